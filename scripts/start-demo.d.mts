/** Types of what `scripts/start-demo.mjs` exports for its test. */
export declare function startBanner(folder: string, url: string): string;

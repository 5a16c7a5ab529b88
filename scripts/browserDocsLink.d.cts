// Types of browserDocsLink.cjs (the esbuild plugin that gives browser bundles the docs link without a file system).
import type { Plugin } from 'esbuild';

/** Resolves `./docsLink` to `./docsLink.browser.ts`. */
export declare const browserDocsLink: Plugin;

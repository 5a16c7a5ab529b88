/** The options every block body is parsed with (the benchmarks parse with the same ones). */
export const YAML_OPTIONS = { uniqueKeys: true, prettyErrors: false, keepSourceTokens: false, strict: true } as const;

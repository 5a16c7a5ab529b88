/**
 * Loads `./notebook` on first use. In the bundle, `scripts/build.mjs` keeps
 * this `require` as it is (the module is the separate `dist/notebook.js`
 * beside `dist/extension.js`); unbundled (tests, tsx) it resolves to the
 * TypeScript source.
 */
import type * as Notebook from './notebook';

let loaded: typeof Notebook | undefined;

/** The note-reading module, loaded the first time it is asked for. */
export function notebook(): typeof Notebook {
  // A plain require so it happens synchronously: the preview's markdown-it hook cannot wait.
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  loaded ??= require('./notebook') as typeof Notebook;
  return loaded;
}

/**
 * Loads `./noteReader` on first use. In the bundle, `scripts/build.mjs` keeps
 * this `require` as it is (the module is the separate `dist/noteReader.js`
 * beside `dist/extension.js`); unbundled (tests, tsx) it resolves to the
 * TypeScript source.
 */
import type * as NoteReader from './noteReader';

let loaded: typeof NoteReader | undefined;

/** The note-reading module, loaded the first time it is asked for. */
export function noteReader(): typeof NoteReader {
  // A plain require so it happens synchronously: the preview's markdown-it hook cannot wait.
  // eslint-disable-next-line @typescript-eslint/no-require-imports
  loaded ??= require('./noteReader') as typeof NoteReader;
  return loaded;
}

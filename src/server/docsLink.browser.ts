/**
 * Where diagnostics link to when the server runs in a web worker: the
 * docs/format.md shipped in the extension, two folders above the worker's
 * own script (`dist/web/server.js`). Swapped in for `docsLink.ts` by the
 * browser build (scripts/build.mjs), which has no file system to search.
 */

const here = (globalThis as { location?: { href?: string } }).location?.href;

/** URL of docs/format.md in the extension that holds the worker. */
export const FORMAT_DOC_URL = here ? new URL('../../docs/format.md', here).href : 'docs/format.md';

/** Link to the section of docs/format.md that explains a diagnostic code. */
export function codeLink(code: string): string {
  return `${FORMAT_DOC_URL}#${code}`;
}

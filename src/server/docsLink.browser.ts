/**
 * Where diagnostics link to when the server runs in a web worker: the
 * docs/format.md shipped in the extension, two folders above the worker's
 * own script (`dist/web/server.js`). Swapped in for `docsLink.ts` by the
 * browser build (scripts/build.mjs), which has no file system to search.
 */

const scope = globalThis as { name?: string; location?: { href?: string } };

/** The worker's name when the client gave the docs' address there, else beside the worker's own script. */
function formatDocUrl(): string {
  // The editor's web extension host may prefix the name ("<host> -> <name>").
  const named = scope.name?.split(' -> ').pop();
  if (named && /format\.md$/.test(named)) return named;
  try {
    return new URL('../../docs/format.md', scope.location?.href).href;
  } catch {
    // A worker started from a blob: has no folder to resolve against.
    return 'docs/format.md';
  }
}

/** URL of docs/format.md in the extension that holds the worker. */
export const FORMAT_DOC_URL = formatDocUrl();

/** Link to the section of docs/format.md that explains a diagnostic code. */
export function codeLink(code: string): string {
  return `${FORMAT_DOC_URL}#${code}`;
}

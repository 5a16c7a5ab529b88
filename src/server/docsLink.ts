/**
 * Where diagnostics link to: the copy of docs/format.md shipped next to the
 * server bundle (dist/../docs/format.md), so the link works offline, in the
 * installed extension and for other editors alike.
 */
import { existsSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

/** The nearest docs/format.md above this module (dist/ when bundled, src/server/ in tests). */
function findFormatDoc(): string {
  let dir = __dirname;
  for (let i = 0; i < 4; i++) {
    const candidate = resolve(dir, 'docs', 'format.md');
    if (existsSync(candidate)) return candidate;
    dir = dirname(dir);
  }
  return resolve(__dirname, '..', 'docs', 'format.md');
}

/** URL of docs/format.md beside the running bundle. */
export const FORMAT_DOC_URL = pathToFileURL(findFormatDoc()).href;

/** Link to the section of docs/format.md that explains a diagnostic code. */
export function codeLink(code: string): string {
  return `${FORMAT_DOC_URL}#${code}`;
}

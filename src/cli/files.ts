/**
 * Collects the Markdown notes named on the command line: files as given,
 * folders walked for `*.md` (hidden folders and node_modules skipped), in a
 * stable order.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';

/** A note to report on: the name to print and its text. */
export interface Note {
  readonly name: string;
  readonly text: string;
}

/** A path that could not be read, with a one-line reason. */
export class UsageError extends Error {}

function walk(dir: string, out: string[]): void {
  const entries = readdirSync(dir, { withFileTypes: true }).sort((a, b) =>
    a.name < b.name ? -1 : a.name > b.name ? 1 : 0,
  );
  for (const e of entries) {
    if (e.name.startsWith('.') || e.name === 'node_modules') continue;
    const p = join(dir, e.name);
    if (e.isDirectory()) walk(p, out);
    else if (e.isFile() && /\.md$/i.test(e.name)) out.push(p);
  }
}

/** Expands the paths to note files; throws {@link UsageError} for a path that cannot be read. */
export function collectFiles(paths: readonly string[], cwd: string): string[] {
  const files: string[] = [];
  for (const p of paths) {
    let st;
    try {
      st = statSync(p);
    } catch {
      throw new UsageError(`cannot read '${p}': no such file or folder`);
    }
    if (st.isDirectory()) {
      try {
        walk(p, files);
      } catch (err) {
        throw new UsageError(
          `cannot read folder '${p}': ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`,
        );
      }
    } else files.push(p);
  }
  // Names stay as the user gave them (a folder's files are joined to its name as written).
  void cwd;
  return files;
}

/** Reads a note as UTF-8 (a BOM is dropped); throws {@link UsageError} when it cannot be read. */
export function readNote(file: string): Note {
  try {
    const text = readFileSync(file, 'utf8');
    return { name: file.split('\\').join('/'), text: text.charCodeAt(0) === 0xfeff ? text.slice(1) : text };
  } catch (err) {
    throw new UsageError(`cannot read '${file}': ${(err as NodeJS.ErrnoException).code ?? (err as Error).message}`);
  }
}

/**
 * Runs by reference on the command line: every note read goes into one
 * {@link RunBook}, so a block may refer to a run of any of them; a note a
 * reference names that was not given is read from disk only when it lies
 * inside a folder given on the command line or the folder of a file given
 * (real paths compared, so no symbolic link leads out), never elsewhere.
 */
import { realpathSync, statSync } from 'node:fs';
import { dirname, resolve, sep } from 'node:path';
import {
  cellStarts,
  decodeUtf8,
  isNotebookPath,
  joinCells,
  notebookCells,
  RunBook,
  type Analyzer,
  type CellLine,
  type Externals,
} from '../core';
import { readNote, STDIN } from './files';

/** The name a note has in the book: its absolute path (standard input: a note in the working folder). */
export function bookName(name: string, cwd: string): string {
  return name === STDIN ? resolve(cwd, '(standard input).md') : resolve(cwd, name);
}

/** Where the Markdown cells of each notebook the book holds start in its text, by the book's name of the note. */
export type NotebookStarts = Map<string, readonly CellLine[]>;

/**
 * The text the book indexes for a note: a notebook's Markdown cells one after another (where each starts is
 * given to `cells`, for the places of its runs).
 */
export function bookText(name: string, text: string, cells?: (starts: readonly CellLine[]) => void): string {
  if (!isNotebookPath(name)) return text;
  const nb = notebookCells(text);
  if (nb.problem) return '';
  cells?.(cellStarts(nb.cells));
  return joinCells(nb.cells);
}

/** The folders a referenced note may be read from: those given, and the folder of each file given. */
export function readableRoots(paths: readonly string[], cwd: string): string[] {
  const roots = new Set<string>();
  for (const p of paths) {
    if (p === STDIN) {
      roots.add(real(cwd));
      continue;
    }
    const abs = resolve(cwd, p);
    let folder = abs;
    try {
      if (!statSync(abs).isDirectory()) folder = dirname(abs);
    } catch {
      folder = dirname(abs);
    }
    roots.add(real(folder));
  }
  return [...roots];
}

function real(path: string): string {
  try {
    return realpathSync(path);
  } catch {
    return path;
  }
}

function inside(path: string, roots: readonly string[]): boolean {
  return roots.some((r) => path === r || path.startsWith(r.endsWith(sep) ? r : r + sep));
}

/** A book for the notes of one command, reading unnamed referenced notes inside `roots` only. */
export function commandBook(
  analyzer: Analyzer,
  roots: readonly string[],
  sources: ((note: string) => Externals | null) | null = null,
  cells: NotebookStarts = new Map(),
): RunBook {
  return new RunBook({
    analyzer,
    ...(sources ? { sources } : {}),
    cellStarts: (note) => cells.get(note) ?? null,
    load: (note) => {
      if (!/\.(md|markdown|ipynb)$/i.test(note)) return null;
      let path: string;
      try {
        path = realpathSync(note);
      } catch {
        return null;
      }
      if (!inside(path, roots))
        return { refused: 'it lies outside the folders given on the command line (and those of the files given)' };
      const read = readNote(note, path);
      if (!('bytes' in read)) return null;
      const text = decodeUtf8(read.bytes).text.replace(/^\uFEFF/, '');
      return bookText(note, text, (starts) => cells.set(note, starts));
    },
  });
}

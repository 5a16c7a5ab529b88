/**
 * A Jupyter notebook as a note of the index of runs: the text the book reads
 * (its Markdown cells one after another, as the command line reads them,
 * src/cli/runs.ts) and, for the places the editor is sent to (a definition, a
 * reference), the position in the notebook's own file of a place in that text.
 *
 * The file is JSON: each cell's `source` is a list of strings, one per line
 * (nbformat writes it so), or one string. Each line of a Markdown cell is
 * found in the file by its JSON-escaped text, in order, from where the one
 * before it was found; a column becomes the length of the escaped text before
 * it. A line written with other escapes than `JSON.stringify`'s (`\u00e9` for
 * `é`) is not found and takes the place of the line before it: the place is
 * then the nearest line found, never a wrong file.
 */
import { cellGap, cellStarts, isNotebookPath, LineIndex, notebookCells, type CellLine, type LineCol } from '../../core';

/** A notebook as the index holds it. */
export interface NotebookNote {
  /** The Markdown cells' texts, each ended by its cell gap (core's cellGap) but the last. */
  readonly text: string;
  /** The position in the notebook's file of an offset of `text`. */
  place(offset: number): LineCol;
  /** Where each Markdown cell starts in `text` (core's cellStarts), for the cell and line of a line of it. */
  readonly starts: readonly CellLine[];
}

/** True for a note of the index that is a notebook. */
export function isNotebookNote(uri: string): boolean {
  return isNotebookPath(uri.split(/[?#]/)[0] ?? '');
}

/** The note of a notebook's file text (a file that is not a notebook gives an empty text). */
export function notebookNote(raw: string): NotebookNote {
  const nb = notebookCells(raw);
  const file = new LineIndex(raw);
  /** Per line of the joined text: its offset there, its text, and the offset of its escaped text in the file. */
  const starts: number[] = [];
  const lines: string[] = [];
  const found: number[] = [];
  const exact: boolean[] = [];
  let text = '';
  let cursor = 0;
  nb.cells.forEach((cell, k) => {
    // Joined exactly as the command line joins them (src/cli/runs.ts, core's joinCells), empty cells included.
    if (k > 0) text += cellGap(nb.cells[k - 1]!.text);
    let at = text.length;
    for (const line of cell.text.split('\n')) {
      const escaped = JSON.stringify(line).slice(1, -1);
      const hit = escaped === '' ? -1 : raw.indexOf(escaped, cursor);
      if (hit >= 0) cursor = hit + escaped.length;
      starts.push(at);
      lines.push(line);
      found.push(hit >= 0 ? hit : (found[found.length - 1] ?? 0));
      exact.push(hit >= 0 || escaped === '');
      at += line.length + 1;
    }
    text += cell.text;
  });
  const place = (offset: number): LineCol => {
    // The last line that starts at or before the offset.
    let a = 0;
    let b = starts.length - 1;
    if (b < 0) return { line: 0, character: 0 };
    while (a < b) {
      const m = (a + b + 1) >>> 1;
      if (starts[m]! <= offset) a = m;
      else b = m - 1;
    }
    if (!exact[a]) return file.positionAt(found[a]!);
    const line = lines[a]!;
    const column = Math.max(0, Math.min(offset - starts[a]!, line.length));
    return file.positionAt(found[a]! + JSON.stringify(line.slice(0, column)).length - 2);
  };
  return { text, place, starts: cellStarts(nb.cells) };
}

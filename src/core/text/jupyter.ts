/**
 * Jupyter notebooks (`.ipynb`, nbformat 4, and the `worksheets` of nbformat
 * 3): the Markdown cells, each as a note of its own. A notebook's code cells
 * are never read, and a file that is not a notebook gives one problem, never
 * an exception. The JSON itself is parsed by the platform's `JSON.parse`; the
 * structure is checked here field by field, because a notebook is data a
 * host read from disk and may be anything.
 */

/** One Markdown cell: its 0-based index among all cells of the notebook, and its text. */
export interface NotebookCell {
  readonly index: number;
  readonly text: string;
}

/** Why a file could not be read as a notebook, with the 0-based line and column of the fault in the file. */
export interface NotebookProblem {
  readonly message: string;
  readonly line: number;
  readonly column: number;
}

/** The Markdown cells of a notebook, or the problem that stopped the reading. */
export type NotebookCells =
  | { readonly cells: readonly NotebookCell[]; readonly problem: null }
  | { readonly cells: readonly []; readonly problem: NotebookProblem };

/** True for a path or URI that names a Jupyter notebook. */
export function isNotebookPath(path: string): boolean {
  return /\.ipynb$/i.test(path);
}

/** Reads the Markdown cells of a notebook's JSON text. */
export function notebookCells(text: string): NotebookCells {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (err) {
    return failed(text, `not a notebook: the file is not valid JSON (${(err as Error).message})`, err);
  }
  const cells = cellList(doc);
  if (!cells) return failed(text, 'not a notebook: no `cells` list (nbformat 4) or `worksheets` (nbformat 3)', null);
  const out: NotebookCell[] = [];
  cells.forEach((cell, index) => {
    if (!isRecord(cell) || cell.cell_type !== 'markdown') return;
    const source = sourceText(cell.source);
    if (source !== null) out.push({ index, text: source });
  });
  return { cells: out, problem: null };
}

function cellList(doc: unknown): readonly unknown[] | null {
  if (!isRecord(doc)) return null;
  if (Array.isArray(doc.cells)) return doc.cells as unknown[];
  // nbformat 3 keeps the cells in worksheets.
  if (Array.isArray(doc.worksheets)) {
    const all: unknown[] = [];
    for (const w of doc.worksheets as unknown[])
      if (isRecord(w) && Array.isArray(w.cells)) all.push(...(w.cells as unknown[]));
    return all;
  }
  return null;
}

/** A cell's source: a string, or a list of strings (lines with their line ends) joined as Jupyter joins them. */
function sourceText(source: unknown): string | null {
  if (typeof source === 'string') return source;
  if (Array.isArray(source) && source.every((s) => typeof s === 'string')) return (source as string[]).join('');
  return null;
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/** The problem, placed at the position `JSON.parse` names in its message when it names one (V8 does). */
function failed(text: string, message: string, err: unknown): NotebookCells {
  const m = err instanceof Error ? /position (\d+)/.exec(err.message) : null;
  const offset = m ? Math.min(Number(m[1]), text.length) : 0;
  let line = 0;
  let start = 0;
  for (let i = 0; i < offset; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      start = i + 1;
    }
  }
  return { cells: [], problem: { message, line, column: offset - start } };
}

/**
 * Jupyter notebooks (`.ipynb`, nbformat 4, and the `worksheets` of nbformat
 * 3): the Markdown cells, each as a note of its own. A notebook's code cells
 * are never read, and a file that is not a notebook gives one problem, never
 * an exception. The JSON itself is parsed by the platform's `JSON.parse`; the
 * structure is checked here field by field, because a notebook is data a
 * host read from disk and may be anything.
 */
import { scanFencedBlocks, type FencedBlock } from './fences';

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

/**
 * Between a notebook's Markdown cells where they are read as one note (the index of runs): at least a blank line,
 * which ends a paragraph or an HTML block of the kind a blank line ends.
 */
export const NOTEBOOK_CELL_GAP = '\n\n';

/**
 * A line that ends every HTML block of kinds 1 to 5 (CommonMark 0.31.2, §4.6: the line holding `-->`, `?>`, `>`,
 * `]]>` or a closing `</script>`, `</pre>`, `</style>` or `</textarea>`), and is plain text outside one.
 */
const HTML_ENDS = '--> ?> ]]> </script> </pre> </style> </textarea>';

/**
 * What follows a Markdown cell's text where a notebook's cells are read as one note: whatever ends a fenced block or
 * an HTML block the cell leaves open, then {@link NOTEBOOK_CELL_GAP}. VS Code renders each cell on its own, so a
 * cell's unclosed fence or `<!--` must not swallow the cells after it.
 */
export function cellGap(text: string): string {
  let last: FencedBlock | undefined;
  for (const b of scanFencedBlocks(text)) last = b;
  if (last && last.closeLine === null) {
    // A closing fence: the opening one's character, as many times (CommonMark §4.5: at least as long).
    let i = last.openStart;
    while (text.charCodeAt(i) === 32) i++;
    let j = i;
    while (text.charCodeAt(j) === text.charCodeAt(i)) j++;
    return `\n${text.slice(i, j)}${NOTEBOOK_CELL_GAP}`;
  }
  // No HTML block can be open in a text without `<`: the plain gap, as notes without HTML always had.
  return text.includes('<') ? `\n${HTML_ENDS}${NOTEBOOK_CELL_GAP}` : NOTEBOOK_CELL_GAP;
}

/** The Markdown cells' texts as one note, each followed by its {@link cellGap} but the last. */
export function joinCells(cells: readonly { readonly text: string }[]): string {
  let out = '';
  cells.forEach((c, k) => {
    if (k > 0) out += cellGap(cells[k - 1]!.text);
    out += c.text;
  });
  return out;
}

/** A place in a notebook: the cell (0-based index among all cells) and the 0-based line in that cell. */
export interface CellLine {
  readonly index: number;
  readonly line: number;
}

/** The first line of each Markdown cell in {@link joinCells}' text of them, in order. */
export function cellStarts(cells: readonly NotebookCell[]): CellLine[] {
  const out: CellLine[] = [];
  let line = 0;
  cells.forEach((c, k) => {
    if (k > 0) {
      const before = cells[k - 1]!.text;
      line += lineBreaks(before) + lineBreaks(cellGap(before));
    }
    out.push({ index: c.index, line });
  });
  return out;
}

/** The cell and the line in it of a line of {@link joinCells}' text, given {@link cellStarts}; null without cells. */
export function cellAtLine(starts: readonly CellLine[], line: number): CellLine | null {
  let a = 0;
  let b = starts.length - 1;
  if (b < 0) return null;
  while (a < b) {
    const m = (a + b + 1) >>> 1;
    if (starts[m]!.line <= line) a = m;
    else b = m - 1;
  }
  const s = starts[a]!;
  return { index: s.index, line: Math.max(0, line - s.line) };
}

function lineBreaks(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) n++;
  return n;
}

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

/**
 * The problem, placed where the JSON goes wrong. V8 names the place in most of its messages, as `at position N`
 * (a 0-based UTF-16 offset; Node.js 20) and, from V8 12 on (Node.js 22), also as `(line L column C)` (1-based);
 * the line and column are taken when given, else the offset. Some messages name no place at all (`Unexpected
 * token ']', "…" is not valid JSON`, `Unexpected end of JSON input`): the offset is then found by
 * {@link jsonFault}, which reads the text by the grammar of RFC 8259.
 */
function failed(text: string, message: string, err: unknown): NotebookCells {
  const said = err instanceof Error ? err.message : '';
  const lc = /\(line (\d+) column (\d+)\)/.exec(said);
  if (lc && Number(lc[1]) >= 1 && Number(lc[2]) >= 1)
    return { cells: [], problem: { message, line: Number(lc[1]) - 1, column: Number(lc[2]) - 1 } };
  const at = /at position (\d+)/.exec(said);
  const offset = Math.min(at ? Number(at[1]) : err ? (jsonFault(text) ?? 0) : 0, text.length);
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

/**
 * What the reader of {@link jsonFault} expects next: a value; a value or `]` (just after `[`); a key; a key or
 * `}` (just after `{`); or, after a value, `,` or the close of the open container (the end of the text when
 * none is open).
 */
type Want = 'value' | 'value-or-close' | 'key' | 'key-or-close' | 'after';

/** JSON's whitespace (RFC 8259 §2): space, tab, line feed, carriage return. */
const isJsonSpace = (c: number): boolean => c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d;

const isDigit = (c: number): boolean => c >= 0x30 && c <= 0x39;

/**
 * The offset of the first character at which `text` stops being JSON (RFC 8259: objects, arrays, strings with
 * their escapes, numbers, `true`, `false`, `null`), the length of the text when it ends too early, or null when
 * it is JSON. Containers are tracked on an explicit stack, so deep nesting cannot overflow the call stack.
 */
export function jsonFault(text: string): number | null {
  const open: number[] = [];
  let want: Want = 'value';
  let i = 0;
  const n = text.length;
  for (;;) {
    while (i < n && isJsonSpace(text.charCodeAt(i))) i++;
    if (i >= n) return want === 'after' && open.length === 0 ? null : n;
    const c = text.charCodeAt(i);
    if (want === 'after') {
      const top = open[open.length - 1];
      if (top === undefined) return i;
      if (c === 0x2c) want = top === 0x7b ? 'key' : 'value';
      else if (c === (top === 0x7b ? 0x7d : 0x5d)) open.pop();
      else return i;
      i++;
      continue;
    }
    if (want === 'key' || want === 'key-or-close') {
      if (want === 'key-or-close' && c === 0x7d) {
        open.pop();
        i++;
        want = 'after';
        continue;
      }
      if (c !== 0x22) return i;
      const end = stringEnd(text, i);
      if (end < 0) return ~end;
      i = end;
      while (i < n && isJsonSpace(text.charCodeAt(i))) i++;
      if (i >= n) return n;
      if (text.charCodeAt(i) !== 0x3a) return i;
      i++;
      want = 'value';
      continue;
    }
    if (want === 'value-or-close' && c === 0x5d) {
      open.pop();
      i++;
      want = 'after';
      continue;
    }
    if (c === 0x7b || c === 0x5b) {
      open.push(c);
      i++;
      want = c === 0x7b ? 'key-or-close' : 'value-or-close';
      continue;
    }
    const end = c === 0x22 ? stringEnd(text, i) : c === 0x2d || isDigit(c) ? numberEnd(text, i) : wordEnd(text, i);
    if (end < 0) return ~end;
    i = end;
    want = 'after';
  }
}

/** The end of the string starting at `from` (its opening quote), or `~offset` of its fault. */
function stringEnd(text: string, from: number): number {
  for (let i = from + 1; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x22) return i + 1;
    if (c < 0x20) return ~i;
    if (c === 0x5c) {
      const e = text.charCodeAt(i + 1);
      if (e === 0x75) {
        for (let k = i + 2; k < i + 6; k++) if (k >= text.length || !/[0-9A-Fa-f]/.test(text[k]!)) return ~k;
        i += 5;
      } else if ('"\\/bfnrt'.includes(text[i + 1] ?? '')) i++;
      else return ~(i + 1);
    }
  }
  return ~text.length;
}

/** The end of the number starting at `from` (`-`? int frac? exp?), or `~offset` of its fault. */
function numberEnd(text: string, from: number): number {
  let i = from;
  if (text.charCodeAt(i) === 0x2d) i++;
  if (!isDigit(text.charCodeAt(i))) return ~i;
  if (text.charCodeAt(i) === 0x30) i++;
  else while (isDigit(text.charCodeAt(i))) i++;
  if (text.charCodeAt(i) === 0x2e) {
    i++;
    if (!isDigit(text.charCodeAt(i))) return ~i;
    while (isDigit(text.charCodeAt(i))) i++;
  }
  if (text.charCodeAt(i) === 0x65 || text.charCodeAt(i) === 0x45) {
    i++;
    if (text.charCodeAt(i) === 0x2b || text.charCodeAt(i) === 0x2d) i++;
    if (!isDigit(text.charCodeAt(i))) return ~i;
    while (isDigit(text.charCodeAt(i))) i++;
  }
  return i;
}

/** The end of `true`, `false` or `null` starting at `from`, or `~offset` of the first character that differs. */
function wordEnd(text: string, from: number): number {
  const word = text[from] === 't' ? 'true' : text[from] === 'f' ? 'false' : text[from] === 'n' ? 'null' : '';
  if (word === '') return ~from;
  for (let k = 0; k < word.length; k++) if (text[from + k] !== word[k]) return ~(from + k);
  return from + word.length;
}

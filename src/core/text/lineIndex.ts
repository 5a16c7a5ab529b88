/**
 * Offsets ↔ (line, character) for one text. Lines end at `\n`, `\r\n` or a
 * lone `\r`, as CommonMark and the Language Server Protocol count them;
 * characters are UTF-16 code units, the LSP default encoding.
 *
 * The line starts are kept in chunks of at most {@link CHUNK_LINES} lines,
 * each relative to the chunk's first line, so that an edit ({@link LineIndex.edit})
 * makes a new index for the new text by rescanning only the lines it touched
 * and moving the later chunks' bases: its cost grows with the edit and the
 * number of chunks, not with the text. The index of one text never changes;
 * an edit returns a new one that shares the untouched chunks.
 */
export interface LineCol {
  /** 0-based line. */
  readonly line: number;
  /** 0-based UTF-16 column. */
  readonly character: number;
}

/** Most lines per chunk: a rescanned chunk costs this much at most, and a 400,000-line note has 200 chunks. */
const CHUNK_LINES = 2048;

/** The line starts of `text` from `from` (a line start) to `to` (a line start, or the end): absolute offsets. */
function scanStarts(text: string, from: number, to: number, out: number[]): void {
  out.push(from);
  // Jumps from break to break with indexOf (native search) rather than visiting every character;
  // the next \r is remembered, so a note without any costs one search for it.
  let nextLf = text.indexOf('\n', from);
  let nextCr = text.indexOf('\r', from);
  while ((nextLf !== -1 && nextLf < to) || (nextCr !== -1 && nextCr < to)) {
    let end: number;
    if (nextCr !== -1 && (nextLf === -1 || nextCr < nextLf)) {
      end = text.charCodeAt(nextCr + 1) === 10 ? nextCr + 2 : nextCr + 1; // \r\n or a lone \r
    } else {
      end = nextLf + 1;
    }
    if (end > to && to < text.length) break; // cannot happen when `to` is a line start; kept as a guard
    out.push(end);
    if (nextLf !== -1 && nextLf < end) nextLf = text.indexOf('\n', end);
    if (nextCr !== -1 && nextCr < end) nextCr = text.indexOf('\r', end);
  }
}

/** Line starts of one text, in chunks. */
export class LineIndex {
  /** Per chunk: its line starts relative to its first line's start (the first is 0). */
  private readonly rel: readonly Int32Array[];
  /** Per chunk: the offset where its first line starts. */
  private readonly base: readonly number[];
  /** Per chunk: its first line's number; one more entry holds the line count. */
  private readonly first: readonly number[];

  constructor(
    readonly text: string,
    chunks?: { rel: readonly Int32Array[]; base: readonly number[] },
  ) {
    if (chunks) {
      this.rel = chunks.rel;
      this.base = chunks.base;
    } else {
      const starts: number[] = [];
      scanStarts(text, 0, text.length, starts);
      const split = toChunks(starts);
      this.rel = split.rel;
      this.base = split.base;
    }
    const first = new Array<number>(this.rel.length + 1);
    let n = 0;
    for (let c = 0; c < this.rel.length; c++) {
      first[c] = n;
      n += this.rel[c]!.length;
    }
    first[this.rel.length] = n;
    this.first = first;
  }

  /** Number of lines (a text ending in a newline has an empty last line). */
  get lineCount(): number {
    return this.first[this.rel.length]!;
  }

  /** The chunk holding a line (0 ≤ line < lineCount). */
  private chunkOfLine(line: number): number {
    let lo = 0;
    let hi = this.rel.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.first[mid]! <= line) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  /** Offset where `line` starts; clamps to the text. */
  lineStart(line: number): number {
    if (line <= 0) return 0;
    if (line >= this.lineCount) return this.text.length;
    const c = this.chunkOfLine(line);
    return this.base[c]! + this.rel[c]![line - this.first[c]!]!;
  }

  /** Offset just before the line's terminator. */
  lineEnd(line: number): number {
    const start = this.lineStart(line);
    let end = line + 1 < this.lineCount ? this.lineStart(line + 1) : this.text.length;
    if (end > start && this.text.charCodeAt(end - 1) === 10) end--;
    if (end > start && this.text.charCodeAt(end - 1) === 13) end--;
    return end;
  }

  /** The line an offset lies on (clamped into the text). O(log lines). */
  private lineOf(o: number): number {
    let lo = 0;
    let hi = this.base.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.base[mid]! <= o) lo = mid;
      else hi = mid - 1;
    }
    const rel = this.rel[lo]!;
    const r = o - this.base[lo]!;
    let a = 0;
    let b = rel.length - 1;
    while (a < b) {
      const mid = (a + b + 1) >> 1;
      if (rel[mid]! <= r) a = mid;
      else b = mid - 1;
    }
    return this.first[lo]! + a;
  }

  /** Position of an offset (clamped into the text). Binary search: O(log lines). */
  positionAt(offset: number): LineCol {
    const o = Math.max(0, Math.min(offset, this.text.length));
    const line = this.lineOf(o);
    // An offset between the \r and the \n of a line break is the end of its line.
    return { line, character: Math.min(o, this.lineEnd(line)) - this.lineStart(line) };
  }

  /** Offset of a position; a character past the line's end clamps to the end. */
  offsetAt(pos: LineCol): number {
    if (pos.line < 0) return 0;
    if (pos.line >= this.lineCount) return this.text.length;
    return Math.min(this.lineStart(pos.line) + Math.max(0, pos.character), this.lineEnd(pos.line));
  }

  /**
   * The index of `text` after the characters [start, end) of this index's text
   * were replaced by `inserted` characters: `text` is the whole new text. Only
   * the lines from the one before the edit to the one after it are scanned
   * again; the chunks after them move by the change in length.
   */
  edit(start: number, end: number, inserted: number, text: string): LineIndex {
    const oldLength = this.text.length;
    const s = Math.max(0, Math.min(start, oldLength));
    const e = Math.max(s, Math.min(end, oldLength));
    const delta = inserted - (e - s);
    if (text.length !== oldLength + delta) return new LineIndex(text); // inconsistent call: start over
    // One line of margin on each side: a break may join or split at either end (\r + \n).
    const lineA = Math.max(0, this.lineOf(s) - 1);
    const lineB = Math.min(this.lineCount, this.lineOf(e) + 2); // first old line kept after the window
    const c0 = this.chunkOfLine(lineA);
    const c1 = lineB >= this.lineCount ? this.rel.length - 1 : this.chunkOfLine(lineB);
    // The affected chunks' lines, as absolute offsets of the new text.
    const starts: number[] = [];
    for (let line = this.first[c0]!; line < lineA; line++) starts.push(this.lineStart(line));
    const from = this.lineStart(lineA);
    const to = lineB >= this.lineCount ? text.length : this.lineStart(lineB) + delta;
    scanStarts(text, from, to, starts);
    if (lineB < this.lineCount) {
      // `to` itself is the first kept line: the loop below adds it, so the scan's own copy of it goes.
      if (starts[starts.length - 1] === to) starts.pop();
      const last = this.first[c1 + 1]!;
      for (let line = lineB; line < last; line++) starts.push(this.lineStart(line) + delta);
    }
    const split = toChunks(starts);
    const rel = [...this.rel.slice(0, c0), ...split.rel, ...this.rel.slice(c1 + 1)];
    const base = [...this.base.slice(0, c0), ...split.base, ...this.base.slice(c1 + 1).map((b) => b + delta)];
    return new LineIndex(text, { rel, base });
  }
}

/** Absolute line starts (in order, non-empty) cut into chunks. */
function toChunks(starts: readonly number[]): { rel: Int32Array[]; base: number[] } {
  const rel: Int32Array[] = [];
  const base: number[] = [];
  for (let i = 0; i < starts.length; i += CHUNK_LINES) {
    const n = Math.min(CHUNK_LINES, starts.length - i);
    const b = starts[i]!;
    const chunk = new Int32Array(n);
    for (let k = 0; k < n; k++) chunk[k] = starts[i + k]! - b;
    rel.push(chunk);
    base.push(b);
  }
  return { rel, base };
}

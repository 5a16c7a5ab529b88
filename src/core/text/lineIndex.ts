/**
 * Offsets ↔ (line, character) for one text. Lines end at `\n`, `\r\n` or a
 * lone `\r`, as CommonMark and the Language Server Protocol count them;
 * characters are UTF-16 code units, the LSP default encoding.
 */
export interface LineCol {
  /** 0-based line. */
  readonly line: number;
  /** 0-based UTF-16 column. */
  readonly character: number;
}

/** Offset of the start of every line, built once per text version. */
export class LineIndex {
  private readonly starts: number[];

  constructor(readonly text: string) {
    const starts = [0];
    // Jumps from break to break with indexOf (native search) rather than visiting every character;
    // the next \r is remembered, so a note without any costs one search for it.
    let nextLf = text.indexOf('\n');
    let nextCr = text.indexOf('\r');
    while (nextLf !== -1 || nextCr !== -1) {
      let end: number;
      if (nextCr !== -1 && (nextLf === -1 || nextCr < nextLf)) {
        end = text.charCodeAt(nextCr + 1) === 10 ? nextCr + 2 : nextCr + 1; // \r\n or a lone \r
      } else {
        end = nextLf + 1;
      }
      starts.push(end);
      if (nextLf !== -1 && nextLf < end) nextLf = text.indexOf('\n', end);
      if (nextCr !== -1 && nextCr < end) nextCr = text.indexOf('\r', end);
    }
    this.starts = starts;
  }

  /** Number of lines (a text ending in a newline has an empty last line). */
  get lineCount(): number {
    return this.starts.length;
  }

  /** Offset where `line` starts; clamps to the text. */
  lineStart(line: number): number {
    if (line <= 0) return 0;
    if (line >= this.starts.length) return this.text.length;
    return this.starts[line];
  }

  /** Offset just before the line's terminator. */
  lineEnd(line: number): number {
    const next = line + 1 < this.starts.length ? this.starts[line + 1] : this.text.length;
    let end = next;
    if (end > this.lineStart(line) && this.text.charCodeAt(end - 1) === 10) end--;
    if (end > this.lineStart(line) && this.text.charCodeAt(end - 1) === 13) end--;
    return end;
  }

  /** Position of an offset (clamped into the text). Binary search: O(log lines). */
  positionAt(offset: number): LineCol {
    const o = Math.max(0, Math.min(offset, this.text.length));
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid] <= o) lo = mid;
      else hi = mid - 1;
    }
    // An offset between the \r and the \n of a line break is the end of its line.
    return { line: lo, character: Math.min(o, this.lineEnd(lo)) - this.starts[lo] };
  }

  /** Offset of a position; a character past the line's end clamps to the end. */
  offsetAt(pos: LineCol): number {
    if (pos.line < 0) return 0;
    if (pos.line >= this.starts.length) return this.text.length;
    return Math.min(this.lineStart(pos.line) + Math.max(0, pos.character), this.lineEnd(pos.line));
  }
}

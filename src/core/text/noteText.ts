/**
 * A note's text held in pieces, with the line starts of each piece: what a
 * host that edits a large note keystroke by keystroke keeps instead of one
 * string. A string edited by `before + inserted + after` is laid out flat by
 * the engine again on the next read of any character, a copy of the whole
 * note per keystroke (and as much garbage); here an edit makes a new text
 * that shares every piece it did not touch, and rebuilds a few pieces of at
 * most some tens of kilobytes. Versions never change: an edit returns a new
 * one, so an analysis of one version stays true of it.
 *
 * Pieces are cut just after a line break (never inside `\r\n`), so a line
 * never spans two pieces. Lines end at `\n`, `\r\n` or a lone `\r`, and
 * characters are UTF-16 code units, as in {@link LineIndex}, whose questions
 * this answers the same way.
 */
import { ownCopy } from './common';
import type { LineCol } from './lineIndex';

/** Characters a piece is cut at (at the first line break from there); a rebuilt stretch is about three pieces. */
const PIECE_CHARS = 16_384;

/** One piece: its text and the starts of its lines, relative to the piece (the first is 0). */
interface Piece {
  readonly text: string;
  readonly starts: Int32Array;
}

/** What a reader of positions asks of a text (LineIndex and NoteText both answer it). */
export interface TextLines {
  readonly lineCount: number;
  lineStart(line: number): number;
  lineEnd(line: number): number;
  positionAt(offset: number): LineCol;
  offsetAt(pos: LineCol): number;
}

/** What a reader of characters asks of a text: a string is one, and so is a {@link NoteText}. */
export interface TextSource {
  readonly length: number;
  slice(start?: number, end?: number): string;
}

/** A version of a note's text, in pieces. */
export class NoteText implements TextLines, TextSource {
  /** Per piece: the offset where it starts, and one more entry: the length. */
  private readonly base: Float64Array;
  /** Per piece: its first line's number, and one more entry: the line count. */
  private readonly first: Float64Array;
  private flat: string | null = null;
  /** 1 when the text ends with a line break: the empty line after it, which no piece holds. */
  private readonly trailing: number;

  private constructor(private readonly pieces: readonly Piece[]) {
    const n = pieces.length;
    this.base = new Float64Array(n + 1);
    this.first = new Float64Array(n + 1);
    let offset = 0;
    let line = 0;
    for (let i = 0; i < n; i++) {
      this.base[i] = offset;
      this.first[i] = line;
      offset += pieces[i]!.text.length;
      line += pieces[i]!.starts.length;
    }
    this.base[n] = offset;
    this.first[n] = line;
    const last = pieces[n - 1]!.text;
    const c = last.charCodeAt(last.length - 1);
    this.trailing = c === 10 || c === 13 ? 1 : 0;
  }

  /** The pieces of a whole text. */
  static of(text: string): NoteText {
    const t = new NoteText(cut(text));
    t.flat = text;
    return t;
  }

  get length(): number {
    return this.base[this.pieces.length]!;
  }

  get lineCount(): number {
    return this.first[this.pieces.length]! + this.trailing;
  }

  /** The whole text as one string (made once per version, on first use). */
  toString(): string {
    if (this.flat === null) this.flat = this.pieces.map((p) => p.text).join('');
    return this.flat;
  }

  /** The characters [start, end), as `String.prototype.slice` reads its arguments (no negative ones). */
  slice(start = 0, end = this.length): string {
    const a = Math.max(0, Math.min(start, this.length));
    const b = Math.max(a, Math.min(end, this.length));
    if (this.flat !== null) return this.flat.slice(a, b);
    if (a === b) return '';
    let i = this.pieceAt(a);
    const out: string[] = [];
    for (let at = a; at < b; i++) {
      const p = this.pieces[i]!;
      const from = at - this.base[i]!;
      const to = Math.min(p.text.length, b - this.base[i]!);
      out.push(p.text.slice(from, to));
      at = this.base[i]! + to;
    }
    return out.length === 1 ? out[0]! : out.join('');
  }

  /** The code unit at an offset (NaN outside the text), as `String.prototype.charCodeAt`. */
  charCodeAt(offset: number): number {
    if (offset < 0 || offset >= this.length) return NaN;
    const i = this.pieceAt(offset);
    return this.pieces[i]!.text.charCodeAt(offset - this.base[i]!);
  }

  /**
   * The text with the characters [start, end) replaced by `inserted`. The
   * pieces around the edit (one more on each side, where a line break may join
   * or split) are cut again; the others are shared with this version.
   */
  edit(start: number, end: number, inserted: string): NoteText {
    const a = Math.max(0, Math.min(start, this.length));
    const b = Math.max(a, Math.min(end, this.length));
    const n = this.pieces.length;
    if (n === 0) return NoteText.of(inserted);
    const p0 = Math.max(0, this.pieceAt(a) - 1);
    const p1 = Math.min(n - 1, this.pieceAt(b) + 1);
    const from = this.base[p0]!;
    const to = this.base[p1 + 1]!;
    let stretch = '';
    for (let i = p0; i <= p1; i++) stretch += this.pieces[i]!.text;
    const edited = stretch.slice(0, a - from) + inserted + stretch.slice(b - from, to - from);
    const pieces = [...this.pieces.slice(0, p0), ...cut(edited), ...this.pieces.slice(p1 + 1)];
    return new NoteText(pieces.length > 0 ? pieces : cut(''));
  }

  /** Offset where `line` starts; clamps to the text. */
  lineStart(line: number): number {
    if (line <= 0) return 0;
    if (line >= this.first[this.pieces.length]!) return this.length;
    const i = this.pieceOfLine(line);
    return this.base[i]! + this.pieces[i]!.starts[line - this.first[i]!]!;
  }

  /** Offset just before the line's terminator. */
  lineEnd(line: number): number {
    if (line < 0) line = 0;
    if (line >= this.first[this.pieces.length]!) return this.length;
    const i = this.pieceOfLine(line);
    const p = this.pieces[i]!;
    const k = line - this.first[i]!;
    const start = p.starts[k]!;
    let end = k + 1 < p.starts.length ? p.starts[k + 1]! : p.text.length;
    if (end > start && p.text.charCodeAt(end - 1) === 10) end--;
    if (end > start && p.text.charCodeAt(end - 1) === 13) end--;
    return this.base[i]! + end;
  }

  /** Position of an offset (clamped into the text). O(log lines). */
  positionAt(offset: number): LineCol {
    const o = Math.max(0, Math.min(offset, this.length));
    if (o === this.length && this.trailing === 1) return { line: this.lineCount - 1, character: 0 };
    const i = this.pieceAt(o);
    const p = this.pieces[i]!;
    const r = o - this.base[i]!;
    let lo = 0;
    let hi = p.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (p.starts[mid]! <= r) lo = mid;
      else hi = mid - 1;
    }
    const line = this.first[i]! + lo;
    // An offset between the \r and the \n of a line break is the end of its line.
    return { line, character: Math.min(o, this.lineEnd(line)) - (this.base[i]! + p.starts[lo]!) };
  }

  /** Offset of a position; a character past the line's end clamps to the end. */
  offsetAt(pos: LineCol): number {
    if (pos.line < 0) return 0;
    if (pos.line >= this.lineCount) return this.length;
    return Math.min(this.lineStart(pos.line) + Math.max(0, pos.character), this.lineEnd(pos.line));
  }

  /** The piece holding an offset (the last piece for the text's end). */
  private pieceAt(offset: number): number {
    let lo = 0;
    let hi = this.pieces.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.base[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  /** The piece holding a line (0 ≤ line < lineCount). */
  private pieceOfLine(line: number): number {
    let lo = 0;
    let hi = this.pieces.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.first[mid]! <= line) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }
}

/** A text cut into pieces just after a line break near every {@link PIECE_CHARS} characters (at least one piece). */
function cut(text: string): Piece[] {
  const pieces: Piece[] = [];
  let at = 0;
  do {
    let end = text.length;
    if (text.length - at > 2 * PIECE_CHARS) {
      const lf = text.indexOf('\n', at + PIECE_CHARS);
      const cr = text.indexOf('\r', at + PIECE_CHARS);
      const br = lf === -1 ? cr : cr === -1 ? lf : Math.min(lf, cr);
      if (br !== -1) end = text.charCodeAt(br) === 13 && text.charCodeAt(br + 1) === 10 ? br + 2 : br + 1;
    }
    // A piece is a copy of its own, not a view into `text` (which would keep all of it alive).
    const piece = end - at === text.length ? text : ownCopy(text.slice(at, end));
    pieces.push({ text: piece, starts: lineStarts(piece) });
    at = end;
  } while (at < text.length);
  return pieces;
}

/** The starts of the lines of a piece (the first is 0). */
function lineStarts(text: string): Int32Array {
  const starts: number[] = [0];
  let nextLf = text.indexOf('\n');
  let nextCr = text.indexOf('\r');
  while (nextLf !== -1 || nextCr !== -1) {
    const end =
      nextCr !== -1 && (nextLf === -1 || nextCr < nextLf)
        ? text.charCodeAt(nextCr + 1) === 10
          ? nextCr + 2
          : nextCr + 1
        : nextLf + 1;
    // A break at the very end of a piece starts no line in it: the next piece's first line.
    if (end < text.length) starts.push(end);
    else break;
    if (nextLf !== -1 && nextLf < end) nextLf = text.indexOf('\n', end);
    if (nextCr !== -1 && nextCr < end) nextCr = text.indexOf('\r', end);
  }
  return Int32Array.from(starts);
}

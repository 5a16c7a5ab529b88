/**
 * One open note as the server sees it: its text and version, a line index for
 * position conversion, and the core's analysis of it. Built once per version,
 * lazily; every feature reads from it.
 */
import type { Position, Range } from 'vscode-languageserver';
import {
  blockHoldingOffset,
  blocksMeeting,
  DEFAULT_DISPLAY,
  type TextLines,
  type TextSource,
  type BlockReport,
  type DisplayOptions,
  type DocumentReport,
  type Span,
} from '../core';
import type { Settings } from '../shared/settings';

/** An analysed version of a note. */
export interface NoteState {
  readonly uri: string;
  readonly version: number;
  /** The note's text: a string, or the server's text in pieces (read it by `slice`). */
  readonly text: TextSource;
  readonly lines: TextLines;
  readonly report: DocumentReport;
}

/** LSP range of a span of note offsets. */
export function toRange(lines: TextLines, span: Span): Range {
  return { start: lines.positionAt(span.start), end: lines.positionAt(span.end) };
}

/**
 * The position a client meant, inside the note: LSP 3.17 reads a character past its line's end as the line's end
 * ("Position"), and so does the server for a line past the note's end (the note's end); a position between the
 * two halves of a surrogate pair (which a UTF-16 client never sends) as the place before the pair. Features then
 * never answer with a range outside the note. The position itself when it is inside.
 */
export function clampPosition(state: Pick<NoteState, 'lines' | 'text'>, pos: Position): Position {
  let offset = state.lines.offsetAt(pos);
  const around = offset > 0 ? state.text.slice(offset - 1, offset + 1) : '';
  if (around.length === 2 && isHighSurrogate(around, 0) && isLowSurrogate(around, 1)) offset--;
  const p = state.lines.positionAt(offset);
  return p.line === pos.line && p.character === pos.character ? pos : p;
}

const isHighSurrogate = (s: string, i: number): boolean => (s.charCodeAt(i) & 0xfc00) === 0xd800;
const isLowSurrogate = (s: string, i: number): boolean => (s.charCodeAt(i) & 0xfc00) === 0xdc00;

/** Note offset of an LSP position. */
export function toOffset(lines: TextLines, pos: Position): number {
  return lines.offsetAt(pos);
}

/** The block whose fences enclose an offset (fence lines included), if any. Binary search. */
export function blockAt(state: NoteState, offset: number): BlockReport | undefined {
  return blockHoldingOffset(state.report.blocks, (b) => b.block, offset);
}

/**
 * The blocks that meet the note offsets [from, to] (fence lines included), in order: found by binary
 * search, so a request about the visible lines of a large note reads only the blocks there.
 */
export function blocksBetween(state: NoteState, from: number, to: number): BlockReport[] {
  return blocksMeeting(state.report.blocks, (b) => b.block, from, to);
}

/** The blocks that have problems, in order (from the analysis's list of them where it has one). */
export function blocksWithProblems(state: NoteState): BlockReport[] {
  const { blocks, withProblems } = state.report;
  if (withProblems) return withProblems.map((i) => blocks[i]!);
  return blocks.filter((b) => b.problems.length > 0);
}

/** Display options of the core from the editor settings. */
export function displayOptions(s: Settings): DisplayOptions {
  return {
    ...DEFAULT_DISPLAY,
    digits: s.significantDigits,
    temperature: s.temperature,
    percent: s.polarization === 'percent',
  };
}

/** The range from `length` characters before the cursor to the cursor. */
export function back(position: Position, length: number): Range {
  return { start: { line: position.line, character: position.character - length }, end: position };
}

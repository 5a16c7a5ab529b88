/**
 * One open note as the server sees it: its text and version, a line index for
 * position conversion, and the core's analysis of it. Built once per version,
 * lazily; every feature reads from it.
 */
import type { Position, Range } from 'vscode-languageserver';
import {
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

/** Note offset of an LSP position. */
export function toOffset(lines: TextLines, pos: Position): number {
  return lines.offsetAt(pos);
}

/** The block whose fences enclose an offset (fence lines included), if any. Binary search. */
export function blockAt(state: NoteState, offset: number): BlockReport | undefined {
  const blocks = state.report.blocks;
  let lo = 0;
  let hi = blocks.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const b = blocks[mid].block;
    if (offset < b.openStart) hi = mid - 1;
    else if (offset > b.blockEnd) lo = mid + 1;
    else return blocks[mid];
  }
  return undefined;
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

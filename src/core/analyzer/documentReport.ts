/**
 * What the analysis of a note gives a host: a report per `levels` block (at
 * its place in the note), where a bounded analysis stopped, and the note's own
 * problems; and, inside the analyzer, what one reading of a note made (the
 * reports with their cache entries), which the two ways of reading a note
 * (aroundChange.ts, boundedReading.ts) return to the Analyzer.
 */
import type { BlockResults } from '../analysis/results';
import type { BlockInput, BlockMeta } from '../block/input';
import type { Dependency } from '../block/externals';
import type { FencedBlock } from '../text/fences';
import type { Problem, Span, Status } from '../types';
import type { Cached } from './blockCache';

/** Where a bounded analysis stopped: the first block not read, and the bound it would have passed. */
export interface Bounded {
  /** Note offset and 0-based line of the opening fence of the first block not read. */
  readonly offset: number;
  readonly line: number;
  readonly reason: 'blocks' | 'size';
}

/** Everything known about one block; spans are offsets into the note. */
export interface BlockReport {
  readonly block: FencedBlock;
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  readonly status: Status;
  /** Every problem of the block, sorted by position, with note offsets. */
  readonly problems: readonly Problem[];
  /** What the block took from outside its text (spectrum files, other runs); empty for most blocks. */
  readonly deps: readonly Dependency[];
  /** Maps a body-relative span (as in `meta` and `results`) to note offsets. */
  toNote(span: Span): Span;
}

/** The analysis of one note. */
export interface DocumentReport {
  readonly blocks: readonly BlockReport[];
  /** How many blocks were read afresh and how many came from the cache. */
  readonly stats: { readonly analysed: number; readonly reused: number };
  /** Set when the analysis stopped at a bound (see {@link AnalyzerLimits}); the blocks from there on are not in `blocks`. */
  readonly bounded: Bounded | null;
  /** Problems of the note as a whole (note offsets), such as `note-bounded`. */
  readonly problems: readonly Problem[];
  /** Indices in `blocks` of the blocks that have problems, ascending (a host lists them without visiting every block). */
  readonly withProblems?: readonly number[];
}

/** What one analysis of a note made: its blocks and their cache entries, and how it ended. */
export interface Reading {
  readonly reports: BlockReport[];
  readonly entries: Cached[];
  readonly complete: boolean;
  readonly bodyChars: number;
  readonly withProblems: readonly number[];
  readonly analysed: number;
  readonly bounded: Bounded | null;
}

/**
 * Boltzmark's own requests and notifications on top of LSP, all named
 * `boltzmark/…`, grouped by direction. docs/architecture.md lists them.
 */
import { RequestType, RequestType0 } from 'vscode-languageserver-protocol';
import type { ViewPayload } from '../core';

// ---- client → server ----

/** Parameters naming one block: the note and the 0-based line of its opening fence (or any line inside it). */
export interface BlockParams {
  readonly uri: string;
  readonly line: number;
}

/** The block's results as a Markdown table (for "Copy Block Results" and the preview fallback); null when no block is there. */
export const ResultsMarkdownRequest = new RequestType<BlockParams, string | null, void>('boltzmark/resultsMarkdown');

/** How the last analysis of a note went: blocks read afresh and reused from the cache. */
export interface AnalysisStats {
  readonly version: number;
  /** Whole-note analyses since the note was opened (one per version, plus one per change of analysis settings). */
  readonly runs: number;
  readonly blocks: number;
  readonly analysed: number;
  readonly reused: number;
}

/** Statistics of the latest analysis of a note (used by tests and benchmarks); null for an unknown note. */
export const AnalysisStatsRequest = new RequestType<{ readonly uri: string }, AnalysisStats | null, void>(
  'boltzmark/analysisStats',
);

/** The server's memory, bytes; `collected` tells whether a full garbage collection ran first (only when started with `--expose-gc`). */
export interface MemoryStats {
  readonly heapUsed: number;
  readonly rss: number;
  readonly collected: boolean;
}

/** The server's memory use (used by the tests, e.g. after a burst of edits). */
export const MemoryRequest = new RequestType0<MemoryStats, void>('boltzmark/memory');

/**
 * The curve view's data for the block at (or enclosing) a line: its curves,
 * measured point and markers, or its first error; null when no block is there.
 */
export const CurveDataRequest = new RequestType<BlockParams, ViewPayload | null, void>('boltzmark/curveData');

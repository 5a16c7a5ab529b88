/**
 * Boltzmark's own requests and notifications on top of LSP, all named
 * `boltzmark/…`, grouped by direction. docs/architecture.md lists them.
 */
import { RequestType, RequestType0 } from 'vscode-languageserver-protocol';
import type { ViewPayload } from '../core';

// ---- client → server ----

/**
 * The key of the client's `capabilities.experimental` that says it runs the commands Boltzmark's code lenses name
 * (`boltzmark.showCurve`, `boltzmark.copyResults`, …: commands of the VS Code extension, not of the server). The
 * server offers lenses only to a client that sets it to true; in any other editor a lens would be a button that
 * fails.
 */
export const LENS_COMMANDS_CAPABILITY = 'boltzmarkLensCommands';

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

// ---- server → client ----

/** A file the server asks the client about: its URI, as the server resolved a spectrum reference. */
export interface FileParams {
  readonly uri: string;
}

/**
 * Size (bytes) and modification time (ms) of a regular file, through the client's file system, or null when
 * there is none. The server asks where it cannot read the file itself (a workspace not on disk, the browser).
 */
export const FileStatRequest = new RequestType<
  FileParams,
  { readonly size: number; readonly mtime: number } | null,
  void
>('boltzmark/fileStat');

/** A file's text through the client's file system (UTF-8), or null when it cannot be read or passes 64 MB. */
export const FileTextRequest = new RequestType<FileParams, string | null, void>('boltzmark/fileText');

/** The server's spectrum files: how many it knows and how many parses it ran (tests and benchmarks: a file is parsed once). */
export interface SpectrumStats {
  readonly files: number;
  readonly parses: number;
}

/** The server's spectrum file counts (client → server; used by the tests and the benchmark). */
export const SpectrumStatsRequest = new RequestType0<SpectrumStats, void>('boltzmark/spectrumStats');

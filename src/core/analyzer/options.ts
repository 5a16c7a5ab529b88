/**
 * What an Analyzer is set up with: how much of one note it reads (the bounds a
 * responsive host sets), how much its cache of block bodies keeps, and the
 * contract's defaults for both.
 */
import { DEFAULT_ANALYSIS_OPTIONS, type AnalysisOptions } from '../analysis/analyse';

/**
 * How much of one note an analysis reads. A host that must stay responsive
 * (the language server) bounds it; reading stops before the first `levels`
 * block that would pass a bound, and the report says where and why.
 */
export interface AnalyzerLimits {
  /** Most `levels` blocks read per note. */
  readonly maxBlocks: number;
  /** Most characters of `levels` block bodies read per note, all blocks together. */
  readonly maxBodyChars: number;
  /**
   * Most characters of one block's body that are read (no bound when absent): a longer body is not read
   * and gets the error `block-large` (see blockBounds.ts).
   */
  readonly maxBlockChars?: number;
}

/** No bound: every block is read (the command line reports whole notebooks). */
export const UNBOUNDED: AnalyzerLimits = { maxBlocks: Infinity, maxBodyChars: Infinity };

/** Options of an {@link Analyzer}. */
export interface AnalyzerOptions extends AnalysisOptions {
  /** Extra fence info strings treated as `levels` blocks. */
  readonly infoStrings: readonly string[];
  /** Most blocks kept in the cache. */
  readonly cacheSize: number;
  /**
   * Most characters of block bodies kept in the cache besides those of the note analysed last: a long
   * body edited keystroke by keystroke leaves a new body each time, which a count of blocks alone would
   * let pile up to gigabytes.
   */
  readonly cacheChars: number;
  /** How much of a note is read; unbounded by default. */
  readonly limits: AnalyzerLimits;
}

/** The contract's defaults. */
export const DEFAULT_ANALYZER_OPTIONS: AnalyzerOptions = {
  ...DEFAULT_ANALYSIS_OPTIONS,
  infoStrings: [],
  cacheSize: 20_000,
  cacheChars: Infinity,
  limits: UNBOUNDED,
};

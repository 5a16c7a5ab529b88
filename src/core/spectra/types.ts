/**
 * Spectra given by reference: the parsed spectrum, the interface through
 * which a host hands the core a file's contents, and what one reference in
 * a block gives (its integral and the numbers behind it).
 *
 * The core never reads a file. A host (the command line, the language
 * server, a test) implements {@link SpectrumSource} and sets it as
 * `Externals.spectra` (block/externals.ts); the block readers ask it for a
 * path as written in the note and get one of the {@link SpectrumAnswer}s.
 */
import type { Span } from '../types';
import type { XUnit } from './axis';

/** Files above this size are refused unread (`spectrum-large`). */
export const SPECTRUM_MAX_BYTES = 64 * 1024 * 1024;

/** A spectrum as read from a file: points sorted by increasing x, in the file's units after XFACTOR/YFACTOR. */
export interface Spectrum {
  /** x of each point, increasing (the file's order is kept in `descending`). */
  readonly x: Float64Array;
  /** y of each point, in the same order as `x`. */
  readonly y: Float64Array;
  /** The file's x unit, or null for a text file without a header naming one (its x is then read in the region's unit). */
  readonly xUnit: XUnit | null;
  /** The y unit as the file names it (JCAMP-DX `##YUNITS`, a text header's second name), or null. */
  readonly yUnit: string | null;
  /** The observe frequency in MHz (JCAMP-DX `##.OBSERVE FREQUENCY`), which converts ppm ↔ Hz; null when not given. */
  readonly observeMHz: number | null;
  /** Which reader read it. */
  readonly format: 'jcamp' | 'text';
  /** The file's title (`##TITLE`), or null. */
  readonly title: string | null;
  /** True when the file stores its points toward decreasing x (as NMR files usually do). */
  readonly descending: boolean;
}

/** What reading a file's text gave: a spectrum, or why it is not one (with the file's 1-based line where known). */
export type SpectrumRead =
  | { readonly ok: true; readonly spectrum: Spectrum }
  | { readonly ok: false; readonly line: number | null; readonly message: string };

/**
 * A host's answer for one path as written in a note. Every answer but
 * `outside` names the dependency `key` (`file:<absolute path or URI>`) and its
 * `stamp` now (see block/externals.ts): the reader records both, so a block
 * is read again when the file appears, changes, is deleted or finishes parsing.
 * A host whose parse completes later must change the stamp it reports then.
 */
export type SpectrumAnswer =
  /** Parsed (or found malformed) and in memory. */
  | { readonly state: 'ready'; readonly key: string; readonly stamp: string; readonly spectrum: Spectrum }
  /** Being read or parsed off the request path; the block waits without an error. */
  | { readonly state: 'pending'; readonly key: string; readonly stamp: string | null }
  /** No such file. */
  | { readonly state: 'missing'; readonly key: string; readonly stamp: null }
  /** The path leaves the workspace (editor) or the note's folder tree (command line); never read. `where` names that boundary. */
  | { readonly state: 'outside'; readonly key: null; readonly where: string }
  /** Larger than {@link SPECTRUM_MAX_BYTES}; never read whole. */
  | { readonly state: 'large'; readonly key: string; readonly stamp: string; readonly size: number }
  /** Read, and not a spectrum: `line` is the file's 1-based line where the reader stopped, when known. */
  | {
      readonly state: 'malformed';
      readonly key: string;
      readonly stamp: string;
      readonly line: number | null;
      readonly message: string;
    };

/** What a host gives the core for spectrum references (`Externals.spectra`). */
export interface SpectrumSource {
  /**
   * The spectrum at `path`, as written in the note (relative to the note's
   * folder, `/` as separator). Must answer at once: a host that parses in the
   * background answers `pending` and changes the file's stamp when done.
   */
  lookup(path: string): SpectrumAnswer;
}

/** How the baseline under a region is taken (docs/format.md, "Spectra"). */
export type BaselineKind = 'linear' | 'none';

/** The integral of one region of one spectrum and what it rests on; all x values in `unit`. */
export interface SpectrumIntegral {
  /** The baseline-corrected trapezoidal integral, in y × `unit`. */
  readonly value: number;
  /** Its standard uncertainty from the noise region, or null without one. */
  readonly uncertainty: number | null;
  /**
   * The integral's standard uncertainty with the linear baseline's own noise, σ·√(Σ c_k²) (see
   * spectra/integrate.ts); null without a noise region or with the baseline `none`. Shown beside
   * `uncertainty`, not in it: the format fixes `uncertainty` as σ·|Δx|·√n (docs/format.md, "Spectra by reference").
   */
  readonly uncertaintyWithBaseline: number | null;
  /** Points of the spectrum inside the region (bounds included). */
  readonly points: number;
  /** The x unit of the file (or of the region, for a text file without one), or null when neither names one. */
  readonly unit: XUnit | null;
  /** The region, low to high, in `unit`. */
  readonly region: readonly [number, number];
  readonly baseline: BaselineKind;
  /** The baseline as a segment `[x0, y0, x1, y1]` over the region's first and last points (zero line for `none`). */
  readonly baselineLine: readonly [number, number, number, number];
  /** The noise region, low to high, in `unit`, or null. */
  readonly noise: readonly [number, number] | null;
  /** σ, the residual standard deviation of the noise region's straight-line fit, in y units; null without one. */
  readonly sigma: number | null;
  /** Points in the noise region (0 without one). */
  readonly noisePoints: number;
}

/**
 * One spectrum reference in a block, kept on the block's meta (`BlockMeta.spectra`)
 * in the order of the block's text, whether or not it could be followed.
 */
export interface SpectrumUse {
  /** Dotted path of the value it gives: `signal.hyperpolarized`, `series.signal[3]`, `lines[2].intensity`. */
  readonly key: string;
  /** The file as written (in the reference or the block's `spectrum:` default). */
  readonly file: string;
  /** Body-relative span of the whole reference (the mapping). */
  readonly span: Span;
  /** Body-relative span of the path as written (the reference's `spectrum:` value, or the block default's). */
  readonly fileSpan: Span;
  /** The dependency key the host gave (`file:…`), or null when the path was refused or no host could follow it. */
  readonly source: string | null;
  /** The integral, or null when the reference could not be followed (its diagnostic says why). */
  readonly result: SpectrumIntegral | null;
}

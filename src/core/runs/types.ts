/**
 * Runs by reference (notebook-format contract v1.2, "A run by reference"): a
 * block's `id` names a run that other blocks may use, in the same note or in
 * another (`{ run: <id> }`, `{ run: <note path>#<id> }`, the path relative to
 * the referring note's folder).
 *
 * The core never reads another note. A host implements {@link RunResolver}
 * (usually by feeding a {@link import('./runBook').RunBook} with note texts)
 * and hands it to the analyzer as `Externals.runs`. Every answer carries the
 * dependency key and stamp the reader records, so the analyzer's cache (and
 * the server's) re-read a block exactly when what it took from another run
 * changed.
 */
import type { BlockInput } from '../block/input';
import type { BlockResults } from '../analysis/results';
import type { Severity, Span, Status } from '../types';
import type { CellLine } from '../text/jupyter';

/** Where a reference stands in its block: `thermal: { run: … }` or `extrapolate.decay: { run: … }`. */
export type RunUse = 'thermal' | 'decay';

/**
 * One reference a block makes, as written, with body-relative spans (like
 * every span of `BlockMeta`), so that hosts can offer definition, references
 * and rename without reading the block again.
 */
export interface RunRef {
  readonly use: RunUse;
  /** The note path as written before `#` (relative to the referring note's folder), or null for a bare id. */
  readonly note: string | null;
  /** The run id referred to. */
  readonly id: string;
  /** The whole reference value (`other.md#run 4`), body-relative. */
  readonly span: Span;
  /** The id part alone, body-relative: what a rename replaces. */
  readonly idSpan: Span;
  /** The note path part alone, body-relative, or null for a bare id. */
  readonly noteSpan: Span | null;
}

/** Where a run is defined: its note (as the host names notes) and the span of its `id` value in that note. */
export interface RunPlace {
  readonly note: string;
  /** Note offsets of the `id` value. */
  readonly span: Span;
  /** 0-based line of the `id` value in its note. */
  readonly line: number;
  /** In a notebook the host set whole (its Markdown cells joined): the cell and the line in it (RunBookOptions.cellStarts). */
  readonly cell?: CellLine;
}

/** The first error of a referenced block: what `reference-invalid` names. */
export interface RunError {
  readonly code: string;
  readonly message: string;
  readonly severity: Severity;
  /** 0-based line in the referenced block's note. */
  readonly line: number;
  /** In a notebook set whole: the cell and the line in it. */
  readonly cell?: CellLine;
}

/** A referenced run as its analysis left it. */
export interface RunFacts {
  readonly id: string;
  readonly place: RunPlace;
  /** The block's `date`, as written, or null. */
  readonly date: string | null;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  readonly status: Status;
  /** The block's first error, or null when it read and analysed cleanly. */
  readonly error: RunError | null;
}

/**
 * What following one reference gave. Each answer names the dependency key
 * the referring block records and the stamp that key has now; the host's
 * `Externals.stamp(key)` must answer the same stamp until something the
 * answer depends on changes.
 */
export type RunAnswer =
  | { readonly kind: 'found'; readonly run: RunFacts; readonly key: string; readonly stamp: string | null }
  /** No block has that id (in that note, when one was named); `known` are the ids that could have been meant. */
  | { readonly kind: 'unknown'; readonly known: readonly string[]; readonly key: string; readonly stamp: string | null }
  /** The reference leads back to the referring block; `chain` lists the ids on the way, the referring one first. */
  | { readonly kind: 'cycle'; readonly chain: readonly string[]; readonly key: string; readonly stamp: string | null }
  /** The named note does not exist (or lies outside what the host may read); `note` is the path it looked for. */
  | {
      readonly kind: 'note-missing';
      readonly note: string;
      /** Why the host did not read it, when it exists but may not be read (outside the folders given). */
      readonly why?: string;
      readonly key: string;
      readonly stamp: string | null;
    };

/** Other blocks of the workspace that carry the same id as the asking block (for `id-duplicate`). */
export interface RunCopies {
  /** The other copies' places (not the asking block's own). */
  readonly others: readonly RunPlace[];
  readonly key: string;
  readonly stamp: string | null;
}

/**
 * The host's side of runs by reference. `from` is the referring note, as
 * `Externals.note` names it; `at` is the body of the referring block, so
 * that the source can tell a block from itself and find cycles.
 */
export interface RunResolver {
  /** Follows one reference written in `from`. */
  resolve(from: string, ref: { readonly note: string | null; readonly id: string }, at: string): RunAnswer;
  /** The other blocks with `id`, for a block of `from` with body `at`. */
  copies(from: string, id: string, at: string): RunCopies;
}

/** Dependency keys of runs start with this (the server's part for runs owns them). */
export const RUN_KEY_PREFIX = 'run:';

/** The key of a reference as written in note `from` (unique per note and text of the reference). */
export function runRefKey(from: string, note: string | null, id: string): string {
  return RUN_KEY_PREFIX + JSON.stringify(['ref', from, note, id]);
}

/** The key of the set of blocks carrying `id` (for `id-duplicate`). */
export function runCopiesKey(id: string): string {
  return RUN_KEY_PREFIX + JSON.stringify(['copies', id]);
}

/** A run key taken apart, or null when `key` is not one. */
export function parseRunKey(
  key: string,
):
  | { readonly kind: 'ref'; readonly from: string; readonly note: string | null; readonly id: string }
  | { readonly kind: 'copies'; readonly id: string }
  | null {
  if (!key.startsWith(RUN_KEY_PREFIX)) return null;
  try {
    const v: unknown = JSON.parse(key.slice(RUN_KEY_PREFIX.length));
    if (!Array.isArray(v)) return null;
    if (v[0] === 'ref' && v.length === 4 && typeof v[1] === 'string' && typeof v[3] === 'string')
      return { kind: 'ref', from: v[1], note: typeof v[2] === 'string' ? v[2] : null, id: v[3] };
    if (v[0] === 'copies' && v.length === 2 && typeof v[1] === 'string') return { kind: 'copies', id: v[1] };
    return null;
  } catch {
    return null;
  }
}

/** The extrapolation of a block's polarization to another time (`extrapolate:`), result `polarizationAt`. */
export interface PolarizationAt {
  /** The time extrapolated to, s. */
  readonly time: number;
  readonly value: number;
  readonly uncertainty: number | null;
  /** The time the block's polarization was measured at, s. */
  readonly from: number;
  /** T₁ used, s, with its standard uncertainty, and the run it came from (null when typed). */
  readonly decay: { readonly value: number; readonly uncertainty: number | null; readonly run: string | null };
}

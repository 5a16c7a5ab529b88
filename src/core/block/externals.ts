/**
 * What a block may take from outside its own text: the contents of a
 * spectrum file, another block named by its id. The core never reads a file
 * or another note itself; each host (command line, language server, VS Code
 * client, tests) implements {@link Externals} and hands it to the analyzer.
 *
 * Whatever a reader takes from outside it records as a {@link Dependency}: a
 * key naming the thing (a file's path, a run's id, as the host spells them)
 * and the stamp it had when read (a file's size and modification time, a
 * block's version). A cached analysis is reused only while every one of its
 * dependencies still has the same stamp (see analyzer/blockCache.ts), so a
 * changed spectrum or a changed referenced block makes exactly the blocks
 * that used it read again.
 */
import type { SpectrumSource } from '../spectra/types';

import type { RunResolver } from '../runs/types';

/** One thing a block's analysis read from outside the block, with the stamp it had then. */
export interface Dependency {
  /** What was read, as the host names it (unique per host: an absolute path, a workspace run id). */
  readonly key: string;
  /** Its identity when read; null when it was looked for and not found (its appearance changes the stamp). */
  readonly stamp: string | null;
}

/**
 * The host's side: the sources a block may read from, and the current stamp
 * of anything read before. Each source is optional; a reader that meets a
 * reference to a source the host did not give reports that it cannot follow
 * it.
 */
export interface Externals {
  /**
   * The note these sources answer for (its URI or path). References are relative to their note, so a
   * cached analysis that read from outside is reused only for the same note.
   */
  readonly note: string;
  /** Other runs, for `{ run: … }` references (see runs/types.ts); absent where the host follows none. */
  readonly runs?: RunResolver;
  /** The stamp a dependency key has now (null: not there). Asked for every dependency of a cached block on reuse. */
  stamp(key: string): string | null;
  /** Spectrum files by path as written in the note (spectra/types.ts); keys `file:<absolute path or URI>`. */
  readonly spectra?: SpectrumSource;
  /**
   * Optional, with {@link changedSince}: a token that stays the same only while every stamp this object
   * answers stays the same. A host that edits a large note passes both, so that the blocks kept from the
   * last analysis are not each asked for their stamps on every keystroke.
   */
  changes?(): string;
  /** The keys whose stamps may have changed since {@link changes} gave `since`; null when that is not known. */
  changedSince?(since: string): KeyChanges | null;
}

/** Which dependency keys may have changed (see {@link Externals.changedSince}). */
export interface KeyChanges {
  /** True when none may have. */
  readonly none: boolean;
  has(key: string): boolean;
  /**
   * Optional: the opening offsets (in the note's current text) of every block of `note` that read a key that
   * may have changed, when the host knows them; the analyzer then asks only those blocks.
   */
  offsetsIn?(note: string): readonly number[] | null;
}

/** The dependencies among `deps` that must be asked again, given what may have changed (null: all). */
export function mayHaveChanged(deps: readonly Dependency[], changes: KeyChanges | null): boolean {
  if (deps.length === 0) return false;
  if (changes === null) return true;
  if (changes.none) return false;
  for (const d of deps) if (changes.has(d.key)) return true;
  return false;
}

/** A dependency list shared by every block that has none (most blocks). */
export const NO_DEPENDENCIES: readonly Dependency[] = Object.freeze([]);

/** True when every dependency still has the stamp it was read with, for the same note (`readFor`). */
export function dependenciesHold(
  deps: readonly Dependency[],
  readFor: string | null,
  externals: Externals | null,
): boolean {
  if (deps.length === 0) return true;
  if (!externals || externals.note !== readFor) return false;
  for (const d of deps) if (externals.stamp(d.key) !== d.stamp) return false;
  return true;
}

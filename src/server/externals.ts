/**
 * The sources a note's blocks may read values from by reference (see
 * src/core/block/externals.ts): one object per note, whose `note` is the
 * note's URI. Each kind of source (spectrum files, other runs) adds its part
 * here; a dependency key names what was read so that `stamp` can answer for
 * it again later, and the analysis of a note is redone when a stamp changes.
 */
import type { Externals, RunResolver } from '../core';

/** The parts the server has; each answers the stamp of the keys it gave out (null for keys it does not know). */
export interface ExternalPart {
  /** Whether this part gave out the key (keys are prefixed by the part, e.g. `file:` or `run:`). */
  owns(key: string): boolean;
  stamp(key: string): string | null;
  /** The part for runs (src/server/runs) gives the resolver of `{ run: … }` references. */
  readonly runs?: RunResolver;
  /** The part's own sources for one note (such as `spectra`), merged into the note's externals. */
  sourcesFor?(uri: string): Omit<Partial<Externals>, 'note' | 'stamp'>;
}

/** The externals of one note, from the server's parts. */
export function noteExternals(uri: string, parts: readonly ExternalPart[]): Externals {
  const runs = parts.find((p) => p.runs)?.runs;
  let sources: Omit<Partial<Externals>, 'note' | 'stamp'> = {};
  for (const p of parts) if (p.sourcesFor) sources = { ...sources, ...p.sourcesFor(uri) };
  return {
    ...sources,
    note: uri,
    ...(runs ? { runs } : {}),
    stamp(key) {
      for (const p of parts) if (p.owns(key)) return p.stamp(key);
      return null;
    },
  };
}

/**
 * The sources a note's blocks may read values from by reference (see
 * src/core/block/externals.ts): one object per note, whose `note` is the
 * note's URI. Each kind of source (spectrum files, other runs) adds its part
 * here; a dependency key names what was read so that `stamp` can answer for
 * it again later, and the analysis of a note is redone when a stamp changes.
 */
import type { Externals } from '../core';

/** The parts the server has; each answers the stamp of the keys it gave out (null for keys it does not know). */
export interface ExternalPart {
  /** Whether this part gave out the key (keys are prefixed by the part, e.g. `file:` or `run:`). */
  owns(key: string): boolean;
  stamp(key: string): string | null;
}

/** The externals of one note, from the server's parts. */
export function noteExternals(uri: string, parts: readonly ExternalPart[]): Externals {
  return {
    note: uri,
    stamp(key) {
      for (const p of parts) if (p.owns(key)) return p.stamp(key);
      return null;
    },
  };
}

/**
 * The sources a note's blocks may read values from by reference (see
 * src/core/block/externals.ts): one object per note, whose `note` is the
 * note's URI. Each kind of source (spectrum files, other runs) adds its part
 * here; a dependency key names what was read so that `stamp` can answer for
 * it again later, and the analysis of a note is redone when a stamp changes.
 */
import type { Externals, KeyChanges, RunResolver } from '../core';

/** The parts the server has; each answers the stamp of the keys it gave out (null for keys it does not know). */
export interface ExternalPart {
  /** Whether this part gave out the key (keys are prefixed by the part, e.g. `file:` or `run:`). */
  owns(key: string): boolean;
  stamp(key: string): string | null;
  /** The part for runs (src/server/runs) gives the resolver of `{ run: … }` references. */
  readonly runs?: RunResolver;
  /** The part's own sources for one note (such as `spectra`), merged into the note's externals. */
  sourcesFor?(uri: string): Omit<Partial<Externals>, 'note' | 'stamp' | 'changes' | 'changedSince'>;
  /** A count that moves whenever a stamp of this part may have changed (see Externals.changes). */
  changes?(): number;
  /** The keys of this part whose stamps may have changed since {@link changes} was `since`; null: unknown. */
  changedSince?(since: number): KeyChanges | null;
}

/** The externals of one note, from the server's parts. */
export function noteExternals(uri: string, parts: readonly ExternalPart[]): Externals {
  const runs = parts.find((p) => p.runs)?.runs;
  let sources: Omit<Partial<Externals>, 'note' | 'stamp' | 'changes' | 'changedSince'> = {};
  for (const p of parts) if (p.sourcesFor) sources = { ...sources, ...p.sourcesFor(uri) };
  const counted = parts.every((p) => typeof p.changes === 'function' && typeof p.changedSince === 'function');
  return {
    ...sources,
    note: uri,
    ...(runs ? { runs } : {}),
    stamp(key) {
      for (const p of parts) if (p.owns(key)) return p.stamp(key);
      return null;
    },
    // The token is every part's count in turn; what changed since one is what changed in any part.
    ...(counted
      ? {
          changes: () => parts.map((p) => p.changes!()).join('/'),
          changedSince(since: string): KeyChanges | null {
            const counts = since.split('/').map(Number);
            if (counts.length !== parts.length) return null;
            const each: KeyChanges[] = [];
            for (let i = 0; i < parts.length; i++) {
              const c = parts[i]!.changedSince!(counts[i]!);
              if (c === null) return null;
              if (!c.none) each.push(c);
            }
            if (each.length === 0) return { none: true, has: () => false, offsetsIn: () => [] };
            if (each.length === 1) return each[0]!;
            return {
              none: false,
              has: (key) => each.some((c) => c.has(key)),
              offsetsIn: (note) => {
                const out: number[] = [];
                for (const c of each) {
                  const o = c.offsetsIn?.(note);
                  if (!o) return null;
                  out.push(...o);
                }
                return out;
              },
            };
          },
        }
      : {}),
  };
}

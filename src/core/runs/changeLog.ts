/**
 * What changed in a book of runs, change by change, so that a host holding
 * stamps read at some count can learn which dependency keys may have moved
 * since (Externals.changedSince) without asking each one: the ids whose sets
 * of blocks changed (their `copies` keys) and whether any reference key may
 * have changed; a change of unknown reach (a note set afresh, deleted,
 * loaded) makes every key suspect.
 */
import type { KeyChanges } from '../block/externals';
import { RUN_KEY_PREFIX, runCopiesKey } from './types';

/** The reach of one change: the ids whose sets of blocks changed, and whether reference keys may have. */
export interface ChangeReach {
  readonly ids: ReadonlySet<string>;
  readonly refs: boolean;
}

/** Where the blocks carrying an id are (in which note, opening where). */
export type Carriers = (
  id: string,
) => readonly { readonly note: string; readonly block: { readonly openStart: number } }[];

/** Changes remembered: more than come between two readings of a note by a host. */
const KEPT = 64;

/** What {@link ChangeLog.since} answers when nothing changed. */
const NO_CHANGE: KeyChanges = { none: true, has: (): boolean => false, offsetsIn: () => [] };

/** How a `copies` key starts (the other run keys are keys of references). */
const COPIES_KEY_START = runCopiesKey('').slice(0, -3);

/** The latest changes of a book, oldest first. */
export class ChangeLog {
  private count = 0;
  private log: { readonly count: number; readonly reach: ChangeReach | null }[] = [];

  /** The number of changes so far: a count that moves with every change. */
  get changes(): number {
    return this.count;
  }

  /** Records one change, of known reach or (null) of any. */
  record(reach: ChangeReach | null): void {
    this.count++;
    this.log.push({ count: this.count, reach });
    if (this.log.length > KEPT) this.log = this.log.slice(-KEPT);
  }

  /** The keys that may have changed since the count was `since`; null when that is not known. */
  since(since: number, carriers: Carriers): KeyChanges | null {
    if (since === this.count) return NO_CHANGE;
    const first = this.log.findIndex((e) => e.count > since);
    if (first < 0 || this.log[first]!.count !== since + 1) return null;
    const ids = new Set<string>();
    let refs = false;
    for (let i = first; i < this.log.length; i++) {
      const reach = this.log[i]!.reach;
      if (reach === null) return null;
      for (const id of reach.ids) ids.add(id);
      refs ||= reach.refs;
    }
    const keys = new Set([...ids].map(runCopiesKey));
    return {
      none: ids.size === 0 && !refs,
      has: (key) => keys.has(key) || (refs && key.startsWith(RUN_KEY_PREFIX) && !key.startsWith(COPIES_KEY_START)),
      // The blocks of a note that carry a changed id; when a reference may have changed, any block may have.
      offsetsIn: (note) => {
        if (refs) return null;
        const out: number[] = [];
        for (const id of ids) for (const b of carriers(id)) if (b.note === note) out.push(b.block.openStart);
        return out;
      },
    };
  }
}

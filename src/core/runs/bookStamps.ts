/**
 * The change bookkeeping of the book of runs (runBook.ts): the log of its
 * changes, the stamps of the dependency keys it hands out, kept until a change
 * could alter them, and the runs evaluated so far with the stamp of what each
 * read. A reference key's stamp is a hash of the bodies of every block
 * reachable from the referenced one and of how each of their references
 * resolved (and, for a broken run, of the line where it breaks): it changes
 * exactly when an answer could. A `copies` key's stamp names the notes holding
 * the id.
 */
import type { KeyChanges } from '../block/externals';
import { hash, type BookBlock } from './bookBlocks';
import { nearIds, type BookIndex, type Stretch } from './bookIndex';
import { ChangeLog, type ChangeReach } from './changeLog';
import { parseRunKey, runCopiesKey, type RunFacts } from './types';

/** A run as evaluated: its facts, the stamp of what it read, and the line its block opened on then. */
export interface Evaluated {
  readonly stamp: string;
  readonly facts: RunFacts;
  readonly line: number;
}

/** The stamps and changes of one book. */
export class BookStamps {
  /** Evaluated blocks, by block, with the stamp of what they read. */
  readonly evaluated = new WeakMap<BookBlock, Evaluated>();
  /** Stamps computed since the last change that could alter them: of `copies` keys, and of reference keys. */
  private readonly copyStamps = new Map<string, string | null>();
  private readonly refStamps = new Map<string, string | null>();
  /** The latest changes and their reach (see {@link since}). */
  private readonly log = new ChangeLog();

  constructor(private readonly index: BookIndex) {}

  /** A count that moves with every change of the book. */
  get changes(): number {
    return this.log.changes;
  }

  /** The keys whose stamps may have changed since {@link changes} was `since`, or null when that is not known. */
  since(since: number): KeyChanges | null {
    return this.log.since(since, (id) => this.index.blocksWithId(id));
  }

  /**
   * Records a change: of known reach (the ids whose sets of blocks changed, and whether any block's body did,
   * which reference stamps hash) or, without `reach`, of any.
   */
  changed(reach?: ChangeReach): void {
    this.log.record(reach ?? null);
    if (reach) {
      for (const id of reach.ids) this.copyStamps.delete(runCopiesKey(id));
      if (reach.refs) this.refStamps.clear();
    } else {
      this.copyStamps.clear();
      this.refStamps.clear();
    }
  }

  /** The current stamp of a key the book handed out (with an answer to a reference, or to `copies`). */
  stamp(key: string): string | null {
    const copy = this.copyStamps.get(key);
    if (copy !== undefined) return copy;
    const known = this.refStamps.get(key);
    if (known !== undefined) return known;
    const parsed = parseRunKey(key);
    let stamp: string | null = null;
    if (parsed?.kind === 'ref') {
      const r = this.index.locate(parsed.from, parsed);
      // A run not evaluated since it was read: where it breaks is not known yet, so this stamp is not kept (the
      // one asked once it is evaluated, as a reference to it resolves, is).
      if (r.kind === 'found' && !this.evaluated.has(r.block)) return this.closure(r.block);
      // An unknown id's answer names the closest ids: it changes with them.
      // What a referring block says of a broken run names the line where it breaks: that line is in the stamp.
      stamp =
        r.kind === 'found'
          ? this.closure(r.block) + this.brokenLine(r.block)
          : r.kind === 'unknown'
            ? hash('unknown\n' + nearIds(parsed.id, r.among).join('\n'))
            : null;
    } else if (parsed?.kind === 'copies') {
      stamp = this.copiesStamp(parsed.id);
    }
    (parsed?.kind === 'copies' ? this.copyStamps : this.refStamps).set(key, stamp);
    return stamp;
  }

  /**
   * The stamp of a block: its body and, for every block reachable from it, its body, how its references resolved
   * and, where it is broken, the line its error names (which the messages of the blocks before it repeat).
   */
  closure(start: BookBlock): string {
    const seen = new Set<BookBlock>([start]);
    const queue: BookBlock[] = [start];
    const parts: string[] = [];
    for (let i = 0; i < queue.length; i++) {
      const b = queue[i]!;
      parts.push(`${b.note}#${b.id ?? b.index}:${b.hash}`);
      // A broken run further on names its line in the messages of the runs before it in the chain.
      if (i > 0) parts.push(this.brokenLine(b));
      for (const ref of b.refs) {
        const r = this.index.locate(b.note, ref);
        if (r.kind !== 'found') {
          parts.push(`${ref.note ?? ''}#${ref.id}:${r.kind}`);
          continue;
        }
        if (!seen.has(r.block)) {
          seen.add(r.block);
          queue.push(r.block);
        }
      }
    }
    return hash(parts.join('\n'));
  }

  /**
   * True when the stamps of references may change with a re-indexed stretch of a note. A reference's stamp hashes
   * the blocks it reaches and, for an unknown id, the closest ids, and for a broken run the line where it breaks.
   * So it may change when a block that a reference names or that makes references was read again differently,
   * when an id came or went, or when a named broken run moved to other lines; none of this can matter where no
   * reference is written.
   */
  referenceStampsMayChange(s: Stretch): boolean {
    const { dropped, added, moved, bodies } = s;
    if (this.index.namedCount() + dropped.reduce((n, b) => n + b.refs.length, 0) === 0) return false;
    const named = (b: BookBlock): boolean => b.id !== null && this.index.isNamed(b.id);
    if (bodies && (s.ids.size > 0 || [...dropped, ...added].some((b) => b.refs.length > 0 || named(b)))) return true;
    if (!s.linesMoved) return false;
    // A named broken run moved, or was read again near the change (the same body, at another line); a named run
    // not evaluated since it was last read again may be broken too.
    return (
      dropped.some((b) => named(b) && this.brokenLine(b) !== '') ||
      moved.some((b) => named(b) && (!this.evaluated.has(b) || this.brokenLine(b) !== ''))
    );
  }

  /** For a run evaluated as broken, `@` and the line where it breaks; '' otherwise (or not evaluated yet). */
  private brokenLine(b: BookBlock): string {
    const memo = this.evaluated.get(b);
    const f = memo?.facts;
    if (!memo || !f || (f.results && !f.error)) return '';
    // The error's line is as evaluated; the place moves with the block.
    return `@${f.error ? f.error.line + b.block.openLine - memo.line : f.place.line}`;
  }

  /** The notes holding a block with `id` (one entry per block), sorted: what an `id-duplicate` message says. */
  private copiesStamp(id: string): string | null {
    const list = this.index.blocksWithId(id);
    if (list.length === 0) return null;
    return list.length === 1
      ? '1'
      : hash(
          list
            .map((b) => b.note)
            .sort()
            .join('\n'),
        );
  }
}

/**
 * Walks over the graph of written references between the book's blocks
 * (runBook.ts): the longest chain from a block, a path from one block to
 * another, and, backwards, the references that lead to a block and the notes
 * that use a note's blocks. None evaluates anything; `follow` gives the block
 * a reference leads to (null when it leads nowhere).
 */
import { spanToNote } from '../analyzer/report';
import type { BookBlock, BookReference } from './bookBlocks';
import type { RunRef } from './types';

/** The block a reference written in block `from` leads to, or null. */
export type Follow = (from: BookBlock, ref: RunRef) => BookBlock | null;

/**
 * The number of runs on the longest chain of written references from a block
 * (the block itself counts 1), or more than `bound` when it is longer than
 * `bound`; a cycle counts as ending where it closes. Lengths are kept until
 * the book's change count moves (exact ones, and "longer than k"), so a
 * lattice of references is walked once per block and bound, not once per
 * path.
 */
export class ChainLengths {
  private readonly known = new Map<BookBlock, { exact?: number; above?: number }>();
  private knownAt = -1;

  constructor(private readonly follow: Follow) {}

  /** The chain length from `b`, with the book at change count `changes`. */
  of(b: BookBlock, bound: number, changes: number): number {
    if (this.knownAt !== changes) {
      this.known.clear();
      this.knownAt = changes;
    }
    return this.from(b, bound, new Set()).length;
  }

  private from(b: BookBlock, bound: number, on: Set<BookBlock>): { length: number; cut: boolean } {
    const known = this.known.get(b);
    if (known?.exact !== undefined) return { length: known.exact, cut: false };
    if (known?.above !== undefined && known.above >= bound) return { length: bound + 1, cut: false };
    if (bound <= 0) return { length: 1, cut: false };
    if (on.has(b)) return { length: 0, cut: true };
    on.add(b);
    let longest = 0;
    let cut = false;
    for (const ref of b.refs) {
      const t = this.follow(b, ref);
      if (!t) continue;
      const r = this.from(t, bound - 1, on);
      cut ||= r.cut;
      longest = Math.max(longest, r.length);
      if (longest >= bound) break;
    }
    on.delete(b);
    const length = 1 + longest;
    if (!cut) {
      if (length <= bound) this.known.set(b, { exact: length });
      else this.known.set(b, { above: Math.max(bound, known?.above ?? 0) });
    }
    return { length, cut };
  }
}

/** The blocks on a path of written references from `start` to `goal` (start first, goal last), or null. */
export function pathTo(start: BookBlock, goal: BookBlock, follow: Follow): BookBlock[] | null {
  const seen = new Set<BookBlock>([start]);
  const back = new Map<BookBlock, BookBlock>();
  const queue: BookBlock[] = [start];
  for (let i = 0; i < queue.length; i++) {
    const b = queue[i]!;
    if (b === goal) {
      const path: BookBlock[] = [b];
      for (let at = back.get(b); at; at = back.get(at)) path.unshift(at);
      return path;
    }
    for (const ref of b.refs) {
      const t = follow(b, ref);
      if (t && !seen.has(t)) {
        seen.add(t);
        back.set(t, b);
        queue.push(t);
      }
    }
  }
  return null;
}

/** The notes of a book, each with its `levels` blocks, in order. */
type Notes = Iterable<{ readonly blocks: readonly BookBlock[] }>;

/** Every reference, in every note given, that leads to `target`. */
export function referrersOf(target: BookBlock, notes: Notes, follow: Follow): BookReference[] {
  const out: BookReference[] = [];
  if (target.id === null) return out;
  for (const n of notes)
    for (const b of n.blocks)
      for (const ref of b.refs) {
        if (ref.id !== target.id) continue;
        if (follow(b, ref) !== target) continue;
        out.push({ from: b, ref, span: spanToNote(b.block, ref.span), idSpan: spanToNote(b.block, ref.idSpan) });
      }
  return out;
}

/**
 * The notes whose blocks use one of `changed`'s blocks (`blocks`), directly or through other blocks, `changed`
 * itself left out.
 */
export function dependentNotes(changed: string, blocks: readonly BookBlock[], notes: Notes, follow: Follow): string[] {
  // Who refers to whom, backwards, once; then a walk from the changed note's blocks.
  const back = new Map<BookBlock, BookBlock[]>();
  for (const n of notes)
    for (const b of n.blocks)
      for (const ref of b.refs) {
        const t = follow(b, ref);
        if (!t) continue;
        const list = back.get(t);
        if (list) list.push(b);
        else back.set(t, [b]);
      }
  const seen = new Set<BookBlock>(blocks);
  const queue = [...seen];
  const result = new Set<string>();
  for (let i = 0; i < queue.length; i++)
    for (const b of back.get(queue[i]!) ?? []) {
      if (seen.has(b)) continue;
      seen.add(b);
      queue.push(b);
      result.add(b.note);
    }
  result.delete(changed);
  return [...result];
}

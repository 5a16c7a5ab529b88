/**
 * What an Analyzer remembers of the notes it analysed last, so that the next
 * version of a note is scanned only where it changed. The fence scan is a
 * function of the text alone and is outside every block at a fence's opening
 * line, so an earlier scan can be taken over up to the last fence that opens
 * before the first changed character, and again from the first fence that
 * opens, in both versions, inside the unchanged end of the text: from there on
 * the two scans see the same characters in the same state, and every block is
 * the old one moved by the change in length (and in line count).
 */
import type { FencedBlock } from '../text/fences';
import { commonPrefix, commonSuffix } from '../text/common';

/** One fence found by a scan: where it opens and, for our blocks, what was made of it. */
export interface FenceRecord<R, E> {
  /** Note offset and 0-based line of the opening fence line. */
  readonly openStart: number;
  readonly openLine: number;
  /** Our block's report and cache entry; null for a fence of another language. */
  readonly report: R | null;
  readonly entry: E | null;
}

/** A note as last analysed. */
export interface NoteMemory<R, E> {
  readonly text: string;
  /** Every fence of the note, in order, up to where the analysis stopped. */
  readonly fences: readonly FenceRecord<R, E>[];
  /** False when a bound stopped the analysis, so `fences` does not reach the end of the note. */
  readonly complete: boolean;
}

/** How to analyse a new text from a remembered version of it. */
export interface Reuse<R, E> {
  readonly memory: NoteMemory<R, E>;
  /** Fences taken over as they are: `memory.fences` before this index. */
  readonly keep: number;
  /** Where the scan starts again: offset and line (of the first fence not kept, or the top of the note). */
  readonly from: number;
  readonly line: number;
  /** New length minus old length. */
  readonly delta: number;
  /** Offsets of the new text from here on hold the old text from `syncFrom − delta` on. */
  readonly syncFrom: number;
  /** True when the whole text is unchanged. */
  readonly same: boolean;
}

/**
 * What a host that applied the edits itself knows about a new text: it
 * agrees with `previous` (the text of an earlier analysis) in at least its
 * first `prefix` and its last `suffix` characters. Smaller numbers than the
 * true ones are safe (more is read again); larger ones are not.
 */
export interface TextChange {
  readonly previous: string;
  readonly prefix: number;
  readonly suffix: number;
}

/**
 * The remembered note that shares the most text with `text`, and how much of its scan is still good; null when none
 * shares anything. With a `change` whose previous text is remembered, the shared ends are taken from it and the texts
 * are not compared at all, so the plan costs nothing that grows with the note.
 */
export function planReuse<R, E>(
  memories: readonly NoteMemory<R, E>[],
  text: string,
  change?: TextChange,
): Reuse<R, E> | null {
  let best: Reuse<R, E> | null = null;
  let bestShared = 0;
  const known = change
    ? memories.find((m) => m.text.length === change.previous.length && m.text === change.previous)
    : undefined;
  for (const memory of known ? [known] : memories) {
    const old = memory.text;
    const hinted = memory === known && change !== undefined;
    const prefix = hinted ? Math.max(0, Math.min(change.prefix, old.length, text.length)) : commonPrefix(old, text);
    // An unchanged note is taken over whole, unless a bound stopped its analysis (then the scan resumes at its last fence).
    const same = prefix === old.length && prefix === text.length && memory.complete;
    const suffix = same
      ? 0
      : hinted
        ? Math.max(0, Math.min(change.suffix, old.length - prefix, text.length - prefix))
        : commonSuffix(old, text, prefix);
    if (prefix + suffix <= bestShared && !same) continue;
    // The last fence that opens strictly before the first changed character: its line, and the one
    // before it, read the same in both versions, so the old scan was at a line start outside any block.
    const keep = same ? memory.fences.length : firstAtOrAfter(memory.fences, prefix);
    const restart = !same && keep > 0 ? memory.fences[keep - 1]! : null;
    best = {
      memory,
      keep: restart ? keep - 1 : keep,
      from: restart ? restart.openStart : 0,
      line: restart ? restart.openLine : 0,
      delta: text.length - old.length,
      syncFrom: text.length - suffix,
      same,
    };
    bestShared = prefix + suffix;
    if (same) break;
  }
  return best;
}

/** Index of the first fence opening at or after `offset` (fences are in order). */
function firstAtOrAfter<R, E>(fences: readonly FenceRecord<R, E>[], offset: number): number {
  let lo = 0;
  let hi = fences.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (fences[mid]!.openStart < offset) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Index of the remembered fence that the new scan's `block` continues from,
 * or -1: the block must open inside the unchanged end of the text, at the
 * place a remembered fence opened (moved by the change in length).
 */
export function resumeAt<R, E>(reuse: Reuse<R, E>, block: FencedBlock): number {
  if (!reuse.memory.complete || block.openStart < reuse.syncFrom) return -1;
  const fences = reuse.memory.fences;
  const i = firstAtOrAfter(fences, block.openStart - reuse.delta);
  return i < fences.length && fences[i]!.openStart === block.openStart - reuse.delta ? i : -1;
}

/** A block moved by `delta` characters and `lines` lines, with the body it already has. */
export function movedBlock(b: FencedBlock, delta: number, lines: number): FencedBlock {
  return {
    ...b,
    openLine: b.openLine + lines,
    closeLine: b.closeLine === null ? null : b.closeLine + lines,
    openStart: b.openStart + delta,
    openEnd: b.openEnd + delta,
    blockEnd: b.blockEnd + delta,
    bodyStart: b.bodyStart + delta,
    lines: b.lines.length === 0 ? b.lines : b.lines.map((l) => ({ ...l, docStart: l.docStart + delta })),
    bodyLine: b.bodyLine + lines,
  };
}

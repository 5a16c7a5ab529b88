/**
 * What an Analyzer remembers of the notes it analysed last, so that the next
 * version of a note is scanned only where it changed. The fence scan is a
 * function of the text alone, and at a fence's opening line it is outside
 * every fenced block and every HTML block (a fence opens inside neither; the
 * line after it is in that fence, whatever came before: the scan's state
 * holds nothing else, such as an open paragraph). So an earlier scan can be
 * taken over up to the last fence that opens before the first changed
 * character, and again from the first fence that opens, in both versions,
 * inside the unchanged end of the text: from there on the two scans see the
 * same characters in the same state, and every block is the old one moved by
 * the change in length (and in line count). An edit that opens an HTML block
 * (a `<!--` typed above the blocks) finds no such fence until the block ends,
 * so the blocks it hides are dropped; one that removes it finds again the
 * fences the old scan did not have, up to one the old scan had.
 */
import type { FencedBlock } from '../text/fences';
import { commonPrefix, commonSuffix, firstAtLeast } from '../text/common';
import type { NoteText } from '../text/noteText';

/** A note's text as an analysis is given it: one string, or a host's text in pieces. */
export type AnyText = string | NoteText;

/** The text as one string (a NoteText is joined: only where the two versions must be compared). */
export function flatText(t: AnyText): string {
  return typeof t === 'string' ? t : t.toString();
}

/** What a remembered block must tell: where its opening fence is. */
export interface Placed {
  readonly block: { readonly openStart: number; readonly openLine: number };
}

/** A note as last analysed. */
export interface NoteMemory<R extends Placed, E> {
  readonly text: AnyText;
  /** Our blocks' reports, in order, up to where the analysis stopped, and their cache entries. */
  readonly reports: readonly R[];
  readonly entries: readonly E[];
  /** False when a bound stopped the analysis, so `reports` does not reach the end of the note. */
  readonly complete: boolean;
  /** Characters of the bodies of `reports`, together. */
  readonly bodyChars: number;
  /** Indices in `reports` of the blocks that have problems, ascending. */
  readonly withProblems: readonly number[];
  /** The note the analysis read its outside sources for, and their change token then (Externals.changes). */
  readonly note: string | null;
  readonly token: string | null;
}

/** How to analyse a new text from a remembered version of it. */
export interface Reuse<R extends Placed, E> {
  readonly memory: NoteMemory<R, E>;
  /** Blocks taken over as they are: `memory.reports` before this index. */
  readonly keep: number;
  /** Where the scan starts again: offset and line (of the first block not kept, or the top of the note). */
  readonly from: number;
  readonly line: number;
  /** New length minus old length. */
  readonly delta: number;
  /** Offsets of the new text from here on hold the old text from `syncFrom − delta` on. */
  readonly syncFrom: number;
  /** True when the whole text is unchanged. */
  readonly same: boolean;
  /** True when the host said what changed since this very memory (a `change` whose previous text it holds). */
  readonly hinted: boolean;
}

/**
 * What a host that applied the edits itself knows about a new text: it
 * agrees with `previous` (the text of an earlier analysis) in at least its
 * first `prefix` and its last `suffix` characters. Smaller numbers than the
 * true ones are safe (more is read again); larger ones are not.
 */
export interface TextChange {
  readonly previous: AnyText;
  readonly prefix: number;
  readonly suffix: number;
}

/**
 * The remembered note that shares the most text with `text`, and how much of its scan is still good; null when none
 * shares anything. With a `change` whose previous text is remembered, the shared ends are taken from it and the texts
 * are not compared at all, so the plan costs nothing that grows with the note.
 */
export function planReuse<R extends Placed, E>(
  memories: readonly NoteMemory<R, E>[],
  text: AnyText,
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
    const prefix = hinted
      ? Math.max(0, Math.min(change.prefix, old.length, text.length))
      : commonPrefix(flatText(old), flatText(text));
    // An unchanged note is taken over whole, unless a bound stopped its analysis (then the scan resumes at its last fence).
    const same = prefix === old.length && prefix === text.length && memory.complete;
    const suffix = same
      ? 0
      : hinted
        ? Math.max(0, Math.min(change.suffix, old.length - prefix, text.length - prefix))
        : commonSuffix(flatText(old), flatText(text), prefix);
    if (prefix + suffix <= bestShared && !same) continue;
    // Our last block that opens strictly before the first changed character: its line, and the ones
    // before it, read the same in both versions, so the old scan was at a line start outside any fenced
    // block and any HTML block, and so is the new one.
    const keep = same ? memory.reports.length : firstAtOrAfter(memory.reports, prefix);
    const restart = !same && keep > 0 ? memory.reports[keep - 1]!.block : null;
    best = {
      memory,
      keep: restart ? keep - 1 : keep,
      from: restart ? restart.openStart : 0,
      line: restart ? restart.openLine : 0,
      delta: text.length - old.length,
      syncFrom: text.length - suffix,
      same,
      hinted,
    };
    bestShared = prefix + suffix;
    if (same) break;
  }
  return best;
}

/** Index of the first block opening at or after `offset` (blocks are in order). */
export function firstAtOrAfter(blocks: readonly Placed[], offset: number): number {
  return firstAtLeast(blocks, (b) => b.block.openStart, offset);
}

/**
 * Index of the remembered block that the new scan's `block` continues from,
 * or -1: the block must open inside the unchanged end of the text, at the
 * place one of ours opened (moved by the change in length). From there on
 * the two scans agree: both are at that line outside every fenced block and
 * every HTML block, and open the same fence on it.
 */
export function resumeAt<R extends Placed, E>(reuse: Reuse<R, E>, block: FencedBlock): number {
  if (!reuse.memory.complete || block.openStart < reuse.syncFrom) return -1;
  const reports = reuse.memory.reports;
  const i = firstAtOrAfter(reports, block.openStart - reuse.delta);
  return i < reports.length && reports[i]!.block.openStart === block.openStart - reuse.delta ? i : -1;
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

/** A block's positions moved by `delta` characters and `lines` lines, in place: for a block that only its mover holds. */
export function shiftBlock(b: FencedBlock, delta: number, lines: number): void {
  const w = b as {
    -readonly [K in keyof FencedBlock]: FencedBlock[K];
  };
  w.openLine += lines;
  if (w.closeLine !== null) w.closeLine += lines;
  w.openStart += delta;
  w.openEnd += delta;
  w.blockEnd += delta;
  w.bodyStart += delta;
  w.bodyLine += lines;
  // The line entries of an indented fence may be shared with another copy of the block: new ones.
  if (b.lines.length > 0) w.lines = b.lines.map((l) => ({ ...l, docStart: l.docStart + delta }));
}

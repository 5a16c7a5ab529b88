/**
 * The blocks of the book of runs as it indexes them: what a block's body
 * gives the index (its id, where the id is written, its references and a
 * hash of the body), read once per body, the small helpers that place a
 * block's spans and lines in its note and move an indexed block after an
 * edit before it, and the reading again of the stretch of a note an edit
 * changed (bookIndex.ts).
 */
import { firstAtOrAfter, shiftBlock, type AnyText, type TextChange } from '../analyzer/rescanPlan';
import { scanInWindows } from '../analyzer/windows';
import { interpretBody } from '../block/interpret';
import { ownCopy } from '../text/common';
import { spanToNote } from '../analyzer/report';
import { isLevelsInfo, scanFencedBlocks, type FencedBlock } from '../text/fences';
import type { Span } from '../types';
import { plainFacts, type PlainFacts } from './plainIds';
import type { RunPlace, RunRef } from './types';

/** One `levels` block of a note, as indexed. */
export interface BookBlock {
  readonly note: string;
  /** Position among the note's `levels` blocks. */
  readonly index: number;
  readonly block: FencedBlock;
  readonly id: string | null;
  /** Where the id value is, in note offsets, or null without an id. */
  readonly place: RunPlace | null;
  /** The references the block writes (body-relative spans). */
  readonly refs: readonly RunRef[];
  readonly hash: string;
}

/** A reference found in the book, with note offsets. */
export interface BookReference {
  /** The referring block. */
  readonly from: BookBlock;
  readonly ref: RunRef;
  /** Note offsets of the whole reference value and of its id part. */
  readonly span: Span;
  readonly idSpan: Span;
}

/** What a block's body gives the index (kept per body, shared by every note and version that has it). */
interface BodyFacts {
  readonly id: string | null;
  readonly idSpan: Span | null;
  readonly refs: readonly RunRef[];
  readonly hash: string;
}

/**
 * Bodies and characters kept before the store is emptied and filled again: a long body edited keystroke by
 * keystroke leaves a new body each time, which a count alone would let pile up to gigabytes.
 */
const MAX_BODIES = 50_000;
const MAX_CHARS = 32_000_000;

/** What a body past the bound of one block gives the index: no id, no references. */
const UNREAD: PlainFacts = { kind: 'plain', id: null, idSpan: null };

/** Reads what each body gives the index, once per body (kept under a copy of the body, for every note and version). */
export class BodyReader {
  private readonly bodies = new Map<string, BodyFacts>();
  /** Characters of the bodies kept. */
  private chars = 0;

  /** `maxBlockChars`: the analyzer's bound on one body (AnalyzerLimits.maxBlockChars), past which it is not read. */
  constructor(private readonly maxBlockChars = Infinity) {}

  /** A block of the index for a block found by the scan. */
  bookBlock(note: string, index: number, block: FencedBlock): BookBlock {
    const f = this.facts(block.body);
    const place: RunPlace | null =
      f.idSpan && f.id !== null
        ? { note, span: spanToNote(block, f.idSpan), line: lineOf(block, f.idSpan.start) }
        : null;
    return { note, index, block, id: f.id, place, refs: f.refs, hash: f.hash };
  }

  private facts(body: string): BodyFacts {
    const known = this.bodies.get(body);
    if (known) return known;
    // Read without sources: only the id and the references as written are kept. Read from (and kept under) a
    // copy of the body: a body sliced from the note would keep that whole version of the note alive.
    // A body whose text alone says it refers to no run and where its id is (most bodies) is not read as YAML.
    // A body past the bound of one block is not read at all (the analyzer does not read it either).
    const own = ownCopy(body);
    const plain: PlainFacts = own.length > this.maxBlockChars ? UNREAD : plainFacts(own);
    const m =
      plain.kind === 'plain' ? { id: plain.id, idSpan: plain.idSpan, refs: NO_REFS } : interpretBody(own, null).meta;
    const f: BodyFacts = { id: m.id, idSpan: m.idSpan, refs: m.refs ?? [], hash: hash(body) };
    if (this.bodies.size > MAX_BODIES || this.chars > MAX_CHARS) {
      this.bodies.clear();
      this.chars = 0;
    }
    this.bodies.set(own, f);
    this.chars += own.length;
    return f;
  }
}

/** The 0-based note line of a body offset. */
export function lineOf(block: FencedBlock, bodyOffset: number): number {
  let line = block.bodyLine;
  const end = Math.min(bodyOffset, block.body.length);
  for (let i = 0; i < end; i++) if (block.body.charCodeAt(i) === 10) line++;
  return line;
}

/** A 64-bit FNV-1a hash of the text (two 32-bit halves), as hex: a stamp, not a security measure. */
export function hash(text: string): string {
  let h1 = 0x811c9dc5;
  let h2 = 0x01000193 ^ text.length;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    h1 = Math.imul(h1 ^ c, 0x01000193);
    h2 = Math.imul(h2 ^ c, 0x5bd1e995) ^ (h2 >>> 15);
  }
  return (h1 >>> 0).toString(16).padStart(8, '0') + (h2 >>> 0).toString(16).padStart(8, '0');
}

/** The references of a block that makes none. */
const NO_REFS: readonly RunRef[] = Object.freeze([]);

/** Index of the block opening at `offset`, or -1 (blocks in order). */
export function openingAt(blocks: readonly BookBlock[], offset: number): number {
  const i = firstAtOrAfter(blocks, offset);
  return i < blocks.length && blocks[i]!.block.openStart === offset ? i : -1;
}

/** An indexed block moved by an edit before it, in place: its place in the note and its position among the blocks. */
export function moveBookBlock(b: BookBlock, delta: number, lines: number, shift: number): void {
  (b as { index: number }).index += shift;
  shiftBlock(b.block, delta, lines);
  if (b.place) {
    const span = b.place.span as { start: number; end: number };
    span.start += delta;
    span.end += delta;
    (b.place as { line: number }).line += lines;
  }
}

/** The stretch of a note an edit changed, read again (see {@link rereadStretch}). */
export interface Reread {
  /** Position of the first block read again: the blocks before it are kept. */
  readonly head: number;
  /** The blocks read in the stretch, and the old ones they replace. */
  readonly added: BookBlock[];
  readonly dropped: BookBlock[];
  /** Position of the first old block after the stretch (kept, moved), or -1 when the scan reached the end. */
  readonly resume: number;
  /** Lines and characters the blocks after the stretch moved by. */
  readonly lines: number;
  readonly delta: number;
}

/**
 * A set note's new text read again only where it changed: the note is scanned from the last block that opens
 * before the change until a block opens, in the unchanged end, where an old one opened (moved by the change in
 * length); the blocks from there on are the old ones.
 * @param blocks the note's blocks as indexed in its old text, of length `oldLength`
 */
export function rereadStretch(
  reader: BodyReader,
  note: string,
  blocks: readonly BookBlock[],
  oldLength: number,
  text: AnyText,
  change: TextChange,
  infoStrings: readonly string[],
): Reread {
  const prefix = Math.max(0, Math.min(change.prefix, oldLength, text.length));
  const suffix = Math.max(0, Math.min(change.suffix, oldLength - prefix, text.length - prefix));
  const delta = text.length - oldLength;
  const syncFrom = text.length - suffix;
  // The first old block opening at or after the change, and the one before it, where the scan starts again.
  const k = firstAtOrAfter(blocks, prefix);
  const keep = Math.max(0, k - 1);
  const from = keep < blocks.length && k > 0 ? blocks[keep]!.block.openStart : 0;
  const line = keep < blocks.length && k > 0 ? blocks[keep]!.block.openLine : 0;
  const head = k > 0 ? keep : 0;
  const added: BookBlock[] = [];
  const dropped: BookBlock[] = [];
  let resume = -1;
  let lines = 0;
  const found =
    typeof text === 'string' ? scanFencedBlocks(text, from, line) : scanInWindows(text, from, line, syncFrom);
  for (const block of found) {
    if (block.openStart >= syncFrom) {
      const j = openingAt(blocks, block.openStart - delta);
      if (j >= 0) {
        resume = j;
        lines = block.openLine - blocks[j]!.block.openLine;
        break;
      }
    }
    if (!isLevelsInfo(block, infoStrings)) continue;
    added.push(reader.bookBlock(note, head + added.length, block));
  }
  const lastOld = resume >= 0 ? resume : blocks.length;
  for (let i = head; i < lastOld; i++) dropped.push(blocks[i]!);
  return { head, added, dropped, resume, lines, delta };
}

/**
 * The index of the book of runs (runBook.ts): the notes it holds, set by a host
 * or read through `load` when a reference names them, their `levels` blocks,
 * the blocks carrying each id, and how many references name each id. A note is
 * indexed when it is set, or again only where an edit changed it. The index
 * also tells where a written reference leads, without evaluating anything.
 * It records no change itself: the book does, with the stretch a re-index
 * returns (and through `loaded` when a note is read through `load`).
 */
import { flatText, type AnyText, type TextChange } from '../analyzer/rescanPlan';
import { isLevelsInfo, scanFencedBlocks, type FencedBlock } from '../text/fences';
import { nearest } from '../text/suggest';
import { BodyReader, moveBookBlock, rereadStretch, type BookBlock } from './bookBlocks';
import { resolveNotePath } from './paths';
import type { Follow } from './referenceGraph';

/** A note of the book, as indexed. */
export interface BookNote {
  readonly note: string;
  readonly text: AnyText;
  readonly blocks: readonly BookBlock[];
  /** True when the book read the note itself through `load` (no host set it). */
  readonly loaded: boolean;
}

/** The stretch of a note indexed again after an edit: what the book needs to know of the change's reach. */
export interface Stretch {
  readonly dropped: readonly BookBlock[];
  readonly added: readonly BookBlock[];
  /** The blocks after the stretch, moved where they are. */
  readonly moved: readonly BookBlock[];
  /** Whether the stretch's blocks were read again differently (bodies or ids). */
  readonly bodies: boolean;
  /** The ids whose sets of blocks changed. */
  readonly ids: ReadonlySet<string>;
  /** Whether the blocks after the stretch moved to other lines. */
  readonly linesMoved: boolean;
}

/** Where a reference leads, without evaluating anything. */
export type Located =
  | { kind: 'found'; block: BookBlock }
  | { kind: 'unknown'; among: readonly string[] }
  | { kind: 'missing'; note: string };

/** The whole note a note is a part of, or null for a whole note (see RunBookOptions.partOf). */
export type PartOf = (note: string) => string | null;

/** Reads a note a reference names that was not set (see RunBookOptions.load). */
export type LoadNote = (note: string) => string | null | { readonly refused: string };

/** The index. One per book. */
export class BookIndex {
  private readonly notes = new Map<string, BookNote>();
  /** Run id → every block carrying it, in note order then block order. */
  private readonly byId = new Map<string, BookBlock[]>();
  /** Ids that references name, with how many references name each (a change to such a block can change their stamps). */
  private readonly named = new Map<string, number>();
  /** What each body gives the index, read once per body. */
  private readonly reader: BodyReader;
  /** Notes looked for through `load` and not found (until the next change), with why when the host refused. */
  private readonly missing = new Map<string, string | null>();
  /** A whole note → the notes set as its parts (see RunBookOptions.partOf), in the order they were set. */
  private readonly parts = new Map<string, string[]>();
  /** Where a written reference leads, for the walks over the graph of references. */
  readonly follow: Follow = (b, ref) => this.target(b.note, ref);

  /**
   * @param maxBlockChars the analyzer's bound on one body, past which a body is not read (none when undefined)
   * @param loaded called once a note read through `load` is indexed (a change of the book)
   */
  constructor(
    private readonly infoStrings: readonly string[],
    maxBlockChars: number | undefined,
    private readonly load: LoadNote | null,
    private readonly loaded: () => void,
    private readonly partOf: PartOf | null = null,
  ) {
    this.reader = new BodyReader(maxBlockChars);
  }

  /** The note as indexed, or undefined. */
  note(note: string): BookNote | undefined {
    return this.notes.get(note);
  }

  /** Every note of the index, in the order they were indexed. */
  allNotes(): IterableIterator<BookNote> {
    return this.notes.values();
  }

  /** True when the index holds the note. */
  has(note: string): boolean {
    return this.notes.has(note);
  }

  /** The notes held, set or loaded. */
  noteNames(): string[] {
    return [...this.notes.keys()];
  }

  /** The note's `levels` blocks as indexed (empty for an unknown note). */
  blocksOf(note: string): readonly BookBlock[] {
    return this.notes.get(note)?.blocks ?? [];
  }

  /** Every block carrying `id`. */
  blocksWithId(id: string): readonly BookBlock[] {
    return this.byId.get(id) ?? [];
  }

  /** Every block that carries an id, in the order of the notes. */
  runs(): BookBlock[] {
    const out: BookBlock[] = [];
    for (const n of this.notes.values()) for (const b of n.blocks) if (b.id !== null) out.push(b);
    return out;
  }

  /** The block of `note` whose body is `body`, or null. */
  blockAt(note: string, body: string, id: string | null = null): BookBlock | null {
    // A block with an id is among the few with that id; any other is looked for through the note.
    if (id !== null) {
      for (const b of this.byId.get(id) ?? []) if (b.note === note && b.block.body === body) return b;
      return null;
    }
    for (const b of this.blocksOf(note)) if (b.block.body === body) return b;
    return null;
  }

  /** How many ids references name. */
  namedCount(): number {
    return this.named.size;
  }

  /** True when a reference names `id`. */
  isNamed(id: string): boolean {
    return this.named.has(id);
  }

  /** Why the host refused a note looked for through `load` (null when it was simply not found). */
  whyMissing(note: string): string | null {
    return this.missing.get(note) ?? null;
  }

  /** Forgets the notes not found through `load`: after a change, they may be there. */
  forgetMissing(): void {
    this.missing.clear();
  }

  /** Indexes a note's text whole (`fences`, when given, spares the scan); `loaded` when read through `load`. */
  add(note: string, text: AnyText, loaded: boolean, fences?: () => readonly FencedBlock[]): BookNote {
    const blocks: BookBlock[] = [];
    for (const block of fences ? fences() : scanFencedBlocks(flatText(text))) {
      if (!isLevelsInfo(block, this.infoStrings)) continue;
      const b = this.reader.bookBlock(note, blocks.length, block);
      blocks.push(b);
      this.name(b, 1);
      if (b.id !== null) {
        const list = this.byId.get(b.id);
        if (list) list.push(b);
        else this.byId.set(b.id, [b]);
      }
    }
    const n: BookNote = { note, text, blocks, loaded };
    this.notes.set(note, n);
    const whole = this.partOf?.(note) ?? null;
    if (whole !== null) {
      const list = this.parts.get(whole);
      if (!list) this.parts.set(whole, [note]);
      else if (!list.includes(note)) list.push(note);
    }
    return n;
  }

  /** Forgets a note and its blocks. */
  drop(note: string): void {
    const old = this.notes.get(note);
    if (!old) return;
    this.notes.delete(note);
    const whole = this.partOf?.(note) ?? null;
    const list = whole === null ? undefined : this.parts.get(whole);
    if (list) {
      const kept = list.filter((x) => x !== note);
      if (kept.length > 0) this.parts.set(whole!, kept);
      else this.parts.delete(whole!);
    }
    for (const b of old.blocks) {
      this.name(b, -1);
      if (b.id === null) continue;
      const list = this.byId.get(b.id);
      if (!list) continue;
      const kept = list.filter((x) => x !== b);
      if (kept.length > 0) this.byId.set(b.id, kept);
      else this.byId.delete(b.id);
    }
  }

  /**
   * A set note's new text indexed again only where it changed: the blocks before the change are kept, the
   * changed stretch is read again (bookBlocks.ts, {@link rereadStretch}) and the blocks after it are the old
   * ones, moved.
   */
  reindex(old: BookNote, text: AnyText, change: TextChange): Stretch {
    const { head, added, dropped, resume, lines, delta } = rereadStretch(
      this.reader,
      old.note,
      old.blocks,
      old.text.length,
      text,
      change,
      this.infoStrings,
    );
    const blocks = old.blocks;
    const lastOld = resume >= 0 ? resume : blocks.length;
    // The ids whose sets of blocks changed (a `copies` stamp); blocks read again the same (body and id) change nothing.
    const count = new Map<string, number>();
    for (const b of dropped) if (b.id !== null) count.set(b.id, (count.get(b.id) ?? 0) - 1);
    for (const b of added) if (b.id !== null) count.set(b.id, (count.get(b.id) ?? 0) + 1);
    const ids = new Set<string>();
    for (const [id, n] of count) if (n !== 0) ids.add(id);
    const bodies =
      dropped.length !== added.length || dropped.some((d, i) => d.hash !== added[i]!.hash || d.id !== added[i]!.id);
    for (const b of dropped) this.name(b, -1);
    for (const b of added) this.name(b, 1);
    // The blocks after the change: the old ones, moved where they are (the book alone holds them; the lists by id
    // and everything keyed by block keep them). The new list is one copy of the old with the changed stretch put in.
    const shift = head + added.length - lastOld;
    const all =
      shift === 0 ? blocks.slice() : blocks.slice(0, head).concat(added, resume >= 0 ? blocks.slice(resume) : []);
    if (shift === 0) for (let i = 0; i < added.length; i++) all[head + i] = added[i]!;
    const moved = resume >= 0 ? all.length - (blocks.length - resume) : all.length;
    if (resume >= 0 && (delta !== 0 || lines !== 0 || shift !== 0))
      for (let i = moved; i < all.length; i++) moveBookBlock(all[i]!, delta, lines, shift);
    this.placeInIdLists(old.note, dropped, added);
    this.notes.set(old.note, { note: old.note, text, blocks: all, loaded: false });
    return { dropped, added, moved: all.slice(moved), bodies, ids, linesMoved: lines !== 0 };
  }

  /**
   * The note a relative path written in `from` names: resolved from the folder of the whole note when `from`
   * is a part of one.
   */
  notePath(from: string, relative: string): string {
    return resolveNotePath(this.partOf?.(from) ?? from, relative);
  }

  /**
   * The blocks of the note a path names, without reading anything: of its parts when the host set parts of it
   * (they stand for the whole), or of the note itself.
   */
  blocksNamed(path: string): readonly BookBlock[] {
    const parts = this.parts.get(path);
    return parts ? parts.flatMap((p) => this.blocksOf(p)) : this.blocksOf(path);
  }

  /** Where a reference written in `from` leads, reading through `load` a note it names that was not set. */
  locate(from: string, ref: { readonly note: string | null; readonly id: string }): Located {
    if (ref.note !== null) {
      const path = this.notePath(from, ref.note);
      // A whole note whose parts are set is read from them alone: never through `load`.
      const blocks = this.parts.has(path) ? this.blocksNamed(path) : this.noteFor(path)?.blocks;
      if (!blocks) return { kind: 'missing', note: path };
      const b = blocks.find((x) => x.id === ref.id);
      if (b) return { kind: 'found', block: b };
      return { kind: 'unknown', among: blocks.flatMap((x) => (x.id === null ? [] : [x.id])) };
    }
    const all = this.byId.get(ref.id);
    if (all && all.length > 0) {
      // Of several blocks with the id, the one in the asking note (or in the same whole note) is meant.
      const block = all.length === 1 ? all[0]! : (all.find((x) => x.note === from) ?? this.sameWhole(from, all));
      return { kind: 'found', block };
    }
    return { kind: 'unknown', among: [...this.byId.keys()] };
  }

  /** Of blocks with one id, the first in the whole note `from` is a part of (the first of all otherwise). */
  private sameWhole(from: string, all: readonly BookBlock[]): BookBlock {
    const whole = this.partOf?.(from) ?? null;
    return (whole === null ? undefined : all.find((x) => this.partOf!(x.note) === whole)) ?? all[0]!;
  }

  /** The block a reference written in `from` leads to (null when unknown, missing or not followed). */
  target(from: string, ref: { readonly note: string | null; readonly id: string }): BookBlock | null {
    const r = this.locate(from, ref);
    return r.kind === 'found' ? r.block : null;
  }

  /**
   * Each id's list keeps note order, then block order: this note's blocks with the id, dropped ones out and
   * new ones in, sorted by their place (the lists are short: one block per id, unless duplicated).
   */
  private placeInIdLists(note: string, dropped: readonly BookBlock[], added: readonly BookBlock[]): void {
    const gone = new Set(dropped);
    const touched = new Set<string>();
    for (const b of dropped) if (b.id !== null) touched.add(b.id);
    for (const b of added) if (b.id !== null) touched.add(b.id);
    for (const id of touched) {
      const list = this.byId.get(id) ?? [];
      const at = list.findIndex((x) => x.note === note);
      const mine = list.filter((x) => x.note === note && !gone.has(x));
      for (const b of added) if (b.id === id) mine.push(b);
      mine.sort((a, b) => a.index - b.index);
      const others = list.filter((x) => x.note !== note);
      const where = at < 0 ? others.length : list.slice(0, at).filter((x) => x.note !== note).length;
      const next = [...others.slice(0, where), ...mine, ...others.slice(where)];
      if (next.length > 0) this.byId.set(id, next);
      else this.byId.delete(id);
    }
  }

  /** A note of the book, read through `load` when a reference names one that was not set. */
  private noteFor(note: string): BookNote | null {
    const n = this.notes.get(note);
    if (n) return n;
    if (!this.load || this.missing.has(note)) return null;
    const text = this.load(note);
    if (text === null || typeof text !== 'string') {
      this.missing.set(note, text === null ? null : text.refused);
      return null;
    }
    const added = this.add(note, text, true);
    this.loaded();
    return added;
  }

  /** Counts the ids a block's references name in (or out of) {@link named}. */
  private name(b: BookBlock, by: 1 | -1): void {
    for (const ref of b.refs) {
      const n = (this.named.get(ref.id) ?? 0) + by;
      if (n > 0) this.named.set(ref.id, n);
      else this.named.delete(ref.id);
    }
  }
}

/** The ids closest to `id` (for "did you mean"), case aside, nearest first, at most five. */
export function nearIds(id: string, among: readonly string[]): string[] {
  return nearest(id, new Set(among), Math.max(2, Math.floor(id.length / 3)), 5, { ignoreCase: true });
}

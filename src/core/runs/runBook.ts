/**
 * A host-neutral book of runs: the hosts feed it note texts (the command
 * line the notes it reads, the language server every note of the workspace,
 * unsaved edits included) and it answers references between blocks
 * ({@link RunResolver}), the ids of the workspace, who refers to whom, and the
 * stamps of the dependency keys it handed out.
 *
 * Each note is indexed when it is set: its `levels` blocks, their ids and the
 * references they make, read without following anything. Cycles are found on
 * that graph of written references, before anything is evaluated, so the
 * evaluation of a referenced block (through the analyzer, with this book as
 * its source) always ends. A key's stamp is a hash of the bodies of every
 * block reachable from the referenced one and of how each of their references
 * resolved: it changes exactly when an answer could.
 */
import { Analyzer } from '../analyzer/analyzer';
import { firstAtOrAfter, flatText, type AnyText, type TextChange } from '../analyzer/rescanPlan';
import { blockHoldingOffset } from '../text/common';
import { spanToNote } from '../analyzer/report';
import { scanInWindows } from '../analyzer/windows';
import { ChangeLog, type ChangeReach } from './changeLog';
import type { Externals, KeyChanges } from '../block/externals';
import { isLevelsInfo, scanFencedBlocks, type FencedBlock } from '../text/fences';
import { nearest } from '../text/suggest';
import { resolveNotePath } from './paths';
import { ChainLengths, pathTo, type Follow } from './referenceGraph';
import { BodyReader, hash, lineOf, moveBookBlock, openingAt, type BookBlock, type BookReference } from './bookBlocks';
import {
  parseRunKey,
  RUN_KEY_PREFIX,
  runCopiesKey,
  runRefKey,
  type RunAnswer,
  type RunCopies,
  type RunError,
  type RunFacts,
  type RunPlace,
  type RunResolver,
} from './types';

export type { BookBlock, BookReference } from './bookBlocks';

/** The longest chain of references a run may stand at the start of: each link is evaluated inside the next. */
export const MAX_CHAIN = 32;

/** The `Externals` a book hands to the analyzer for one note. */
export interface RunExternals extends Externals {
  readonly runs: RunResolver;
}

/** Options of a {@link RunBook}. */
export interface RunBookOptions {
  /** The analyzer that evaluates referenced blocks (shared with the host's, to share its options). */
  readonly analyzer?: Analyzer;
  /** Extra fence info strings read as `levels` blocks (as the analyzer's option). */
  readonly infoStrings?: readonly string[];
  /**
   * Reads a note a reference names that was not set: its text, or null when it does not exist or the host
   * may not read it (the command line reads only inside the folder tree it was given).
   */
  readonly load?: (note: string) => string | null | { readonly refused: string };
  /**
   * The host's other sources for a note (spectrum files), merged into {@link RunBook.externalsFor}, so that a
   * referenced block whose own values come from a file reads them as its note does.
   */
  readonly sources?: (note: string) => Externals | null;
}

interface BookNote {
  readonly note: string;
  readonly text: AnyText;
  readonly blocks: readonly BookBlock[];
  /** True when the book read the note itself through `load` (no host set it). */
  readonly loaded: boolean;
}

/** The book. One per host; not safe to share across threads (there are none). */
export class RunBook implements RunResolver {
  private readonly notes = new Map<string, BookNote>();
  /** Run id → every block carrying it, in note order then block order. */
  private readonly byId = new Map<string, BookBlock[]>();
  /** What each body gives the index, read once per body. */
  private readonly reader: BodyReader;
  private readonly analyzer: Analyzer;
  private readonly infoStrings: readonly string[];
  private readonly load: RunBookOptions['load'] | null;
  private readonly sources: RunBookOptions['sources'] | null;
  /** Notes looked for through `load` and not found (until the next change), with why when the host refused. */
  private readonly missing = new Map<string, string | null>();
  /** Evaluated blocks, by block, with the stamp of what they read. */
  private readonly evaluated = new WeakMap<BookBlock, { stamp: string; facts: RunFacts; line: number }>();
  /** Stamps computed since the last change that could alter them: of `copies` keys, and of reference keys. */
  private readonly copyStamps = new Map<string, string | null>();
  private readonly refStamps = new Map<string, string | null>();
  /** The latest changes and their reach (see {@link changedSince}). */
  private readonly log = new ChangeLog();
  /** Ids that references name, with how many references name each (a change to such a block can change their stamps). */
  private readonly named = new Map<string, number>();
  /** Where a written reference leads, for the walks over the graph of references. */
  private readonly follow: Follow = (b, ref) => this.target(b.note, ref);
  /** Chain lengths known since the last change. */
  private readonly chains = new ChainLengths(this.follow);

  constructor(options: RunBookOptions = {}) {
    this.analyzer = options.analyzer ?? new Analyzer({ infoStrings: options.infoStrings ?? [] });
    this.reader = new BodyReader(this.analyzer.options.limits.maxBlockChars);
    this.infoStrings = options.infoStrings ?? this.analyzer.options.infoStrings;
    this.load = options.load ?? null;
    this.sources = options.sources ?? null;
  }

  /**
   * Sets (or replaces) a note's text; the host's version wins over one read through `load`. A host sets a
   * note's current text before it analyses the note with {@link externalsFor}: the book tells a block from
   * the others (and finds the cycles through it) by its body in the note as set. `fences`, when the host has
   * found them already (every fenced block of `text`, in order), spares the book its own scan of a note it
   * indexes whole; it is asked only then.
   */
  setNote(note: string, text: AnyText, change?: TextChange, fences?: () => readonly FencedBlock[]): void {
    const old = this.notes.get(note);
    if (old && !old.loaded && change && old.text === change.previous && this.reindex(old, text, change)) return;
    this.drop(note);
    this.index(note, text, false, fences);
  }

  /**
   * A count that moves with every change of the book; with {@link changedSince}, what a host asks to know
   * whether the stamps it holds may be out of date without asking each one.
   */
  changes(): number {
    return this.log.changes;
  }

  /**
   * The keys whose stamps may have changed since the book's {@link changes} was `since`, as a test; null when
   * that is not known (too long ago, or a change of unknown reach): then every stamp must be asked.
   */
  changedSince(since: number): KeyChanges | null {
    return this.log.since(since, (id) => this.byId.get(id) ?? []);
  }

  /** Forgets a note (deleted, or closed and gone from the workspace). */
  deleteNote(note: string): void {
    this.drop(note);
    this.changed();
  }

  /** True when the book holds the note. */
  hasNote(note: string): boolean {
    return this.notes.has(note);
  }

  /** The notes the book holds, set or loaded. */
  noteNames(): string[] {
    return [...this.notes.keys()];
  }

  /** The note's `levels` blocks as indexed (empty for an unknown note). */
  blocksOf(note: string): readonly BookBlock[] {
    return this.notes.get(note)?.blocks ?? [];
  }

  /** Every block that carries an id, in the order of the notes given. */
  runs(): BookBlock[] {
    const out: BookBlock[] = [];
    for (const n of this.notes.values()) for (const b of n.blocks) if (b.id !== null) out.push(b);
    return out;
  }

  /** Every block carrying `id`. */
  blocksWithId(id: string): readonly BookBlock[] {
    return this.byId.get(id) ?? [];
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

  /** The block a reference written in `from` leads to (null when unknown, missing or not followed). */
  target(from: string, ref: { readonly note: string | null; readonly id: string }): BookBlock | null {
    const r = this.locate(from, ref);
    return r.kind === 'found' ? r.block : null;
  }

  /** Every reference written in a note, in order, with note offsets. */
  references(note: string): BookReference[] {
    const out: BookReference[] = [];
    for (const b of this.blocksOf(note))
      for (const ref of b.refs)
        out.push({ from: b, ref, span: spanToNote(b.block, ref.span), idSpan: spanToNote(b.block, ref.idSpan) });
    return out;
  }

  /** The reference whose value holds the note offset (ends included, as a cursor sees it), or null. */
  referenceAt(note: string, offset: number): BookReference | null {
    const b = this.blockHolding(note, offset);
    if (!b) return null;
    for (const ref of b.refs) {
      const span = spanToNote(b.block, ref.span);
      if (offset >= span.start && offset <= span.end)
        return { from: b, ref, span, idSpan: spanToNote(b.block, ref.idSpan) };
    }
    return null;
  }

  /** The block of a note whose fences hold an offset (ends included), found by binary search. */
  blockHolding(note: string, offset: number): BookBlock | null {
    return blockHoldingOffset(this.blocksOf(note), (b) => b.block, offset) ?? null;
  }

  /** The block whose `id` value holds the note offset (ends included), or null. */
  idAt(note: string, offset: number): BookBlock | null {
    const b = this.blockHolding(note, offset);
    return b?.place && offset >= b.place.span.start && offset <= b.place.span.end ? b : null;
  }

  /** Every reference, in every note of the book, that leads to `target`. */
  referrers(target: BookBlock): BookReference[] {
    const out: BookReference[] = [];
    if (target.id === null) return out;
    for (const n of this.notes.values())
      for (const b of n.blocks)
        for (const ref of b.refs) {
          if (ref.id !== target.id) continue;
          if (this.target(n.note, ref) !== target) continue;
          out.push({ from: b, ref, span: spanToNote(b.block, ref.span), idSpan: spanToNote(b.block, ref.idSpan) });
        }
    return out;
  }

  /**
   * The notes whose blocks use `changed` (one of its blocks), directly or through other blocks: what a host
   * analyses and publishes again after `changed` was edited.
   */
  dependents(changed: string): string[] {
    // Who refers to whom, backwards, once; then a walk from the changed note's blocks.
    const back = new Map<BookBlock, BookBlock[]>();
    for (const n of this.notes.values())
      for (const b of n.blocks)
        for (const ref of b.refs) {
          const t = this.target(n.note, ref);
          if (!t) continue;
          const list = back.get(t);
          if (list) list.push(b);
          else back.set(t, [b]);
        }
    const seen = new Set<BookBlock>(this.blocksOf(changed));
    const queue = [...seen];
    const notes = new Set<string>();
    for (let i = 0; i < queue.length; i++)
      for (const b of back.get(queue[i]!) ?? []) {
        if (seen.has(b)) continue;
        seen.add(b);
        queue.push(b);
        notes.add(b.note);
      }
    notes.delete(changed);
    return [...notes];
  }

  /** The analyzer's sources for a note of this book. */
  externalsFor(note: string): RunExternals {
    const other = this.sources?.(note) ?? null;
    if (!other) return { note, runs: this, stamp: (key) => this.stamp(key) };
    return {
      ...other,
      note,
      runs: this,
      stamp: (key) => (this.owns(key) ? this.stamp(key) : other.stamp(key)),
    };
  }

  /** True for the dependency keys this book answers. */
  owns(key: string): boolean {
    return key.startsWith(RUN_KEY_PREFIX);
  }

  /** The current stamp of a key handed out by {@link resolve} or {@link copies}. */
  stamp(key: string): string | null {
    const copy = this.copyStamps.get(key);
    if (copy !== undefined) return copy;
    const known = this.refStamps.get(key);
    if (known !== undefined) return known;
    const parsed = parseRunKey(key);
    let stamp: string | null = null;
    if (parsed?.kind === 'ref') {
      const r = this.locate(parsed.from, parsed);
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

  resolve(from: string, ref: { readonly note: string | null; readonly id: string }, at: string): RunAnswer {
    const key = runRefKey(from, ref.note, ref.id);
    const r = this.locate(from, ref);
    if (r.kind === 'missing') {
      const why = this.missing.get(r.note) ?? null;
      return why === null
        ? { kind: 'note-missing', note: r.note, key, stamp: this.stamp(key) }
        : { kind: 'note-missing', note: r.note, why, key, stamp: this.stamp(key) };
    }
    if (r.kind === 'unknown') return { kind: 'unknown', known: nearIds(ref.id, r.among), key, stamp: this.stamp(key) };
    const self = this.blockAt(from, at);
    if (self) {
      const chain = pathTo(r.block, self, this.follow);
      if (chain)
        return {
          kind: 'cycle',
          chain: [self.id ?? '?', ...chain.map((b) => b.id ?? '?')],
          key,
          stamp: this.stamp(key),
        };
    }
    return { kind: 'found', run: this.facts(r.block), key, stamp: this.stamp(key) };
  }

  copies(from: string, id: string, at: string): RunCopies {
    const key = runCopiesKey(id);
    const self = this.blockAt(from, at, id);
    const others: RunPlace[] = [];
    for (const b of this.blocksWithId(id)) if (b !== self && b.place) others.push(b.place);
    return { others, key, stamp: this.stamp(key) };
  }

  /** The run a block of the book is, as a referring block sees it (evaluated once per stamp). */
  facts(b: BookBlock): RunFacts {
    const stamp = this.closure(b);
    const memo = this.evaluated.get(b);
    // The facts name lines: a block moved by an edit above it is evaluated again.
    if (memo && memo.stamp === stamp && memo.line === b.block.openLine) return memo.facts;
    const place = b.place ?? {
      note: b.note,
      span: { start: b.block.openStart, end: b.block.openEnd },
      line: b.block.openLine,
    };
    if (this.chains.of(b, MAX_CHAIN + 1, this.log.changes) > MAX_CHAIN) {
      // Evaluated one inside the other, a longer chain could exhaust the stack: refused before it is read.
      const facts: RunFacts = {
        id: b.id ?? '',
        place,
        date: null,
        input: null,
        results: null,
        status: 'invalid',
        error: {
          code: 'reference-chain',
          message: `its references go more than ${MAX_CHAIN} runs deep; take a value from a run nearer its source`,
          severity: 'error',
          line: place.line,
        },
      };
      this.evaluated.set(b, { stamp, facts, line: b.block.openLine });
      return facts;
    }
    const c = this.analyzer.analyseBody(b.block.body, this.externalsFor(b.note));
    const first = c.problems.find((p) => p.severity === 'error') ?? null;
    const error: RunError | null = first
      ? {
          code: first.code,
          message: first.message,
          severity: first.severity,
          line: lineOf(b.block, first.span.start),
        }
      : null;
    const facts: RunFacts = {
      id: b.id ?? '',
      place: b.place ?? {
        note: b.note,
        span: { start: b.block.openStart, end: b.block.openEnd },
        line: b.block.openLine,
      },
      date: c.meta.date,
      input: c.input,
      results: error ? null : c.results,
      status: error || !c.results ? 'invalid' : c.results.status,
      error,
    };
    // Stamped as read: the runs it reaches were evaluated with it, and the lines where they break are now known.
    this.evaluated.set(b, { stamp: this.closure(b), facts, line: b.block.openLine });
    return facts;
  }

  // --- inside ---

  /**
   * Records a change: of known reach (the ids whose sets of blocks changed, and whether any block's body did,
   * which reference stamps hash) or, without `reach`, of any.
   */
  private changed(reach?: ChangeReach): void {
    this.log.record(reach ?? null);
    this.missing.clear();
    if (reach) {
      for (const id of reach.ids) this.copyStamps.delete(runCopiesKey(id));
      if (reach.refs) this.refStamps.clear();
    } else {
      this.copyStamps.clear();
      this.refStamps.clear();
    }
  }

  /** Counts the ids a block's references name in (or out of) {@link named}. */
  private name(b: BookBlock, by: 1 | -1): void {
    for (const ref of b.refs) {
      const n = (this.named.get(ref.id) ?? 0) + by;
      if (n > 0) this.named.set(ref.id, n);
      else this.named.delete(ref.id);
    }
  }

  /**
   * A set note's new text indexed again only where it changed: the blocks before the change are kept, the
   * note is scanned from the last block that opens before it until a block opens, in the unchanged end, where
   * an old one opened (moved by the change in length), and the blocks from there on are the old ones, moved.
   * False when the change cannot be placed (the caller indexes the note afresh).
   */
  private reindex(old: BookNote, text: AnyText, change: TextChange): boolean {
    const oldLength = old.text.length;
    const prefix = Math.max(0, Math.min(change.prefix, oldLength, text.length));
    const suffix = Math.max(0, Math.min(change.suffix, oldLength - prefix, text.length - prefix));
    const delta = text.length - oldLength;
    const syncFrom = text.length - suffix;
    const blocks = old.blocks;
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
      if (!isLevelsInfo(block, this.infoStrings)) continue;
      added.push(this.reader.bookBlock(old.note, head + added.length, block));
    }
    const lastOld = resume >= 0 ? resume : blocks.length;
    for (let i = head; i < lastOld; i++) dropped.push(blocks[i]!);
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
    const refs = this.referenceStampsMayChange(dropped, added, all.slice(moved), bodies, ids.size > 0, lines !== 0);
    // Each id's list keeps note order, then block order: this note's blocks with the id, dropped ones out and
    // new ones in, sorted by their place (the lists are short: one block per id, unless duplicated).
    const gone = new Set(dropped);
    const touched = new Set<string>();
    for (const b of dropped) if (b.id !== null) touched.add(b.id);
    for (const b of added) if (b.id !== null) touched.add(b.id);
    for (const id of touched) {
      const list = this.byId.get(id) ?? [];
      const at = list.findIndex((x) => x.note === old.note);
      const mine = list.filter((x) => x.note === old.note && !gone.has(x));
      for (const b of added) if (b.id === id) mine.push(b);
      mine.sort((a, b) => a.index - b.index);
      const others = list.filter((x) => x.note !== old.note);
      const where = at < 0 ? others.length : list.slice(0, at).filter((x) => x.note !== old.note).length;
      const next = [...others.slice(0, where), ...mine, ...others.slice(where)];
      if (next.length > 0) this.byId.set(id, next);
      else this.byId.delete(id);
    }
    this.notes.set(old.note, { note: old.note, text, blocks: all, loaded: false });
    this.changed({ ids, refs });
    return true;
  }

  /**
   * True when the stamps of references may change with a re-indexed stretch of a note. A reference's stamp hashes
   * the blocks it reaches and, for an unknown id, the closest ids, and for a broken run the line where it breaks.
   * So it may change when a block that a reference names or that makes references was read again differently,
   * when an id came or went, or when a named broken run moved to other lines; none of this can matter where no
   * reference is written.
   * @param moved the blocks after the stretch, moved where they are
   * @param bodies whether the stretch's blocks were read again differently (bodies or ids)
   */
  private referenceStampsMayChange(
    dropped: readonly BookBlock[],
    added: readonly BookBlock[],
    moved: readonly BookBlock[],
    bodies: boolean,
    idsChanged: boolean,
    linesMoved: boolean,
  ): boolean {
    if (this.named.size + dropped.reduce((n, b) => n + b.refs.length, 0) === 0) return false;
    const named = (b: BookBlock): boolean => b.id !== null && this.named.has(b.id);
    if (bodies && (idsChanged || [...dropped, ...added].some((b) => b.refs.length > 0 || named(b)))) return true;
    if (!linesMoved) return false;
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

  private drop(note: string): void {
    const old = this.notes.get(note);
    if (!old) return;
    this.notes.delete(note);
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

  private index(note: string, text: AnyText, loaded: boolean, fences?: () => readonly FencedBlock[]): BookNote {
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
    this.changed();
    return n;
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
    return this.index(note, text, true);
  }

  /** Where a reference leads, without evaluating anything. */
  private locate(
    from: string,
    ref: { readonly note: string | null; readonly id: string },
  ):
    | { kind: 'found'; block: BookBlock }
    | { kind: 'unknown'; among: readonly string[] }
    | { kind: 'missing'; note: string } {
    if (ref.note !== null) {
      const path = resolveNotePath(from, ref.note);
      const n = this.noteFor(path);
      if (!n) return { kind: 'missing', note: path };
      const b = n.blocks.find((x) => x.id === ref.id);
      if (b) return { kind: 'found', block: b };
      return { kind: 'unknown', among: n.blocks.flatMap((x) => (x.id === null ? [] : [x.id])) };
    }
    const all = this.byId.get(ref.id);
    if (all && all.length > 0) return { kind: 'found', block: all.find((x) => x.note === from) ?? all[0]! };
    return { kind: 'unknown', among: [...this.byId.keys()] };
  }

  /**
   * The stamp of a block: its body and, for every block reachable from it, its body, how its references resolved
   * and, where it is broken, the line its error names (which the messages of the blocks before it repeat).
   */
  private closure(start: BookBlock): string {
    const seen = new Set<BookBlock>([start]);
    const queue: BookBlock[] = [start];
    const parts: string[] = [];
    for (let i = 0; i < queue.length; i++) {
      const b = queue[i]!;
      parts.push(`${b.note}#${b.id ?? b.index}:${b.hash}`);
      // A broken run further on names its line in the messages of the runs before it in the chain.
      if (i > 0) parts.push(this.brokenLine(b));
      for (const ref of b.refs) {
        const r = this.locate(b.note, ref);
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

  /** The notes holding a block with `id` (one entry per block), sorted: what an `id-duplicate` message says. */
  private copiesStamp(id: string): string | null {
    const list = this.byId.get(id);
    if (!list || list.length === 0) return null;
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

/** The ids closest to `id` (for "did you mean"), case aside, nearest first, at most five. */
function nearIds(id: string, among: readonly string[]): string[] {
  return nearest(id, new Set(among), Math.max(2, Math.floor(id.length / 3)), 5, { ignoreCase: true });
}

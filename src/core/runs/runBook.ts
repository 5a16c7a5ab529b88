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
import type { AnyText, TextChange } from '../analyzer/rescanPlan';
import { blockHoldingOffset } from '../text/common';
import { spanToNote } from '../analyzer/report';
import type { ChangeReach } from './changeLog';
import type { Externals, KeyChanges } from '../block/externals';
import type { FencedBlock } from '../text/fences';
import type { CellLine } from '../text/jupyter';
import { dependentNotes, referrersOf } from './referenceGraph';
import type { BookBlock, BookReference } from './bookBlocks';
import { BookAnswers } from './bookAnswers';
import { BookIndex, type LoadNote, type PartOf } from './bookIndex';
import { BookStamps } from './bookStamps';
import { RUN_KEY_PREFIX, type RunAnswer, type RunCopies, type RunFacts, type RunResolver } from './types';

export type { BookBlock, BookReference } from './bookBlocks';
export { MAX_CHAIN } from './bookAnswers';

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
  readonly load?: LoadNote;
  /**
   * The host's other sources for a note (spectrum files), merged into {@link RunBook.externalsFor}, so that a
   * referenced block whose own values come from a file reads them as its note does.
   */
  readonly sources?: (note: string) => Externals | null;
  /**
   * For a host that sets a note in parts (VS Code opens each Markdown cell of a notebook as a document of its
   * own): the whole note a note is a part of, or null for a whole note. A relative path written in a part is
   * resolved from the whole note's folder, and a reference naming the whole note finds its blocks in the parts
   * set; the host then keeps the whole note itself out of the book, or its runs would be there twice.
   */
  readonly partOf?: PartOf;
  /**
   * For a host that sets a notebook whole (its Markdown cells joined, core's joinCells): where each cell starts in
   * that note (core's cellStarts), or null for another note; a run's place and its first error then name their
   * cell and the line in it.
   */
  readonly cellStarts?: (note: string) => readonly CellLine[] | null;
}

/**
 * The book. One per host; not safe to share across threads (there are none). It holds its notes in an index
 * (bookIndex.ts), keeps its changes and stamps in a ledger (bookStamps.ts) and answers references with
 * bookAnswers.ts; what is here is what hosts ask.
 */
export class RunBook implements RunResolver {
  /** The notes, their blocks and the blocks carrying each id. */
  private readonly index: BookIndex;
  /** The changes of the book, the stamps of its keys and the runs evaluated. */
  private readonly stamps: BookStamps;
  /** The answers to references. */
  private readonly answers: BookAnswers;
  private readonly sources: RunBookOptions['sources'] | null;

  constructor(options: RunBookOptions = {}) {
    const analyzer = options.analyzer ?? new Analyzer({ infoStrings: options.infoStrings ?? [] });
    this.index = new BookIndex(
      options.infoStrings ?? analyzer.options.infoStrings,
      analyzer.options.limits.maxBlockChars,
      options.load ?? null,
      () => this.changed(),
      options.partOf ?? null,
    );
    this.stamps = new BookStamps(this.index);
    this.answers = new BookAnswers(
      this.index,
      this.stamps,
      analyzer,
      (note) => this.externalsFor(note),
      options.cellStarts ?? null,
    );
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
    const old = this.index.note(note);
    if (old && !old.loaded && change && old.text === change.previous) {
      // Indexed again only where it changed.
      const stretch = this.index.reindex(old, text, change);
      this.changed({ ids: stretch.ids, refs: this.stamps.referenceStampsMayChange(stretch) });
      return;
    }
    this.index.drop(note);
    this.index.add(note, text, false, fences);
    this.changed();
  }

  /**
   * A count that moves with every change of the book; with {@link changedSince}, what a host asks to know
   * whether the stamps it holds may be out of date without asking each one.
   */
  changes(): number {
    return this.stamps.changes;
  }

  /**
   * The keys whose stamps may have changed since the book's {@link changes} was `since`, as a test; null when
   * that is not known (too long ago, or a change of unknown reach): then every stamp must be asked.
   */
  changedSince(since: number): KeyChanges | null {
    return this.stamps.since(since);
  }

  /** Forgets a note (deleted, or closed and gone from the workspace). */
  deleteNote(note: string): void {
    this.index.drop(note);
    this.changed();
  }

  /** True when the book holds the note. */
  hasNote(note: string): boolean {
    return this.index.has(note);
  }

  /** The notes the book holds, set or loaded. */
  noteNames(): string[] {
    return this.index.noteNames();
  }

  /** The note's `levels` blocks as indexed (empty for an unknown note). */
  blocksOf(note: string): readonly BookBlock[] {
    return this.index.blocksOf(note);
  }

  /** Every block that carries an id, in the order of the notes given. */
  runs(): BookBlock[] {
    return this.index.runs();
  }

  /** Every block carrying `id`. */
  blocksWithId(id: string): readonly BookBlock[] {
    return this.index.blocksWithId(id);
  }

  /** The block of `note` whose body is `body`, or null. */
  blockAt(note: string, body: string, id: string | null = null): BookBlock | null {
    return this.index.blockAt(note, body, id);
  }

  /** The note a relative path written in `from` names (from the whole note's folder when `from` is a part). */
  notePath(from: string, relative: string): string {
    return this.index.notePath(from, relative);
  }

  /** The blocks of the note a path names, as references find them: of its parts when parts of it are set. */
  blocksNamed(path: string): readonly BookBlock[] {
    return this.index.blocksNamed(path);
  }

  /** The block a reference written in `from` leads to (null when unknown, missing or not followed). */
  target(from: string, ref: { readonly note: string | null; readonly id: string }): BookBlock | null {
    return this.index.target(from, ref);
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
    return referrersOf(target, this.index.allNotes(), this.index.follow);
  }

  /**
   * The notes whose blocks use `changed` (one of its blocks), directly or through other blocks: what a host
   * analyses and publishes again after `changed` was edited.
   */
  dependents(changed: string): string[] {
    return dependentNotes(changed, this.blocksOf(changed), this.index.allNotes(), this.index.follow);
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
    return this.stamps.stamp(key);
  }

  resolve(from: string, ref: { readonly note: string | null; readonly id: string }, at: string): RunAnswer {
    return this.answers.resolve(from, ref, at);
  }

  copies(from: string, id: string, at: string): RunCopies {
    return this.answers.copies(from, id, at);
  }

  /** The run a block of the book is, as a referring block sees it (evaluated once per stamp). */
  facts(b: BookBlock): RunFacts {
    return this.answers.facts(b);
  }

  /**
   * Records a change: of known reach (the ids whose sets of blocks changed, and whether any block's body did,
   * which reference stamps hash) or, without `reach`, of any. A note not found may be there now.
   */
  private changed(reach?: ChangeReach): void {
    this.stamps.changed(reach);
    this.index.forgetMissing();
  }
}

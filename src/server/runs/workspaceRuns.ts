/**
 * The workspace's runs, for runs by reference (docs/format.md, "A run by
 * reference"): every Markdown note of the workspace folders, open or not,
 * fed to the core's {@link RunBook}. Notes on disk are read once when the
 * folders are known and again on each file event; an open note's unsaved
 * text wins over its file. The book answers the `run:` dependency keys of
 * the analyses (an {@link ExternalPart}), so a note whose referenced blocks
 * changed is analysed again, and nothing else.
 *
 * Notes are named by URI, spelled as VS Code spells a file URI (every
 * character but the unreserved ones percent-encoded in each path segment),
 * which is also how the core spells a note a reference names.
 */
import {
  Analyzer,
  isInside,
  LineIndex,
  RunBook,
  type Externals,
  type FencedBlock,
  type KeyChanges,
  type NoteText,
  type RunResolver,
  type Span,
  type TextChange,
  type TextLines,
} from '../../core';
import type { Range } from 'vscode-languageserver';
import type { ExternalPart } from '../externals';
import { isNotebookNote, notebookNote, type NotebookNote } from './notebookNotes';
import { SERVER_LIMITS } from '../notes';
import { noteFileUri } from '../../shared/spectrumPaths';

/**
 * The notebook a note is a cell of (VS Code opens each Markdown cell of a notebook as a document of its own, named
 * `vscode-notebook-cell:` and the notebook's path), or null for a note of its own.
 */
export function notebookOfCell(uri: string): string | null {
  return uri.startsWith('vscode-notebook-cell:') ? noteFileUri(uri) : null;
}

/** Note files the index reads: Markdown, and Jupyter notebooks (their Markdown cells, see notebookNotes.ts). */
export const NOTE_FILE = /\.(md|markdown|ipynb)$/i;
/** Files read at once while the folders are walked. */
const READ_BATCH = 32;

/**
 * How the index reads notes that are not open: from disk where the server runs on Node.js (see
 * diskNotes.ts); a server without a file system (in a browser) has none and indexes the open notes only.
 */
export interface NoteFiles {
  /** Every note file (by URI) under a folder URI. */
  list(folder: string): Promise<string[]>;
  /** A note's text, or null when it is missing, too large or unreadable. */
  read(uri: string): Promise<string | null>;
  /** The same, at once (for a reference to a note the walk has not reached yet). */
  readNow(uri: string): string | null;
}

/** A file URI as VS Code spells it (and as the core's note paths are spelled). */
export function fileUri(path: string): string {
  let p = path.replace(/\\/g, '/');
  if (!p.startsWith('/')) p = '/' + p;
  // VS Code lowercases a drive letter.
  p = p.replace(/^\/([A-Za-z]):/, (_m, d: string) => `/${d.toLowerCase()}:`);
  return (
    'file://' +
    p
      .split('/')
      .map((s) => encodeURIComponent(s).replace(/[!'()*]/g, (c) => '%' + c.charCodeAt(0).toString(16).toUpperCase()))
      .join('/')
  );
}

/** True when the URI names a note the index reads. */
export function isNoteUri(uri: string): boolean {
  return NOTE_FILE.test(uri.split(/[?#]/)[0] ?? '');
}

/** What changed in the index: the notes set or removed. */
export type IndexListener = (notes: readonly string[]) => void;

/** The index of every run of the workspace. */
export class WorkspaceRuns implements ExternalPart {
  readonly book: RunBook;
  /** Notes with an unsaved text (open in the editor): file events do not replace them. */
  private readonly open = new Set<string>();
  /**
   * Notebooks open in the editor → their cells open as notes. While a notebook is open its cells stand for it in
   * the book (see RunBookOptions.partOf), and its file is kept out of the index: read from the file as well, each
   * of its runs would be there twice, each the other's `id-duplicate`.
   */
  private readonly cells = new Map<string, Set<string>>();
  /**
   * The text of every note of the book, for positions in notes that are not open; for a notebook, the text the
   * book reads (its Markdown cells) with the file text it came from and the places in that file.
   */
  private readonly texts = new Map<
    string,
    { text: string | NoteText; lines: TextLines | null; notebook?: { raw: string; note: NotebookNote } }
  >();
  private folders: string[] = [];
  private scanning: Promise<void> = Promise.resolve();
  private scans = 0;

  constructor(
    private readonly changed: IndexListener,
    private readonly files: NoteFiles | null,
    analyzer: Analyzer = new Analyzer({ limits: SERVER_LIMITS }),
    sources: ((note: string) => Externals | null) | null = null,
  ) {
    this.book = new RunBook({
      analyzer,
      load: (note) => this.loadNow(note),
      partOf: notebookOfCell,
      cellStarts: (note) => this.texts.get(note)?.notebook?.note.starts ?? null,
      ...(sources ? { sources } : {}),
    });
  }

  /** The resolver the analyses of every note use. */
  get runs(): RunResolver {
    return this.book;
  }

  owns(key: string): boolean {
    return this.book.owns(key);
  }

  stamp(key: string): string | null {
    return this.book.stamp(key);
  }

  changes(): number {
    return this.book.changes();
  }

  changedSince(since: number): KeyChanges | null {
    return this.book.changedSince(since);
  }

  /** The notes of the index that are not open in the editor and refer to another run. */
  closedReferrers(): string[] {
    return this.book
      .noteNames()
      .filter((n) => !this.open.has(n) && this.book.blocksOf(n).some((b) => b.refs.length > 0));
  }

  /** Whether the editor has the note open (a notebook: any of its cells). */
  isOpen(uri: string): boolean {
    return this.open.has(uri) || this.cells.has(uri);
  }

  /** The text of a note of the book, or null. */
  textOf(note: string): string | null {
    const t = this.texts.get(note)?.text;
    return t === undefined ? null : typeof t === 'string' ? t : t.toString();
  }

  /**
   * The line index of a note of the book, or null (also for a notebook, whose places are not those of the text the
   * book reads: see {@link rangeOf}).
   */
  linesOf(note: string): TextLines | null {
    const t = this.texts.get(note);
    if (!t || t.notebook) return null;
    if (!t.lines) t.lines = typeof t.text === 'string' ? new LineIndex(t.text) : t.text;
    return t.lines;
  }

  /** The range in a note's file of a span of the text the book reads of it, or null when the note is unknown. */
  rangeOf(note: string, span: Span): Range | null {
    const nb = this.texts.get(note)?.notebook;
    if (nb) return { start: nb.note.place(span.start), end: nb.note.place(span.end) };
    const lines = this.linesOf(note);
    return lines ? { start: lines.positionAt(span.start), end: lines.positionAt(span.end) } : null;
  }

  /** Resolves when the latest walk of the folders is over. */
  ready(): Promise<void> {
    return this.scanning;
  }

  /** Sets the workspace folders (URIs) and reads every note in them; notes of removed folders are dropped. */
  setFolders(folders: readonly string[]): Promise<void> {
    this.folders = [...folders];
    const scan = ++this.scans;
    const gone = this.book.noteNames().filter((n) => !this.open.has(n) && !this.inFolders(n));
    for (const n of gone) this.forget(n);
    if (gone.length > 0) this.changed(gone);
    this.scanning = this.walkAll(scan);
    return this.scanning;
  }

  /** An open note's text (opened or edited). */
  edited(
    uri: string,
    text: string | NoteText,
    changeSince?: (previous: NoteText) => TextChange | undefined,
    fences?: () => readonly FencedBlock[],
  ): void {
    this.open.add(uri);
    const notebook = notebookOfCell(uri);
    if (notebook !== null) this.cellOpened(notebook, uri);
    const known = this.texts.get(uri)?.text;
    if (known === text) return;
    // An edit of the text the book holds is indexed again where it changed only (core/runs/runBook.ts).
    const change = known !== undefined && typeof known !== 'string' && changeSince ? changeSince(known) : undefined;
    this.texts.set(uri, { text, lines: typeof text === 'string' ? null : text });
    this.book.setNote(uri, text, change, fences);
    this.changed([uri]);
  }

  /** A note was closed: its file's text takes over (or it leaves the index when it has no file in the folders). */
  async closed(uri: string): Promise<void> {
    this.open.delete(uri);
    await this.reread(uri);
    const notebook = notebookOfCell(uri);
    const open = notebook === null ? undefined : this.cells.get(notebook);
    if (!open?.delete(uri) || open.size > 0) return;
    // The notebook's last cell closed: its file takes over.
    this.cells.delete(notebook!);
    await this.reread(notebook!);
  }

  /** A cell of a notebook was opened: the notebook's file leaves the index while the notebook is open. */
  private cellOpened(notebook: string, cell: string): void {
    const open = this.cells.get(notebook);
    if (open) {
      open.add(cell);
      return;
    }
    this.cells.set(notebook, new Set([cell]));
    if (!this.book.hasNote(notebook)) return;
    this.forget(notebook);
    this.changed([notebook]);
  }

  /** A watched file was created, changed or deleted. */
  async fileEvent(uri: string, kind: 'created' | 'changed' | 'deleted'): Promise<void> {
    if (this.isOpen(uri)) return;
    if (kind === 'deleted' && !isNoteUri(uri)) {
      // A folder was deleted: every note under it goes.
      const gone = this.book.noteNames().filter((n) => !this.open.has(n) && isInside(n, uri));
      for (const n of gone) this.forget(n);
      if (gone.length > 0) this.changed(gone);
      return;
    }
    if (!isNoteUri(uri)) return;
    await this.reread(uri);
  }

  /** Reads a note again from disk (after a file event or when it was closed). */
  private async reread(uri: string): Promise<void> {
    const text = this.inFolders(uri) && this.files ? await this.files.read(uri) : null;
    if (this.isOpen(uri)) return; // opened meanwhile: the editor's text wins
    if (text === null) {
      if (!this.book.hasNote(uri)) return;
      this.forget(uri);
    } else {
      if (this.unchanged(uri, text)) return;
      this.set(uri, text);
    }
    this.changed([uri]);
  }

  /** A note's file text, as the book reads it: a notebook's Markdown cells (see notebookNotes.ts). */
  private set(uri: string, raw: string): void {
    const note = isNotebookNote(uri) ? notebookNote(raw) : null;
    const text = note ? note.text : raw;
    this.texts.set(uri, note ? { text, lines: null, notebook: { raw, note } } : { text, lines: null });
    this.book.setNote(uri, text);
  }

  /** True when the book holds the note as read from this file text already. */
  private unchanged(uri: string, raw: string): boolean {
    const t = this.texts.get(uri);
    return (t?.notebook ? t.notebook.raw : t?.text) === raw && this.book.hasNote(uri);
  }

  private forget(uri: string): void {
    this.texts.delete(uri);
    this.book.deleteNote(uri);
  }

  private inFolders(uri: string): boolean {
    return this.folders.some((f) => isInside(uri, f));
  }

  /** A note a reference names that the index does not hold yet (the walk is not over): read now, in the folders only. */
  private loadNow(note: string): string | null {
    if (!this.files || !this.inFolders(note) || !isNoteUri(note) || this.cells.has(note)) return null;
    const raw = this.files.readNow(note);
    if (raw === null) return null;
    const nb = isNotebookNote(note) ? notebookNote(raw) : null;
    this.texts.set(note, nb ? { text: nb.text, lines: null, notebook: { raw, note: nb } } : { text: raw, lines: null });
    return nb ? nb.text : raw;
  }

  private async walkAll(scan: number): Promise<void> {
    const files = this.files;
    if (!files) return;
    const found: string[] = [];
    for (const f of this.folders) found.push(...(await files.list(f)));
    const set: string[] = [];
    for (let i = 0; i < found.length; i += READ_BATCH) {
      if (scan !== this.scans) return; // the folders changed: a newer walk takes over
      const batch = found.slice(i, i + READ_BATCH);
      const texts = await Promise.all(batch.map((u) => files.read(u)));
      batch.forEach((uri, k) => {
        const text = texts[k];
        if (text === null || text === undefined || this.isOpen(uri)) return;
        if (this.unchanged(uri, text)) return;
        this.set(uri, text);
        set.push(uri);
      });
    }
    if (set.length > 0) this.changed(set);
  }
}

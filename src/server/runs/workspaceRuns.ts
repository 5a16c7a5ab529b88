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
import { promises as fs, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Analyzer, isInside, LineIndex, RunBook, type RunResolver } from '../../core';
import type { ExternalPart } from '../externals';
import { SERVER_LIMITS } from '../notes';

/** Note files the index reads. */
const NOTE_FILE = /\.(md|markdown)$/i;
/** Folders never walked. */
const SKIPPED_FOLDER = /^(node_modules|\.git|\.hg|\.svn)$/;
/** A note file larger than this is not indexed (the server's own bound on a note is 2 M characters). */
const MAX_NOTE_BYTES = 4_000_000;
/** At most this many notes are indexed per workspace. */
const MAX_NOTES = 50_000;
/** Files read at once while the folders are walked. */
const READ_BATCH = 32;

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

/** The path of a `file:` URI, or null for another scheme. */
export function uriPath(uri: string): string | null {
  if (!uri.startsWith('file:')) return null;
  try {
    return fileURLToPath(uri);
  } catch {
    return null;
  }
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
  /** The text of every note of the book, for positions in notes that are not open. */
  private readonly texts = new Map<string, { text: string; lines: LineIndex | null }>();
  private folders: string[] = [];
  private scanning: Promise<void> = Promise.resolve();
  private scans = 0;

  constructor(
    private readonly changed: IndexListener,
    analyzer: Analyzer = new Analyzer({ limits: SERVER_LIMITS }),
  ) {
    this.book = new RunBook({ analyzer, load: (note) => this.loadNow(note) });
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

  /** The text of a note of the book, or null. */
  textOf(note: string): string | null {
    return this.texts.get(note)?.text ?? null;
  }

  /** The line index of a note of the book, or null. */
  linesOf(note: string): LineIndex | null {
    const t = this.texts.get(note);
    if (!t) return null;
    if (!t.lines) t.lines = new LineIndex(t.text);
    return t.lines;
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
  edited(uri: string, text: string): void {
    this.open.add(uri);
    if (this.texts.get(uri)?.text === text) return;
    this.set(uri, text);
    this.changed([uri]);
  }

  /** A note was closed: its file's text takes over (or it leaves the index when it has no file in the folders). */
  async closed(uri: string): Promise<void> {
    this.open.delete(uri);
    await this.reread(uri);
  }

  /** A watched file was created, changed or deleted. */
  async fileEvent(uri: string, kind: 'created' | 'changed' | 'deleted'): Promise<void> {
    if (this.open.has(uri)) return;
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
    const text = this.inFolders(uri) ? await readNote(uri) : null;
    if (this.open.has(uri)) return; // opened meanwhile: the editor's text wins
    if (text === null) {
      if (!this.book.hasNote(uri)) return;
      this.forget(uri);
    } else {
      if (this.texts.get(uri)?.text === text && this.book.hasNote(uri)) return;
      this.set(uri, text);
    }
    this.changed([uri]);
  }

  private set(uri: string, text: string): void {
    this.texts.set(uri, { text, lines: null });
    this.book.setNote(uri, text);
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
    if (!this.inFolders(note) || !isNoteUri(note)) return null;
    const path = uriPath(note);
    if (path === null) return null;
    try {
      if (statSync(path).size > MAX_NOTE_BYTES) return null;
      const text = readFileSync(path, 'utf8');
      this.texts.set(note, { text, lines: null });
      return text;
    } catch {
      return null;
    }
  }

  private async walkAll(scan: number): Promise<void> {
    const found: string[] = [];
    for (const f of this.folders) {
      const root = uriPath(f);
      if (root !== null) await walk(root, found);
    }
    const set: string[] = [];
    for (let i = 0; i < found.length; i += READ_BATCH) {
      if (scan !== this.scans) return; // the folders changed: a newer walk takes over
      const batch = found.slice(i, i + READ_BATCH);
      const texts = await Promise.all(batch.map((p) => readNote(fileUri(p))));
      batch.forEach((p, k) => {
        const uri = fileUri(p);
        const text = texts[k];
        if (text === null || text === undefined || this.open.has(uri)) return;
        if (this.texts.get(uri)?.text === text && this.book.hasNote(uri)) return;
        this.set(uri, text);
        set.push(uri);
      });
    }
    if (set.length > 0) this.changed(set);
  }
}

/** Every note file under a folder (depth first, hidden and dependency folders skipped), at most MAX_NOTES. */
async function walk(dir: string, out: string[]): Promise<void> {
  let entries: import('node:fs').Dirent[];
  try {
    entries = await fs.readdir(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    if (out.length >= MAX_NOTES) return;
    if (e.isDirectory()) {
      if (!SKIPPED_FOLDER.test(e.name) && !e.name.startsWith('.')) await walk(join(dir, e.name), out);
    } else if (e.isFile() && NOTE_FILE.test(e.name)) out.push(join(dir, e.name));
  }
}

/** A note's text from disk, or null when it is missing, too large or unreadable. */
async function readNote(uri: string): Promise<string | null> {
  const path = uriPath(uri);
  if (path === null) return null;
  try {
    const st = await fs.stat(path);
    if (!st.isFile() || st.size > MAX_NOTE_BYTES) return null;
    return await fs.readFile(path, 'utf8');
  } catch {
    return null;
  }
}

/**
 * The notes a command reads and their rows: every note read first (a block may
 * use a run of any of them), the book of runs built only when the notes need
 * one, then the rows note by note, with nothing of a note kept once given.
 */
import { dirname } from 'node:path';
import {
  Analyzer,
  decodeUtf8,
  isNotebookPath,
  notebookCells,
  notebookInvalidEntry,
  LineIndex,
  notUtf8Diagnostic,
  reportEntry,
  terminalText,
  unreadableEntry,
  SpectrumShelf,
  needRunBook,
  scanFencedBlocks,
  type RunBook,
  type Externals,
} from '../core';
import { collectNotes } from './files';
import type { Row } from './formats';
import type { Io } from './main';
import { bookName, bookText, commandBook, readableRoots, type NotebookStarts } from './runs';
import { noteSpectra } from './spectra';

/** One note as read: its text (a byte-order mark dropped) and where its bytes were not UTF-8. */
export interface ReadNote {
  readonly note: { readonly name: string } | { readonly name: string; readonly unreadable: string };
  readonly text: string;
  readonly invalid: readonly { readonly byte: number; readonly offset: number }[];
}

/**
 * The rows of the notes under the given paths, note by note, in file then line order (an unreadable file is one
 * row). A block may use a run of any note read, so every note is read first; the book of runs is built only when
 * the notes need one (a block can refer to a run, or two blocks carry one id: core/runs/plainIds.ts), since
 * building it reads every block once more. Nothing of a note is kept once its rows are given: the analyzer's
 * cache is emptied after each, so memory holds the notes' texts and one note's work.
 */
export function noteRowsOf(paths: readonly string[], io: Io): Generator<Row[]> {
  return eachNoteRows(readNotes(paths, io), io);
}

/** The notes as read, and what reads them: the analyzer, the book of runs when they need one, their sources. */
export interface ReadNotes {
  readonly read: readonly ReadNote[];
  readonly analyzer: Analyzer;
  readonly book: RunBook | null;
  readonly externalsFor: (note: string) => Externals;
}

/** The rows of the notes read, note by note; the analyzer's cache is emptied after each. */
export function* eachNoteRows(notes: ReadNotes, io: Pick<Io, 'err' | 'cwd'>): Generator<Row[]> {
  for (const r of notes.read) {
    yield rowsOfNote(notes.analyzer, r, io, notes.externalsFor);
    notes.analyzer.clear();
  }
}

/** The notes under the given paths, read, and the book of runs when they need one (see {@link noteRowsOf}). */
export function readNotes(paths: readonly string[], io: Io): ReadNotes {
  const analyzer = new Analyzer();
  // One shelf for the run: a spectrum file that several notes use is parsed once.
  const shelf = new SpectrumShelf();
  const stdin = io.stdin ?? (() => new Uint8Array(0));
  // Each note's spectrum files are read relative to its folder, for the blocks of the note and those it refers to.
  const spectra = (note: string): Externals => noteSpectra(shelf, note, dirname(note));
  const read: ReadNote[] = collectNotes(paths, io.cwd, stdin).map((note) => {
    if ('unreadable' in note) return { note, text: '', invalid: [] };
    const decoded = decodeUtf8(note.bytes);
    // The bytes are not kept: the text is what is read from here on.
    // A byte-order mark is not part of the note; offsets after it move back by one.
    const bom = decoded.text.charCodeAt(0) === 0xfeff ? 1 : 0;
    const text = bom ? decoded.text.slice(1) : decoded.text;
    return {
      note: { name: note.name },
      text,
      invalid: decoded.invalid.map((v) => ({ byte: v.byte, offset: v.offset - bom })),
    };
  });
  const cells: NotebookStarts = new Map();
  const texts = read.map((r) =>
    'unreadable' in r.note
      ? null
      : {
          name: r.note.name,
          text: bookText(r.note.name, r.text, (starts) => cells.set(bookName(r.note.name, io.cwd), starts)),
        },
  );
  let book: RunBook | null = null;
  if (needRunBook(levelsBodies(analyzer, texts))) {
    book = commandBook(analyzer, readableRoots(paths, io.cwd), spectra, cells);
    for (const t of texts) if (t) book.setNote(bookName(t.name, io.cwd), t.text);
  }
  const externalsFor = book ? (note: string): Externals => book!.externalsFor(note) : spectra;
  return { read, analyzer, book, externalsFor };
}

/** The bodies of every `levels` block of the notes' texts (as the book would index them). */
function* levelsBodies(analyzer: Analyzer, texts: readonly ({ text: string } | null)[]): Generator<string> {
  for (const t of texts) {
    if (!t) continue;
    for (const block of scanFencedBlocks(t.text)) if (analyzer.isLevelsFence(block)) yield block.body;
  }
}

/** The rows of one note read (one row for an unreadable one); warnings about its bytes go to `io.err`. */
export function rowsOfNote(
  analyzer: Analyzer,
  r: ReadNote,
  io: Pick<Io, 'err' | 'cwd'>,
  externalsFor: (note: string) => Externals,
): Row[] {
  const { note, text, invalid } = r;
  if ('unreadable' in note)
    return [{ block: null, entry: unreadableEntry(note.name, `Cannot read '${note.name}': ${note.unreadable}.`) }];
  const externals = externalsFor(bookName(note.name, io.cwd));
  const rows: Row[] = [];
  if (isNotebookPath(note.name)) {
    rows.push(...notebookRows(analyzer, note.name, text, externals));
    if (invalid.length > 0)
      io.err(
        terminalText(
          `boltzmark: warning: '${note.name}': the bytes at offset ${invalid[0]!.byte} are not UTF-8; they are read as U+FFFD`,
        ) + '\n',
      );
    return rows;
  }
  const lines = new LineIndex(text);
  const blocks = analyzer.analyzeText(text, externals).blocks;
  // Blocks and bad sequences are both in note order: one pass pairs them (no block × sequence scan).
  const outside: { byte: number; offset: number }[] = [];
  let next = 0;
  for (const block of blocks) {
    const entry = reportEntry(note.name, block, lines);
    while (next < invalid.length && invalid[next]!.offset < block.block.openStart) outside.push(invalid[next++]!);
    const inside: { byte: number; offset: number }[] = [];
    while (next < invalid.length && invalid[next]!.offset < block.block.blockEnd) inside.push(invalid[next++]!);
    const first = inside[0];
    rows.push({
      block,
      entry: first
        ? {
            ...entry,
            diagnostics: [notUtf8Diagnostic(first.byte, first.offset, inside.length, lines), ...entry.diagnostics],
          }
        : entry,
    });
  }
  // Bytes outside every block change no result, but are not replaced in silence either.
  for (; next < invalid.length; next++) outside.push(invalid[next]!);
  if (outside.length > 0)
    io.err(
      terminalText(
        `boltzmark: warning: '${note.name}': the bytes at offset ${outside[0]!.byte} are not UTF-8` +
          (outside.length > 1
            ? ` (and ${outside.length - 1} more outside levels blocks)`
            : ' (outside levels blocks)') +
          '; they are read as U+FFFD',
      ) + '\n',
    );
  return rows;
}

/** Every block of the notes under the given paths, in file then line order; an unreadable file is one row. */
export function analyseAll(paths: readonly string[], io: Io): Row[] {
  const rows: Row[] = [];
  for (const r of noteRowsOf(paths, io)) for (const row of r) rows.push(row);
  return rows;
}

/**
 * The rows of a Jupyter notebook: every block of its Markdown cells, each placed by its cell (1-based, among all
 * cells) and its line in that cell; or, for a file that is not a notebook, one row with the fault.
 */
function notebookRows(analyzer: Analyzer, name: string, text: string, externals: Externals): Row[] {
  const nb = notebookCells(text);
  if (nb.problem)
    return [
      {
        block: null,
        entry: notebookInvalidEntry(name, nb.problem.message, nb.problem.line + 1, nb.problem.column + 1),
      },
    ];
  return nb.cells.flatMap((c) => {
    const lines = new LineIndex(c.text);
    return analyzer
      .analyzeText(c.text, externals)
      .blocks.map((block) => ({ block, entry: reportEntry(name, block, lines, c.index + 1) }));
  });
}

/**
 * `boltzmark report <files|folders…>` reports every `levels` block of the
 * notes; `boltzmark check` prints their diagnostics for CI. Exit status: 0 when
 * no block has an error, 1 when one has or a file could not be read (that file
 * is reported in place of its blocks and every other file still is), 2 for a
 * usage error (an unknown option or format, `-` given twice).
 */
import { Command, CommanderError, InvalidArgumentError, Option } from 'commander';
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
  STATUSES,
  terminalText,
  unreadableEntry,
  SpectrumShelf,
  needRunBook,
  scanFencedBlocks,
  type RunBook,
  type Externals,
  type Status,
} from '../core';
import { noteSpectra } from './spectra';
// The bundler keeps only this field of package.json.
import { version } from '../../package.json';
import { collectNotes, UsageError } from './files';
import { reportJsonParallel } from './parallel';
import { bookName, bookText, commandBook, readableRoots } from './runs';
import {
  DEFAULT_TABLE_WIDTH,
  formatCsv,
  formatLinePoints,
  jsonElement,
  formatMarkdown,
  formatTable,
  where,
  type Row,
} from './formats';

/** Where the CLI reads and writes; the tests pass their own. */
export interface Io {
  readonly out: (s: string) => void;
  readonly err: (s: string) => void;
  /** The folder relative paths are read from (names are printed as given). */
  readonly cwd: string;
  /** The terminal's width in columns, when the output is a terminal. */
  readonly columns?: number;
  /** Standard input, read whole, for the path `-`. */
  readonly stdin?: () => Uint8Array;
  /** Threads for the JSON report when `--workers` is not given (the command sets the number of cores). */
  readonly workers?: number;
  /** The script the threads run (the command's own bundle); without it the report stays on this thread. */
  readonly workerScript?: string;
}

/** Notes from which the JSON report is shared out to threads (fewer are done before threads would start). */
const PARALLEL_FROM = 32;

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
function* noteRowsOf(paths: readonly string[], io: Io): Generator<Row[]> {
  const { read, analyzer, externalsFor } = readNotes(paths, io);
  for (const r of read) {
    yield rowsOfNote(analyzer, r, io, externalsFor);
    analyzer.clear();
  }
}

/** The notes under the given paths, read, and the book of runs when they need one (see {@link noteRowsOf}). */
function readNotes(
  paths: readonly string[],
  io: Io,
): {
  read: ReadNote[];
  analyzer: Analyzer;
  book: RunBook | null;
  externalsFor: (note: string) => Externals;
} {
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
  const texts = read.map((r) =>
    'unreadable' in r.note ? null : { name: r.note.name, text: bookText(r.note.name, r.text) },
  );
  let book: RunBook | null = null;
  if (needRunBook(levelsBodies(analyzer, texts))) {
    book = commandBook(analyzer, readableRoots(paths, io.cwd), spectra);
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
function analyseAll(paths: readonly string[], io: Io): Row[] {
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

const hasError = (rows: readonly Row[]): boolean =>
  rows.some((r) => r.entry.diagnostics.some((d) => d.severity === 'error'));

/**
 * Runs the report over the given paths and returns the exit status. A status
 * filter narrows what is printed; the exit status still reflects every block.
 */
export function report(
  paths: readonly string[],
  format: string,
  io: Io,
  statuses: readonly Status[] | null = null,
  wide = false,
): number | Promise<number> {
  if (format === 'json') return reportJson(paths, io, statuses);
  const rows = analyseAll(paths, io);
  const shown = statuses ? rows.filter((r) => statuses.includes(r.entry.status)) : rows;
  const width = io.columns !== undefined && io.columns >= 40 ? io.columns : DEFAULT_TABLE_WIDTH;
  const table = (r: readonly Row[]): string => formatTable(r, { width, wide });
  const formatter =
    {
      csv: formatCsv,
      'line-points': formatLinePoints,
      markdown: formatMarkdown,
      table,
    }[format] ?? table;
  io.out(formatter(shown));
  return hasError(rows) ? 1 : 0;
}

/**
 * The JSON report, written note by note as each is analysed: the same bytes as `formatJson` of every row, with
 * nothing of a note kept once it is written.
 */
function reportJson(paths: readonly string[], io: Io, statuses: readonly Status[] | null): number | Promise<number> {
  const notes = readNotes(paths, io);
  // Notes that need no book are independent of one another: from a few dozen on they are shared out to threads.
  const workers = io.workers ?? 1;
  if (!notes.book && workers > 1 && io.workerScript && notes.read.length >= PARALLEL_FROM)
    return reportJsonParallel(notes.read, io, statuses, workers, io.workerScript);
  let written = 0;
  let error = false;
  const each = function* (): Generator<Row[]> {
    for (const r of notes.read) {
      yield rowsOfNote(notes.analyzer, r, io, notes.externalsFor);
      notes.analyzer.clear();
    }
  };
  for (const rows of each()) {
    error ||= hasError(rows);
    let part = '';
    for (const r of rows) {
      if (statuses && !statuses.includes(r.entry.status)) continue;
      part += (written++ === 0 ? '[\n' : ',\n') + jsonElement(r.entry);
    }
    if (part !== '') io.out(part);
  }
  io.out(written === 0 ? '[]\n' : '\n]\n');
  return error ? 1 : 0;
}

/**
 * `boltzmark check`: every diagnostic as `file:line:col: severity code message`,
 * the form compilers print, so editors and CI annotate them; exit 1 on errors.
 */
export function check(paths: readonly string[], io: Io): number {
  let blocks = 0;
  let errors = 0;
  let warnings = 0;
  for (const { entry } of (function* () {
    for (const rows of noteRowsOf(paths, io)) yield* rows;
  })()) {
    blocks++;
    for (const d of entry.diagnostics) {
      if (d.severity === 'error') errors++;
      if (d.severity === 'warning') warnings++;
      io.out(`${terminalText(`${where(entry, d.line)}:${d.column}: ${d.severity} ${d.code} ${d.message}`)}\n`);
    }
  }
  io.err(`boltzmark: ${blocks} block(s) checked, ${errors} error(s), ${warnings} warning(s)\n`);
  return errors > 0 ? 1 : 0;
}

/** Parses `--workers 4`: a whole number from 1 to 256. */
function parseWorkers(value: string): number {
  const n = Number(value);
  if (!/^\d+$/.test(value.trim()) || n < 1 || n > 256)
    throw new InvalidArgumentError(`'${value}' is not a number of threads from 1 to 256`);
  return n;
}

/** Parses `--status inverted,non-thermal`; throws a usage error for an unknown word. */
function parseStatuses(value: string): Status[] {
  // Status words are matched without regard to case: `Inverted` and `NON-THERMAL` are what people type.
  const words = value
    .split(',')
    .map((w) => w.trim().toLowerCase())
    .filter((w) => w !== '');
  for (const w of words) {
    if (!(STATUSES as readonly string[]).includes(w))
      throw new InvalidArgumentError(`unknown status '${w}' (use ${STATUSES.join(', ')})`);
  }
  return words as Status[];
}

/**
 * Parses the arguments (without `node` and the script) and runs on this thread only; returns the exit status.
 * What the tests and other hosts call; the command itself calls {@link start}.
 */
export function main(argv: readonly string[], io: Io): number {
  const { workerScript: _script, ...here } = io;
  return start(argv, here) as number;
}

/**
 * Parses the arguments and runs; returns the exit status, or its promise when the JSON report runs on threads
 * (only with `io.workerScript`).
 */
export function start(argv: readonly string[], io: Io): number | Promise<number> {
  let status: number | Promise<number> = 0;
  const program = new Command()
    .name('boltzmark')
    .description(
      'Spin and excitation temperatures, polarization and population inversion from the levels blocks of Markdown notes.',
    )
    .version(version, '-V, --version', 'print the version and exit')
    .exitOverride()
    .configureOutput({
      writeOut: io.out,
      writeErr: io.err,
      outputError: (s, write) => write(`boltzmark: ${s.replace(/^error: /, '')}`),
    });
  program
    .command('report')
    .description('report every levels block of the given notes (folders are searched for *.md, - reads standard input)')
    .argument('<paths...>', 'Markdown files or folders, or - for standard input')
    .addOption(
      new Option(
        '-f, --format <format>',
        'output format (line-points: the plot data of every block of lines as CSV, one row per line)',
      )
        .choices(['table', 'json', 'csv', 'line-points', 'markdown'])
        .default('table'),
    )
    .addOption(
      new Option(
        '-s, --status <list>',
        'only blocks with these statuses, comma-separated (normal, saturated, inverted, non-thermal, invalid)',
      ).argParser(parseStatuses),
    )
    .option('-w, --wide', 'the table with every column, however wide (default: fit the terminal, or 100 columns)')
    .addOption(
      new Option(
        '--workers <count>',
        'threads the JSON report is analysed on, from 32 notes on (default: one per core but one; 1 keeps it on this thread)',
      ).argParser(parseWorkers),
    )
    .action((paths: string[], opts: { format: string; status?: Status[]; wide?: boolean; workers?: number }) => {
      const run = opts.workers === undefined ? io : { ...io, workers: opts.workers };
      status = report(paths, opts.format, run, opts.status ?? null, opts.wide === true);
    });
  program
    .command('check')
    .description('print every diagnostic as file:line:col: severity code message; exit 1 when any is an error')
    .argument('<paths...>', 'Markdown files or folders, or - for standard input')
    .action((paths: string[]) => {
      status = check(paths, io);
    });
  try {
    program.parse([...argv], { from: 'user' });
  } catch (err) {
    if (err instanceof CommanderError) {
      // Help and version are not errors; every real usage error exits with 2.
      return err.exitCode === 0 ? 0 : 2;
    }
    if (err instanceof UsageError) {
      io.err(`boltzmark: ${terminalText(err.message)}\n`);
      return 2;
    }
    throw err;
  }
  return status;
}

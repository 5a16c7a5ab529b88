/**
 * `boltzmark report <files|folders…>` reports every `levels` block of the
 * notes; `boltzmark check` prints their diagnostics for CI. Exit status: 0 when
 * no block has an error, 1 when one has or a file could not be read (that file
 * is reported in place of its blocks and every other file still is), 2 for a
 * usage error (an unknown option or format, `-` given twice).
 */
import { Command, CommanderError, InvalidArgumentError, Option } from 'commander';
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
  type Status,
} from '../core';
// The bundler keeps only this field of package.json.
import { version } from '../../package.json';
import { eachNote, listNotes, readNote, UsageError, type ListedNote, type Note } from './files';
import { reportJsonParallel } from './parallel';
import {
  DEFAULT_TABLE_WIDTH,
  formatCsv,
  formatJson,
  jsonElement,
  formatLinePoints,
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
  /** Worker threads for the JSON report when `--workers` is not given (the command sets the number of cores). */
  readonly workers?: number;
  /** The script the worker threads run (the command's own bundle); without it the report stays on this thread. */
  readonly workerScript?: string;
}

/** The rows of one note (one row for an unreadable one); warnings about its bytes go to `io.err`. */
export function noteRows(analyzer: Analyzer, note: Note, io: Pick<Io, 'err'>): Row[] {
  const rows: Row[] = [];
  if ('unreadable' in note) {
    rows.push({ block: null, entry: unreadableEntry(note.name, `Cannot read '${note.name}': ${note.unreadable}.`) });
    return rows;
  }
  const decoded = decodeUtf8(note.bytes);
  // A byte-order mark is not part of the note; offsets after it move back by one.
  const bom = decoded.text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const text = bom ? decoded.text.slice(1) : decoded.text;
  const invalid = decoded.invalid.map((v) => ({ byte: v.byte, offset: v.offset - bom }));
  if (isNotebookPath(note.name)) {
    rows.push(...notebookRows(analyzer, note.name, text));
    if (invalid.length > 0)
      io.err(
        terminalText(
          `boltzmark: warning: '${note.name}': the bytes at offset ${invalid[0]!.byte} are not UTF-8; they are read as U+FFFD`,
        ) + '\n',
      );
    return rows;
  }
  const lines = new LineIndex(text);
  const blocks = analyzer.analyzeText(text).blocks;
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

/**
 * Blocks kept in the command line's cache between notes: none. Each note is
 * analysed once, so a body cached for a later note is worth less than the
 * collector's work of keeping it: the cache is emptied after each note (and
 * with it the memory of earlier notes), and the heap holds one note's work.
 */
export const CLI_CACHE_BLOCKS = 0;

/** Notes from which the JSON report is shared out to worker threads. */
const PARALLEL_FROM = 32;

/** Every block of the notes under the given paths, in file then line order; an unreadable file is one row. */
function analyseAll(paths: readonly string[], io: Io): Row[] {
  const rows: Row[] = [];
  for (const r of eachNoteRows(paths, io)) rows.push(...r);
  return rows;
}

/**
 * The rows of one note at a time, in file order: a note is read, analysed and
 * given to the caller before the next is read, so nothing but the caller's
 * own output needs to outlive it.
 */
function* eachNoteRows(paths: readonly string[], io: Io, listed?: readonly (Note | ListedNote)[]): Generator<Row[]> {
  const analyzer = new Analyzer({ cacheSize: CLI_CACHE_BLOCKS });
  const stdin = io.stdin ?? (() => new Uint8Array(0));
  // Notes already listed (standard input then read, once) are read from the list.
  const notes = listed ? listed.map((n) => ('path' in n ? () => readNote(n.name, n.path) : () => n)) : null;
  if (notes) for (const read of notes) yield noteRows(analyzer, read(), io);
  else for (const note of eachNote(paths, io.cwd, stdin)) yield noteRows(analyzer, note, io);
}

/**
 * The rows of a Jupyter notebook: every block of its Markdown cells, each placed by its cell (1-based, among all
 * cells) and its line in that cell; or, for a file that is not a notebook, one row with the fault.
 */
function notebookRows(analyzer: Analyzer, name: string, text: string): Row[] {
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
      .analyzeText(c.text)
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
  workers = io.workers ?? 1,
): number | Promise<number> {
  if (format === 'json' && workers > 1 && io.workerScript) {
    const listed = listNotes(paths, io.cwd, io.stdin ?? (() => new Uint8Array(0)));
    // A thread costs its start (loading this script again): worth it from a few dozen notes on.
    if (listed.length >= PARALLEL_FROM) return reportJsonParallel(listed, io, statuses, workers, io.workerScript);
    return reportJsonStream(paths, io, statuses, listed);
  }
  if (format === 'json') return reportJsonStream(paths, io, statuses);
  const rows = analyseAll(paths, io);
  const shown = statuses ? rows.filter((r) => statuses.includes(r.entry.status)) : rows;
  const width = io.columns !== undefined && io.columns >= 40 ? io.columns : DEFAULT_TABLE_WIDTH;
  const table = (r: readonly Row[]): string => formatTable(r, { width, wide });
  const formatter =
    {
      json: formatJson,
      csv: formatCsv,
      'line-points': formatLinePoints,
      markdown: formatMarkdown,
      table,
    }[format] ?? table;
  io.out(formatter(shown));
  return hasError(rows) ? 1 : 0;
}

/**
 * The JSON report written note by note, as each is analysed: the same bytes
 * as {@link formatJson} of every row, but no note's rows outlive its turn, so
 * the memory of a report over any number of notes stays that of one note.
 */
function reportJsonStream(
  paths: readonly string[],
  io: Io,
  statuses: readonly Status[] | null,
  listed?: readonly (Note | ListedNote)[],
): number {
  let error = false;
  let first = true;
  for (const rows of eachNoteRows(paths, io, listed)) {
    if (!error && hasError(rows)) error = true;
    // One write per note: a write per entry costs more in the stream than the entries' own formatting.
    let chunk = '';
    for (const r of rows) {
      if (statuses && !statuses.includes(r.entry.status)) continue;
      chunk += (first ? '[\n' : ',\n') + jsonElement(r.entry);
      first = false;
    }
    if (chunk !== '') io.out(chunk);
  }
  io.out(first ? '[]\n' : '\n]\n');
  return error ? 1 : 0;
}

/**
 * `boltzmark check`: every diagnostic as `file:line:col: severity code message`,
 * the form compilers print, so editors and CI annotate them; exit 1 on errors.
 */
export function check(paths: readonly string[], io: Io): number {
  const rows = analyseAll(paths, io);
  let errors = 0;
  let warnings = 0;
  for (const { entry } of rows) {
    for (const d of entry.diagnostics) {
      if (d.severity === 'error') errors++;
      if (d.severity === 'warning') warnings++;
      io.out(`${terminalText(`${where(entry, d.line)}:${d.column}: ${d.severity} ${d.code} ${d.message}`)}\n`);
    }
  }
  io.err(`boltzmark: ${rows.length} block(s) checked, ${errors} error(s), ${warnings} warning(s)\n`);
  return errors > 0 ? 1 : 0;
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

/** Parses `--workers 4`: a whole number from 1 to 256. */
function parseCount(value: string): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1 || n > 256) throw new InvalidArgumentError('a whole number from 1 to 256');
  return n;
}

/**
 * Parses the arguments (without `node` and the script) and runs on this thread only; returns the exit status.
 * The tests call this; the command calls {@link start}.
 */
export function main(argv: readonly string[], io: Io): number {
  const { out, err, cwd, columns, stdin } = io;
  const status = start(argv, {
    out,
    err,
    cwd,
    ...(columns !== undefined ? { columns } : {}),
    ...(stdin ? { stdin } : {}),
  });
  // Without a worker script nothing runs on another thread, so the status is known now.
  if (typeof status !== 'number') throw new Error('boltzmark: a report on worker threads needs a worker script');
  return status;
}

/**
 * Parses the arguments (without `node` and the script) and runs; returns the exit status, or a promise of it when
 * the JSON report runs on worker threads.
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
        'threads that analyse notes for the JSON report (default: one per core)',
      ).argParser(parseCount),
    )
    .action((paths: string[], opts: { format: string; status?: Status[]; wide?: boolean; workers?: number }) => {
      status = report(paths, opts.format, io, opts.status ?? null, opts.wide === true, opts.workers ?? io.workers ?? 1);
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

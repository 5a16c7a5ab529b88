/**
 * `boltzmark report <files|folders…>` reports every `levels` block of the
 * notes; `boltzmark check` prints their diagnostics for CI. Exit status: 0 when
 * no block has an error, 1 when one has, 2 for a usage error (an unknown option
 * or format, `-` given twice) or a path that could not be read. An unreadable
 * file is reported in place of its blocks and every other file still is, in
 * full; it makes the status 2 even when blocks of other files have errors.
 */
import { Command, CommanderError, InvalidArgumentError, Option } from 'commander';
import { STATUSES, terminalText, type Status } from '../core';
// The bundler keeps only this field of package.json.
import { version } from '../../package.json';
import { UsageError } from './files';
import { analyseAll, eachNoteRows, noteRowsOf, readNotes, type ReadNotes } from './notes';
import { folderGiven, reportJsonParallel, startThreads, stopThreads } from './parallel';
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
  /** Threads for the JSON report, this one included, when `--workers` is not given (the command sets it from the cores). */
  readonly workers?: number;
  /** The script the threads run (the command's own bundle); without it the report stays on this thread. */
  readonly workerScript?: string;
}

/** Notes from which the JSON report is shared out to threads (fewer are done before threads would start). */
const PARALLEL_FROM = 32;

const hasError = (rows: readonly Row[]): boolean =>
  rows.some((r) => r.entry.diagnostics.some((d) => d.severity === 'error'));

/** The exit status of a usage error, which a path that could not be read is (the contract's machine report). */
const USAGE = 2;

/** True when a row stands for a file that could not be read. */
const isUnreadable = (r: Row): boolean => r.entry.diagnostics.some((d) => d.code === 'file-unreadable');

/** The exit status of the rows: 2 when a file could not be read (before any block error), 1 on an error, else 0. */
const exitStatus = (rows: readonly Row[]): number => (rows.some(isUnreadable) ? USAGE : hasError(rows) ? 1 : 0);

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
  return exitStatus(rows);
}

/**
 * The JSON report, written note by note as each is analysed: the same bytes as `formatJson` of every row, with
 * nothing of a note kept once it is written.
 */
function reportJson(paths: readonly string[], io: Io, statuses: readonly Status[] | null): number | Promise<number> {
  const workers = io.workers ?? 1;
  const script = workers > 1 ? io.workerScript : undefined;
  // With a folder to read, the threads start while this one reads the notes (parallel.ts).
  const early = script && folderGiven(paths, io.cwd) ? startThreads(workers - 1, script, statuses) : [];
  let notes: ReadNotes;
  try {
    notes = readNotes(paths, io);
  } catch (e) {
    stopThreads(early);
    throw e;
  }
  // Known before any note is analysed: a file that could not be read makes the status 2 whatever the blocks say.
  const unreadable = notes.read.some((r) => 'unreadable' in r.note);
  // Notes that need no book are independent of one another: from a few dozen on they are shared out to threads.
  if (!notes.book && script && notes.read.length >= PARALLEL_FROM)
    return reportJsonParallel(notes.read, io, statuses, workers, script, early).then((code) =>
      unreadable ? USAGE : code,
    );
  stopThreads(early);
  let written = 0;
  let error = false;
  for (const rows of eachNoteRows(notes, io)) {
    error ||= hasError(rows);
    let part = '';
    for (const r of rows) {
      if (statuses && !statuses.includes(r.entry.status)) continue;
      part += (written++ === 0 ? '[\n' : ',\n') + jsonElement(r.entry);
    }
    if (part !== '') io.out(part);
  }
  io.out(written === 0 ? '[]\n' : '\n]\n');
  return unreadable ? USAGE : error ? 1 : 0;
}

/**
 * `boltzmark check`: every diagnostic as `file:line:col: severity code message`,
 * the form compilers print, so editors and CI annotate them; exit 1 on errors,
 * 2 when a file could not be read.
 */
export function check(paths: readonly string[], io: Io): number {
  let blocks = 0;
  let errors = 0;
  let warnings = 0;
  let unreadable = false;
  for (const row of (function* () {
    for (const rows of noteRowsOf(paths, io)) yield* rows;
  })()) {
    const { entry } = row;
    unreadable ||= isUnreadable(row);
    blocks++;
    for (const d of entry.diagnostics) {
      if (d.severity === 'error') errors++;
      if (d.severity === 'warning') warnings++;
      io.out(`${terminalText(`${where(entry, d.line)}:${d.column}: ${d.severity} ${d.code} ${d.message}`)}\n`);
    }
  }
  io.err(`boltzmark: ${blocks} block(s) checked, ${errors} error(s), ${warnings} warning(s)\n`);
  return unreadable ? USAGE : errors > 0 ? 1 : 0;
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
      // Commander echoes arguments as given (an unknown option, a format word): each line it writes to standard
      // error goes without control or reordering characters, whoever hosts the command.
      writeErr: (s) =>
        io.err(
          s
            .split('\n')
            .map((l) => terminalText(l))
            .join('\n'),
        ),
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
        'threads the JSON report is analysed on, this one included, from 32 notes on (default: one per core, at most 8; 1 keeps it on this thread)',
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
      return err.exitCode === 0 ? 0 : USAGE;
    }
    if (err instanceof UsageError) {
      io.err(`boltzmark: ${terminalText(err.message)}\n`);
      return USAGE;
    }
    throw err;
  }
  return status;
}

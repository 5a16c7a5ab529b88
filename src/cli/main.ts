/**
 * `boltzmark report <files|folders…>` reports every `levels` block of the
 * notes; `boltzmark check` prints their diagnostics for CI. Exit status: 0 when no block has an error, 1 when one has, 2 for a
 * usage error (unknown option, unreadable path), as the contract says.
 */
import { Command, CommanderError, InvalidArgumentError, Option } from 'commander';
import { Analyzer, LineIndex, reportEntry, STATUSES, type Status } from '../core';
import { collectFiles, readNote, UsageError } from './files';
import { DEFAULT_TABLE_WIDTH, formatCsv, formatJson, formatMarkdown, formatTable, type Row } from './formats';

/** Where the CLI writes; the tests pass their own. */
export interface Io {
  readonly out: (s: string) => void;
  readonly err: (s: string) => void;
  readonly cwd: string;
  /** The terminal's width in columns, when the output is a terminal. */
  readonly columns?: number;
}

/** Every block of the notes under the given paths, in file then line order. */
function analyseAll(paths: readonly string[], io: Io): Row[] {
  const analyzer = new Analyzer();
  const rows: Row[] = [];
  for (const file of collectFiles(paths, io.cwd)) {
    const note = readNote(file);
    const lines = new LineIndex(note.text);
    for (const block of analyzer.analyzeText(note.text).blocks)
      rows.push({ block, entry: reportEntry(note.name, block, lines) });
  }
  return rows;
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
): number {
  const rows = analyseAll(paths, io);
  const shown = statuses ? rows.filter((r) => statuses.includes(r.entry.status)) : rows;
  const width = io.columns !== undefined && io.columns >= 40 ? io.columns : DEFAULT_TABLE_WIDTH;
  const table = (r: readonly Row[]): string => formatTable(r, { width, wide });
  const formatter = { json: formatJson, csv: formatCsv, markdown: formatMarkdown, table }[format] ?? table;
  io.out(formatter(shown));
  return hasError(rows) ? 1 : 0;
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
      io.out(`${entry.file}:${d.line}:${d.column}: ${d.severity} ${d.code} ${d.message}\n`);
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

/** Parses the arguments (without `node` and the script) and runs; returns the exit status. */
export function main(argv: readonly string[], io: Io): number {
  let status = 0;
  const program = new Command()
    .name('boltzmark')
    .description(
      'Spin and excitation temperatures, polarization and population inversion from the levels blocks of Markdown notes.',
    )
    .exitOverride()
    .configureOutput({
      writeOut: io.out,
      writeErr: io.err,
      outputError: (s, write) => write(`boltzmark: ${s.replace(/^error: /, '')}`),
    });
  program
    .command('report')
    .description('report every levels block of the given notes (folders are searched for *.md)')
    .argument('<paths...>', 'Markdown files or folders')
    .addOption(
      new Option('-f, --format <format>', 'output format')
        .choices(['table', 'json', 'csv', 'markdown'])
        .default('table'),
    )
    .addOption(
      new Option(
        '-s, --status <list>',
        'only blocks with these statuses, comma-separated (normal, saturated, inverted, non-thermal, invalid)',
      ).argParser(parseStatuses),
    )
    .option('-w, --wide', 'the table with every column, however wide (default: fit the terminal, or 100 columns)')
    .action((paths: string[], opts: { format: string; status?: Status[]; wide?: boolean }) => {
      status = report(paths, opts.format, io, opts.status ?? null, opts.wide === true);
    });
  program
    .command('check')
    .description('print every diagnostic as file:line:col: severity code message; exit 1 when any is an error')
    .argument('<paths...>', 'Markdown files or folders')
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
      io.err(`boltzmark: ${err.message}\n`);
      return 2;
    }
    throw err;
  }
  return status;
}

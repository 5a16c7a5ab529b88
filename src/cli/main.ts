/**
 * `boltzmark report <files|folders…>`: reports every `levels` block of the
 * notes. Exit status: 0 when no block has an error, 1 when one has, 2 for a
 * usage error (unknown option, unreadable path), as the contract says.
 */
import { Command, CommanderError, Option } from 'commander';
import { Analyzer, LineIndex, reportEntry } from '../core';
import { collectFiles, readNote, UsageError } from './files';
import { formatCsv, formatJson, formatTable, type Row } from './formats';

/** Where the CLI writes; the tests pass their own. */
export interface Io {
  readonly out: (s: string) => void;
  readonly err: (s: string) => void;
  readonly cwd: string;
}

/** Runs the report over the given paths and returns the exit status. */
export function report(paths: readonly string[], format: string, io: Io): number {
  const analyzer = new Analyzer();
  const rows: Row[] = [];
  for (const file of collectFiles(paths, io.cwd)) {
    const note = readNote(file);
    const lines = new LineIndex(note.text);
    for (const block of analyzer.analyzeText(note.text).blocks) rows.push({ block, entry: reportEntry(note.name, block, lines) });
  }
  io.out(format === 'json' ? formatJson(rows) : format === 'csv' ? formatCsv(rows) : formatTable(rows));
  return rows.some((r) => r.entry.diagnostics.some((d) => d.severity === 'error')) ? 1 : 0;
}

/** Parses the arguments (without `node` and the script) and runs; returns the exit status. */
export function main(argv: readonly string[], io: Io): number {
  let status = 0;
  const program = new Command()
    .name('boltzmark')
    .description('Spin and excitation temperatures, polarization and population inversion from the levels blocks of Markdown notes.')
    .exitOverride()
    .configureOutput({ writeOut: io.out, writeErr: io.err, outputError: (s, write) => write(`boltzmark: ${s.replace(/^error: /, '')}`) });
  program
    .command('report')
    .description('report every levels block of the given notes (folders are searched for *.md)')
    .argument('<paths...>', 'Markdown files or folders')
    .addOption(new Option('-f, --format <format>', 'output format').choices(['table', 'json', 'csv']).default('table'))
    .action((paths: string[], opts: { format: string }) => {
      status = report(paths, opts.format, io);
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

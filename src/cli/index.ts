#!/usr/bin/env node
/** Entry point of the `boltzmark` command (and of the threads its JSON report runs on: src/cli/parallel.ts). */
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { isMainThread } from 'node:worker_threads';
import { start } from './main';
import { serveNotes } from './parallel';

/**
 * The engine is asked not to inline the array builtins (`map`, `reduce`, `every`…) into the code it optimizes. An
 * inlined `map` makes a list with holes where the builtin makes one without, so the physics, which reads lists made
 * both ways, was compiled for one kind, thrown away at the other and compiled again: 48 such deoptimizations over a
 * thousand notes, 7 with the builtins called, and about a tenth less CPU for the report (README, Performance). A
 * command that runs for seconds gains more from compiling once than from the inlining. Set before any code is hot;
 * only for the engines known to have the flag (V8 up to 13: Node.js 20 to 24), since an unknown flag is complained
 * about on standard error.
 */
function tuneEngine(): void {
  const major = Number(/^(\d+)\./.exec(process.versions.v8)?.[1]);
  if (major >= 10 && major <= 13) setFlagsFromString('--no-turbo-inline-array-builtins');
}

/** The exit status of a command whose reader closed the pipe it wrote to: that of one stopped by SIGPIPE. */
const READER_GONE = 128 + 13;

/** Threads the JSON report takes at most by default, on a machine of many cores. */
const MAX_DEFAULT_WORKERS = 8;

/**
 * What happens when the output cannot be written. A reader that stops reading (`| head`) closes the pipe: the
 * command ends there, quietly, as commands stopped by SIGPIPE do; any other failure (a full disk) is said in one
 * line on standard error, with exit status 1. Either way no stack trace, and nothing more is written.
 */
function outputFailed(err: unknown): never {
  if ((err as NodeJS.ErrnoException | null)?.code === 'EPIPE') process.exit(READER_GONE);
  try {
    process.stderr.write(`boltzmark: the report could not be written: ${(err as Error).message}\n`);
  } finally {
    process.exit(1);
  }
}

function run(): void {
  // Writes to a pipe fail later, as an event; writes to a file fail at once, inside the report.
  process.stdout.on('error', outputFailed);
  // Standard error is where warnings go; a reader that closed it loses only those.
  process.stderr.on('error', () => undefined);
  let status: number | Promise<number>;
  try {
    status = startCommand();
  } catch (err) {
    if (
      typeof (err as NodeJS.ErrnoException | null)?.code === 'string' &&
      (err as { syscall?: string }).syscall === 'write'
    )
      outputFailed(err);
    throw err;
  }
  if (typeof status === 'number') process.exitCode = status;
  else
    void status.then((code) => {
      process.exitCode = code;
    });
}

function startCommand(): number | Promise<number> {
  return start(process.argv.slice(2), {
    // A write that failed leaves the stream errored at once (its event comes later): the report stops there.
    out: (s) => {
      process.stdout.write(s);
      if (process.stdout.errored) outputFailed(process.stdout.errored);
    },
    // What reaches standard error is already without control characters (start() cleans what commander echoes).
    err: (s) => process.stderr.write(s),
    cwd: process.cwd(),
    ...(process.stdout.isTTY && process.stdout.columns ? { columns: process.stdout.columns } : {}),
    // `-`: standard input, read whole (file descriptor 0).
    stdin: () => readFileSync(0),
    // The JSON report shares the notes out to threads, this one among them, the others running this same script:
    // one per core, at most eight, since each thread's engine compiles the same code again (about a second of
    // CPU), which more threads than that do not win back on a folder of notes (README, Performance).
    workers: Math.min(MAX_DEFAULT_WORKERS, availableParallelism()),
    workerScript: __filename,
  });
}

tuneEngine();
if (!isMainThread) serveNotes();
else run();

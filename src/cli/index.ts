#!/usr/bin/env node
/** Entry point of the `boltzmark` command (and of the threads its JSON report runs on: src/cli/parallel.ts). */
import { readFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { isMainThread } from 'node:worker_threads';
import { start } from './main';
import { serveNotes } from './parallel';

if (!isMainThread) serveNotes();
else run();

function run(): void {
  const status = start(process.argv.slice(2), {
    out: (s) => process.stdout.write(s),
    err: (s) => process.stderr.write(s),
    cwd: process.cwd(),
    ...(process.stdout.isTTY && process.stdout.columns ? { columns: process.stdout.columns } : {}),
    // `-`: standard input, read whole (file descriptor 0).
    stdin: () => readFileSync(0),
    // The JSON report shares the notes out to threads running this same script: one per core but one, which is
    // left to this thread's reading and writing (on two cores, threads were slower than none: README, Performance).
    workers: Math.max(1, availableParallelism() - 1),
    workerScript: __filename,
  });
  if (typeof status === 'number') process.exitCode = status;
  else
    void status.then((code) => {
      process.exitCode = code;
    });
}

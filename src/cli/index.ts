#!/usr/bin/env node
/** Entry point of the `boltzmark` command. */
import { readFileSync } from 'node:fs';
import { main } from './main';

process.exitCode = main(process.argv.slice(2), {
  out: (s) => process.stdout.write(s),
  err: (s) => process.stderr.write(s),
  cwd: process.cwd(),
  ...(process.stdout.isTTY && process.stdout.columns ? { columns: process.stdout.columns } : {}),
  // `-`: standard input, read whole (file descriptor 0).
  stdin: () => readFileSync(0),
});

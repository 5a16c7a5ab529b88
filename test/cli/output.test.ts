import { strict as assert } from 'node:assert';
import { spawn } from 'node:child_process';
import { closeSync, openSync, rmSync } from 'node:fs';
import { resolve } from 'node:path';
import { benchFolder } from '../support/benchFolder';

// When the output cannot be written. `boltzmark report … | head` closes the pipe after a few lines: the command
// must stop there, quietly, as commands stopped by SIGPIPE do (exit status 128 + 13; SIGPIPE is signal 13 in
// POSIX's table of signals, common practice, no source), not crash with a stack trace. A full disk gives one
// line on standard error and exit status 1. The command itself (dist/cli.js, built before the suites) is run,
// since the pipe and the exit are the process's own.

const BUNDLE = resolve('dist/cli.js');

/** Runs the command with its output read until `keep` bytes came, then the pipe closed; the status and stderr. */
function readThenClose(args: string[], keep: number): Promise<{ code: number | null; err: string; got: number }> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [BUNDLE, ...args], { stdio: ['ignore', 'pipe', 'pipe'] });
    let got = 0;
    let err = '';
    child.stdout.on('data', (b: Buffer) => {
      got += b.length;
      if (got >= keep) child.stdout.destroy();
    });
    child.stderr.on('data', (b: Buffer) => (err += b.toString()));
    child.on('error', fail);
    child.on('close', (code) => done({ code, err, got }));
  });
}

describe('boltzmark report when its output cannot be written', function () {
  this.timeout(60_000);
  let dir = '';
  before(() => {
    // Far more than a pipe holds (64 KiB on Linux) and than the reader takes in one read: 1,200 blocks, about
    // 1.5 KB of JSON and 250 bytes of CSV each.
    dir = benchFolder('boltzmark-output-', 60, 20);
  });
  after(() => rmSync(dir, { recursive: true, force: true }));

  for (const workers of ['1', '2'])
    it(`stops quietly when the reader closes the pipe (JSON, ${workers} thread(s))`, async () => {
      const r = await readThenClose(['report', dir, '--format', 'json', '--workers', workers], 100);
      assert.equal(r.code, 141, r.err);
      assert.equal(r.err, '');
    });

  it('stops quietly when the reader closes the pipe (CSV)', async () => {
    const r = await readThenClose(['report', dir, '--format', 'csv'], 10);
    assert.equal(r.code, 141, r.err);
    assert.equal(r.err, '');
  });

  it('says in one line that a full disk took the report, with exit status 1', async () => {
    // /dev/full: every write fails with ENOSPC (Linux's full(4) device).
    const fd = openSync('/dev/full', 'w');
    try {
      const r = await new Promise<{ code: number | null; err: string }>((done, fail) => {
        const child = spawn(process.execPath, [BUNDLE, 'report', dir, '--format', 'json'], {
          stdio: ['ignore', fd, 'pipe'],
        });
        let err = '';
        child.stderr!.on('data', (b: Buffer) => (err += b.toString()));
        child.on('error', fail);
        child.on('close', (code) => done({ code, err }));
      });
      assert.equal(r.code, 1);
      assert.match(r.err, /^boltzmark: the report could not be written: ENOSPC[^\n]*\n$/);
    } finally {
      closeSync(fd);
    }
  });
});

import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { rmSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { main, start, type Io } from '../../src/cli/main';
import { benchFolder } from '../support/benchFolder';

// The JSON report of many notes that need no book of runs is shared out to threads running the command's own
// bundle (dist/cli.js, built before the suites run). Whatever the threads do, the report must be the bytes the
// one-thread report writes, and a thread that fails must not lose a note. The notes are the invented benchmark
// notebook (bench/note.ts), each with ids of its own, plus a note with an error and one with bytes that are
// not UTF-8.

const BUNDLE = resolve('dist/cli.js');

/** A folder of `count` notes, one with an error and one with bytes that are not UTF-8; the caller removes it. */
function folder(count: number): string {
  const dir = benchFolder('boltzmark-threads-', count, 6);
  writeFileSync(join(dir, 'n010b.md'), '```levels\nid: broken\npopulations: [0.5, oops]\n```\n');
  writeFileSync(
    join(dir, 'n020b.md'),
    Buffer.from([0x23, 0x20, 0xff, 0x0a, ...Buffer.from('```levels\ngap: 1 K\n```\n')]),
  );
  return dir;
}

async function run(
  args: string[],
  cwd: string,
  threads: Partial<Io>,
): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await start(args, { out: (s) => (out += s), err: (s) => (err += s), cwd, ...threads });
  return { code, out, err };
}

/** The JSON report of the notes of `dir` on this thread alone. */
function oneThread(dir: string): string {
  let out = '';
  main(['report', '.', '--format', 'json'], { out: (s) => (out += s), err: () => undefined, cwd: dir });
  return out;
}

/**
 * With the other threads running `script` (written as `name` into a folder of `count` notes), the report is the
 * one-thread report, byte for byte, for each number of threads.
 */
async function losesNone(count: number, name: string, script: string, threads: readonly number[]): Promise<void> {
  const dir = folder(count);
  const path = join(dir, name);
  writeFileSync(path, script);
  try {
    const out = oneThread(dir);
    for (const workers of threads)
      assert.equal((await run(['report', '.', '--format', 'json'], dir, { workers, workerScript: path })).out, out);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

describe('boltzmark report on threads', function () {
  this.timeout(60_000);

  it('writes the same bytes, exit status and warnings as on one thread', async () => {
    const dir = folder(40);
    try {
      let out = '';
      let err = '';
      const code = main(['report', '.', '--format', 'json'], {
        out: (s) => (out += s),
        err: (s) => (err += s),
        cwd: dir,
      });
      const threaded = await run(['report', '.', '--format', 'json'], dir, { workers: 3, workerScript: BUNDLE });
      assert.equal(threaded.out, out);
      assert.equal(threaded.err, err);
      assert.equal(threaded.code, code);
      assert.equal(code, 1, 'the broken note has an error');
      assert.match(err, /not UTF-8/);
      const filtered = await run(['report', '.', '--format', 'json', '--status', 'invalid'], dir, {
        workers: 2,
        workerScript: BUNDLE,
      });
      const entries = JSON.parse(filtered.out) as { status: string }[];
      assert.ok(entries.length > 0 && entries.every((e) => e.status === 'invalid'));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('analyses on this thread the notes of a thread that fails, and loses none', () =>
    losesNone(40, 'thread-that-fails.js', "throw new Error('this thread fails at once');\n", [2]));

  it('analyses on this thread the notes held by a thread that fails midway, and writes each note once', () =>
    // The command's own thread, which fails a moment after it is given its second note, holding the notes it has
    // not answered.
    losesNone(
      60,
      'thread-that-fails-midway.js',
      `require(${JSON.stringify(BUNDLE)});\n` +
        "const { parentPort } = require('node:worker_threads');\n" +
        'let n = 0;\n' +
        "parentPort.on('message', () => { if (++n === 2) setImmediate(() => { throw new Error('fails midway'); }); });\n",
      [2, 4],
    ));

  it('analyses on this thread the notes held by a thread that ends without answering', () =>
    // A script that listens for nothing: its thread ends as soon as it has run, holding the notes it was given.
    losesNone(40, 'thread-that-ends.js', '// this thread listens for nothing and ends\n', [4]));

  it('stops unused the threads it started for a folder of too few notes, and the command ends', () => {
    // Threads start before a folder's notes are read; three notes are too few to share out. A thread left
    // running (it waits for notes) would keep the process alive until the time limit below.
    const dir = folder(3);
    try {
      const r = spawnSync(process.execPath, [BUNDLE, 'report', '.', '--format', 'json', '--workers', '4'], {
        cwd: dir,
        encoding: 'utf8',
        timeout: 30_000,
      });
      assert.equal(r.error, undefined, 'the command ended by itself');
      assert.equal(r.status, 1, 'the broken note has an error');
      assert.equal(r.stdout, oneThread(dir));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('keeps notes that refer to runs on one thread, where the book of runs is', async () => {
    const dir = folder(40);
    writeFileSync(
      join(dir, 'zz-uses.md'),
      '```levels\nid: uses\nsystem: 13C\nfield: 9.4 T\nsignal:\n  hyperpolarized: 2.9e4\n  thermal: { run: n3 run 1 }\n```\n',
    );
    try {
      // A thread script that would fail: the report must not need it.
      const threaded = await run(['report', '.', '--format', 'json'], dir, {
        workers: 2,
        workerScript: join(dir, 'no-such-script.js'),
      });
      const out = oneThread(dir);
      assert.equal(threaded.out, out);
      assert.ok(!out.includes('reference-unavailable'), 'the reference is followed');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, start, type Io } from '../../src/cli/main';

// The exit status of the machine contract: 0 when no block has an error, 1 when one has, 2 for a usage error,
// which an unreadable path is. A path that cannot be read makes the status 2 even when blocks of other files have
// errors, and every other file is still reported in full, in every format and in `check`.

/** ΔE/k = 10 K and n_u/n_l = 0.5: a block without problems (β = ln 2 / 10 K). */
const GOOD = '```levels\nid: good\ngap: 10 K\nratio: 0.5\n```\n';
/** A block with an error: a population that is not a number. */
const BROKEN = '```levels\nid: broken\npopulations: [0.5, oops]\n```\n';

function run(args: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(args, { out: (s) => (out += s), err: (s) => (err += s), cwd });
  return { code, out, err };
}

interface Entry {
  file: string;
  id: string | null;
  status: string;
  diagnostics: { code: string }[];
}

describe('boltzmark exit status for paths that cannot be read', () => {
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-exit-'));
    writeFileSync(join(dir, 'good.md'), GOOD);
    writeFileSync(join(dir, 'broken.md'), BROKEN);
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('is 0 for good notes, 1 for a block with an error, and 2 for a missing file, in JSON', () => {
    assert.equal(run(['report', 'good.md', '-f', 'json'], dir).code, 0);
    assert.equal(run(['report', 'good.md', 'broken.md', '-f', 'json'], dir).code, 1);
    const r = run(['report', 'good.md', 'missing.md', '-f', 'json'], dir);
    assert.equal(r.code, 2);
    const entries = JSON.parse(r.out) as Entry[];
    assert.deepEqual(
      entries.map((e) => [e.file, e.status]),
      [
        ['good.md', 'normal'],
        ['missing.md', 'invalid'],
      ],
    );
  });

  it('is 2 when a block error and an unreadable path come together, with every readable block still reported', () => {
    const r = run(['report', 'broken.md', 'missing.md', 'good.md', '-f', 'json'], dir);
    assert.equal(r.code, 2);
    const entries = JSON.parse(r.out) as Entry[];
    assert.deepEqual(
      entries.map((e) => [e.file, e.id, e.diagnostics[0]?.code ?? null]),
      [
        ['broken.md', 'broken', entries[0]!.diagnostics[0]!.code],
        ['missing.md', null, 'file-unreadable'],
        ['good.md', 'good', null],
      ],
    );
    assert.notEqual(entries[0]!.diagnostics[0]!.code, 'file-unreadable');
  });

  it('is 2 in the table, CSV and Markdown formats and in `check`, which still print the other files', () => {
    for (const format of ['table', 'csv', 'markdown', 'line-points']) {
      const r = run(['report', 'good.md', 'missing.md', '-f', format], dir);
      assert.equal(r.code, 2, format);
      if (format !== 'line-points') assert.match(r.out, /good\.md/, format);
    }
    const c = run(['check', 'broken.md', 'missing.md'], dir);
    assert.equal(c.code, 2);
    assert.match(c.out, /^missing\.md:1:1: error file-unreadable /m);
    assert.match(c.out, /^broken\.md:\d+:\d+: error /m);
    assert.equal(run(['check', 'broken.md'], dir).code, 1);
    assert.equal(run(['check', 'good.md'], dir).code, 0);
  });

  it('is 2 for a folder path that does not exist, and still 2 when the status filter hides the entry', () => {
    const r = run(['report', 'no-such-folder', 'good.md', '-f', 'json', '--status', 'normal'], dir);
    assert.equal(r.code, 2);
    assert.deepEqual(
      (JSON.parse(r.out) as Entry[]).map((e) => e.file),
      ['good.md'],
    );
  });

  it('writes the usage errors the command echoes without control characters, whoever hosts the command', () => {
    // ECMA-48: ESC [ … is a control sequence (CSI), ESC ] … an operating system command (OSC 8 makes a link).
    let err = '';
    const io: Io = { out: () => undefined, err: (s) => (err += s), cwd: dir };
    assert.equal(start(['report', 'good.md', '-f', 'x\u001b]8;;http://evil\u001b\\y\u001b[2J'], io), 2);
    assert.match(err, /^boltzmark: /);
    const control = (c: string): boolean => {
      const n = c.codePointAt(0)!;
      return (n < 0x20 && n !== 0x0a) || (n >= 0x7f && n <= 0x9f);
    };
    assert.ok(![...err].some(control), JSON.stringify(err));
    assert.ok(err.endsWith('\n'), 'the message ends its line');
  });

  it('is 2 when the JSON report is shared out to threads, and the report is the one of one thread', async () => {
    // Enough notes for threads, each id its own (a shared id would keep the report on one thread, with the book of
    // runs). The thread script ends at once, so this thread analyses every note itself.
    for (let i = 0; i < 40; i++)
      writeFileSync(join(dir, `n${String(i).padStart(2, '0')}.md`), GOOD.replace('good', `n${i}`));
    const script = join(dir, 'thread-that-ends.js');
    writeFileSync(script, '// this thread listens for nothing and ends\n');
    let out = '';
    const io: Io = { out: (s) => (out += s), err: () => undefined, cwd: dir, workers: 2, workerScript: script };
    const status = start(['report', '.', 'missing.md', '-f', 'json'], io);
    // Only the report on threads answers with a promise.
    assert.ok(status instanceof Promise, 'the report was shared out to threads');
    assert.equal(await status, 2);
    const one = run(['report', '.', 'missing.md', '-f', 'json'], dir);
    assert.equal(one.code, 2);
    assert.equal(out, one.out);
  });
});

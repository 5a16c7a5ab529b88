import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src/cli/main';

// The command line never loses a result: a file it cannot read is reported in
// place of its blocks, every other file still is, and the exit status is 2, a
// usage error, as the contract has it for an unreadable path (1 is for blocks
// with errors).

interface Entry {
  file: string;
  line: number;
  status: string;
  beta: { value: number } | null;
  diagnostics: { severity: string; code: string; message: string; line: number; column: number }[];
}

function run(args: string[], cwd: string, stdin?: Uint8Array): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const io: Io = { out: (s) => (out += s), err: (s) => (err += s), cwd, stdin: () => stdin ?? new Uint8Array(0) };
  const code = main(args, io);
  return { code, out, err };
}

const json = (args: string[], cwd: string, stdin?: Uint8Array): { code: number; entries: Entry[]; err: string } => {
  const r = run(['report', ...args, '-f', 'json'], cwd, stdin);
  return { code: r.code, entries: JSON.parse(r.out) as Entry[], err: r.err };
};

/** A good note: ΔE/k = 10 K and n_u/n_l = 0.5, so β = ln 2 / 10 K (Boltzmann factor; common practice, no source). */
const GOOD = '```levels\ngap: 10 K\nratio: 0.5\n```\n';
const BETA = Math.log(2) / 10;

describe('boltzmark: files that cannot be read', function () {
  this.timeout(60000);
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-files-'));
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('reports a missing file, a dangling link and a link loop each in its place, and every good file still', () => {
    writeFileSync(join(dir, 'a.md'), GOOD);
    writeFileSync(join(dir, 'z.md'), GOOD);
    symlinkSync(join(dir, 'nowhere.md'), join(dir, 'dangling.md'));
    symlinkSync(join(dir, 'loop2.md'), join(dir, 'loop1.md'));
    symlinkSync(join(dir, 'loop1.md'), join(dir, 'loop2.md'));
    const names = ['a.md', 'missing.md', 'dangling.md', 'loop1.md', 'z.md'];
    const { code, entries } = json(names, dir);
    assert.equal(code, 2);
    assert.deepEqual(
      entries.map((e) => [e.file, e.status]),
      names.map((n) => [n, n === 'a.md' || n === 'z.md' ? 'normal' : 'invalid']),
    );
    for (const e of entries.filter((x) => x.status === 'normal')) assert.ok(Math.abs(e.beta!.value - BETA) < 1e-12);
    const reasons = entries.filter((e) => e.status === 'invalid').map((e) => e.diagnostics);
    for (const d of reasons) {
      assert.equal(d.length, 1);
      assert.equal(d[0]!.severity, 'error');
      assert.equal(d[0]!.code, 'file-unreadable');
      assert.deepEqual([d[0]!.line, d[0]!.column], [1, 1]);
    }
    assert.match(reasons[0]![0]!.message, /no such file/);
    assert.match(reasons[1]![0]!.message, /symbolic link to nothing/);
    assert.match(reasons[2]![0]!.message, /loop of symbolic links/);
  });

  it('shows an unreadable file as a line of the table and of `check`, with exit status 2', () => {
    writeFileSync(join(dir, 'a.md'), GOOD);
    const table = run(['report', 'a.md', 'gone.md'], dir);
    assert.equal(table.code, 2);
    assert.match(table.out, /^a\.md:1 .* normal /m);
    assert.match(table.out, /^gone\.md:1 .* invalid /m);
    assert.match(table.out, /gone\.md:1:1: error file-unreadable: Cannot read 'gone\.md': no such file or folder\./);
    const check = run(['check', 'a.md', 'gone.md'], dir);
    assert.equal(check.code, 2);
    assert.equal(check.out, "gone.md:1:1: error file-unreadable Cannot read 'gone.md': no such file or folder.\n");
    assert.match(check.err, /2 block\(s\) checked, 1 error/);
  });

  it('never opens a FIFO or a device (which would block), named or found in a folder', () => {
    writeFileSync(join(dir, 'a.md'), GOOD);
    const made = spawnSync('mkfifo', [join(dir, 'pipe.md')]);
    assert.equal(made.status, 0, `mkfifo: ${String(made.stderr)}`);
    // /dev/zero never ends: read, it would fill memory; a link to it looks like a note.
    symlinkSync('/dev/zero', join(dir, 'zero.md'));
    const named = json(['pipe.md', 'zero.md', 'a.md'], dir);
    assert.equal(named.code, 2);
    assert.deepEqual(
      named.entries.map((e) => [e.file, e.status]),
      [
        ['pipe.md', 'invalid'],
        ['zero.md', 'invalid'],
        ['a.md', 'normal'],
      ],
    );
    assert.match(named.entries[0]!.diagnostics[0]!.message, /FIFO/);
    assert.match(named.entries[1]!.diagnostics[0]!.message, /device/);
    const walked = json(['.'], dir);
    assert.equal(walked.code, 2);
    assert.deepEqual(
      walked.entries.map((e) => [e.file, e.status]),
      [
        ['a.md', 'normal'],
        ['pipe.md', 'invalid'],
        ['zero.md', 'invalid'],
      ],
    );
  });

  it('reports a file that cannot be opened (permission, or a folder in a file’s place) and goes on', () => {
    writeFileSync(join(dir, 'a.md'), GOOD);
    // Root reads every file whatever its mode, so the case used is one no user can read as a note: a path
    // through a file as if it were a folder (ENOTDIR).
    const { code, entries } = json(['a.md/inner.md', 'a.md'], dir);
    assert.equal(code, 2);
    assert.deepEqual(
      entries.map((e) => e.status),
      ['invalid', 'normal'],
    );
    assert.match(entries[0]!.diagnostics[0]!.message, /not a folder/);
  });

  it('follows links to notes and to folders, each real folder once, so a link back up cannot loop', () => {
    mkdirSync(join(dir, 'notes'));
    mkdirSync(join(dir, 'elsewhere'));
    writeFileSync(join(dir, 'notes', 'a.md'), GOOD);
    writeFileSync(join(dir, 'elsewhere', 'b.md'), GOOD);
    symlinkSync(join(dir, 'elsewhere'), join(dir, 'notes', 'linked'));
    symlinkSync(join(dir, 'elsewhere', 'b.md'), join(dir, 'notes', 'c.md'));
    symlinkSync(dir, join(dir, 'notes', 'up'));
    const { code, entries } = json(['notes'], dir);
    assert.equal(code, 0);
    // a.md, c.md (the link to b.md, taken first), then linked/ (whose b.md is the same real file) and up/,
    // whose notes/ and elsewhere/ were already walked: every note once, by real path.
    assert.deepEqual(
      entries.map((e) => e.file),
      ['notes/a.md', 'notes/c.md'],
    );
  });

  it('warns about bytes that are not UTF-8 with their byte offset, on the block and line that hold them', () => {
    const head = Buffer.from('# ä note\n\n```levels\ngap: 10 K\nid: caf');
    const bytes = Buffer.concat([head, Buffer.from([0xe9]), Buffer.from('\nratio: 0.5\n```\n')]);
    writeFileSync(join(dir, 'latin1.md'), bytes);
    const { code, entries } = json(['latin1.md'], dir);
    assert.equal(code, 0, 'a warning, not an error');
    const d = entries[0]!.diagnostics.find((x) => x.code === 'text-encoding-invalid');
    assert.ok(d, JSON.stringify(entries[0]!.diagnostics));
    assert.equal(d.severity, 'warning');
    assert.match(d.message, new RegExp(`offset ${head.length} `));
    assert.deepEqual([d.line, d.column], [5, 8]);
    // Outside any block: said on standard error, the report is unchanged.
    writeFileSync(join(dir, 'outside.md'), Buffer.concat([Buffer.from([0xff, 0xfe, 0x41]), Buffer.from(`\n${GOOD}`)]));
    const r = json(['outside.md'], dir);
    assert.equal(r.entries[0]!.diagnostics.length, 0);
    assert.match(r.err, /'outside\.md': the bytes at offset 0 are not UTF-8 \(and 1 more outside levels blocks\)/);
  });
});

describe('boltzmark: standard input and the version', () => {
  it('reads one note from standard input for `-`, named `-`, among other files', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-stdin-'));
    try {
      writeFileSync(join(dir, 'a.md'), GOOD);
      const { code, entries } = json(['-', 'a.md'], dir, Buffer.from(`\uFEFF${GOOD}`));
      assert.equal(code, 0);
      assert.deepEqual(
        entries.map((e) => [e.file, e.line, e.status]),
        [
          ['-', 1, 'normal'],
          ['a.md', 1, 'normal'],
        ],
      );
      // The bundled command, reading a real pipe.
      const r = spawnSync(process.execPath, [join(process.cwd(), 'dist/cli.js'), 'report', '-', '-f', 'json'], {
        input: GOOD,
        encoding: 'utf8',
        cwd: dir,
      });
      assert.equal(r.status, 0, r.stderr);
      assert.equal((JSON.parse(r.stdout) as Entry[])[0]!.file, '-');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('prints the version of package.json for --version and -V, and exits 0', () => {
    const { version } = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    for (const flag of ['--version', '-V']) {
      const r = run([flag], process.cwd());
      assert.equal(r.code, 0);
      assert.equal(r.out, `${version}\n`);
    }
    const bundled = spawnSync(process.execPath, ['dist/cli.js', '--version'], { encoding: 'utf8' });
    assert.equal(bundled.status, 0);
    assert.equal(bundled.stdout, `${version}\n`);
  });
});

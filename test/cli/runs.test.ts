import { strict as assert } from 'node:assert';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main, type Io } from '../../src/cli/main';
import { dayRefBlock, extrapolatedRun, fence } from '../support/runNotes';

// Runs by reference on the command line: references resolve across every note read; a referenced note
// that was not named is read inside the folders given (or the folder of a file given), never outside.
// Invented numbers: the checks are about which notes are read and what the report says.

interface Entry {
  file: string;
  id: string | null;
  status: string;
  polarization: { value: number; uncertainty: number | null } | null;
  polarizationAt: { time: number; value: number; uncertainty: number | null; from: number } | null;
  thermalReference: { id: string; date: string | null } | null;
  diagnostics: { severity: string; code: string; message: string; line: number }[];
}

function run(args: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const io: Io = { out: (s) => (out += s), err: (s) => (err += s), cwd, stdin: () => new Uint8Array(0) };
  return { code: main(args, io), out, err };
}
const json = (args: string[], cwd: string): { code: number; entries: Entry[] } => {
  const r = run(['report', ...args, '-f', 'json'], cwd);
  return { code: r.code, entries: JSON.parse(r.out) as Entry[] };
};

const REF = dayRefBlock();
const RUN = (ref: string): string => extrapolatedRun('run 1', ref);

describe('boltzmark: runs by reference', function () {
  this.timeout(60000);
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-runs-'));
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('resolves a reference to another note given on the command line, and reports polarizationAt', () => {
    writeFileSync(join(dir, 'ref.md'), REF);
    writeFileSync(join(dir, 'run.md'), RUN('ref.md#ref-13C Monday'));
    const { code, entries } = json(['ref.md', 'run.md'], dir);
    assert.equal(code, 0, JSON.stringify(entries.map((e) => e.diagnostics)));
    const run1 = entries.find((e) => e.id === 'run 1')!;
    assert.deepEqual(run1.thermalReference, { id: 'ref-13C Monday', date: '2026-04-12' });
    assert.equal(run1.polarizationAt!.time, 0);
    assert.equal(run1.polarizationAt!.from, 42);
    // P(0) = P(42 s)·exp(42/47.9) (exponential decay law; the full check is in test/core/runs/physics.test.ts).
    assert.ok(Math.abs(run1.polarizationAt!.value / run1.polarization!.value - Math.exp(42 / 47.9)) < 1e-12);
  });

  it('finds a run in a notebook cell after a cell that leaves a fence or a comment open', () => {
    // VS Code renders each Markdown cell on its own: an unclosed fence or `<!--` ends with its cell.
    for (const first of ['```levels\nid: draft\ngap: 1 K', 'Set aside:\n\n<!--\n```levels\nid: old\n```']) {
      const md = (text: string): object => ({ cell_type: 'markdown', metadata: {}, source: [text] });
      const cells = [md(first), md(REF)];
      writeFileSync(join(dir, 'day.ipynb'), JSON.stringify({ cells, metadata: {}, nbformat: 4, nbformat_minor: 5 }));
      writeFileSync(join(dir, 'run.md'), RUN('day.ipynb#ref-13C Monday'));
      const { entries } = json(['run.md'], dir);
      const run1 = entries.find((e) => e.id === 'run 1')!;
      assert.deepEqual(run1.diagnostics, [], first);
      assert.deepEqual(run1.thermalReference, { id: 'ref-13C Monday', date: '2026-04-12' });
    }
  });

  it('names a broken run of a notebook by its cell and line, named on the command line or read for a reference', () => {
    const md = (text: string): object => ({ cell_type: 'markdown', metadata: {}, source: [text] });
    const code = { cell_type: 'code', metadata: {}, source: ['x = 1'], outputs: [] };
    // Cell 3 holds the reference with a zero thermal signal: the error is on line 8 of that cell.
    const cells = [md('# Monday'), code, md(REF.replace('thermal: 1.08e3', 'thermal: 0'))];
    writeFileSync(join(dir, 'day.ipynb'), JSON.stringify({ cells, metadata: {}, nbformat: 4, nbformat_minor: 5 }));
    writeFileSync(join(dir, 'run.md'), RUN('day.ipynb#ref-13C Monday'));
    for (const args of [['run.md', 'day.ipynb'], ['run.md']]) {
      const { entries } = json(args, dir);
      const d = entries.find((e) => e.id === 'run 1')!.diagnostics[0]!;
      assert.equal(d.code, 'reference-invalid');
      assert.match(d.message, /signal-thermal-zero.*day\.ipynb, cell 3, line 8\)/, args.join(' '));
    }
  });

  it('reads a referenced note that was not named, inside the folder given', () => {
    mkdirSync(join(dir, 'refs'));
    mkdirSync(join(dir, 'runs'));
    writeFileSync(join(dir, 'refs', 'mon.md'), REF);
    writeFileSync(join(dir, 'runs', 'r1.md'), RUN('../refs/mon.md#ref-13C Monday'));
    // The folder holds both: the unnamed note is read, and not reported itself.
    const inTree = json(['.'], dir);
    assert.equal(inTree.code, 0);
    // Naming only the run's note: ../refs lies outside the folder of the file given, so it is not read.
    const named = json(['runs/r1.md'], dir);
    assert.equal(named.code, 1);
    assert.deepEqual(
      named.entries.map((e) => e.diagnostics.map((d) => d.code)),
      [['reference-unknown']],
    );
    assert.match(named.entries[0]!.diagnostics[0]!.message, /is not read: it lies outside the folders given/);
    // Naming the reference's folder too makes its note one that is read (and reported).
    const both = json(['runs/r1.md', 'refs'], dir);
    assert.equal(both.code, 0);
    assert.deepEqual(
      both.entries.map((e) => e.id),
      ['run 1', 'ref-13C Monday'],
    );
  });

  it('never reads a note outside the folders given, not even through a symbolic link', () => {
    const outside = mkdtempSync(join(tmpdir(), 'boltzmark-outside-'));
    try {
      writeFileSync(join(outside, 'secret.md'), REF);
      mkdirSync(join(dir, 'notes'));
      symlinkSync(join(outside, 'secret.md'), join(dir, 'notes', 'link.md'));
      writeFileSync(
        join(dir, 'notes', 'run.md'),
        RUN('../../' + outside.split('/').pop()! + '/secret.md#ref-13C Monday') +
          RUN('link.md#ref-13C Monday').replace('run 1', 'run 2'),
      );
      const { entries } = json(['notes/run.md'], dir);
      for (const e of entries)
        assert.deepEqual(
          e.diagnostics.map((d) => d.code),
          ['reference-unknown'],
          e.id ?? '',
        );
    } finally {
      rmSync(outside, { recursive: true, force: true });
    }
  });

  it('keeps every other file’s results when a referenced block is broken, and names the fault', () => {
    writeFileSync(join(dir, 'ref.md'), REF.replace('thermal: 1.08e3', 'thermal: 0'));
    writeFileSync(join(dir, 'run.md'), RUN('ref.md#ref-13C Monday'));
    writeFileSync(join(dir, 'other.md'), fence('gap: 10 K\nratio: 0.5'));
    const { code, entries } = json(['.'], dir);
    assert.equal(code, 1);
    assert.deepEqual(
      entries.map((e) => [e.file, e.status]),
      [
        ['other.md', 'normal'],
        ['ref.md', 'invalid'],
        ['run.md', 'invalid'],
      ],
    );
    const d = entries[2]!.diagnostics[0]!;
    assert.equal(d.code, 'reference-invalid');
    assert.match(d.message, /signal-thermal-zero.*ref\.md, line 8/);
  });

  it('check prints a reference error at the reference, and the CSV carries polarizationAt and the reference', () => {
    writeFileSync(join(dir, 'run.md'), RUN('nowhere'));
    const c = run(['check', 'run.md'], dir);
    assert.equal(c.code, 1);
    assert.match(c.out, /^run\.md:7:\d+: error reference-unknown /m);
    writeFileSync(join(dir, 'ref.md'), REF);
    writeFileSync(join(dir, 'run.md'), RUN('ref-13C Monday'));
    const csv = run(['report', '.', '-f', 'csv'], dir);
    const [head, , row] = csv.out.trimEnd().split('\r\n');
    const names = head!.split(',');
    const cells = row!.split(',');
    assert.equal(cells[names.indexOf('thermal_reference')], 'ref-13C Monday');
    assert.equal(Number(cells[names.indexOf('polarization_at_time_s')]), 0);
    assert.ok(Number(cells[names.indexOf('polarization_at')]) > Number(cells[names.indexOf('polarization')]));
  });
});

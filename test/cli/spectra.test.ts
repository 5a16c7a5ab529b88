/**
 * The command line reads spectra relative to each note: the JSON `spectra`
 * list, the table's marked lines, paths out of the note's folder tree and
 * files above 64 MB refused unread, and one note's failure losing no other.
 */
import { strict as assert } from 'node:assert';
import { closeSync, mkdirSync, mkdtempSync, openSync, ftruncateSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

function run(args: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(args, { out: (s) => (out += s), err: (s) => (err += s), cwd, columns: 200 });
  return { code, out, err };
}

/** A triangle line 0 1 2 3 2 1 0 at x = 4…10 on a 0…14 ppm axis: trapezoid area 9 (hand computed). */
const TRIANGLE = 'ppm,y\n' + [0, 0, 0, 0, 0, 1, 2, 3, 2, 1, 0, 0, 0, 0, 0].map((y, i) => `${i},${y}`).join('\n') + '\n';

function fence(sig: string): string {
  return `\`\`\`levels\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  hyperpolarized: ${sig}\n  thermal: 0.01\n\`\`\`\n`;
}

interface Entry {
  file: string;
  diagnostics: { code: string; message: string; line: number; column: number }[];
  spectra: {
    key: string;
    file: string;
    region: number[] | null;
    unit: string | null;
    integral: { value: number; uncertainty: number | null } | null;
    points: number | null;
  }[];
  polarization: { value: number } | null;
}

describe('boltzmark report with spectrum files', () => {
  const dir = mkdtempSync(join(tmpdir(), 'bm-spectra-'));
  mkdirSync(join(dir, 'lab', 'spectra'), { recursive: true });
  mkdirSync(join(dir, 'lab', 'sub'), { recursive: true });
  writeFileSync(join(dir, 'lab', 'spectra', 'tri.csv'), TRIANGLE);
  writeFileSync(join(dir, 'secret.csv'), TRIANGLE);
  symlinkSync(join(dir, 'secret.csv'), join(dir, 'lab', 'spectra', 'link.csv'));
  // A sparse file of 65 MB: refused by its size, never read.
  const fd = openSync(join(dir, 'lab', 'spectra', 'huge.csv'), 'w');
  ftruncateSync(fd, 65 * 1024 * 1024);
  closeSync(fd);
  writeFileSync(
    join(dir, 'lab', 'good.md'),
    `# good\n\n${fence('{ spectrum: spectra/tri.csv, region: [3 ppm, 11 ppm], baseline: none }')}`,
  );
  writeFileSync(
    join(dir, 'lab', 'sub', 'nested.md'),
    `# nested\n\n${fence('{ spectrum: ../spectra/tri.csv, region: [3, 11] }')}`,
  );
  writeFileSync(
    join(dir, 'lab', 'bad.md'),
    `# bad\n\n${fence('{ spectrum: ../secret.csv, region: [3, 11] }')}\n${fence('{ spectrum: spectra/link.csv, region: [3, 11] }')}\n${fence('{ spectrum: spectra/huge.csv, region: [3, 11] }')}`,
  );

  it('prints the spectra list of the contract, the integral entering P as a typed number would', () => {
    const { out } = run(['report', 'lab/good.md', '-f', 'json'], dir);
    const [e] = JSON.parse(out) as Entry[];
    assert.deepEqual(e!.diagnostics, []);
    assert.deepEqual(e!.spectra, [
      {
        key: 'signal.hyperpolarized',
        file: 'spectra/tri.csv',
        region: [3, 11],
        unit: 'ppm',
        integral: { value: 9, uncertainty: null },
        points: 9,
      },
    ]);
    writeFileSync(join(dir, 'typed.md'), `# typed\n\n${fence('9')}`);
    const [typed] = JSON.parse(run(['report', 'typed.md', '-f', 'json'], dir).out) as Entry[];
    assert.equal(e!.polarization!.value, typed!.polarization!.value);
  });

  it('marks the values taken from files in the table', () => {
    const { out } = run(['report', 'lab/good.md', '--wide'], dir);
    assert.match(out, /⌁ signal\.hyperpolarized = 9\.000 from spectra\/tri\.csv, 3 … 11 ppm, 9 points/);
  });

  it('refuses a path out of the note’s folder tree, also through a link, and a file above 64 MB, unread', () => {
    const { code, out } = run(['report', 'lab', '-f', 'json'], dir);
    assert.equal(code, 1);
    const entries = JSON.parse(out) as Entry[];
    const bad = entries.filter((e) => e.file === 'lab/bad.md');
    assert.deepEqual(
      bad.map((e) => e.diagnostics.map((d) => d.code)),
      [['spectrum-outside'], ['spectrum-outside'], ['spectrum-large']],
    );
    assert.equal(bad[0]!.diagnostics[0]!.line, 8);
    // `  hyperpolarized: { spectrum: ` is 30 characters: the path starts in column 31.
    assert.equal(bad[0]!.diagnostics[0]!.column, 31);
    assert.match(bad[2]!.diagnostics[0]!.message, /65\.0 MB, above the 64 MB/);
    // The other notes keep their results, and a note below reads a file beside its own folder only inside its tree.
    assert.equal(entries.find((e) => e.file === 'lab/good.md')!.spectra[0]!.integral!.value, 9);
    const nested = entries.find((e) => e.file === 'lab/sub/nested.md')!;
    assert.deepEqual(
      nested.diagnostics.map((d) => d.code),
      ['spectrum-outside'],
    );
  });

  it('reads spectra of a note given as an absolute path, relative to that note', () => {
    const { out } = run(['report', join(dir, 'lab', 'good.md'), '-f', 'json'], tmpdir());
    assert.equal((JSON.parse(out) as Entry[])[0]!.spectra[0]!.integral!.value, 9);
  });

  it('reads the demo note from its invented spectra, every reference followed', () => {
    const { out } = run(['report', 'demo/spectra-run12.md', '-f', 'json'], process.cwd());
    const entries = JSON.parse(out) as Entry[];
    assert.deepEqual(
      entries.map((e) => e.diagnostics.filter((d) => d.code.startsWith('spectrum')).length),
      [0, 0],
    );
    assert.deepEqual(
      entries.map((e) => e.spectra.filter((s) => s.integral !== null).length),
      [2, 8],
    );
    assert.ok(entries[0]!.spectra.every((s) => s.unit === 'ppm' && s.integral!.uncertainty !== null));
  });
});

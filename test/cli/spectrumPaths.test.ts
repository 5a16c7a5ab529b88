/**
 * Spectrum paths on the command line are compared by path segments: a folder or file whose name merely begins with
 * two dots (`..data/`, `..x.csv`) lies inside the note's folder and is read, while `..` as a segment leaves it. And
 * the JSON `spectra` list follows the order of the block's text, whatever order the block is read in.
 */
import { strict as assert } from 'node:assert';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

/** A triangle line 0 1 2 3 2 1 0 at x = 4…10 on a 0…14 ppm axis, scaled by `k`: trapezoid area 9·k (hand computed). */
const triangle = (k: number): string =>
  'ppm,y\n' + [0, 0, 0, 0, 0, 1, 2, 3, 2, 1, 0, 0, 0, 0, 0].map((y, i) => `${i},${y * k}`).join('\n') + '\n';

interface Entry {
  diagnostics: { code: string; message: string }[];
  spectra: { key: string; file: string; integral: { value: number } | null }[];
}

function report(dir: string, note: string): Entry[] {
  let out = '';
  main(['report', note, '-f', 'json'], { out: (s) => (out += s), err: () => undefined, cwd: dir });
  return JSON.parse(out) as Entry[];
}

const spin = (signal: string): string =>
  `\`\`\`levels\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n${signal}\`\`\`\n`;

describe('boltzmark report: spectrum paths and the order of the spectra list', () => {
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-dots-'));
    mkdirSync(join(dir, 'lab', '..data'), { recursive: true });
    writeFileSync(join(dir, 'lab', '..data', 'hp.csv'), triangle(100));
    writeFileSync(join(dir, 'lab', '..thermal.csv'), triangle(1));
    writeFileSync(join(dir, 'outside.csv'), triangle(1));
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('reads a file in a folder, or a file, whose name begins with two dots, inside the note’s folder', () => {
    writeFileSync(
      join(dir, 'lab', 'dots.md'),
      spin(
        '  hyperpolarized: { spectrum: ..data/hp.csv, region: [3 ppm, 11 ppm], baseline: none }\n' +
          '  thermal: { spectrum: ..thermal.csv, region: [3 ppm, 11 ppm], baseline: none }\n',
      ),
    );
    const [e] = report(dir, 'lab/dots.md');
    assert.deepEqual(e!.diagnostics, []);
    assert.deepEqual(
      e!.spectra.map((s) => [s.file, s.integral?.value]),
      [
        ['..data/hp.csv', 900],
        ['..thermal.csv', 9],
      ],
    );
  });

  it('still refuses `..` as a path segment, alone or after a folder', () => {
    writeFileSync(
      join(dir, 'lab', 'out.md'),
      spin(
        '  hyperpolarized: { spectrum: ../outside.csv, region: [3 ppm, 11 ppm] }\n' +
          '  thermal: { spectrum: ..data/../../outside.csv, region: [3 ppm, 11 ppm] }\n',
      ) + spin('  hyperpolarized: { spectrum: .., region: [3 ppm, 11 ppm] }\n  thermal: 1\n'),
    );
    const entries = report(dir, 'lab/out.md');
    assert.deepEqual(
      entries.map((e) => e.diagnostics.map((d) => d.code)),
      [['spectrum-outside', 'spectrum-outside'], ['spectrum-outside']],
    );
  });

  it('lists the spectra in the order of the block’s text, thermal first when it is written first', () => {
    const hp = '  hyperpolarized: { spectrum: ..data/hp.csv, region: [3 ppm, 11 ppm], baseline: none }\n';
    const th = '  thermal: { spectrum: ..thermal.csv, region: [3 ppm, 11 ppm], baseline: none }\n';
    writeFileSync(join(dir, 'lab', 'order.md'), spin(th + hp) + '\n' + spin(hp + th));
    const [thermalFirst, hpFirst] = report(dir, 'lab/order.md');
    assert.deepEqual(
      thermalFirst!.spectra.map((s) => s.key),
      ['signal.thermal', 'signal.hyperpolarized'],
    );
    assert.deepEqual(
      hpFirst!.spectra.map((s) => s.key),
      ['signal.hyperpolarized', 'signal.thermal'],
    );
  });
});

import { strict as assert } from 'node:assert';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

function run(args: string[]): { code: number; out: string } {
  let out = '';
  const code = main(args, { out: (s) => (out += s), err: () => undefined, cwd: process.cwd() });
  return { code, out };
}

// Balmer lines with NIST ASD vacuum wavelengths, E_u, g and A (Kramida, Ralchenko, Reader & NIST ASD Team, export
// retrieved 2026-06-15) and the relative intensities I ∝ gA/λ · e^(−E/kT) at 10 000 K (Griem 1997, ch. 6), with the
// Hγ line made 40 % too weak, as self-absorption would.
const NOTE = [
  '```levels',
  'id: balmer',
  'wavelengths: vacuum',
  'detector: energy',
  'lines:',
  '  - { label: Hα, wavelength: 656.4632 nm, upper: 97492.304 cm-1, g: 18, A: 4.4101e7, intensity: 1 ± 0.001 }',
  '  - { label: Hβ, wavelength: 486.2691 nm, upper: 102823.904 cm-1, g: 32, A: 8.4193e6, intensity: 0.21276108 ± 0.0002 }',
  '  - { label: Hγ, wavelength: 434.1691 nm, upper: 105291.657 cm-1, g: 50, A: 2.5304e6, intensity: 0.04707563 ± 0.00005 }',
  '  - { label: Hδ, wavelength: 410.28991 nm, upper: 106632.1681 cm-1, g: 72, A: 9.732e5, intensity: 0.03791632 ± 0.00004 }',
  '  - { label: "=cmd", wavelength: 397.12 nm, upper: 107440.45 cm-1, g: 98, A: 4.39e5, intensity: 0.02141142 ± 0.00003 }',
  '```',
  '',
].join('\n');

/** The fields of a report entry this suite reads. */
interface Entry {
  trade: string;
  temperatureName: string;
  polarization: null | object;
  plot: {
    ordinate: string;
    intercept: { value: number };
    points: { label: string; flag: string | null; upperEnergy: number; upperEnergyEv: number; y: number }[];
  };
  refit: { temperature: { value: number } };
  wavelengths: { medium: string; stated: boolean };
}

describe('boltzmark report: the plot data of lines', () => {
  const dir = mkdtempSync(join(tmpdir(), 'bm-lines-'));
  writeFileSync(join(dir, 'lines.md'), NOTE);

  it('puts each line’s point, the intercept and the refit without the flagged line in the JSON', () => {
    const { code, out } = run(['report', dir, '--format', 'json']);
    assert.equal(code, 0);
    const [e] = JSON.parse(out) as Entry[];
    assert.equal(e.trade, 'emission');
    assert.equal(e.temperatureName, 'excitation temperature');
    assert.equal(e.polarization, null);
    assert.equal(e.plot.points.length, 5);
    assert.equal(e.plot.ordinate, 'ln(Iλ/(gA))');
    assert.ok(Number.isFinite(e.plot.intercept.value));
    const flagged = e.plot.points.filter((p) => p.flag !== null);
    assert.deepEqual(
      flagged.map((p) => [p.label, p.flag]),
      [['Hγ', 'below']],
    );
    // Without Hγ the four remaining Balmer points lie on the 10 000 K line (§8c); the fifth (Hε, E_u, g and A from memory, its intensity computed at 10 000 K by the same formula) too.
    assert.ok(Math.abs(e.refit.temperature.value - 10000) < 1, String(e.refit.temperature.value));
    for (const p of e.plot.points) {
      assert.ok(Math.abs(p.upperEnergyEv * 11604.51812155008 - p.upperEnergy) < 1e-6 * p.upperEnergy);
      assert.ok('residual' in p && 'uncertainty' in p && 'y' in p);
    }
    assert.deepEqual(e.wavelengths, { medium: 'vacuum', stated: true });
  });

  it('prints the same points as CSV with --format line-points, a formula-like label guarded', () => {
    const { out } = run(['report', dir, '--format', 'line-points']);
    const rows = out.trim().split('\r\n');
    assert.equal(rows[0].split(',')[3], 'label');
    assert.equal(rows.length, 6);
    assert.ok(rows.some((r) => r.includes(",'=cmd,")));
    assert.ok(
      rows.some((r) => r.includes(',Hγ,') && r.endsWith(`,below,${rows[1].split(',')[11]},${rows[1].split(',')[12]},`)),
    );
    assert.equal(rows[0].split(',').at(-1), 'cell', 'the last column is the notebook cell, empty for a Markdown note');
  });

  it('names the notebook cell of each point in the line-points CSV (its line counts in that cell)', () => {
    const nbDir = mkdtempSync(join(tmpdir(), 'boltzmark-lines-nb-'));
    const cells = [
      { cell_type: 'code', source: ['x = 1'], metadata: {}, outputs: [], execution_count: null },
      {
        cell_type: 'markdown',
        source: NOTE.split('\n').map((l, i, a) => (i < a.length - 1 ? l + '\n' : l)),
        metadata: {},
      },
    ];
    writeFileSync(join(nbDir, 'lamp.ipynb'), JSON.stringify({ cells, metadata: {}, nbformat: 4, nbformat_minor: 5 }));
    const { out } = run(['report', nbDir, '--format', 'line-points']);
    const rows = out.trim().split('\r\n');
    assert.equal(rows.length, 6);
    for (const r of rows.slice(1)) {
      assert.ok(r.startsWith(`${join(nbDir, 'lamp.ipynb')},1,balmer,`), r);
      assert.ok(r.endsWith(',2'), r);
    }
  });

  it('leaves out the empty P, P_th and ε columns of a table of lines', () => {
    const { out } = run(['report', dir]);
    const head = out.split('\n')[0];
    assert.match(head, /^where\s+id\s+status\s+T\s+β/);
    assert.doesNotMatch(head, /P_th|ε/);
    assert.match(out, /kT = /);
  });
});

import { strict as assert } from 'node:assert';
import { parse as parseCsv } from 'csv-parse/sync';
import { curveCsv, curveData, KELVIN_PER_WAVENUMBER, type CurvePayload } from '../../../src/core';
import { block } from '../helpers';

function payload(body: string): CurvePayload {
  return curveData(block(body).report, { uri: 'file:///n.md', version: 1 }) as CurvePayload;
}

/** RFC 4180 records, read by csv-parse (a general-purpose reader independent of this code). */
function parse(text: string): string[][] {
  return parseCsv(text) as string[][];
}

describe('curve view CSV export', () => {
  it('writes the large-N curve, the finite-N steps, the measured point and the lattice marker', () => {
    const p = payload('id: run 1\ngap: 10 K\npopulations: [0.7 ± 0.01, 0.3 ± 0.01]\nlattice: 10 K\ncount: 4');
    const rows = parse(curveCsv([p]));
    assert.deepEqual(rows[0], [
      'run',
      'series',
      'm',
      'energy_K',
      'entropy_per_Nk',
      'beta_per_K',
      'u_energy_K',
      'u_entropy',
      'u_beta_per_K',
      'entropy_deficit',
      'relative_entropy',
    ]);
    assert.equal(rows.filter((r) => r[1] === 'large-N').length, p.curve.energy.length);
    const steps = rows.filter((r) => r[1] === 'finite-N (N=4)');
    assert.deepEqual(
      steps.map((r) => r[2]),
      ['0', '1', '2', '3', '4'],
    );
    assert.equal(Number(steps[2]![4]), p.finiteN!.entropy[2]); // full precision: reads back as the same double
    assert.ok(Math.abs(Number(steps[2]![4]) - Math.log(6) / 4) < 1e-15); // ln C(4, 2)/4
    const measured = rows.find((r) => r[1] === 'measured')!;
    assert.equal(Number(measured[3]), 3);
    assert.equal(Number(measured[6]), p.measured!.uEnergy);
    assert.ok(rows.some((r) => r[1] === 'thermal at lattice 10 K'));
    assert.ok(rows.slice(1).every((r) => r.length === 11));
  });

  it('adds the energy in the block’s unit when asked', () => {
    const p = payload('gap: 100 cm-1\npopulations: [0.7, 0.3]');
    const rows = parse(curveCsv([p], p.unit));
    assert.equal(rows[0]![4], 'energy_cm-1');
    const m = rows.find((r) => r[1] === 'measured')!;
    assert.ok(Math.abs(Number(m[4]) - 30) < 1e-9, m[4]);
    assert.ok(Math.abs(Number(m[3]) - 30 * KELVIN_PER_WAVENUMBER) < 1e-9, m[3]);
  });

  it('quotes ids with commas and quotes, and defuses ids a spreadsheet would run as formulas', () => {
    const a = payload('id: \'run "7", cell B\'\ngap: 10 K\npopulations: [0.7, 0.3]');
    const b = payload('id: "=HYPERLINK(\\"http://x\\")"\ngap: 10 K\npopulations: [0.7, 0.3]');
    const rows = parse(curveCsv([a, b]));
    assert.ok(rows.some((r) => r[0] === 'run "7", cell B'));
    assert.ok(rows.some((r) => r[0] === '\'=HYPERLINK("http://x")'));
    assert.ok(!rows.some((r) => r[0]!.startsWith('=')));
  });
});

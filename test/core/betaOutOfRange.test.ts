/**
 * Blocks whose every number is finite and in range but whose β is not: the
 * quotient ln(ratio)/ΔE passes the largest double (about 1.8e308, IEEE 754
 * binary64), or the spacing rounds to 0. Before `beta-out-of-range` such a
 * block read as `non-thermal` (or `saturated`) with no diagnostic at all.
 */
import { strict as assert } from 'node:assert';
import { Analyzer } from '../../src/core';
import { problem } from './helpers';

describe('beta-out-of-range', () => {
  const cases: [string, string, string][] = [
    ['a gap far below what the ratio allows', 'gap: 5e-324 K\nratio: 0.5', '0.5'],
    ['a Zeeman spacing that rounds to 0', 'system: 1H\nfield: 1e-320 T\npolarization: 0.5', '0.5'],
    ['spin populations over a spacing that rounds to 0', 'system: 1H\nfield: 1e-320 T\npopulations: [0.6, 0.4]', '0.6'],
    ['a spacing that overflows', 'system: electron\ng-factor: 1e308\nfield: 1e308 T\npolarization: 0.5', '0.5'],
    [
      'levels 1e-320 K apart',
      'levels:\n  - { energy: 0 K, population: 1 }\n  - { energy: 1e-320 K, population: 0.5 }\n' +
        '  - { energy: 2e-320 K, population: 0.25 }',
      '1',
    ],
    [
      'levels whose spread overflows',
      'levels:\n  - { energy: -1e308 K, population: 1 }\n  - { energy: 0 K, population: 0.5 }\n' +
        '  - { energy: 1e308 K, population: 0.25 }',
      '1',
    ],
    [
      'lines whose upper energies differ in the last digit only',
      'detector: photon\nlines:\n  - { wavelength: 500 nm, upper: 10 eV, g: 3, A: 1e7, intensity: 1000 }\n' +
        '  - { wavelength: 500 nm, upper: 10.000000000000001 eV, g: 3, A: 1e7, intensity: 100 }\n' +
        '  - { wavelength: 500 nm, upper: 10.000000000000002 eV, g: 3, A: 1e7, intensity: 10 }',
      '{ wavelength: 500 nm, upper: 10 eV, g: 3, A: 1e7, intensity: 1000 }',
    ],
    [
      'a thermal reference whose P_th underflows',
      'system: 13C\nfield: 1e-300 T\nlattice: 298 K\nsignal:\n  hyperpolarized: 50\n  thermal: 1',
      '',
    ],
  ];
  for (const [what, body, at] of cases) {
    it(`is an error on the measured value for ${what}`, () => {
      const p = problem(body, 'beta-out-of-range');
      assert.equal(p.severity, 'error');
      if (at) assert.equal(p.at, at);
      else assert.ok(p.at.length > 0, 'points at the block');
      assert.match(p.message, /No temperature can be computed/);
    });
  }

  it('leaves the block invalid and the next block of the note working', () => {
    const text = '```levels\ngap: 5e-324 K\nratio: 0.5\n```\n\n```levels\ngap: 10 K\nratio: 0.5\n```\n';
    const [bad, good] = new Analyzer().analyzeText(text).blocks;
    assert.equal(bad.status, 'invalid');
    assert.equal(good.status, 'normal');
    // β = ln(n_l/n_u)/ΔE = ln 2 / 10 K (docs/format.md, Conventions).
    assert.equal(good.results?.beta?.value, Math.log(2) / 10);
  });

  it('is not raised where β is merely tiny, huge or a T → 0 limit', () => {
    for (const body of ['gap: 1e-300 K\nratio: 0.5', 'gap: 1e300 K\nratio: 0.5', 'gap: 10 K\nratio: 0']) {
      const codes = new Analyzer().analyzeText('```levels\n' + body + '\n```\n').blocks[0].problems.map((p) => p.code);
      assert.ok(!codes.includes('beta-out-of-range'), `${body}: ${codes.join(', ')}`);
    }
  });
});

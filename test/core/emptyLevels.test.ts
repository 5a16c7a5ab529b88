/**
 * Empty levels in a Boltzmann fit. At any finite temperature every level
 * holds population, n ∝ g e^(−βE) > 0 (the Boltzmann distribution; contract,
 * "Conventions"); only β → ±∞ empties levels, and then all those above the
 * lowest (below the highest) populated energy. So an empty level between
 * populated ones fits no temperature (`non-thermal`), while one beyond them
 * may be a population too small to see. A zero written as 0 ± u is tested
 * against the fit's prediction at the 1 % level, |n_pred| > 2.576 σ: 2.576 is
 * the coverage factor of a normal distribution for 99 % (JCGM 100:2008
 * Table G.1, from memory), the level of the contract's χ² test.
 */
import { strict as assert } from 'node:assert';
import { block, problem } from './helpers';

/** e^(−βE) for β = 0.1 K⁻¹, to twelve digits (exact arithmetic, rounded). */
const E1 = 0.367879441171; // e^(−1)
const E2 = 0.135335283237; // e^(−2)
const E3 = 0.0497870683679; // e^(−3)

function levels(...items: [energy: number, population: string][]): string {
  return `levels:\n${items.map(([e, p]) => `  - { energy: ${e} K, population: ${p} }`).join('\n')}`;
}

describe('an empty level between populated ones', () => {
  const body = levels([0, '1'], [10, '0'], [20, `${E2}`], [30, `${E3}`]);

  it('makes the block non-thermal, with a warning on that level’s population', () => {
    const p = problem(body, 'population-zero-inconsistent');
    assert.equal(p.severity, 'warning');
    assert.equal(p.at, '0');
    // The other three lie on β = 0.1 K⁻¹, so the fit predicts e^(−1) = 0.368 at 10 K.
    assert.match(p.message, /predicts n = 0\.368 here/);
    const r = block(body).report;
    assert.equal(r.status, 'non-thermal');
    assert.equal(r.results!.fit!.consistent, false);
    assert.ok(!r.problems.some((x) => x.code === 'population-zero-excluded'), 'one diagnostic per level');
    // The empty lower level under populated upper ones is still listed as inverted.
    assert.ok(r.results!.invertedPairs.length >= 2);
  });

  it('is non-thermal too when it shares its energy with a populated level (no temperature empties one of two equal levels)', () => {
    const r = block(levels([0, '1'], [10, `${E1}`], [10, '0'], [20, `${E2}`])).report;
    assert.equal(r.status, 'non-thermal');
  });

  it('with a stated 0 ± u that covers the prediction stays out of the fit, consistent', () => {
    // 0.368 / 0.5 = 0.74 standard uncertainties: well within 2.576.
    const ok = levels([0, '1'], [10, '0 ± 0.5'], [20, `${E2}`], [30, `${E3}`]);
    const p = problem(ok, 'population-zero-excluded');
    assert.match(p.message, /0\.74 standard uncertainties/);
    const r = block(ok).report;
    assert.equal(r.status, 'normal');
    assert.ok(!r.problems.some((x) => x.code === 'population-zero-inconsistent'));
  });

  it('with a stated 0 ± u far below the prediction is not consistent', () => {
    const bad = levels([0, '1'], [10, '0 ± 0.01'], [20, `${E2}`], [30, `${E3}`]);
    const p = problem(bad, 'population-zero-inconsistent');
    assert.match(p.message, /36\.79 standard uncertainties/);
    assert.equal(block(bad).report.status, 'non-thermal');
  });

  it('in a spin 3/2 (7Li) makes the Zeeman populations non-thermal', () => {
    const r = block('system: 7Li\nfield: 9.4 T\npopulations: [0.26, 0, 0.25, 0.24]').report;
    assert.equal(r.status, 'non-thermal');
    assert.ok(r.problems.some((x) => x.code === 'population-zero-inconsistent'));
  });
});

describe('an empty level beyond the populated ones', () => {
  it('at the top is left out with a note that gives the predicted population, the status unchanged', () => {
    const body = levels([0, '1'], [10, `${E1}`], [20, `${E2}`], [60, '0']);
    const p = problem(body, 'population-zero-excluded');
    assert.equal(p.severity, 'info');
    // e^(−6) = 0.00247875 (exact arithmetic).
    assert.match(p.message, /predicts n = 0\.00248 here/);
    assert.equal(block(body).report.status, 'normal');
  });

  it('at the bottom of an inverted ladder is left out likewise, and the block stays inverted', () => {
    // β = −0.1 K⁻¹: n = e^(0.1 (E − 30 K)); at 0 K e^(−3) = 0.0498.
    const body = levels([0, '0'], [10, `${E2}`], [20, `${E1}`], [30, '1']);
    const p = problem(body, 'population-zero-excluded');
    assert.match(p.message, /predicts n = 0\.0498 here/);
    assert.equal(block(body).report.status, 'inverted');
  });

  it('written 0 ± u is tested against the prediction at the 1 % level: 2.5 σ passes, 2.65 σ does not', () => {
    // Three levels exactly on β = 0.1 K⁻¹ leave no scatter, so σ = u and z = e^(−3)/u.
    const at = (u: number): string => levels([0, '1'], [10, `${E1}`], [20, `${E2}`], [30, `0 ± ${u}`]);
    const inside = block(at(E3 / 2.5)).report;
    assert.equal(inside.status, 'normal');
    assert.ok(inside.problems.some((x) => x.code === 'population-zero-excluded'));
    const outside = block(at(E3 / 2.65)).report;
    assert.equal(outside.status, 'non-thermal');
    const p = problem(at(E3 / 2.65), 'population-zero-inconsistent');
    assert.match(p.message, /2\.65 standard uncertainties/);
  });
});

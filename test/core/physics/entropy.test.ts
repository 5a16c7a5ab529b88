import assert from 'node:assert/strict';
import { gibbsEntropy, meanEnergy, relativeEntropy, thermalDistribution } from '../../../src/core/physics/entropy';
import { close } from '../helpers';

/** Canonical two-level entropy in closed form, S/(Nk) = ln(1 + e^(−x)) + x/(1 + e^x) (domain.md §7; Schroeder ch. 3 and 6). */
const twoLevelEntropy = (x: number): number => Math.log1p(Math.exp(-x)) + x / (1 + Math.exp(x));

describe('thermal distribution and Gibbs entropy of a two-level system', () => {
  it('gives p_upper = 0.268 941 421 4 and S/(Nk) = 0.582 203 108 9 at ε/kT = 1', () => {
    // domain.md §7 canonical checks, derived (D) from the two-level formulas of Schroeder,
    // An Introduction to Thermal Physics (2000) and Kittel & Kroemer, Thermal Physics (1980).
    const p = thermalDistribution([0, 1], [1, 1], 1)!;
    close(p[1], 0.2689414214, 1e-9, 'p_upper');
    close(gibbsEntropy(p, [1, 1]), 0.5822031089, 1e-9, 'S/(Nk)');
    close(gibbsEntropy(p, null), twoLevelEntropy(1), 1e-14, 'closed form');
    close(meanEnergy(p, [0, 1]), 0.2689414214, 1e-9, 'U/(Nε)');
  });

  it('gives the same entropy at ε/kT = −1 with the populations swapped', () => {
    // domain.md §7 (D): x = −1 → p_upper = 0.731 058 578 6, same S.
    const p = thermalDistribution([0, 1], [1, 1], -1)!;
    close(p[1], 0.7310585786, 1e-9, 'p_upper');
    close(gibbsEntropy(p, [1, 1]), 0.5822031089, 1e-9, 'S/(Nk)');
  });

  it('gives S/(Nk) = 0.365 333 855 1 at ε/kT = 2 and the paramagnet value at μB/kT = 0.5', () => {
    // domain.md §7 (D): x = 2 → 0.365 333 855 1; paramagnet formula (Schroeder Problem 3.23) at μB/kT = 0.5
    // gives 0.582 203 108 9 with levels ∓μB (ε = 2μB).
    close(gibbsEntropy(thermalDistribution([0, 1], null, 2)!), 0.3653338551, 1e-9, 'x = 2');
    close(gibbsEntropy(thermalDistribution([-0.5, 0.5], null, 1)!), 0.5822031089, 1e-9, 'paramagnet');
    const x = 0.5;
    close(
      gibbsEntropy(thermalDistribution([-0.5, 0.5], null, 1)!),
      Math.log(2 * Math.cosh(x)) - x * Math.tanh(x),
      1e-14,
      'paramagnet closed form',
    );
  });

  it('gives S/(Nk) = 1.385 325 944 for the degenerate pair g = 1, 3 at ε/kT = 0.1', () => {
    // domain.md §7 (D): n₁/n₀ = 2.714 512 254, S/(Nk) = 1.385 325 944.
    const p = thermalDistribution([0, 1], [1, 3], 0.1)!;
    close(p[1]! / p[0]!, 2.714512254, 1e-9, 'n₁/n₀');
    close(gibbsEntropy(p, [1, 3]), 1.385325944, 1e-9, 'S/(Nk)');
  });
});

describe('thermal distribution and Gibbs entropy of a spin 1', () => {
  // E = −mε for m = +1, 0, −1 with ε = 1 K.
  const energies = [-1, 0, 1];

  it('gives the tabulated populations, entropy and energy at βε = 1', () => {
    // domain.md §7 (D): p = (0.665 240 955 8, 0.244 728 471 1, 0.090 030 573 17), S/(Nk) = 0.832 395 581 8,
    // U/(Nε) = −0.575 210 382 6 (= −B₁(1)).
    const p = thermalDistribution(energies, null, 1)!;
    close(p[0], 0.6652409558, 1e-9, 'p(m = +1)');
    close(p[1], 0.2447284711, 1e-9, 'p(m = 0)');
    close(p[2], 0.09003057317, 1e-9, 'p(m = −1)');
    close(gibbsEntropy(p), 0.8323955818, 1e-9, 'S/(Nk)');
    close(meanEnergy(p, energies), -0.5752103826, 1e-9, 'U/(Nε)');
  });

  it('mirrors the populations at βε = −1 and reaches ln 3 at βε = 0', () => {
    // domain.md §7 (D): βε = −1 → same S, U/(Nε) = +0.575 210 382 6; βε = 0.5 → 1.020 191 337; βε = 0 → ln 3.
    const p = thermalDistribution(energies, null, -1)!;
    close(gibbsEntropy(p), 0.8323955818, 1e-9, 'S at βε = −1');
    close(meanEnergy(p, energies), 0.5752103826, 1e-9, 'U at βε = −1');
    close(gibbsEntropy(thermalDistribution(energies, null, 0.5)!), 1.020191337, 1e-9, 'S at βε = 0.5');
    close(gibbsEntropy(thermalDistribution(energies, null, 0)!), Math.log(3), 1e-15, 'S at βε = 0');
  });

  it('has dS/dU = β in every case, by numerical differentiation', () => {
    // domain.md §7: "Numerical dS/dU returns β in every case" (1/T = ∂S/∂U, Kittel & Kroemer ch. 2).
    const g = [2, 1, 3, 1];
    const e = [0, 0.7, 1.1, 2.5];
    for (const beta of [-3, -0.4, 0.2, 1, 4]) {
      const h = 1e-5;
      const s = (b: number): number => gibbsEntropy(thermalDistribution(e, g, b)!, g)!;
      const u = (b: number): number => meanEnergy(thermalDistribution(e, g, b)!, e)!;
      close((s(beta + h) - s(beta - h)) / (u(beta + h) - u(beta - h)), beta, 1e-7, `β = ${beta}`);
    }
  });
});

describe('Gibbs entropy', () => {
  it('is largest, ln Σg, when every state is equally populated', () => {
    close(gibbsEntropy([1, 3, 5], [1, 3, 5]), Math.log(9), 1e-15, 'uniform per state');
    assert.ok(gibbsEntropy([1, 2, 5], [1, 3, 5])! < Math.log(9));
  });

  it('treats 0 ln 0 as 0 and ignores the population scale', () => {
    assert.equal(gibbsEntropy([0, 1, 0]), 0);
    close(gibbsEntropy([0, 2, 0], [1, 4, 1]), Math.log(4), 1e-15, 'one degenerate level');
    const reference = gibbsEntropy([0.2, 0.5, 0.3], [1, 2, 1])!;
    close(gibbsEntropy([0.2e300, 0.5e300, 0.3e300], [1, 2, 1]), reference, 1e-14, 'scale 1e300');
    close(gibbsEntropy([0.2e-300, 0.5e-300, 0.3e-300], [1, 2, 1]), reference, 1e-14, 'scale 1e-300');
    close(gibbsEntropy([Number.MAX_VALUE, Number.MAX_VALUE]), Math.LN2, 1e-15, 'two huge populations');
  });

  it('returns null for invalid inputs and never NaN', () => {
    const cases: Array<[number[], number[] | null]> = [
      [[], null],
      [[0, 0], null],
      [[1, -1], null],
      [[1, NaN], null],
      [[1, Infinity], null],
      [[1, 1], [1]],
      [
        [1, 1],
        [1, 0],
      ],
      [
        [1, 1],
        [1, NaN],
      ],
    ];
    for (const [p, g] of cases) {
      assert.equal(gibbsEntropy(p, g), null, `p = ${p.join(', ')}, g = ${JSON.stringify(g)}`);
    }
  });
});

describe('thermal distribution at extreme β', () => {
  it('stays finite for huge |β| and shares the ground or top level by degeneracy at β = ±∞', () => {
    assert.deepEqual(thermalDistribution([0, 1, 2], null, 1e300), [1, 0, 0]);
    assert.deepEqual(thermalDistribution([0, 1, 2], null, -1e300), [0, 0, 1]);
    const shared = thermalDistribution([5, 0, 0], [1, 1, 3], Infinity)!;
    assert.equal(shared[0], 0);
    close(shared[1], 0.25, 1e-15, 'g = 1 ground state');
    close(shared[2], 0.75, 1e-15, 'g = 3 ground state');
    assert.deepEqual(thermalDistribution([5, 0, 5], [2, 1, 2], -Infinity), [0.5, 0, 0.5]);
    assert.deepEqual(thermalDistribution([1e300, -1e300], null, 1e10), [0, 1]);
    close(thermalDistribution([0, 1], [1, 3], -0)![1], 0.75, 1e-15, 'β = −0 weights by g');
  });

  it('returns null for NaN β, non-finite energies and bad degeneracies', () => {
    assert.equal(thermalDistribution([0, 1], null, NaN), null);
    assert.equal(thermalDistribution([0, Infinity], null, 1), null);
    assert.equal(thermalDistribution([], null, 1), null);
    assert.equal(thermalDistribution([0, 1], [1, -1], 1), null);
    assert.equal(thermalDistribution([0, 1], [1], 1), null);
  });
});

describe('mean energy', () => {
  it('normalises the populations', () => {
    close(meanEnergy([2, 6], [10, 20]), 17.5, 1e-15, '⟨E⟩');
    assert.equal(meanEnergy([0, 0], [1, 2]), null);
    assert.equal(meanEnergy([1, 1], [1, NaN]), null);
    assert.equal(meanEnergy([1], [1, 2]), null);
  });
});

describe('relative entropy', () => {
  it('matches a direct sum and is zero for identical distributions', () => {
    // Independent direct sum: D = ½ ln(½/¼) + ½ ln(½/¾).
    close(relativeEntropy([1, 1], [1, 3]), 0.5 * Math.log(2) + 0.5 * Math.log(2 / 3), 1e-14, 'D(p‖q)');
    close(relativeEntropy([0.2, 0.8], [2, 8]), 0, 1e-15, 'D(p‖p)');
    assert.ok(relativeEntropy([0.9, 0.1], [0.1, 0.9])! > 0);
  });

  it('equals the entropy deficit against a thermal distribution with the same mean energy', () => {
    // Identity D(p‖q) = S(q) − S(p) when q is thermal and ⟨E⟩_p = ⟨E⟩_q (Gibbs inequality).
    const e = [0, 1, 2];
    const q = thermalDistribution(e, null, 0.7)!;
    const eq = meanEnergy(q, e)!;
    // Non-thermal p with the same mean energy: move weight from level 1 equally to levels 0 and 2.
    const d = 0.05;
    const p = [q[0]! + d, q[1]! - 2 * d, q[2]! + d];
    close(meanEnergy(p, e), eq, 1e-14, 'same mean energy');
    close(relativeEntropy(p, q), gibbsEntropy(q)! - gibbsEntropy(p)!, 1e-12, 'deficit');
  });

  it('is infinite where q vanishes under p, and null for invalid input', () => {
    assert.equal(relativeEntropy([1, 1], [1, 0]), Infinity);
    assert.equal(relativeEntropy([0, 1], [0, 1]), 0);
    assert.equal(relativeEntropy([1, 1], [1]), null);
    assert.equal(relativeEntropy([0, 0], [1, 1]), null);
    assert.equal(relativeEntropy([1, NaN], [1, 1]), null);
  });
});

import assert from 'node:assert/strict';
import {
  MAX_CURVE_POINTS,
  betaAtEnergy,
  schemeCurve,
  thermalStateAtEnergy,
  type CurvePoint,
} from '../../../src/core/physics/curves';
import { gibbsEntropy, meanEnergy, relativeEntropy, thermalDistribution } from '../../../src/core/physics/entropy';
import { close } from '../helpers';

/** Binary entropy H(p) = −p ln p − (1 − p) ln(1 − p) in nats (domain.md §7, large-N two-state entropy). */
const binaryEntropy = (p: number): number => -p * Math.log(p) - (1 - p) * Math.log1p(-p);

/** Checks the shape every curve must have: increasing energy, decreasing β, β = 0 inside, ends near the extremes. */
function checkShape(curve: CurvePoint[], eMin: number, eMax: number): void {
  for (let i = 1; i < curve.length; i++) {
    assert.ok(curve[i]!.energy > curve[i - 1]!.energy, `energy not increasing at point ${i}`);
    assert.ok(curve[i]!.beta < curve[i - 1]!.beta, `β not decreasing at point ${i}`);
  }
  const span = eMax - eMin;
  assert.ok(
    curve[0]!.energy - eMin <= 1e-6 * span,
    `first point ${curve[0]!.energy} not within 1e-6 of the ground energy`,
  );
  assert.ok(eMax - curve[curve.length - 1]!.energy <= 1e-6 * span, 'last point not within 1e-6 of the top energy');
  assert.ok(curve[0]!.beta > 0 && curve[curve.length - 1]!.beta < 0, 'β does not change sign');
  assert.ok(
    curve.some((p) => p.beta === 0),
    'no point at β = 0',
  );
}

describe('S(E) and β(E) of a two-level scheme', () => {
  const gap = 2.5; // K
  const curve = schemeCurve([0, gap], [1, 1])!;

  it('covers the whole energy range with 400 points by default', () => {
    assert.equal(curve.length, 400);
    checkShape(curve, 0, gap);
  });

  it('follows S/(Nk) = H(p) and β = ln((1 − p)/p)/ε with p = E/ε', () => {
    // domain.md §7, large-N two-state system (Schroeder, An Introduction to Thermal Physics, 2000; Kittel & Kroemer,
    // Thermal Physics, 1980): S ≈ N k H(p), 1/T = (k/ε) ln((N − m)/m).
    for (const point of curve) {
      const p = point.energy / gap;
      close(point.entropy, binaryEntropy(p), 1e-9, `S at p = ${p}`);
      close(point.beta, Math.log((1 - p) / p) / gap, 1e-8, `β at p = ${p}`);
    }
  });

  it('is symmetric about the midpoint, with S = ln 2 at β = 0', () => {
    const middle = curve.find((p) => p.beta === 0)!;
    close(middle.entropy, Math.LN2, 1e-15, 'S at β = 0');
    close(middle.energy, gap / 2, 1e-15, 'E at β = 0');
    for (const e of [1e-4, 0.3, 1.1, 1.2]) {
      const below = thermalStateAtEnergy([0, gap], null, e)!;
      const above = thermalStateAtEnergy([0, gap], null, gap - e)!;
      close(above.entropy, below.entropy, 1e-10, `S(${e}) vs S(ε − ${e})`); // ε − e carries a rounding of ε
      close(above.beta, -below.beta, 1e-9, `β(${e}) vs −β(ε − ${e})`);
    }
  });

  it('has chord slopes between the β values at their ends (dS/dE = β, S concave)', () => {
    for (let i = 1; i < curve.length; i++) {
      const a = curve[i - 1]!;
      const b = curve[i]!;
      const slope = (b.entropy - a.entropy) / (b.energy - a.energy);
      const margin = 1e-6 * Math.max(1, Math.abs(slope));
      assert.ok(
        slope <= a.beta + margin && slope >= b.beta - margin,
        `chord ${i}: slope ${slope} outside [${b.beta}, ${a.beta}]`,
      );
    }
  });
});

describe('S(E) and β(E) of larger schemes', () => {
  it('agrees with the Gibbs entropy of the thermal distribution at every point', () => {
    // Independent path: entropy.ts thermalDistribution → gibbsEntropy, meanEnergy.
    const energies = [3, 0, 0.4, 7, 7, 2.2];
    const g = [2, 3, 1, 5, 1, 4];
    const curve = schemeCurve(energies, g, { points: 120 })!;
    assert.equal(curve.length, 120);
    checkShape(curve, 0, 7);
    for (const point of curve) {
      const p = thermalDistribution(energies, g, point.beta)!;
      close(point.entropy, gibbsEntropy(p, g)!, 1e-10, `S at β = ${point.beta}`);
      close(point.energy, meanEnergy(p, energies)!, 1e-10, `E at β = ${point.beta}`);
    }
  });

  it('ends at ln g of a degenerate ground and top level', () => {
    const curve = schemeCurve([0, 1, 2], [3, 1, 5])!;
    close(curve[0]!.entropy, Math.log(3), 1e-4, 'S near the ground level');
    close(curve[curve.length - 1]!.entropy, Math.log(5), 1e-4, 'S near the top level');
    close(Math.max(...curve.map((p) => p.entropy)), Math.log(9), 1e-15, 'largest S = ln Σg');
  });

  it('reproduces the spin-1 entropy and energy at βε = 1 through thermalStateAtEnergy', () => {
    // domain.md §7 (D): spin 1 at βε = 1: U/(Nε) = −0.575 210 382 6, S/(Nk) = 0.832 395 581 8.
    const state = thermalStateAtEnergy([-1, 0, 1], null, -0.5752103826)!;
    close(state.beta, 1, 1e-9, 'β');
    close(state.entropy, 0.8323955818, 1e-9, 'S');
    close(betaAtEnergy([-1, 0, 1], [1, 1, 1], 0.5752103826), -1, 1e-9, 'β at the mirrored energy');
  });

  it('draws a 64-level scheme with 2000 points (its speed is a row of npm run bench)', () => {
    const energies = Array.from({ length: 64 }, (_, i) => i * i * 0.01);
    const curve = schemeCurve(energies, null, { points: 2000 })!;
    assert.equal(curve.length, 2000);
    checkShape(curve, 0, 63 * 63 * 0.01);
  });

  it('draws 100 000 levels at its fixed number of points', () => {
    // No timing here (a busy machine made a time limit fail): the work is bounded by the 400 points asked for.
    const energies = Array.from({ length: 100000 }, (_, i) => Math.sqrt(i));
    const curve = schemeCurve(energies, null)!;
    assert.equal(curve.length, 400);
    checkShape(curve, 0, Math.sqrt(99999));
  });

  it('handles a level just above a degenerate ground state (widely separated scales)', () => {
    const curve = schemeCurve([0, 1e-6, 1], [2, 1, 1], { points: 300 })!;
    checkShape(curve, 0, 1);
  });

  it('returns null for fewer than two levels, zero span and invalid numbers', () => {
    const cases: Array<[number[], number[] | null]> = [
      [[1], null],
      [[], null],
      [[2, 2], null],
      [[0, NaN], null],
      [[0, Infinity], null],
      [
        [0, 1],
        [1, 0],
      ],
      [[0, 1], [1]],
      [[-Number.MAX_VALUE, Number.MAX_VALUE], null],
    ];
    for (const [e, g] of cases) {
      assert.equal(schemeCurve(e, g), null, `energies ${e.join(', ')}, g ${JSON.stringify(g)}`);
    }
    assert.equal(schemeCurve([0, 1], null, { points: NaN })!.length, 400);
    assert.equal(schemeCurve([0, 1], null, { points: 1 })!.length, 3);
    assert.equal(schemeCurve([0, 1], null, { points: 1e12 })!.length, MAX_CURVE_POINTS, 'points are capped');
  });
});

describe('inverse temperature at a given energy', () => {
  const energies = [0, 0.5, 1.7, 4];
  const g = [1, 2, 2, 3];

  it('inverts the mean energy of the thermal distribution for either sign of β', () => {
    for (const beta of [-8, -1, -1e-9, 1e-9, 0.3, 5, 200]) {
      const e = meanEnergy(thermalDistribution(energies, g, beta)!, energies)!;
      close(betaAtEnergy(energies, g, e), beta, 1e-7, `β = ${beta}`);
    }
  });

  it('returns zero at the β = 0 energy and null at or outside the ends', () => {
    const e0 = meanEnergy(g, energies)!;
    assert.equal(betaAtEnergy(energies, g, e0), 0);
    for (const e of [0, 4, -1, 5, NaN, Infinity, -Infinity])
      assert.equal(betaAtEnergy(energies, g, e), null, `E = ${e}`);
    assert.equal(thermalStateAtEnergy(energies, g, 4), null);
  });

  it('gives the thermal entropy at the same mean energy, never below a measured distribution', () => {
    // Gibbs inequality: S(thermal at ⟨E⟩) − S(p) = D(p‖thermal) ≥ 0.
    const p = [0.4, 0.1, 0.3, 0.2];
    const e = meanEnergy(p, energies)!;
    const state = thermalStateAtEnergy(energies, g, e)!;
    const q = thermalDistribution(energies, g, state.beta)!;
    close(state.entropy - gibbsEntropy(p, g)!, relativeEntropy(p, q)!, 1e-9, 'entropy deficit');
    assert.ok(state.entropy > gibbsEntropy(p, g)!);
  });
});

import { strict as assert } from 'node:assert';
import { curveData, KELVIN_PER_WAVENUMBER, lnBinomial, type CurvePayload, type ViewPayload } from '../../../src/core';
import { block, close } from '../helpers';

const SOURCE = { uri: 'file:///notes/run.md', version: 3 };

/** The payload of one block, asserting that it is drawable. */
function curveOf(body: string): CurvePayload {
  const p: ViewPayload = curveData(block(body).report, SOURCE);
  assert.equal(p.kind, 'curve', p.kind === 'problem' ? p.message : '');
  return p as CurvePayload;
}

/** Binary entropy −p ln p − (1 − p) ln(1 − p), in nats. */
function binaryEntropy(p: number): number {
  return -p * Math.log(p) - (1 - p) * Math.log1p(-p);
}

describe('curve view payload', () => {
  it('follows the closed form of the two-state system along the whole large-N curve', () => {
    // Canonical two-state system (D. V. Schroeder, An Introduction to Thermal Physics, 2000, §3.3 and §6.1):
    // with the upper fraction p = E/ε, S/(Nk) = −p ln p − (1 − p) ln(1 − p) and β = ln((1 − p)/p)/ε.
    const c = curveOf('gap: 10 K\npopulations: [0.7, 0.3]');
    assert.ok(c.curve.energy.length >= 100, `${c.curve.energy.length} points`);
    for (let i = 0; i < c.curve.energy.length; i++) {
      const p = c.curve.energy[i]! / 10;
      if (p < 1e-4 || p > 1 - 1e-4) continue; // the ends test the formula's rounding, not the curve
      close(c.curve.entropy[i], binaryEntropy(p), 1e-9, `S at p = ${p}`);
      const beta = Math.log((1 - p) / p) / 10;
      if (Math.abs(beta) > 1e-6) close(c.curve.beta[i], beta, 1e-7, `β at p = ${p}`);
    }
    assert.ok(
      c.curve.energy.every((e, i) => i === 0 || e > c.curve.energy[i - 1]!),
      'energies increase',
    );
    assert.equal(c.saturationEnergy, 5);
    close(c.maxEntropy, Math.LN2, 1e-15, 'S at saturation');
  });

  it('places two measured levels on the closed-form curve with a zero deficit', () => {
    // Same closed form at p = 0.3: E = 3 K, S = 0.6108643020548935, β = ln(7/3)/10 K⁻¹.
    const m = curveOf('id: run 1\ngap: 10 K\npopulations: [0.7, 0.3]').measured!;
    close(m.energy, 3, 1e-14, 'E');
    close(m.entropy, binaryEntropy(0.3), 1e-14, 'S');
    close(m.beta, Math.log(7 / 3) / 10, 1e-14, 'β');
    assert.deepEqual([m.deficit, m.relativeEntropy], [0, 0], 'two levels are always thermal (round-off shown as 0)');
  });

  it('propagates the population uncertainties to E and S (checked by finite differences)', () => {
    const m = curveOf('gap: 10 K\npopulations: [0.7 ± 0.01, 0.3 ± 0.02]').measured!;
    // Independent route: central differences of E(n_l, n_u) = 10 n_u/(n_l + n_u) and S = H(n_u/(n_l + n_u)).
    const e = (nl: number, nu: number): number => (10 * nu) / (nl + nu);
    const s = (nl: number, nu: number): number => binaryEntropy(nu / (nl + nu));
    const h = 1e-6;
    const d = (f: (a: number, b: number) => number, which: 0 | 1): number =>
      which === 0 ? (f(0.7 + h, 0.3) - f(0.7 - h, 0.3)) / (2 * h) : (f(0.7, 0.3 + h) - f(0.7, 0.3 - h)) / (2 * h);
    close(m.uEnergy, Math.hypot(d(e, 0) * 0.01, d(e, 1) * 0.02), 1e-6, 'u(E)');
    close(m.uEntropy, Math.hypot(d(s, 0) * 0.01, d(s, 1) * 0.02), 1e-6, 'u(S)');
  });

  it('propagates u(β) to E when the populations are implied by a polarization', () => {
    // Spin 1/2: E(β) = ε/(1 + e^(βε)) from the lower level at 0 (Schroeder §6.1); u(E) = |dE/dβ| u(β).
    const c = curveOf('system: 1H\nfield: 7.05 T\npolarization: 0.4 ± 0.02');
    const [e0, e1] = c.scheme.energies as [number, number];
    const gap = e1 - e0;
    const m = c.measured!;
    const energy = (b: number): number => e0 + gap / (1 + Math.exp(b * gap));
    const h = m.beta! * 1e-6;
    close(m.uEnergy, Math.abs((energy(m.beta! + h) - energy(m.beta! - h)) / (2 * h)) * m.uBeta!, 1e-6, 'u(E)');
  });

  it('gives a non-thermal measurement a positive entropy deficit equal to its relative entropy', () => {
    // The pumped-cell populations of the demo: the middle level is driven far above its Boltzmann share.
    const c = curveOf(
      'levels:\n  - { energy: 0 cm-1, g: 2, population: 0.52 }\n  - { energy: 12579 cm-1, g: 2, population: 0.30 }\n  - { energy: 12817 cm-1, g: 4, population: 0.18 }',
    );
    const m = c.measured!;
    assert.ok(m.deficit! > 0.01, `deficit ${m.deficit}`);
    close(m.relativeEntropy, m.deficit!, 1e-9, 'D(p‖q) against S_thermal − S');
    close(m.thermalEntropy! - m.entropy, m.deficit!, 1e-12, 'deficit from its parts');
    assert.equal(c.unit.name, 'cm-1');
    assert.equal(c.unit.label, 'cm⁻¹');
    assert.equal(c.unit.kelvinPerUnit, KELVIN_PER_WAVENUMBER);
  });

  it('draws the exact finite-N staircase ln C(N, m)/N next to the large-N curve when count is given', () => {
    const c = curveOf('gap: 10 K\npopulations: [0.7, 0.3]\ncount: 4');
    const f = c.finiteN!;
    assert.equal(f.n, 4);
    assert.deepEqual(f.m, [0, 1, 2, 3, 4]);
    assert.deepEqual(f.energy, [0, 2.5, 5, 7.5, 10]);
    // C(4, m) = 1, 4, 6, 4, 1 (Pascal's triangle).
    [1, 4, 6, 4, 1].forEach((binomial, m) =>
      close(f.entropy[m]! + 1, Math.log(binomial) / 4 + 1, 1e-15, `S at m = ${m}`),
    );
    // Each step sits below the large-N value at the same energy (Stirling: ln C(N, m) < N H(m/N)).
    for (const m of [1, 2, 3]) assert.ok(f.entropy[m]! < binaryEntropy(m / 4));
  });

  it('adds the level degeneracies to the finite-N entropy', () => {
    const f = curveOf('gap: 1420.405751768 MHz\ng: [1, 3]\nratio: 2.9979 ± 0.0003\ncount: 1000').finiteN!;
    close(f.entropy[500], (lnBinomial(1000, 500)! + 500 * Math.log(3)) / 1000, 1e-14, 'S at m = N/2');
  });

  it('says that the exact finite-N curve is for two-level schemes only', () => {
    const c = curveOf('system: 7Li\nfield: 0.63 T\npopulations: [0.2402, 0.2468, 0.2532, 0.2598]\ncount: 200');
    assert.equal(c.finiteN, null);
    assert.match(c.notes.join(' '), /two-level schemes only; this scheme has 4 levels/);
    assert.equal(c.status, 'inverted');
    assert.ok(c.measured!.energy > c.saturationEnergy, 'an inverted point lies right of saturation');
  });

  it('marks the thermal state at the lattice temperature', () => {
    // Two levels at T_L = ε/k: p_upper = e⁻¹/(1 + e⁻¹), E = ε p_upper (Boltzmann factor, Schroeder §6.1).
    const t = curveOf('gap: 10 K\npopulations: [0.9, 0.1]\nlattice: 10 K').thermal!;
    const p = Math.exp(-1) / (1 + Math.exp(-1));
    close(t.energy, 10 * p, 1e-14, 'E_L');
    close(t.entropy, binaryEntropy(p), 1e-14, 'S_L');
    assert.equal(t.beta, 0.1);
  });

  it('gives a block with errors as its first error, message and code', () => {
    const { report } = block('id: hurried\nsystem: 13C\nfield: 7.05 MT\nlattice: 1.4 K\npolarization: 0.3');
    const p = curveData(report, SOURCE);
    assert.equal(p.kind, 'problem');
    const first = report.problems.find((x) => x.severity === 'error')!;
    assert.deepEqual(p, {
      kind: 'problem',
      ...SOURCE,
      line: 2,
      id: 'hurried',
      code: 'unit-case',
      message: first.message,
      plot: null,
    });
  });

  it('uses kelvin on the axis for a gap written as a wavelength, and a stand-in id naming the line', () => {
    const c = curveOf('gap: 1064 nm\ng: [12, 4]\npopulations: [2.0e16 cm-3, 8.0e16 cm-3]');
    assert.deepEqual(c.unit, { name: 'K', label: 'K', kelvinPerUnit: 1 });
    assert.equal(c.id, 'block at line 3');
    assert.equal(c.status, 'inverted');
  });
});

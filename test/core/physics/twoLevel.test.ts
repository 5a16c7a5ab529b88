import assert from 'node:assert/strict';
import {
  betaFromPopulations,
  betaFromTwoLevelPolarization,
  polarizationFromPopulations,
  populationsFromBeta,
} from '../../../src/core/physics/twoLevel';
import { close } from '../helpers';

/** Rounds to the given number of decimals, as a report would print it. */
const round = (x: number, decimals: number): number => Math.round(x * 10 ** decimals) / 10 ** decimals;

describe('two-level inverse temperature from populations', () => {
  it('reproduces the worked propagation example r = 0.50 ± 0.01 at ΔE/k = 10 K', () => {
    // domain.md §11, derived (D) with the law of propagation of uncertainty, GUM JCGM 100:2008 §5.1.2:
    // β = ln(1/r)/(ΔE/k) = 0.069 314 718 K⁻¹, u(β) = u(r)/(r ΔE/k) = 0.002 K⁻¹.
    const beta = betaFromPopulations(1, 0.5, 1, 1, 10, { nUpper: 0.01 });
    close(beta?.value, 0.069314718, 1e-8, 'β');
    close(beta?.uncertainty, 0.002, 1e-12, 'u(β)');
    // domain.md §11 (D): T = 14.426 950 K, u(T) = 0.416 274 K, reported as 14.43 K and 0.42 K (GUM §7.2.6).
    const t = 1 / beta!.value;
    const uT = beta!.uncertainty! / beta!.value ** 2;
    close(t, 14.42695, 1e-6, 'T');
    close(uT, 0.416274, 1e-6, 'u(T)');
    assert.equal(round(t, 2), 14.43);
    assert.equal(round(uT, 2), 0.42);
  });

  it('gives a negative temperature of the same size for the inverted ratio r = 2.00 ± 0.04', () => {
    // domain.md §11 (D): T = −14.43 K, u = 0.42 K; β = −0.069 314 718 K⁻¹, u(β) = 0.002 K⁻¹.
    const beta = betaFromPopulations(1, 2, 1, 1, 10, { nUpper: 0.04 });
    close(beta?.value, -0.069314718, 1e-8, 'β');
    close(beta?.uncertainty, 0.002, 1e-12, 'u(β)');
    assert.equal(round(1 / beta!.value, 2), -14.43);
    assert.equal(round(beta!.uncertainty! / beta!.value ** 2, 2), 0.42);
  });

  it('uses the degeneracies, as in the 21-cm spin temperature with g = 1, 3', () => {
    // domain.md §6 (D from Wilson & Hüttemeister, Tools of Radio Astronomy — Problems and Solutions, Springer 2000):
    // T* = 0.068 168 725 K; n₁/n₀ = 2.99 → T_s = T*/ln(3/2.99) = 20.416 514 K; T_s = 2.725 K ↔ n₁/n₀ = 2.925 882 788.
    close(1 / betaFromPopulations(1, 2.99, 1, 3, 0.068168725)!.value, 20.416514, 1e-7, 'T_s at ratio 2.99');
    close(1 / betaFromPopulations(1, 2.925882788, 1, 3, 0.068168725)!.value, 2.725, 1e-8, 'T_s at 2.725 K');
    // domain.md §6: a ratio above g₁/g₀ = 3 means an inverted hyperfine pair.
    assert.ok(betaFromPopulations(1, 3.01, 1, 3, 0.068168725)!.value < 0);
  });

  it('gives the excitation temperature of an inverted laser transition', () => {
    // domain.md §10 (D): hc/(λk) = 13 522.339 K for 1064 nm; N₂/N₁ = 2, g₂ = g₁ → T_ex = −19 508.61 K.
    close(1 / betaFromPopulations(1, 2, 1, 1, 13522.339)!.value, -19508.61, 1e-6, 'T_ex');
  });

  it('propagates all three uncertainties like an independent numerical differentiation', () => {
    // Independent check: central differences of β in each input, combined in quadrature (GUM §5.1.2).
    const [nl, nu, gl, gu, gap] = [0.62, 0.38, 2, 3, 7.5];
    const u = { nLower: 0.011, nUpper: 0.007, gap: 0.05 };
    const f = (a: number, b: number, e: number): number => betaFromPopulations(a, b, gl, gu, e)!.value;
    const d = (g: (h: number) => number, h: number): number => (g(h) - g(-h)) / (2 * h);
    const c1 = d((h) => f(nl + h, nu, gap), 1e-6);
    const c2 = d((h) => f(nl, nu + h, gap), 1e-6);
    const c3 = d((h) => f(nl, nu, gap + h), 1e-6);
    const expected = Math.hypot(c1 * u.nLower, c2 * u.nUpper, c3 * u.gap);
    close(betaFromPopulations(nl, nu, gl, gu, gap, u)!.uncertainty, expected, 1e-7, 'u(β)');
  });

  it('leaves the uncertainty null when no input carries one, or when one is invalid', () => {
    assert.equal(betaFromPopulations(1, 0.5, 1, 1, 10)!.uncertainty, null);
    assert.equal(betaFromPopulations(1, 0.5, 1, 1, 10, {})!.uncertainty, null);
    assert.equal(betaFromPopulations(1, 0.5, 1, 1, 10, { nLower: -0.1 })!.uncertainty, null);
    assert.equal(betaFromPopulations(1, 0.5, 1, 1, 10, { nLower: NaN })!.uncertainty, null);
    assert.equal(betaFromPopulations(1, 0.5, 1, 1, 10, { gap: 0 })!.uncertainty, 0);
  });

  it('returns null for an empty level, a non-positive gap and non-finite numbers, and never throws', () => {
    const cases: Array<[number, number, number, number, number]> = [
      [0, 1, 1, 1, 1],
      [1, 0, 1, 1, 1],
      [-0, 1, 1, 1, 1],
      [1, 1, 1, 1, 0],
      [1, 1, 1, 1, -2],
      [1, 1, 0, 1, 1],
      [NaN, 1, 1, 1, 1],
      [1, Infinity, 1, 1, 1],
      [1, 1, 1, 1, Infinity],
      [1, 1, 1, -Infinity, 1],
      [-1, 1, 1, 1, 1],
    ];
    for (const args of cases) {
      assert.equal(betaFromPopulations(...args), null, `inputs ${args.join(', ')}`);
    }
    // Extreme but valid ratios stay finite.
    close(betaFromPopulations(1e300, 1e-300, 1, 1, 1)!.value, 600 * Math.LN10, 1e-14, 'β at a ratio of 1e600');
  });

  it('returns exactly zero at equal populations per state (saturation)', () => {
    assert.equal(betaFromPopulations(1, 3, 1, 3, 5)!.value, 0);
    assert.ok(Object.is(betaFromPopulations(2, 2, 1, 1, 5)!.value, 0));
  });
});

describe('two-level polarization', () => {
  it('is (n_l − n_u)/(n_l + n_u) with first-order uncertainty', () => {
    // Definition: domain.md Part 1 and docs/format.md conventions; sensitivities checked numerically.
    const p = polarizationFromPopulations(0.7, 0.3, { nLower: 0.02, nUpper: 0.01 });
    close(p?.value, 0.4, 1e-14, 'P');
    const h = 1e-7;
    const c1 =
      (polarizationFromPopulations(0.7 + h, 0.3)!.value - polarizationFromPopulations(0.7 - h, 0.3)!.value) / (2 * h);
    const c2 =
      (polarizationFromPopulations(0.7, 0.3 + h)!.value - polarizationFromPopulations(0.7, 0.3 - h)!.value) / (2 * h);
    close(p?.uncertainty, Math.hypot(c1 * 0.02, c2 * 0.01), 1e-7, 'u(P)');
  });

  it('works on any common scale, including ones that would overflow a sum', () => {
    close(polarizationFromPopulations(1.5e308, 0.5e308)!.value, 0.5, 1e-15, 'P near the overflow limit');
    assert.equal(polarizationFromPopulations(0, 4)!.value, -1);
    assert.equal(polarizationFromPopulations(4, 0)!.value, 1);
  });

  it('returns null for empty, negative or non-finite populations', () => {
    for (const [a, b] of [
      [0, 0],
      [-1, 2],
      [NaN, 1],
      [1, Infinity],
      [-0, 0],
    ] as const) {
      assert.equal(polarizationFromPopulations(a, b), null, `inputs ${a}, ${b}`);
    }
  });
});

describe('two-level inverse temperature from polarization', () => {
  it('gives the 13C spin temperature at 9.4 T for P = 0.30, 0.50 and −0.30', () => {
    // domain.md §4, derived (D) from the IUPAC 2001 γ (Harris et al., Pure Appl. Chem. 73, 1795) and exact h, k:
    // hν/k = 4.830 8666 × 10⁻³ K; P = 0.30 → T_s = 7.803 8136 mK, 1/T_s = 128.142 48 K⁻¹; P = 0.50 → 4.397 2443 mK.
    const gap = 4.8308666e-3;
    close(1 / betaFromTwoLevelPolarization(0.3, 1, 1, gap)!.value, 7.8038136e-3, 1e-7, 'T_s at P = 0.30');
    close(betaFromTwoLevelPolarization(0.3, 1, 1, gap)!.value, 128.14248, 1e-7, 'β at P = 0.30');
    close(1 / betaFromTwoLevelPolarization(0.5, 1, 1, gap)!.value, 4.3972443e-3, 1e-7, 'T_s at P = 0.50');
    close(1 / betaFromTwoLevelPolarization(-0.3, 1, 1, gap)!.value, -7.8038136e-3, 1e-7, 'T_s at P = −0.30');
  });

  it('agrees with the population form, with degeneracies', () => {
    // Independent path: n_l = (1 + P)/2, n_u = (1 − P)/2 through betaFromPopulations.
    for (const p of [-0.9, -0.2, 1e-9, 0.4, 0.999]) {
      const expected = betaFromPopulations((1 + p) / 2, (1 - p) / 2, 2, 5, 3)!.value;
      close(betaFromTwoLevelPolarization(p, 2, 5, 3)!.value, expected, 1e-12, `β at P = ${p}`);
    }
  });

  it('has u(T)/T = u(P)/P in the high-temperature regime', () => {
    // domain.md §11 (D): spin-1/2 high-temperature regime T ≈ hν/(2kP) ⇒ u(T)/T = u(P)/P.
    const b = betaFromTwoLevelPolarization(3.2e-5, 1, 1, 0.0192, 3.2e-7)!;
    close(b.uncertainty! / b.value, 0.01, 1e-8, 'u(β)/β');
    // With a gap uncertainty as well: relative terms add in quadrature (GUM §5.1.2).
    const c = betaFromTwoLevelPolarization(3.2e-5, 1, 1, 0.0192, 3.2e-7, 0.0192 * 0.02)!;
    close(c.uncertainty! / c.value, Math.hypot(0.01, 0.02), 1e-8, 'u(β)/β with u(ΔE)');
  });

  it('returns null for |P| ≥ 1, non-finite P, and invalid gaps or degeneracies', () => {
    const cases: Array<[number, number, number, number]> = [
      [1, 1, 1, 1],
      [-1, 1, 1, 1],
      [1.2, 1, 1, 1],
      [NaN, 1, 1, 1],
      [Infinity, 1, 1, 1],
      [0.1, 1, 1, 0],
      [0.1, 0, 1, 1],
      [0.1, 1, 1, NaN],
    ];
    for (const args of cases) {
      assert.equal(betaFromTwoLevelPolarization(...args), null, `inputs ${args.join(', ')}`);
    }
    assert.ok(Object.is(betaFromTwoLevelPolarization(-0, 1, 1, 1)!.value, 0), 'P = −0 gives β = +0');
  });
});

describe('two-level populations from inverse temperature', () => {
  it('reproduces the 13C thermal population ratio and polarization at 9.4 T, 298.15 K', () => {
    // domain.md §4 (D from IUPAC 2001 γ, exact h, k): n_up/n_low = 0.999 983 797, P = 8.101 403 × 10⁻⁶.
    const p = populationsFromBeta(1 / 298.15, 1, 1, 4.8308666e-3)!;
    close(p.upper / p.lower, 0.999983797, 1e-9, 'n_up/n_low');
    close(p.lower - p.upper, 8.101403e-6, 1e-6, 'P');
    close(p.lower + p.upper, 1, 1e-15, 'normalisation');
  });

  it('reproduces the electron polarization at 3.35 T and 1.2 K', () => {
    // domain.md §4 (D from CODATA 2018 γ_e): x = hν/kT = 3.754 7513, P = 0.954 2581.
    const p = populationsFromBeta(1 / 1.2, 1, 1, 3.7547513 * 1.2)!;
    close(p.lower - p.upper, 0.9542581, 1e-7, 'P');
  });

  it('is stable for any sign and size of β', () => {
    assert.deepEqual(populationsFromBeta(Infinity, 1, 1, 1), { lower: 1, upper: 0 });
    assert.deepEqual(populationsFromBeta(-Infinity, 1, 1, 1), { lower: 0, upper: 1 });
    assert.deepEqual(populationsFromBeta(1e6, 1, 1, 1), { lower: 1, upper: 0 });
    close(populationsFromBeta(0, 1, 3, 1)!.upper, 0.75, 1e-15, 'g-weighted at β = 0');
    close(populationsFromBeta(-0, 1, 3, 1)!.lower, 0.25, 1e-15, 'g-weighted at β = −0');
    assert.equal(populationsFromBeta(NaN, 1, 1, 1), null);
    assert.equal(populationsFromBeta(1, 1, 1, 0), null);
    assert.equal(populationsFromBeta(1, 1, -1, 1), null);
  });

  it('round-trips through betaFromPopulations', () => {
    for (const beta of [-3, -1e-6, 0.25, 4]) {
      const p = populationsFromBeta(beta, 3, 1, 2)!;
      close(betaFromPopulations(p.lower, p.upper, 3, 1, 2)!.value, beta, 1e-9, `β = ${beta}`);
    }
  });
});

import assert from 'node:assert/strict';
import {
  ALL_PAIRS_LIMIT,
  CHI2_SIGNIFICANCE,
  RESIDUAL_TOLERANCE,
  boltzmannFit,
  invertedPairs,
  weightedLineFit,
} from '../../../src/core/physics/fit';
import { close } from '../helpers';
import { ARGON } from '../nistLines';

/**
 * Independent straight-line fit from the uncentred normal equations
 * (Bevington & Robinson, Data Reduction and Error Analysis, ch. 6):
 * Δ = S·Sxx − Sx², b = (S·Sxy − Sx·Sy)/Δ, a = (Sxx·Sy − Sx·Sxy)/Δ, var b = S/Δ, var a = Sxx/Δ, cov = −Sx/Δ.
 */
function normalEquations(x: number[], y: number[], w: number[]) {
  let s = 0,
    sx = 0,
    sy = 0,
    sxx = 0,
    sxy = 0;
  x.forEach((xi, i) => {
    s += w[i]!;
    sx += w[i]! * xi;
    sy += w[i]! * y[i]!;
    sxx += w[i]! * xi * xi;
    sxy += w[i]! * xi * y[i]!;
  });
  const d = s * sxx - sx * sx;
  return {
    slope: (s * sxy - sx * sy) / d,
    intercept: (sxx * sy - sx * sxy) / d,
    varSlope: s / d,
    varIntercept: sxx / d,
    cov: -sx / d,
  };
}

// H I Balmer lines, NIST Atomic Spectra Database (Kramida, Ralchenko, Reader and NIST ASD Team; export of
// June 2026) as transcribed in domain.md §8a: vacuum λ (nm), upper-level E_k (cm⁻¹), g_k, A_ki (s⁻¹).
const BALMER = [
  { line: 'Hα', lambda: 656.4632, e: 97492.304, g: 18, a: 4.4101e7 },
  { line: 'Hβ', lambda: 486.2691, e: 102823.904, g: 32, a: 8.4193e6 },
  { line: 'Hγ', lambda: 434.1691, e: 105291.657, g: 50, a: 2.5304e6 },
  { line: 'Hδ', lambda: 410.28991, e: 106632.1681, g: 72, a: 9.732e5 },
];
/** Second radiation constant hc/k, K per cm⁻¹ (exact since SI 2019; domain.md §2). */
const C2 = 1.438776877503934;

describe('weighted straight-line fit', () => {
  const x = [1, 2, 3, 4, 5];
  const y = [2.1, 3.9, 6.2, 7.8, 10.1];
  const sigma = [0.1, 0.2, 0.1, 0.3, 0.2];

  it('agrees with the uncentred normal equations when weighted', () => {
    const fit = weightedLineFit(x, y, sigma)!;
    const ref = normalEquations(
      x,
      y,
      sigma.map((s) => 1 / (s * s)),
    );
    close(fit.slope, ref.slope, 1e-13, 'slope');
    close(fit.intercept, ref.intercept, 1e-12, 'intercept');
    close(fit.uSlope, Math.sqrt(ref.varSlope), 1e-12, 'u(slope)');
    close(fit.uIntercept, Math.sqrt(ref.varIntercept), 1e-12, 'u(intercept)');
    close(fit.covariance, ref.cov, 1e-12, 'covariance');
    const chi2 = y.reduce((acc, yi, i) => acc + ((yi - ref.intercept - ref.slope * x[i]!) / sigma[i]!) ** 2, 0);
    close(fit.chi2, chi2, 1e-10, 'χ²');
    assert.equal(fit.dof, 3);
    assert.equal(fit.weighted, true);
  });

  it('scales the unweighted covariance by the residual variance s² = RSS/(n − 2)', () => {
    const fit = weightedLineFit(x, y, null)!;
    const ref = normalEquations(
      x,
      y,
      x.map(() => 1),
    );
    const rss = y.reduce((acc, yi, i) => acc + (yi - ref.intercept - ref.slope * x[i]!) ** 2, 0);
    close(fit.slope, ref.slope, 1e-13, 'slope');
    close(fit.chi2, rss, 1e-10, 'residual sum of squares');
    close(fit.uSlope, Math.sqrt((rss / 3) * ref.varSlope), 1e-11, 'u(slope)');
    close(fit.uIntercept, Math.sqrt((rss / 3) * ref.varIntercept), 1e-11, 'u(intercept)');
    assert.equal(fit.weighted, false);
    fit.residuals.forEach((r, i) => close(r, y[i]! - ref.intercept - ref.slope * x[i]!, 1e-9, `residual ${i}`));
  });

  it('fits two points exactly, with uncertainties only when σ is given', () => {
    const weighted = weightedLineFit([0, 2], [1, 5], [0.1, 0.1])!;
    close(weighted.slope, 2, 1e-15, 'slope');
    assert.equal(weighted.dof, 0);
    close(weighted.uSlope, Math.sqrt(0.02) / 2, 1e-14, 'u(slope) from σ');
    const unweighted = weightedLineFit([0, 2], [1, 5], null)!;
    assert.equal(unweighted.uSlope, null);
    assert.equal(unweighted.uIntercept, null);
    assert.equal(unweighted.covariance, null);
  });

  it('stays accurate for x values far from zero', () => {
    const fit = weightedLineFit([1e9, 1e9 + 1, 1e9 + 2], [3, 5, 7], null)!;
    close(fit.slope, 2, 1e-9, 'slope');
  });

  it('returns null for degenerate x, too few points and invalid numbers', () => {
    assert.equal(weightedLineFit([3, 3, 3], [1, 2, 3], null), null);
    assert.equal(weightedLineFit([1], [1], null), null);
    assert.equal(weightedLineFit([1, 2], [1], null), null);
    assert.equal(weightedLineFit([1, NaN], [1, 2], null), null);
    assert.equal(weightedLineFit([1, 2], [1, Infinity], null), null);
    assert.equal(weightedLineFit([1, 2], [1, 2], [1, 0]), null);
    assert.equal(weightedLineFit([1, 2], [1, 2], [1, -1]), null);
    assert.equal(weightedLineFit([1, 2], [1, 2], [1, NaN]), null);
    assert.equal(weightedLineFit([1, 2], [1, 2], [1]), null);
  });
});

describe('Boltzmann fit', () => {
  it('reproduces the relative Balmer intensities of a 10 000 K plasma from the ASD data', () => {
    // domain.md §8c, derived (D): I ∝ gA/λ · exp(−E_k/kT); relative to Hα: 0.212 761 08, 0.078 459 387, 0.037 916 32.
    const intensity = BALMER.map((l) => ((l.g * l.a) / l.lambda) * Math.exp((-l.e * C2) / 10000));
    [1, 0.21276108, 0.078459387, 0.03791632].forEach((expected, i) =>
      close(intensity[i]! / intensity[0]!, expected, 1e-7, BALMER[i]!.line),
    );
  });

  it('recovers β = 1e-4 K⁻¹ (T = 10 000 K) from the tabulated Balmer intensities', () => {
    // domain.md §8c (D) relative intensities at 10 000 K with NIST ASD g, A, λ (domain.md §8a);
    // upper-level populations n_k ∝ I λ/A, energies converted with hc/k = 1.438 776 877 503 934 K per cm⁻¹.
    const relative = [1, 0.21276108, 0.078459387, 0.03791632];
    const energies = BALMER.map((l) => l.e * C2);
    const populations = BALMER.map((l, i) => (relative[i]! * l.lambda) / l.a);
    const fit = boltzmannFit(
      energies,
      populations,
      BALMER.map((l) => l.g),
      null,
    )!;
    close(fit.beta, 1e-4, 1e-7, 'β');
    assert.equal(fit.consistent, true);
    assert.equal(fit.rule, 'residual');
    // With 2 % uncertainties the fit is weighted and passes the χ² test.
    const weighted = boltzmannFit(
      energies,
      populations,
      BALMER.map((l) => l.g),
      populations.map((n) => 0.02 * n),
    )!;
    close(weighted.beta, 1e-4, 1e-7, 'β, weighted');
    assert.equal(weighted.weighted, true);
    assert.equal(weighted.consistent, true);
    // u(β) from σ_y = 0.02 alone: 0.02/√Σ(E − Ē)² (independent closed form).
    const mean = energies.reduce((a, b) => a + b, 0) / 4;
    close(weighted.uBeta, 0.02 / Math.sqrt(energies.reduce((a, e) => a + (e - mean) ** 2, 0)), 1e-9, 'u(β)');
  });

  it('recovers T = 5000 K from the 5000 K Balmer intensities', () => {
    // domain.md §8c (D): relative I at 5000 K = 1, 0.098 797 427, 0.025 544 659, 0.010 179 329.
    const relative = [1, 0.098797427, 0.025544659, 0.010179329];
    const populations = BALMER.map((l, i) => (relative[i]! * l.lambda) / l.a);
    const fit = boltzmannFit(
      BALMER.map((l) => l.e * C2),
      populations,
      BALMER.map((l) => l.g),
      null,
    )!;
    close(1 / fit.beta, 5000, 1e-7, 'T');
  });

  it('recovers T = 10 000 K from the Ar I 4p → 4s intensities', () => {
    // NIST Atomic Spectra Database, Ar I lines as transcribed in domain.md §8b (λ_vac nm, E_k cm⁻¹, g_k, A s⁻¹);
    // relative intensities at 10 000 K from domain.md §8c (derived, D), relative to 811.7542 nm.
    const ar = ARGON;
    const relative = [
      1, 0.50419777, 0.2972004, 0.19934234, 0.19398811, 0.14872981, 0.15546566, 0.072272388, 0.13180352,
    ];
    const computed = ar.map(([lambda, e, g, a]) => ((g * a) / lambda) * Math.exp((-e * C2) / 10000));
    relative.forEach((r, i) => close(computed[i]! / computed[0]!, r, 1e-7, `Ar line ${ar[i]![0]} nm`));
    const fit = boltzmannFit(
      ar.map((l) => l[1] * C2),
      ar.map((l, i) => (relative[i]! * l[0]) / l[3]),
      ar.map((l) => l[2]),
      null,
    )!;
    close(1 / fit.beta, 10000, 1e-5, 'T');
  });

  it('gives the tabulated Boltzmann-plot slope in cm from the published y values', () => {
    // domain.md §8c (D): y = ln(I_rel λ/(gA)) = −14.005 498 14, −14.772 596 42, −15.127 651 01, −15.320 520 65
    // against E_k in cm⁻¹ has slope −1.438 776 88 × 10⁻⁴ cm at 10 000 K.
    const y = [-14.00549814, -14.77259642, -15.12765101, -15.32052065];
    const fit = boltzmannFit(
      BALMER.map((l) => l.e),
      y.map(Math.exp),
      null,
      null,
    )!;
    close(-fit.beta, -1.43877688e-4, 1e-7, 'slope');
  });

  it('applies the χ² test at the 1 % level: consistent at χ² = 9.0, not at 9.5, for 2 degrees of freedom', () => {
    // χ²₀.₉₉(2 dof) = −2 ln(0.01) = 9.210 340 372, from the closed-form χ² CDF 1 − e^(−x/2) for 2 dof (derived).
    assert.equal(CHI2_SIGNIFICANCE, 0.01);
    const energies = [0, 100, 200, 300];
    const pattern = [1, -1, -1, 1]; // orthogonal to 1 and E, so the residuals are exactly c·pattern
    const sigmaY = 0.02;
    for (const [chi2, expected] of [
      [9.0, true],
      [9.5, false],
    ] as const) {
      const c = sigmaY * Math.sqrt(chi2 / 4);
      const populations = energies.map((e, i) => Math.exp(-0.01 * e + c * pattern[i]!));
      const fit = boltzmannFit(
        energies,
        populations,
        null,
        populations.map((n) => sigmaY * n),
      )!;
      close(fit.chi2Limit, 2 * Math.log(100), 1e-9, 'χ² limit');
      close(fit.chi2, chi2, 1e-9, 'χ²');
      close(fit.chi2PerDof, chi2 / 2, 1e-9, 'χ²/dof');
      close(fit.beta, 0.01, 1e-9, 'β');
      assert.equal(fit.dof, 2);
      assert.equal(fit.rule, 'chi2');
      assert.equal(fit.consistent, expected, `χ² = ${chi2}`);
    }
  });

  it('passes a thermal three-level set with 1 % noise and flags a clearly non-thermal one', () => {
    // χ²₀.₉₉(1 dof) = 6.634 897 (common statistical tables, from memory).
    const energies = [0, 100, 200];
    const thermal = energies.map((e, i) => Math.exp(-0.01 * e) * (1 + [0.005, -0.008, 0.006][i]!));
    const ok = boltzmannFit(
      energies,
      thermal,
      [1, 1, 1],
      thermal.map((n) => 0.01 * n),
    )!;
    close(ok.chi2Limit, 6.634897, 1e-6, 'χ² limit for 1 dof');
    assert.equal(ok.consistent, true);
    const odd = [1, 2 * Math.exp(-1), Math.exp(-2)];
    const bad = boltzmannFit(
      energies,
      odd,
      [1, 1, 1],
      odd.map((n) => 0.01 * n),
    )!;
    assert.equal(bad.consistent, false);
    assert.ok(bad.chi2 > 1000);
  });

  it('applies the residual rule without uncertainties: 5 % per degeneracy', () => {
    // RESIDUAL_TOLERANCE = ln 1.05 (common practice, no source; documented in fit.ts).
    close(RESIDUAL_TOLERANCE, Math.log(1.05), 1e-15, 'tolerance');
    const energies = [0, 100, 200, 300];
    const pattern = [1, -1, -1, 1];
    for (const [c, expected] of [
      [0.045, true],
      [0.055, false],
    ] as const) {
      const populations = energies.map((e, i) => 3 * Math.exp(-0.02 * e + c * pattern[i]!));
      const fit = boltzmannFit(energies, populations, [1, 1, 1, 1], null)!;
      fit.residuals.forEach((r, i) => close(r, c * pattern[i]!, 1e-9, `residual ${i}`));
      assert.equal(fit.consistent, expected, `|residual| = ${c}`);
      assert.equal(fit.rule, 'residual');
    }
  });

  it('falls back to the unweighted fit when some level has no uncertainty', () => {
    const fit = boltzmannFit([0, 1, 2], [1, 0.4, 0.13], null, [0.01, null, 0.01])!;
    assert.equal(fit.weighted, false);
    assert.equal(fit.rule, 'residual');
    const zero = boltzmannFit([0, 1, 2], [1, 0.4, 0.13], null, [0.01, 0, 0.01])!;
    assert.equal(zero.weighted, false);
  });

  it('leaves out empty levels and lists them', () => {
    const fit = boltzmannFit([0, 1, 2, 3], [1, Math.exp(-1), 0, Math.exp(-3)], null, null)!;
    assert.deepEqual(fit.excluded, [2]);
    assert.deepEqual(fit.used, [0, 1, 3]);
    close(fit.beta, 1, 1e-12, 'β');
    assert.equal(boltzmannFit([0, 1, 2], [1, 0, 0], null, null), null, 'one populated level is not enough');
  });

  it('gives a negative β for an inverted distribution and is consistent for two levels', () => {
    const fit = boltzmannFit([0, 10], [1, 2], null, null)!;
    close(fit.beta, -Math.log(2) / 10, 1e-14, 'β');
    assert.equal(fit.consistent, true);
    assert.equal(fit.uBeta, null);
  });

  it('returns null for invalid inputs and never throws', () => {
    assert.equal(boltzmannFit([0, 1], [1, 0.5], [1], null), null);
    assert.equal(boltzmannFit([0, 1], [1, 0.5], null, [0.1]), null);
    assert.equal(boltzmannFit([0, NaN], [1, 0.5], null, null), null);
    assert.equal(boltzmannFit([0, 1], [1, -0.5], null, null), null);
    assert.equal(boltzmannFit([0, 1], [1, Infinity], null, null), null);
    assert.equal(boltzmannFit([0, 1], [1, 0.5], [1, 0], null), null);
    assert.equal(boltzmannFit([1, 1], [1, 0.5], null, null), null, 'equal energies');
    assert.equal(boltzmannFit([], [], null, null), null);
  });
});

describe('inverted pairs', () => {
  it('lists pairs whose upper level holds more population per state, by input index', () => {
    assert.deepEqual(invertedPairs([0, 1, 2], [0.5, 0.2, 0.3], null), [{ lower: 1, upper: 2 }]);
    // Input order does not matter: levels are sorted by energy.
    assert.deepEqual(invertedPairs([2, 0, 1], [0.3, 0.5, 0.2], null), [{ lower: 2, upper: 0 }]);
    assert.deepEqual(invertedPairs([0, 1, 2], [0.5, 0.3, 0.2], null), []);
  });

  it('weighs by degeneracy, as the laser gain condition does', () => {
    // domain.md §10: inversion ⇔ N₂/g₂ > N₁/g₁ (degeneracy-weighted). notebook-format example: g = [12, 4],
    // populations 2.0e16 and 8.0e16 cm⁻³ → 2e16 per state above vs 1.67e15 below: inverted.
    assert.deepEqual(invertedPairs([0, 13522.339], [2e16, 8e16], [12, 4]), [{ lower: 0, upper: 1 }]);
    assert.deepEqual(invertedPairs([0, 1], [1, 2.9], [1, 3]), []);
  });

  it('keeps empty levels and skips levels of equal energy', () => {
    assert.deepEqual(invertedPairs([0, 1], [0, 1e-9], null), [{ lower: 0, upper: 1 }]);
    assert.deepEqual(invertedPairs([0, 0], [0.1, 0.9], null), []);
  });

  it('compares all pairs up to the limit and only neighbours beyond it', () => {
    const schemeOf = (n: number) => {
      const energies = Array.from({ length: n }, (_, i) => i);
      const populations = energies.map((i) => (i === 2 ? 2 : 1 / (i + 1)));
      return { energies, populations };
    };
    assert.equal(ALL_PAIRS_LIMIT, 200);
    const small = schemeOf(ALL_PAIRS_LIMIT);
    assert.deepEqual(invertedPairs(small.energies, small.populations, null), [
      { lower: 0, upper: 2 },
      { lower: 1, upper: 2 },
    ]);
    const large = schemeOf(ALL_PAIRS_LIMIT + 1);
    assert.deepEqual(invertedPairs(large.energies, large.populations, null), [{ lower: 1, upper: 2 }]);
  });

  it('lists the inverted neighbours of a 100 000-level block', () => {
    const n = 100000;
    const energies = Array.from({ length: n }, (_, i) => (i * 7919) % n); // a permutation
    const populations = energies.map((e) => (e % 2 === 0 ? 2 : 1));
    const pairs = invertedPairs(energies, populations, null);
    assert.equal(pairs.length, n / 2 - 1); // every odd energy sits below an even one holding more
  });

  it('returns an empty list for invalid input', () => {
    assert.deepEqual(invertedPairs([0, 1], [1], null), []);
    assert.deepEqual(invertedPairs([0, NaN], [1, 2], null), []);
    assert.deepEqual(invertedPairs([0, 1], [1, -2], null), []);
    assert.deepEqual(invertedPairs([0, 1], [1, 2], [1, 0]), []);
  });
});

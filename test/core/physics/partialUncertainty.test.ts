/**
 * Boltzmann fits in which only some levels or lines state an uncertainty:
 * the value is the unweighted line, and u(β) takes in every stated
 * uncertainty (GUM, JCGM 100:2008 §5.1.2) together with the scatter they
 * leave unexplained (physics/lineFit.ts, partlyStatedLineFit).
 *
 * The propagation is checked against a Monte Carlo propagation of
 * distributions (JCGM 101:2008): normal errors of the stated size are drawn,
 * the unweighted slope is refitted each time, and its standard deviation is
 * compared with the first-order u(slope). The slope is linear in y, so the
 * two agree up to the Monte Carlo's own scatter, about 1/√(2M) relative.
 */
import { strict as assert } from 'node:assert';
import { boltzmannFit, partlyStatedLineFit, weightedLineFit } from '../../../src/core/physics/fit';
import { block, close, problem } from '../helpers';
import { BALMER, C2 } from '../nistLines';

/** Monte Carlo trials: the relative standard error of a standard deviation is 1/√(2M) ≈ 0.2 %. */
const M = 100_000;

/**
 * mulberry32, a small 32-bit generator (public-domain, T. Ettinger; from memory),
 * and standard normal draws by the Box–Muller transform (G. E. P. Box, M. E.
 * Muller, Ann. Math. Stat. 29, 610 (1958)). Seeded, so every run draws alike.
 */
function gaussian(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => {
    let u = uniform();
    while (u === 0) u = uniform();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
}

/** Mean and sample standard deviation. */
function moments(v: readonly number[]): { mean: number; sd: number } {
  const mean = v.reduce((s, x) => s + x, 0) / v.length;
  const sd = Math.sqrt(v.reduce((s, x) => s + (x - mean) ** 2, 0) / (v.length - 1));
  return { mean, sd };
}

/**
 * The slope's sensitivity to each y_i, found without the closed form: the
 * unweighted slope of the unit vector e_i (the slope is linear in y, so
 * b = Σ c_i y_i with c_i the slope of e_i).
 */
function sensitivities(x: readonly number[]): number[] {
  return x.map(
    (_, i) =>
      weightedLineFit(
        x,
        x.map((__, j) => (i === j ? 1 : 0)),
        null,
      )!.slope,
  );
}

describe('a straight line with uncertainties on some points only', () => {
  const x = [0, 1, 2, 3, 4, 5];
  const truth = x.map((xi) => 2 - 0.5 * xi);
  const stated = [0.05, null, 0.2, null, null, 0.1];

  it('gives, without any stated uncertainty, exactly the scatter-based uncertainties of the unweighted fit', () => {
    const y = [2.03, 1.46, 1.02, 0.49, 0.02, -0.55];
    const plain = weightedLineFit(x, y, null)!;
    const partly = partlyStatedLineFit(
      x,
      y,
      x.map(() => null),
    )!;
    close(partly.slope, plain.slope, 1e-15, 'slope');
    close(partly.uSlope, plain.uSlope!, 1e-12, 'u(slope)');
    close(partly.uIntercept, plain.uIntercept!, 1e-12, 'u(intercept)');
    close(partly.covariance, plain.covariance!, 1e-12, 'cov');
    close(partly.excessVariance, plain.chi2 / plain.dof, 1e-12, 's₀² = s²');
  });

  it('propagates the stated uncertainties through the unweighted slope: u²(b) = Σ c_i² u_i² on points without scatter', () => {
    // On an exact line the residuals vanish, so no excess variance: only the stated ones count.
    const fit = partlyStatedLineFit(x, truth, stated)!;
    assert.equal(fit.excessVariance, 0);
    const c = sensitivities(x);
    const expected = Math.sqrt(c.reduce((s, ci, i) => s + ci * ci * (stated[i] ?? 0) ** 2, 0));
    close(fit.uSlope, expected, 1e-12, 'u(slope) from the sensitivities');
    // The same number by hand: x̄ = 2.5, S_xx = 17.5, c = (x − x̄)/S_xx for the points 0, 2, 5.
    close(fit.uSlope, Math.hypot((-2.5 / 17.5) * 0.05, (-0.5 / 17.5) * 0.2, (2.5 / 17.5) * 0.1), 1e-12, 'by hand');
    // JCGM 101: the slope's spread when only those errors are drawn.
    const draw = gaussian(20260615);
    const slopes: number[] = [];
    for (let m = 0; m < M; m++) {
      const y = truth.map((t, i) => t + (stated[i] ?? 0) * draw());
      slopes.push(weightedLineFit(x, y, null)!.slope);
    }
    close(moments(slopes).sd, fit.uSlope!, 0.01, 'Monte Carlo sd of the slope');
  });

  it('estimates the excess variance from the residuals without counting the stated part twice', () => {
    // Every point also scatters by s₀ = 0.15 beyond what is stated; E[RSS] = Σ(1 − h_ii)(u_i² + s₀²)
    // (linear-model algebra, from memory), which the Monte Carlo checks, and the estimate of s₀² is
    // unbiased wherever the max(0, ·) leaves it alone.
    const s0 = 0.15;
    const draw = gaussian(7);
    const n = x.length;
    const xm = 2.5;
    const sxx = 17.5;
    const v = stated.map((u) => (u ?? 0) ** 2 + s0 * s0);
    const expectedRss = v.reduce((s, vi, i) => s + (1 - 1 / n - (x[i]! - xm) ** 2 / sxx) * vi, 0);
    const c = sensitivities(x);
    const trueU = Math.sqrt(c.reduce((s, ci, i) => s + ci * ci * v[i]!, 0));
    const rss: number[] = [];
    const slopes: number[] = [];
    const u2: number[] = [];
    const s02: number[] = [];
    for (let m = 0; m < M; m++) {
      const y = truth.map((t, i) => t + Math.sqrt(v[i]!) * draw());
      const fit = partlyStatedLineFit(x, y, stated)!;
      rss.push(fit.chi2);
      slopes.push(fit.slope);
      u2.push(fit.uSlope! ** 2);
      s02.push(fit.excessVariance);
    }
    close(moments(rss).mean, expectedRss, 0.01, 'mean RSS');
    close(moments(slopes).sd, trueU, 0.01, 'Monte Carlo sd of the slope');
    // The max(0, ·) adds a little (negative estimates are raised to 0): the mean lies a few % above s₀².
    const mean = moments(s02).mean;
    assert.ok(mean >= s0 * s0 && mean < 1.1 * s0 * s0, `mean s₀² = ${mean}, true ${s0 * s0}`);
    // Hence u²(slope) is, on average, the true variance of the slope (to the same few %).
    const meanU2 = moments(u2).mean;
    assert.ok(meanU2 > 0.97 * trueU ** 2 && meanU2 < 1.1 * trueU ** 2, `mean u² = ${meanU2}, true ${trueU ** 2}`);
  });

  it('with two points takes the one without an uncertainty as exact, as the two-level formula does', () => {
    const fit = partlyStatedLineFit([0, 2], [1, 0], [0.1, null])!;
    assert.equal(fit.dof, 0);
    assert.equal(fit.excessVariance, 0);
    close(fit.uSlope, 0.05, 1e-15, 'u(b) = u/Δx');
  });

  it('refuses stated uncertainties that are not finite or negative, and lists of the wrong length', () => {
    assert.equal(partlyStatedLineFit([0, 1, 2], [0, 1, 2], [Number.NaN, null, null]), null);
    assert.equal(partlyStatedLineFit([0, 1, 2], [0, 1, 2], [-1, null, null]), null);
    assert.equal(partlyStatedLineFit([0, 1, 2], [0, 1, 2], [null, null]), null);
  });
});

describe('the Boltzmann fit with uncertainties on some levels only', () => {
  // β = 0.1 K⁻¹ exactly: n_i = e^(−βE_i), g = 1 (the Boltzmann distribution; contract, "Conventions").
  const energies = [0, 10, 20, 30];
  const populations = energies.map((e) => Math.exp(-0.1 * e));

  it('lets a stated uncertainty on one level reach u(β): |∂β/∂y_i|·u(y_i) = |x_i − x̄|/S_xx · u(n)/n', () => {
    const none = boltzmannFit(energies, populations, null, null)!;
    const some = boltzmannFit(energies, populations, null, [null, 0.3 * populations[1]!, null, null])!;
    close(some.beta, none.beta, 1e-12, 'same β as the unweighted fit');
    close(some.beta, 0.1, 1e-12, 'β');
    // x̄ = 15 K, S_xx = 500 K²: |10 − 15|/500 × 0.3 = 0.003 K⁻¹ (GUM §5.1.2 on the least-squares slope).
    close(some.uBeta, 0.003, 1e-9, 'u(β)');
    assert.ok(none.uBeta! < 1e-12, `exact data leave no scatter: ${none.uBeta}`);
    assert.equal(some.weighted, false);
    assert.equal(some.stated, 1);
    assert.equal(some.rule, 'residual');
  });

  it('keeps the weighted fit and its χ² test when every level states an uncertainty', () => {
    const all = boltzmannFit(
      energies,
      populations,
      null,
      populations.map((n) => 0.02 * n),
    )!;
    assert.equal(all.weighted, true);
    assert.equal(all.stated, 4);
    assert.equal(all.rule, 'chi2');
  });
});

describe('a block in which only some levels or lines state an uncertainty', () => {
  const levels = (u1: string, u2: string): string =>
    `levels:\n  - { energy: 0 K, population: 1.0${u1} }\n  - { energy: 10 K, population: 0.368${u2} }\n  - { energy: 20 K, population: 0.135 }\n  - { energy: 30 K, population: 0.0498 }`;

  it('says how many levels state one, on the first level without, and how the fit treats them', () => {
    const p = problem(levels(' ± 0.01', ' ± 0.1'), 'uncertainty-partial');
    assert.equal(p.severity, 'info');
    assert.equal(p.at, '0.135');
    assert.match(p.message, /Only 2 of the 4 levels/);
    assert.match(p.message, /unweighted/);
  });

  it('gives a larger u(β) than the scatter alone when a stated uncertainty is larger than the scatter', () => {
    const none = block(levels('', '')).report.results!.beta!;
    const some = block(levels(' ± 0.01', ' ± 0.1')).report.results!.beta!;
    close(some.value, none.value, 1e-12, 'β is the unweighted one');
    // The stated 0.1 on n = 0.368 alone gives |10 − 15|/500 × 0.1/0.368 = 2.7e-3 K⁻¹.
    assert.ok(some.uncertainty! >= (5 / 500) * (0.1 / 0.368) * 0.999, `u(β) = ${some.uncertainty}`);
    assert.ok(some.uncertainty! > 5 * none.uncertainty!, `${some.uncertainty} against ${none.uncertainty}`);
  });

  it('says nothing when every level, or none, states an uncertainty', () => {
    for (const body of [
      levels('', ''),
      levels(' ± 0.01', ' ± 0.01').replace('0.135 }', '0.135 ± 0.01 }').replace('0.0498 }', '0.0498 ± 0.002 }'),
    ]) {
      const r = block(body).report;
      assert.ok(!r.problems.some((x) => x.code === 'uncertainty-partial'), body);
    }
  });

  it('carries the stated u(I) of some lines into u(β) and the plot, with a note on a line without one', () => {
    const T = 10000;
    // Optically thin lines in LTE: I ∝ (g A/λ) e^(−E/kT) (Aguilera & Aragón, Spectrochim. Acta B 63, 893 (2008)).
    const I = BALMER.map(([nm, E, g, A]) => ((g * A) / nm) * Math.exp((-E * C2) / T));
    const items = BALMER.map(
      ([nm, E, g, A], i) =>
        `  - { wavelength: ${nm} nm, upper: ${E} cm-1, g: ${g}, A: ${A}, intensity: ${I[i]}${i === 0 || i === 2 ? ` ± ${0.05 * I[i]!}` : ''} }`,
    );
    const body = `wavelengths: vacuum\ndetector: energy\nlines:\n${items.join('\n')}`;
    const p = problem(body, 'uncertainty-partial');
    assert.match(p.message, /Only 2 of the 4 lines/);
    assert.ok(p.at.includes('486.2691'), p.at);
    const r = block(body).report.results!;
    close(r.temperature!.value, T, 1e-9, 'T');
    // The exact intensities leave no scatter: u(β) is the stated 5 % of Hα and Hγ through the slope.
    const x = BALMER.map(([, E]) => E * C2);
    const xm = x.reduce((s, v) => s + v, 0) / 4;
    const sxx = x.reduce((s, v) => s + (v - xm) ** 2, 0);
    const expected = Math.hypot(((x[0]! - xm) / sxx) * 0.05, ((x[2]! - xm) / sxx) * 0.05);
    close(r.beta!.uncertainty, expected, 1e-6, 'u(β)');
    close(r.trade.plot!.slope.uncertainty, expected, 1e-6, 'u(slope) of the plot');
    assert.deepEqual(
      r.trade.plot!.points.map((q) => q.uY !== null),
      [true, false, true, false],
    );
  });
});

/**
 * Straight-line least squares and the Boltzmann plot: ln(n_i/g_i) against E_i
 * is a line of slope −β for a population at one temperature.
 *
 * Sources: weighted linear least squares as in P. R. Bevington, D. K. Robinson,
 * Data Reduction and Error Analysis for the Physical Sciences, 3rd ed., McGraw-Hill
 * 2003, ch. 6 (chapter cited from memory); the Boltzmann-plot method as reviewed by J. A. Aguilera, C. Aragón,
 * Spectrochim. Acta B 63, 893–916 (2008); uncertainty propagation GUM (JCGM 100:2008)
 * §5.1.2. The χ² quantile comes from @stdlib/stats-base-dists-chisquare-quantile.
 *
 * Units: energies E/k in K, β in K⁻¹. Nothing here throws.
 */

import chisquareQuantile = require('@stdlib/stats-base-dists-chisquare-quantile');

/** Result of {@link weightedLineFit} for y = intercept + slope·x. */
export interface LineFit {
  readonly slope: number;
  readonly intercept: number;
  /** Standard uncertainty of the slope; null for an unweighted fit of two points (no scatter to estimate). */
  readonly uSlope: number | null;
  readonly uIntercept: number | null;
  /** Covariance of slope and intercept, same availability as the uncertainties. */
  readonly covariance: number | null;
  /** Σ((y − fit)/σ)² when weighted; the plain residual sum of squares when unweighted. */
  readonly chi2: number;
  /** Degrees of freedom n − 2. */
  readonly dof: number;
  /** y_i − (intercept + slope·x_i), in input order. */
  readonly residuals: number[];
  readonly weighted: boolean;
}

/**
 * Straight-line fit y = a + b·x by linear least squares.
 *
 * Weighted (sigma given): weights 1/σ_i², covariance matrix (XᵀWX)⁻¹, so the
 * uncertainties follow from the stated σ alone and χ² = Σ(r_i/σ_i)² tests them.
 * Unweighted (sigma null): all weights 1 and the uncertainties are estimated
 * from the residual scatter, covariance s²(XᵀX)⁻¹ with s² = Σr_i²/(n − 2); with
 * n = 2 there is no scatter to use and the uncertainties are null.
 * Sums are taken about the weighted mean of x for numerical stability.
 *
 * Domain: at least 2 points, equal lengths, finite x and y, every σ finite and
 * > 0. Returns null otherwise, when all x are equal (to rounding), and when the
 * sums overflow.
 */
export function weightedLineFit(x: readonly number[], y: readonly number[], sigma: readonly number[] | null): LineFit | null {
  const n = x.length;
  if (n < 2 || y.length !== n || (sigma !== null && sigma.length !== n)) return null;
  if (!x.every(Number.isFinite) || !y.every(Number.isFinite)) return null;
  if (sigma !== null && !sigma.every((s) => Number.isFinite(s) && s > 0)) return null;
  const w = x.map((_, i) => (sigma === null ? 1 : 1 / (sigma[i]! * sigma[i]!)));
  let sw = 0;
  let swx = 0;
  let swy = 0;
  for (let i = 0; i < n; i++) {
    sw += w[i]!;
    swx += w[i]! * x[i]!;
    swy += w[i]! * y[i]!;
  }
  if (!Number.isFinite(sw) || sw === 0) return null;
  const xm = swx / sw;
  const ym = swy / sw;
  let sxx = 0;
  let sxy = 0;
  let spread = 0;
  let xScale = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - xm;
    sxx += w[i]! * dx * dx;
    sxy += w[i]! * dx * (y[i]! - ym);
    spread = Math.max(spread, Math.abs(dx));
    xScale = Math.max(xScale, Math.abs(x[i]!));
  }
  if (!(sxx > 0) || !Number.isFinite(sxx) || spread <= 16 * Number.EPSILON * xScale) return null;
  const slope = sxy / sxx;
  const intercept = ym - slope * xm;
  const residuals = x.map((xi, i) => y[i]! - (intercept + slope * xi));
  const chi2 = residuals.reduce((acc, r, i) => acc + w[i]! * r * r, 0);
  // Overflow in the sums (values near the double range) makes the fit meaningless: no result.
  if (!Number.isFinite(slope) || !Number.isFinite(intercept) || !Number.isFinite(chi2)) return null;
  const dof = n - 2;
  // (XᵀWX)⁻¹ about the mean: var(b) = 1/Sxx, var(a) = 1/Sw + x̄²/Sxx, cov(a, b) = −x̄/Sxx.
  const factor = sigma !== null ? 1 : dof > 0 ? chi2 / dof : NaN;
  const finite = (v: number): number | null => (Number.isFinite(v) ? v : null);
  return {
    slope,
    intercept,
    uSlope: finite(Math.sqrt(factor / sxx)),
    uIntercept: finite(Math.sqrt(factor * (1 / sw + (xm * xm) / sxx))),
    covariance: finite((-factor * xm) / sxx),
    chi2,
    dof,
    residuals,
    weighted: sigma !== null,
  };
}

/**
 * Largest |residual| of ln(n/g) that still counts as consistent with one
 * temperature when no uncertainties are given: ln(1.05), i.e. every level within
 * 5 % (in population per degeneracy) of the fitted Boltzmann line. Common
 * practice, no source: chosen to pass rounded lab-note data (2–3 significant
 * digits) and flag clearly non-thermal distributions.
 */
export const RESIDUAL_TOLERANCE = Math.log(1.05);

/** Significance level of the χ² consistency test (docs/format.md, status rules). */
export const CHI2_SIGNIFICANCE = 0.01;

/** Critical values already computed, by degrees of freedom (a notebook uses a handful of level counts). */
const CHI2_CRITICAL = new Map<number, number>();

/**
 * The χ² quantile at 1 − {@link CHI2_SIGNIFICANCE} for `dof` degrees of freedom,
 * from @stdlib/stats-base-dists-chisquare-quantile; remembered per dof (at most
 * a thousand of them), because the quantile inverts the incomplete gamma
 * function and costs more than the fit it judges.
 */
function chi2Critical(dof: number): number {
  const known = CHI2_CRITICAL.get(dof);
  if (known !== undefined) return known;
  const q = chisquareQuantile(1 - CHI2_SIGNIFICANCE, dof);
  if (CHI2_CRITICAL.size < 1000) CHI2_CRITICAL.set(dof, q);
  return q;
}

/** Result of {@link boltzmannFit}. */
export interface BoltzmannFit {
  /** Inverse temperature β = −slope, K⁻¹. */
  readonly beta: number;
  /** Standard uncertainty of β (weighted: from the stated u(n); unweighted: from the scatter); null with 2 unweighted levels. */
  readonly uBeta: number | null;
  /** Intercept of ln(n/g) at E = 0, on the scale of the given populations. */
  readonly intercept: number;
  readonly chi2: number;
  readonly dof: number;
  /** χ²/dof, null when dof = 0. */
  readonly chi2PerDof: number | null;
  /** Indices (input order) of the levels used, and their residuals in ln(n/g). */
  readonly used: number[];
  readonly residuals: number[];
  /** Indices of levels with zero population, left out of the fit (the caller warns). */
  readonly excluded: number[];
  readonly weighted: boolean;
  /** Which consistency rule was applied. */
  readonly rule: 'chi2' | 'residual';
  /** χ² quantile at 1 − CHI2_SIGNIFICANCE for `dof` (weighted fits with dof ≥ 1), else null. */
  readonly chi2Limit: number | null;
  /** Whether the levels are consistent with one temperature (see {@link boltzmannFit}). */
  readonly consistent: boolean;
}

/**
 * Boltzmann plot: fits y_i = ln(n_i/g_i) against E_i; β = −slope and u(β) = u(slope).
 *
 * Weighting: σ_y = u(n_i)/n_i (first order, GUM §5.1.2) when every used level has
 * a positive finite u(n); otherwise the fit is unweighted.
 * Consistency: weighted fits use a χ² test at the 1 % level — not consistent when
 * χ² > χ²-quantile(0.99, dof); unweighted fits use the residual rule — not consistent
 * when any |residual| exceeds {@link RESIDUAL_TOLERANCE}. Two levels are always consistent.
 *
 * Levels with zero population are excluded (listed in `excluded`).
 * Domain: energies finite, populations finite and ≥ 0, degeneracies (null = all 1)
 * finite and > 0, equal lengths, at least two used levels at distinct energies.
 * Returns null otherwise.
 */
export function boltzmannFit(
  energiesK: readonly number[],
  populations: readonly number[],
  degeneracies: readonly number[] | null,
  uPopulations: ReadonlyArray<number | null | undefined> | null,
): BoltzmannFit | null {
  const n = energiesK.length;
  if (populations.length !== n || (degeneracies !== null && degeneracies.length !== n)) return null;
  if (uPopulations !== null && uPopulations.length !== n) return null;
  const used: number[] = [];
  const excluded: number[] = [];
  for (let i = 0; i < n; i++) {
    const p = populations[i]!;
    const g = degeneracies === null ? 1 : degeneracies[i]!;
    if (!Number.isFinite(energiesK[i]!) || !Number.isFinite(p) || p < 0 || !Number.isFinite(g) || g <= 0) return null;
    (p === 0 ? excluded : used).push(i);
  }
  const x = used.map((i) => energiesK[i]!);
  const y = used.map((i) => Math.log(populations[i]!) - Math.log(degeneracies === null ? 1 : degeneracies[i]!));
  const sigmas = used.map((i) => {
    const u = uPopulations === null ? null : uPopulations[i];
    return u === null || u === undefined ? NaN : u / populations[i]!;
  });
  const weighted = sigmas.length > 0 && sigmas.every((s) => Number.isFinite(s) && s > 0);
  const line = weightedLineFit(x, y, weighted ? sigmas : null);
  if (line === null) return null;
  const chi2Limit = weighted && line.dof >= 1 ? chi2Critical(line.dof) : null;
  const consistent = weighted
    ? chi2Limit === null || !(line.chi2 > chi2Limit)
    : line.residuals.every((r) => Math.abs(r) <= RESIDUAL_TOLERANCE);
  return {
    beta: -line.slope + 0,
    uBeta: line.uSlope,
    intercept: line.intercept,
    chi2: line.chi2,
    dof: line.dof,
    chi2PerDof: line.dof > 0 ? line.chi2 / line.dof : null,
    used,
    residuals: line.residuals,
    excluded,
    weighted,
    rule: weighted ? 'chi2' : 'residual',
    chi2Limit,
    consistent,
  };
}

/**
 * Up to this many levels every pair is compared (n(n − 1)/2 comparisons, about
 * 20 000 at most); beyond it only neighbours in energy, so that a huge block costs
 * O(n log n) work and yields a bounded list instead of O(n²) pairs.
 */
export const ALL_PAIRS_LIMIT = 200;

/** Two levels, by index in the input arrays; `lower` has the lower energy. */
export interface LevelPair {
  readonly lower: number;
  readonly upper: number;
}

/**
 * Population-inverted pairs: pairs of levels at different energies where the upper
 * level holds more population per degeneracy than the lower, n_u/g_u > n_l/g_l
 * (equivalently, a negative excitation temperature for that transition).
 *
 * Levels are sorted by energy (input order breaks ties) and the pairs are listed in
 * that order; indices refer to the input arrays. All pairs are compared when there
 * are at most {@link ALL_PAIRS_LIMIT} levels, only adjacent ones (skipping equal
 * energies) beyond. Levels with zero population take part (an empty lower level under
 * a populated upper one is inverted). Invalid input (lengths differ, non-finite
 * energies, negative or non-finite populations, degeneracies not > 0) gives [].
 */
export function invertedPairs(
  energiesK: readonly number[],
  populations: readonly number[],
  degeneracies: readonly number[] | null,
): LevelPair[] {
  const n = energiesK.length;
  if (populations.length !== n || (degeneracies !== null && degeneracies.length !== n)) return [];
  for (let i = 0; i < n; i++) {
    const g = degeneracies === null ? 1 : degeneracies[i]!;
    if (!Number.isFinite(energiesK[i]!) || !Number.isFinite(populations[i]!) || populations[i]! < 0) return [];
    if (!Number.isFinite(g) || g <= 0) return [];
  }
  const order = energiesK.map((_, i) => i).sort((a, b) => energiesK[a]! - energiesK[b]! || a - b);
  const perState = (i: number): number => populations[i]! / (degeneracies === null ? 1 : degeneracies[i]!);
  const pairs: LevelPair[] = [];
  const inverted = (lo: number, hi: number): void => {
    if (energiesK[hi]! > energiesK[lo]! && perState(hi) > perState(lo)) pairs.push({ lower: lo, upper: hi });
  };
  if (n <= ALL_PAIRS_LIMIT) {
    for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) inverted(order[a]!, order[b]!);
  } else {
    for (let a = 0; a + 1 < n; a++) {
      let b = a + 1;
      while (b < n && energiesK[order[b]!]! === energiesK[order[a]!]!) b++;
      if (b < n) inverted(order[a]!, order[b]!);
    }
  }
  return pairs;
}

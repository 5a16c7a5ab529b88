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

import { partlyStatedLineFit, weightedLineFit } from './lineFit';

export { partlyStatedLineFit, weightedLineFit, type LineFit } from './lineFit';

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
  /**
   * Standard uncertainty of β: weighted, from the stated u(n); unweighted, from the scatter; partly stated,
   * from the stated u(n) and the scatter they leave unexplained ({@link partlyStatedLineFit}). Null with two
   * unweighted levels and no stated uncertainty.
   */
  readonly uBeta: number | null;
  /** Intercept of ln(n/g) at E = 0, on the scale of the given populations. */
  readonly intercept: number;
  /** Standard uncertainty of the intercept and its covariance with the slope (= −β), same availability as uBeta. */
  readonly uIntercept: number | null;
  readonly covariance: number | null;
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
  /** How many used levels state an uncertainty u(n) > 0: all of them when weighted, some or none otherwise. */
  readonly stated: number;
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
 * a positive finite u(n); otherwise the fit is unweighted. When only some levels
 * state u(n), the weights of the others are unknown, so the value is still the
 * unweighted line, but u(β) propagates the stated σ_y through it together with
 * the scatter they leave unexplained ({@link partlyStatedLineFit}): every stated
 * uncertainty enters (GUM §5.1.2), none is dropped for want of the others.
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
  const stated = sigmas.filter((s) => Number.isFinite(s) && s > 0).length;
  const weighted = sigmas.length > 0 && stated === sigmas.length;
  const line =
    stated > 0 && !weighted
      ? partlyStatedLineFit(
          x,
          y,
          sigmas.map((s) => (Number.isFinite(s) && s > 0 ? s : null)),
        )
      : weightedLineFit(x, y, weighted ? sigmas : null);
  if (line === null) return null;
  const chi2Limit = weighted && line.dof >= 1 ? chi2Critical(line.dof) : null;
  const consistent = weighted
    ? chi2Limit === null || !(line.chi2 > chi2Limit)
    : line.residuals.every((r) => Math.abs(r) <= RESIDUAL_TOLERANCE);
  return {
    beta: -line.slope + 0,
    uBeta: line.uSlope,
    intercept: line.intercept,
    uIntercept: line.uIntercept,
    covariance: line.covariance,
    chi2: line.chi2,
    dof: line.dof,
    chi2PerDof: line.dof > 0 ? line.chi2 / line.dof : null,
    used,
    residuals: line.residuals,
    excluded,
    weighted,
    stated,
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

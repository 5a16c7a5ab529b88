/**
 * A single transition between two levels: inverse temperature, polarization
 * and the populations they imply.
 *
 * Conventions (docs/format.md, "Conventions"): levels are ordered by energy,
 * "lower" and "upper" always mean energy, energies and gaps are E/k in kelvin
 * and β = 1/T is in K⁻¹. β is what is computed and propagated because it stays
 * finite and smooth through saturation (T = ±∞). Uncertainties are standard
 * uncertainties propagated to first order with the law of propagation of
 * uncertainty for uncorrelated inputs (GUM, JCGM 100:2008, §5.1.2, eq. (10)).
 *
 * Nothing here throws: an undefined result is `null`.
 */

import type { Measured } from '../types';

/** Standard uncertainties of the inputs of {@link betaFromPopulations}; a missing entry counts as exact. */
export interface TwoLevelUncertainties {
  readonly nLower?: number | null;
  readonly nUpper?: number | null;
  readonly gap?: number | null;
}

/** Normalised populations of a two-level system (fractions that add up to 1). */
export interface TwoLevelPopulations {
  readonly lower: number;
  readonly upper: number;
}

/** True for a finite number > 0. */
function positive(x: number): boolean {
  return Number.isFinite(x) && x > 0;
}

/**
 * First-order combined standard uncertainty √Σ(cᵢ uᵢ)² (GUM §5.1.2) from
 * sensitivity coefficients cᵢ and uncertainties uᵢ. Inputs whose uncertainty is
 * absent count as exact. Returns null when no input carries an uncertainty,
 * when an uncertainty is negative or not finite, or when the result is not finite.
 */
function combine(terms: ReadonlyArray<readonly [number, number | null | undefined]>): number | null {
  let given = false;
  const parts: number[] = [];
  for (const [c, u] of terms) {
    if (u === null || u === undefined) continue;
    if (!Number.isFinite(u) || u < 0) return null;
    given = true;
    if (u > 0) parts.push(Math.abs(c * u));
  }
  if (!given) return null;
  // Math.hypot scales internally, so huge or tiny contributions neither overflow nor underflow.
  const result = Math.hypot(...parts);
  return Number.isFinite(result) ? result : null;
}

/**
 * Inverse temperature from the populations of two levels,
 * β = ln[(n_l/g_l)/(n_u/g_u)] / ΔE (Boltzmann distribution n_u/n_l = (g_u/g_l)·e^(−βΔE)).
 *
 * Units: populations on any common scale (only their ratio matters), gap ΔE = E_u − E_l
 * as E/k in K, β in K⁻¹. Negative β means an inverted pair (negative spin or
 * excitation temperature).
 *
 * Uncertainty (GUM §5.1.2): sensitivities ∂β/∂n_l = 1/(n_l ΔE), ∂β/∂n_u = −1/(n_u ΔE),
 * ∂β/∂ΔE = −β/ΔE; `uncertainty` is null when no input carries one.
 *
 * Domain: returns null when either population is 0 (β would be ±∞: T → 0, which the
 * caller reports), when a population is negative or not finite, when a degeneracy is
 * not a finite positive number, or when the gap is not finite and > 0.
 */
export function betaFromPopulations(
  nLower: number,
  nUpper: number,
  gLower: number,
  gUpper: number,
  gapK: number,
  u?: TwoLevelUncertainties,
): Measured | null {
  if (!positive(nLower) || !positive(nUpper) || !positive(gLower) || !positive(gUpper) || !positive(gapK)) {
    return null;
  }
  // Logarithms taken separately so that extreme ratios neither overflow nor underflow.
  const value = (Math.log(nLower) - Math.log(gLower) - Math.log(nUpper) + Math.log(gUpper)) / gapK;
  if (!Number.isFinite(value)) return null;
  const uncertainty = combine([
    [1 / (nLower * gapK), u?.nLower],
    [-1 / (nUpper * gapK), u?.nUpper],
    [-value / gapK, u?.gap],
  ]);
  return { value: value + 0, uncertainty };
}

/**
 * Two-level polarization P = (n_l − n_u)/(n_l + n_u), positive at positive
 * temperature whatever the sign of γ (docs/format.md, "Conventions").
 *
 * Uncertainty (GUM §5.1.2): ∂P/∂n_l = 2n_u/(n_l + n_u)², ∂P/∂n_u = −2n_l/(n_l + n_u)².
 *
 * Domain: populations finite and ≥ 0, not both 0; otherwise null. Any common scale.
 */
export function polarizationFromPopulations(
  nLower: number,
  nUpper: number,
  u?: { readonly nLower?: number | null; readonly nUpper?: number | null },
): Measured | null {
  if (!Number.isFinite(nLower) || !Number.isFinite(nUpper) || nLower < 0 || nUpper < 0) return null;
  const s = Math.max(nLower, nUpper);
  if (s === 0) return null;
  // Work in units of the larger population so the sum cannot overflow.
  const a = nLower / s;
  const b = nUpper / s;
  const sum = a + b;
  const value = (a - b) / sum;
  const uncertainty = combine([
    [(2 * b) / (sum * sum * s), u?.nLower],
    [(-2 * a) / (sum * sum * s), u?.nUpper],
  ]);
  return { value: value + 0, uncertainty };
}

/**
 * Inverse temperature of a two-level system from its polarization P, using
 * n_l/n_u = (1 + P)/(1 − P): β = [2 artanh P + ln(g_u/g_l)] / ΔE
 * (for g_l = g_u this is the spin-1/2 relation T_s = ΔE/(2 artanh P)).
 *
 * Units: ΔE as E/k in K, β in K⁻¹. Uncertainty (GUM §5.1.2):
 * ∂β/∂P = 2/[(1 − P²)ΔE], ∂β/∂ΔE = −β/ΔE; null when neither uP nor uGap is given.
 *
 * Domain: |P| < 1 (P = ±1 means T → 0±: null), degeneracies finite and > 0,
 * gap finite and > 0; otherwise null.
 */
export function betaFromTwoLevelPolarization(
  p: number,
  gLower: number,
  gUpper: number,
  gapK: number,
  uP?: number | null,
  uGap?: number | null,
): Measured | null {
  if (!Number.isFinite(p) || Math.abs(p) >= 1) return null;
  if (!positive(gLower) || !positive(gUpper) || !positive(gapK)) return null;
  const value = (2 * Math.atanh(p) + Math.log(gUpper) - Math.log(gLower)) / gapK;
  if (!Number.isFinite(value)) return null;
  // (1 − P)(1 + P) rather than 1 − P² keeps precision close to |P| = 1.
  const uncertainty = combine([
    [2 / ((1 - p) * (1 + p) * gapK), uP],
    [-value / gapK, uGap],
  ]);
  return { value: value + 0, uncertainty };
}

/**
 * Normalised Boltzmann populations of two levels at inverse temperature β:
 * n_u/n_l = (g_u/g_l)·e^(−βΔE), n_l + n_u = 1.
 *
 * Computed as logistic functions of z = ln(g_u/g_l) − βΔE, so any sign and
 * magnitude of β is safe: β = +∞ puts everything in the lower level, β = −∞ in
 * the upper one, β = 0 gives g-weighted populations.
 *
 * Units: β in K⁻¹, ΔE as E/k in K. Domain: β not NaN, degeneracies finite and
 * > 0, gap finite and > 0; otherwise null.
 */
export function populationsFromBeta(
  beta: number,
  gLower: number,
  gUpper: number,
  gapK: number,
): TwoLevelPopulations | null {
  if (Number.isNaN(beta) || !positive(gLower) || !positive(gUpper) || !positive(gapK)) return null;
  const z = Math.log(gUpper) - Math.log(gLower) - beta * gapK;
  if (Number.isNaN(z)) return null;
  const upper = 1 / (1 + Math.exp(-z));
  const lower = 1 / (1 + Math.exp(z));
  return { lower, upper };
}

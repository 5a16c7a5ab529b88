/**
 * Spin I in a field: the Brillouin function and the vector polarization
 * ⟨I_z⟩/I of Zeeman levels E_m = −m·ΔE (m = −I … I, ΔE > 0 the level spacing
 * as E/k in K) under a spin temperature.
 *
 * Formula: B_J(x) = ((2J+1)/2J)·coth((2J+1)x/2J) − (1/2J)·coth(x/2J)
 * (C. Kittel, Introduction to Solid State Physics, 8th ed., Wiley 2005, ch. 11;
 * A. Abragam, The Principles of Nuclear Magnetism, Oxford 1961). For the
 * Boltzmann distribution over the Zeeman levels, ⟨I_z⟩/I = B_I(I·y) with y = β·ΔE;
 * I = 1/2 gives tanh(y/2). Sign convention (docs/format.md): P > 0 at positive
 * temperature, whatever the sign of γ.
 *
 * Nothing here throws: an undefined result is `null`.
 */

import type { Measured } from '../types';

/**
 * Langevin function L(u) = coth u − 1/u, without the cancellation of the two
 * terms near u = 0: Lambert's continued fraction u/(3 + u²/(5 + u²/(7 + …)))
 * below |u| = 2 (all terms positive; 20 levels reach double precision there),
 * coth u = 1 + 2/expm1(2u) above. Odd in u; L(±∞) = ±1.
 */
function langevin(u: number): number {
  const a = Math.abs(u);
  let r: number;
  if (a < 2) {
    const u2 = a * a;
    let tail = 41;
    for (let k = 19; k >= 1; k--) tail = 2 * k + 1 + u2 / tail;
    r = a / tail;
  } else {
    r = 1 + 2 / Math.expm1(2 * a) - 1 / a;
  }
  return u < 0 ? -r : r;
}

/**
 * Derivative L′(u) = 1/u² − 1/sinh²u: Taylor series 1/3 − u²/15 + 2u⁴/189 −
 * 7u⁶/4725 + 18u⁸/93555 (relative truncation error < 1e-13) below |u| = 0.25,
 * the closed form above (1/sinh² underflows harmlessly to 0 for large u).
 */
function langevinDerivative(u: number): number {
  const a = Math.abs(u);
  if (a < 0.25) {
    const v = a * a;
    return 1 / 3 + v * (-1 / 15 + v * (2 / 189 + v * (-7 / 4725 + v * (18 / 93555))));
  }
  const s = Math.sinh(a);
  return 1 / (a * a) - 1 / (s * s);
}

/** True when 2J is a positive integer no larger than 2^31 (a physical spin). */
function isSpin(j: number): boolean {
  return Number.isFinite(j) && j > 0 && Number.isInteger(2 * j) && j <= 2 ** 30;
}

/**
 * Brillouin function B_J(x), dimensionless, in (−1, 1).
 *
 * Method: with a = (2J+1)/2J and b = 1/2J, coth t = L(t) + 1/t turns the defining
 * formula into B_J(x) = a·L(a x) − b·L(b x) (L the Langevin function), in which the
 * 1/x poles cancel exactly; L is evaluated by a continued fraction for small
 * arguments and by coth for large ones. For |x| ≥ 4J (both coth arguments ≥ 2)
 * B_J = ±[1 + 2a/expm1(2a|x|) − 2b/expm1(2b|x|)], which keeps 1 − |B_J| accurate.
 * The result has full relative precision at small x (B_J(x) ≈ (J+1)x/3J),
 * saturates to exactly ±1 for large |x|, and is odd in x.
 *
 * Domain: J > 0 (any real; the spin case is J = 1/2, 1, 3/2, …), x any number
 * including ±∞. Returns null for NaN x, J not finite and > 0, or J so small that
 * 1/2J overflows.
 */
export function brillouin(j: number, x: number): number | null {
  if (!Number.isFinite(j) || j <= 0 || Number.isNaN(x)) return null;
  const b = 0.5 / j;
  const a = 1 + b; // (2J+1)/2J without overflowing 2J
  if (!Number.isFinite(b)) return null;
  if (!Number.isFinite(x)) return x > 0 ? 1 : -1;
  const t = Math.abs(x);
  if (b * t < 2) return a * langevin(a * x) - b * langevin(b * x) + 0;
  // Both coth arguments ≥ 2: with coth u = 1 + 2/expm1(2u) and a − b = 1 the 1/x terms cancel
  // exactly, leaving 1 minus exponentially small terms (exactly ±1 once they underflow).
  const r = 1 + (2 * a) / Math.expm1(2 * a * t) - (2 * b) / Math.expm1(2 * b * t);
  return x < 0 ? -r : r;
}

/** dB_J/dx = a²L′(a x) − b²L′(b x), same a, b as {@link brillouin}; finite for all x. */
function brillouinDerivative(j: number, x: number): number {
  const b = 0.5 / j;
  const a = 1 + b;
  return a * a * langevinDerivative(a * x) - b * b * langevinDerivative(b * x);
}

/**
 * Vector polarization P = ⟨I_z⟩/I of spin I at y = β·ΔE, i.e. P = B_I(I·y)
 * (exact for a Boltzmann distribution over E_m = −m·ΔE).
 *
 * Units: y dimensionless (β in K⁻¹ times the spacing ΔE in K). Domain: I a
 * positive multiple of 1/2, y any number (y < 0: negative temperature, P < 0).
 * Returns null otherwise.
 */
export function spinPolarization(spin: number, y: number): number | null {
  if (!isSpin(spin) || Number.isNaN(y)) return null;
  return brillouin(spin, spin * y);
}

/**
 * Vector polarization ⟨I_z⟩/I from measured populations of the 2I + 1 Zeeman
 * levels listed in order of increasing energy (index k has m = I − k):
 * P = Σ n_k (I − k) / (I Σ n_k). For two levels this is (n_l − n_u)/(n_l + n_u).
 *
 * Uncertainty (GUM §5.1.2), when `uPopulations` is given:
 * ∂P/∂n_k = [(I − k) − I·P] / (I Σ n), missing entries counting as exact.
 *
 * Domain: at least two populations, all finite and ≥ 0, not all 0; any common
 * scale. Returns null otherwise.
 */
export function spinPolarizationFromPopulations(
  populations: readonly number[],
  uPopulations?: ReadonlyArray<number | null | undefined> | null,
): Measured | null {
  const n = populations.length;
  if (n < 2) return null;
  let max = 0;
  for (const p of populations) {
    if (!Number.isFinite(p) || p < 0) return null;
    max = Math.max(max, p);
  }
  if (max === 0) return null;
  const spin = (n - 1) / 2;
  let sum = 0;
  let moment = 0;
  for (let k = 0; k < n; k++) {
    const p = populations[k]! / max; // scaled: sums cannot overflow
    sum += p;
    moment += p * (spin - k);
  }
  const value = moment / (spin * sum) + 0;
  // (I − k) − I·P = Σ_j (j − k)·n_j/Σn = A − k = (n − 1 − k) − B, with A = Σ j·n_j/Σn the mean distance from
  // the lowest level and B that from the highest. Both are sums of terms ≥ 0; taking the smaller one keeps
  // the coefficient of the most populated level exact near |P| = 1, where (I − k) − I·P cancels to 0.
  let fromLowest = 0;
  let fromHighest = 0;
  for (let j = 0; j < n; j++) {
    const p = populations[j]! / max / sum;
    fromLowest += j * p;
    fromHighest += (n - 1 - j) * p;
  }
  const offset = (k: number): number => (fromLowest <= fromHighest ? fromLowest - k : n - 1 - k - fromHighest);
  let given = false;
  const parts: number[] = [];
  for (let k = 0; k < n && uPopulations; k++) {
    const u = uPopulations[k];
    if (u === null || u === undefined) continue;
    if (!Number.isFinite(u) || u < 0) return { value, uncertainty: null };
    given = true;
    parts.push((Math.abs(offset(k)) / (spin * sum)) * (u / max));
  }
  const uncertainty = given ? Math.hypot(...parts) : null;
  return { value, uncertainty: uncertainty !== null && Number.isFinite(uncertainty) ? uncertainty : null };
}

/**
 * Solve B_J(x) = p for x ≥ 0 with 0 ≤ p < 1. B_J is increasing and concave on
 * x ≥ 0 with slope (J+1)/3J at 0, so x ≥ p·3J/(J+1) is a lower bracket; the upper
 * bracket is found by doubling. Newton steps are kept inside the bracket and
 * replaced by bisection when they leave it, so the loop always converges.
 */
function inverseBrillouin(j: number, p: number): number {
  if (p === 0) return 0;
  let lo = (p * 3 * j) / (j + 1);
  let hi = Math.max(2 * lo, 1);
  for (let i = 0; i < 2100 && (brillouin(j, hi) as number) < p; i++) {
    lo = hi;
    hi *= 2;
  }
  let x = lo;
  for (let i = 0; i < 200; i++) {
    const f = (brillouin(j, x) as number) - p;
    if (f === 0) return x;
    if (f < 0) lo = x;
    else hi = x;
    const d = brillouinDerivative(j, x);
    let next = x - f / d;
    if (!(next > lo && next < hi)) next = lo + (hi - lo) / 2;
    if (next === x || hi - lo <= 4 * Number.EPSILON * hi) return next;
    x = next;
  }
  return x;
}

/**
 * Inverse temperature of spin I from its vector polarization P = ⟨I_z⟩/I, by
 * inverting P = B_I(I·β·ΔE) (Newton iteration safeguarded by bisection).
 *
 * Units: spacing ΔE between adjacent Zeeman levels as E/k in K, β in K⁻¹.
 * Uncertainty: u(β) = u(P)/|dP/dβ| with dP/dβ = I·ΔE·B_I′(I·β·ΔE) (GUM §5.1.2,
 * first order); null when uP is absent or dP/dβ underflows to 0 (deep saturation).
 *
 * Domain: I a positive multiple of 1/2, −1 < P < 1, spacing finite and > 0;
 * otherwise null (P = ±1 means T → 0±).
 */
export function betaFromSpinPolarization(
  spin: number,
  p: number,
  spacingK: number,
  uP?: number | null,
): Measured | null {
  if (!isSpin(spin) || !Number.isFinite(p) || Math.abs(p) >= 1) return null;
  if (!Number.isFinite(spacingK) || spacingK <= 0) return null;
  const x = inverseBrillouin(spin, Math.abs(p));
  const value = (p < 0 ? -x : x) / (spin * spacingK) + 0;
  if (!Number.isFinite(value)) return null;
  let uncertainty: number | null = null;
  if (uP !== null && uP !== undefined && Number.isFinite(uP) && uP >= 0) {
    const slope = spin * spacingK * brillouinDerivative(spin, x);
    const u = uP === 0 ? 0 : uP / slope;
    uncertainty = Number.isFinite(u) ? u : null;
  }
  return { value, uncertainty };
}

/**
 * Thermal-equilibrium vector polarization of spin I at a (lattice) temperature
 * T > 0: P = B_I(I·ΔE/T); I = 1/2 gives tanh(ΔE/2T), the high-temperature limit
 * is (I+1)ΔE/3T.
 *
 * Units: spacing ΔE as E/k in K, T in K. Domain: I a positive multiple of 1/2,
 * spacing finite and > 0, T > 0 (T = +∞ gives 0); otherwise null.
 */
export function thermalSpinPolarization(spin: number, spacingK: number, temperatureK: number): number | null {
  if (!isSpin(spin) || !Number.isFinite(spacingK) || spacingK <= 0) return null;
  if (Number.isNaN(temperatureK) || temperatureK <= 0) return null;
  return spinPolarization(spin, spacingK / temperatureK);
}

/**
 * N independent two-level systems with gap ε (E/k in K), m of them excited:
 * U = mε, microcanonical entropy S = k ln C(N, m), and a finite-N inverse
 * temperature from differences of ln C.
 *
 * Sources: multiplicity Ω = C(N, m) of the two-state system and 1/T = ∂S/∂U
 * (D. V. Schroeder, An Introduction to Thermal Physics, Addison Wesley Longman
 * 2000, §2.1 and ch. 3; C. Kittel, H. Kroemer, Thermal Physics, 2nd ed., Freeman
 * 1980, ch. 1–2). ln C(N, m) from @stdlib/math-base-special-binomcoefln.
 *
 * Nothing here throws: invalid input gives `null`.
 */

import binomcoefln = require('@stdlib/math-base-special-binomcoefln');

/**
 * Natural logarithm of the binomial coefficient C(N, m), the entropy S/k of N
 * two-level systems with m excited.
 *
 * Method: @stdlib/math-base-special-binomcoefln (log-gamma based, well kept
 * and tested upstream); relative error near 1e-16 against exact BigInt
 * binomials up to N = 5000 (see the tests), symmetric in m ↔ N − m.
 *
 * Domain: integers 0 ≤ m ≤ N ≤ 2^53 − 1; otherwise null.
 */
export function lnBinomial(n: number, m: number): number | null {
  if (!Number.isSafeInteger(n) || !Number.isSafeInteger(m) || m < 0 || m > n) return null;
  const k = Math.min(m, n - m);
  if (k === 0) return 0;
  const v = binomcoefln(n, k);
  return Number.isFinite(v) ? v : null;
}

/** Upper bound on maxPoints, so that a setting cannot ask for unbounded work. */
export const MAX_FINITE_N_POINTS = 100000;

/** One point of the finite-N curve. */
export interface FiniteNPoint {
  /** Number of excited systems. */
  readonly m: number;
  /** U/N = mε/N, K (E/k) per system. */
  readonly energy: number;
  /** S/(Nk) = ln C(N, m)/N. */
  readonly entropy: number;
  /** Finite-N inverse temperature, K⁻¹ (see {@link finiteNCurve}). */
  readonly beta: number;
}

/**
 * Finite-difference inverse temperature at m, in K⁻¹: the central difference
 * [ln C(N, m+1) − ln C(N, m−1)]/(2ε) inside, the forward difference
 * [ln C(N, 1) − ln C(N, 0)]/ε = ln N/ε at m = 0 and the backward one (−ln N/ε)
 * at m = N. Computed from the exact ratios C(N, m+1)/C(N, m) = (N−m)/(m+1), so no
 * cancellation between large logarithms occurs; m > N/2 is mirrored so that
 * β(N − m) = −β(m) and β(N/2) = 0 hold exactly.
 */
function finiteBeta(n: number, m: number, gapK: number): number {
  if (2 * m === n) return 0;
  if (2 * m > n) return -finiteBeta(n, n - m, gapK); // mirror: exact antisymmetry β(N − m) = −β(m)
  if (m === 0) return Math.log(n) / gapK;
  // ln((N−m)/(m+1)) + ln((N−m+1)/m) as log1p of exact integer differences: full relative precision near N/2.
  return (Math.log1p((n - 2 * m - 1) / (m + 1)) + Math.log1p((n - 2 * m + 1) / m)) / (2 * gapK);
}

/** The m values to sample: all of them, or a grid symmetric under m → N − m that includes 0, ⌊N/2⌋, ⌈N/2⌉ and N. */
function sampleCounts(n: number, maxPoints: number): number[] {
  if (n + 1 <= maxPoints) return Array.from({ length: n + 1 }, (_, m) => m);
  // An even number of steps puts ⌊N/2⌋ on the grid; an odd N adds ⌈N/2⌉ as one extra point.
  let steps = maxPoints - 1 - (n % 2);
  if (steps % 2 === 1) steps -= 1;
  const counts = new Set<number>();
  for (let i = 0; i <= steps; i++) {
    counts.add(2 * i <= steps ? Math.floor((i * n) / steps) : n - Math.floor(((steps - i) * n) / steps));
  }
  counts.add(Math.floor(n / 2));
  counts.add(Math.ceil(n / 2));
  return [...counts].sort((a, b) => a - b);
}

/**
 * Entropy and inverse temperature of N two-level systems with gap ε as a function
 * of the energy per system, S/(Nk) = ln C(N, m)/N at U/N = mε/N.
 *
 * β uses the central difference of ln C over two steps of m divided by 2ε — the
 * definition the docs state, exact for the slope of the chord through m ± 1 and
 * symmetric (β(N − m) = −β(m), β(N/2) = 0); at the ends, where one neighbour is
 * missing, the one-sided forward (m = 0) or backward (m = N) difference over one step.
 *
 * Sampling: every m when N + 1 ≤ maxPoints (default 2001, clamped to 4 … {@link MAX_FINITE_N_POINTS}), else an even
 * stride that always contains m = 0, the N/2 region and m = N, at most maxPoints
 * points; cost O(points), so N up to 2^53 − 1 is fine.
 *
 * Domain: integer N ≥ 1, gap finite and > 0; otherwise null.
 */
export function finiteNCurve(n: number, gapK: number, opts?: { readonly maxPoints?: number }): FiniteNPoint[] | null {
  if (!Number.isSafeInteger(n) || n < 1 || !Number.isFinite(gapK) || gapK <= 0) return null;
  const requested = opts?.maxPoints;
  const maxPoints =
    requested !== undefined && Number.isFinite(requested)
      ? Math.min(MAX_FINITE_N_POINTS, Math.max(4, Math.floor(requested)))
      : 2001;
  return sampleCounts(n, maxPoints).map((m) => ({
    m,
    energy: (m * gapK) / n,
    entropy: (lnBinomial(n, m) as number) / n,
    beta: finiteBeta(n, m, gapK) + 0,
  }));
}

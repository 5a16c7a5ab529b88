/**
 * Straight-line least squares, y = a + b·x, weighted or not: the Boltzmann plot
 * (fit.ts) and the start of the decay fit (relaxation.ts) use it. Sources:
 * weighted linear least squares as in P. R. Bevington, D. K. Robinson, Data
 * Reduction and Error Analysis for the Physical Sciences, 3rd ed., McGraw-Hill
 * 2003, ch. 6 (chapter cited from memory). It imports no package, so every
 * bundle and module target can take it. Nothing here throws.
 */

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
 * Sums are taken about the weighted mean of x, and y from its first value, for numerical stability.
 *
 * Domain: at least 2 points, equal lengths, finite x and y, every σ finite and
 * > 0. Returns null otherwise, when all x are equal (to rounding), and when the
 * sums overflow.
 */
export function weightedLineFit(
  x: readonly number[],
  y: readonly number[],
  sigma: readonly number[] | null,
): LineFit | null {
  const n = x.length;
  if (n < 2 || y.length !== n || (sigma !== null && sigma.length !== n)) return null;
  if (!x.every(Number.isFinite) || !y.every(Number.isFinite)) return null;
  if (sigma !== null && !sigma.every((s) => Number.isFinite(s) && s > 0)) return null;
  const w = x.map((_, i) => (sigma === null ? 1 : 1 / (sigma[i]! * sigma[i]!)));
  // y is taken from its first value: equal y (equal populations per degeneracy, T = ±∞) then give a slope of
  // exactly 0 rather than the rounding of their mean (β = 5e-30, T = 2e29 K), and large y with a small spread
  // keep their digits.
  const y0 = y[0]!;
  const yr = y.map((yi) => yi - y0);
  let sw = 0;
  let swx = 0;
  let swy = 0;
  for (let i = 0; i < n; i++) {
    sw += w[i]!;
    swx += w[i]! * x[i]!;
    swy += w[i]! * yr[i]!;
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
    sxy += w[i]! * dx * (yr[i]! - ym);
    spread = Math.max(spread, Math.abs(dx));
    xScale = Math.max(xScale, Math.abs(x[i]!));
  }
  if (!(sxx > 0) || !Number.isFinite(sxx) || spread <= 16 * Number.EPSILON * xScale) return null;
  const slope = sxy / sxx;
  const shifted = ym - slope * xm;
  const intercept = shifted + y0;
  const residuals = x.map((xi, i) => yr[i]! - (shifted + slope * xi));
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

/** Result of {@link partlyStatedLineFit}: an unweighted line with uncertainties that include the stated u(y). */
export interface PartlyStatedFit extends LineFit {
  /**
   * The variance of y beyond the stated uncertainties that the residual
   * scatter calls for, given to every point (0 when the stated ones explain
   * the scatter, and with two points, which leave no scatter to judge).
   */
  readonly excessVariance: number;
}

/**
 * Straight-line fit y = a + b·x when only some points state a standard
 * uncertainty u_i of y (the others state none).
 *
 * Weights are unknown for the points without u, so the line itself is the
 * unweighted least-squares line (equal weights), and its uncertainties come
 * from the law of propagation (JCGM 100:2008 §5.1.2) applied to that linear
 * estimator: b = Σ c_i y_i with c_i = (x_i − x̄)/S_xx, a = Σ d_i y_i with
 * d_i = 1/n − x̄ c_i, so u²(b) = Σ c_i² V_i, u²(a) = Σ d_i² V_i and
 * cov(a, b) = Σ c_i d_i V_i, where V_i is the variance of point i.
 *
 * V_i = u_i² + s₀² (u_i = 0 where none is stated): the stated uncertainty plus
 * an excess variance s₀², common to all points, for whatever the stated ones do
 * not cover (the additive "excess variance" model of interlaboratory
 * evaluations, e.g. R. C. Paule, J. Mandel, J. Res. NBS 87, 377 (1982), cited
 * from memory). s₀² is estimated by moments: for independent errors the
 * residual sum of squares has expectation Σ(1 − h_ii)V_i with leverages
 * h_ii = 1/n + (x_i − x̄)²/S_xx (linear-model algebra, from memory), so
 * s₀² = max(0, (RSS − Σ(1 − h_ii)u_i²)/(n − 2)). Without stated uncertainties
 * this is the usual s² = RSS/(n − 2) of {@link weightedLineFit}; when the
 * stated ones explain the scatter, s₀² = 0 and only they count. Scatter the
 * stated ones already explain is thus not counted twice. With two points
 * (n − 2 = 0) s₀² is 0: the points without u count as exact, as in the
 * two-level formula.
 *
 * Domain: as {@link weightedLineFit} unweighted; `stated` has one entry per
 * point, null (or 0) where none is stated, else finite and > 0. Returns null
 * otherwise.
 */
export function partlyStatedLineFit(
  x: readonly number[],
  y: readonly number[],
  stated: ReadonlyArray<number | null>,
): PartlyStatedFit | null {
  const n = x.length;
  if (stated.length !== n) return null;
  if (!stated.every((u) => u === null || (Number.isFinite(u) && u >= 0))) return null;
  const line = weightedLineFit(x, y, null);
  if (!line) return null;
  let xm = 0;
  for (const xi of x) xm += xi / n;
  let sxx = 0;
  for (const xi of x) sxx += (xi - xm) * (xi - xm);
  const v = stated.map((u) => (u === null ? 0 : u * u));
  let explained = 0;
  for (let i = 0; i < n; i++) explained += (1 - 1 / n - (x[i]! - xm) ** 2 / sxx) * v[i]!;
  const s0 = line.dof > 0 ? Math.max(0, (line.chi2 - explained) / line.dof) : 0;
  let vb = 0;
  let va = 0;
  let cab = 0;
  for (let i = 0; i < n; i++) {
    const c = (x[i]! - xm) / sxx;
    const d = 1 / n - xm * c;
    const vi = v[i]! + s0;
    vb += c * c * vi;
    va += d * d * vi;
    cab += c * d * vi;
  }
  const finite = (u: number): number | null => (Number.isFinite(u) ? u : null);
  return {
    ...line,
    uSlope: finite(Math.sqrt(vb)),
    uIntercept: finite(Math.sqrt(va)),
    covariance: finite(cab),
    excessVariance: s0,
  };
}

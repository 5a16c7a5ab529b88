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
 * Sums are taken about the weighted mean of x for numerical stability.
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

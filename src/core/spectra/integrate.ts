/**
 * The integral of a region of a spectrum, as docs/format.md ("Spectra")
 * defines it:
 *
 * - the points inside the region, its bounds included, toward increasing x;
 * - the trapezoidal rule over them, less the baseline's own trapezoids;
 * - the `linear` baseline is the straight line through the centroids
 *   (mean x, mean y) of the m points nearest each end of the region,
 *   m = max(3, ⌈0.02 n⌉) for n points (common practice, no source: a
 *   two-point baseline through single points would carry their noise whole);
 * - the noise: σ is the residual standard deviation of a straight-line
 *   least-squares fit over the noise region's points (divisor n − 2), and the
 *   integral's standard uncertainty is σ·|Δx|·√n, Δx the mean point spacing
 *   in the region (the trapezoidal sum of n independent values of standard
 *   deviation σ, end-point halves neglected; GUM JCGM 100:2008 eq. (10));
 * - beside it, not in it (the format's rule is the one above), the
 *   uncertainty with the linear baseline's own noise: the subtracted area is
 *   L·[(1 − t)·ȳ_a + t·ȳ_b] (L the region's width, t where the region's
 *   middle lies between the two centroids' x), so the integral is Σ c_k·y_k
 *   with c_k the trapezoid weight of point k less L(1 − t)/m for the m points
 *   of the first centroid and L·t/m for those of the second (they are points
 *   of the region too), and u = σ·√(Σ c_k²) (GUM eq. (10)).
 */
import type { BaselineKind, Spectrum } from './types';

/** Why a region gives no integral, in words for a message. */
export type RegionProblem =
  | { readonly kind: 'outside'; readonly min: number; readonly max: number }
  | { readonly kind: 'few'; readonly points: number };

/** The integral of one region; see the module comment. All x in the spectrum's unit. */
export interface RegionIntegral {
  readonly value: number;
  readonly points: number;
  /** The baseline's segment over the region's first and last point, `[x0, y0, x1, y1]`. */
  readonly baselineLine: readonly [number, number, number, number];
  /** Mean spacing of the region's points. */
  readonly spacing: number;
  /** √(Σ c_k²): σ times this is the integral's standard uncertainty with the baseline's own noise. */
  readonly fullFactor: number;
}

/** A tolerance for "inside": bounds equal to a point's x up to rounding include it. */
function slack(lo: number, hi: number): number {
  return 1e-9 * Math.max(Math.abs(lo), Math.abs(hi), hi - lo);
}

/** Index of the first point with x ≥ v (x increasing). */
function lowerBound(x: Float64Array, v: number): number {
  let a = 0;
  let b = x.length;
  while (a < b) {
    const m = (a + b) >>> 1;
    if (x[m]! < v) a = m + 1;
    else b = m;
  }
  return a;
}

/** The index range `[first, last]` of the points in `[lo, hi]`, or why there is none worth integrating. */
export function pointsIn(s: Spectrum, lo: number, hi: number): { first: number; last: number } | RegionProblem {
  const n = s.x.length;
  const min = s.x[0]!;
  const max = s.x[n - 1]!;
  const tol = slack(lo, hi);
  if (lo < min - tol || hi > max + tol) return { kind: 'outside', min, max };
  const first = lowerBound(s.x, lo - tol);
  const last = lowerBound(s.x, hi + tol * (1 + 1e-6)) - 1;
  const points = last - first + 1;
  if (points < 3) return { kind: 'few', points: Math.max(0, points) };
  return { first, last };
}

/** Integrates `[lo, hi]` (lo ≤ hi, in the spectrum's unit) less the chosen baseline. */
export function integrateRegion(
  s: Spectrum,
  lo: number,
  hi: number,
  baseline: BaselineKind,
): RegionIntegral | RegionProblem {
  const r = pointsIn(s, lo, hi);
  if ('kind' in r) return r;
  const { first, last } = r;
  const { x, y } = s;
  const n = last - first + 1;
  let area = 0;
  for (let i = first; i < last; i++) area += ((x[i + 1]! - x[i]!) * (y[i]! + y[i + 1]!)) / 2;
  const x0 = x[first]!;
  const x1 = x[last]!;
  let b0 = 0;
  let b1 = 0;
  let m = 0;
  let t = 0.5;
  if (baseline === 'linear') {
    m = Math.min(n, Math.max(3, Math.ceil(0.02 * n)));
    const [ax, ay] = centroid(x, y, first, first + m - 1);
    const [bx, by] = centroid(x, y, last - m + 1, last);
    // The area under the line is L·[(1 − t)·ay + t·by]; with coinciding centroids, the mean of the two.
    if (bx > ax) t = ((x0 + x1) / 2 - ax) / (bx - ax);
    if (bx > ax) {
      const slope = (by - ay) / (bx - ax);
      b0 = ay + slope * (x0 - ax);
      b1 = ay + slope * (x1 - ax);
    } else {
      b0 = b1 = (ay + by) / 2;
    }
  }
  // The baseline is a straight line, so its trapezoids sum to its exact integral.
  const value = area - ((x1 - x0) * (b0 + b1)) / 2;
  return {
    value,
    points: n,
    baselineLine: [x0, b0, x1, b1],
    spacing: (x1 - x0) / (n - 1),
    fullFactor: sensitivityNorm(x, first, last, m, t),
  };
}

/**
 * √(Σ c_k²) over the region's points: c_k the trapezoid weight of point k, less L(1 − t)/m when it is one of the
 * first m points and L·t/m when one of the last m (m = 0: no baseline).
 */
function sensitivityNorm(x: Float64Array, first: number, last: number, m: number, t: number): number {
  const width = x[last]! - x[first]!;
  let sum = 0;
  for (let k = first; k <= last; k++) {
    let c = ((k < last ? x[k + 1]! : x[k]!) - (k > first ? x[k - 1]! : x[k]!)) / 2;
    if (m > 0 && k < first + m) c -= (width * (1 - t)) / m;
    if (m > 0 && k > last - m) c -= (width * t) / m;
    sum += c * c;
  }
  return Math.sqrt(sum);
}

function centroid(x: Float64Array, y: Float64Array, from: number, to: number): [number, number] {
  let sx = 0;
  let sy = 0;
  for (let i = from; i <= to; i++) {
    sx += x[i]!;
    sy += y[i]!;
  }
  const k = to - from + 1;
  return [sx / k, sy / k];
}

/** σ of a noise region: the residual standard deviation (divisor n − 2) of a least-squares straight line through its points. */
export function noiseSigma(s: Spectrum, lo: number, hi: number): { sigma: number; points: number } | RegionProblem {
  const r = pointsIn(s, lo, hi);
  if ('kind' in r) return r;
  const { first, last } = r;
  const n = last - first + 1;
  // Centred sums, for accuracy far from x = 0 (ppm axes at 170, wavelengths at 600 nm).
  let mx = 0;
  let my = 0;
  for (let i = first; i <= last; i++) {
    mx += s.x[i]!;
    my += s.y[i]!;
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = first; i <= last; i++) {
    const dx = s.x[i]! - mx;
    const dy = s.y[i]! - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const ssr = sxx > 0 ? Math.max(0, syy - (sxy * sxy) / sxx) : syy;
  return { sigma: Math.sqrt(ssr / (n - 2)), points: n };
}

/** The standard uncertainty of a region's integral from the noise σ: σ·|Δx|·√n. */
export function integralUncertainty(sigma: number, spacing: number, points: number): number {
  return sigma * Math.abs(spacing) * Math.sqrt(points);
}

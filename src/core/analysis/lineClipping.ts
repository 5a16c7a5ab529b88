/**
 * Robust outlier flagging for a Boltzmann plot or rotation diagram, by
 * iterative clipping from a robust start:
 *
 * 1. Start from the Theil–Sen line (slope = median of the slopes of all
 *    pairs of points, intercept = median of y − slope·x; H. Theil 1950,
 *    P. K. Sen 1968, cited from memory), which a minority of bad points
 *    cannot drag, even when they carry the largest weights: self-absorbed
 *    lines are the strongest, so the best-measured, ones.
 * 2. Flag every point more than {@link CLIP_SIGMA} σ from the current line,
 *    largest first, at most half of the points and so that three remain;
 *    refit the rest by (weighted) least squares; repeat until the flagged
 *    set no longer changes (at most {@link MAX_ROUNDS} rounds).
 *
 * σ of a point: its stated u(y) = u(n)/n when every point carries one,
 * otherwise 1.4826 × the median absolute residual of the current line (the
 * normal-consistent MAD; common practice, no source). Either is floored by
 * the point's `floor`, when given: the scatter about the line that the
 * rounding of the written numbers alone produces ({@link roundingFloor}), so
 * that points which differ from a perfect line only by the last digits they
 * were written with are not flagged, however small the MAD of such points
 * is. A deviation at the level of floating-point rounding is never flagged.
 * Above 200 points the start is the least-squares line instead, to bound the
 * work of the pairwise slopes.
 */
import { weightedLineFit, type LineFit } from '../physics/lineFit';

/** A point is flagged beyond this many σ from the line. */
export const CLIP_SIGMA = 3;
/** Rounds of clipping and refitting before giving up on a stable set. */
export const MAX_ROUNDS = 20;
/** Above this many points the pairwise-slope start is skipped. */
const PAIRWISE_LIMIT = 200;

/** The outcome: flagged indices (ascending), each one's distance to the clean line in σ (signed, positive above), and that line. */
export interface Clipping {
  readonly flagged: readonly number[];
  readonly deviations: readonly number[];
  /** The fit without the flagged points (null when nothing was flagged or the refit failed). */
  readonly clean: LineFit | null;
}

function median(values: number[]): number {
  const s = values.sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** The Theil–Sen line through the points, or null when every x is equal. */
function theilSen(x: readonly number[], y: readonly number[]): { slope: number; intercept: number } | null {
  const slopes: number[] = [];
  for (let i = 0; i < x.length; i++)
    for (let j = i + 1; j < x.length; j++) if (x[j] !== x[i]) slopes.push((y[j]! - y[i]!) / (x[j]! - x[i]!));
  if (slopes.length === 0) return null;
  const slope = median(slopes);
  return { slope, intercept: median(x.map((xi, i) => y[i]! - slope * xi)) };
}

/**
 * Clips the points (x, y, σ or null) as described above; `floor`, one per
 * point, is the least σ a point is judged with (null: none).
 */
export function clipLine(
  x: readonly number[],
  y: readonly number[],
  sigma: readonly number[] | null,
  floor: readonly number[] | null = null,
): Clipping {
  const n = x.length;
  const cap = Math.min(Math.floor(n / 2), n - 3);
  const all = x.map((_, i) => i);
  const fitOf = (idx: readonly number[]): LineFit | null =>
    weightedLineFit(
      idx.map((i) => x[i]!),
      idx.map((i) => y[i]!),
      sigma ? idx.map((i) => sigma[i]!) : null,
    );
  if (cap < 1) return { flagged: [], deviations: [], clean: null };
  let line = n <= PAIRWISE_LIMIT ? theilSen(x, y) : fitOf(all);
  let flagged: number[] = [];
  let clean: LineFit | null = null;
  for (let round = 0; round < MAX_ROUNDS && line; round++) {
    const l = line;
    const z = zScores(x, y, sigma, floor, l);
    const next = all
      .filter(
        (i) =>
          Math.abs(z[i]!) > CLIP_SIGMA &&
          Math.abs(y[i]! - (l.intercept + l.slope * x[i]!)) > 1e-9 * (1 + Math.abs(y[i]!)),
      )
      .sort((a, b) => Math.abs(z[b]!) - Math.abs(z[a]!))
      .slice(0, cap)
      .sort((a, b) => a - b);
    const same = next.length === flagged.length && next.every((i, k) => i === flagged[k]);
    flagged = next;
    clean = flagged.length > 0 ? fitOf(all.filter((i) => !flagged.includes(i))) : null;
    if (same && round > 0) break;
    line = clean ?? fitOf(all);
    if (flagged.length === 0) break;
  }
  if (!clean || flagged.length === 0) return { flagged: [], deviations: [], clean: null };
  const z = zScores(x, y, sigma, floor, clean);
  return { flagged, deviations: flagged.map((i) => z[i]!), clean };
}

/** Each point's distance from the line in its σ (stated, or the line's robust scatter; at least its floor). */
function zScores(
  x: readonly number[],
  y: readonly number[],
  sigma: readonly number[] | null,
  floor: readonly number[] | null,
  line: { slope: number; intercept: number },
): number[] {
  const r = x.map((xi, i) => y[i]! - (line.intercept + line.slope * xi));
  const s = sigma ? 0 : 1.4826 * median(r.map(Math.abs));
  return r.map((ri, i) => {
    const si = Math.max(sigma ? sigma[i]! : s, floor ? floor[i]! : 0);
    return si > 0 ? ri / si : ri === 0 ? 0 : Math.sign(ri) * Infinity;
  });
}

/**
 * Significant digits of the shortest decimal that reads back as v: the typed
 * digits for a number written with up to 15 of them, less trailing zeros
 * (1520 → 3, 1.00 → 1, 0.0123 → 3). 0, NaN and ±∞ give 0.
 */
export function writtenDigits(v: number): number {
  const a = Math.abs(v);
  if (!Number.isFinite(a) || a === 0) return 0;
  // toExponential() without digits gives as many as v needs, e.g. 1520 → "1.52e+3", 1 → "1e+0".
  return a.toExponential().split('e')[0]!.replace('.', '').length;
}

/**
 * The relative standard uncertainty that rounding leaves in a written
 * number: the value lies anywhere within half a unit of its last written
 * digit δ, a rectangular distribution of width δ, so u = δ/(2√3) (JCGM
 * 100:2008 §F.2.2.1, the resolution of an indication, cited from memory),
 * returned relative to |v|.
 *
 * A number as read keeps no trailing zeros: 1.00 reads back as 1, and 1520
 * may have been 1.520e3 or 1.52e3. So δ is the unit of v's last non-zero
 * digit ({@link writtenDigits}) or that of its `digits`-th significant digit,
 * whichever is finer: `digits` is the precision the number is known to be
 * written with at least (for a column of numbers, the most digits any of them
 * shows). 0, NaN and ±∞ give 0.
 */
export function roundingUncertainty(v: number, digits: number): number {
  const a = Math.abs(v);
  if (!Number.isFinite(a) || a === 0) return 0;
  // The power of ten of the leading digit, from the same shortest decimal (1520 → "1.52e+3" → 3).
  const lead = Number(a.toExponential().split('e')[1]);
  const last = lead - Math.max(writtenDigits(a), digits) + 1;
  return 10 ** last / (2 * Math.sqrt(3)) / a;
}

/**
 * Numbers are read to at least two significant digits, so that a column of
 * round numbers (1000, 300, 50) is not read as known to ±50 %: the rounding
 * uncertainty of one number stays below 5 %/√3 = 2.9 %, and a line 30 % off
 * is still flagged.
 */
export const LEAST_DIGITS = 2;

/**
 * The precision a column of written numbers (the intensities of a block, or
 * its A values) is taken to have: the most significant digits any of them
 * shows, as one writer keeps one precision and a lost trailing zero only
 * shortens some of them; at least {@link LEAST_DIGITS}. Common practice, no
 * source, for that reading.
 */
export function columnDigits(values: readonly number[]): number {
  let most = LEAST_DIGITS;
  for (const v of values) most = Math.max(most, writtenDigits(v));
  return most;
}

/**
 * The standard deviation of each point's distance from the least-squares
 * line through all the points when the only error is the rounding u_i of each
 * y_i: √(u_i² + Σ_j h_ij² u_j²), with h_ij = 1/n + (x_i − x̄)(x_j − x̄)/S_xx the
 * hat matrix of the unweighted line (so Σ_j h_ij² u_j² is the variance the
 * rounding of all points gives the line at x_i; GUM §5.1.2). Point and line
 * are taken as independent, which errs on the large side. O(n): the sum over
 * j expands into three running sums. Where every x is equal, u_i.
 */
export function roundingFloor(x: readonly number[], u: readonly number[]): number[] {
  const n = x.length;
  let xm = 0;
  for (const xi of x) xm += xi / n;
  let sxx = 0;
  let u0 = 0;
  let u1 = 0;
  let u2 = 0;
  for (let j = 0; j < n; j++) {
    const d = x[j]! - xm;
    const v = u[j]! * u[j]!;
    sxx += d * d;
    u0 += v;
    u1 += d * v;
    u2 += d * d * v;
  }
  return x.map((xi, i) => {
    if (!(sxx > 0)) return u[i]!;
    const d = xi - xm;
    const line = u0 / (n * n) + (2 * d * u1) / (n * sxx) + (d * d * u2) / (sxx * sxx);
    return Math.sqrt(u[i]! * u[i]! + Math.max(0, line));
  });
}

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
 * normal-consistent MAD; common practice, no source). A deviation at the
 * level of rounding is never flagged. Above 200 points the start is the
 * least-squares line instead, to bound the work of the pairwise slopes.
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

/** Clips the points (x, y, σ or null) as described above. */
export function clipLine(x: readonly number[], y: readonly number[], sigma: readonly number[] | null): Clipping {
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
    const z = zScores(x, y, sigma, l);
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
  const z = zScores(x, y, sigma, clean);
  return { flagged, deviations: flagged.map((i) => z[i]!), clean };
}

/** Each point's distance from the line in its σ (stated, or the line's robust scatter). */
function zScores(
  x: readonly number[],
  y: readonly number[],
  sigma: readonly number[] | null,
  line: { slope: number; intercept: number },
): number[] {
  const r = x.map((xi, i) => y[i]! - (line.intercept + line.slope * xi));
  if (sigma) return r.map((ri, i) => ri / sigma[i]!);
  const s = 1.4826 * median(r.map(Math.abs));
  return r.map((ri) => (s > 0 ? ri / s : ri === 0 ? 0 : Math.sign(ri) * Infinity));
}

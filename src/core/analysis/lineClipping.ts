/**
 * Robust outlier flagging for a Boltzmann plot or rotation diagram, by
 * iterative clipping with deleted residuals: the point farthest from the
 * current line (in its own standard deviations) is set aside and the line
 * refitted without it; the point is flagged when it lies more than
 * {@link CLIP_SIGMA} σ off that refitted line, and the loop goes on with the
 * rest; it stops at the first suspect within the bound. A point is never
 * judged against a line it dragged, which is what let a few self-absorbed
 * lines flag most of a set before.
 *
 * σ of a point: its stated u(y) = u(n)/n when every point carries one,
 * otherwise the scatter √(χ²/dof) of the refit without it (the refit's
 * prediction uncertainty is left out, so the test errs towards flagging).
 * Bounds: at least three points stay (so the refit has a scatter), and at
 * most half of the points are flagged. Method: common practice (deleted
 * residuals, as in Bevington & Robinson's discussion of rejecting data;
 * cited from memory), no single source.
 */
import { weightedLineFit, type LineFit } from '../physics/lineFit';

/** A point is flagged beyond this many σ from the line refitted without it. */
export const CLIP_SIGMA = 3;

/** The outcome: flagged indices (in the order found), each one's side of the clean line, and that line. */
export interface Clipping {
  readonly flagged: readonly number[];
  /** Per flagged point, its distance to the clean line in σ, signed (positive above). */
  readonly deviations: readonly number[];
  /** The fit without the flagged points (null when nothing was flagged or the refit failed). */
  readonly clean: LineFit | null;
}

/** Clips the points (x, y, σ or null) as described above. */
export function clipLine(x: readonly number[], y: readonly number[], sigma: readonly number[] | null): Clipping {
  const n = x.length;
  let active = x.map((_, i) => i);
  const flagged: number[] = [];
  const deviations: number[] = [];
  let clean: LineFit | null = null;
  const fitOf = (idx: readonly number[]): LineFit | null =>
    weightedLineFit(
      idx.map((i) => x[i]!),
      idx.map((i) => y[i]!),
      sigma ? idx.map((i) => sigma[i]!) : null,
    );
  while (active.length > 3 && flagged.length < Math.floor(n / 2)) {
    const current = fitOf(active);
    if (!current) break;
    // The suspect: the largest residual in units of its σ (plain residual when unweighted).
    let worst = -1;
    let size = -1;
    active.forEach((i, k) => {
      const r = Math.abs(current.residuals[k]!) / (sigma ? sigma[i]! : 1);
      if (r > size) [worst, size] = [i, r];
    });
    const rest = active.filter((i) => i !== worst);
    const refit = fitOf(rest);
    if (!refit) break;
    const s = sigma ? sigma[worst]! : refit.dof > 0 ? Math.sqrt(refit.chi2 / refit.dof) : NaN;
    const off = y[worst]! - (refit.intercept + refit.slope * x[worst]!);
    const d = off / s;
    // A deviation at the level of rounding is no outlier, however small the scatter of exact data.
    if (!(Math.abs(d) > CLIP_SIGMA) || Math.abs(off) <= 1e-9 * (1 + Math.abs(y[worst]!))) break;
    flagged.push(worst);
    deviations.push(d);
    active = rest;
    clean = refit;
  }
  // Each flagged point's side is told against the final clean line, not the one of its own step.
  if (clean) {
    const c = clean;
    flagged.forEach((i, k) => {
      const s = sigma ? sigma[i]! : c.dof > 0 ? Math.sqrt(c.chi2 / c.dof) : NaN;
      const d = (y[i]! - (c.intercept + c.slope * x[i]!)) / s;
      if (Number.isFinite(d)) deviations[k] = d;
    });
  }
  return { flagged, deviations, clean };
}

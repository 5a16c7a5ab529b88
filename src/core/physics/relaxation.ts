/**
 * Time-series fits of magnetic-resonance signals by nonlinear least squares
 * (Levenberg–Marquardt from the `ml-levenberg-marquardt` package):
 *
 * - decay: S_n = S₀ exp(−t_n/T₁) cos^(n−1) θ, n = 1, 2, … the readout index;
 *   each small-angle readout leaves cos θ of the magnetization (G. von Witte,
 *   M. Ernst, S. Kozerke, Magn. Reson. 4, 175 (2023), who apply this
 *   correction to decays only);
 * - buildup: S(t) = S∞ (1 − exp(−t/τ)) + S₀.
 *
 * Parameters are fitted in scaled units (times over the largest time, signals
 * over the largest |signal|) so the package's fixed finite-difference step
 * suits every data set. Standard uncertainties come from the covariance
 * (JᵀWJ)⁻¹ at the solution, with the analytic Jacobian, scaled by χ²/dof when
 * the points carry no uncertainties (the scatter then estimates them).
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { inverse, Matrix } from 'ml-matrix';
import type { Measured } from '../types';
import { weightedLineFit } from './lineFit';

/** Result of a series fit, in the input's units (times in s). */
export interface SeriesFit {
  readonly model: 'decay' | 'buildup';
  /** T₁ (decay) or τ (buildup), s. */
  readonly timeConstant: Measured;
  /** S₀ (decay) or S∞ (buildup). */
  readonly amplitude: Measured;
  /** S₀ of a buildup (the offset), null for decays. */
  readonly offset: Measured | null;
  readonly fitted: readonly number[];
  readonly residuals: readonly number[];
  readonly chi2: number;
  readonly dof: number;
  /** False when the optimiser stopped at its iteration limit or gave non-finite values. */
  readonly converged: boolean;
}

/** Most Levenberg–Marquardt iterations per fit, over all rounds. */
const MAX_ITERATIONS = 500;

/**
 * Iterations per round: the package has no relative stopping rule, so the fit runs in rounds
 * and a test after each decides whether it has converged. From the log-linear start of a decay
 * two or three iterations reach the minimum.
 */
const ROUND = 2;

/**
 * Largest Gauss–Newton step, relative to each parameter, of a converged fit. The package
 * steers by a finite-difference Jacobian, whose fixed point lies a few parts in 10⁹ from
 * the exact minimum on scattered data; 10⁻⁷ is well above that and far below any
 * uncertainty a lab series can have.
 */
const STEP_TOLERANCE = 1e-7;

type Model = (p: readonly number[], i: number) => number;

/**
 * The largest |v|, in a loop: `Math.max(...values)` passes every value as an
 * argument and overflows the stack for a series of a few hundred thousand points.
 */
function maxAbs(values: readonly number[]): number {
  let m = 0;
  for (const v of values) m = Math.max(m, Math.abs(v));
  return m;
}

/** Fits a decay with optional readout flip angle θ (rad, 0 < θ < π/2). */
export function fitDecay(
  t: readonly number[],
  s: readonly number[],
  flip: number | null,
  sigma: readonly number[] | null,
): SeriesFit | null {
  const c = flip === null ? 1 : Math.cos(flip);
  const corr = t.map((_, i) => Math.pow(c, i));
  const tMax = maxAbs(t) || 1;
  const sMax = maxAbs(s) || 1;
  const x = t.map((v) => v / tMax);
  const y = s.map((v) => v / sMax);
  const f: Model = ([a, k], i) => a * Math.exp(-x[i] / k) * corr[i];
  const jac = ([a, k]: readonly number[], i: number): number[] => {
    const e = Math.exp(-x[i] / k) * corr[i];
    return [e, (a * e * x[i]) / (k * k)];
  };
  const scaledSigma = sigma ? sigma.map((u) => u / sMax) : null;
  const fit = solve(x, y, f, jac, logLinearStart(x, y, corr, scaledSigma), scaledSigma);
  if (!fit) return null;
  const [a, k] = fit.p;
  const [ua, uk] = fit.u;
  return finish(
    'decay',
    fit,
    { value: k * tMax, u: uk * tMax },
    { value: a * sMax, u: ua * sMax },
    null,
    s,
    (i) => f(fit.p, i) * sMax,
    sigma,
  );
}

/**
 * Where the decay fit starts: the weighted straight line through ln(S_n / cos^(n−1) θ)
 * against t, slope −1/T₁ and intercept ln S₀, with weights (S_n/σ_n)² (σ of ln S is
 * σ/S to first order, GUM §5.1.2), which is the least-squares answer itself for
 * data without scatter and close to it otherwise, so the optimiser has little left
 * to do. Points of the other sign than the first, or zero, are left out of the
 * line; without two usable points, or when the line does not fall, the first and
 * last points give the start instead.
 */
function logLinearStart(
  x: readonly number[],
  y: readonly number[],
  corr: readonly number[],
  sigma: readonly number[] | null,
): number[] {
  const sign = y[0]! < 0 ? -1 : 1;
  const xs: number[] = [];
  const zs: number[] = [];
  const us: number[] = [];
  for (let i = 0; i < x.length; i++) {
    const v = (sign * y[i]!) / corr[i]!;
    if (!(v > 0)) continue;
    xs.push(x[i]!);
    zs.push(Math.log(v));
    // σ of ln(S/c) is σ/|S|; unweighted data get σ ∝ 1/|S|, the same first-order weighting.
    us.push((sigma ? sigma[i]! : 1) / Math.abs(y[i]!));
  }
  const line = xs.length >= 2 ? weightedLineFit(xs, zs, us) : null;
  if (line && line.slope < 0 && Number.isFinite(line.intercept))
    return [sign * Math.exp(line.intercept), -1 / line.slope];
  const y0 = y[0]! / corr[0]!;
  const yn = y[y.length - 1]! / corr[corr.length - 1]!;
  const ratio = yn / y0;
  const k0 = ratio > 0 && ratio < 1 ? (x[x.length - 1]! - x[0]!) / -Math.log(ratio) : 1;
  return [y0 * Math.exp(x[0]! / k0), k0];
}

/** Fits a build-up S(t) = S∞(1 − e^(−t/τ)) + S₀. */
export function fitBuildup(
  t: readonly number[],
  s: readonly number[],
  sigma: readonly number[] | null,
): SeriesFit | null {
  const tMax = maxAbs(t) || 1;
  const sMax = maxAbs(s) || 1;
  const x = t.map((v) => v / tMax);
  const y = s.map((v) => v / sMax);
  const f: Model = ([a, k, b], i) => a * (1 - Math.exp(-x[i] / k)) + b;
  const jac = ([a, k]: readonly number[], i: number): number[] => {
    const e = Math.exp(-x[i] / k);
    return [1 - e, (-a * e * x[i]) / (k * k), 1];
  };
  const half = y[0] + (y[y.length - 1] - y[0]) / 2;
  const at = y.findIndex((v) => (y[y.length - 1] > y[0] ? v >= half : v <= half));
  const k0 = Math.max(at >= 0 ? x[at] / Math.LN2 : 0.3, 0.05);
  const fit = solve(x, y, f, jac, [y[y.length - 1] - y[0], k0, y[0]], sigma ? sigma.map((u) => u / sMax) : null);
  if (!fit) return null;
  const [a, k, b] = fit.p;
  const [ua, uk, ub] = fit.u;
  return finish(
    'buildup',
    fit,
    { value: k * tMax, u: uk * tMax },
    { value: a * sMax, u: ua * sMax },
    { value: b * sMax, u: ub * sMax },
    s,
    (i) => f(fit.p, i) * sMax,
    sigma,
  );
}

interface Solved {
  readonly p: number[];
  readonly u: number[];
  readonly converged: boolean;
}

function solve(
  x: number[],
  y: number[],
  f: Model,
  jac: (p: readonly number[], i: number) => number[],
  initial: number[],
  sigma: number[] | null,
): Solved | null {
  if (!initial.every(Number.isFinite)) return null;
  const index = x.map((_, i) => i);
  // Weighted least squares is run as plain least squares of y/σ against f/σ. The package's own
  // `weights` are left at 1: in its 4.x releases the error sum weights a point by w² while the
  // step's normal equations weight it by 1/w², so no choice of w gives the 1/σ² of both. The σ are
  // taken relative to the smallest (the minimum does not move), so that the package's absolute
  // damping meets a problem of the same scale as an unweighted one.
  const least = sigma ? sigma.reduce((m, v) => Math.min(m, v), Infinity) : 1;
  const w = (i: number): number => (sigma ? sigma[i] / least : 1);
  const scaled = y.map((v, i) => v / w(i));
  const run = (start: number[], iterations: number) =>
    levenbergMarquardt({ x: index, y: scaled }, (q: number[]) => (i: number) => f(q, i) / w(i), {
      initialValues: start,
      damping: 1e-3,
      gradientDifference: 1e-6,
      centralDifference: true,
      maxIterations: iterations,
      // 0: every lower residual sum counts as the best point (a positive tolerance would hold the
      // package a few digits short of the minimum), and only an exact fit stops a round early.
      errorTolerance: 0,
      improvementThreshold: 1e-12,
    });
  let p = initial;
  let at: Curvature | null = null;
  let converged = false;
  try {
    // The package stops only on an absolute error threshold or its iteration limit, which noisy data
    // always reach. So it runs in short rounds, each from the best point of the last, and after each
    // round the point is tested: the fit has converged when the Gauss–Newton step there,
    // (JᵀWJ)⁻¹ JᵀW r with the analytic Jacobian, would move no parameter by more than STEP_TOLERANCE
    // of its value (the usual relative step test; Dennis & Schnabel, Numerical Methods for
    // Unconstrained Optimization, SIAM 1996, §7.2, from memory). The same JᵀWJ gives the covariance.
    for (let used = 0; used < MAX_ITERATIONS && !converged; used += ROUND) {
      const next = run(p, ROUND).parameterValues;
      if (!next.every(Number.isFinite)) return null;
      p = next;
      at = curvature(
        p,
        x.length,
        (i) => y[i]! - f(p, i),
        (i) => jac(p, i),
        sigma,
      );
      // A singular JᵀWJ leaves a parameter undetermined; more rounds would not change that.
      if (!at) break;
      converged = at.step.every((d, j) => Math.abs(d) <= STEP_TOLERANCE * Math.abs(p[j]!));
    }
  } catch {
    return null;
  }
  if (!at) return { p, u: p.map(() => NaN), converged: false };
  const dof = x.length - p.length;
  // Covariance (JᵀWJ)⁻¹, scaled by the reduced χ² when the data carry no uncertainties.
  const scale = sigma ? 1 : dof > 0 ? at.chi2 / dof : NaN;
  const u = p.map((_, j) => Math.sqrt(at!.covariance.get(j, j) * scale));
  return { p, u, converged };
}

/** What {@link curvature} finds at a point of the parameter space. */
interface Curvature {
  /** (JᵀWJ)⁻¹. */
  readonly covariance: Matrix;
  /** The Gauss–Newton step (JᵀWJ)⁻¹ JᵀW r. */
  readonly step: number[];
  /** Σ (r_i/σ_i)². */
  readonly chi2: number;
}

/**
 * JᵀWJ, its inverse and the Gauss–Newton step at one point, W = diag(1/σ²) (1 when
 * unweighted), from the residuals r and the model's analytic derivatives. Null when
 * JᵀWJ is singular (a parameter the data do not determine).
 */
function curvature(
  p: readonly number[],
  n: number,
  residual: (i: number) => number,
  derivatives: (i: number) => number[],
  sigma: readonly number[] | null,
): Curvature | null {
  const m = p.length;
  const jtj = Matrix.zeros(m, m);
  // A typed array: its elements are doubles from the start (a list made at its length has holes, which the engine
  // compiles for apart from the lists without).
  const jtr = new Float64Array(m);
  let chi2 = 0;
  for (let i = 0; i < n; i++) {
    const w = sigma ? 1 / (sigma[i]! * sigma[i]!) : 1;
    const d = derivatives(i);
    const r = residual(i);
    chi2 += w * r * r;
    for (let j = 0; j < m; j++) {
      jtr[j]! += w * d[j]! * r;
      for (let l = 0; l < m; l++) jtj.set(j, l, jtj.get(j, l) + w * d[j]! * d[l]!);
    }
  }
  let covariance: Matrix;
  try {
    covariance = inverse(jtj);
  } catch {
    return null;
  }
  const step = p.map((_, j) => {
    let s = 0;
    for (let l = 0; l < m; l++) s += covariance.get(j, l) * jtr[l]!;
    return s;
  });
  if (!step.every(Number.isFinite)) return null;
  return { covariance, step, chi2 };
}

function finish(
  model: 'decay' | 'buildup',
  fit: Solved,
  tc: { value: number; u: number },
  amp: { value: number; u: number },
  off: { value: number; u: number } | null,
  s: readonly number[],
  at: (i: number) => number,
  sigma: readonly number[] | null,
): SeriesFit {
  const m = (v: { value: number; u: number }): Measured => ({
    value: v.value,
    uncertainty: Number.isFinite(v.u) ? v.u : null,
  });
  const fitted = s.map((_, i) => at(i));
  const residuals = s.map((v, i) => v - fitted[i]);
  const chi2 = residuals.reduce((acc, r, i) => acc + (r / (sigma ? sigma[i] : 1)) ** 2, 0);
  const ok = fit.converged && Number.isFinite(tc.value) && tc.value > 0;
  return {
    model,
    timeConstant: m(tc),
    amplitude: m(amp),
    offset: off ? m(off) : null,
    fitted,
    residuals,
    chi2,
    dof: s.length - fit.p.length,
    converged: ok,
  };
}

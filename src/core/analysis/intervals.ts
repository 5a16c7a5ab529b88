/**
 * Coverage intervals (k = 2, about 95 %) of β, P and T, as the contract's
 * "Honest intervals" section defines them.
 *
 * β's interval is β ± 2u(β) (GUM JCGM 100:2008 §6.2.1, expanded uncertainty
 * U = k·u with k = 2). P's is P ± 2u(P), clipped to [−1, 1], the range P can
 * take. T = 1/β is monotonic on each side of β = 0, so the image of β's
 * interval has exactly β's coverage (JCGM 101:2008 §5.3.1: a coverage
 * interval maps through a monotonic function); it is skewed, and far wider
 * above than below when β/u(β) is small. Where β's interval holds 0 the
 * image is two half-lines, and only a bound on |T| is known.
 *
 * Pure functions of plain numbers; nothing here throws.
 */
import type { Measured } from '../types';

/** The coverage factor of every interval shown (k = 2, JCGM 100:2008 §6.3.3). */
export const COVERAGE_FACTOR = 2;

/** An interval `[low, high]` with low ≤ high. */
export type Interval = readonly [number, number];

/** The k = 2 intervals of one block's results; null where the result has no uncertainty. */
export interface ResultIntervals {
  readonly beta: Interval | null;
  /** T = 1/β's image of β's interval; null when β has no uncertainty or its interval holds 0. */
  readonly temperature: Interval | null;
  /** When β's interval holds 0: |T| is at least this (either sign), K. */
  readonly temperatureBound: number | null;
  readonly polarization: Interval | null;
  /** True when P ± 2u(P) passed ±1 and was clipped there. */
  readonly polarizationClipped: boolean;
}

const usable = (m: Measured | null): m is Measured & { uncertainty: number } =>
  m !== null && Number.isFinite(m.value) && m.uncertainty !== null && Number.isFinite(m.uncertainty);

/** β ± k·u(β), or null without an uncertainty. */
export function betaInterval(beta: Measured | null): Interval | null {
  if (!usable(beta)) return null;
  const half = COVERAGE_FACTOR * beta.uncertainty;
  const low = beta.value - half;
  const high = beta.value + half;
  return Number.isFinite(low) && Number.isFinite(high) ? [low, high] : null;
}

/**
 * The image of β's interval through T = 1/β: [1/(β + 2u), 1/(β − 2u)] for
 * either sign of β. Null when β's interval holds 0 (or touches it), where the
 * image is not one interval.
 */
export function temperatureInterval(beta: Measured | null): Interval | null {
  const b = betaInterval(beta);
  if (!b || !(b[0] > 0 || b[1] < 0)) return null;
  const low = 1 / b[1];
  const high = 1 / b[0];
  return Number.isFinite(low) && Number.isFinite(high) ? [low, high] : null;
}

/**
 * When β's interval holds 0, all that is known of T at k = 2 is
 * |T| ≥ 1/(|β| + 2u(β)) of either sign; null otherwise (or without an uncertainty).
 */
export function temperatureBound(beta: Measured | null): number | null {
  const b = betaInterval(beta);
  if (!b || b[0] > 0 || b[1] < 0) return null;
  const bound = 1 / Math.max(Math.abs(b[0]), Math.abs(b[1]));
  return Number.isFinite(bound) ? bound : null;
}

/** P ± k·u(P) clipped to [−1, 1], and whether it was clipped. */
export function polarizationInterval(p: Measured | null): { interval: Interval; clipped: boolean } | null {
  if (!usable(p)) return null;
  const half = COVERAGE_FACTOR * p.uncertainty;
  const low = p.value - half;
  const high = p.value + half;
  if (Number.isNaN(low) || Number.isNaN(high)) return null;
  return { interval: [Math.max(-1, low), Math.min(1, high)], clipped: low < -1 || high > 1 };
}

/** All three intervals of a block's β and P. */
export function resultIntervals(beta: Measured | null, polarization: Measured | null): ResultIntervals {
  const p = polarizationInterval(polarization);
  return {
    beta: betaInterval(beta),
    temperature: temperatureInterval(beta),
    temperatureBound: temperatureBound(beta),
    polarization: p ? p.interval : null,
    polarizationClipped: p ? p.clipped : false,
  };
}

/**
 * True when T's interval is skewed enough that T ± 2u(T) would mislead: one
 * side of the interval differs from 2u(T) = 2u(β)/β² by more than the given
 * fraction (10 % by default, the "about 10 %"; common practice, no source).
 */
export function temperatureSkewed(t: Measured, interval: Interval, fraction = 0.1): boolean {
  if (t.uncertainty === null || !(t.uncertainty > 0)) return false;
  const half = COVERAGE_FACTOR * t.uncertainty;
  const below = t.value - interval[0];
  const above = interval[1] - t.value;
  return Math.abs(below - half) > fraction * half || Math.abs(above - half) > fraction * half;
}

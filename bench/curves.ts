/**
 * The curve view's computations: S(E) and β(E) with 2,000 points for a
 * 64-level scheme (one `schemeCurve` call gives both), and the exact
 * finite-N two-state curve S = ln C(N, m) for N = 10⁶ (2,001 points, the
 * view's default sampling). Median of repeated calls after a warm-up.
 */
import { finiteNCurve, schemeCurve } from '../src/core';
import { median, timeOnce } from './stats';

/** What {@link measureCurves} reports, ms. */
export interface CurveFigures {
  readonly schemeMs: number;
  readonly schemePoints: number;
  readonly finiteNMs: number;
  readonly finiteNPoints: number;
}

/** A 64-level scheme: uneven spacings and degeneracies, energies E/k in K. */
function scheme64(): { energies: number[]; g: number[] } {
  const energies: number[] = [];
  const g: number[] = [];
  for (let i = 0; i < 64; i++) {
    energies.push(i * 1.5 + 0.02 * i * i);
    g.push(1 + (i % 4));
  }
  return { energies, g };
}

/** Times each curve `repetitions` times. */
export function measureCurves(repetitions: number): CurveFigures {
  const { energies, g } = scheme64();
  let schemePoints = 0;
  let finiteNPoints = 0;
  const scheme = (): void => {
    schemePoints = schemeCurve(energies, g, { points: 2000 })?.length ?? 0;
  };
  const finite = (): void => {
    finiteNPoints = finiteNCurve(1_000_000, 0.5)?.length ?? 0;
  };
  for (let i = 0; i < 3; i++) {
    scheme();
    finite();
  }
  const s: number[] = [];
  const f: number[] = [];
  for (let i = 0; i < repetitions; i++) {
    s.push(timeOnce(scheme));
    f.push(timeOnce(finite));
  }
  if (schemePoints !== 2000) throw new Error(`the scheme curve has ${schemePoints} points`);
  return { schemeMs: median(s), schemePoints, finiteNMs: median(f), finiteNPoints };
}

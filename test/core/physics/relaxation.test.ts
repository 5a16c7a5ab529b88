import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fitBuildup, fitDecay, type SeriesFit } from '../../../src/core/physics/relaxation';
import { close } from '../helpers';

// The series fits run Levenberg–Marquardt (ml-levenberg-marquardt) from a log-linear start and stop
// when the Gauss–Newton step at the package's result is below 1e-7 of each parameter. Every check
// value below comes from an independent computation: the minimum of the same χ² found by variable
// projection and golden-section search in 60-digit decimals (reference/series_minima.py, Python's
// standard library, written to reference/series_minima.json with the inputs), a finite-difference
// Hessian of that χ², or the gradient's root in 50-digit arithmetic (reference/relaxation_minimum.py, mpmath).

/** One committed reference case: the inputs and the minimum reference/series_minima.py found. */
interface MinimumCase {
  readonly name: string;
  readonly model: 'decay' | 'buildup';
  readonly time: number[];
  readonly signal: number[];
  readonly flip: number | null;
  readonly sigma: number[] | null;
  readonly expected: { timeConstant: number; amplitude: number; offset: number | null; chi2: number };
}

const SERIES_MINIMA = (
  JSON.parse(readFileSync(join(__dirname, 'reference', 'series_minima.json'), 'utf8')) as { cases: MinimumCase[] }
).cases;

/** χ² of the build-up model S∞(1 − e^(−t/τ)) + S₀ (σ = 1 for an unweighted fit). */
function buildupChi2(t: number[], s: number[], sigma: number[] | null) {
  return ([a, k, b]: number[]): number =>
    s.reduce((acc, v, i) => acc + ((v - (a! * (1 - Math.exp(-t[i]! / k!)) + b!)) / (sigma ? sigma[i]! : 1)) ** 2, 0);
}

function converged(fit: SeriesFit | null): SeriesFit {
  assert.ok(fit && fit.converged, 'the fit converges');
  return fit;
}

describe('series fits, against an independent minimiser', () => {
  const t = [0, 30, 60, 120, 240, 480, 960, 1920];
  // Deterministic scatter of about 1 % of the plateau, so the minimum is not at the generating values.
  const s = t.map((v, i) => 0.9 * (1 - Math.exp(-v / 400)) + 0.02 + 0.01 * Math.sin(1.7 * i + 0.3));

  for (const c of SERIES_MINIMA) {
    it(`lands on the least-squares minimum found by variable projection in 60-digit arithmetic: ${c.name}`, () => {
      const flip = c.flip;
      const ours = converged(
        c.model === 'decay' ? fitDecay(c.time, c.signal, flip, c.sigma) : fitBuildup(c.time, c.signal, c.sigma),
      );
      const e = c.expected;
      close(ours.timeConstant.value, e.timeConstant, 1e-6, 'time constant');
      close(ours.amplitude.value, e.amplitude, 1e-6, 'amplitude');
      if (e.offset !== null) close(ours.offset!.value, e.offset, 1e-5, 'offset');
      close(ours.chi2, e.chi2, 1e-9, 'χ² at the minimum');
      // The reference is the exact minimum to far below double precision: the fit cannot go under it.
      assert.ok(ours.chi2 >= e.chi2 * (1 - 1e-12), `χ² ${ours.chi2} below the minimum ${e.chi2}`);
    });
  }

  it('gives the uncertainties of the curvature of χ²: u² = 2 [H⁻¹]_jj with H its Hessian (finite differences)', () => {
    // For a χ² with given σ the covariance is 2 H⁻¹ (Bevington & Robinson, ch. 8; from memory).
    const sigma = t.map(() => 0.01);
    const ours = converged(fitBuildup(t, s, sigma));
    const p = [ours.amplitude.value, ours.timeConstant.value, ours.offset!.value];
    const chi2 = buildupChi2(t, s, sigma);
    const h = p.map((v) => 1e-4 * Math.abs(v));
    const at = (d: number[]): number => chi2(p.map((v, j) => v + d[j]!));
    const H = p.map((_, j) =>
      p.map((__, l) => {
        const e = (sj: number, sl: number): number =>
          at(p.map((___, m) => (m === j ? sj * h[j]! : 0) + (m === l ? sl * h[l]! : 0)));
        return (e(1, 1) - e(1, -1) - e(-1, 1) + e(-1, -1)) / (4 * h[j]! * h[l]!);
      }),
    );
    // Inverse of the 3 × 3 Hessian by Gauss–Jordan elimination, independent of the fit's own closed form.
    const n = 3;
    const m = H.map((row, j) => [...row, ...Array.from({ length: n }, (_, l) => (l === j ? 1 : 0))]);
    for (let c = 0; c < n; c++) {
      const pivot = m[c]![c]!;
      for (let l = 0; l < 2 * n; l++) m[c]![l]! /= pivot;
      for (let r = 0; r < n; r++)
        if (r !== c) {
          const f = m[r]![c]!;
          for (let l = 0; l < 2 * n; l++) m[r]![l]! -= f * m[c]![l]!;
        }
    }
    const u = (j: number): number => Math.sqrt(2 * m[j]![n + j]!);
    close(ours.amplitude.uncertainty!, u(0), 1e-4, 'u(S∞)');
    close(ours.timeConstant.uncertainty!, u(1), 1e-4, 'u(τ)');
    close(ours.offset!.uncertainty!, u(2), 1e-4, 'u(S₀)');
  });

  it('lands on the exact least-squares minimum of the demo notebook series', () => {
    // Check values: the roots of ∂(Σ residual²)/∂(parameters) = 0 for the series of demo/measurements.md,
    // solved in 50-digit arithmetic by reference/relaxation_minimum.py (mpmath 1.3 findroot).
    // The fit stops within 1e-7 of the minimum by design; in practice it lands far closer.
    const decay = converged(
      fitDecay(
        [0, 6, 12, 18, 24, 30, 36, 42, 48, 54],
        [1.0, 0.8844, 0.769, 0.6822, 0.5956, 0.5267, 0.4598, 0.4079, 0.3561, 0.3143],
        (5 * Math.PI) / 180,
        null,
      ),
    );
    close(decay.timeConstant.value, 47.939950135587116711, 1e-9, 'T₁ of the demo decay');
    const minutes = [0, 5, 10, 20, 30, 45, 60, 90].map((m) => 60 * m);
    const buildup = converged(fitBuildup(minutes, [0.02, 0.257, 0.431, 0.672, 0.805, 0.911, 0.953, 0.984], null));
    close(buildup.timeConstant.value, 1081.1074907232736863, 1e-9, 'τ of the demo build-up');
    close(buildup.amplitude.value, 0.96911917697310717879, 1e-9, 'S∞ of the demo build-up');
    close(buildup.offset!.value, 0.020444388524868682072, 1e-7, 'S₀ of the demo build-up');
    close(decay.amplitude.value, 1.0011706324923638298, 1e-9, 'S₀ of the demo decay');
  });

  it('reports no fit when the signal grows instead of decaying, and no uncertainty from two points', () => {
    const growing = fitDecay([0, 10, 20, 30], [1, 1.5, 2.2, 3.4], null, null);
    assert.ok(!growing || !growing.converged, 'a growing series is no decay');
    const two = converged(fitDecay([0, 10], [1, 0.5], null, null));
    // ln 2 per 10 s: T₁ = 10/ln 2 s exactly (two points fix both parameters).
    close(two.timeConstant.value, 10 / Math.LN2, 1e-12, 'T₁ through two points');
    assert.equal(two.timeConstant.uncertainty, null);
  });
});

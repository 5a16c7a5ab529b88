/**
 * The measurement plot of the curve view: for emission lines the Boltzmann
 * plot itself, for a time series the data with the fitted model and the
 * residuals. Computed here, drawn by the webview.
 */
import type { BlockResults } from '../analysis/results';
import type { BlockInput } from '../block/input';
import { KELVIN_PER_EV } from '../quantities/constants';
import type { MeasurementPlot, PlotPoint } from './payload';

const FIT_SAMPLES = 200;

/** The plot for a block with emission lines or a time series, or null. */
export function measurementPlot(input: BlockInput, results: BlockResults): MeasurementPlot | null {
  if (input.lines && results.fit) return boltzmannPlot(input, results);
  if (input.series && results.series) return seriesPlot(input, results);
  return null;
}

/**
 * ln(n/g) against E_upper in eV, where n = Iλ/A (energy-calibrated) or I/A
 * (photon counting): the same ordinate the Boltzmann fit used, so the fitted
 * line is y − residual at each point and has slope −β·(K per eV).
 */
function boltzmannPlot(input: BlockInput, r: BlockResults): MeasurementPlot {
  const fit = r.fit!;
  const points: PlotPoint[] = [];
  const fitted: { x: number; y: number }[] = [];
  const residuals: { x: number; y: number }[] = [];
  // A rotation diagram is drawn against E_u/k in K, as radio astronomers plot it; a Boltzmann plot against eV.
  const radio = input.lines!.detector === 'radiometer';
  const perUnit = radio ? 1 : KELVIN_PER_EV;
  input.levels.forEach((l, i) => {
    const n = l.population ?? 0;
    if (!(n > 0)) return;
    const x = l.energy / perUnit;
    const y = Math.log(n / l.g);
    const res = fit.residuals[i];
    points.push({
      x,
      y,
      u: l.uPopulation !== null ? l.uPopulation / n : null,
      flagged: r.outliers.includes(i),
      label: l.label,
    });
    if (res !== null && res !== undefined) {
      fitted.push({ x, y: y - res });
      residuals.push({ x, y: res });
    }
  });
  fitted.sort((a, b) => a.x - b.x);
  const ends = fitted.length >= 2 ? [fitted[0], fitted[fitted.length - 1]] : [];
  const detector = r.trade.plot?.ordinate ?? (input.lines!.detector === 'energy' ? 'ln(Iλ/gA)' : 'ln(I/gA)');
  return {
    kind: 'boltzmann',
    title: `${radio ? 'Rotation diagram' : 'Boltzmann plot'}: slope −β = −1/(kT)`,
    xTitle: radio ? 'upper-level energy E_u/k (K)' : 'upper-level energy E (eV)',
    yTitle: detector,
    points,
    fit: { x: ends.map((p) => p.x), y: ends.map((p) => p.y) },
    residuals,
  };
}

/** Signal against time (s) with the fitted model (readout by readout for a decay with flips) and residuals. */
function seriesPlot(input: BlockInput, r: BlockResults): MeasurementPlot {
  const s = input.series!;
  const f = r.series!;
  const points: PlotPoint[] = s.times.map((t, i) => ({
    x: t,
    y: s.signals[i],
    u: s.uSignals ? s.uSignals[i] : null,
    flagged: false,
    label: null,
  }));
  const tMax = s.times[s.times.length - 1];
  const tMin = s.times[0];
  const a = f.amplitude.value;
  const tc = f.timeConstant.value;
  const off = f.offset?.value ?? 0;
  let fit: { x: number[]; y: number[] };
  if (f.model === 'decay' && s.flip !== null) {
    // Each readout removes 1 − cos θ of the signal: the model exists only at the readouts.
    fit = { x: [...s.times], y: [...f.fitted] };
  } else {
    const x = Array.from({ length: FIT_SAMPLES }, (_, k) => tMin + ((tMax - tMin) * k) / (FIT_SAMPLES - 1));
    const y = x.map((t) => (f.model === 'decay' ? a * Math.exp(-t / tc) : a * (1 - Math.exp(-t / tc)) + off));
    fit = { x, y };
  }
  return {
    kind: 'series',
    title: f.model === 'decay' ? 'decay: S₀ exp(−t/T₁) cos^(n−1) θ' : 'build-up: S∞ (1 − exp(−t/τ)) + S₀',
    xTitle: 'time t (s)',
    yTitle: 'signal',
    points,
    fit,
    residuals: s.times.map((t, i) => ({ x: t, y: f.residuals[i] })),
  };
}

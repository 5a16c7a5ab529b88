/**
 * The measurement inputs beyond populations: a time series (fitted), a
 * signal against a thermal reference (turned into a polarization), emission
 * lines (outliers of the Boltzmann plot) and the gain of an optical
 * transition.
 */
import type { BlockInput } from '../block/input';
import type { ReadValue } from '../block/values';
import { thermalSpinPolarization } from '../physics/brillouin';
import {
  gainCoefficient,
  gainDecibels,
  inversionDensity,
  singlePassGain,
  thresholdGain,
  thresholdInversion,
} from '../physics/gain';
import { fitBuildup, fitDecay, type SeriesFit } from '../physics/relaxation';
import { acquisitionFactor, referencedPolarization } from '../physics/thermalReference';
import type { Problem } from '../types';
import type { GainResult, SignalResult } from './results';

/** Fits the block's time series, with warnings for a short series or a fit that did not converge. */
export function measureSeries(input: BlockInput, problems: Problem[]): SeriesFit | null {
  const s = input.series;
  if (!s) return null;
  const fit =
    s.model === 'decay' ? fitDecay(s.times, s.signals, s.flip, s.uSignals) : fitBuildup(s.times, s.signals, s.uSignals);
  if (!fit || !fit.converged) {
    problems.push({
      severity: 'warning',
      code: 'series-no-convergence',
      message: `series: the ${s.model} fit did not converge; check that the data follow the model (and the sign and units of the times).`,
      span: s.span,
    });
    return fit && Number.isFinite(fit.timeConstant.value) && fit.timeConstant.value > 0 ? fit : null;
  }
  if (fit.dof === 0) {
    problems.push({
      severity: 'warning',
      code: 'series-too-short',
      message: `series: ${s.times.length} points fix the ${s.model} model's ${s.times.length} parameters exactly; add points to get standard uncertainties.`,
      span: s.span,
    });
  }
  return fit;
}

/** Polarization from the signal and its thermal reference (the series amplitude stands in for a missing hyperpolarized signal). */
export function measureSignal(
  input: BlockInput,
  series: SeriesFit | null,
  problems: Problem[],
): { result: SignalResult; polarization: ReadValue } | null {
  const sig = input.signal;
  const spin = input.spin;
  const T = input.lattice?.value;
  if (!sig || !spin || T === undefined) return null;
  // A thermal reference taken from another run: P_th at that run's own spin spacing (its field) and lattice.
  const ref = sig.thermalRun ?? null;
  const pThermal = thermalSpinPolarization(
    ref ? ref.spin.species.spin : spin.species.spin,
    ref ? ref.spin.spacing : spin.spacing,
    T,
  );
  let hp = sig.hyperpolarized;
  let uHp = sig.uHyperpolarized;
  if (hp === null && series) {
    // A decay starts at S₀; a build-up ends at its plateau S∞ + S₀.
    const off = series.offset;
    hp = series.amplitude.value + (off ? off.value : 0);
    const ua = series.amplitude.uncertainty;
    uHp = ua === null ? null : off?.uncertainty != null ? Math.hypot(ua, off.uncertainty) : ua;
  }
  if (pThermal === null) return null;
  const run = ref ? { id: ref.id, place: ref.place, date: ref.date } : null;
  if (hp === null) {
    if (input.series) return null;
    // The block is a thermal reference itself: its polarization is P_th (u from the lattice, in the budget).
    return {
      result: {
        pThermal,
        factor: 1,
        ratio: 1,
        hyperpolarized: sig.thermal,
        fromSeries: false,
        thermalOnly: true,
        thermalRun: run,
      },
      polarization: { value: pThermal, uncertainty: null, span: sig.span, unit: null },
    };
  }
  const factor = acquisitionFactor(
    { scans: sig.scans[0], gain: sig.gain[0], flip: sig.flip[0], amount: sig.amount[0] },
    { scans: sig.scans[1], gain: sig.gain[1], flip: sig.flip[1], amount: sig.amount[1] },
  );
  const p = referencedPolarization(pThermal, hp, uHp, sig.thermal, sig.uThermal, factor);
  if (!(Math.abs(p.value) < 1)) {
    problems.push({
      severity: 'error',
      code: 'signal-polarization-range',
      message: `signal: the referenced polarization comes out as ${p.value.toPrecision(3)}, beyond ±1; check scans, gains, flip angles and the lattice temperature.`,
      span: sig.span,
    });
    return null;
  }
  return {
    result: {
      pThermal,
      factor,
      ratio: hp / sig.thermal,
      hyperpolarized: hp,
      fromSeries: sig.hyperpolarized === null,
      thermalOnly: false,
      thermalRun: run,
    },
    polarization: { value: p.value, uncertainty: p.uncertainty, span: sig.span, unit: null },
  };
}

/** Gain, single-pass gain and threshold of a transition given with absolute populations. */
export function measureGain(input: BlockInput): GainResult | null {
  const gi = input.gain;
  if (!gi || input.levels.length !== 2) return null;
  const [lo, up] = input.levels;
  const g0 = gainCoefficient(gi.crossSection, lo.population!, up.population!, lo.g, up.g);
  const single = gi.length !== null ? singlePassGain(g0, gi.length) : null;
  const threshold =
    gi.length !== null && gi.mirrors ? thresholdGain(gi.loss, gi.mirrors[0], gi.mirrors[1], gi.length) : null;
  // First-order propagation (JCGM 100:2008 §5.1.2) of the densities' uncertainties; σ, L and the mirrors are
  // taken as exact (the block gives them without uncertainty).
  const variance = (up.uPopulation ?? 0) ** 2 + ((up.g / lo.g) * (lo.uPopulation ?? 0)) ** 2;
  const uG0 = variance > 0 ? gi.crossSection * Math.sqrt(variance) : null;
  const finiteOrNull = (x: number | null): number | null => (x !== null && Number.isFinite(x) ? x : null);
  const db = gi.length !== null ? gainDecibels(g0, gi.length) : null;
  const nth = threshold !== null ? thresholdInversion(threshold, gi.crossSection) : null;
  return {
    coefficient: g0,
    uCoefficient: finiteOrNull(uG0),
    singlePass: single !== null && Number.isFinite(single) ? single : null,
    uSinglePass: single !== null && uG0 !== null && gi.length !== null ? finiteOrNull(single * gi.length * uG0) : null,
    singlePassDb: db !== null && Number.isFinite(db) ? db : null,
    inversion: inversionDensity(lo.population!, up.population!, lo.g, up.g),
    thresholdInversion: nth !== null && Number.isFinite(nth) ? nth : null,
    threshold,
    aboveThreshold: threshold === null ? null : g0 > threshold,
  };
}

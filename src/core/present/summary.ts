/**
 * Display strings of a block's results, shared by every host (hover, inlay
 * hints, report table) so that all show the same numbers the same way:
 * GUM rounding (two significant digits of the uncertainty), SI prefixes for
 * temperatures, β in K⁻¹.
 */
import type { BlockResults } from '../analysis/results';
import {
  formatFraction,
  formatInverseTemperature,
  formatNumber,
  formatTemperature,
  formatTemperatureInterval,
} from './numbers';
import { temperatureSkewed } from '../analysis/intervals';
import { measurementShort } from './measurementSummary';
import type { Measured, Status } from '../types';
import { DEFAULT_DISPLAY, type DisplayOptions } from './displayOptions';

export { DEFAULT_DISPLAY, type DisplayOptions } from './displayOptions';

/** What each status word means, for hovers and reports. */
export const STATUS_WORDS: Readonly<Record<Status, string>> = {
  normal: 'normal: positive spin temperature, more population below',
  saturated: 'saturated: β is zero within its uncertainty (T → ±∞), levels equally populated per degeneracy',
  inverted: 'inverted: population inversion, negative spin temperature',
  'non-thermal': 'non-thermal: the levels do not follow one Boltzmann distribution',
  invalid: 'invalid: the block has an error',
};

/** T as shown: a value, a T → 0± limit, or T → ±∞ when saturated. */
export function temperatureText(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  if (r.limit === 'zero-positive') return 'T → 0⁺';
  if (r.limit === 'zero-negative') return 'T → 0⁻';
  if (!r.beta) return 'T not determined (no populations measured)';
  if (r.status === 'saturated' || !r.temperature) return 'T → ±∞ (saturated)';
  return measuredTemperatureText(r.temperature, o);
}

/** A finite temperature as shown, `T = 5.61 ± 0.19 mK`: GUM rounding, the unit prefix as the options say. */
export function measuredTemperatureText(t: Measured, o: DisplayOptions = DEFAULT_DISPLAY): string {
  return `T = ${formatTemperature(t.value, t.uncertainty, { digits: o.digits, mode: o.temperature === 'kelvin' ? 'kelvin' : 'auto' })}`;
}

/**
 * T as people read it in the hover and the report table, with what its k = 2
 * interval says: `T = 57 K (33 … 199 K, 95 %)` when the interval (the image of
 * β ± 2u(β)) is skewed by more than 10 %, `T = 57 ± 20 K` when it is not, and
 * for a saturated block the bound that is known, `|T| ≥ 33 K (95 %), either sign`.
 */
export function temperatureIntervalText(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  if (r.limit || !r.beta) return temperatureText(r, o);
  const { temperature: interval, temperatureBound: bound } = r.intervals;
  return temperatureWithInterval(r.temperature, interval, bound, r.status === 'saturated', o) ?? temperatureText(r, o);
}

/**
 * The interval-aware T text from plain numbers (for hosts that keep only
 * those, such as the run log): null when there is neither a temperature nor a bound.
 */
export function temperatureWithInterval(
  t: Measured | null,
  interval: readonly [number, number] | null,
  bound: number | null,
  saturated: boolean,
  o: DisplayOptions = DEFAULT_DISPLAY,
): string | null {
  const mode = o.temperature === 'kelvin' ? 'kelvin' : 'auto';
  if (t && interval && !saturated) {
    if (!temperatureSkewed(t, interval)) return measuredTemperatureText(t, o);
    return `T = ${formatTemperatureInterval(t.value, interval[0], interval[1], { digits: o.digits, mode })}`;
  }
  if (bound !== null) {
    const at = `|T| ≥ ${formatTemperature(bound, null, { digits: 2, mode })} (95 %), either sign`;
    return saturated || !t ? `${at}: saturated` : `T = ${formatTemperature(t.value, null, { digits: 2, mode })}; ${at}`;
  }
  return t && !saturated ? measuredTemperatureText(t, o) : null;
}

/** P as shown, with its k = 2 interval when P ± 2u(P) passes ±1 and is clipped there. */
export function polarizationText(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  const p = r.polarization;
  if (!p) return '—';
  const text = fractionText(p, o);
  const iv = r.intervals.polarization;
  if (!iv || !r.intervals.polarizationClipped) return text;
  const short: DisplayOptions = { ...o, digits: Math.min(o.digits, 3) };
  return `${text} (95 %: ${fractionText(iv[0], short)} … ${fractionText(iv[1], short)}, clipped at ±1)`;
}

/** β as shown, or its ±∞ limit. */
export function betaText(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  if (r.limit === 'zero-positive') return 'β → +∞';
  if (r.limit === 'zero-negative') return 'β → −∞';
  if (!r.beta) return 'β undefined';
  return `β = ${formatInverseTemperature(r.beta.value, r.beta.uncertainty, { digits: o.digits })}`;
}

/** A polarization (or any fraction) as shown. */
export function fractionText(m: Measured | number | null, o: DisplayOptions = DEFAULT_DISPLAY): string {
  if (m === null) return '—';
  const v = typeof m === 'number' ? { value: m, uncertainty: null } : m;
  // Below 0.1 % a percentage hides the digits that matter (thermal nuclear polarizations are ~10⁻⁵),
  // so small values are written as fractions with a power of ten.
  const percent = o.percent && (v.value === 0 || Math.abs(v.value) >= 1e-3);
  return formatFraction(v.value, v.uncertainty, { digits: o.digits, percent });
}

/** Enhancement ε = P / P_th as shown. */
export function enhancementText(e: number | null, o: DisplayOptions = DEFAULT_DISPLAY): string {
  return e === null ? '—' : formatNumber(e, Math.min(o.digits, 3));
}

/** Short one-line form, e.g. `T = 5.61 mK · P = 31 % · ε = 241`. */
export function shortSummary(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  const short: DisplayOptions = { ...o, digits: Math.min(o.digits, 3) };
  const parts: string[] = [];
  const extra = measurementShort(r);
  if (!r.beta && !r.limit && extra) return r.status === 'normal' ? extra : `${extra} · ${r.status}`;
  const t = temperatureText(r, short);
  const b = betaText(r, short);
  const noU = (s: string): string => s.replace(/ ± [^ ]+/, '');
  if (o.temperature === 'beta-first') parts.push(noU(b));
  else parts.push(noU(t));
  if (r.polarization) parts.push(`P = ${noU(fractionText(r.polarization.value, short))}`);
  if (r.enhancement !== null) parts.push(`ε = ${enhancementText(r.enhancement, short)}`);
  // The temperature text already says "saturated"; other statuses are added once.
  if (extra) parts.push(extra);
  if (r.status !== 'normal' && !parts[0].includes(r.status)) parts.push(r.status);
  return parts.join(' · ');
}

/**
 * Display strings of a block's results, shared by every host (hover, inlay
 * hints, report table) so that all show the same numbers the same way:
 * GUM rounding (two significant digits of the uncertainty), SI prefixes for
 * temperatures, β in K⁻¹.
 */
import type { BlockResults } from '../analysis/results';
import { formatFraction, formatInverseTemperature, formatNumber, formatTemperature } from './numbers';
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

/**
 * Display strings of a block's results, shared by every host (hover, inlay
 * hints, report table) so that all show the same numbers the same way:
 * GUM rounding (two significant digits of the uncertainty), SI prefixes for
 * temperatures, β in K⁻¹.
 */
import type { BlockResults } from '../analysis/results';
import { formatFraction, formatInverseTemperature, formatMeasured, formatNumber, formatTemperature } from './numbers';
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

/**
 * The status in words for one block: {@link STATUS_WORDS}, except that a block
 * without any temperature (only a time series, or only a gain) is not
 * described by a temperature it does not have.
 */
export function statusWords(status: Status, r: BlockResults | null): string {
  if (r && !r.beta && !r.limit && status === 'normal') {
    if (r.series) return 'normal: the series was fitted; the block gives no temperature';
    return 'normal: no temperature (no populations measured)';
  }
  return STATUS_WORDS[status];
}

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
  // One unit per setting everywhere (a column never mixes % and fractions); small values keep the unit
  // and take a power of ten instead (thermal nuclear polarizations are ~10⁻⁵).
  return formatFraction(v.value, v.uncertainty, { digits: o.digits, percent: o.percent });
}

/** Enhancement ε = P / P_th as shown, with its standard uncertainty when there is one. */
export function enhancementText(
  e: number | null,
  o: DisplayOptions = DEFAULT_DISPLAY,
  uncertainty: number | null = null,
): string {
  if (e === null) return '—';
  return uncertainty !== null && uncertainty > 0
    ? formatMeasured(e, uncertainty, { digits: o.digits })
    : formatNumber(e, Math.min(o.digits, 3));
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

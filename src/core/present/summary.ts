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
  formatMeasured,
  formatNumber,
  formatTemperature,
  formatTemperatureInterval,
  lowerBoundDigits,
} from './numbers';
import { temperatureSkewed } from '../analysis/intervals';
import { measurementShort } from './measurementSummary';
import type { Measured, Status } from '../types';
import { DEFAULT_DISPLAY, type DisplayOptions } from './displayOptions';

export { DEFAULT_DISPLAY, type DisplayOptions } from './displayOptions';

/**
 * What each status word means, for hovers and reports. The sentences hold for
 * degenerate levels too (the 21-cm pair, a rotational ladder): what counts is
 * the population per degeneracy, n/g.
 */
export const STATUS_WORDS: Readonly<Record<Status, string>> = {
  normal: 'normal: positive temperature, more population per degeneracy below',
  saturated: 'saturated: β is zero within its uncertainty (T → ±∞), levels equally populated per degeneracy',
  inverted: 'inverted: more population per degeneracy above, a negative temperature',
  'non-thermal': 'non-thermal: the levels do not follow one Boltzmann distribution',
  invalid: 'invalid: the block has an error',
};

/**
 * The status in words for one block: {@link statusText}, except that a block
 * without any temperature (only a time series, or only a gain) is not
 * described by a temperature it does not have.
 */
export function statusWords(status: Status, r: BlockResults | null): string {
  if (r && !r.beta && !r.limit && status === 'normal') {
    if (r.series) return 'normal: the series was fitted; the block gives no temperature';
    return 'normal: no temperature (no populations measured)';
  }
  return statusText(status, r);
}

/** The status sentence in the block's own trade's words (spin temperature for spins, excitation temperature elsewhere). */
export function statusText(status: Status, r: BlockResults | null): string {
  const name = r?.trade.temperatureName;
  if (!name) return STATUS_WORDS[status];
  switch (status) {
    case 'normal':
      return `normal: positive ${name}, more population per degeneracy below`;
    case 'inverted':
      return `inverted: more population per degeneracy above, a negative ${name}`;
    default:
      return STATUS_WORDS[status];
  }
}

/** The symbol of a block's temperature: T_ex for lines and transitions, T for spins and explicit levels. */
export function temperatureSymbol(r: BlockResults): string {
  const t = r.trade.trade;
  return t === 'emission' || t === 'radio' || t === 'optical' ? 'T_ex' : 'T';
}

/**
 * T as shown: a value (with kT in eV beside it for plasmas), a T → 0± limit,
 * T → ±∞ when saturated, or for a saturated radio line the limit the trade
 * quotes, `T_ex > 68 K at 95 %` (|T| ≥ 1/(|β| + 2u(β)), of either sign).
 */
export function temperatureText(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  const sym = temperatureSymbol(r);
  if (r.limit === 'zero-positive') return `${sym} → 0⁺`;
  if (r.limit === 'zero-negative') return `${sym} → 0⁻`;
  if (!r.beta) return `${sym} not determined (no populations measured)`;
  const bound = r.trade.temperatureLimit;
  if (r.status === 'saturated' && bound !== null)
    return `${sym} > ${formatTemperature(lowerBoundDigits(bound, Math.min(o.digits, 2)), null, { digits: Math.min(o.digits, 2), mode: o.temperature === 'kelvin' ? 'kelvin' : 'auto' })} at 95 %`;
  if (r.status === 'saturated' || !r.temperature) return `${sym} → ±∞ (saturated)`;
  const ev = r.trade.temperatureEv;
  const plasma = ev ? ` (kT = ${formatMeasured(ev.value, ev.uncertainty, { digits: o.digits })} eV)` : '';
  return measuredTemperatureText(r.temperature, o, sym) + plasma;
}

/** A finite temperature as shown, `T = 5.61 ± 0.19 mK`: GUM rounding, the unit prefix as the options say. */
export function measuredTemperatureText(t: Measured, o: DisplayOptions = DEFAULT_DISPLAY, symbol = 'T'): string {
  return `${symbol} = ${formatTemperature(t.value, t.uncertainty, { digits: o.digits, mode: o.temperature === 'kelvin' ? 'kelvin' : 'auto' })}`;
}

/** The temperature's value without its symbol: `T_ex = 10.0 kK` → `10.0 kK`, `T → ±∞` → `→ ±∞`. */
export function withoutSymbol(text: string): string {
  return text.replace(/^T(?:_ex)? = /, '').replace(/^T(?:_ex)? /, '');
}

/**
 * T as people read it in the hover and the report table, with what its k = 2
 * interval says: `T = 57 K (33 … 199 K, 95 %)` when the interval (the image of
 * β ± 2u(β)) is skewed by more than 10 %, `T = 57 ± 20 K` when it is not, and
 * for a saturated block the bound that is known, `|T| ≥ 33 K (95 %), either sign`.
 */
export function temperatureIntervalText(r: BlockResults, o: DisplayOptions = DEFAULT_DISPLAY): string {
  if (r.limit || !r.beta) return temperatureText(r, o);
  // A saturated radio line is quoted as that trade quotes it (temperatureText's `T_ex > … at 95 %`).
  if (r.status === 'saturated' && r.trade.temperatureLimit !== null) return temperatureText(r, o);
  const { temperature: interval, temperatureBound: bound } = r.intervals;
  const text = temperatureWithInterval(
    r.temperature,
    interval,
    bound,
    r.status === 'saturated',
    o,
    temperatureSymbol(r),
  );
  if (text === null) return temperatureText(r, o);
  const ev = r.trade.temperatureEv;
  return ev && r.status !== 'saturated'
    ? `${text} (kT = ${formatMeasured(ev.value, ev.uncertainty, { digits: o.digits })} eV)`
    : text;
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
  symbol = 'T',
): string | null {
  const mode = o.temperature === 'kelvin' ? 'kelvin' : 'auto';
  if (t && interval && !saturated) {
    if (!temperatureSkewed(t, interval)) return measuredTemperatureText(t, o, symbol);
    return `${symbol} = ${formatTemperatureInterval(t.value, interval[0], interval[1], { digits: o.digits, mode })}`;
  }
  if (bound !== null) {
    const at = `|${symbol}| ≥ ${formatTemperature(lowerBoundDigits(bound, 2), null, { digits: 2, mode })} (95 %), either sign`;
    return saturated || !t
      ? `${at}: saturated`
      : `${symbol} = ${formatTemperature(t.value, null, { digits: 2, mode })}; ${at}`;
  }
  return t && !saturated ? measuredTemperatureText(t, o, symbol) : null;
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
  const noU = (s: string): string => s.replace(/ ± [^ )]+/g, '');
  if (o.temperature === 'beta-first') parts.push(noU(b));
  else parts.push(noU(t));
  if (r.polarization) parts.push(`P = ${noU(fractionText(r.polarization.value, short))}`);
  if (r.enhancement !== null) parts.push(`ε = ${enhancementText(r.enhancement, short)}`);
  // The temperature text already says "saturated"; other statuses are added once.
  if (extra) parts.push(extra);
  if (r.status !== 'normal' && !parts[0].includes(r.status)) parts.push(r.status);
  return parts.join(' · ');
}

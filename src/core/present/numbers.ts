/**
 * Display strings for numbers and measured values.
 *
 * Values with an uncertainty follow the GUM convention (JCGM 100:2008 §7.2.6):
 * the standard uncertainty is given with two significant digits and the value
 * is rounded to the same decimal position, e.g. 10.057 62 with u = 0.027 18 →
 * `10.058 ± 0.027`. Display strings use the minus sign U+2212 and superscript
 * exponents (`1.2 × 10⁵`); a non-finite input gives `—`, never `NaN`.
 * {@link formatPlainNumber} is the exception: plain ASCII for CSV files.
 */

const DASH = '—';
const MINUS = '\u2212';
const SUPERSCRIPTS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

/** Decimal exponents outside [LOW, HIGH) are shown in scientific form by default. */
const DEFAULT_LIMITS = { high: 1e6, low: 1e-4 };

/** Writes an integer exponent in superscript digits, e.g. −5 → `⁻⁵`. */
function superscript(n: number): string {
  const digits = String(Math.abs(n)).replace(/\d/g, (d) => SUPERSCRIPTS[Number(d)]);
  return (n < 0 ? '⁻' : '') + digits;
}

/** Replaces an ASCII minus by U+2212 and drops the sign of a rounded zero (`-0.00` → `0.00`). */
function displaySign(text: string): string {
  if (/^-0(?:\.0*)?$/.test(text)) return text.slice(1);
  return text.startsWith('-') ? MINUS + text.slice(1) : text;
}

/**
 * |x| rounded half away from zero at the decimal power `position` (−3 rounds to
 * thousandths), as a whole number of 10^position. Works on the shortest decimal
 * form of x, so 298.15 rounds to 298.2 although its double is 298.149 99….
 */
function roundAt(x: number, position: number, direction: Rounding = 'nearest'): bigint {
  if (x === 0) return 0n;
  const [mantissa, exponent] = Math.abs(x).toExponential().split('e');
  const digits = mantissa.replace('.', '');
  const keep = Number(exponent) - position + 1;
  if (keep < 0) return direction === 'outward' ? 1n : 0n;
  const kept = keep === 0 ? 0n : BigInt(digits.slice(0, keep).padEnd(keep, '0'));
  if (direction === 'inward') return kept;
  if (direction === 'outward') return /[1-9]/.test(digits.slice(keep)) ? kept + 1n : kept;
  return (digits[keep] ?? '0') >= '5' ? kept + 1n : kept;
}

/**
 * How a bound is rounded for display: to the nearest, or in magnitude toward zero
 * (`inward`) or away from it (`outward`), so that a shown bound stays true: a lower
 * bound of a magnitude rounds inward, an interval's ends round away from its middle.
 */
type Rounding = 'nearest' | 'inward' | 'outward';

/**
 * A lower bound of a magnitude, x > 0, cut (never rounded up) to `digits`
 * significant digits: `|T| ≥ 67.9 K` shows as `≥ 67 K`, not `≥ 68 K`, which
 * would claim more than is known. The result's shortest decimal form is the cut one.
 */
export function lowerBoundDigits(x: number, digits: number): number {
  if (!Number.isFinite(x) || x <= 0) return x;
  const power = leadingPower(x) - Math.max(1, Math.floor(digits)) + 1;
  return Number(`${roundAt(x, power, 'inward')}e${power}`);
}

/** Decimal power of the leading digit of x ≠ 0 (exact: read from the shortest decimal form). */
function leadingPower(x: number): number {
  return Number(x.toExponential().split('e')[1]);
}

/** Writes ± n × 10^power in fixed notation with an ASCII minus; a zero has no sign. */
function render(n: bigint, power: number, negative: boolean): string {
  let text = n.toString();
  if (power >= 0) text = n === 0n ? '0' : text + '0'.repeat(power);
  else {
    text = text.padStart(1 - power, '0');
    text = `${text.slice(0, power)}.${text.slice(power)}`;
  }
  return negative && n !== 0n ? `-${text}` : text;
}

/**
 * The GUM pair `value ± u` (u > 0 finite) in fixed notation, both divided by
 * 10^shift: u keeps two significant digits and the value is rounded at the same
 * place. At most 17 digits below the leading digit are written (double precision).
 */
function pair(value: number, u: number, shift = 0): string {
  let position = leadingPower(u) - 1;
  if (roundAt(u, position) >= 100n) position += 1;
  position = Math.max(position, leadingPower(Math.max(Math.abs(value), u)) - 17);
  const v = render(roundAt(value, position), position - shift, value < 0);
  return `${displaySign(v)} ± ${render(roundAt(u, position), position - shift, false)}`;
}

/** Options shared by the measured-value formatters. */
export interface MeasuredOptions {
  /** Significant digits of a value without uncertainty; default 4. */
  readonly digits?: number;
}

function measured(value: number, u: number | null, digits: number, limits = DEFAULT_LIMITS): string {
  if (!Number.isFinite(value)) return DASH;
  if (u === null || u === 0) return numberText(value, digits, limits);
  if (!Number.isFinite(u) || u < 0) return `${numberText(value, digits, limits)} ± ${DASH}`;
  const scale = Math.max(Math.abs(value), u);
  if (scale < limits.high && scale >= limits.low) return pair(value, u);
  const n = leadingPower(scale);
  return `(${pair(value, u, n)}) × 10${superscript(n)}`;
}

/**
 * A value with its standard uncertainty by GUM §7.2.6 (two significant digits
 * of uncertainty, value to the same decimal place), e.g. `10.058 ± 0.027`.
 * Without uncertainty (null or 0) the value gets `digits` significant digits.
 * Magnitudes ≥ 10⁶ or < 10⁻⁴ use a common power of ten: `(2.400 ± 0.030) × 10¹⁶`.
 * A non-finite value gives `—`; a non-finite or negative uncertainty shows as `± —`.
 */
export function formatMeasured(value: number, uncertainty: number | null, opts: MeasuredOptions = {}): string {
  return measured(value, uncertainty, opts.digits ?? 4);
}

/**
 * `x` with `digits` significant digits (default 4; clamped to 1…21), e.g.
 * `0.003221`, `−14.43`, `3.221 × 10⁻⁵`. Scientific form outside
 * [10⁻⁴, 10⁶) in magnitude; zero is `0`, a non-finite input `—`.
 */
export function formatNumber(x: number, digits = 4): string {
  return numberText(x, digits, DEFAULT_LIMITS);
}

function numberText(x: number, digits: number, limits: { high: number; low: number }): string {
  if (!Number.isFinite(x)) return DASH;
  if (x === 0) return '0';
  const p = Math.min(21, Math.max(1, Math.round(digits)));
  let power = leadingPower(x);
  let n = roundAt(x, power - p + 1);
  if (n.toString().length > p) n = roundAt(x, ++power - p + 1); // 999.96 → 1000
  const magnitude = Math.abs(Number(`${n}e${power - p + 1}`));
  if (magnitude < limits.high && magnitude >= limits.low) return displaySign(render(n, power - p + 1, x < 0));
  const s = n.toString();
  const mantissa = (x < 0 ? MINUS : '') + s[0] + (s.length > 1 ? `.${s.slice(1)}` : '');
  return `${mantissa} × 10${superscript(power)}`;
}

/** Options of {@link formatTemperature}. */
export interface TemperatureOptions extends MeasuredOptions {
  /** `auto` (default) picks K, mK, µK or nK; `kelvin` always writes K. */
  readonly mode?: 'auto' | 'kelvin';
}

const PREFIXES: ReadonlyArray<readonly [unit: string, factor: number]> = [
  ['K', 1],
  ['mK', 1e-3],
  ['µK', 1e-6],
  ['nK', 1e-9],
];

/**
 * A temperature given in kelvin (negative temperatures keep their sign), e.g.
 * `14.43 ± 0.42 K`, `5.61 ± 0.19 mK`, `−14.43 ± 0.42 K`. In `auto` mode the
 * prefix follows |T| (by the uncertainty when T = 0); |T| ≥ 10⁵ K or < 10⁻⁹ K
 * is written in kelvin with a power of ten (`1.200 × 10⁵ K`). A non-finite T
 * (β = 0) gives `—`.
 */
export function formatTemperature(kelvin: number, uncertainty: number | null, opts: TemperatureOptions = {}): string {
  if (!Number.isFinite(kelvin)) return DASH;
  const digits = opts.digits ?? 4;
  if (opts.mode === 'kelvin') return `${measured(kelvin, uncertainty, digits)} K`;
  const size = kelvin !== 0 ? Math.abs(kelvin) : Math.abs(uncertainty ?? 0);
  if (size >= 1e5 || (size > 0 && size < 1e-9)) {
    return `${measured(kelvin, uncertainty, digits, { high: 1e5, low: 1e-9 })} K`;
  }
  const [unit, factor] = PREFIXES.find(([, f]) => size >= f) ?? PREFIXES[0];
  const u = uncertainty === null ? null : uncertainty / factor;
  return `${measured(kelvin / factor, u, digits, { high: Infinity, low: 0 })} ${unit}`;
}

/**
 * An inverse temperature β in K⁻¹, e.g. `0.0693 ± 0.0020 K⁻¹`; scientific form
 * (`(1.234 ± 0.056) × 10⁸ K⁻¹`) for magnitudes ≥ 10⁶ or < 10⁻⁴. β = 0 is `0 K⁻¹`.
 */
export function formatInverseTemperature(beta: number, uncertainty: number | null, opts: MeasuredOptions = {}): string {
  if (!Number.isFinite(beta)) return DASH;
  return `${measured(beta, uncertainty, opts.digits ?? 4)} K⁻¹`;
}

/** Options of {@link formatFraction}. */
export interface FractionOptions extends MeasuredOptions {
  /** Write as a percentage (`31.2 ± 1.0 %`) instead of a fraction (`0.312 ± 0.010`). */
  readonly percent?: boolean;
}

/** A dimensionless fraction such as a polarization, by the same GUM rule; optionally in percent. */
export function formatFraction(p: number, uncertainty: number | null, opts: FractionOptions = {}): string {
  if (!Number.isFinite(p)) return DASH;
  const k = opts.percent ? 100 : 1;
  // In percent, below 0.01 % (a fraction of 10⁻⁴) the fixed form would be mostly zeros: a power of ten
  // takes over at the same fraction in both units, so "%" and fractions switch at the same P.
  const limits = opts.percent ? { high: DEFAULT_LIMITS.high, low: 1e-2 } : DEFAULT_LIMITS;
  const text = measured(p * k, uncertainty === null ? null : uncertainty * k, opts.digits ?? 4, limits);
  return opts.percent ? `${text} %` : text;
}

/**
 * A temperature with its coverage interval, `57 K (33 … 199 K, 95 %)`: the
 * three numbers in one unit (chosen by the value's size, as
 * {@link formatTemperature} chooses it), rounded where two significant digits
 * of the interval's shorter side end (the GUM §7.2.6 rule applied to the
 * nearer bound). An end that is a million or more of the unit is written with
 * a power of ten. A non-finite input gives `—`.
 */
export function formatTemperatureInterval(
  kelvin: number,
  low: number,
  high: number,
  opts: TemperatureOptions & { readonly level?: string } = {},
): string {
  if (!Number.isFinite(kelvin) || !Number.isFinite(low) || !Number.isFinite(high)) return DASH;
  const arm = Math.min(Math.abs(kelvin - low), Math.abs(high - kelvin));
  if (!(arm > 0)) return formatTemperature(kelvin, null, opts);
  const size = Math.abs(kelvin);
  const [unit, factor] =
    opts.mode === 'kelvin' || size >= 1e5 || size < 1e-9
      ? (['K', 1] as const)
      : (PREFIXES.find(([, f]) => size >= f) ?? PREFIXES[0]);
  let position = leadingPower(arm / factor) - 1;
  position = Math.max(position, leadingPower(Math.max(size / factor, arm / factor)) - 17);
  const text = (x: number, rounding: Rounding): string => {
    const v = x / factor;
    if (Math.abs(v) >= 1e6 || (v !== 0 && Math.abs(v) < 1e-4 && position < -6)) return numberText(v, 2, DEFAULT_LIMITS);
    return displaySign(render(roundAt(v, position, rounding), position, v < 0));
  };
  // The ends are rounded away from the middle (the low one toward −∞, the high one toward +∞), so that the
  // interval shown holds the computed one.
  const lowText = text(low, low < 0 ? 'outward' : 'inward');
  const highText = text(high, high < 0 ? 'inward' : 'outward');
  return `${text(kelvin, 'nearest')} ${unit} (${lowText} … ${highText} ${unit}, ${opts.level ?? '95 %'})`;
}

/**
 * Plain ASCII for CSV and other machine-read text: the shortest string that
 * reads back as the same double (`0.005613`, `2.4e+16`, `-3`). A non-finite
 * input gives the empty string (an empty cell); JSON writers should use null.
 */
export function formatPlainNumber(x: number): string {
  return Number.isFinite(x) ? String(x) : '';
}

/**
 * Short number texts for axis ticks, chart labels and the temperature
 * reading of the β axis. The formatted facts beside the chart come from the
 * core (GUM rounding); these are only for the drawing.
 */

const SUPERSCRIPT = '⁰¹²³⁴⁵⁶⁷⁸⁹';
const MINUS = '\u2212';

/** `x` with about three significant digits, scientific (`1.2×10⁻⁵`) outside [10⁻³, 10⁶). */
export function shortNumber(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) {
    const [m, e] = x.toExponential(Math.max(0, digits - 2)).split('e');
    const exp = Number(e);
    const sup = (exp < 0 ? '⁻' : '') + String(Math.abs(exp)).replace(/\d/g, (d) => SUPERSCRIPT[Number(d)]!);
    return `${m!.replace(/\.?0+$/, '').replace('-', MINUS)}×10${sup}`;
  }
  return String(Number(x.toPrecision(digits))).replace('-', MINUS);
}

const PREFIXES: readonly [string, number][] = [
  ['K', 1],
  ['mK', 1e-3],
  ['µK', 1e-6],
  ['nK', 1e-9],
];

/** A temperature in K with an SI prefix chosen from its size, e.g. `−5.6 mK`; `±∞` for an infinite one. */
export function shortTemperature(kelvin: number): string {
  if (!Number.isFinite(kelvin)) return '±∞';
  const a = Math.abs(kelvin);
  const [unit, factor] = PREFIXES.find(([, f]) => a >= f) ?? (a === 0 ? PREFIXES[0]! : PREFIXES[PREFIXES.length - 1]!);
  return `${shortNumber(kelvin / factor)} ${unit}`;
}

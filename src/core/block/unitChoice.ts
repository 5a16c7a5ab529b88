/**
 * Which units a bare number could have meant, judged by magnitude: the units
 * its siblings in the block use, kept only where the value then falls in the
 * known range of the key and within the spread of its siblings, most
 * plausible (closest on a log scale to the siblings' middle) first. A fix
 * built from this list never turns a 13 eV atomic level into 105 keV.
 */
import { convert, parseQuantity, type Dimension } from '../quantities/units';

/** A sibling value as written: its unit and its value in the canonical unit. */
export interface Sibling {
  readonly unit: string;
  readonly canonical: number;
}

/** Where a key's values plausibly lie, in the canonical unit, and how far from its siblings a value may stray. */
export interface PlausibleRange {
  readonly low: number;
  readonly high: number;
  /** A value more than this factor outside the siblings' span is implausible. */
  readonly spread: number;
}

/** The outcome: units to offer (best first) and those ruled out with the canonical value they would give. */
export interface UnitChoice {
  readonly offer: readonly string[];
  readonly ruledOut: readonly { readonly unit: string; readonly canonical: number }[];
}

/** Reads the siblings' written quantities (text as written) into units and canonical values; unreadable ones are skipped. */
export function siblingsOf(texts: readonly string[], dim: Dimension): Sibling[] {
  const out: Sibling[] = [];
  for (const t of texts) {
    const q = parseQuantity(t);
    if ('problem' in q || q.quantity.unit === null) continue;
    const c = convert(q.quantity, dim);
    if ('problem' in c) continue;
    out.push({ unit: q.quantity.unit, canonical: c.value });
  }
  return out;
}

/**
 * The units for a bare `value`: each distinct sibling unit (then `fallback`
 * when no sibling has one) is tried; it is offered when the converted value
 * lies in `range` and within `range.spread` of the siblings' smallest and
 * largest magnitudes (zero fits every unit).
 */
export function chooseUnits(
  value: number,
  dim: Dimension,
  siblings: readonly Sibling[],
  range: PlausibleRange,
  fallback: readonly string[],
): UnitChoice {
  const units = [...new Set(siblings.map((s) => s.unit))];
  if (units.length === 0) units.push(...fallback);
  const mags = siblings.map((s) => Math.abs(s.canonical)).filter((m) => m > 0);
  // Loops, not spreads: a list of a few hundred thousand siblings would overflow the stack.
  const least = mags.reduce((m, x) => Math.min(m, x), Infinity);
  const most = mags.reduce((m, x) => Math.max(m, x), -Infinity);
  const lo = mags.length ? least / range.spread : range.low;
  const hi = mags.length ? most * range.spread : range.high;
  const middle = mags.length ? Math.sqrt(least * most) : Math.sqrt(range.low * range.high);
  const scored: { unit: string; canonical: number; score: number; ok: boolean }[] = [];
  for (const unit of units) {
    const q = parseQuantity(`${value} ${unit}`);
    if ('problem' in q) continue;
    const c = convert(q.quantity, dim);
    if ('problem' in c) continue;
    const m = Math.abs(c.value);
    const ok = m === 0 || (m >= range.low && m <= range.high && m >= lo && m <= hi);
    scored.push({ unit, canonical: c.value, score: m === 0 ? 0 : Math.abs(Math.log10(m / middle)), ok });
  }
  scored.sort((a, b) => a.score - b.score);
  return {
    offer: scored.filter((s) => s.ok).map((s) => s.unit),
    ruledOut: scored.filter((s) => !s.ok).map((s) => ({ unit: s.unit, canonical: s.canonical })),
  };
}

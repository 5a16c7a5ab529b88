/**
 * Axis ranges of the measurement chart. Loops rather than `Math.min(...values)`:
 * a spread passes every value as a call argument, and a series of a few hundred
 * thousand points would overflow the page's stack and leave the chart blank.
 */

/** The values' range widened by 8 % each side (by 1 each side when all are equal). */
export function paddedRange(values: readonly number[]): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (!(max > min)) {
    min = Number.isFinite(min) ? min - 1 : -1;
    max = Number.isFinite(max) ? max + 1 : 1;
  }
  const pad = (max - min) * 0.08;
  return { min: min - pad, max: max + pad };
}

/** The largest |v|, at least `floor`. */
export function largestMagnitude(values: readonly number[], floor: number): number {
  let m = floor;
  for (const v of values) m = Math.max(m, Math.abs(v));
  return m;
}

/** Timing helpers of the benchmarks: medians and percentiles of repeated runs. */

/** The q-quantile (0 ≤ q ≤ 1) of the values, by the nearest-rank method. */
export function quantile(values: readonly number[], q: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.min(sorted.length, Math.max(1, Math.ceil(q * sorted.length)));
  return sorted[rank - 1]!;
}

/** The median (nearest rank, the lower middle for an even count). */
export function median(values: readonly number[]): number {
  return quantile(values, 0.5);
}

/** Milliseconds since an arbitrary origin, sub-millisecond resolution. */
export function now(): number {
  return performance.now();
}

/** Milliseconds taken by one call. */
export function timeOnce(fn: () => void): number {
  const start = now();
  fn();
  return now() - start;
}

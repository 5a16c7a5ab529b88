/** Builds a {@link Spectrum} with its points sorted by increasing x, whatever order the file stores them in. */
import type { Spectrum } from './types';

type Rest = Omit<Spectrum, 'x' | 'y' | 'descending'>;

export function sortedSpectrum(xs: ArrayLike<number>, ys: ArrayLike<number>, rest: Rest): Spectrum {
  const n = Math.min(xs.length, ys.length);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let ascending = true;
  let descending = true;
  for (let i = 1; i < n; i++) {
    if (xs[i]! < xs[i - 1]!) ascending = false;
    if (xs[i]! > xs[i - 1]!) descending = false;
  }
  if (ascending) {
    for (let i = 0; i < n; i++) [x[i], y[i]] = [xs[i]!, ys[i]!];
  } else if (descending) {
    for (let i = 0; i < n; i++) [x[n - 1 - i], y[n - 1 - i]] = [xs[i]!, ys[i]!];
  } else {
    const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => xs[a]! - xs[b]! || a - b);
    for (let i = 0; i < n; i++) [x[i], y[i]] = [xs[order[i]!]!, ys[order[i]!]!];
  }
  return { ...rest, x, y, descending: !ascending && n > 1 && xs[0]! > xs[n - 1]! };
}

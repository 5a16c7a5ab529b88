/**
 * "Did you mean …" helpers shared by isotope symbols, units and block keys.
 *
 * The distance is the optimal-string-alignment form of the Damerau–Levenshtein
 * distance: insertions, deletions, substitutions and transpositions of two
 * adjacent characters each cost 1, and no substring is edited twice. It counts
 * Unicode code points, not UTF-16 units, so `µ` and `°` count as one character.
 */

/**
 * Edit distance between `a` and `b` (Damerau–Levenshtein, optimal string
 * alignment, case-sensitive).
 *
 * @param bound optional limit: as soon as the distance is known to exceed it,
 *   the function stops and returns `bound + 1`. Must be ≥ 0; default unbounded.
 * @returns the distance, or `bound + 1` when it is larger than `bound`.
 */
export function editDistance(a: string, b: string, bound = Number.POSITIVE_INFINITY): number {
  // A string of n UTF-16 units holds n/2 to n code points: when even the nearest counts differ by more than
  // the bound, the answer is known before either string is split (a pasted megabyte costs nothing here).
  if (Math.max(Math.ceil(a.length / 2) - b.length, Math.ceil(b.length / 2) - a.length) > bound) return bound + 1;
  const s = Array.from(a);
  const t = Array.from(b);
  if (Math.abs(s.length - t.length) > bound) return bound + 1;
  if (s.length === 0 || t.length === 0) return Math.max(s.length, t.length);
  // Three rolling rows: two back (for transpositions), previous, current.
  let before = new Array<number>(t.length + 1).fill(0);
  let previous = Array.from({ length: t.length + 1 }, (_, j) => j);
  let current = new Array<number>(t.length + 1).fill(0);
  for (let i = 1; i <= s.length; i++) {
    current[0] = i;
    let rowMin = current[0];
    for (let j = 1; j <= t.length; j++) {
      const cost = s[i - 1] === t[j - 1] ? 0 : 1;
      let d = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      if (i > 1 && j > 1 && s[i - 1] === t[j - 2] && s[i - 2] === t[j - 1]) {
        d = Math.min(d, before[j - 2] + 1);
      }
      current[j] = d;
      if (d < rowMin) rowMin = d;
    }
    if (rowMin > bound) return bound + 1;
    [before, previous, current] = [previous, current, before];
  }
  const result = previous[t.length];
  return result > bound ? bound + 1 : result;
}

/** Options of {@link closest}. */
export interface ClosestOptions {
  /** Compare lower-cased forms (the returned candidate keeps its own case). Default false. */
  readonly ignoreCase?: boolean;
}

/**
 * The candidate nearest to `word` by {@link editDistance}, or null when none is
 * within `maxDistance`. Ties go to the candidate listed first, so callers order
 * candidates by preference. A candidate equal to `word` is returned as is.
 */
export function closest(
  word: string,
  candidates: Iterable<string>,
  maxDistance: number,
  options: ClosestOptions = {},
): string | null {
  const fold = (x: string): string => (options.ignoreCase ? x.toLowerCase() : x);
  const target = fold(word);
  let best: string | null = null;
  let bestDistance = maxDistance + 1;
  for (const candidate of candidates) {
    const d = editDistance(target, fold(candidate), bestDistance - 1);
    if (d < bestDistance) {
      best = candidate;
      bestDistance = d;
      if (d === 0) break;
    }
  }
  return best;
}

/**
 * Up to `count` candidates within `maxDistance` of `word` by {@link editDistance}, nearest first, ties in
 * code-unit order of the candidates.
 */
export function nearest(
  word: string,
  candidates: Iterable<string>,
  maxDistance: number,
  count: number,
  options: ClosestOptions = {},
): string[] {
  const fold = (x: string): string => (options.ignoreCase ? x.toLowerCase() : x);
  const target = fold(word);
  const scored: { candidate: string; d: number }[] = [];
  for (const candidate of candidates) {
    const d = editDistance(target, fold(candidate), maxDistance);
    if (d <= maxDistance) scored.push({ candidate, d });
  }
  scored.sort((a, b) => a.d - b.d || (a.candidate < b.candidate ? -1 : a.candidate > b.candidate ? 1 : 0));
  return scored.slice(0, count).map((s) => s.candidate);
}

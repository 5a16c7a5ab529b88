/**
 * How much two versions of a note share at their start and at their end, so
 * that an edit is re-read from where it begins to where the old text resumes.
 * Whole chunks are compared with string equality, which the engine does
 * natively (a memory comparison), and only the last, differing chunk
 * character by character: a 1 MB note costs a fraction of a millisecond
 * instead of a million JavaScript-level comparisons.
 */

/**
 * Index of the first item whose key is at least `value`, in items sorted by that key (binary search):
 * the one search of every list of blocks by offset.
 */
export function firstAtLeast<T>(items: readonly T[], key: (item: T) => number, value: number): number {
  let lo = 0;
  let hi = items.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (key(items[mid]!) < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Where a fenced block lies in its note, fence lines included. */
interface Extent {
  readonly openStart: number;
  readonly blockEnd: number;
}

/**
 * The items whose block meets the note offsets [from, to] (ends included), in note order: found by binary search,
 * so that a request about a few lines of a large note reads only the blocks there.
 */
export function blocksMeeting<T>(items: readonly T[], extent: (item: T) => Extent, from: number, to: number): T[] {
  const out: T[] = [];
  for (let i = firstAtLeast(items, (x) => extent(x).blockEnd, from); i < items.length; i++) {
    if (extent(items[i]!).openStart > to) break;
    out.push(items[i]!);
  }
  return out;
}

/** The item whose block holds the note offset (ends included), or undefined; by binary search. */
export function blockHoldingOffset<T>(items: readonly T[], extent: (item: T) => Extent, offset: number): T | undefined {
  const b = items[firstAtLeast(items, (x) => extent(x).blockEnd, offset)];
  return b !== undefined && extent(b).openStart <= offset ? b : undefined;
}

/**
 * A copy of a string that shares no memory with the string it came from.
 * JavaScript engines keep a substring as a view into its parent (V8 does for
 * 13 characters and more), so a body or a piece sliced from a note and kept
 * would keep that whole version of the note alive. Slicing a concatenation
 * makes the engine lay the concatenation out flat first, in new memory, and
 * the slice then views that copy: one copy, far cheaper than a round trip
 * through JSON.
 */
export function ownCopy(s: string): string {
  return (s + ' ').slice(0, -1);
}

/** Characters compared at once; big enough that the per-chunk cost vanishes, small enough to waste little past the change. */
const CHUNK = 4096;

/** Length of the longest common prefix of `a` and `b`. */
export function commonPrefix(a: string, b: string): number {
  const n = Math.min(a.length, b.length);
  let i = 0;
  while (i + CHUNK <= n && a.slice(i, i + CHUNK) === b.slice(i, i + CHUNK)) i += CHUNK;
  while (i < n && a.charCodeAt(i) === b.charCodeAt(i)) i++;
  return i;
}

/**
 * Length of the longest common suffix of `a` and `b` that leaves the first
 * `prefix` characters of both alone, so that prefix and suffix never overlap
 * (with `aaa` → `aaaa` the change is one inserted character, not a negative one).
 */
export function commonSuffix(a: string, b: string, prefix: number): number {
  const n = Math.min(a.length, b.length) - prefix;
  let i = 0;
  while (i + CHUNK <= n && a.slice(a.length - i - CHUNK, a.length - i) === b.slice(b.length - i - CHUNK, b.length - i))
    i += CHUNK;
  while (i < n && a.charCodeAt(a.length - 1 - i) === b.charCodeAt(b.length - 1 - i)) i++;
  return i;
}

/** Characters of a note that a message quotes at most (common practice for readable messages, no source). */
export const QUOTE_CHARS = 60;

/** Characters of an id or a label shown as a name (a hover's title, the outline); the reports keep it whole. */
export const NAME_CHARS = 80;

/** A quotation between backticks longer than {@link QUOTE_CHARS}. */
const LONG_QUOTE = new RegExp(`\`([^\`]{${QUOTE_CHARS + 1},})\``, 'g');

/** A message no longer than this whole, when even its quotations clipped leave it longer. */
const MESSAGE_CHARS = 2000;

/** `s` cut to at most `max` UTF-16 units, ending in `…` when cut; never inside a surrogate pair. */
export function clipText(s: string, max = QUOTE_CHARS): string {
  if (s.length <= max) return s;
  let end = max - 1;
  const last = s.charCodeAt(end - 1);
  if (last >= 0xd800 && last <= 0xdbff) end--;
  return `${s.slice(0, end)}…`;
}

/**
 * A message with every stretch of the note it quotes (between backticks) clipped to {@link QUOTE_CHARS}, and
 * the whole to {@link MESSAGE_CHARS}: a pasted megabyte in a unit or a key makes a message of a line, not of
 * a megabyte, in the editor and in every report. A short message is returned as it is.
 */
export function clipQuotes(message: string): string {
  if (message.length <= 2 * QUOTE_CHARS) return message;
  const clipped = message.replace(LONG_QUOTE, (_, quoted: string) => `\`${clipText(quoted)}\``);
  return clipText(clipped, MESSAGE_CHARS);
}

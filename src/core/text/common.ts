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

/** A character next to which a backtick cannot delimit a quotation: a letter, a digit, `_` or a backtick. */
const WORDLIKE = /[\p{L}\p{N}_`]/u;

/**
 * The quotations of a message, as [opening, closing] backtick offsets, and the backticks that belong to none.
 *
 * Messages quote names and values of the note between single backticks, and quoted note text may hold backticks
 * of its own, so the backticks cannot simply be paired in turn. A delimiter of ours always stands apart from the
 * words around it: an opening one after the start, a space or a punctuation mark, a closing one before the end,
 * a space or a punctuation mark. Inside a quotation, the closing backtick is the first such one after which the
 * next backtick (if any) can open a quotation; failing that, the last one that can close. A backtick in note text
 * between two letters, as in `a`b`, is never taken for a delimiter. Linear in the number of backticks.
 */
function quotations(message: string): { spans: [number, number][]; strays: number[] } {
  const ticks: number[] = [];
  for (let i = message.indexOf('`'); i >= 0; i = message.indexOf('`', i + 1)) ticks.push(i);
  const apart = (i: number): boolean => i < 0 || i >= message.length || !WORDLIKE.test(message[i]!);
  const canOpen = ticks.map((t) => apart(t - 1));
  const canClose = ticks.map((t) => apart(t + 1));
  // From the end: the first closing backtick at or after each one that the next backtick could follow as an opening
  // one, and the last closing backtick of all, so that each quotation is found at once (a pasted run of backticks
  // makes no quadratic search).
  const n = ticks.length;
  const nextFit = new Array<number>(n + 1).fill(-1);
  let lastClose = -1;
  for (let j = n - 1; j >= 0; j--) {
    nextFit[j] = canClose[j] && (j + 1 === n || canOpen[j + 1]) ? j : nextFit[j + 1]!;
    if (lastClose < 0 && canClose[j]) lastClose = j;
  }
  const spans: [number, number][] = [];
  const strays: number[] = [];
  for (let k = 0; k < n;) {
    const close = !canOpen[k] ? -1 : nextFit[k + 1]! >= 0 ? nextFit[k + 1]! : lastClose > k ? lastClose : -1;
    if (close < 0) {
      strays.push(ticks[k++]!);
      continue;
    }
    spans.push([ticks[k]!, ticks[close]!]);
    k = close + 1;
  }
  return { spans, strays };
}

/**
 * Quoted text as a code span that no backtick in it can end (CommonMark 0.31.2 §6.1): between single backticks
 * when it holds none, as every message writes it; otherwise fenced with one backtick more than its longest run
 * of them, and padded with a space where it starts or ends with a backtick or a space (a renderer strips one
 * space from each side).
 */
function codeSpan(text: string): string {
  if (!text.includes('`')) return `\`${text}\``;
  let longest = 0;
  for (const run of text.match(/`+/g) ?? []) longest = Math.max(longest, run.length);
  const fence = '`'.repeat(longest + 1);
  const pad = /^[` ]|[` ]$/.test(text) ? ' ' : '';
  return `${fence}${pad}${text}${pad}${fence}`;
}

/**
 * A message with every stretch of the note it quotes (between backticks) clipped to {@link QUOTE_CHARS}, and
 * the whole to {@link MESSAGE_CHARS}: a pasted megabyte in a unit or a key makes a message of a line, not of
 * a megabyte, in the editor and in every report.
 *
 * Quoted note text that holds backticks itself is fenced anew (see {@link quotations} and {@link codeSpan}), so
 * it stays inside its quotation when the message is read as Markdown, and only quoted text is ever clipped,
 * never the message's own words; a backtick that delimits nothing is escaped. The whole is cut, when it must be,
 * before a quotation rather than inside it. A message whose backticks all pair up into short quotations that hold
 * none (every message about ordinary note text) is returned as it is.
 */
export function clipQuotes(message: string): string {
  if (!message.includes('`')) return clipText(message, MESSAGE_CHARS);
  const { spans, strays } = quotations(message);
  let out = '';
  // Where each quotation stands in the result, so that the cut to MESSAGE_CHARS falls outside every one.
  const placed: [number, number][] = [];
  let from = 0;
  let stray = 0;
  const prose = (to: number): void => {
    for (; stray < strays.length && strays[stray]! < to; stray++) {
      out += `${message.slice(from, strays[stray])}\\\``;
      from = strays[stray]! + 1;
    }
    out += message.slice(from, to);
  };
  for (const [open, close] of spans) {
    prose(open);
    const start = out.length;
    out += codeSpan(clipText(message.slice(open + 1, close)));
    placed.push([start, out.length]);
    from = close + 1;
  }
  prose(message.length);
  if (out.length <= MESSAGE_CHARS) return out;
  let cut = MESSAGE_CHARS - 1;
  for (const [start, end] of placed) if (start < cut && cut < end) cut = start;
  const last = out.charCodeAt(cut - 1);
  if (last >= 0xd800 && last <= 0xdbff) cut--;
  return `${out.slice(0, cut)}…`;
}

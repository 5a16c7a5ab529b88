/**
 * How many columns a terminal gives text (UAX #11 East Asian Width, the emoji of UTS #51, the characters of
 * UAX #29 that a table holds), and the table's ways to make text fit: wrapping at spaces and shortening a cell
 * with an ellipsis, never inside a character.
 */

/**
 * Code points shown two columns wide: the East Asian Wide (W) and Fullwidth (F) ranges of Unicode Standard Annex
 * #11 (East Asian Width), from its data file EastAsianWidth.txt (Unicode 15.1), outside the emoji, which
 * `Emoji_Presentation` covers below: Hangul Jamo leading consonants, the angle brackets U+2329–U+232A, the CJK
 * radicals, symbols and punctuation, kana, Bopomofo, Hangul compatibility Jamo, the enclosed CJK letters (less the
 * ambiguous U+3248–U+324F), the CJK compatibility block, CJK Extension A, the unified ideographs, Yi, Hangul Jamo
 * Extended-A, the Hangul syllables, the compatibility ideographs, the vertical, compatibility and small forms, the
 * fullwidth forms, Tangut, Khitan, the kana supplements, Nushu, the enclosed ideographic supplement, and planes 2
 * and 3 (whose unassigned code points the file also gives W). Sorted, for a binary search.
 */
const WIDE: readonly (readonly [number, number])[] = [
  [0x1100, 0x115f],
  [0x2329, 0x232a],
  [0x2e80, 0x303e],
  [0x3041, 0x3247],
  [0x3250, 0x4dbf],
  [0x4e00, 0xa4cf],
  [0xa960, 0xa97f],
  [0xac00, 0xd7a3],
  [0xf900, 0xfaff],
  [0xfe10, 0xfe19],
  [0xfe30, 0xfe6f],
  [0xff00, 0xff60],
  [0xffe0, 0xffe6],
  [0x16fe0, 0x16fe4],
  [0x16ff0, 0x16ff1],
  [0x17000, 0x18cff],
  [0x18d00, 0x18d08],
  [0x1aff0, 0x1b2ff],
  [0x1f200, 0x1f2ff],
  [0x20000, 0x3fffd],
];

function inWide(cp: number): boolean {
  let lo = 0;
  let hi = WIDE.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const [from, to] = WIDE[mid]!;
    if (cp < from) hi = mid - 1;
    else if (cp > to) lo = mid + 1;
    else return true;
  }
  return false;
}

/**
 * Code points that take no column of their own: nonspacing and enclosing marks (Mn, Me: the combining accents,
 * the keycap), format characters (Cf: zero-width space and joiners, bidirectional marks, the soft hyphen, tags),
 * the other default ignorables (variation selectors, the Hangul fillers) and controls (none are left in the
 * table's text).
 */
const ZERO_WIDTH = /[\p{Mn}\p{Me}\p{Cf}\p{Default_Ignorable_Code_Point}\p{Cc}]/u;
/** Pictographs shown as emoji by default (Unicode Technical Standard #51, §4): two columns wide, as W in UAX #11. */
const EMOJI = /\p{Emoji_Presentation}/u;
/** Characters that U+FE0F turns into an emoji (UTS #51 §1.4.3: `❤️`, `1️⃣`). */
const EMOJI_CHARACTER = /\p{Emoji}/u;
/** What a zero width joiner joins into one emoji (UTS #51 §2.3, emoji ZWJ sequences). */
const PICTOGRAPHIC = /\p{Extended_Pictographic}/u;
/** Text that is one column per UTF-16 unit: printable ASCII, Latin-1 and Latin Extended, Greek, and the table's signs (– — ± × ⁻ → ≥ ∞). */
const NARROW =
  /^[\x20-\x7e\xa0-\xac\xae-\u02ff\u0370-\u03ff\u2010-\u2027\u2030-\u205e\u2070-\u209f\u2190-\u21ff\u2200-\u22ff]*$/;

const isRegional = (cp: number): boolean => cp >= 0x1f1e6 && cp <= 0x1f1ff;
/** Hangul vowel and trailing consonant Jamo, which join the syllable before them (UAX #29, rule GB7–GB8). */
const isJamoTail = (cp: number): boolean => (cp >= 0x1160 && cp <= 0x11ff) || (cp >= 0xd7b0 && cp <= 0xd7ff);
const isHangul = (cp: number): boolean =>
  (cp >= 0x1100 && cp <= 0x11ff) || (cp >= 0xa960 && cp <= 0xa97f) || (cp >= 0xac00 && cp <= 0xd7ff);

/**
 * Calls `f` with the start (UTF-16 offset) and the columns of each character of `s` as people see one: a base
 * with the marks, joiners and selectors after it, a Hangul syllable with its vowel and final Jamo, an emoji with its
 * skin tone or the pictographs a zero width joiner adds, a pair of regional indicators (a flag), after the extended
 * grapheme clusters of UAX #29 for what a table holds. A character takes two columns when its base is wide or an
 * emoji, or U+FE0F gives it emoji presentation; none when it is only marks; one otherwise. One pass, no segmenter
 * (`Intl.Segmenter` costs time and memory that grow faster than the text: a pasted 100,000-character id).
 */
function eachCharacter(s: string, f: (start: number, width: number) => void): void {
  let start = -1;
  let width = 0;
  let base = -1;
  let afterJoiner = false;
  let regionals = 0;
  for (let i = 0; i < s.length;) {
    const cp = s.codePointAt(i)!;
    const ch = cp > 0xffff ? s.slice(i, i + 2) : s[i]!;
    const joins =
      start >= 0 &&
      (ZERO_WIDTH.test(ch) ||
        (cp >= 0x1f3fb && cp <= 0x1f3ff) ||
        (afterJoiner && PICTOGRAPHIC.test(ch)) ||
        (isRegional(cp) && regionals === 1) ||
        (isJamoTail(cp) && isHangul(base)));
    if (joins) {
      if (cp === 0xfe0f && base >= 0 && EMOJI_CHARACTER.test(String.fromCodePoint(base))) width = 2;
      if (isRegional(cp)) regionals++;
    } else {
      if (start >= 0) f(start, width);
      start = i;
      const zero = ZERO_WIDTH.test(ch);
      base = zero ? -1 : cp;
      width = zero ? 0 : inWide(cp) || EMOJI.test(ch) ? 2 : 1;
      regionals = isRegional(cp) ? 1 : 0;
    }
    afterJoiner = cp === 0x200d;
    i += ch.length;
  }
  if (start >= 0) f(start, width);
}

/**
 * The columns a terminal gives `s` (see {@link eachCharacter}). Ambiguous-width characters (A) count one, as
 * UAX #11 advises where the context is not East Asian.
 */
export function textWidth(s: string): number {
  if (NARROW.test(s)) return s.length;
  let width = 0;
  eachCharacter(s, (_, w) => (width += w));
  return width;
}

/** Breaks text at spaces into lines of at most `width` characters (a longer word stays whole); later lines get `indent`. */
export function wrap(text: string, width: number, indent: string): string[] {
  const lines: string[] = [];
  let current = '';
  for (const word of text.split(/(?<=\S) (?=\S)/)) {
    const next = current === '' ? word : `${current} ${word}`;
    if (textWidth(next) <= width || current.trim() === '') current = next;
    else {
      lines.push(current);
      current = indent + word;
    }
  }
  lines.push(current);
  return lines;
}

/**
 * Shortens a cell to `max` columns with an ellipsis at the end, or at the start (`fromStart`, for paths), never
 * inside a character (a letter with its marks, a wide character, an emoji sequence).
 */
export function clip(s: string, max: number, fromStart = false): string {
  if (textWidth(s) <= max) return s;
  const keep = Math.max(1, max - 1);
  const starts: number[] = [];
  const widths: number[] = [];
  eachCharacter(s, (start, w) => {
    starts.push(start);
    widths.push(w);
  });
  let width = 0;
  if (fromStart) {
    let k = starts.length;
    while (k > 0 && width + widths[k - 1]! <= keep) width += widths[--k]!;
    return `…${s.slice(k < starts.length ? starts[k] : s.length)}`;
  }
  let k = 0;
  while (k < starts.length && width + widths[k]! <= keep) width += widths[k++]!;
  return `${s.slice(0, k < starts.length ? starts[k] : s.length)}…`;
}

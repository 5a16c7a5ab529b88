/** The output formats of `boltzmark report`: a table for people, JSON (the contract), CSV and Markdown. */
import {
  csvText,
  markdownCode,
  markdownText,
  terminalText,
  measurementShort,
  betaText,
  enhancementText,
  fractionText,
  linesCsv,
  withoutSymbol,
  polarizationText,
  temperatureIntervalText,
  type ReportEntry,
  type BlockReport,
  DEFAULT_DISPLAY,
  spectraLines,
} from '../core';

/** A block with its report entry, for the formatters. */
export interface Row {
  readonly entry: ReportEntry;
  /** Null for a file that could not be read (its entry says why). */
  readonly block: BlockReport | null;
}

/** The table's header; each row has one cell per heading. */
const TABLE_HEAD = ['where', 'id', 'status', 'T', 'β (K⁻¹)', 'P', 'P_th', 'ε', 'also'];

/**
 * How a narrow table makes room, step by step: move what follows T's value (its 95 % interval, kT) to an
 * indented line under the row, leave out β (T says the same), then P_th (a reference
 * value), then move ε and the measurement results to an indented line under their row, then shorten
 * long places and ids. Nothing but β and P_th is ever left out.
 */
const NARROWING = ['interval', 'beta', 'thermal', 'below', 'shorten'] as const;
/** Default width of the table when there is no terminal to ask: an ordinary terminal's 100 columns. */
export const DEFAULT_TABLE_WIDTH = 100;

/** How the human table is laid out. */
export interface TableOptions {
  /** Widest line allowed, in characters (the terminal's width, or {@link DEFAULT_TABLE_WIDTH}). */
  readonly width: number;
  /** Every column, whatever the width. */
  readonly wide: boolean;
}

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
function wrap(text: string, width: number, indent: string): string[] {
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
function clip(s: string, max: number, fromStart = false): string {
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

/**
 * Human table: file:line, id, status, T, β, P, P_th, ε, and the measurement results with their
 * uncertainties; then each problem on its own line. Unless `wide`, columns are left out (β first, then
 * P_th, the measurement results, ε) and long places and ids shortened until a line fits `width`.
 */
export function formatTable(
  rows: readonly Row[],
  o: TableOptions = { width: DEFAULT_TABLE_WIDTH, wide: false },
): string {
  if (rows.length === 0) return 'No levels blocks found.\n';
  // Note text (file names, ids, messages quoting the note) without control characters: no escape sequences.
  const body = tableCells(rows, true).map((r) => r.map(terminalText));
  // P, P_th, ε and the measurement results are not printed when no row has a value there (emission
  // lines and radio transitions have no polarization): a column of dashes says nothing.
  let keep = TABLE_HEAD.map((_, i) => i).filter((i) => i < 5 || body.some((r) => r[i] !== '—' && r[i] !== ''));
  // A loop, not Math.max(...cells): a report of a few hundred thousand blocks would overflow the stack.
  const widthsOf = (cells: string[][], cols: number[]): number[] =>
    cols.map((i) => cells.reduce((w, r) => Math.max(w, textWidth(r[i])), textWidth(TABLE_HEAD[i])));
  const total = (cells: string[][], cols: number[]): number =>
    widthsOf(cells, cols).reduce((a, b) => a + b, 0) + 2 * (cols.length - 1);
  let cells = body;
  const dropped: string[] = [];
  let below = false;
  // T's interval and kT, when moved under the row (the `interval` step).
  let tailsOfT: string[] = cells.map(() => '');
  if (!o.wide) {
    for (const step of NARROWING) {
      const excess = total(cells, keep) - o.width;
      if (excess <= 0) break;
      if (step === 'interval') {
        tailsOfT = cells.map((r) => {
          const at = r[3].indexOf(' (');
          return at < 0 ? '' : r[3].slice(at + 1);
        });
        cells = cells.map((r) => r.map((c, i) => (i === 3 && c.includes(' (') ? c.slice(0, c.indexOf(' (')) : c)));
      } else if (step === 'beta' || step === 'thermal') {
        const col = step === 'beta' ? 4 : 6;
        if (!keep.includes(col)) continue;
        keep = keep.filter((k) => k !== col);
        dropped.push(TABLE_HEAD[col]);
      } else if (step === 'below') {
        keep = keep.filter((k) => k !== 7 && k !== 8);
        below = true;
      } else {
        // The place keeps its end (file name and line), the id its beginning.
        // Half the excess from each, as far as each can give (16 and 10 columns stay); what one cannot give, the
        // other gives.
        const [wWhere, wId] = widthsOf(cells, [0, 1]);
        const canWhere = Math.max(0, wWhere - 16);
        const canId = Math.max(0, wId - 10);
        const cutWhere = Math.min(canWhere, Math.max(Math.floor(excess / 2), excess - canId));
        const cutId = Math.min(canId, excess - cutWhere);
        const idMax = wId - cutId;
        const whereMax = wWhere - cutWhere;
        cells = cells.map((r) => r.map((c, i) => (i === 0 ? clip(c, whereMax, true) : i === 1 ? clip(c, idMax) : c)));
      }
    }
  }
  const widths = widthsOf(cells, keep);
  const line = (row: string[]): string =>
    keep
      .map((i, k) => row[i] + ' '.repeat(widths[k] - textWidth(row[i])))
      .join('  ')
      .trimEnd();
  const out = [line(TABLE_HEAD), line(TABLE_HEAD.map((_, i) => '-'.repeat(widths[keep.indexOf(i)] ?? 0)))];
  rows.forEach(({ entry, block }, i) => {
    out.push(line(cells[i]));
    const extra = [
      tailsOfT[i] !== '' ? `T ${tailsOfT[i]}` : '',
      ...(below ? [cells[i][7] !== '—' ? `ε = ${cells[i][7]}` : '', cells[i][8]] : []),
    ].filter((x) => x !== '');
    if (extra.length) out.push(`    ${extra.join(' · ')}`);
    // Values taken from spectrum files, each marked and named with its file and region.
    if (block)
      for (const s of spectraLines(block.meta)) {
        const text = terminalText(`    ${s}`);
        out.push(...(o.wide ? [text] : wrap(text, o.width, '        ')));
      }
    for (const d of entry.diagnostics) {
      const text = terminalText(`    ${where(entry, d.line)}:${d.column}: ${d.severity} ${d.code}: ${d.message}`);
      out.push(...(o.wide ? [text] : wrap(text, o.width, '        ')));
    }
  });
  if (dropped.length) out.push(`(${dropped.join(', ')} left out to fit ${o.width} columns; --wide shows every column)`);
  return out.join('\n') + '\n';
}

/**
 * Characters that JSON.stringify writes as they are but a terminal would act on or a display reorder: DEL and the
 * C1 controls U+007F–U+009F (U+009B is CSI, U+009D OSC on terminals that take 8-bit controls), the bidirectional
 * embeddings, overrides, isolates and marks of UAX #9 (U+061C, U+200E, U+200F, U+202A–U+202E, U+2066–U+2069), and
 * the line and paragraph separators U+2028, U+2029. JSON.stringify already escapes C0 (RFC 8259 §7).
 */
const JSON_UNSAFE = /[\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/**
 * JSON text with {@link JSON_UNSAFE} characters written as `\uXXXX` escapes (RFC 8259 §7): the same JSON value,
 * every string of the note kept whole, but nothing in the bytes for a terminal to run when the report is printed
 * on one. Such characters only ever stand inside strings, so escaping them everywhere is exact.
 */
export function jsonSafe(json: string): string {
  return json.replace(JSON_UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** One entry as it stands inside the JSON array of {@link formatJson} (two-space indented, no comma). */
export function jsonElement(entry: Row['entry']): string {
  const inArray = jsonSafe(JSON.stringify([entry], null, 2));
  return inArray.slice(2, -2); // drops "[\n" and "\n]"
}

/** The JSON array of the contract, two-space indented. */
export function formatJson(rows: readonly Row[]): string {
  return (
    jsonSafe(
      JSON.stringify(
        rows.map((r) => r.entry),
        null,
        2,
      ),
    ) + '\n'
  );
}

const CSV_HEAD = [
  'file',
  'line',
  'id',
  'status',
  'beta',
  'beta_uncertainty',
  'temperature',
  'temperature_uncertainty',
  'polarization',
  'polarization_uncertainty',
  'thermal_polarization',
  'enhancement',
  'enhancement_uncertainty',
  'entropy',
  'time_constant_s',
  'time_constant_uncertainty_s',
  'gain_coefficient_per_cm',
  'gain_coefficient_uncertainty_per_cm',
  'single_pass_gain',
  'single_pass_gain_uncertainty',
  'threshold_gain_per_cm',
  'errors',
  'warnings',
  'beta_low_95',
  'beta_high_95',
  'temperature_low_95',
  'temperature_high_95',
  'polarization_low_95',
  'polarization_high_95',
  'polarization_at_time_s',
  'polarization_at',
  'polarization_at_uncertainty',
  'thermal_reference',
  // Added last, so that no column moves: the notebook cell of a block (its `line` counts within the cell).
  'cell',
];

/** CSV through the core's writer (RFC 4180, formula-guarded), full-precision numbers, empty cells for unknowns. */
export function formatCsv(rows: readonly Row[]): string {
  return csvText([
    CSV_HEAD,
    ...rows.map(({ entry: e }) => [
      e.file,
      e.line,
      e.id,
      e.status,
      e.beta?.value ?? null,
      e.beta?.uncertainty ?? null,
      e.temperature?.value ?? null,
      e.temperature?.uncertainty ?? null,
      e.polarization?.value ?? null,
      e.polarization?.uncertainty ?? null,
      e.thermalPolarization,
      e.enhancement,
      e.enhancementUncertainty,
      e.entropy,
      e.timeConstant?.value ?? null,
      e.timeConstant?.uncertainty ?? null,
      e.gainCoefficient,
      e.gainCoefficientUncertainty,
      e.singlePassGain,
      e.singlePassGainUncertainty,
      e.thresholdGain,
      e.diagnostics.filter((d) => d.severity === 'error').length,
      e.diagnostics.filter((d) => d.severity === 'warning').length,
      e.beta?.interval?.[0] ?? null,
      e.beta?.interval?.[1] ?? null,
      e.temperature?.interval?.[0] ?? null,
      e.temperature?.interval?.[1] ?? null,
      e.polarization?.interval?.[0] ?? null,
      e.polarization?.interval?.[1] ?? null,
      e.polarizationAt?.time ?? null,
      e.polarizationAt?.value ?? null,
      e.polarizationAt?.uncertainty ?? null,
      e.thermalReference?.id ?? null,
      e.cell,
    ]),
  ]);
}

/**
 * A Markdown results table, to paste into a summary note. The cells that come
 * from the note (the file name and the block id) are literal text: the file
 * and line in a code span that no backtick in the name can close, the id with
 * every Markdown character escaped. The other cells are Boltzmark's own
 * numbers and words.
 */
export function formatMarkdown(rows: readonly Row[]): string {
  if (rows.length === 0) return '_No levels blocks found._\n';
  const [head, cells] = withoutEmptyColumns(TABLE_HEAD, tableCells(rows, true));
  const out = [`| ${head.join(' | ')} |`, `| ${head.map(() => '---').join(' | ')} |`];
  cells.forEach((c, i) => {
    const e = rows[i]!.entry;
    const id = e.id === null ? c[1]! : markdownText(e.id);
    // The numbers are Boltzmark's own, but `|T| ≥ …` holds the table's cell separator.
    const rest = c.slice(2).map((x) => x.replace(/\|/g, '\\|'));
    out.push(`| ${markdownCode(where(e, e.line))} | ${id} | ${rest.join(' | ')} |`);
  });
  return out.join('\n') + '\n';
}

/**
 * Leaves out the P, P_th, ε and "also" columns when no row has a value there
 * (emission lines and radio transitions have no polarization): a column of
 * dashes says nothing.
 */
function withoutEmptyColumns(head: readonly string[], body: readonly string[][]): [string[], string[][]] {
  const optional = new Set(['P', 'P_th', 'ε', 'also']);
  const keep = head.map((h, i) => !optional.has(h) || body.some((r) => r[i] !== '—' && r[i] !== ''));
  return [head.filter((_, i) => keep[i]), body.map((r) => r.filter((_, i) => keep[i]))];
}

/** The per-line plot data of every block of lines as CSV (one row per line; formula-like text guarded). */
export function formatLinePoints(rows: readonly Row[]): string {
  return linesCsv(
    rows.flatMap(({ entry, block }) =>
      block ? [{ file: entry.file, line: entry.line, id: entry.id, results: block.results, cell: entry.cell }] : [],
    ),
  );
}

/** The cells of one row per block: where, id, status, T, β, P, P_th, ε, and the other results. */
function tableCells(rows: readonly Row[], withUncertainty: boolean): string[][] {
  return rows.map(({ entry: e, block: b }) => {
    const r = b?.results ?? null;
    return [
      where(e, e.line),
      e.id ?? '—',
      e.status,
      r && (r.beta || r.limit) ? withoutSymbol(temperatureIntervalText(r)) : '—',
      r && (r.beta || r.limit) ? betaText(r).replace(/^β = /, '').replace(/ K⁻¹$/, '') : '—',
      r?.polarization ? polarizationText(r) : '—',
      r?.thermalPolarization != null
        ? fractionText(
            { value: r.thermalPolarization, uncertainty: r.uThermalPolarization },
            { ...DEFAULT_DISPLAY, digits: 3 },
          )
        : '—',
      r ? enhancementText(r.enhancement, DEFAULT_DISPLAY, r.enhancementUncertainty) : '—',
      r ? (measurementShort(r, withUncertainty) ?? '') : '',
    ];
  });
}

/**
 * Where a line of a note is, as people and CI annotations read it: `file:line`, and for a notebook cell
 * `file, cell N:line` (the line counted in the cell, as the editor shows it there).
 */
export function where(e: Pick<ReportEntry, 'file' | 'cell'>, line: number): string {
  return e.cell === null ? `${e.file}:${line}` : `${e.file}, cell ${e.cell}:${line}`;
}

/**
 * The checks on a JCAMP-DX text that run before `jcampconverter` decodes it
 * (see jcamp.ts): a damaged file is reported with its line instead of decoded
 * into nonsense. {@link scan} walks the labels and data lines once: characters
 * outside AFFN/ASDF, a DUP count that would expand without bound, no data
 * table at all, and in `(X++(Y..Y))` tables the standard's own checks (each
 * line's x against the spacing the header gives, and after a line ending in
 * DIF form the Y check value, collected here); in `(XY..XY)` tables, whole
 * pairs. It also notes the AFFN lines to hand the package in another spelling
 * and the NTUPLES variables that are real or imaginary. {@link verifyTable}
 * then holds the decoded ordinates to what the lines held. Nothing throws.
 */
import { resolution, shown, XyLines, type Check, type Spacing } from './jcampLines';

/** A DUP count above this (or DUP counts summing above {@link MAX_EXPANDED}) is taken as damage, not data. */
const MAX_DUP = 10_000_000;
const MAX_EXPANDED = 40_000_000;

export interface Table {
  /** 1-based line of the table's label. */
  readonly line: number;
  /** The y symbol of `(X++(Y..Y))` or `(X++(R..R))`, else null. */
  readonly symbol: string | null;
  /** For an `(X++(Y..Y))` table: the ordinates its lines hold and their Y check values (to hold the decoded points to). */
  readonly xy: { readonly points: number; readonly checks: readonly Check[] } | null;
  /** For an `(XY..XY)` table outside NTUPLES: how many x, y pairs its lines hold. */
  readonly pairs: number | null;
}

export interface Scan {
  /** The data tables (XYDATA, XYPOINTS, PEAK TABLE, DATA TABLE), in file order. */
  readonly tables: Table[];
  readonly ntuples: boolean;
  /** Symbols of the NTUPLES variables whose VAR_NAME names an imaginary part. */
  readonly imaginary: Set<string>;
  readonly real: Set<string>;
  /** True when a `(X++(Y..Y))` data line separates its AFFN values with commas. */
  readonly commas: boolean;
  /** Data lines to hand the package in another spelling (AFFN exponents written out), by 1-based line. */
  readonly rewrites: Map<number, string>;
}

export type Problem = { line: number; message: string };

/** Checks labels and data lines; returns the scan or the first problem with its line. */
export function scan(text: string): Scan | Problem {
  const tables: Table[] = [];
  const rewrites = new Map<number, string>();
  let ntuples = false;
  let symbols: string[] = [];
  let varNames: string[] = [];
  /** The NTUPLES lists (FIRST, LAST, FACTOR, VARDIM), which hold each variable's values in SYMBOL order. */
  const lists = new Map<string, string[]>();
  /**
   * Labels since the last table that place its points (FIRSTX, LASTX, NPOINTS, DELTAX, XFACTOR);
   * the package, too, starts afresh after each table.
   */
  let head = new Map<string, string>();
  let inData = false;
  let xy: XyLines | null = null;
  let pairs: number | null = null;
  let commas = false;
  let expanded = 0;
  let line = 0;
  let start = 0;
  /** Closes the table being read, keeping what its lines hold. */
  const finish = (): void => {
    if (xy) tables[tables.length - 1] = { ...tables[tables.length - 1]!, xy: { points: xy.points, checks: xy.checks } };
    if (pairs !== null) tables[tables.length - 1] = { ...tables[tables.length - 1]!, pairs };
    xy = null;
    pairs = null;
  };
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    line++;
    const raw = text.slice(start, end);
    start = end + 1;
    if (raw.startsWith('##') || /^\s+##/.test(raw)) {
      const m = /^\s*##([^=]*)=(.*)$/.exec(raw);
      if (!m) return { line, message: `line ${line}: a \`##\` label without \`=\`` };
      const label = m[1]!.replace(/[\s_-]/g, '').toUpperCase();
      const value = m[2]!;
      inData = false;
      finish();
      if (label === 'XYDATA' || label === 'XYPOINTS' || label === 'PEAKTABLE' || label === 'DATATABLE') {
        inData = true;
        const sym = /\(\s*([A-Z0-9]+)\s*\+\+\s*\(\s*([A-Z0-9]+)\s*\.\.\s*\2\s*\)\s*\)/i.exec(value);
        tables.push({ line, symbol: sym ? sym[2]!.toUpperCase() : null, xy: null, pairs: null });
        const group = value.includes('++')
          ? undefined
          : /\(([A-Z]+)\.\.\1\)/.exec(value.replace(/\s/g, '').toUpperCase())?.[1];
        if (!ntuples && group !== undefined && group !== 'XY')
          // The package reads every such table as x, y pairs, so (XYW..XYW) would come out shuffled.
          return { line, message: `line ${line}: a \`(${group}..${group})\` table; only \`(XY..XY)\` pairs are read` };
        if (!ntuples && group === 'XY') pairs = 0;
        if (value.includes('++')) {
          const spacing = ntuples
            ? spacingOf(
                ntupleHead(lists, symbols, sym?.[1]?.toUpperCase() ?? null, head),
                '##FIRST, ##LAST and ##VAR_DIM',
              )
            : spacingOf(head, '##FIRSTX, ##LASTX and ##NPOINTS');
          if (typeof spacing === 'string') return { line, message: `line ${line}: ${spacing}` };
          xy = new XyLines(spacing);
        }
        head = new Map();
      } else if (label === 'NTUPLES') ntuples = true;
      else if (label === 'SYMBOL') symbols = value.split(',').map((s) => s.trim().toUpperCase());
      else if (label === 'VARNAME') varNames = value.split(',').map((s) => s.trim().toUpperCase());
      else if (/^(?:FIRST|LAST|FACTOR|VARDIM)$/.test(label)) lists.set(label, value.split(','));
      else if (/^(?:FIRSTX|LASTX|NPOINTS|DELTAX|XFACTOR)$/.test(label)) head.set(label, value.trim());
      continue;
    }
    if (!inData) continue;
    const data = raw.replace(/\$\$.*$/, '');
    if (xy && !commas && data.includes(',')) commas = true;
    for (let i = 0; i < data.length; i++) {
      const c = data.charCodeAt(i);
      const ok =
        (c >= 48 && c <= 57) || // digits
        c === 32 ||
        c === 9 ||
        c === 13 ||
        c === 43 || // +
        c === 45 || // -
        c === 46 || // .
        c === 44 || // ,
        c === 59 || // ; (XYPOINTS groups)
        c === 63 || // ? (missing value)
        c === 40 || // ( (XYPOINTS may bracket pairs)
        c === 41 ||
        c === 37 || // % (DIF 0)
        (c >= 64 && c <= 90) || // @ A–Z: SQZ @A–I, DIF J–R, DUP S–Z (E also as an exponent)
        (c >= 97 && c <= 115); // a–s: SQZ a–i, DIF j–r, DUP s
      if (!ok)
        return {
          line,
          message: `line ${line}: \`${data[i]}\` is not a character of JCAMP-DX data (AFFN digits or the ASDF letters)`,
        };
      const dup = (c >= 83 && c <= 90) || c === 115; // S–Z, s
      if (dup) {
        let j = i + 1;
        while (j < data.length && data.charCodeAt(j) >= 48 && data.charCodeAt(j) <= 57) j++;
        const count = Number(String(c === 115 ? 9 : c - 82) + data.slice(i + 1, j));
        if (count > MAX_DUP || (expanded += count) > MAX_EXPANDED)
          return { line, message: `line ${line}: a DUP count of ${count} repeats far more points than a file holds` };
      }
    }
    if (xy) {
      const problem = xy.row(line, data, rewrites);
      if (problem !== null) return { line, message: `line ${line}: ${problem}` };
    }
    if (pairs !== null) {
      // The package drops a group of an odd count of numbers unsaid; the points after it may still fit ##NPOINTS.
      for (const g of data.split(';')) {
        const n = g.split(/[\s,]+/).filter((f) => f !== '').length;
        if (n % 2 !== 0) return { line, message: `line ${line}: \`${g.trim()}\` is not x, y pairs (${n} numbers)` };
        pairs += n / 2;
      }
    }
  }
  finish();
  if (tables.length === 0)
    return { line: 1, message: 'no data table (`##XYDATA=`, `##XYPOINTS=`, `##PEAK TABLE=` or `##DATA TABLE=`)' };
  const imaginary = new Set<string>();
  const real = new Set<string>();
  symbols.forEach((s, i) => {
    const name = varNames[i] ?? '';
    if (/IMAG/.test(name) || (name === '' && s === 'I')) imaginary.add(s);
    else if (/REAL/.test(name) || (name === '' && s === 'R')) real.add(s);
  });
  return { tables, ntuples, imaginary, real, commas, rewrites };
}

/**
 * The NTUPLES values that place a page's points, under the non-NTUPLES names: the x variable's
 * entries of ##FIRST, ##LAST, ##VAR_DIM and ##FACTOR (the first variable when the symbol is not
 * among ##SYMBOL, as the package takes it), and a page's own ##DELTAX.
 */
function ntupleHead(
  lists: Map<string, string[]>,
  symbols: string[],
  x: string | null,
  page: Map<string, string>,
): Map<string, string> {
  const at = Math.max(0, x === null ? 0 : symbols.indexOf(x));
  const out = new Map<string, string>();
  const put = (label: string, list: string): void => {
    const v = lists.get(list)?.[at]?.trim();
    if (v) out.set(label, v);
  };
  put('FIRSTX', 'FIRST');
  put('LASTX', 'LAST');
  put('NPOINTS', 'VARDIM');
  put('XFACTOR', 'FACTOR');
  const delta = page.get('DELTAX');
  if (delta !== undefined) out.set('DELTAX', delta);
  return out;
}

/**
 * The spacing of a table's points as the package computes it: from the first x, the last x
 * and the number of points, else from the first x and ##DELTAX; XFACTOR 1 when absent or 0.
 * A table without a first x, or without either way to the spacing, would be placed at x = 0
 * with spacing 1 by the package, so it is a problem (the message) instead.
 */
function spacingOf(head: Map<string, string>, from: string): Spacing | string {
  const value = (label: string): number | null => {
    const t = head.get(label);
    const n = t === undefined || t === '' ? NaN : Number(t);
    return Number.isFinite(n) ? n : null;
  };
  const first = value('FIRSTX');
  const last = value('LASTX');
  const count = value('NPOINTS');
  const factor = value('XFACTOR') || 1;
  if (first !== null && last !== null && count !== null && count >= 1)
    return { first, delta: count > 1 ? (last - first) / (count - 1) : 0, factor, slackPerPoint: 0, from };
  const delta = value('DELTAX');
  if (first !== null && delta !== null)
    return { first, delta, factor, slackPerPoint: resolution(head.get('DELTAX')!) / 2, from: '##FIRSTX and ##DELTAX' };
  return `the \`(X++(Y..Y))\` table has no ${from} (nor a first x and ##DELTAX) to place its points on the x axis`;
}

/**
 * Holds a table's decoded ordinates (after YFACTOR) to its lines: their number, and for an
 * `(X++(Y..Y))` table each Y check value.
 */
export function verifyTable(table: Table, ys: ArrayLike<number>, yFactor: number): Problem | null {
  if (table.pairs !== null && table.pairs !== ys.length)
    return {
      line: table.line,
      message: `line ${table.line}: the data lines hold ${table.pairs} x, y pairs but decode to ${ys.length}; the table cannot be read unambiguously`,
    };
  const xy = table.xy;
  if (!xy) return null;
  if (xy.points !== ys.length)
    return {
      line: table.line,
      message: `line ${table.line}: the data lines hold ${xy.points} ordinates but decode to ${ys.length}; the table cannot be read unambiguously`,
    };
  // Compared as written, before YFACTOR: ASDF ordinates are mostly integers up to 2³¹, which a
  // difference of one unit must not slip through; the slack covers only rounding.
  for (const c of xy.checks) {
    const got = ys[c.index]! / yFactor;
    if (!(Math.abs(got - c.value) <= 1e-6 + 1e-12 * Math.abs(c.value)))
      return {
        line: c.line,
        message: `line ${c.line}: the Y check value ${shown(c.value)} does not repeat the last ordinate of the line before (${shown(got)}), as the DIF form requires; the data are damaged`,
      };
  }
  return null;
}

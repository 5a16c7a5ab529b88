/**
 * JCAMP-DX spectra (IUPAC; McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988),
 * version 4.24; Davies & Lampen, Appl. Spectrosc. 47, 1093 (1993), NMR and
 * `##NTUPLES`) through the `jcampconverter` package, which decodes AFFN and the
 * compressed ASDF forms (SQZ, DIF, DUP), `##XYDATA`, `##XYPOINTS`/`##PEAK TABLE`
 * and `##NTUPLES` pages, and applies XFACTOR/YFACTOR.
 *
 * Around the package this module only: checks the text first, so that a
 * damaged file is reported with its line instead of decoded into nonsense
 * (characters outside AFFN/ASDF, a DUP count that would expand without
 * bound, no data table at all); picks the real part of an NTUPLES spectrum;
 * keeps the file's own x unit (the package rewrites an Hz axis to ppm where an
 * observe frequency is given, which this undoes); and checks the decoded
 * points against `##NPOINTS`. Nothing throws.
 */
// @ts-expect-error -- TS1479: the package ships only as an ES module; esbuild (bundles) and tsx (tests) load it from CommonJS.
import { convert, type Entry, type Spectrum as JcampSpectrum } from 'jcampconverter';
import { parseXUnit } from './axis';
import { sortedSpectrum } from './sorted';
import type { SpectrumRead } from './types';

/** A DUP count above this (or DUP counts summing above {@link MAX_EXPANDED}) is taken as damage, not data. */
const MAX_DUP = 10_000_000;
const MAX_EXPANDED = 40_000_000;

/** The labels the package keeps in `info` (everything else would be stored there too, data included). */
const KEPT_RECORDS = /^(?:TITLE|XUNITS|YUNITS|UNITS|\.OBSERVEFREQUENCY|NPOINTS)$/;

/** True when the text looks like JCAMP-DX (a `##` label on its first non-blank line). */
export function looksLikeJcamp(text: string): boolean {
  return /^\s*##[A-Za-z.$]/.test(text.slice(0, 4096));
}

interface Scan {
  /** 1-based line of each data table label (XYDATA, XYPOINTS, PEAK TABLE, DATA TABLE), in order. */
  readonly tables: { line: number; symbol: string | null }[];
  readonly ntuples: boolean;
  /** Symbols of the NTUPLES variables whose VAR_NAME names an imaginary part. */
  readonly imaginary: Set<string>;
  readonly real: Set<string>;
  /** True when a `(X++(Y..Y))` data line separates its AFFN values with commas. */
  readonly commas: boolean;
}

/** Checks labels and data lines; returns the scan or the first problem with its line. */
function scan(text: string): Scan | { line: number; message: string } {
  const tables: { line: number; symbol: string | null }[] = [];
  let ntuples = false;
  let symbols: string[] = [];
  let varNames: string[] = [];
  let inData = false;
  let compressed = false;
  let commas = false;
  let expanded = 0;
  let line = 0;
  let start = 0;
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
      if (label === 'XYDATA' || label === 'XYPOINTS' || label === 'PEAKTABLE' || label === 'DATATABLE') {
        inData = true;
        compressed = value.includes('++');
        const sym = /\(\s*[A-Z]\+\+\s*\(\s*([A-Z])\.\.\1\s*\)\s*\)/i.exec(value)?.[1] ?? null;
        tables.push({ line, symbol: sym ? sym.toUpperCase() : null });
      } else if (label === 'NTUPLES') ntuples = true;
      else if (label === 'SYMBOL') symbols = value.split(',').map((s) => s.trim().toUpperCase());
      else if (label === 'VARNAME') varNames = value.split(',').map((s) => s.trim().toUpperCase());
      continue;
    }
    if (!inData) continue;
    const data = raw.replace(/\$\$.*$/, '');
    if (compressed && !commas && data.includes(',')) commas = true;
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
  }
  if (tables.length === 0)
    return { line: 1, message: 'no data table (`##XYDATA=`, `##XYPOINTS=`, `##PEAK TABLE=` or `##DATA TABLE=`)' };
  const imaginary = new Set<string>();
  const real = new Set<string>();
  symbols.forEach((s, i) => {
    const name = varNames[i] ?? '';
    if (/IMAG/.test(name) || (name === '' && s === 'I')) imaginary.add(s);
    else if (/REAL/.test(name) || (name === '' && s === 'R')) real.add(s);
  });
  return { tables, ntuples, imaginary, real, commas };
}

function text1(v: unknown): string | null {
  if (typeof v === 'string') return v.trim();
  if (typeof v === 'number') return String(v);
  if (Array.isArray(v) && v.length > 0) return text1(v[0]);
  return null;
}

function num(v: unknown): number | null {
  const n = typeof v === 'number' ? v : typeof v === 'string' ? Number(v.trim()) : Array.isArray(v) ? num(v[0]) : NaN;
  return Number.isFinite(n) ? n : null;
}

/** Reads a JCAMP-DX text into a spectrum, or the reason (with the line) it is not one. */
export function readJcamp(text: string): SpectrumRead {
  const s = scan(text);
  if ('message' in s) return { ok: false, line: s.line, message: s.message };
  let entries: Entry[];
  try {
    // The package decodes `(XY..XY)` pairs under ##PEAK TABLE only; ##XYPOINTS has the same data syntax.
    let input = text.replace(/^(\s*)##\s*XY\s*POINTS\s*=/gim, '$1##PEAK TABLE=');
    // JCAMP-DX separates AFFN values by blanks or commas; the package reads a comma in `(X++(Y..Y))` data as a
    // decimal point, so commas there become blanks (labels, which hold the only other commas, are left alone).
    if (s.commas)
      input = input.replace(/^(?!\s*##)[^\n]*,[^\n]*$/gm, (l) => l.replace(/\$\$.*$/, '').replace(/,/g, ' '));
    entries = convert(input, { keepRecordsRegExp: KEPT_RECORDS }).flatten;
  } catch (e) {
    return {
      ok: false,
      line: null,
      message: `not readable as JCAMP-DX (${e instanceof Error ? e.message : String(e)})`,
    };
  }
  // The data tables in file order, to line up each decoded page with its label's line and symbol.
  let tableIndex = 0;
  let chosen: { entry: Entry; spectrum: JcampSpectrum; table: { line: number; symbol: string | null } } | null = null;
  for (const entry of entries) {
    for (const sp of entry.spectra ?? []) {
      const table = s.tables[tableIndex++] ?? s.tables[s.tables.length - 1]!;
      if (chosen) continue;
      if (s.ntuples && table.symbol && s.imaginary.has(table.symbol)) continue;
      if (s.ntuples && table.symbol && s.real.size > 0 && !s.real.has(table.symbol)) continue;
      chosen = { entry, spectrum: sp, table };
    }
  }
  if (!chosen) {
    const first = s.tables[0]!;
    return { ok: false, line: first.line, message: `line ${first.line}: no real spectrum among the data tables` };
  }
  const { entry, spectrum: sp, table } = chosen;
  const xs = sp.data?.x;
  const ys = sp.data?.y ?? sp.data?.r;
  if (!Array.isArray(xs) || !Array.isArray(ys) || xs.length === 0 || xs.length !== ys.length)
    return { ok: false, line: table.line, message: `line ${table.line}: the data table decodes to no x, y points` };
  const declared = num(sp.nbPoints);
  if (declared !== null && table.symbol !== null && declared !== xs.length)
    return {
      ok: false,
      line: table.line,
      message: `line ${table.line}: the data decode to ${xs.length} points where ##NPOINTS says ${declared}`,
    };
  for (let i = 0; i < xs.length; i++) {
    if (!Number.isFinite(xs[i]) || !Number.isFinite(ys[i]))
      return {
        ok: false,
        line: table.line,
        message: `line ${table.line}: point ${i + 1} of the data table is not a finite number`,
      };
  }
  const observe = num(sp.observeFrequency) ?? num(entry.info?.['.OBSERVEFREQUENCY']);
  const written = originalXUnit(entry, sp);
  const unit = written === null ? null : parseXUnit(written);
  if (written !== null && unit === null)
    return {
      ok: false,
      line: labelLine(text, 'XUNITS') ?? table.line,
      message: `the x unit \`${written}\` is not a spectrum axis (Hz, ppm, 1/cm, nanometers, micrometers)`,
    };
  let x: ArrayLike<number> = xs;
  const converted = typeof sp.xUnits === 'string' && /PPM/i.test(sp.xUnits) && unit !== 'ppm';
  if (converted && observe !== null && unit !== null) {
    // jcampconverter divided an Hz axis by the observe frequency; the file's unit is kept instead.
    const scale = unit === 'Hz' ? observe : unit === 'kHz' ? observe / 1e3 : unit === 'MHz' ? observe / 1e6 : 1;
    x = xs.map((v) => v * scale);
  }
  return {
    ok: true,
    spectrum: sortedSpectrum(x, ys, {
      xUnit: unit,
      yUnit: text1(sp.yUnits) ?? text1(entry.info?.YUNITS),
      observeMHz: observe !== null && observe > 0 ? observe : null,
      format: 'jcamp',
      title: text1(entry.title) ?? text1(entry.info?.TITLE),
    }),
  };
}

/** The x unit as the file writes it: `##XUNITS`, or the NTUPLES unit of the page's x variable. */
function originalXUnit(entry: Entry, sp: JcampSpectrum): string | null {
  const direct = text1(entry.info?.XUNITS);
  if (direct) return direct;
  const units = entry.info?.UNITS;
  const first = typeof units === 'string' ? units.split(',')[0]?.trim() : text1(units);
  if (first) return first;
  const own = text1(sp.xUnits);
  return own ? own.replace(/^.*\[(.*)\]$/, '$1') : null;
}

function labelLine(text: string, label: string): number | null {
  const re = new RegExp(`^\\s*##${label}\\s*=`, 'im');
  const m = re.exec(text);
  return m ? text.slice(0, m.index).split('\n').length : null;
}

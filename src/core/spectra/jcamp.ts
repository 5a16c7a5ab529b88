/**
 * JCAMP-DX spectra (IUPAC; McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988),
 * version 4.24; Davies & Lampen, Appl. Spectrosc. 47, 1093 (1993), NMR and
 * `##NTUPLES`; Lampen et al., Pure Appl. Chem. 71, 1549 (1999), the 5.x
 * revision) through the `jcampconverter` package, which decodes AFFN and the
 * compressed ASDF forms (SQZ, DIF, DUP), `##XYDATA`, `##XYPOINTS`/`##PEAK
 * TABLE` and `##NTUPLES` pages, and applies XFACTOR/YFACTOR.
 *
 * Around the package this module only: checks the text first (jcampScan.ts),
 * so that a damaged file is reported with its line instead of decoded into
 * nonsense, and holds the decoded points to those checks;
 * writes AFFN numbers with an exponent (`1.5E-3`, which the package would
 * take for the SQZ digit E) as plain decimals; picks the real part of an
 * NTUPLES spectrum; keeps the file's own x unit (the package rewrites an Hz
 * axis to ppm where an observe frequency is given, which this undoes); and
 * checks the decoded points against `##NPOINTS`. Nothing throws.
 */
// @ts-expect-error -- TS1479: the package ships only as an ES module; esbuild (bundles) and tsx (tests) load it from CommonJS.
import { convert, type Entry, type Spectrum as JcampSpectrum } from 'jcampconverter';
import { parseXUnit } from './axis';
import { sortedSpectrum } from './sorted';
import { scan, verifyTable, type Table } from './jcampScan';
import type { SpectrumRead } from './types';

/** The labels the package keeps in `info` (everything else would be stored there too, data included). */
const KEPT_RECORDS = /^(?:TITLE|XUNITS|YUNITS|UNITS|\.OBSERVEFREQUENCY|NPOINTS)$/;

/** True when the text looks like JCAMP-DX (a `##` label on its first non-blank line). */
export function looksLikeJcamp(text: string): boolean {
  return /^\s*##[A-Za-z.$]/.test(text.slice(0, 4096));
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
export function readJcamp(raw: string): SpectrumRead {
  // Instruments write CR LF (or, from old Macs, CR alone) at the ends of lines, and some a byte-order mark: the
  // labels and data are read line by line as LF lines (the line count, and so every line number, is the same).
  const unmarked = raw.charCodeAt(0) === 0xfeff ? raw.slice(1) : raw;
  const text = unmarked.includes('\r') ? unmarked.replace(/\r\n?/g, '\n') : unmarked;
  const s = scan(text);
  if ('message' in s) return { ok: false, line: s.line, message: s.message };
  let entries: Entry[];
  try {
    let input = text;
    // AFFN exponents written out, so that the package does not take their E for the SQZ digit 5.
    if (s.rewrites.size > 0)
      input = input
        .split('\n')
        .map((l, i) => s.rewrites.get(i + 1) ?? l)
        .join('\n');
    // The package decodes `(XY..XY)` pairs under ##PEAK TABLE only; ##XYPOINTS has the same data syntax.
    input = input.replace(/^(\s*)##\s*XY\s*POINTS\s*=/gim, '$1##PEAK TABLE=');
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
  let chosen: { entry: Entry; spectrum: JcampSpectrum; table: Table } | null = null;
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
  const unsure = verifyTable(table, ys, num(sp.yFactor) || 1);
  if (unsure) return { ok: false, ...unsure };
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

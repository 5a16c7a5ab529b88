/**
 * Two-column text spectra (`.csv`, `.tsv`, `.txt`): one `x, y` pair per
 * line, separated by a comma, a tab or spaces (a semicolon too, as some
 * instruments write). Lines starting with `#` and blank lines are skipped.
 * An optional first line of names (`ppm,intensity`, `wavelength (nm)\tcounts`)
 * gives the x unit, read from the first name (the name itself, or what stands
 * in parentheses, brackets or after a `/`). Nothing throws; a line that is not
 * a pair of finite numbers is reported with its 1-based line number.
 */
import { parseXUnit, type XUnit } from './axis';
import type { SpectrumRead } from './types';
import { sortedSpectrum } from './sorted';
import { clipText } from '../text/common';

const SEPARATORS = /[\s,;]+/;

/** Reads a two-column text spectrum. */
export function readTextColumns(raw: string): SpectrumRead {
  // CR LF and CR alone end lines as LF does (a file saved on Windows or an old Mac); line numbers are unchanged.
  const text = raw.includes('\r') ? raw.replace(/\r\n?/g, '\n') : raw;
  const xs: number[] = [];
  const ys: number[] = [];
  let xUnit: XUnit | null = null;
  let yUnit: string | null = null;
  let header = false;
  let line = 0;
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  while (start <= text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    line++;
    const raw = text.slice(start, end);
    start = end + 1;
    const trimmed = raw.trim();
    if (trimmed === '' || trimmed.startsWith('#')) {
      if (end === text.length) break;
      continue;
    }
    const parts = trimmed.split(SEPARATORS);
    if (parts.length === 2) {
      const x = toNumber(parts[0]!);
      const y = toNumber(parts[1]!);
      if (x !== null && y !== null) {
        xs.push(x);
        ys.push(y);
        if (end === text.length) break;
        continue;
      }
    }
    if (xs.length === 0 && !header && !/^[+\-.\d]/.test(trimmed)) {
      // The first line of names: the x unit from the first, the y unit from the second.
      header = true;
      const names = trimmed.split(/\s*[,;\t]\s*|\s{2,}/);
      const first = names.length >= 2 ? names[0]! : trimmed.split(/\s+/)[0]!;
      xUnit = unitOfName(first);
      const second = names.length >= 2 ? names[1]! : null;
      yUnit = second !== null && second !== '' ? second : null;
      if (end === text.length) break;
      continue;
    }
    return {
      ok: false,
      line,
      message:
        parts.length !== 2
          ? `line ${line} has ${parts.length} columns; a two-column spectrum has one x, y pair per line`
          : `line ${line} is not a pair of finite numbers: \`${clipText(trimmed)}\``,
    };
  }
  if (xs.length === 0)
    return { ok: false, line: null, message: 'the file holds no x, y pairs (only comments, blank lines or names)' };
  return {
    ok: true,
    spectrum: sortedSpectrum(xs, ys, { xUnit, yUnit, observeMHz: null, format: 'text', title: null }),
  };
}

function toNumber(s: string): number | null {
  if (!/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(s)) return null;
  const v = Number(s);
  return Number.isFinite(v) ? v : null;
}

/** The x unit a column name gives: `ppm`, `shift (ppm)`, `wavelength [nm]`, `wavenumber/cm-1`, or null. */
export function unitOfName(name: string): XUnit | null {
  const n = name.trim().replace(/^["']|["']$/g, '');
  const inner = /[([]\s*([^)\]]+?)\s*[)\]]/.exec(n)?.[1] ?? (n.includes('/') ? n.slice(n.indexOf('/') + 1) : null);
  return (inner !== null ? parseXUnit(inner) : null) ?? parseXUnit(n);
}

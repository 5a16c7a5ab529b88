/**
 * The curve view's spectrum panel: for each spectrum reference of a block,
 * the spectrum decimated for display (never the full-resolution arrays),
 * the integrated region, the baseline under it and the noise region, in the
 * file's x unit. ppm axes run right to left, as NMR spectra are drawn.
 * Built by the host that holds the parsed spectra (the language server),
 * validated on arrival in the page like the rest of the payload.
 */
import { csvText, type CsvField } from '../present/csv';
import { formatMeasured } from '../present/numbers';
import type { Spectrum, SpectrumUse } from '../spectra/types';
import { isArrayOf, isCount, isFiniteNumber, isNumberArray, isNumberOrNull, isRecord, isText } from './validate';

/** At most this many points of a spectrum reach the page (two per column of a wide chart). */
export const SPECTRUM_DISPLAY_POINTS = 4000;

/** One reference's spectrum as the page draws it. Text fields are from the note or the file: show as text only. */
export interface SpectrumTrace {
  /** Dotted path of the value it gives (`signal.hyperpolarized`). */
  readonly key: string;
  /** The file as written in the note. */
  readonly file: string;
  /** The x unit (`ppm`, `Hz`, `nm` …), or null. */
  readonly unit: string | null;
  /** True for an axis drawn right to left (ppm). */
  readonly reversed: boolean;
  /** The points drawn, by increasing x: the spectrum decimated (min and max per column). */
  readonly x: readonly number[];
  readonly y: readonly number[];
  /** Points in the file. */
  readonly points: number;
  /** The integrated region, low to high. */
  readonly region: readonly [number, number];
  /** The baseline as a segment `[x0, y0, x1, y1]`. */
  readonly baseline: readonly [number, number, number, number];
  readonly baselineKind: 'linear' | 'none';
  /** The noise region, low to high, or null. */
  readonly noise: readonly [number, number] | null;
  readonly integral: { readonly value: number; readonly uncertainty: number | null };
  /** The integral as the hover shows it (`2.41(3)e6`). */
  readonly integralText: string;
}

/**
 * Decimates a sorted series to at most `max` points (max ≥ 4) keeping each column's
 * minimum and maximum in x order, so peaks and noise keep their height. Indices `from`…`to` (inclusive).
 */
export function decimateMinMax(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  max: number = SPECTRUM_DISPLAY_POINTS,
  from = 0,
  to: number = x.length - 1,
): { x: number[]; y: number[] } {
  const n = to - from + 1;
  const outX: number[] = [];
  const outY: number[] = [];
  if (n <= 0) return { x: outX, y: outY };
  if (n <= max) {
    for (let i = from; i <= to; i++) {
      outX.push(x[i]!);
      outY.push(y[i]!);
    }
    return { x: outX, y: outY };
  }
  const columns = Math.max(2, Math.floor(max / 2));
  for (let c = 0; c < columns; c++) {
    const a = from + Math.floor((c * n) / columns);
    const b = from + Math.floor(((c + 1) * n) / columns) - 1;
    if (b < a) continue;
    let lo = a;
    let hi = a;
    for (let i = a + 1; i <= b; i++) {
      if (y[i]! < y[lo]!) lo = i;
      if (y[i]! > y[hi]!) hi = i;
    }
    const first = Math.min(lo, hi);
    const second = Math.max(lo, hi);
    outX.push(x[first]!);
    outY.push(y[first]!);
    if (second !== first) {
      outX.push(x[second]!);
      outY.push(y[second]!);
    }
  }
  return { x: outX, y: outY };
}

/**
 * The traces of a block's references that were followed, in text order. `spectrumFor` gives the parsed
 * spectrum of a dependency key (`file:…`) when the host holds it; references without one are left out.
 */
export function spectrumTraces(
  uses: readonly SpectrumUse[] | undefined,
  spectrumFor: (source: string) => Spectrum | null,
  digits = 4,
): SpectrumTrace[] {
  const out: SpectrumTrace[] = [];
  for (const u of uses ?? []) {
    const r = u.result;
    if (!r || !u.source) continue;
    const s = spectrumFor(u.source);
    if (!s || s.x.length === 0) continue;
    const d = decimateMinMax(s.x, s.y);
    out.push({
      key: u.key,
      file: u.file,
      unit: r.unit,
      reversed: r.unit === 'ppm',
      x: d.x,
      y: d.y,
      points: s.x.length,
      region: [r.region[0], r.region[1]],
      baseline: [r.baselineLine[0], r.baselineLine[1], r.baselineLine[2], r.baselineLine[3]],
      baselineKind: r.baseline,
      noise: r.noise ? [r.noise[0], r.noise[1]] : null,
      integral: { value: r.value, uncertainty: r.uncertainty },
      integralText: formatMeasured(r.value, r.uncertainty, { digits }),
    });
  }
  return out;
}

function isPair(x: unknown): x is [number, number] {
  return Array.isArray(x) && x.length === 2 && x.every(isFiniteNumber);
}

/** True when `x` is a well-formed {@link SpectrumTrace}. */
export function isSpectrumTrace(x: unknown): x is SpectrumTrace {
  if (!isRecord(x)) return false;
  const integral = x.integral;
  return (
    isText(x.key, 200) &&
    isText(x.file, 4000) &&
    (x.unit === null || isText(x.unit, 20)) &&
    typeof x.reversed === 'boolean' &&
    isNumberArray(x.x, 2 * SPECTRUM_DISPLAY_POINTS) &&
    isNumberArray(x.y, 2 * SPECTRUM_DISPLAY_POINTS) &&
    x.x.length === x.y.length &&
    isCount(x.points) &&
    isPair(x.region) &&
    Array.isArray(x.baseline) &&
    x.baseline.length === 4 &&
    x.baseline.every(isFiniteNumber) &&
    (x.baselineKind === 'linear' || x.baselineKind === 'none') &&
    (x.noise === null || isPair(x.noise)) &&
    isRecord(integral) &&
    isFiniteNumber(integral.value) &&
    isNumberOrNull(integral.uncertainty) &&
    isText(x.integralText, 200)
  );
}

/** True for a payload's `spectra` field: absent (a payload without references, or saved before them) or traces. */
export function isSpectrumTraces(x: unknown): x is readonly SpectrumTrace[] | undefined {
  return x === undefined || isArrayOf(x, isSpectrumTrace, 100);
}

/** The baseline's y at x (the segment extended). */
export function baselineAt(t: Pick<SpectrumTrace, 'baseline'>, x: number): number {
  const [x0, y0, x1, y1] = t.baseline;
  return x1 === x0 ? y0 : y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
}

/**
 * CSV of one trace as drawn: x, y, and in the region the baseline and y less the baseline, with the integral,
 * the region and the noise region in the header rows (`present/csv.ts` guards text from the note).
 */
export function spectrumCsv(t: SpectrumTrace): string {
  const unit = t.unit ?? '';
  const rows: CsvField[][] = [
    ['file', t.file],
    ['value', t.key],
    ['integral', t.integral.value, 'uncertainty', t.integral.uncertainty],
    ['region', t.region[0], t.region[1], unit],
    ['noise', t.noise?.[0] ?? null, t.noise?.[1] ?? null, unit],
    ['baseline', t.baselineKind],
    ['points_in_file', t.points, 'points_here', t.x.length],
    [],
    [`x_${unit || 'unitless'}`, 'y', 'baseline', 'y_less_baseline'],
  ];
  for (let i = 0; i < t.x.length; i++) {
    const x = t.x[i]!;
    const inRegion = x >= t.region[0] && x <= t.region[1];
    const b = inRegion ? baselineAt(t, x) : null;
    rows.push([x, t.y[i]!, b, b === null ? null : t.y[i]! - b]);
  }
  return csvText(rows);
}

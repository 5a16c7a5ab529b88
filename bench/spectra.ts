/**
 * Parsing and integrating a spectrum of 1 M points against one of 100 k:
 * a JCAMP-DX file in the compressed DIFDUP form (written by the independent
 * `convert-to-jcamp`) and a two-column text file. Linear work keeps the ratio
 * near 10. The times themselves are for information; the figure held to a
 * target is the ratio, measured within one run (medians of interleaved pairs).
 */
// @ts-expect-error -- TS1479: the package ships only as an ES module; tsx loads it from CommonJS.
import { fromJSON } from 'convert-to-jcamp';
import { integrateRegion, noiseSigma, readSpectrum } from '../src/core';
import { median, timeOnce } from './stats';

/** What {@link measureSpectra} reports for one file kind. */
export interface SpectrumFigures {
  readonly kind: 'jcamp' | 'text';
  readonly points: number;
  readonly largeMs: number;
  readonly smallMs: number;
  /** Median over repetitions of large / small (10 × the points). */
  readonly ratio: number;
  readonly bytes: number;
}

/** A spectrum of n points over 0…200 ppm with three Lorentzian lines and a deterministic noise. */
function points(n: number): { x: Float64Array; y: Float64Array } {
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  let s = 1;
  for (let i = 0; i < n; i++) {
    const v = (200 * i) / (n - 1);
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    x[i] = v;
    y[i] =
      1e5 / (1 + ((v - 171) / 0.2) ** 2) +
      3e4 / (1 + ((v - 40) / 0.3) ** 2) +
      8e3 / (1 + ((v - 20) / 0.2) ** 2) +
      (s / 2 ** 32 - 0.5) * 50;
  }
  return { x, y };
}

function file(n: number, kind: 'jcamp' | 'text'): string {
  const p = points(n);
  if (kind === 'jcamp')
    return fromJSON(
      { x: p.x, y: p.y },
      { info: { xUnits: 'PPM', yUnits: 'ARBITRARY UNITS', title: 'bench' }, xyEncoding: 'DIFDUP' },
    ) as string;
  const lines = ['ppm,intensity'];
  for (let i = 0; i < n; i++) lines.push(`${p.x[i]!.toFixed(6)},${p.y[i]!.toFixed(3)}`);
  return lines.join('\n') + '\n';
}

function parseAndIntegrate(text: string, name: string): number {
  const r = readSpectrum(text, name);
  if (!r.ok) throw new Error(`bench spectrum not read: ${r.message}`);
  const i = integrateRegion(r.spectrum, 165, 177, 'linear');
  const n = noiseSigma(r.spectrum, 100, 150);
  if (!('value' in i) || !('sigma' in n)) throw new Error('bench region not integrated');
  return i.value;
}

/** Times parse + integrate of `large` points against `large / 10`, `repetitions` interleaved pairs. */
export function measureSpectra(kind: 'jcamp' | 'text', large: number, repetitions: number): SpectrumFigures {
  const name = kind === 'jcamp' ? 'b.jdx' : 'b.csv';
  const big = file(large, kind);
  const small = file(large / 10, kind);
  const ratios: number[] = [];
  const bigs: number[] = [];
  const smalls: number[] = [];
  for (let r = 0; r < repetitions; r++) {
    // Alternate which goes first, so neither always runs on a warmer heap.
    const pair =
      r % 2 === 0
        ? [timeOnce(() => parseAndIntegrate(small, name)), timeOnce(() => parseAndIntegrate(big, name))].reverse()
        : [timeOnce(() => parseAndIntegrate(big, name)), timeOnce(() => parseAndIntegrate(small, name))];
    const [a, b] = pair as [number, number];
    bigs.push(a);
    smalls.push(b);
    ratios.push(a / b);
  }
  return {
    kind,
    points: large,
    largeMs: median(bigs),
    smallMs: median(smalls),
    ratio: median(ratios),
    bytes: big.length,
  };
}

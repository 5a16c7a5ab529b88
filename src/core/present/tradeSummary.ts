/**
 * Display rows of what a block's trade adds (plot data, refit without the
 * flagged lines, √N uncertainties, the wavelength medium, a line temperature
 * from T_B, column densities), a hover's rows for one line, and the per-line
 * plot data as CSV. Shared by hovers, the preview and the command line.
 */
import type { BlockResults } from '../analysis/results';
import type { PlotPointResult } from '../analysis/trade';
import type { BlockInput } from '../block/input';
import { KELVIN_PER_EV, KELVIN_PER_WAVENUMBER } from '../quantities/constants';
import type { DisplayOptions } from './displayOptions';
import { formatMeasured, formatNumber, formatTemperature, lowerBoundDigits } from './numbers';
import { csvText, type CsvField } from './csv';

/** A label and its value, as display text. */
export type TradeRow = readonly [string, string];

const cm2 = (x: number, o: DisplayOptions): string => `${formatNumber(x, o.digits)} cm⁻²`;

/** The rows a block's trade adds; empty for spin blocks. */
export function tradeRows(input: BlockInput | null, r: BlockResults, o: DisplayOptions): TradeRow[] {
  const rows: TradeRow[] = [];
  const t = r.trade;
  const mode = o.temperature === 'kelvin' ? 'kelvin' : 'auto';
  const lines = input?.lines;
  if (lines) {
    if (lines.detectorAssumed) rows.push(['detector', 'energy (assumed: no `detector:` given)']);
    const poisson = lines.lines.filter((l) => l.poisson).length;
    if (poisson > 0)
      rows.push([
        'u(I)',
        `√I (Poisson counting statistics) for ${poisson} of ${lines.lines.length} lines written without ±`,
      ]);
  }
  if (t.plot) {
    const p = t.plot;
    const what = lines?.detector === 'radiometer' ? 'rotation diagram' : 'Boltzmann plot';
    rows.push([
      what,
      `${p.points.length} lines, ${p.ordinate} against E_u: slope −1/kT, intercept a = ${formatMeasured(p.intercept.value, p.intercept.uncertainty, { digits: o.digits })}`,
    ]);
    if (p.birgeRatio !== null && p.birgeRatio > 1 && p.slope.uncertainty !== null && r.beta)
      rows.push([
        'u(β) × √(χ²/dof)',
        `${formatNumber(p.slope.uncertainty * p.birgeRatio, 2)} K⁻¹ (scatter beyond the stated uncertainties, √(χ²/dof) = ${formatNumber(p.birgeRatio, 3)})`,
      ]);
    const flagged = p.points.filter((q) => q.flag !== null);
    if (flagged.length > 0) {
      const name = (q: PlotPointResult): string =>
        `${q.label ?? `line at ${formatNumber(q.energy / KELVIN_PER_EV, 5)} eV`} (${q.flag ?? ''})`;
      rows.push([
        'flagged lines',
        `${flagged.map(name).join(', ')}; iterative clipping, each judged against the line refitted without it`,
      ]);
    }
  }
  if (t.refit?.temperature) {
    const T = t.refit.temperature;
    rows.push([
      `T_ex without the ${t.refit.without.length} flagged`,
      formatTemperature(T.value, T.uncertainty, { digits: o.digits, mode }),
    ]);
  }
  if (t.medium)
    rows.push([
      'wavelengths',
      t.medium.stated
        ? `${t.medium.kind} (stated)`
        : `${t.medium.kind} (assumed: the IAU convention quotes air wavelengths from 200 nm up, vacuum below)`,
    ]);
  if (t.fromBrightness && input?.trade?.line) {
    const l = input.trade.line;
    const bg = input.trade.background;
    rows.push([
      'line temperature',
      `J(T_ex) = T_B/(1 − e^(−τ)) + J(T_bg), J(T) = (hν/k)/(e^(hν/kT) − 1), with T_B = ${formatTemperature(l.brightness.value, l.brightness.uncertainty, { digits: o.digits, mode })}, τ = ${formatMeasured(l.opticalDepth.value, l.opticalDepth.uncertainty, { digits: o.digits })}, T_bg = ${bg ? formatTemperature(bg.value, bg.uncertainty, { digits: o.digits, mode }) : '0 K (no `background:`)'}`,
    ]);
  }
  const c = t.column;
  if (c) {
    if (c.sum !== null) rows.push(['Σ N of the given levels', cm2(c.sum, o)]);
    if (c.partition !== null) rows.push(['Q(T) of the linear rotor', formatNumber(c.partition, o.digits)]);
    if (c.total)
      rows.push([
        'total column density N = Q(T)·e^a',
        `${formatMeasured(c.total.value, c.total.uncertainty, { digits: o.digits })} cm⁻²`,
      ]);
    else if (c.partition === null && (input?.lines || input?.trade?.columns))
      rows.push(['total column density', 'add `rotational-constant:` (a linear rotor) for Q(T) and the total']);
  }
  if (t.temperatureLimit !== null)
    rows.push([
      'limit',
      `β is zero within 2u(β): |T_ex| ≥ 1/(|β| + 2u(β)) = ${formatTemperature(lowerBoundDigits(t.temperatureLimit, 2), null, { digits: 2, mode })} at about 95 % (GUM k = 2), of either sign`,
    ]);
  return rows;
}

/** The hover rows of one plotted line: E_u, its point (y, u(y)), the residual and the flag. */
export function linePointRows(r: BlockResults, index: number, o: DisplayOptions): TradeRow[] | null {
  const p = r.trade.plot;
  const q = p?.points.find((x) => x.index === index);
  if (!p || !q) return null;
  const rows: TradeRow[] = [
    [
      'E_u',
      `${formatNumber(q.energy / KELVIN_PER_EV, o.digits)} eV = ${formatNumber(q.energy / KELVIN_PER_WAVENUMBER, o.digits + 2)} cm⁻¹ = ${formatTemperature(q.energy, null, { digits: o.digits })}`,
    ],
    [p.ordinate, formatMeasured(q.y, q.uY, { digits: o.digits })],
  ];
  if (q.uY !== null)
    rows.push([
      'u(y)',
      `${formatNumber(q.uY, 2)} = u(I)/I${q.poisson ? ', with u(I) = √I (Poisson: photon counts written without ±)' : ''}`,
    ]);
  rows.push(['residual from the fit', `${q.residual > 0 ? '+' : ''}${formatNumber(q.residual, 3)}`]);
  rows.push([
    'flag',
    q.flag === null
      ? 'none'
      : `outlier, ${q.flag} the line refitted without the flagged lines${q.flag === 'below' ? ' (as self-absorption would put it)' : ''}`,
  ]);
  return rows;
}

/** A block's place and its results, for {@link linesCsv}. */
export interface LinesCsvBlock {
  readonly file: string;
  readonly line: number;
  readonly id: string | null;
  readonly results: BlockResults | null;
  /** The 1-based notebook cell the block is in (its `line` counts in that cell), or null for a Markdown note. */
  readonly cell?: number | null;
}

/** The header of {@link linesCsv}. */
export const LINES_CSV_HEAD = [
  'file',
  'line',
  'id',
  'label',
  'upper_energy_K',
  'upper_energy_eV',
  'ordinate',
  'y',
  'u_y',
  'residual',
  'flag',
  'intercept',
  'intercept_uncertainty',
  'cell',
];

/** The per-line plot data of every block of lines, one row per line (RFC 4180, CRLF). */
export function linesCsv(blocks: readonly LinesCsvBlock[]): string {
  const records: CsvField[][] = [LINES_CSV_HEAD];
  for (const b of blocks) {
    const p = b.results?.trade.plot;
    if (!p) continue;
    for (const q of p.points)
      records.push([
        b.file,
        b.line,
        b.id,
        q.label,
        q.energy,
        q.energy / KELVIN_PER_EV,
        p.ordinate,
        q.y,
        q.uY,
        q.residual,
        q.flag,
        p.intercept.value,
        p.intercept.uncertainty,
        b.cell ?? null,
      ]);
  }
  return csvText(records);
}

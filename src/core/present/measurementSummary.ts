/**
 * Display rows for the measurement inputs (time series, thermal reference,
 * emission lines, gain), shared by hovers, "Copy Block Results" and the preview so
 * every host shows the same audited numbers.
 */
import type { BlockResults } from '../analysis/results';
import type { BlockInput } from '../block/input';
import { formatMeasured, formatNumber } from './numbers';
import type { DisplayOptions } from './displayOptions';
import { tradeRows } from './tradeSummary';
import { polarizationAtText, referenceRows } from './runSummary';

/** A label and its value, as display text. */
export type Row = readonly [string, string];

const deg = (rad: number): string => `${formatNumber((rad * 180) / Math.PI, 3)} deg`;

/** Rows describing a block's series, signal reference, lines and gain; empty when it has none. */
export function measurementRows(input: BlockInput | null, r: BlockResults, o: DisplayOptions): Row[] {
  const rows: Row[] = [];
  const s = r.series;
  if (s && input?.series) {
    const name = s.model === 'decay' ? 'T₁ (decay)' : 'τ (build-up)';
    rows.push([name, `${formatMeasured(s.timeConstant.value, s.timeConstant.uncertainty, { digits: o.digits })} s`]);
    rows.push([
      s.model === 'decay' ? 'S₀' : 'S∞',
      formatMeasured(s.amplitude.value, s.amplitude.uncertainty, { digits: o.digits }),
    ]);
    if (s.offset)
      rows.push(['S₀ (offset)', formatMeasured(s.offset.value, s.offset.uncertainty, { digits: o.digits })]);
    const weighted = input.series.uSignals !== null;
    rows.push([
      'series fit',
      `${input.series.times.length} points, ${weighted ? `χ²/dof = ${formatNumber(s.chi2, 3)}/${s.dof}` : `residual standard error √(SSR/(n − p)) = ${formatNumber(Math.sqrt(s.chi2 / Math.max(1, s.dof)), 3)}`}${s.converged ? '' : ', not converged'}`,
    ]);
    if (s.model === 'decay' && input.series.flip !== null)
      rows.push(['readout correction', `cos^(n−1) θ, θ = ${deg(input.series.flip)}`]);
  }
  rows.push(...referenceRows(input, r, o));
  const sig = r.signal;
  if (sig && input?.signal && !sig.thermalOnly) {
    const i = input.signal;
    rows.push([
      'S_hp / S_th',
      `${formatNumber(sig.hyperpolarized, o.digits)} / ${formatNumber(i.thermal, o.digits)} = ${formatNumber(sig.ratio, o.digits)}${sig.fromSeries ? ' (S_hp fitted from the series)' : ''}`,
    ]);
    rows.push(['scans hp / th', `${i.scans[0]} / ${i.scans[1]}`]);
    rows.push(['flip hp / th', `${deg(i.flip[0])} / ${deg(i.flip[1])}`]);
    rows.push(['gain hp / th', `${formatNumber(i.gain[0], 4)} / ${formatNumber(i.gain[1], 4)}`]);
    rows.push(['amount hp / th', `${formatNumber(i.amount[0], 4)} / ${formatNumber(i.amount[1], 4)}`]);
    rows.push([
      'scale factor',
      `(scans·gain·sin θ·amount)_th / (scans·gain·sin θ·amount)_hp = ${formatNumber(sig.factor, o.digits)}`,
    ]);
    rows.push(['P_th of the reference', formatNumber(sig.pThermal, o.digits)]);
  }
  rows.push(...tradeRows(input, r, o));
  const g = r.gain;
  if (g) {
    rows.push(['inversion ΔN = N_u − (g_u/g_l)·N_l', `${formatNumber(g.inversion, o.digits)} cm⁻³`]);
    rows.push(['gain g₀', `${formatMeasured(g.coefficient, g.uCoefficient, { digits: o.digits })} cm⁻¹`]);
    if (g.singlePass !== null || g.singlePassDb !== null)
      rows.push([
        'single-pass gain',
        [
          g.singlePass !== null ? `× ${formatMeasured(g.singlePass, g.uSinglePass, { digits: o.digits })}` : null,
          g.singlePassDb !== null ? `${formatNumber(g.singlePassDb, 3)} dB` : null,
        ]
          .filter((x) => x !== null)
          .join(' = '),
      ]);
    if (g.threshold !== null)
      rows.push([
        'threshold g_th',
        `${formatNumber(g.threshold, o.digits)} cm⁻¹ (${g.aboveThreshold ? 'above threshold' : 'below threshold'})`,
      ]);
    if (g.thresholdInversion !== null)
      rows.push(['threshold inversion ΔN_th = g_th/σ', `${formatNumber(g.thresholdInversion, o.digits)} cm⁻³`]);
  }
  return rows;
}

/**
 * A short addition to the one-line summary, e.g. `T₁ = 22.1 s` or `g₀ = 0.0205 cm⁻¹ (above threshold)`;
 * with `withUncertainty` (the report table's last column) each value carries its standard uncertainty.
 */
export function measurementShort(r: BlockResults, withUncertainty = false): string | null {
  const parts: string[] = [];
  const value = (x: number, u: number | null): string =>
    withUncertainty ? formatMeasured(x, u, { digits: 3 }) : formatNumber(x, 3);
  if (r.series) {
    const tc = r.series.timeConstant;
    parts.push(`${r.series.model === 'decay' ? 'T₁' : 'τ'} = ${value(tc.value, tc.uncertainty)} s`);
  }
  const at = polarizationAtText(r, { digits: 3, percent: true });
  if (at) parts.push(withUncertainty ? at : at.replace(/ ± [^ )%]+/, ''));
  if (r.gain)
    parts.push(
      `g₀ = ${value(r.gain.coefficient, r.gain.uCoefficient)} cm⁻¹${r.gain.aboveThreshold === null ? '' : r.gain.aboveThreshold ? ' (above threshold)' : ' (below threshold)'}`,
    );
  return parts.length ? parts.join(' · ') : null;
}

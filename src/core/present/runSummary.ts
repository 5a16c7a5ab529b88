/**
 * How values taken from other runs are shown: the thermal reference a block
 * uses ("thermal reference: ref-13C Monday, 2026-04-12"), the decay run of an
 * extrapolation, and the polarization carried to another time
 * (`polarizationAt`). Shared by hovers, "Copy Block Results", the preview, the
 * curve view and the command line's table, so every host says the same.
 */
import type { BlockResults } from '../analysis/results';
import type { BlockInput } from '../block/input';
import { shortNote } from '../runs/paths';
import type { RunPlace } from '../runs/types';
import type { DisplayOptions } from './displayOptions';
import { formatFraction, formatMeasured, formatPlainNumber } from './numbers';

type Row = readonly [string, string];

/** `ref.md, line 3` (in a notebook `day.ipynb, cell 2, line 4`, 1-based as the command line counts): where a run is defined. */
export function runPlaceText(place: RunPlace): string {
  return place.cell
    ? `${shortNote(place.note)}, cell ${place.cell.index + 1}, line ${place.cell.line + 1}`
    : `${shortNote(place.note)}, line ${place.line + 1}`;
}

/** `ref-13C Monday, 2026-04-12` (the date only when the run has one). */
export function runLabel(id: string, date: string | null): string {
  return date ? `${id}, ${date}` : id;
}

/** The one line a block's thermal reference gets, or null when the reference is typed in the block. */
export function thermalReferenceText(r: BlockResults): string | null {
  const s = r.signal;
  if (s?.thermalOnly) return 'thermal reference: this block (P = P_th)';
  const run = s?.thermalRun;
  return run ? `thermal reference: ${runLabel(run.id, run.date)}` : null;
}

/** `P(0 s) = 48.07 ± 1.43 %`: the extrapolated polarization, or null. */
export function polarizationAtText(r: BlockResults, o: Pick<DisplayOptions, 'digits' | 'percent'>): string | null {
  const at = r.polarizationAt;
  if (!at) return null;
  return `P(${formatPlainNumber(at.time)} s) = ${formatFraction(at.value, at.uncertainty, { digits: o.digits, percent: o.percent })}`;
}

/** Rows for the referenced values and the extrapolation (hover, preview, copied results); empty when none. */
export function referenceRows(input: BlockInput | null, r: BlockResults, o: DisplayOptions): Row[] {
  const rows: Row[] = [];
  const s = r.signal;
  if (s?.thermalOnly) rows.push(['thermal reference', 'this block records only a thermal signal: P = P_th']);
  else if (s?.thermalRun)
    rows.push([
      'thermal reference',
      `${runLabel(s.thermalRun.id, s.thermalRun.date)} (${runPlaceText(s.thermalRun.place)})`,
    ]);
  const at = r.polarizationAt;
  if (at) {
    const x = input?.extrapolate ?? null;
    rows.push([
      `P at ${formatPlainNumber(at.time)} s`,
      formatFraction(at.value, at.uncertainty, { digits: o.digits, percent: o.percent }),
    ]);
    const t1 = `${formatMeasured(at.decay.value, at.decay.uncertainty, { digits: o.digits })} s`;
    const run = x?.decayRun
      ? ` (decay run: ${runLabel(x.decayRun.id, x.decayRun.date)}, ${runPlaceText(x.decayRun.place)})`
      : '';
    rows.push(['extrapolation', `from ${formatPlainNumber(at.from)} s along exp((from − to)/T₁), T₁ = ${t1}${run}`]);
  }
  return rows;
}

/**
 * The rows that the report's formats share: a block with its report entry, the cells of the table for people
 * (which the Markdown table also prints) and where a line of a note is, as `file:line` or `file, cell N:line`.
 */
import {
  measurementShort,
  betaText,
  enhancementText,
  fractionText,
  withoutSymbol,
  polarizationText,
  temperatureIntervalText,
  type ReportEntry,
  type BlockReport,
  DEFAULT_DISPLAY,
} from '../core';

/** A block with its report entry, for the formatters. */
export interface Row {
  readonly entry: ReportEntry;
  /** Null for a file that could not be read (its entry says why). */
  readonly block: BlockReport | null;
}

/** The table's header; each row has one cell per heading. */
export const TABLE_HEAD = ['where', 'id', 'status', 'T', 'β (K⁻¹)', 'P', 'P_th', 'ε', 'also'];

/** The cells of one row per block: where, id, status, T, β, P, P_th, ε, and the other results. */
export function tableCells(rows: readonly Row[], withUncertainty: boolean): string[][] {
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

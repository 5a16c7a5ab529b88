/** The CSV formats of `boltzmark report`: one row per block, and the plot data of lines (one row per line). */
import { csvText, linesCsv } from '../core';
import type { Row } from './rows';

const CSV_HEAD = [
  'file',
  'line',
  'id',
  'status',
  'beta',
  'beta_uncertainty',
  'temperature',
  'temperature_uncertainty',
  'polarization',
  'polarization_uncertainty',
  'thermal_polarization',
  'enhancement',
  'enhancement_uncertainty',
  'entropy',
  'time_constant_s',
  'time_constant_uncertainty_s',
  'gain_coefficient_per_cm',
  'gain_coefficient_uncertainty_per_cm',
  'single_pass_gain',
  'single_pass_gain_uncertainty',
  'threshold_gain_per_cm',
  'errors',
  'warnings',
  'beta_low_95',
  'beta_high_95',
  'temperature_low_95',
  'temperature_high_95',
  'polarization_low_95',
  'polarization_high_95',
  'polarization_at_time_s',
  'polarization_at',
  'polarization_at_uncertainty',
  'thermal_reference',
  // Added last, so that no column moves: the notebook cell of a block (its `line` counts within the cell).
  'cell',
];

/** CSV through the core's writer (RFC 4180, formula-guarded), full-precision numbers, empty cells for unknowns. */
export function formatCsv(rows: readonly Row[]): string {
  return csvText([
    CSV_HEAD,
    ...rows.map(({ entry: e }) => [
      e.file,
      e.line,
      e.id,
      e.status,
      e.beta?.value ?? null,
      e.beta?.uncertainty ?? null,
      e.temperature?.value ?? null,
      e.temperature?.uncertainty ?? null,
      e.polarization?.value ?? null,
      e.polarization?.uncertainty ?? null,
      e.thermalPolarization,
      e.enhancement,
      e.enhancementUncertainty,
      e.entropy,
      e.timeConstant?.value ?? null,
      e.timeConstant?.uncertainty ?? null,
      e.gainCoefficient,
      e.gainCoefficientUncertainty,
      e.singlePassGain,
      e.singlePassGainUncertainty,
      e.thresholdGain,
      e.diagnostics.filter((d) => d.severity === 'error').length,
      e.diagnostics.filter((d) => d.severity === 'warning').length,
      e.beta?.interval?.[0] ?? null,
      e.beta?.interval?.[1] ?? null,
      e.temperature?.interval?.[0] ?? null,
      e.temperature?.interval?.[1] ?? null,
      e.polarization?.interval?.[0] ?? null,
      e.polarization?.interval?.[1] ?? null,
      e.polarizationAt?.time ?? null,
      e.polarizationAt?.value ?? null,
      e.polarizationAt?.uncertainty ?? null,
      e.thermalReference?.id ?? null,
      e.cell,
    ]),
  ]);
}

/** The per-line plot data of every block of lines as CSV (one row per line; formula-like text guarded). */
export function formatLinePoints(rows: readonly Row[]): string {
  return linesCsv(
    rows.flatMap(({ entry, block }) =>
      block ? [{ file: entry.file, line: entry.line, id: entry.id, results: block.results, cell: entry.cell }] : [],
    ),
  );
}

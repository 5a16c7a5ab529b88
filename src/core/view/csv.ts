/**
 * CSV export of the curve view: the large-N curve, the finite-N staircase,
 * the measured point and the thermal marker of every run shown, one row per
 * point, written by the one CSV writer (`present/csv.ts`: RFC 4180, formula
 * guarding, full-precision numbers, empty cells for unknowns). Energies in K and, when asked, also in a display unit.
 */
import { csvText, type CsvField } from '../present/csv';
import { formatPlainNumber } from '../present/numbers';
import type { CurvePayload, DisplayUnit } from './payload';
import { runChartRows, type RunChartPayload, type RunQuantity } from './runChart';
import type { DisplayOptions } from '../present/displayOptions';

type Cell = CsvField;

const HEAD = [
  'run',
  'series',
  'm',
  'energy_K',
  'entropy_per_Nk',
  'beta_per_K',
  'u_energy_K',
  'u_entropy',
  'u_beta_per_K',
  'entropy_deficit',
  'relative_entropy',
];

/** The rows of one run, with `energy_K` in the fourth column. */
function runRows(p: CurvePayload): Cell[][] {
  const rows: Cell[][] = [];
  const c = p.curve;
  for (let i = 0; i < c.energy.length; i++)
    rows.push([p.id, 'large-N', null, c.energy[i]!, c.entropy[i]!, c.beta[i]!, null, null, null, null, null]);
  const f = p.finiteN;
  if (f) {
    for (let i = 0; i < f.energy.length; i++) {
      rows.push([
        p.id,
        `finite-N (N=${f.n})`,
        f.m[i]!,
        f.energy[i]!,
        f.entropy[i]!,
        f.beta[i]!,
        null,
        null,
        null,
        null,
        null,
      ]);
    }
  }
  const m = p.measured;
  if (m)
    rows.push([
      p.id,
      'measured',
      null,
      m.energy,
      m.entropy,
      m.beta,
      m.uEnergy,
      m.uEntropy,
      m.uBeta,
      m.deficit,
      m.relativeEntropy,
    ]);
  const t = p.thermal;
  if (t)
    rows.push([
      p.id,
      `thermal at lattice ${formatPlainNumber(t.temperature)} K`,
      null,
      t.energy,
      t.entropy,
      t.beta,
      null,
      null,
      null,
      null,
      null,
    ]);
  return rows;
}

/**
 * The CSV text of the given runs (the block shown first, then the pinned ones).
 * With a display unit other than K, a column `energy_<unit>` follows `energy_K`.
 */
export function curveCsv(runs: readonly CurvePayload[], unit: DisplayUnit | null = null): string {
  const extra = unit !== null && unit.kelvinPerUnit !== 1;
  const head = extra ? [...HEAD.slice(0, 4), `energy_${unit.name}`, ...HEAD.slice(4)] : HEAD;
  const records: Cell[][] = [head];
  for (const p of runs) {
    for (const row of runRows(p)) {
      const e = row[3] as number;
      records.push(extra ? [...row.slice(0, 4), e / unit.kelvinPerUnit, ...row.slice(4)] : row);
    }
  }
  return csvText(records);
}

/** The CSV text of a run comparison for one quantity (see {@link runChartRows}). */
export function runChartCsv(p: RunChartPayload, q: RunQuantity, o: DisplayOptions): string {
  return csvText(runChartRows(p, q, o));
}

/**
 * The run comparison chart's data: one result (P, β, T, ε, T₁/τ or g₀) of
 * many runs against their date or their order, with standard uncertainties
 * for the error bars and the run's status for its colour. Built by the host
 * from the run log's entries (a note's blocks, or the run log's filter) and
 * sent to the curve view's page, which only draws it; the validator below
 * checks it on arrival. Package-free: the page's bundle carries it.
 */
import { formatFraction, formatInverseTemperature, formatMeasured, formatTemperature } from '../present/numbers';
import type { Measured, Status } from '../types';
import type { DisplayOptions } from '../present/displayOptions';
import { isArrayOf, isCount, isFiniteNumber, isNumberOrNull, isOneOf, isRecord, isText } from './validate';

/** The results a run comparison can show. */
export type RunQuantity = 'polarization' | 'beta' | 'temperature' | 'enhancement' | 'timeConstant' | 'gain';

/** The choices, in the order the page lists them. */
export const RUN_QUANTITIES: readonly RunQuantity[] = [
  'polarization',
  'beta',
  'temperature',
  'enhancement',
  'timeConstant',
  'gain',
];

/** What the chart needs of one run (a subset of the run log's entry). */
export interface RunSource {
  readonly uri: string;
  readonly name: string;
  /** 0-based line of the opening fence. */
  readonly line: number;
  readonly id: string | null;
  readonly date: string | null;
  readonly status: Status;
  readonly polarization: Measured | null;
  readonly beta: Measured | null;
  readonly temperature: Measured | null;
  readonly enhancement: Measured | null;
  /** T₁ (decay) or τ (build-up) in s. */
  readonly timeConstant: Measured | null;
  /** Small-signal gain coefficient g₀ in cm⁻¹. */
  readonly gain: Measured | null;
}

/** One result of a run as plotted: value and standard uncertainty in the axis unit, and as text. */
export interface RunValue {
  readonly y: number;
  readonly u: number | null;
  readonly text: string;
}

/** One run on the chart. */
export interface RunPoint {
  readonly uri: string;
  readonly line: number;
  /** How the run is named: its id, or the note and line. */
  readonly label: string;
  readonly date: string | null;
  readonly status: Status;
  /** Position on the x axis: days since 1970-01-01 (UTC) when the chart is by date, else the run's order from 1. */
  readonly x: number;
  /** The run's value of each quantity it has (null where it has none). */
  readonly values: Readonly<Record<RunQuantity, RunValue | null>>;
}

/** An axis of one quantity: its title with the unit, and the short name. */
export interface RunAxis {
  readonly quantity: RunQuantity;
  readonly title: string;
}

/** The chart's data. */
export interface RunChartPayload {
  /** What the runs are: a note's name, or the run log with its filter. */
  readonly title: string;
  /** `date` when every run has a date, else `order`. */
  readonly xAxis: 'date' | 'order';
  readonly axes: readonly RunAxis[];
  readonly points: readonly RunPoint[];
}

/** The y-axis title of each quantity, with its unit as the display options give it. */
export function runAxisTitle(q: RunQuantity, o: DisplayOptions): string {
  switch (q) {
    case 'polarization':
      return o.percent ? 'polarization P (%)' : 'polarization P';
    case 'beta':
      return 'inverse temperature β (K⁻¹)';
    case 'temperature':
      return 'spin or excitation temperature T (K)';
    case 'enhancement':
      return 'enhancement ε = P/P_th';
    case 'timeConstant':
      return 'time constant T₁ or τ (s)';
    case 'gain':
      return 'gain coefficient g₀ (cm⁻¹)';
  }
}

/** Days since 1970-01-01 of an ISO date `YYYY-MM-DD` (a time after it is ignored), or null. */
export function dayNumber(date: string | null): number | null {
  const m = date === null ? null : /^(\d{4})-(\d{2})-(\d{2})/.exec(date.trim());
  if (!m) return null;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const ms = Date.UTC(y, mo - 1, d);
  const back = new Date(ms);
  // Refuses dates that roll over (2026-02-30).
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) return null;
  return ms / 86_400_000;
}

/** The ISO date of a day number (the inverse of {@link dayNumber} on whole days). */
export function dayText(day: number): string {
  return new Date(Math.round(day) * 86_400_000).toISOString().slice(0, 10);
}

function value(q: RunQuantity, m: Measured | null, o: DisplayOptions): RunValue | null {
  if (!m || !Number.isFinite(m.value)) return null;
  const u = m.uncertainty !== null && Number.isFinite(m.uncertainty) && m.uncertainty > 0 ? m.uncertainty : null;
  const digits = { digits: o.digits };
  switch (q) {
    case 'polarization': {
      const k = o.percent ? 100 : 1;
      return {
        y: m.value * k,
        u: u === null ? null : u * k,
        text: formatFraction(m.value, u, { ...digits, percent: o.percent }),
      };
    }
    case 'beta':
      return { y: m.value, u, text: formatInverseTemperature(m.value, u, digits) };
    case 'temperature':
      return { y: m.value, u, text: formatTemperature(m.value, u, digits) };
    case 'enhancement':
      return { y: m.value, u, text: formatMeasured(m.value, u, digits) };
    case 'timeConstant':
      return { y: m.value, u, text: `${formatMeasured(m.value, u, digits)} s` };
    case 'gain':
      return { y: m.value, u, text: `${formatMeasured(m.value, u, digits)} cm⁻¹` };
  }
}

/**
 * The chart of the given runs: by date when every run has a valid date (runs
 * of one day spread over a fifth of a day so that their bars stay apart), else
 * by their order as given. Only the quantities some run has get an axis.
 */
export function runChartData(title: string, runs: readonly RunSource[], o: DisplayOptions): RunChartPayload {
  const days = runs.map((r) => dayNumber(r.date));
  const byDate = runs.length > 0 && days.every((d) => d !== null);
  const sameDay = new Map<number, number>();
  if (byDate) for (const d of days) sameDay.set(d!, (sameDay.get(d!) ?? 0) + 1);
  const seen = new Map<number, number>();
  const points: RunPoint[] = runs.map((r, i) => {
    let x = i + 1;
    if (byDate) {
      const d = days[i]!;
      const n = sameDay.get(d)!;
      const k = seen.get(d) ?? 0;
      seen.set(d, k + 1);
      x = n === 1 ? d : d + (k / (n - 1) - 0.5) * 0.2;
    }
    const values = {} as Record<RunQuantity, RunValue | null>;
    for (const q of RUN_QUANTITIES) values[q] = value(q, r[q === 'gain' ? 'gain' : q], o);
    return {
      uri: r.uri,
      line: r.line,
      label: r.id ?? `${r.name}:${r.line + 1}`,
      date: r.date,
      status: r.status,
      x,
      values,
    };
  });
  const axes = RUN_QUANTITIES.filter((q) => points.some((p) => p.values[q] !== null)).map((quantity) => ({
    quantity,
    title: runAxisTitle(quantity, o),
  }));
  return { title, xAxis: byDate ? 'date' : 'order', axes, points };
}

/** Most runs a chart carries (a bound for the validator, far above a lab's runs per note or filter). */
export const MAX_RUN_POINTS = 5000;

const STATUS_WORDS: readonly Status[] = ['normal', 'saturated', 'inverted', 'non-thermal', 'invalid'];

function isRunValue(x: unknown): x is RunValue | null {
  return x === null || (isRecord(x) && isFiniteNumber(x.y) && isNumberOrNull(x.u) && isText(x.text, 200));
}

function isRunPoint(x: unknown): x is RunPoint {
  if (!isRecord(x) || !isRecord(x.values)) return false;
  const values = x.values;
  return (
    isText(x.uri, 4000) &&
    isCount(x.line) &&
    isText(x.label, 1000) &&
    (x.date === null || isText(x.date, 100)) &&
    isOneOf(x.status, STATUS_WORDS) &&
    isFiniteNumber(x.x) &&
    RUN_QUANTITIES.every((q) => isRunValue(values[q]))
  );
}

/** True when `x` is a well-formed {@link RunChartPayload}. */
export function isRunChartPayload(x: unknown): x is RunChartPayload {
  return (
    isRecord(x) &&
    isText(x.title, 1000) &&
    isOneOf(x.xAxis, ['date', 'order'] as const) &&
    isArrayOf(
      x.axes,
      (a): a is RunAxis => isRecord(a) && isOneOf(a.quantity, RUN_QUANTITIES) && isText(a.title, 200),
      RUN_QUANTITIES.length,
    ) &&
    isArrayOf(x.points, isRunPoint, MAX_RUN_POINTS)
  );
}

/** The CSV column of a quantity, plain ASCII with its unit. */
export function runCsvColumn(q: RunQuantity, o: DisplayOptions): string {
  return {
    polarization: o.percent ? 'polarization_percent' : 'polarization',
    beta: 'beta_per_K',
    temperature: 'temperature_K',
    enhancement: 'enhancement',
    timeConstant: 'time_constant_s',
    gain: 'gain_coefficient_per_cm',
  }[q];
}

/**
 * The chart's runs as table rows (header first) for one quantity: run, note
 * line (1-based), date, status, value and standard uncertainty in the axis
 * unit; runs without the quantity are left out. The CSV writer quotes and guards the cells.
 */
export function runChartRows(p: RunChartPayload, q: RunQuantity, o: DisplayOptions): (string | number | null)[][] {
  const column = runCsvColumn(q, o);
  const rows: (string | number | null)[][] = [['run', 'line', 'date', 'status', column, `${column}_uncertainty`]];
  for (const pt of p.points) {
    const v = pt.values[q];
    if (v) rows.push([pt.label, pt.line + 1, pt.date, pt.status, v.y, v.u]);
  }
  return rows;
}

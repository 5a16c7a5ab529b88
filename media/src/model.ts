/**
 * From the payloads to what the two charts draw: points in the display unit
 * (energy E/unit = (E/k)/kelvinPerUnit; β always in K⁻¹, the unit every
 * result and table gives it in, whatever unit the energy axis uses), axis ranges, error bars, the deficit gap
 * and the inversion region. Pure: no DOM, no chart.js.
 */
import {
  COVERAGE_FACTOR,
  pinsBesides,
  type CurvePayload,
  type DisplayUnit,
  type EnergyAxisUnit,
  type PinnedRun,
} from '../../src/core/packageFree';
import { shortNumber, shortTemperature } from './numbers';
import type { Palette } from './palette';

/** A point on screen axes. */
export interface XY {
  readonly x: number;
  readonly y: number;
}

/** One drawn series. `role` decides its styling; `label` is shown in the legend (null: not listed). */
export interface Series {
  readonly role: 'curve' | 'finiteN' | 'measured' | 'lattice' | 'pin' | 'pinCurve';
  readonly label: string | null;
  readonly points: readonly XY[];
  readonly color: string;
  readonly pointStyle: 'circle' | 'triangle' | 'rect' | 'rectRot' | 'star' | 'crossRot' | 'cross' | 'rectRounded';
}

/** An error bar around a point (null where the uncertainty is unknown). */
export interface ErrorBar {
  readonly x: number;
  readonly y: number;
  readonly dx: number | null;
  readonly dy: number | null;
  readonly color: string;
}

/** The dashed gap between a measured point and the thermal curve above it, with its text. */
export interface DeficitGap {
  readonly x: number;
  readonly from: number;
  readonly to: number;
  readonly text: string;
  readonly color: string;
}

/** What one chart draws. */
export interface ChartModel {
  readonly series: readonly Series[];
  readonly x: { readonly min: number; readonly max: number; readonly title: string };
  readonly y: { readonly min: number; readonly max: number; readonly title: string };
  readonly errorBars: readonly ErrorBar[];
  readonly deficit: DeficitGap | null;
  /** Energy of β = 0 on the x axis; right of it β < 0. */
  readonly saturationX: number;
}

/** Both charts. */
export interface ViewModel {
  readonly entropy: ChartModel;
  readonly beta: ChartModel;
  /** Kelvin per display unit, for the T reading of the β axis. */
  readonly kelvinPerUnit: number;
  readonly unit: DisplayUnit;
}

const PIN_SHAPES: readonly Series['pointStyle'][] = ['rectRot', 'star', 'crossRot', 'rect', 'rectRounded', 'cross'];

/** The display unit actually used: the block's, or kelvin. */
function unitOf(p: CurvePayload, choice: EnergyAxisUnit): DisplayUnit {
  return choice === 'K' ? { name: 'K', label: 'K', kelvinPerUnit: 1 } : p.unit;
}

function sameScheme(a: CurvePayload, b: CurvePayload): boolean {
  const near = (x: readonly number[], y: readonly number[]): boolean =>
    x.length === y.length && x.every((v, i) => Math.abs(v - y[i]!) <= 1e-12 * Math.max(1, Math.abs(v)));
  return near(a.scheme.energies, b.scheme.energies) && near(a.scheme.g, b.scheme.g);
}

function columnPoints(xs: readonly number[], ys: readonly number[], kx: number, ky: number): XY[] {
  return xs.map((x, i) => ({ x: x / kx, y: ys[i]! * ky }));
}

/** Limits of the β axis: wide enough for every marker and a readable middle of the curve. */
function betaLimit(base: CurvePayload, pins: readonly PinnedRun[]): number {
  const span = base.scheme.energies[base.scheme.energies.length - 1]! - base.scheme.energies[0]!;
  let limit = 6 / span;
  for (const p of [base, ...pins.map((r) => r.payload)]) {
    const m = p.measured;
    if (m && m.beta !== null) limit = Math.max(limit, Math.abs(m.beta) + 2 * (m.uBeta ?? 0));
    if (p.thermal) limit = Math.max(limit, Math.abs(p.thermal.beta));
  }
  return niceCeil(1.1 * limit);
}

/** The smallest of 1, 2, 2.5, 5 × 10ⁿ that is ≥ x > 0: an axis end that reads well. */
export function niceCeil(x: number): number {
  const power = 10 ** Math.floor(Math.log10(x));
  const step = [1, 2, 2.5, 5, 10].find((f) => f * power >= x * (1 - 1e-12)) ?? 10;
  return step * power;
}

/** Builds both chart models for the shown block and the pinned runs. */
export function viewModel(
  base: CurvePayload,
  pinned: readonly PinnedRun[],
  choice: EnergyAxisUnit,
  palette: Palette,
): ViewModel {
  const pins = pinsBesides(base, pinned);
  const unit = unitOf(base, choice);
  const k = unit.kelvinPerUnit;
  const e: Series[] = [];
  const b: Series[] = [];
  const eBars: ErrorBar[] = [];
  const bBars: ErrorBar[] = [];
  e.push({
    role: 'curve',
    label: 'thermal states, large N',
    points: columnPoints(base.curve.energy, base.curve.entropy, k, 1),
    color: palette.curve,
    pointStyle: 'circle',
  });
  b.push({
    role: 'curve',
    label: 'thermal states, large N',
    points: columnPoints(base.curve.energy, base.curve.beta, k, 1),
    color: palette.curve,
    pointStyle: 'circle',
  });
  const f = base.finiteN;
  if (f) {
    const label = `exact, N = ${f.n}`;
    e.push({
      role: 'finiteN',
      label,
      points: columnPoints(f.energy, f.entropy, k, 1),
      color: palette.finiteN,
      pointStyle: 'circle',
    });
    b.push({
      role: 'finiteN',
      label,
      points: columnPoints(f.energy, f.beta, k, 1),
      color: palette.finiteN,
      pointStyle: 'circle',
    });
  }
  const runs: { p: CurvePayload; role: 'measured' | 'pin'; color: string; shape: Series['pointStyle'] }[] = [
    { p: base, role: 'measured', color: palette.measured, shape: 'circle' },
    // Each pin keeps the colour and shape of its place in the pin list, also while one of them is the shown run.
    ...pinned.flatMap((r, i) =>
      pins.includes(r)
        ? [
            {
              p: r.payload,
              role: 'pin' as const,
              color: palette.pins[i % palette.pins.length]!,
              shape: PIN_SHAPES[i % PIN_SHAPES.length]!,
            },
          ]
        : [],
    ),
  ];
  for (const { p, role, color, shape } of runs) {
    if (role === 'pin' && !sameScheme(p, base)) {
      e.push({
        role: 'pinCurve',
        label: null,
        points: columnPoints(p.curve.energy, p.curve.entropy, k, 1),
        color,
        pointStyle: shape,
      });
      b.push({
        role: 'pinCurve',
        label: null,
        points: columnPoints(p.curve.energy, p.curve.beta, k, 1),
        color,
        pointStyle: shape,
      });
    }
    const m = p.measured;
    if (!m) continue;
    const x = m.energy / k;
    const dx = m.uEnergy === null ? null : m.uEnergy / k;
    e.push({ role, label: p.id, points: [{ x, y: m.entropy }], color, pointStyle: shape });
    eBars.push({ x, y: m.entropy, dx, dy: m.uEntropy, color });
    if (m.beta !== null) {
      b.push({ role, label: p.id, points: [{ x, y: m.beta }], color, pointStyle: shape });
      // The β bar is the k = 2 interval β ± 2u(β) (the contract's `interval`); the T axis reads it as T's interval.
      bBars.push({ x, y: m.beta, dx, dy: m.uBeta === null ? null : COVERAGE_FACTOR * m.uBeta, color });
    }
  }
  const t = base.thermal;
  if (t) {
    const label = `thermal at lattice ${shortTemperature(t.temperature)}`;
    e.push({
      role: 'lattice',
      label,
      points: [{ x: t.energy / k, y: t.entropy }],
      color: palette.lattice,
      pointStyle: 'triangle',
    });
    b.push({
      role: 'lattice',
      label,
      points: [{ x: t.energy / k, y: t.beta }],
      color: palette.lattice,
      pointStyle: 'triangle',
    });
  }
  const all = [base, ...pins.map((r) => r.payload)];
  const xMin = Math.min(...all.map((p) => p.scheme.energies[0]!)) / k;
  const xMax = Math.max(...all.map((p) => p.scheme.energies[p.scheme.energies.length - 1]!)) / k;
  const sMax = Math.max(...all.map((p) => p.maxEntropy));
  const limit = betaLimit(base, pins);
  const xTitle = `energy per system E (${unit.label})`;
  const m = base.measured;
  const deficit: DeficitGap | null =
    m && m.thermalEntropy !== null && m.deficit !== null && m.deficit > 1e-3 * Math.max(sMax, 1e-300)
      ? {
          x: m.energy / k,
          from: m.entropy,
          to: m.thermalEntropy,
          text: `deficit ΔS/N = ${shortNumber(m.deficit)} k`,
          color: palette.measured,
        }
      : null;
  return {
    unit,
    kelvinPerUnit: k,
    entropy: {
      series: e,
      errorBars: eBars,
      deficit,
      saturationX: base.saturationEnergy / k,
      x: { min: xMin, max: xMax, title: xTitle },
      y: { min: 0, max: niceCeil(1.08 * sMax), title: 'entropy S/(Nk)' },
    },
    beta: {
      series: b,
      errorBars: bBars,
      deficit: null,
      saturationX: base.saturationEnergy / k,
      x: { min: xMin, max: xMax, title: xTitle },
      y: {
        min: -limit,
        max: limit,
        title: 'inverse temperature β (K⁻¹)',
      },
    },
  };
}

/**
 * The run comparison chart: one result of many runs (P, β, T, ε, T₁/τ or
 * g₀, as chosen) against their date or order, each run a point in its
 * status's colour and shape with its standard uncertainty as an error bar.
 * Hovering a point names the run, its date and value; clicking it asks the
 * host to open the run. Everything drawn comes from the host's payload;
 * text from a note reaches the canvas only through chart.js's text drawing.
 */
import type { ChartDataset } from 'chart.js';
import { drawScatter, markAxes, type Scatter } from './scatter';
import {
  dayText,
  type RunChartPayload,
  type RunPoint,
  type RunQuantity,
  type Status,
} from '../../src/core/packageFree';
import { shortNumber } from './numbers';
import type { ErrorBar } from './model';
import { niceStep } from './ticks';
import type { Palette } from './theme';

/** The statuses drawn, in legend order, with a point shape each (so colour is never the only cue). */
const STATUS_STYLE: readonly (readonly [Status, 'circle' | 'rectRot' | 'triangle' | 'rect'])[] = [
  ['normal', 'circle'],
  ['saturated', 'rectRot'],
  ['inverted', 'triangle'],
  ['non-thermal', 'rect'],
];

/** The colour of a status: the theme's chart colours, as the status chip uses them. */
export function statusColor(s: Status, p: Palette): string {
  switch (s) {
    case 'normal':
      return p.curve;
    case 'saturated':
      return p.saturation;
    case 'inverted':
      return p.inversion;
    case 'non-thermal':
      return p.finiteN;
    default:
      return p.muted;
  }
}

/** The y range of the points with their error bars, padded by 8 %; a single value gets ±10 % (or ±1). */
function yRange(values: readonly { y: number; u: number | null }[]): { min: number; max: number } {
  let min = Math.min(...values.map((v) => v.y - (v.u ?? 0)));
  let max = Math.max(...values.map((v) => v.y + (v.u ?? 0)));
  if (!(max > min)) {
    const half = Math.abs(min) > 0 ? Math.abs(min) * 0.1 : 1;
    min -= half;
    max += half;
  }
  const pad = (max - min) * 0.08;
  return { min: min - pad, max: max + pad };
}

/** The x range: whole days (or runs) with half a step of room on each side. */
function xRange(points: readonly RunPoint[]): { min: number; max: number } {
  const xs = points.map((p) => p.x);
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const room = Math.max(0.6, (hi - lo) * 0.05);
  return { min: lo - room, max: hi + room };
}

/** Owns the chart.js instance of the run comparison. */
export class RunChart {
  private chart: Scatter | null = null;
  private drawn = 0;
  /** The points of each dataset, so a click or a tooltip finds its run. */
  private shown: RunPoint[][] = [];

  constructor(
    private readonly section: HTMLElement,
    private readonly canvas: HTMLCanvasElement,
    private readonly open: (p: RunPoint) => void,
  ) {}

  /** The quantities the payload offers, in order. */
  static choices(runs: RunChartPayload | null | undefined): RunQuantity[] {
    return runs ? runs.axes.map((a) => a.quantity) : [];
  }

  /** Shows and draws the runs for `quantity`, or hides the section when no run has any result. */
  draw(runs: RunChartPayload | null | undefined, quantity: RunQuantity, p: Palette): void {
    const axis = runs?.axes.find((a) => a.quantity === quantity);
    const points = runs && axis ? runs.points.filter((pt) => pt.values[quantity] !== null) : [];
    this.section.hidden = !runs || runs.axes.length === 0;
    if (!runs || !axis || points.length === 0) return;
    this.shown = STATUS_STYLE.map(([s]) => points.filter((pt) => pt.status === s));
    const datasets: ChartDataset<'scatter'>[] = STATUS_STYLE.map(([status, shape], i) => ({
      label: status,
      data: this.shown[i]!.map((pt) => ({ x: pt.x, y: pt.values[quantity]!.y })),
      borderColor: statusColor(status, p),
      backgroundColor: statusColor(status, p),
      pointStyle: shape,
      pointRadius: 5,
      pointHoverRadius: 7,
      pointHitRadius: 8,
      showLine: false,
    }));
    const bars: ErrorBar[] = points.flatMap((pt) => {
      const v = pt.values[quantity]!;
      return v.u === null ? [] : [{ x: pt.x, y: v.y, dx: null, dy: v.u, color: statusColor(pt.status, p) }];
    });
    const x = xRange(points);
    const y = yRange(points.map((pt) => pt.values[quantity]!));
    const byDate = runs.xAxis === 'date';
    const stepX = byDate ? Math.max(1, niceStep((x.max - x.min) / 6, [1, 2, 7, 14, 30, 61, 91, 183, 365])) : 1;
    const tooltipLines = (ds: number, index: number): string[] => {
      const pt = this.shown[ds]?.[index];
      if (!pt) return [];
      return [
        `${pt.label}${pt.date ? ` · ${pt.date}` : ''}`,
        `${axis.title.replace(/ \(.*\)$/, '')}: ${pt.values[quantity]!.text}`,
        pt.status,
      ];
    };
    const options = {
      animation: false as const,
      responsive: true,
      maintainAspectRatio: false,
      parsing: false as const,
      scales: {
        x: {
          type: 'linear' as const,
          min: x.min,
          max: x.max,
          title: { display: true, text: byDate ? 'date' : 'run (order in the note or list)', color: p.foreground },
          grid: { color: p.grid, lineWidth: 0.5 },
          ticks: {
            color: p.muted,
            stepSize: stepX,
            autoSkip: true,
            maxRotation: 0,
            includeBounds: false,
            callback: (v: number | string) => {
              const n = Number(v);
              if (!Number.isInteger(Math.round(n * 1e6) / 1e6)) return '';
              return byDate ? dayText(n) : String(n);
            },
          },
        },
        y: {
          type: 'linear' as const,
          min: y.min,
          max: y.max,
          title: { display: true, text: axis.title, color: p.foreground },
          grid: { color: p.grid, lineWidth: 0.5 },
          ticks: {
            color: p.muted,
            callback: (v: number | string) => shortNumber(Number(v)),
            maxTicksLimit: 8,
            includeBounds: false,
          },
        },
      },
      onHover: (e: { native: Event | null }, active: unknown[]) => {
        const target = e.native?.target as HTMLElement | null;
        if (target) target.style.cursor = active.length > 0 ? 'pointer' : 'default';
      },
      onClick: (_e: unknown, active: { datasetIndex: number; index: number }[]) => {
        const hit = active[0];
        const pt = hit ? this.shown[hit.datasetIndex]?.[hit.index] : undefined;
        if (pt) this.open(pt);
      },
      plugins: {
        legend: {
          display: true,
          labels: {
            color: p.foreground,
            usePointStyle: true,
            boxWidth: 8,
            boxHeight: 8,
            filter: (i: { datasetIndex?: number }) => (this.shown[i.datasetIndex ?? -1]?.length ?? 0) > 0,
          },
        },
        tooltip: {
          callbacks: {
            title: () => '',
            label: (c: { datasetIndex: number; dataIndex: number }) => tooltipLines(c.datasetIndex, c.dataIndex),
          },
        },
        errorBars: { bars, width: p.highContrast ? 2 : 1.5 },
        background: { color: p.background },
      },
    };
    this.chart = drawScatter(this.canvas, this.chart, datasets, options);
    markAxes(this.canvas, this.chart, x, y);
    this.canvas.dataset.points = String(points.length);
    this.canvas.dataset.quantity = quantity;
    this.canvas.setAttribute('aria-label', `${axis.title} of ${points.length} runs of ${runs.title}`);
    this.section.dataset.drawn = String(++this.drawn);
  }

  /** The canvas, for the PNG export. */
  canvases(): HTMLCanvasElement[] {
    return [this.canvas];
  }
}

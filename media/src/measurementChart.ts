/**
 * The measurement chart below the curves: the Boltzmann plot of an
 * emission-lines block (points, flagged lines, the fitted line) or a time
 * series with its fitted model, and the residuals on a right-hand axis.
 */
import { type Chart, type ChartDataset } from 'chart.js';
import { drawScatter, markAxes, type Scatter } from './scatter';
import type { MeasurementPlot, PinnedPlot } from '../../src/core/packageFree';
import { largestMagnitude, paddedRange } from './axisRange';
import { shortNumber } from './numbers';
import type { Palette } from './theme';

const range = paddedRange;

/** The tick values of every axis, as JSON, for tests: `{"x":[…],"y":[…],"y2":[…]}`. */
export function tickValues(chart: Chart): string {
  const out: Record<string, number[]> = {};
  for (const [id, scale] of Object.entries(chart.scales)) out[id] = scale.ticks.map((t) => t.value);
  return JSON.stringify(out);
}

/** Owns the chart.js instance of the measurement plot. */
export class MeasurementChart {
  private chart: Scatter | null = null;
  private drawn = 0;

  constructor(
    private readonly section: HTMLElement,
    private readonly title: HTMLElement,
    private readonly canvas: HTMLCanvasElement,
  ) {}

  /** Shows and draws the plot, or hides the section when there is none. */
  draw(plot: MeasurementPlot | null | undefined, p: Palette, pinned: readonly PinnedPlot[] = []): void {
    this.section.hidden = !plot;
    if (!plot) return;
    this.title.textContent = plot.title;
    const ys = [...plot.points.map((q) => q.y), ...plot.fit.y, ...pinned.flatMap((r) => r.plot.points.map((q) => q.y))];
    const xs = [...plot.points.map((q) => q.x), ...plot.fit.x, ...pinned.flatMap((r) => r.plot.points.map((q) => q.x))];
    const datasets: ChartDataset<'scatter'>[] = [
      {
        label: 'measured',
        data: plot.points.filter((q) => !q.flagged).map((q) => ({ x: q.x, y: q.y })),
        borderColor: p.measured,
        backgroundColor: p.measured,
        pointRadius: 4,
        pointStyle: 'circle',
        showLine: false,
        yAxisID: 'y',
      },
      {
        label: 'flagged (> 3 σ off)',
        data: plot.points.filter((q) => q.flagged).map((q) => ({ x: q.x, y: q.y })),
        borderColor: p.saturation,
        backgroundColor: p.saturation,
        pointRadius: 6,
        pointStyle: 'crossRot',
        borderWidth: 2,
        showLine: false,
        yAxisID: 'y',
      },
      {
        label: 'fit',
        data: plot.fit.x.map((x, i) => ({ x, y: plot.fit.y[i] })),
        borderColor: p.curve,
        backgroundColor: p.curve,
        pointRadius: 0,
        showLine: true,
        borderWidth: 2,
        yAxisID: 'y',
      },
      {
        label: 'residual',
        data: plot.residuals.map((r) => ({ x: r.x, y: r.y })),
        borderColor: p.muted,
        backgroundColor: p.muted,
        pointRadius: 3,
        pointStyle: 'triangle',
        showLine: false,
        yAxisID: 'y2',
      },
    ];
    // Each pinned run: its points and its fit in the pin's colour, labelled by its id in the legend.
    pinned.forEach((r, i) => {
      const color = p.pins[i % p.pins.length]!;
      datasets.push(
        {
          label: r.id,
          data: r.plot.points.map((q) => ({ x: q.x, y: q.y })),
          borderColor: color,
          backgroundColor: color,
          pointRadius: 4,
          pointStyle: 'rectRot',
          showLine: false,
          yAxisID: 'y',
        },
        {
          label: '',
          data: r.plot.fit.x.map((x, k) => ({ x, y: r.plot.fit.y[k]! })),
          borderColor: color,
          backgroundColor: color,
          pointRadius: 0,
          showLine: true,
          borderWidth: 1.5,
          borderDash: [6, 4],
          yAxisID: 'y',
        },
      );
    });
    const x = range(xs);
    const y = range(ys);
    const rmax =
      largestMagnitude(
        plot.residuals.map((r) => r.y),
        1e-300,
      ) * 1.2;
    const axis = (title: string, min: number, max: number, position: 'left' | 'right' | 'bottom', grid: boolean) => ({
      type: 'linear' as const,
      position,
      min,
      max,
      title: { display: true, text: title, color: p.foreground },
      grid: { display: grid, color: p.grid, lineWidth: 0.5 },
      // Ticks at round steps only: the padded axis ends (1.04, −0.00617) would crowd their neighbours.
      ticks: {
        color: p.muted,
        callback: (v: number | string) => shortNumber(Number(v)),
        maxTicksLimit: 7,
        includeBounds: false,
      },
    });
    const options = {
      animation: false as const,
      responsive: true,
      maintainAspectRatio: false,
      parsing: false as const,
      scales: {
        x: axis(plot.xTitle, x.min, x.max, 'bottom', true),
        y: axis(plot.yTitle, y.min, y.max, 'left', true),
        y2: axis('residual', -rmax, rmax, 'right', false),
      },
      plugins: {
        legend: {
          display: true,
          labels: {
            color: p.foreground,
            usePointStyle: true,
            boxWidth: 8,
            boxHeight: 8,
            filter: (i: { datasetIndex?: number; text?: string }) =>
              i.datasetIndex === 1 ? plot.points.some((q) => q.flagged) : i.text !== '',
          },
        },
        background: { color: p.background },
      },
    };
    this.chart = drawScatter(this.canvas, this.chart, datasets, options);
    markAxes(this.canvas, this.chart, x, y);
    this.canvas.dataset.kind = plot.kind;
    this.canvas.dataset.pins = pinned.map((r) => r.id).join('\n');
    this.canvas.dataset.ticks = tickValues(this.chart);
    this.section.dataset.drawn = String(++this.drawn);
  }
}

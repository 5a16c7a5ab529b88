/**
 * The spectrum panel under the curves: for a block whose values come from
 * spectrum files, the spectrum of one reference (picked in the panel's
 * list), the integrated region shaded between the curve and the baseline,
 * the baseline drawn across it, and the noise region marked as a band. The
 * x axis is in the file's unit and runs right to left for ppm; it shows the
 * region and the noise region with room around them, not the whole file. Every number
 * comes from the host (`SpectrumTrace`, decimated there); text from the note
 * or the file is shown with `textContent` only.
 *
 * Test markers: `#spectra[data-drawn]` counts draws; `#spectrum-chart`
 * carries `data-area`, `data-x` (the axis range low, high), `data-y`,
 * `data-reversed`, `data-region`, `data-noise` and `data-key`.
 */
import { Chart, type ChartDataset, type ChartType, type Plugin } from 'chart.js';
import { drawScatter, markAxes, type Scatter } from './scatter';
import { baselineAt, type SpectrumTrace } from '../../src/core/packageFree';
import { paddedRange } from './axisRange';
import { shortNumber } from './numbers';
import type { Palette } from './theme';

/** What the shading plugin reads from `options.plugins.spectrumShade`. */
interface ShadeOptions {
  readonly trace: SpectrumTrace | null;
  readonly region: string;
  readonly noise: string;
  readonly font: string;
  readonly text: string;
}

declare module 'chart.js' {
  // The type parameter must keep Chart.js's own name and arity for the declaration to merge.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface PluginOptionsByType<TType extends ChartType> {
    spectrumShade?: ShadeOptions;
  }
}

/** The region as a polygon between the curve and the baseline, and the noise band; under the datasets. */
const shadePlugin: Plugin = {
  id: 'spectrumShade',
  beforeDatasetsDraw(chart, _args, options) {
    const o = options as unknown as ShadeOptions;
    const t = o.trace;
    if (!t) return;
    const { ctx, chartArea: a } = chart;
    const x = chart.scales.x!;
    const y = chart.scales.y!;
    const px = (v: number): number => x.getPixelForValue(v);
    const py = (v: number): number => y.getPixelForValue(v);
    ctx.save();
    ctx.beginPath();
    ctx.rect(a.left, a.top, a.right - a.left, a.bottom - a.top);
    ctx.clip();
    if (t.noise) {
      const l = Math.min(px(t.noise[0]), px(t.noise[1]));
      const r = Math.max(px(t.noise[0]), px(t.noise[1]));
      ctx.fillStyle = o.noise;
      ctx.globalAlpha = 0.14;
      ctx.fillRect(l, a.top, r - l, a.bottom - a.top);
      ctx.globalAlpha = 1;
      ctx.fillStyle = o.noise;
      ctx.font = o.font;
      ctx.textBaseline = 'top';
      ctx.fillText('noise', l + 3, a.top + 3);
    }
    const [lo, hi] = t.region;
    const inside: number[] = [];
    for (let i = 0; i < t.x.length; i++) if (t.x[i]! >= lo && t.x[i]! <= hi) inside.push(i);
    if (inside.length >= 2) {
      ctx.beginPath();
      ctx.moveTo(px(t.x[inside[0]!]!), py(baselineAt(t, t.x[inside[0]!]!)));
      for (const i of inside) ctx.lineTo(px(t.x[i]!), py(t.y[i]!));
      for (let k = inside.length - 1; k >= 0; k--) {
        const xv = t.x[inside[k]!]!;
        ctx.lineTo(px(xv), py(baselineAt(t, xv)));
      }
      ctx.closePath();
      ctx.fillStyle = o.region;
      ctx.globalAlpha = 0.35;
      ctx.fill();
      ctx.globalAlpha = 1;
    }
    ctx.restore();
  },
};

Chart.register(shadePlugin);

/**
 * The stretch of x drawn: the region and the noise region with room around them (a quarter of their span and
 * one region width each side), within the spectrum's own range, so a narrow line is not lost in a wide file.
 */
export function viewRange(t: Pick<SpectrumTrace, 'x' | 'region' | 'noise'>): { min: number; max: number } {
  const first = t.x[0] ?? t.region[0];
  const last = t.x[t.x.length - 1] ?? t.region[1];
  const lo = Math.min(t.region[0], t.noise?.[0] ?? Infinity);
  const hi = Math.max(t.region[1], t.noise?.[1] ?? -Infinity);
  const room = (hi - lo) * 0.25 + (t.region[1] - t.region[0]);
  const min = Math.max(first, lo - room);
  const max = Math.min(last, hi + room);
  return max > min ? { min, max } : paddedRange(t.x as number[]);
}

/** Owns the spectrum section: the list of references, the chart, the caption. */
export class SpectrumChart {
  private chart: Scatter | null = null;
  private drawn = 0;
  /** The reference shown, by key (kept while the cursor moves between blocks with the same keys). */
  private chosen: string | null = null;
  private traces: readonly SpectrumTrace[] = [];

  constructor(
    private readonly section: HTMLElement,
    private readonly pick: HTMLElement & { value: string },
    private readonly caption: HTMLElement,
    private readonly canvas: HTMLCanvasElement,
    private readonly redraw: () => void,
  ) {
    pick.addEventListener('change', () => {
      this.chosen = pick.value;
      this.redraw();
    });
  }

  /** The trace shown, or null. */
  shown(): SpectrumTrace | null {
    return this.traces.find((t) => t.key === this.chosen) ?? this.traces[0] ?? null;
  }

  canvases(): HTMLCanvasElement[] {
    return [this.canvas];
  }

  /** Shows and draws the chosen trace, or hides the section when the block has none. */
  draw(traces: readonly SpectrumTrace[] | undefined, p: Palette): void {
    this.traces = traces ?? [];
    this.section.hidden = this.traces.length === 0;
    const t = this.shown();
    if (!t) return;
    this.fillPick(t);
    const unit = t.unit ?? '';
    this.caption.textContent = `${t.key} = ${t.integralText} (y × ${unit || 'x'}) from ${t.file}: ${t.points} points in the file, ${t.x.length} drawn`;
    const xr = viewRange(t);
    const ys: number[] = [t.baseline[1], t.baseline[3]];
    for (let i = 0; i < t.x.length; i++) if (t.x[i]! >= xr.min && t.x[i]! <= xr.max) ys.push(t.y[i]!);
    const yr = paddedRange(ys);
    const datasets: ChartDataset<'scatter'>[] = [
      {
        label: 'spectrum',
        data: t.x.map((x, i) => ({ x, y: t.y[i]! })),
        borderColor: p.curve,
        backgroundColor: p.curve,
        pointRadius: 0,
        showLine: true,
        borderWidth: 1.25,
      },
      {
        label: t.baselineKind === 'none' ? 'baseline: none (zero)' : 'baseline',
        data: [
          { x: t.region[0], y: baselineAt(t, t.region[0]) },
          { x: t.region[1], y: baselineAt(t, t.region[1]) },
        ],
        borderColor: p.measured,
        backgroundColor: p.measured,
        pointRadius: 0,
        showLine: true,
        borderWidth: 1.5,
        borderDash: [5, 3],
      },
    ];
    const font = `${p.fontSize}px ${p.fontFamily}`;
    const options = {
      animation: false as const,
      responsive: true,
      maintainAspectRatio: false,
      parsing: false as const,
      scales: {
        x: {
          type: 'linear' as const,
          min: xr.min,
          max: xr.max,
          reverse: t.reversed,
          title: { display: true, text: unit ? `x / ${unit}` : 'x', color: p.foreground },
          grid: { color: p.grid, lineWidth: 0.5 },
          ticks: { color: p.muted, callback: (v: number | string) => shortNumber(Number(v)), maxTicksLimit: 9 },
        },
        y: {
          type: 'linear' as const,
          min: yr.min,
          max: yr.max,
          title: { display: true, text: 'y', color: p.foreground },
          grid: { color: p.grid, lineWidth: 0.5 },
          ticks: { color: p.muted, callback: (v: number | string) => shortNumber(Number(v)), maxTicksLimit: 7 },
        },
      },
      plugins: {
        legend: { display: true, labels: { color: p.foreground, boxWidth: 12 } },
        spectrumShade: { trace: t, region: p.measured, noise: p.muted, font, text: p.foreground },
        background: { color: p.background },
      },
    };
    this.chart = drawScatter(this.canvas, this.chart, datasets, options);
    markAxes(this.canvas, this.chart, xr, yr);
    const d = this.canvas.dataset;
    d.reversed = String(t.reversed);
    d.region = t.region.join(',');
    d.noise = t.noise ? t.noise.join(',') : '';
    d.key = t.key;
    this.canvas.setAttribute('aria-label', `Spectrum of ${t.key} with the integrated region shaded`);
    this.section.dataset.drawn = String(++this.drawn);
  }

  /** The list of references, rebuilt only when it changes. */
  private fillPick(shown: SpectrumTrace): void {
    const keys = this.traces.map((t) => t.key);
    if (this.pick.dataset.keys !== keys.join('\n')) {
      this.pick.dataset.keys = keys.join('\n');
      this.pick.replaceChildren(
        ...this.traces.map((t) => {
          const o = document.createElement('vscode-option');
          o.setAttribute('value', t.key);
          o.textContent = `${t.key} (${t.file})`;
          return o;
        }),
      );
    }
    if (this.pick.value !== shown.key) this.pick.value = shown.key;
  }
}

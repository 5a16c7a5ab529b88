/**
 * The two linked charts: entropy S/(Nk) against E above, β against E below
 * with the temperature T = 1/β as a second reading on its right axis. Both
 * share the x range and fixed axis widths so their plot areas line up.
 * chart.js is tree-shaken: only the pieces registered here are bundled.
 */
import {
  Chart,
  Legend,
  LinearScale,
  LineElement,
  PointElement,
  ScatterController,
  Tooltip,
  type ChartDataset,
  type ScaleOptionsByType,
} from 'chart.js';
import type { ChartModel, Series, ViewModel } from './model';
import { shortNumber, shortTemperature } from './numbers';
import { temperatureTicks } from './ticks';
import { tickValues } from './measurementChart';
import { backgroundPlugin, deficitPlugin, errorBarsPlugin, inversionPlugin } from './plugins';
import type { Palette } from './theme';

Chart.register(
  ScatterController,
  LineElement,
  PointElement,
  LinearScale,
  Legend,
  Tooltip,
  backgroundPlugin,
  inversionPlugin,
  errorBarsPlugin,
  deficitPlugin,
);

/** Width in CSS pixels given to every y axis, so the two plot areas share their left and right edges. */
const AXIS_WIDTH = 112;

type Scatter = Chart<'scatter'>;

function dataset(s: Series, p: Palette): ChartDataset<'scatter'> {
  const curve = s.role === 'curve' || s.role === 'finiteN' || s.role === 'pinCurve';
  const marker = s.role === 'measured' || s.role === 'pin' || s.role === 'lattice';
  return {
    label: s.label ?? '',
    data: s.points.map((q) => ({ x: q.x, y: q.y })),
    showLine: curve,
    stepped: s.role === 'finiteN' ? 'middle' : false,
    borderColor: s.color,
    backgroundColor: s.role === 'lattice' ? p.background : s.color,
    borderWidth: curve ? (s.role === 'pinCurve' ? 1.5 : p.highContrast ? 3 : 2.5) : 2,
    borderDash: s.role === 'pinCurve' ? [6, 4] : s.role === 'finiteN' ? [] : [],
    pointRadius: marker ? (s.role === 'measured' ? 5 : 6) : 0,
    pointHoverRadius: marker ? 7 : 3,
    pointHitRadius: curve ? 4 : 8,
    pointStyle: curve ? 'line' : s.pointStyle,
    order: marker ? 0 : 1,
  };
}

function fixedWidth(scale: { width: number }): void {
  scale.width = AXIS_WIDTH;
}

function axis(
  title: string,
  min: number,
  max: number,
  p: Palette,
  position: 'left' | 'bottom',
): ScaleOptionsByType<'linear'> {
  return {
    type: 'linear',
    position,
    min,
    max,
    title: { display: true, text: title, color: p.foreground },
    grid: { color: p.grid, lineWidth: 0.5 },
    border: { color: p.muted },
    ticks: {
      color: p.muted,
      callback: (v: number | string) => shortNumber(Number(v)),
      maxTicksLimit: 9,
      // Ticks only at round steps: an axis end that is not on the step would crowd its neighbour.
      includeBounds: false,
    },
    ...(position === 'left' ? { afterFit: fixedWidth } : {}),
  } as unknown as ScaleOptionsByType<'linear'>;
}

/** Options of one chart; `right` is the right-hand axis (the T reading, or an empty spacer). */
function options(m: ChartModel, p: Palette, legend: boolean, right: ScaleOptionsByType<'linear'>, zeroLine: boolean) {
  const font = `${p.fontSize}px ${p.fontFamily}`;
  return {
    animation: false as const,
    responsive: true,
    maintainAspectRatio: false,
    parsing: false as const,
    normalized: true,
    scales: {
      x: axis(m.x.title, m.x.min, m.x.max, p, 'bottom'),
      y: axis(m.y.title, m.y.min, m.y.max, p, 'left'),
      y2: right,
    },
    plugins: {
      legend: {
        display: legend,
        position: 'top' as const,
        labels: {
          color: p.foreground,
          usePointStyle: true,
          boxWidth: 10,
          boxHeight: 10,
          filter: (item: { text: string }) => item.text !== '',
        },
      },
      tooltip: {
        callbacks: {
          label: (c: { dataset: { label?: string }; parsed: { x: number | null; y: number | null } }) =>
            `${c.dataset.label || 'curve'}: (${shortNumber(c.parsed.x ?? NaN, 4)}, ${shortNumber(c.parsed.y ?? NaN, 4)})`,
        },
      },
      inversion: {
        saturationX: m.saturationX,
        shade: p.inversion,
        line: p.saturation,
        text: p.foreground,
        alpha: p.highContrast ? 0.28 : 0.16,
        zeroLine,
        font,
      },
      errorBars: { bars: m.errorBars, width: p.highContrast ? 2 : 1.5 },
      deficit: { gap: m.deficit, font },
      background: { color: p.background },
    },
  };
}

/**
 * The right axis of the β chart: the same scale as β, labelled at round temperatures T = 1/β (and ±∞ at
 * β = 0). The β bars span β ± 2u(β), so read on this axis they span T's interval, the image of β's
 * (skewed, exact coverage).
 */
function temperatureAxis(m: ChartModel, p: Palette): ScaleOptionsByType<'linear'> {
  const a = axis('T = 1/β (bars: 95 %)', m.y.min, m.y.max, p, 'left');
  const step = (m.y.max - m.y.min) * 1e-9;
  const betas = temperatureTicks(m.y.min, m.y.max);
  return {
    ...a,
    position: 'right',
    afterFit: fixedWidth,
    grid: { display: false },
    // Ticks where T is a round number, not where β is: 1/β of a round β is rarely round.
    afterBuildTicks: (scale: { ticks: { value: number }[] }) => {
      scale.ticks = betas.map((value) => ({ value }));
    },
    ticks: {
      ...a.ticks,
      includeBounds: false,
      callback: (v: number | string) => (Math.abs(Number(v)) <= step ? '±∞' : shortTemperature(1 / Number(v))),
    },
  } as unknown as ScaleOptionsByType<'linear'>;
}

/** An empty right axis of the same width, so the entropy chart's plot area matches the β chart's. */
function spacerAxis(m: ChartModel): ScaleOptionsByType<'linear'> {
  return {
    type: 'linear',
    position: 'right',
    min: m.y.min,
    max: m.y.max,
    afterFit: fixedWidth,
    grid: { display: false },
    border: { display: false },
    ticks: { display: false },
    title: { display: false },
  } as unknown as ScaleOptionsByType<'linear'>;
}

/**
 * Writes the plot area and axis ranges on the canvas, so tests and exports
 * can map values to pixels, and the legend's labels (one per line), so tests
 * can read what the legend lists.
 */
function describe(chart: Scatter): void {
  const c = chart.canvas;
  const a = chart.chartArea;
  const x = chart.scales.x!;
  const y = chart.scales.y!;
  c.dataset.area = [a.left, a.top, a.right, a.bottom].join(',');
  c.dataset.x = [x.min, x.max].join(',');
  c.dataset.y = [y.min, y.max].join(',');
  c.dataset.ticks = tickValues(chart as unknown as Chart);
  const title = (chart.options.scales?.y as { title?: { text?: unknown } } | undefined)?.title?.text;
  c.dataset.yTitle = typeof title === 'string' ? title : '';
  c.dataset.legend = chart.data.datasets
    .map((d) => d.label ?? '')
    .filter((l) => l !== '')
    .join('\n');
}

/** Owns the two chart.js instances. */
export class CurveCharts {
  private entropy: Scatter | null = null;
  private beta: Scatter | null = null;

  constructor(
    private readonly entropyCanvas: HTMLCanvasElement,
    private readonly betaCanvas: HTMLCanvasElement,
  ) {}

  /** Draws (or redraws) both charts synchronously. */
  draw(model: ViewModel, p: Palette): void {
    Chart.defaults.color = p.foreground;
    Chart.defaults.font.family = p.fontFamily;
    Chart.defaults.font.size = p.fontSize;
    this.entropy = this.render(
      this.entropy,
      this.entropyCanvas,
      model.entropy,
      options(model.entropy, p, true, spacerAxis(model.entropy), false),
      p,
    );
    this.beta = this.render(
      this.beta,
      this.betaCanvas,
      model.beta,
      options(model.beta, p, false, temperatureAxis(model.beta, p), true),
      p,
    );
    describe(this.entropy);
    describe(this.beta);
  }

  private render(
    chart: Scatter | null,
    canvas: HTMLCanvasElement,
    m: ChartModel,
    o: ReturnType<typeof options>,
    p: Palette,
  ): Scatter {
    const datasets = m.series.map((s) => dataset(s, p));
    if (!chart)
      return new Chart(canvas, { type: 'scatter', data: { datasets }, options: o as never }) as unknown as Scatter;
    chart.data.datasets = datasets;
    chart.options = o as never;
    chart.update('none');
    return chart;
  }

  /** The two canvases, for export. */
  canvases(): HTMLCanvasElement[] {
    return [this.entropyCanvas, this.betaCanvas];
  }
}

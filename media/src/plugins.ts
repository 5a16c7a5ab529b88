/**
 * Small chart.js plugins of the curve view (no plugin packages): the shaded
 * population-inversion region right of β = 0 with its label, the saturation
 * line, error bars around the measured points, and the entropy-deficit gap.
 * Each reads its data from the chart's `options.plugins.<id>`.
 */
import type { Chart, ChartType, Plugin } from 'chart.js';
import type { DeficitGap, ErrorBar } from './model';

/** Options of the inversion plugin. */
export interface InversionOptions {
  /** Energy of β = 0 on the x axis. */
  readonly saturationX: number;
  readonly shade: string;
  readonly line: string;
  readonly text: string;
  /** Opacity of the shading. */
  readonly alpha: number;
  /** Also draw the horizontal β = 0 line (the β chart). */
  readonly zeroLine: boolean;
  /** CSS font of the labels. */
  readonly font: string;
}

/** Options of the error-bar plugin. */
export interface ErrorBarOptions {
  readonly bars: readonly ErrorBar[];
  readonly width: number;
}

/** Options of the deficit plugin. */
export interface DeficitOptions {
  readonly gap: DeficitGap | null;
  readonly font: string;
}

declare module 'chart.js' {
  // The type parameter must keep Chart.js's own name and arity for the declaration to merge.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface PluginOptionsByType<TType extends ChartType> {
    inversion?: InversionOptions;
    errorBars?: ErrorBarOptions;
    deficit?: DeficitOptions;
    background?: BackgroundOptions;
  }
}

function scales(chart: Chart): { x: Chart['scales'][string]; y: Chart['scales'][string] } {
  return { x: chart.scales.x!, y: chart.scales.y! };
}

/**
 * Writes `text` at (x, y) with the context's current alignment and baseline, and returns the box its ink covers
 * ([left, top, right, bottom], in the chart's CSS pixels) from the text's measured bounding box.
 */
function drawText(ctx: CanvasRenderingContext2D, text: string, x: number, y: number): readonly number[] {
  ctx.fillText(text, x, y);
  const m = ctx.measureText(text);
  return [
    x - m.actualBoundingBoxLeft,
    y - m.actualBoundingBoxAscent,
    x + m.actualBoundingBoxRight,
    y + m.actualBoundingBoxDescent,
  ];
}

/** Shades x > saturationX, marks β = 0 and labels both; drawn under the datasets. */
export const inversionPlugin: Plugin = {
  id: 'inversion',
  beforeDatasetsDraw(chart, _args, options) {
    const o = options as unknown as InversionOptions;
    if (typeof o.saturationX !== 'number') return;
    const { ctx, chartArea: a } = chart;
    const { x, y } = scales(chart);
    const px = Math.max(a.left, Math.min(a.right, x.getPixelForValue(o.saturationX)));
    const boxes: Record<string, readonly number[]> = {};
    ctx.save();
    ctx.globalAlpha = o.alpha;
    ctx.fillStyle = o.shade;
    ctx.fillRect(px, a.top, a.right - px, a.bottom - a.top);
    ctx.globalAlpha = 1;
    ctx.fillStyle = o.text;
    ctx.font = o.font;
    ctx.textBaseline = 'top';
    ctx.textAlign = 'right';
    // On the entropy chart the saturation label also sits at the top (left of the line): when the two
    // would overlap, the inversion label moves down a line.
    const inversionText = 'population inversion (β < 0)';
    const lineHeight = parseFloat(o.font) * 1.3 || 16;
    const inversionLeft = a.right - 6 - ctx.measureText(inversionText).width;
    const clash = !o.zeroLine && inversionLeft < px;
    if (a.right - px > 40)
      boxes.inversion = drawText(ctx, inversionText, a.right - 6, a.top + 4 + (clash ? lineHeight : 0));
    ctx.strokeStyle = o.line;
    ctx.lineWidth = 1.5;
    ctx.setLineDash([5, 4]);
    ctx.beginPath();
    ctx.moveTo(px, a.top);
    ctx.lineTo(px, a.bottom);
    ctx.stroke();
    ctx.setLineDash([]);
    // Saturation is the point where β = 0: on the β chart the label sits where the curve crosses β = 0,
    // on the entropy chart at the top, beside the maximum of S. Its place is written on the canvas for tests.
    let label: [number, number] = [px - 4, a.top + 4];
    ctx.textAlign = 'right';
    ctx.textBaseline = 'top';
    if (o.zeroLine) {
      const py = y.getPixelForValue(0);
      if (py >= a.top && py <= a.bottom) {
        ctx.beginPath();
        ctx.moveTo(a.left, py);
        ctx.lineTo(a.right, py);
        ctx.stroke();
        // "β = 0" above the line at the left, "saturation" below it, left of where the curve crosses.
        ctx.textAlign = 'left';
        ctx.textBaseline = 'bottom';
        boxes.zero = drawText(ctx, 'β = 0', a.left + 4, py - 3);
        ctx.textAlign = 'right';
        ctx.textBaseline = 'top';
        label = [px - 4, py + 3];
      }
    }
    boxes.saturation = drawText(ctx, 'saturation', label[0], label[1]);
    chart.canvas.dataset.saturationLabel = label.join(',');
    // Where each label's ink lies (left, top, right, bottom in the chart's CSS pixels), for tests of their layout.
    chart.canvas.dataset.labelBoxes = JSON.stringify(boxes);
    ctx.restore();
  },
};

/** Draws ±u error bars with end caps around points; drawn over the datasets. */
export const errorBarsPlugin: Plugin = {
  id: 'errorBars',
  afterDatasetsDraw(chart, _args, options) {
    const o = options as unknown as ErrorBarOptions;
    if (!Array.isArray(o.bars as unknown)) return;
    const { ctx, chartArea: a } = chart;
    const { x, y } = scales(chart);
    ctx.save();
    ctx.beginPath();
    ctx.rect(a.left, a.top, a.right - a.left, a.bottom - a.top);
    ctx.clip();
    ctx.lineWidth = o.width;
    const cap = 4;
    for (const bar of o.bars) {
      ctx.strokeStyle = bar.color;
      const px = x.getPixelForValue(bar.x);
      const py = y.getPixelForValue(bar.y);
      ctx.beginPath();
      if (bar.dx !== null && bar.dx > 0) {
        const l = x.getPixelForValue(bar.x - bar.dx);
        const r = x.getPixelForValue(bar.x + bar.dx);
        ctx.moveTo(l, py);
        ctx.lineTo(r, py);
        ctx.moveTo(l, py - cap);
        ctx.lineTo(l, py + cap);
        ctx.moveTo(r, py - cap);
        ctx.lineTo(r, py + cap);
      }
      if (bar.dy !== null && bar.dy > 0) {
        const t = y.getPixelForValue(bar.y + bar.dy);
        const b = y.getPixelForValue(bar.y - bar.dy);
        ctx.moveTo(px, t);
        ctx.lineTo(px, b);
        ctx.moveTo(px - cap, t);
        ctx.lineTo(px + cap, t);
        ctx.moveTo(px - cap, b);
        ctx.lineTo(px + cap, b);
      }
      ctx.stroke();
    }
    ctx.restore();
  },
};

/** Draws the dashed gap from the measured point up to the thermal curve, with the deficit's value. */
export const deficitPlugin: Plugin = {
  id: 'deficit',
  afterDatasetsDraw(chart, _args, options) {
    const o = options as unknown as DeficitOptions;
    const gap = o.gap;
    if (!gap) return;
    const { ctx, chartArea: a } = chart;
    const { x, y } = scales(chart);
    const px = x.getPixelForValue(gap.x);
    const from = y.getPixelForValue(gap.from);
    const to = y.getPixelForValue(gap.to);
    ctx.save();
    ctx.strokeStyle = gap.color;
    ctx.fillStyle = gap.color;
    ctx.lineWidth = 1.5;
    ctx.setLineDash([3, 3]);
    ctx.beginPath();
    ctx.moveTo(px, from);
    ctx.lineTo(px, to);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.font = o.font;
    const leftSide = px > (a.left + a.right) / 2;
    ctx.textAlign = leftSide ? 'right' : 'left';
    ctx.textBaseline = 'middle';
    ctx.fillText(gap.text, px + (leftSide ? -8 : 8), (from + to) / 2);
    ctx.restore();
  },
};

/** Options of the background plugin. */
export interface BackgroundOptions {
  readonly color: string;
}

/** Paints the whole canvas in the theme's editor background first, so the chart (and its PNG) is opaque. */
export const backgroundPlugin: Plugin = {
  id: 'background',
  beforeDraw(chart, _args, options) {
    const o = options as unknown as BackgroundOptions;
    if (typeof o.color !== 'string') return;
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.globalCompositeOperation = 'destination-over';
    ctx.fillStyle = o.color;
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};

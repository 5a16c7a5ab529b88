/**
 * What every scatter chart of the view does the same way: made once, then
 * updated in place without animation, and its plot area and axis ranges
 * written on the canvas (`data-area`, `data-x`, `data-y`) so that the page
 * tests read pixels back by value.
 */
import { Chart, type ChartDataset } from 'chart.js';

export type Scatter = Chart<'scatter'>;

/** Draws `datasets` with `options` on the canvas: a new chart the first time, the same one updated afterwards. */
export function drawScatter(
  canvas: HTMLCanvasElement,
  chart: Scatter | null | undefined,
  datasets: ChartDataset<'scatter'>[],
  options: unknown,
): Scatter {
  if (!chart)
    return new Chart(canvas, { type: 'scatter', data: { datasets }, options: options as never }) as unknown as Scatter;
  chart.data.datasets = datasets;
  chart.options = options as never;
  chart.update('none');
  return chart;
}

/** Writes the plot area and the axis ranges on the canvas, for the page tests. */
export function markAxes(
  canvas: HTMLCanvasElement,
  chart: Scatter,
  x: { readonly min: number; readonly max: number },
  y: { readonly min: number; readonly max: number },
): void {
  const a = chart.chartArea;
  canvas.dataset.area = [a.left, a.top, a.right, a.bottom].join(',');
  canvas.dataset.x = [x.min, x.max].join(',');
  canvas.dataset.y = [y.min, y.max].join(',');
}

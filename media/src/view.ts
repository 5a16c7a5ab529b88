/**
 * The curve view's page. It draws what the host sends (the webview only
 * draws; every number comes from the core through typed, validated
 * messages), keeps its last render in the webview state so a hidden or
 * reloaded panel comes back at once, and follows the theme.
 *
 * DOM markers for tests: `body[data-drawn]` counts completed chart draws,
 * `body[data-state]` is `chart`, `problem` or `empty`, and each canvas
 * (`#entropy-chart`, `#beta-chart`) carries its plot area and axis ranges.
 *
 * The page imports the core through src/core/packageFree.ts rather than
 * src/core/index.ts: that part depends on no package, so the bundle stays
 * free of the YAML reader and the analysis it never runs.
 */
import type { EnergyAxisUnit, RenderMessage } from '../../src/core/packageFree';
import { CurveCharts } from './charts';
import { wireControls } from './controls';
import { composePng } from './exportImage';
import { connectHost } from './host';
import { viewModel } from './model';
import { MeasurementChart } from './measurementChart';
import { Panel } from './panel';
import { onThemeChange, readPalette } from './theme';

const host = connectHost();
const saved = host.savedState();
let unit: EnergyAxisUnit = saved?.unit ?? 'block';
let last: RenderMessage | null = saved?.last ?? null;
/** Highest render sequence number seen since this page loaded (a restored host starts again from 0). */
let seen = -1;
let drawn = 0;

const panel = new Panel();
const measurement = new MeasurementChart(
  document.getElementById('measurement') as HTMLElement,
  document.getElementById('measurement-title') as HTMLElement,
  document.getElementById('measurement-chart') as HTMLCanvasElement,
);
const charts = new CurveCharts(
  document.getElementById('entropy-chart') as HTMLCanvasElement,
  document.getElementById('beta-chart') as HTMLCanvasElement,
);

function draw(): void {
  const current = last?.current ?? null;
  panel.showPins(last?.pinned ?? [], (key) => host.post({ type: 'unpin', key }));
  controls.setDrawable(current?.kind === 'curve');
  const palette = readPalette();
  // Drawn after its section is shown, so chart.js measures a laid-out canvas.
  const plot = current?.plot ?? null;
  if (current === null) {
    measurement.draw(null, palette);
    return panel.showEmpty();
  }
  if (current.kind === 'problem') {
    panel.showProblem(current);
    return measurement.draw(plot, palette);
  }
  panel.showCurve(current);
  measurement.draw(plot, palette);
  charts.draw(viewModel(current, last?.pinned ?? [], unit, palette), palette);
  for (const c of charts.canvases())
    c.setAttribute(
      'aria-label',
      `${c.id === 'beta-chart' ? 'Inverse temperature' : 'Entropy'} against energy for ${current.id}`,
    );
  document.body.dataset.drawn = String(++drawn);
}

function png(): string | null {
  const current = last?.current;
  return current?.kind === 'curve' ? composePng(charts.canvases(), current.id, readPalette()) : null;
}

const controls = wireControls(unit, {
  unit(u) {
    unit = u;
    host.saveState({ unit, last });
    draw();
  },
  pin: () => host.post({ type: 'pin' }),
  exportCsv: () => host.post({ type: 'exportCsv', unit }),
  exportPng() {
    const dataUrl = png();
    if (dataUrl) host.post({ type: 'exportPng', dataUrl });
  },
  copyImageLink() {
    const dataUrl = png();
    if (dataUrl) host.post({ type: 'copyImageLink', dataUrl });
  },
});

host.listen((message) => {
  if (message.seq < seen) return; // an older render overtaken by a newer one
  seen = message.seq;
  last = message;
  host.saveState({ unit, last });
  draw();
});

onThemeChange(() => {
  if (last?.current?.kind === 'curve') draw();
});

draw();
host.post({ type: 'ready' });

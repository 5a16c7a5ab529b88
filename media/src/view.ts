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
import { RUN_QUANTITIES, type EnergyAxisUnit, type RenderMessage, type RunQuantity } from '../../src/core/packageFree';
import { CurveCharts } from './charts';
import { wireControls } from './controls';
import { composePng } from './exportImage';
import { connectHost } from './host';
import { viewModel } from './model';
import { MeasurementChart } from './measurementChart';
import { Panel } from './panel';
import { RunChart } from './runChart';
import { SpectrumChart } from './spectrumChart';
import { onThemeChange, readPalette } from './theme';

const host = connectHost();
const saved = host.savedState();
let unit: EnergyAxisUnit = saved?.unit ?? 'block';
let last: RenderMessage | null = saved?.last ?? null;
let quantity: RunQuantity = saved?.quantity ?? 'polarization';
/** The quantity drawn: the chosen one, or the first the runs have when they lack it. */
let shownQuantity: RunQuantity = quantity;
/** Highest render sequence number seen since this page loaded (a restored host starts again from 0). */
let seen = -1;
let drawn = 0;

const panel = new Panel();
const measurement = new MeasurementChart(
  document.getElementById('measurement') as HTMLElement,
  document.getElementById('measurement-title') as HTMLElement,
  document.getElementById('measurement-chart') as HTMLCanvasElement,
);
const runChart = new RunChart(
  document.getElementById('runs') as HTMLElement,
  document.getElementById('runs-chart') as HTMLCanvasElement,
  (run) => host.post({ type: 'openRun', uri: run.uri, line: run.line }),
);
const spectra = new SpectrumChart(
  document.getElementById('spectra') as HTMLElement,
  document.getElementById('spectra-pick') as HTMLElement & { value: string },
  document.getElementById('spectra-caption') as HTMLElement,
  document.getElementById('spectrum-chart') as HTMLCanvasElement,
  () => spectra.draw(last?.current?.spectra, readPalette()),
);
document.getElementById('spectra-png')?.addEventListener('click', () => {
  const t = spectra.shown();
  if (t)
    host.post({
      type: 'exportSpectrumPng',
      key: t.key,
      dataUrl: composePng(spectra.canvases(), `${t.key}: ${t.file}`, readPalette()),
    });
});
document.getElementById('spectra-csv')?.addEventListener('click', () => {
  const t = spectra.shown();
  if (t) host.post({ type: 'exportSpectrumCsv', key: t.key });
});
const runsEmpty = document.getElementById('runs-empty') as HTMLElement;
const runsTitle = document.getElementById('runs-title') as HTMLElement;
const runsSelect = document.getElementById('runs-quantity') as (HTMLElement & { value: string }) | null;

/** The run comparison: the chosen result if any run has it, else the first result some run has. */
function drawRuns(): void {
  const runs = last?.runs ?? null;
  const offered = RunChart.choices(runs);
  const shown = offered.includes(quantity) ? quantity : (offered[0] ?? quantity);
  shownQuantity = shown;
  if (runsSelect && runsSelect.value !== shown) runsSelect.value = shown;
  runsTitle.textContent = runs ? `Runs compared: ${runs.title}` : 'Runs compared';
  const count = runs?.points.filter((p) => p.values[shown] !== null).length ?? 0;
  runsEmpty.hidden = count > 0;
  runsEmpty.textContent = count > 0 ? '' : 'None of these runs has a value for this result.';
  runChart.draw(runs, shown, readPalette());
}

function saveState(): void {
  host.saveState({ unit, last, quantity });
}

runsSelect?.addEventListener('change', () => {
  const v = runsSelect.value;
  if (!(RUN_QUANTITIES as readonly string[]).includes(v)) return;
  quantity = v as RunQuantity;
  saveState();
  drawRuns();
});
document.getElementById('runs-png')?.addEventListener('click', () => {
  const runs = last?.runs;
  if (runs) host.post({ type: 'exportRunsPng', dataUrl: composePng(runChart.canvases(), runs.title, readPalette()) });
});
document.getElementById('runs-csv')?.addEventListener('click', () => {
  if (last?.runs) host.post({ type: 'exportRunsCsv', quantity: shownQuantity });
});

const charts = new CurveCharts(
  document.getElementById('entropy-chart') as HTMLCanvasElement,
  document.getElementById('beta-chart') as HTMLCanvasElement,
);

function draw(): void {
  drawRuns();
  const current = last?.current ?? null;
  const plotPins = last?.pinnedPlots ?? [];
  panel.showPins(last?.pinned ?? [], plotPins, (key) => host.post({ type: 'unpin', key }));
  controls.setDrawable(current?.kind === 'curve', current?.kind === 'curve' || !!current?.plot);
  const palette = readPalette();
  // Drawn after its section is shown, so chart.js measures a laid-out canvas.
  const plot = current?.plot ?? null;
  // Pinned plots of the same kind (series with series, Boltzmann plots with Boltzmann plots), not the block shown.
  const overlay = plotPins.filter(
    (p) => plot && p.plot.kind === plot.kind && !(current && p.uri === current.uri && p.line === current.line),
  );
  if (current === null) {
    measurement.draw(null, palette);
    spectra.draw(undefined, palette);
    return panel.showEmpty();
  }
  if (current.kind === 'problem') {
    panel.showProblem(current);
    spectra.draw(current.spectra, palette);
    return measurement.draw(plot, palette, overlay);
  }
  panel.showCurve(current);
  measurement.draw(plot, palette, overlay);
  spectra.draw(current.spectra, palette);
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
    saveState();
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
  saveState();
  draw();
});

onThemeChange(() => {
  if (last?.current?.kind === 'curve' || last?.runs || last?.current?.spectra?.length) draw();
});

draw();
host.post({ type: 'ready' });

import { strict as assert } from 'node:assert';
import { mkdirSync } from 'node:fs';
import {
  Analyzer,
  curveData,
  readSpectrum,
  spectrumTraces,
  type Externals,
  type Spectrum,
  type ViewPayload,
} from '../../src/core';
import { openView, usePageServer, type ViewPage } from './harness';
import { render } from './payloads';
import { geometry, near, pixelsAround, type ChartGeometry } from './pixels';
import { blend, LIGHT } from './themes';

declare const document: {
  body: { dataset: Record<string, string | undefined> };
  getElementById(
    id: string,
  ): { hidden: boolean; textContent: string | null; dataset: Record<string, string | undefined> } | null;
};

/**
 * An invented ¹³C spectrum (invented data, for drawing only): a Gaussian line at 171 ppm, σ = 0.8 ppm,
 * height 100, on x = 150 … 250 ppm every 0.01 ppm (10 001 points), with a small ripple as noise.
 */
function spectrumCsv(): string {
  const rows = ['ppm,intensity'];
  for (let i = 0; i <= 10000; i++) {
    const x = 150 + i * 0.01;
    rows.push(`${x.toFixed(2)},${(100 * Math.exp(-((x - 171) ** 2) / (2 * 0.8 ** 2)) + 0.5 * Math.sin(i)).toFixed(5)}`);
  }
  return rows.join('\n');
}

const BODY = [
  'id: run 12',
  'system: 13C',
  'field: 9.4 T',
  'lattice: 298 K',
  'signal:',
  '  hyperpolarized: { spectrum: spectra/hp.csv, region: [168 ppm, 174 ppm], noise: [200 ppm, 230 ppm] }',
  '  thermal: { spectrum: spectra/hp.csv, region: [168 ppm, 174 ppm], baseline: none }',
  '  scans: { hyperpolarized: 1, thermal: 100 }',
].join('\n');

/** The payload as the server builds it (curve.ts): the block's curve data and its traces. */
function spectralPayload(spectrum: Spectrum): ViewPayload {
  const externals: Externals = {
    note: 'file:///lab/spectra.md',
    stamp: () => '1:1',
    spectra: { lookup: () => ({ state: 'ready', key: 'file:/lab/spectra/hp.csv', stamp: '1:1', spectrum }) },
  };
  const text = `# spectra\n\n\`\`\`levels\n${BODY}\n\`\`\`\n`;
  const [block] = new Analyzer().analyzeText(text, externals).blocks;
  const p = curveData(block!, { uri: 'file:///lab/spectra.md', version: 1 });
  return { ...p, spectra: spectrumTraces(block!.meta.spectra, () => spectrum) };
}

/** Pixel of a data point on an axis drawn right to left. */
function toPixelReversed(g: ChartGeometry, x: number, y: number): [number, number] {
  return [
    g.right - ((x - g.x[0]) / (g.x[1] - g.x[0])) * (g.right - g.left),
    g.bottom - ((y - g.y[0]) / (g.y[1] - g.y[0])) * (g.bottom - g.top),
  ];
}

describe('curve view spectrum panel (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;
  const read = readSpectrum(spectrumCsv(), 'hp.csv');
  if (!read.ok) throw new Error(read.message);
  const payload = spectralPayload(read.spectrum);

  const drawnCount = (): Promise<number> =>
    view.page.evaluate(() => Number(document.getElementById('spectra')!.dataset.drawn ?? 0));

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
  });

  it('gets a decimated spectrum, never the file’s full resolution', () => {
    const t = payload.spectra![0]!;
    assert.equal(t.points, 10001);
    assert.ok(t.x.length <= 4000 && t.x.length >= 3000, String(t.x.length));
    // The peak's top survives the decimation (min and max per column).
    let top = -Infinity;
    for (const y of t.y) top = Math.max(top, y);
    assert.ok(top > 99.5, String(top));
  });

  it('draws the spectrum, ppm right to left, with the region shaded between curve and baseline', async () => {
    const before = await drawnCount();
    await view.post(render(payload));
    await view.page.waitForFunction((n) => Number(document.getElementById('spectra')!.dataset.drawn ?? 0) > n, before);
    assert.equal(await view.page.evaluate(() => document.getElementById('spectra')!.hidden), false);
    const d = await view.page.evaluate(() => ({ ...document.getElementById('spectrum-chart')!.dataset }));
    assert.equal(d.reversed, 'true');
    assert.equal(d.region, '168,174');
    assert.equal(d.noise, '200,230');
    assert.equal(d.key, 'signal.hyperpolarized');
    const g = await geometry(view.page, 'spectrum-chart');
    const bg = LIGHT.vars['--vscode-editor-background']!;
    const shade = blend(LIGHT.vars['--vscode-charts-red']!, bg, 0.35);
    // Inside the region, halfway up the line: shaded. At 185 ppm, the same height: not shaded (no line there).
    const inside = toPixelReversed(g, 171.3, 45);
    const outside = toPixelReversed(g, 185, 45);
    // Higher x is further left.
    assert.ok(toPixelReversed(g, 200, 0)[0] < toPixelReversed(g, 160, 0)[0]);
    const [pin, pout] = await pixelsAround(view.page, 'spectrum-chart', [inside, outside], 2);
    assert.ok(
      pin!.some((q) => near(q, shade, 12)),
      `shaded inside: ${JSON.stringify(pin!.slice(0, 3))} vs ${shade.join(',')}`,
    );
    assert.ok(!pout!.some((q) => near(q, shade, 12)), 'not shaded outside the region');
    const caption = await view.page.evaluate(() => document.getElementById('spectra-caption')!.textContent ?? '');
    assert.match(caption, /signal\.hyperpolarized = .* from spectra\/hp\.csv: 10001 points in the file/);
    mkdirSync('test-output/webview', { recursive: true });
    await view.page.locator('#spectra').screenshot({ path: 'test-output/webview/spectrum-light.png' });
  });

  it('exports the reference shown as PNG and CSV through the host', async () => {
    await view.page.click('#spectra-csv');
    assert.deepEqual((await view.posted()).at(-1), { type: 'exportSpectrumCsv', key: 'signal.hyperpolarized' });
    await view.page.click('#spectra-png');
    const png = (await view.posted()).at(-1)!;
    assert.equal(png.type, 'exportSpectrumPng');
    assert.equal(png.key, 'signal.hyperpolarized');
    assert.match(String(png.dataUrl), /^data:image\/png;base64,/);
  });

  it('hides the panel for a block without references, and refuses a trace with too many points', async () => {
    const plain = { ...payload, spectra: undefined };
    await view.post(render(plain));
    await view.page.waitForFunction(() => document.getElementById('spectra')!.hidden === true);
    const t = payload.spectra![0]!;
    const huge = { ...t, x: new Array(10001).fill(1), y: new Array(10001).fill(1) };
    const before = await view.page.evaluate(() => Number(document.body.dataset.drawn ?? 0));
    await view.post(render({ ...payload, spectra: [huge] }));
    // A valid render after it is drawn; the malformed one never was.
    await view.post(render(payload));
    await view.page.waitForFunction(() => document.getElementById('spectra')!.hidden === false);
    assert.equal(await view.page.evaluate(() => Number(document.body.dataset.drawn ?? 0)), before + 1);
  });
});

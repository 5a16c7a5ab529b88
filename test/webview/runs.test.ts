import { strict as assert } from 'node:assert';
import { mkdirSync } from 'node:fs';
import { DEFAULT_DISPLAY, isViewToHost, RunLog, runChartData, type RunChartPayload } from '../../src/core';
import { openView, usePageServer, type ViewPage } from './harness';
import { curveOf, render, SERIES, XSS_ID } from './payloads';
import { geometry, near, pixelsAround, toPixel } from './pixels';
import { LIGHT, rgb } from './themes';
import { RUN_LOG_NOTE } from '../core/view/runLogNote';

// Page-side names for the functions passed to the page (this module is typed without the DOM library).
declare const window: { __test: { posted: unknown[] } };
declare const document: {
  getElementById(id: string): {
    hidden: boolean;
    value: string;
    textContent: string | null;
    dataset: Record<string, string | undefined>;
    dispatchEvent(e: unknown): void;
  } | null;
  querySelectorAll(selector: string): { length: number };
};
declare const Event: new (type: string) => unknown;

function runsOf(text: string): RunChartPayload {
  const log = new RunLog();
  log.update('file:///lab/runs.md', 'runs.md', text);
  return runChartData('runs.md', log.entries(), DEFAULT_DISPLAY);
}

// The run comparison: one result of each run against date, status colours, error bars, click to open.
describe('curve view run comparison (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;
  const runs = runsOf(RUN_LOG_NOTE);

  const drawnRuns = () => view.page.evaluate(() => Number(document.getElementById('runs')!.dataset.drawn ?? 0));
  async function showRuns(r: RunChartPayload): Promise<void> {
    const before = await drawnRuns();
    await view.post({ ...render(curveOf(SERIES[0]!)), runs: r });
    await view.page.waitForFunction((n) => Number(document.getElementById('runs')!.dataset.drawn ?? 0) > n, before);
  }

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
  });

  it('draws every run at its date and value, in its status colour, with its uncertainty as an error bar', async () => {
    await showRuns(runs);
    assert.equal(await view.page.evaluate(() => document.getElementById('runs')!.hidden), false);
    const canvas = await view.page.evaluate(() => ({ ...document.getElementById('runs-chart')!.dataset }));
    assert.equal(canvas.points, '4');
    assert.equal(canvas.quantity, 'polarization');
    const g = await geometry(view.page, 'runs-chart');
    const at = runs.points.map((p) => toPixel(g, p.x, p.values.polarization!.y));
    assert.ok(
      at.every(([x, y]) => x > g.left && x < g.right && y > g.top && y < g.bottom),
      JSON.stringify(at),
    );
    // Status colours from the theme: normal runs in charts-blue, the inverted one in charts-orange.
    const blue = rgb(LIGHT.vars['--vscode-charts-blue']!);
    const orange = rgb(LIGHT.vars['--vscode-charts-orange']!);
    const around = await pixelsAround(view.page, 'runs-chart', at, 2);
    for (let i = 0; i < 3; i++)
      assert.ok(
        around[i]!.some((q) => near(q, blue)),
        `run ${i + 1} in blue`,
      );
    assert.ok(
      around[3]!.some((q) => near(q, orange)),
      'the inverted run in orange',
    );
    // The end caps of run 1's bar at P ± u = 31.2 ± 1.0 %, 4 px wide: looked for 3.5 px right of the bar,
    // where the dot (radius 5) cannot reach at that height once the cap is more than 5 px off its centre.
    for (const end of [31.2 + 1.0, 31.2 - 1.0]) {
      const [cx, cy] = toPixel(g, runs.points[0]!.x, end);
      assert.ok(Math.abs(cy - at[0]![1]) > 5, 'the bar reaches beyond the dot');
      const [capPixels] = await pixelsAround(view.page, 'runs-chart', [[cx + 3.5, cy]], 1);
      // The 1.5 px line is antialiased: a bluish pixel, far from the white background.
      const white = [255, 255, 255] as const;
      assert.ok(
        capPixels!.some((q) => near(q, blue, 130) && !near(q, white, 40)),
        `an error-bar cap at ${end} %: ${JSON.stringify(capPixels)}`,
      );
    }
    // The dates, not day numbers, label the axis (a page without a date axis would show 20521).
    assert.equal(runs.xAxis, 'date');
  });

  it('switches the result shown, and keeps it across renders', async () => {
    await view.page.evaluate(() => {
      const select = document.getElementById('runs-quantity')!;
      select.value = 'enhancement';
      select.dispatchEvent(new Event('change'));
    });
    await view.page.waitForFunction(() => document.getElementById('runs-chart')!.dataset.quantity === 'enhancement');
    await showRuns(runs);
    assert.equal(
      await view.page.evaluate(() => document.getElementById('runs-chart')!.dataset.quantity),
      'enhancement',
    );
    // A result none of the runs has is offered no axis: the page falls back to one they have.
    const onlyP: RunChartPayload = { ...runs, axes: runs.axes.filter((a) => a.quantity === 'polarization') };
    await showRuns(onlyP);
    assert.equal(
      await view.page.evaluate(() => document.getElementById('runs-chart')!.dataset.quantity),
      'polarization',
    );
  });

  it('asks the host to open the run a click lands on, and exports CSV for the result shown', async () => {
    await view.page.evaluate(() => {
      const select = document.getElementById('runs-quantity')!;
      select.value = 'polarization';
      select.dispatchEvent(new Event('change'));
    });
    await showRuns(runs);
    assert.equal(
      await view.page.evaluate(() => document.getElementById('runs-chart')!.dataset.quantity),
      'polarization',
    );
    const g = await geometry(view.page, 'runs-chart');
    await view.page.locator('#runs-chart').scrollIntoViewIfNeeded();
    const box = await view.page.locator('#runs-chart').boundingBox();
    const [x, y] = toPixel(g, runs.points[3]!.x, runs.points[3]!.values.polarization!.y);
    const before = (await view.posted()).length;
    await view.page.mouse.click(box!.x + x, box!.y + y);
    await view.page.waitForFunction((n) => window.__test.posted.length > n, before);
    const open = (await view.posted()).at(-1)!;
    assert.deepEqual(open, { type: 'openRun', uri: 'file:///lab/runs.md', line: runs.points[3]!.line });
    assert.ok(isViewToHost(open));
    await view.page.click('#runs-csv');
    await view.page.waitForFunction((n) => window.__test.posted.length > n + 1, before);
    assert.deepEqual((await view.posted()).at(-1), { type: 'exportRunsCsv', quantity: 'polarization' });
    await view.page.click('#runs-png');
    await view.page.waitForFunction((n) => window.__test.posted.length > n + 2, before);
    const png = (await view.posted()).at(-1) as { type: string; dataUrl: string };
    assert.equal(png.type, 'exportRunsPng');
    assert.ok(isViewToHost(png));
  });

  it('shows a hostile run name only as text and hides the section when there are no runs', async () => {
    await showRuns(runsOf(RUN_LOG_NOTE.replace('id: run 1', `id: "${XSS_ID}"`).replace('# Polarizer runs', '# x')));
    assert.equal(await view.page.evaluate(() => document.querySelectorAll('#runs img, #runs script').length), 0);
    await view.post({ ...render(curveOf(SERIES[0]!)), runs: null });
    await view.page.waitForFunction(() => document.getElementById('runs')!.hidden === true);
  });

  it('saves a screenshot of the run comparison for the README', async () => {
    mkdirSync('test-output/webview', { recursive: true });
    await showRuns(runs);
    assert.equal(
      await view.page.evaluate(() => document.getElementById('runs-chart')!.dataset.quantity),
      'polarization',
    );
    await view.page.locator('#runs').screenshot({ path: 'test-output/webview/run-comparison-light.png' });
  });
});

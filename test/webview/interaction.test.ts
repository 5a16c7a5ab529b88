import { strict as assert } from 'node:assert';
import { isViewToHost, type CurvePayload } from '../../src/core';
import { openView, usePageServer, type ViewPage } from './harness';
import { curveOf, MULTI_LEVEL, payloadOf, render, SERIES, TWO_LEVEL } from './payloads';
import { geometry, near, pixelsAround, toPixel } from './pixels';
import { DARK, LIGHT, rgb } from './themes';

// Page-side names for the functions passed to the page (this module is typed without the DOM library).
declare const window: { __test: { applyTheme(t: unknown): void; posted: unknown[] } };
declare const document: {
  body: { dataset: Record<string, string | undefined> };
  getElementById(id: string): {
    textContent: string | null;
    hidden: boolean;
    value: string;
    dataset: Record<string, string | undefined>;
    dispatchEvent(e: unknown): void;
    hasAttribute(a: string): boolean;
  } | null;
  querySelectorAll(selector: string): { length: number };
};
declare const Event: new (type: string) => unknown;

describe('curve view messages and controls (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;
  let draws = 0;

  async function show(p: CurvePayload, pins: Parameters<typeof render>[1] = []): Promise<void> {
    await view.post(render(p, pins));
    await view.drawn(++draws);
  }
  const drawCount = () => view.page.evaluate(() => Number(document.body.dataset.drawn));
  const title = () => view.page.evaluate(() => document.getElementById('block-title')!.textContent);
  /** Waits for the page's n-th posted message and returns it. */
  async function nthPosted(n: number): Promise<{ type: string; [k: string]: unknown }> {
    await view.page.waitForFunction((k) => window.__test.posted.length >= k, n);
    return (await view.posted())[n - 1]!;
  }

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
  });

  it('says it is ready once loaded, before any render', async () => {
    assert.deepEqual(await view.posted(), [{ type: 'ready' }]);
    assert.equal(await view.page.evaluate(() => document.body.dataset.state), 'empty');
  });

  it('posts pin, CSV, PNG and image-link requests from its buttons, each valid for the host', async () => {
    const [first, second] = SERIES.map((b) => curveOf(b));
    await show(first!, [{ key: 'pin-7', payload: second! }]);
    await view.page.click('#pin-button');
    assert.deepEqual(await nthPosted(2), { type: 'pin' });
    await view.page.click('#export-csv');
    assert.deepEqual(await nthPosted(3), { type: 'exportCsv', unit: 'block' });
    await view.page.click('#export-png');
    const png = await nthPosted(4);
    assert.equal(png.type, 'exportPng');
    assert.ok(isViewToHost(png), 'passes the host’s validator');
    const bytes = Buffer.from(String(png.dataUrl).split(',')[1]!, 'base64');
    assert.equal(bytes.subarray(1, 4).toString(), 'PNG');
    assert.ok(bytes.readUInt32BE(16) >= 600 && bytes.readUInt32BE(20) >= 500, 'both charts in one image');
    await view.page.click('#copy-link');
    const link = await nthPosted(5);
    assert.equal(link.type, 'copyImageLink');
    assert.ok(isViewToHost(link));
    await view.page.click('#pin-list vscode-button');
    assert.deepEqual(await nthPosted(6), { type: 'unpin', key: 'pin-7' });
  });

  it('lists a pin of the shown run once in the legend and keeps it in the pin list, and lists other pins beside it', async () => {
    const [first, second] = SERIES.map((b, i) => curveOf(b, `series-${i}`));
    const legend = async (): Promise<string[]> =>
      ((await view.page.evaluate(() => document.getElementById('entropy-chart')!.dataset.legend)) ?? '').split('\n');
    const pinItems = () => view.page.evaluate(() => document.querySelectorAll('#pin-list li').length);
    await show(first!, [{ key: 'pin-1', payload: first! }]);
    assert.equal(
      (await legend()).filter((l) => l === first!.id).length,
      1,
      `legend: ${JSON.stringify(await legend())}`,
    );
    assert.equal(await pinItems(), 1, 'the pin can still be unpinned');
    await show(second!, [{ key: 'pin-1', payload: first! }]);
    const both = await legend();
    assert.ok(both.includes(first!.id) && both.includes(second!.id), `legend: ${JSON.stringify(both)}`);
  });

  it('switches the energy axis to kelvin and back, and exports in the unit shown', async () => {
    await show(curveOf(MULTI_LEVEL));
    assert.ok(Math.abs((await geometry(view.page, 'entropy-chart')).x[1] - 12817) < 1e-6);
    await view.page.evaluate(() => {
      const select = document.getElementById('unit-select')!;
      select.value = 'K';
      select.dispatchEvent(new Event('change'));
    });
    await view.drawn(++draws);
    const g = await geometry(view.page, 'entropy-chart');
    assert.ok(Math.abs(g.x[1] - 12817 * 1.438776877) < 0.01, `x axis up to ${g.x[1]} K`);
    const before = (await view.posted()).length;
    await view.page.click('#export-csv');
    assert.deepEqual(await nthPosted(before + 1), { type: 'exportCsv', unit: 'K' });
    await view.page.evaluate(() => {
      const select = document.getElementById('unit-select')!;
      select.value = 'block';
      select.dispatchEvent(new Event('change'));
    });
    await view.drawn(++draws);
  });

  it('drops an invalid message and a render older than one already drawn', async () => {
    const good = curveOf(TWO_LEVEL);
    const broken = JSON.parse(JSON.stringify(render(good)));
    broken.current.curve.entropy[5] = 'NaN';
    await view.post(broken);
    const newer = render(curveOf(SERIES[2]!));
    const older = render(curveOf(SERIES[3]!));
    await view.post(newer);
    await view.post({ ...older, seq: newer.seq - 1 });
    await view.post(render(curveOf(SERIES[1]!)));
    await view.drawn(draws + 2);
    draws += 2;
    assert.equal(await drawCount(), draws, 'exactly the two valid, current renders were drawn');
    assert.equal(await title(), 'cell-B run 8');
    assert.ok(
      view.console.some((l) => l.includes('ignored a message')),
      view.console.join('\n'),
    );
  });

  it('shows the first diagnostic of a block with errors instead of a stale chart', async () => {
    const problem = payloadOf('id: hurried\nsystem: C13\nfield: 7.05 T\npolarization: 0.28');
    assert.equal(problem.kind, 'problem');
    await view.post(render(problem));
    await view.page.waitForFunction(() => document.body.dataset.state === 'problem');
    const seen = await view.page.evaluate(() => ({
      text: document.getElementById('problem')!.textContent,
      chartsHidden: document.getElementById('charts')!.hidden,
      pinDisabled: document.getElementById('pin-button')!.hasAttribute('disabled'),
    }));
    assert.ok(seen.text!.includes(problem.message) && seen.text!.includes(problem.code!), seen.text!);
    assert.equal(seen.chartsHidden, true);
    assert.equal(seen.pinDisabled, true);
    assert.equal(await drawCount(), draws, 'no chart was drawn for it');
  });

  it('comes back from its saved state after a reload, without waiting for the host', async () => {
    await show(curveOf(SERIES[0]!));
    await view.page.reload();
    await view.page.waitForFunction(() => document.body.dataset.drawn === '1');
    assert.equal(await title(), 'cell-B run 7');
    draws = 1;
  });

  it('redraws in the new colours when the theme changes', async () => {
    const p = curveOf(TWO_LEVEL);
    await show(p);
    await view.page.evaluate((t) => window.__test.applyTheme(t), DARK);
    await view.drawn(++draws);
    const g = await geometry(view.page, 'beta-chart');
    const i = Math.floor(p.curve.energy.length / 3);
    const [px] = await pixelsAround(view.page, 'beta-chart', [toPixel(g, p.curve.energy[i]!, p.curve.beta[i]!)], 1.5);
    assert.ok(
      px!.some((q) => near(q, rgb(DARK.vars['--vscode-charts-blue']!))),
      'dark theme blue on the curve',
    );
    const [bg] = await pixelsAround(view.page, 'beta-chart', [[g.left + 2, g.bottom - 40]], 0);
    assert.ok(
      near(bg![0]!, rgb(DARK.vars['--vscode-editor-background']!), 2),
      `dark background, got ${JSON.stringify(bg![0])}`,
    );
  });
});

import { strict as assert } from 'node:assert';
import { mkdirSync } from 'node:fs';
import { openView, usePageServer, type ViewPage } from './harness';
import { payloadOf, render } from './payloads';
import { geometry, near, pixelsAround, toPixel, type ChartGeometry } from './pixels';

/** The page's DOM as these tests touch it (the test files compile without the DOM library). */
declare function getComputedStyle(e: never): { borderLeftColor: string };
declare const document: {
  getElementById(
    id: string,
  ): { hidden: boolean; textContent: string | null; dataset: Record<string, string | undefined> } | null;
};
import { LIGHT, rgb } from './themes';

// Ar I lines of the NIST Atomic Spectra Database (upper-level energies, g, A; vacuum λ), with intensities
// made at 10 000 K (derived by I ∝ g A/λ · exp(−E_k/kT)) with 5 % uncertainties; the third line
// (810.59 nm) made 50 % too bright, about 8 σ.
const LINES = `lines:
  - { wavelength: 811.7542 nm, upper: 105462.7596 cm-1, g: 7, A: 3.3e7, intensity: 1 ± 0.05 }
  - { wavelength: 763.7208 nm, upper: 106237.5518 cm-1, g: 5, A: 2.45e7, intensity: 0.50419777 ± 0.025 }
  - { wavelength: 810.5921 nm, upper: 106087.2598 cm-1, g: 3, A: 2.5e7, intensity: 0.4458006 ± 0.022 }
  - { wavelength: 801.699 nm, upper: 105617.27 cm-1, g: 5, A: 9.3e6, intensity: 0.19934234 ± 0.01 }
  - { wavelength: 795.0362 nm, upper: 107131.7086 cm-1, g: 3, A: 1.86e7, intensity: 0.19398811 ± 0.01 }`;
const SERIES =
  'series:\n  model: decay\n  time: [0 s, 6 s, 12 s, 18 s, 24 s, 30 s]\n  signal: [1.0, 0.88, 0.78, 0.69, 0.6, 0.53]';

// The measurement chart under the curves: the Boltzmann plot of emission lines, a series with its fit.
describe('curve view measurement plot (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;

  async function geometryOf(): Promise<ChartGeometry & { kind: string }> {
    const g = await geometry(view.page, 'measurement-chart');
    const kind = await view.page.evaluate(() => document.getElementById('measurement-chart')!.dataset.kind ?? '');
    return { ...g, kind };
  }

  async function drawnCount(): Promise<number> {
    return view.page.evaluate(() => Number(document.getElementById('measurement')!.dataset.drawn ?? 0));
  }

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
  });

  it('draws the Boltzmann plot of an emission-lines block, with its points in the measured colour', async () => {
    const p = payloadOf(LINES, 'lamp');
    assert.equal(p.kind, 'problem', 'lines have no S(E) curve');
    assert.equal(p.plot?.kind, 'boltzmann');
    assert.equal(p.plot!.points.filter((q) => q.flagged).length, 1, 'only the too-bright line is flagged');
    const before = await drawnCount();
    await view.post(render(p));
    await view.page.waitForFunction(
      (n) => Number(document.getElementById('measurement')!.dataset.drawn ?? 0) > n,
      before,
    );
    assert.equal(await view.page.evaluate(() => document.getElementById('measurement')!.hidden), false);
    const g = await geometryOf();
    assert.equal(g.kind, 'boltzmann');
    const red = rgb(LIGHT.vars['--vscode-charts-red']!);
    const plain = p.plot!.points.filter((q) => !q.flagged).map((q) => toPixel(g, q.x, q.y));
    assert.ok(
      plain.length >= 4 && plain.every(([x, y]) => x > g.left && x < g.right && y > g.top && y < g.bottom),
      `points inside the plot area: ${JSON.stringify({ g, plain })}`,
    );
    const around = await pixelsAround(view.page, 'measurement-chart', plain, 2);
    assert.ok(
      around.every((px) => px.some((q) => near(q, red))),
      'a measured-colour dot at every unflagged line',
    );
    assert.match(
      await view.page.evaluate(() => document.getElementById('measurement-title')!.textContent ?? ''),
      /Boltzmann plot/,
    );
  });

  it('draws a bare decay series with its fit, and hides the plot for a block without one', async () => {
    const p = payloadOf(SERIES, 'decay');
    assert.equal(p.plot?.kind, 'series');
    assert.equal(p.plot!.residuals.length, 6);
    const before = await drawnCount();
    await view.post(render(p));
    await view.page.waitForFunction(
      (n) => Number(document.getElementById('measurement')!.dataset.drawn ?? 0) > n,
      before,
    );
    assert.equal((await geometryOf()).kind, 'series');
    mkdirSync('test-output/webview', { recursive: true });
    await view.page.locator('#measurement').screenshot({ path: 'test-output/webview/measurement-series-light.png' });
    // Above a drawn fit the chip says what is drawn, and the explanation is a note, not an error.
    assert.equal(await view.page.evaluate(() => document.getElementById('block-status')!.textContent), 'series fit');
    const problem = await view.page.evaluate(() => {
      const e = document.getElementById('problem') as unknown as {
        dataset: Record<string, string>;
        getAttribute(a: string): string;
      };
      return {
        kind: e.dataset.kind,
        role: e.getAttribute('role'),
        border: getComputedStyle(e as never).borderLeftColor,
      };
    });
    assert.deepEqual([problem.kind, problem.role], ['note', 'status']);
    const error = rgb(LIGHT.vars['--vscode-inputValidation-errorBorder'] ?? LIGHT.vars['--vscode-errorForeground']!);
    assert.notEqual(problem.border, `rgb(${error.join(', ')})`, 'not the error colour');
    await view.post(render(payloadOf('gap: 10 K\nratio: 0.5', 'plain')));
    await view.page.waitForFunction(() => document.getElementById('measurement')!.hidden === true);
  });

  it('pins a series so that another run’s fit is drawn over it, in the pin colour, and lists it', async () => {
    const shown = payloadOf(SERIES, 'decay');
    const other = payloadOf(
      'id: run 3 decay\nseries:\n  model: decay\n  time: [0 s, 6 s, 12 s, 18 s, 24 s, 30 s]\n  signal: [0.8, 0.66, 0.55, 0.46, 0.38, 0.32]',
      'decay-3',
    );
    const pinnedPlots = [{ key: 'pin-1', id: 'run 3 decay', uri: other.uri, line: other.line, plot: other.plot! }];
    const before = await drawnCount();
    await view.post({ ...render(shown), pinnedPlots });
    await view.page.waitForFunction(
      (n) => Number(document.getElementById('measurement')!.dataset.drawn ?? 0) > n,
      before,
    );
    assert.equal(
      await view.page.evaluate(() => document.getElementById('measurement-chart')!.dataset.pins),
      'run 3 decay',
    );
    const g = await geometryOf();
    const orange = rgb(LIGHT.vars['--vscode-charts-orange']!);
    const at = other.plot!.points.map((q) => toPixel(g, q.x, q.y));
    const around = await pixelsAround(view.page, 'measurement-chart', at, 2);
    assert.ok(
      around.filter((px) => px.some((q) => near(q, orange, 30))).length >= 4,
      'the pinned run’s points in the first pin colour',
    );
    const listed = await view.page.evaluate(() => document.getElementById('pin-list')!.textContent ?? '');
    assert.match(listed, /run 3 decay — series fit/);
    const pinDisabled = await view.page.evaluate(() =>
      (document.getElementById('pin-button') as unknown as { hasAttribute(a: string): boolean }).hasAttribute(
        'disabled',
      ),
    );
    assert.equal(pinDisabled, false, 'a series can be pinned');
  });
});

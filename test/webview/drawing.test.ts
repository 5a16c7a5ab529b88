import { strict as assert } from 'node:assert';
import type { CurvePayload } from '../../src/core';
import { openView, usePageServer, type ViewPage } from './harness';
import { curveOf, FINITE_N, MULTI_LEVEL, render, TWO_LEVEL, TWO_LEVEL_INVERTED } from './payloads';
import { geometry, near, pixelsAround, toPixel, type ChartGeometry } from './pixels';
import { blend, LIGHT, rgb } from './themes';

// The curve view's page in headless Chromium: what it draws, checked in its pixels.
describe('curve view drawing (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;
  let draws = 0;

  /** Sends a render of `p` and waits for the draw it causes. */
  async function show(p: CurvePayload): Promise<void> {
    await view.post(render(p));
    await view.drawn(++draws);
  }

  /** Curve points inside the plot area (not within 3 px of its edges), every `step`-th. */
  function inside(g: ChartGeometry, xs: readonly number[], ys: readonly number[], step: number): [number, number][] {
    const out: [number, number][] = [];
    for (let i = 0; i < xs.length; i += step) {
      const [px, py] = toPixel(g, xs[i]!, ys[i]!);
      if (px > g.left + 3 && px < g.right - 3 && py > g.top + 3 && py < g.bottom - 3) out.push([px, py]);
    }
    return out;
  }

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
  });

  it('draws a two-level scheme with the curve colour along S(E) and β(E), and not away from them', async () => {
    const p = curveOf(TWO_LEVEL);
    await show(p);
    const blue = rgb(LIGHT.vars['--vscode-charts-blue']!);
    for (const [id, ys] of [
      ['entropy-chart', p.curve.entropy],
      ['beta-chart', p.curve.beta],
    ] as const) {
      const g = await geometry(view.page, id);
      const points = inside(g, p.curve.energy, ys, 8);
      assert.ok(points.length > 15, `${id}: ${points.length} curve points inside the plot`);
      const around = await pixelsAround(view.page, id, points, 1.5);
      const hits = around.filter((px) => px.some((q) => near(q, blue))).length;
      assert.ok(hits >= 0.9 * points.length, `${id}: curve colour at ${hits} of ${points.length} curve points`);
    }
    // Control: above the entropy curve near the ground state (E → 0, S → 0) there is no curve colour.
    const g = await geometry(view.page, 'entropy-chart');
    const empty = await pixelsAround(view.page, 'entropy-chart', [toPixel(g, 1, 0.6), toPixel(g, 9, 0.6)], 3);
    assert.ok(
      empty.every((px) => !px.some((q) => near(q, blue))),
      'no curve colour where the curve is not',
    );
    assert.equal(await view.page.evaluate('document.body.dataset.state'), 'chart');
  });

  it('shades the population-inversion region exactly where β < 0', async () => {
    const p = curveOf(TWO_LEVEL);
    await show(p);
    const bg = LIGHT.vars['--vscode-editor-background']!;
    const shade = blend(LIGHT.vars['--vscode-charts-orange']!, bg, 0.16);
    for (const id of ['beta-chart', 'entropy-chart']) {
      const g = await geometry(view.page, id);
      const [zeroX] = toPixel(g, p.saturationEnergy, 0);
      // A row a third of the way down the plot: below the labels, above most of the curve.
      const y = g.top + (g.bottom - g.top) * 0.35;
      const left: [number, number][] = [];
      const right: [number, number][] = [];
      for (let x = g.left + 4; x < g.right - 4; x += 3) {
        if (x < zeroX - 5) left.push([x, y]);
        else if (x > zeroX + 5) right.push([x, y]);
      }
      const shaded = async (pts: [number, number][]) =>
        (await pixelsAround(view.page, id, pts, 0)).filter((px) => near(px[0]!, shade, 3)).length;
      const r = await shaded(right);
      assert.ok(r >= 0.8 * right.length, `${id}: ${r} of ${right.length} pixels right of β = 0 are shaded`);
      assert.equal(await shaded(left), 0, `${id}: no shading left of β = 0`);
    }
  });

  it('draws a multi-level scheme with its measured point below the curve', async () => {
    const p = curveOf(MULTI_LEVEL);
    await show(p);
    const g = await geometry(view.page, 'entropy-chart');
    const k = p.unit.kelvinPerUnit;
    assert.ok(Math.abs(g.x[1] - 12817) < 1e-6, `x axis in cm⁻¹ up to the top level: ${g.x[1]}`);
    const red = rgb(LIGHT.vars['--vscode-charts-red']!);
    const m = p.measured!;
    const [mx, my] = toPixel(g, m.energy / k, m.entropy);
    const [, ty] = toPixel(g, m.energy / k, m.thermalEntropy!);
    assert.ok(ty < my - 5, 'the thermal curve lies visibly above the non-thermal point');
    const [atPoint, inGap] = await pixelsAround(
      view.page,
      'entropy-chart',
      [
        [mx, my],
        [mx, (my + ty) / 2],
      ],
      1,
    );
    assert.ok(
      atPoint!.some((q) => near(q, red)),
      'the measured marker',
    );
    assert.ok(
      inGap!.some((q) => near(q, red)),
      'the dashed deficit gap between point and curve',
    );
    const facts = (await view.page.evaluate(`document.getElementById('facts').textContent`)) as string;
    assert.match(facts, /entropy deficit/);
    assert.match(facts, /relative entropy to thermal/);
  });

  it('draws the finite-N staircase next to the large-N curve', async () => {
    const p = curveOf(FINITE_N);
    await show(p);
    const g = await geometry(view.page, 'entropy-chart');
    const purple = rgb(LIGHT.vars['--vscode-charts-purple']!);
    const f = p.finiteN!;
    const k = p.unit.kelvinPerUnit;
    // The exact values ln C(12, m)/12 sit at E = mε/12; each step is drawn through them.
    const steps = inside(
      g,
      f.energy.map((e) => e / k),
      f.entropy,
      1,
    );
    assert.ok(steps.length >= 9, `${steps.length} steps inside`);
    const around = await pixelsAround(view.page, 'entropy-chart', steps, 1.5);
    assert.ok(
      around.every((px) => px.some((q) => near(q, purple))),
      'staircase colour at every exact point',
    );
    const legend = await view.page.evaluate(`document.body.dataset.drawn`);
    assert.equal(Number(legend), draws);
  });

  it('moves the measured marker when a message changes the block', async () => {
    const before = curveOf(TWO_LEVEL);
    const after = curveOf(TWO_LEVEL_INVERTED);
    await show(before);
    const g = await geometry(view.page, 'beta-chart');
    const red = rgb(LIGHT.vars['--vscode-charts-red']!);
    const at = (p: CurvePayload) => toPixel(g, p.measured!.energy, p.measured!.beta!);
    const hasRed = async (pt: [number, number]) =>
      (await pixelsAround(view.page, 'beta-chart', [pt], 1))[0]!.some((q) => near(q, red));
    assert.ok(await hasRed(at(before)), 'marker at the first position');
    assert.equal(await hasRed(at(after)), false, 'nothing red yet where the second point goes');
    await show(after);
    assert.deepEqual(await geometry(view.page, 'beta-chart'), g, 'same axes, so positions compare');
    assert.ok(await hasRed(at(after)), 'marker at the new position');
    assert.equal(await hasRed(at(before)), false, 'the old position is empty');
    assert.ok(at(after)[0] > toPixel(g, after.saturationEnergy, 0)[0], 'the inverted run sits right of saturation');
  });
});

import { strict as assert } from 'node:assert';
import { temperatureTicks } from '../../media/src/ticks';
import { openView, usePageServer, type ViewPage } from './harness';
import { curveOf, payloadOf, render, MULTI_LEVEL, SERIES } from './payloads';
import { geometry, toPixel } from './pixels';
import { LIGHT } from './themes';

declare const document: { getElementById(id: string): { dataset: Record<string, string | undefined> } | null };

/** True when x is 1, 2 or 5 times a power of ten, to rounding. */
function round125(x: number): boolean {
  const power = 10 ** Math.floor(Math.log10(x) + 1e-12);
  return [1, 2, 5, 10].some((m) => Math.abs(x / power - m) < 1e-9);
}

/** True when the ticks are evenly spaced (every gap the same): no axis end wedged between them. */
function even(ticks: readonly number[]): boolean {
  if (ticks.length < 3) return true;
  const step = ticks[1]! - ticks[0]!;
  return ticks.every((t, i) => i === 0 || Math.abs(t - ticks[i - 1]! - step) <= 1e-9 * Math.abs(step));
}

describe('temperature axis ticks', () => {
  it('sit at round temperatures, ±∞ at β = 0, never closer than a tenth of the axis', () => {
    // Round numbers 1, 2, 5 × 10ⁿ: common practice for axis labels, no source.
    for (const [min, max] of [
      [-5e-4, 5e-4],
      [-2000, 2000],
      [-0.25, 1],
    ] as const) {
      const betas = temperatureTicks(min, max);
      assert.ok(betas.includes(0), 'β = 0 is marked');
      for (const b of betas.filter((x) => x !== 0)) assert.ok(round125(1 / Math.abs(b)), `T = ${1 / b} is round`);
      for (let i = 1; i < betas.length; i++)
        assert.ok(betas[i]! - betas[i - 1]! >= (max - min) / 10 - 1e-15, `${betas[i - 1]} and ${betas[i]} too close`);
      assert.ok(betas.length >= 3, `${betas.length} ticks`);
    }
  });
});

describe('curve view axes (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;
  let draws = 0;
  const data = (id: string) => view.page.evaluate((i) => ({ ...document.getElementById(i)!.dataset }), id);

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
  });

  it('gives β in K⁻¹ on its axis for a block in cm⁻¹, with the measured point at its β in K⁻¹', async () => {
    const p = curveOf(MULTI_LEVEL);
    await view.post(render(p));
    await view.drawn(++draws);
    const d = await data('beta-chart');
    assert.equal(d.yTitle, 'inverse temperature β (K⁻¹)');
    const g = await geometry(view.page, 'beta-chart');
    const m = p.measured!;
    // β of this block ≈ 4.8e-5 K⁻¹ (T ≈ 20 790 K): inside the K⁻¹ axis, which a per-cm⁻¹ axis (×0.69) would also
    // hold, so check the scale itself: the axis end is within a factor 10 of |β| in K⁻¹.
    assert.ok(m.beta! > g.y[0] && m.beta! < g.y[1] && g.y[1] < 20 * Math.abs(m.beta!), JSON.stringify(g.y));
    // The saturation label sits where β = 0 is (3 px below the line), not at the axis bottom.
    const [, zero] = toPixel(g, 0, 0);
    const [, labelY] = d.saturationLabel!.split(',').map(Number) as [number, number];
    assert.ok(Math.abs(labelY - (zero + 3)) < 1, `label at ${labelY}, β = 0 at ${zero}`);
  });

  it('keeps the labels of β = 0, saturation and inversion apart: "β = 0" above the line, "saturation" below', async () => {
    type Box = [number, number, number, number];
    const apart = (a: Box, b: Box): boolean => a[2] <= b[0] || b[2] <= a[0] || a[3] <= b[1] || b[3] <= a[1];
    for (const p of [curveOf(MULTI_LEVEL), curveOf(SERIES[0]!)]) {
      await view.post(render(p));
      await view.drawn(++draws);
      const beta = JSON.parse((await data('beta-chart')).labelBoxes!) as Record<string, Box>;
      const [, zero] = toPixel(await geometry(view.page, 'beta-chart'), 0, 0);
      assert.ok(beta.zero![3] <= zero, `"β = 0" reaches ${beta.zero![3]}, below the line at ${zero}`);
      assert.ok(
        beta.saturation![1] >= zero,
        `"saturation" starts at ${beta.saturation![1]}, above the line at ${zero}`,
      );
      assert.ok(apart(beta.zero!, beta.saturation!), JSON.stringify(beta));
      const entropy = JSON.parse((await data('entropy-chart')).labelBoxes!) as Record<string, Box>;
      if (entropy.inversion) assert.ok(apart(entropy.inversion, entropy.saturation!), JSON.stringify(entropy));
    }
  });

  it('puts every tick of the curves at a round, evenly spaced value, and the T axis at round temperatures', async () => {
    for (const p of [curveOf(MULTI_LEVEL), curveOf(SERIES[0]!)]) {
      await view.post(render(p));
      await view.drawn(++draws);
      for (const id of ['entropy-chart', 'beta-chart']) {
        const ticks = JSON.parse((await data(id)).ticks!) as Record<string, number[]>;
        for (const axis of ['x', 'y']) assert.ok(even(ticks[axis]!), `${id} ${axis}: ${ticks[axis]!.join(', ')}`);
        if (id === 'beta-chart')
          for (const b of ticks.y2!.filter((x) => x !== 0)) assert.ok(round125(1 / Math.abs(b)), `T tick ${1 / b}`);
      }
    }
  });

  it('keeps the padded ends of the measurement plot and its residual axis off the ticks', async () => {
    const series =
      'series:\n  model: decay\n  time: [0 s, 6 s, 12 s, 18 s, 24 s, 30 s]\n  signal: [1.0, 0.88, 0.78, 0.69, 0.6, 0.53]';
    await view.post(render(payloadOf(series, 'decay')));
    await view.page.waitForFunction(() => document.getElementById('measurement-chart')!.dataset.kind === 'series');
    const ticks = JSON.parse((await data('measurement-chart')).ticks!) as Record<string, number[]>;
    for (const axis of ['x', 'y', 'y2']) assert.ok(even(ticks[axis]!), `${axis}: ${ticks[axis]!.join(', ')}`);
  });
});

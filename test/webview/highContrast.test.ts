import { strict as assert } from 'node:assert';
import { mkdirSync } from 'node:fs';
import { openView, usePageServer } from './harness';
import { curveOf, render, TWO_LEVEL } from './payloads';
import { geometry, near, pixelsAround, toPixel, type Pixel } from './pixels';
import { blend, contrastRatio, HIGH_CONTRAST, HIGH_CONTRAST_LIGHT, rgb } from './themes';

const OUT = 'test-output/webview';

/** The opaque pixel of a neighbourhood that is nearest to `rgb`, if any is within `tol`. */
function nearest(px: readonly Pixel[], want: readonly [number, number, number], tol: number): Pixel | undefined {
  return px.find((q) => near(q, want, tol));
}

// The high-contrast themes: the view must take their colours, draw thicker and
// more opaque marks (media/src/charts.ts), and keep the contrast WCAG 2.1 asks
// for: 3:1 for graphics (SC 1.4.11 non-text contrast) and 4.5:1 for text
// (SC 1.4.3), https://www.w3.org/TR/WCAG21/.
describe('curve view in high-contrast themes (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();

  before(() => {
    mkdirSync(OUT, { recursive: true });
  });

  for (const theme of [HIGH_CONTRAST, HIGH_CONTRAST_LIGHT]) {
    it(`draws in the ${theme.name} theme's colours, with the inversion shade stronger and every mark in contrast`, async () => {
      const view = await openView(pages.browser, pages.origin, theme);
      const p = curveOf(TWO_LEVEL);
      await view.post(render(p));
      await view.drawn(1);
      const bg = rgb(theme.vars['--vscode-editor-background']!);
      const curve = rgb(theme.vars['--vscode-charts-blue']!);
      const g = await geometry(view.page, 'entropy-chart');

      // The curve in the theme's chart colour along S(E).
      const points: [number, number][] = [];
      for (let i = 0; i < p.curve.energy.length; i += 10) {
        const [x, y] = toPixel(g, p.curve.energy[i]!, p.curve.entropy[i]!);
        if (x > g.left + 3 && x < g.right - 3 && y > g.top + 3 && y < g.bottom - 3) points.push([x, y]);
      }
      const around = await pixelsAround(view.page, 'entropy-chart', points, 1.5);
      const hits = around.map((px) => nearest(px, curve, 4)).filter((q) => q !== undefined);
      assert.ok(hits.length >= 0.9 * points.length, `curve colour at ${hits.length} of ${points.length} curve points`);

      // The ground of the plot where nothing is drawn (above the curve near E = 0) is the theme's background,
      // and the curve stands out from it by at least 3:1.
      const [[ground]] = await pixelsAround(
        view.page,
        'entropy-chart',
        [toPixel(g, p.curve.energy.at(-1)! * 0.03, 0.6)],
        0,
      );
      assert.ok(near(ground!, bg, 2), `plot ground ${JSON.stringify(ground)} is the background ${JSON.stringify(bg)}`);
      const ratio = contrastRatio(curve, [ground![0], ground![1], ground![2]]);
      assert.ok(ratio >= 3, `curve against ground: ${ratio.toFixed(2)}:1`);

      // High contrast shades the inversion region at 0.28 opacity (0.16 elsewhere): the stronger blend is what is drawn.
      const [zeroX] = toPixel(g, p.saturationEnergy, 0);
      const y = g.top + (g.bottom - g.top) * 0.35;
      const right: [number, number][] = [];
      for (let x = zeroX + 8; x < g.right - 4; x += 4) right.push([x, y]);
      const shade = blend(theme.vars['--vscode-charts-orange']!, theme.vars['--vscode-editor-background']!, 0.28);
      const weak = blend(theme.vars['--vscode-charts-orange']!, theme.vars['--vscode-editor-background']!, 0.16);
      const cells = await pixelsAround(view.page, 'entropy-chart', right, 0);
      const strong = cells.filter((c) => near(c[0]!, shade, 3)).length;
      assert.ok(
        strong >= 0.8 * right.length,
        `${strong} of ${right.length} pixels right of β = 0 carry the high-contrast shade`,
      );
      assert.equal(cells.filter((c) => near(c[0]!, weak, 3)).length, 0, 'none carries the ordinary shade');

      // The facts beside the charts are in the theme's foreground, readable at 4.5:1 or better.
      const color = (await view.page.evaluate(`getComputedStyle(document.getElementById('facts')).color`)) as string;
      const fg = (color.match(/\d+/g) ?? []).slice(0, 3).map(Number) as [number, number, number];
      assert.deepEqual(fg, rgb(theme.vars['--vscode-foreground']!), `facts colour ${color}`);
      assert.ok(contrastRatio(fg, bg) >= 4.5, `text contrast ${contrastRatio(fg, bg).toFixed(2)}:1`);

      assert.equal(await view.page.evaluate(`document.body.className`), theme.bodyClass);
      await view.page.screenshot({ path: `${OUT}/curve-view-two-level-${theme.name}.png`, fullPage: true });
      await view.page.close();
    });
  }
});

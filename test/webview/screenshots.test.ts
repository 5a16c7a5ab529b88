import { strict as assert } from 'node:assert';
import { mkdirSync, statSync } from 'node:fs';
import { openView, usePageServer } from './harness';
import { curveOf, FINITE_N, MULTI_LEVEL, render, SERIES } from './payloads';
import { DARK, LIGHT } from './themes';

const OUT = 'test-output/webview';

// Screenshots of the view in a light and a dark theme, saved for people to look at
// (test-output/ is not committed; docs/images holds chosen copies).
describe('curve view screenshots (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();

  before(() => {
    mkdirSync(OUT, { recursive: true });
  });

  for (const theme of [LIGHT, DARK]) {
    it(`saves the ${theme.name} theme: a run series with pins, a non-thermal scheme and a finite-N staircase`, async () => {
      const view = await openView(pages.browser, pages.origin, theme);
      const [first, ...rest] = SERIES.map((b, i) => curveOf(b, `week-11-${i}`));
      const pins = rest.map((payload, i) => ({ key: `pin-${i}`, payload }));
      const shots: [string, ReturnType<typeof render>][] = [
        ['series', render(first!, pins)],
        ['multi-level', render(curveOf(MULTI_LEVEL))],
        ['finite-n', render(curveOf(FINITE_N))],
      ];
      let n = 0;
      for (const [name, message] of shots) {
        await view.post(message);
        await view.drawn(++n);
        const path = `${OUT}/curve-view-${name}-${theme.name}.png`;
        await view.page.screenshot({ path, fullPage: true });
        assert.ok(statSync(path).size > 10_000, `${path} holds a picture`);
      }
      assert.equal(await view.page.evaluate(`document.body.className`), theme.bodyClass);
      await view.page.close();
    });
  }
});

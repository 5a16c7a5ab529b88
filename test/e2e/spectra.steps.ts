/**
 * e2e steps of spectrum references, registered into the editor suite's
 * `describe`, on the demo's `spectra-run12.md` (its files in `spectra/`):
 * the hover on a reference shows the integral read from the file; a file
 * renamed on disk makes its reference an error, and renaming it back
 * recovers the block, with no reload; the curve view's spectrum panel is
 * drawn with its region shaded.
 */
import { strict as assert } from 'node:assert';
import { readFileSync, renameSync } from 'node:fs';
import { join } from 'node:path';
import * as host from '../../scripts/editorHost.cjs';
import { shot, type Session } from './session';
import {
  clean,
  clickLensAbove,
  dismissHover,
  frameWith,
  goToLine,
  hoverText,
  lineOf,
  openFromExplorer,
  runCommand,
  waitNoProblem,
  waitProblems,
} from './workbench';

const NOTE = 'spectra-run12.md';
const TEXT = readFileSync(join(host.ROOT, 'demo', NOTE), 'utf8');
const ID = lineOf(TEXT, 'id: run 12 spectra');
const THERMAL = 'spectra/thermal-0412.csv';

// Page-side names for the functions passed to the page (this module is typed without the DOM library).
type DomNode = any;

export function spectraSteps(session: () => Session): void {
  it('hovers a spectrum reference with the integral ± u, the points, the unit and the file', async () => {
    const { page } = session();
    // The earlier steps leave the preview and the curve view open: start from the note alone.
    await runCommand(page, 'View: Close All Editors');
    await openFromExplorer(page, NOTE, 'Run 12 from its spectra (invented)');
    await goToLine(page, ID + 5);
    const text = await hoverText(page, '  thermal: { spectrum', 'region', /from the spectrum/);
    assert.match(text, /signal\.thermal/);
    assert.match(text, /integral\s+\S.*±.*\(y × ppm\)/);
    assert.match(text, /region\s+168 … 174\.5 ppm, \d+ points/);
    assert.match(text, /x unit\s+ppm/);
    assert.ok(text.includes(THERMAL), text);
    await shot(page, '20-spectrum-hover');
    await dismissHover(page);
  });

  it('reports a spectrum file renamed on disk on its reference, and recovers when it is renamed back', async () => {
    const s = session();
    const { page } = s;
    const file = join(s.workspace, ...THERMAL.split('/'));
    const moved = `${file}.moved`;
    await runCommand(page, 'View: Focus Problems (Errors, Warnings, Infos)');
    renameSync(file, moved);
    try {
      await waitProblems(page, [['spectrum-missing', THERMAL]]);
      await shot(page, '21-spectrum-missing');
    } finally {
      renameSync(moved, file);
    }
    await waitNoProblem(page, 'spectrum-missing');
    await shot(page, '22-spectrum-recovered');
  });

  it('draws the spectrum panel in the curve view with the integrated region shaded', async () => {
    const { page } = session();
    await goToLine(page, ID);
    const view = await clickLensAbove(page, 'id: run 12 spectra', 'Show Curve View', (ms) =>
      frameWith(page, 'body[data-drawn] #block-title', 'run 12 spectra', ms),
    );
    await view.locator('#spectra:not([hidden])[data-drawn]').waitFor();
    const data = await view.locator('#spectrum-chart').evaluate((c: DomNode) => ({ ...c.dataset }));
    assert.equal(data.reversed, 'true', 'ppm runs right to left');
    assert.equal(data.key, 'signal.hyperpolarized');
    // Red-tinted pixels (the shading and the baseline) inside the region, none in a stretch without a line.
    const tinted = await view.locator('#spectrum-chart').evaluate((c: DomNode) => {
      const [l, t, r, b] = String(c.dataset.area).split(',').map(Number);
      const [x0, x1] = String(c.dataset.x).split(',').map(Number);
      const ratio = c.width / c.clientWidth;
      const ctx = c.getContext('2d');
      const count = [] as number[];
      for (const [lo, hi] of [String(c.dataset.region).split(',').map(Number), [185, 195]]) {
        // Reversed axis: x0 at the right edge.
        const pa = r - ((lo - x0) / (x1 - x0)) * (r - l);
        const pb = r - ((hi - x0) / (x1 - x0)) * (r - l);
        const left = Math.floor(Math.min(pa, pb) * ratio);
        const width = Math.max(1, Math.floor(Math.abs(pb - pa) * ratio));
        const d = ctx.getImageData(left, Math.floor(t * ratio), width, Math.floor((b - t) * ratio)).data;
        let n = 0;
        for (let i = 0; i < d.length; i += 4) if (d[i + 3] > 0 && d[i] > d[i + 1] + 40 && d[i] > d[i + 2] + 40) n++;
        count.push(n);
      }
      return count;
    });
    // The region is a few pixels wide in a narrow side panel: any shading there counts, none outside it.
    assert.ok(tinted[0]! >= 10, `shaded pixels in the region: ${JSON.stringify(tinted)}`);
    assert.equal(tinted[1], 0, `no shading outside it: ${JSON.stringify(tinted)}`);
    assert.match(
      clean(await view.locator('#spectra-caption').innerText()),
      /signal\.hyperpolarized = .* from spectra\/run12-hp\.jdx/,
    );
    await view.locator('#spectra').scrollIntoViewIfNeeded();
    await shot(page, '23-spectrum-panel');
  });
}

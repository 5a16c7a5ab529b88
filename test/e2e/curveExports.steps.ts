/**
 * e2e steps of the curve view's pins and exports, registered into the
 * editor suite's `describe` (they need the view the earlier steps opened).
 * The expected numbers come from the core run on the committed note, so a
 * wrong payload, a CSV of the wrong runs or a link to the wrong place fails.
 */
import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import type { Frame, Page } from 'playwright-core';
import { Analyzer, curveCsv, curveData, type CurvePayload } from '../../src/core';
import { saveDialog } from './dialogs';
import { csvRecords, isWholePng, parseCsv, pngFacts, waitForFile } from './files';
import { scratchFolder, shot, type Session } from './session';
import { canvasInk, clean, frameWith, goToLine } from './workbench';

/** Where the steps start: the note, and the block the view shows now (to be pinned) and the one to move to. */
export interface CurveExportPlan {
  readonly note: string;
  readonly text: string;
  /** The block the view shows when the steps begin; it is pinned. */
  readonly pinned: string;
  /** The block the cursor then moves to (a 1-based line inside it); it stays shown. */
  readonly shown: { readonly id: string; readonly line: number };
}

/** The core's payload of a block of `text`, as the language server builds it. */
function corePayload(text: string, id: string): CurvePayload {
  const report = new Analyzer().analyzeText(text).blocks.find((b) => b.meta.id === id);
  assert.ok(report, `the note has a block "${id}"`);
  const p = curveData(report, { uri: 'note', version: 0 });
  assert.equal(p.kind, 'curve', `the core draws a curve for "${id}"`);
  return p as CurvePayload;
}

/** The file-name stem the view is meant to offer for an ASCII block id: lower case, other characters as dashes. */
function stem(id: string): string {
  return id
    .toLowerCase()
    .replace(/[^a-z0-9_]+/g, '-')
    .replace(/^-+|-+$/g, '');
}

/** The curve view's page (the webview frame with its controls). */
function curveView(page: Page): Promise<Frame> {
  return frameWith(page, 'body[data-drawn] #pin-button');
}

/** The page's draw counter. */
async function draws(view: Frame): Promise<number> {
  return Number(await view.locator('body').getAttribute('data-drawn'));
}

/** Waits until the page has drawn the chart of block `id` again, after `before` draws. */
async function redrawn(view: Frame, id: string, before: number): Promise<void> {
  await view.locator('#block-title', { hasText: id }).waitFor();
  await view.locator(`body[data-state="chart"]:not([data-drawn="${before}"])`).waitFor();
}

/** The ids of the page's pin list, in order. */
async function pinnedIds(view: Frame): Promise<string[]> {
  return view.locator('#pin-list li .pin-id').allTextContents();
}

/** Registers the steps; `session` gives the suite's session once its `before` ran. */
export function curveExportSteps(session: () => Session, plan: CurveExportPlan): void {
  const pinned = corePayload(plan.text, plan.pinned);
  const shown = corePayload(plan.text, plan.shown.id);
  const note = (): string => join(session().workspace, plan.note);

  it('pins the shown run; after the cursor moves on, the page lists the pin by its id and draws the block under the cursor', async () => {
    const { page } = session();
    const view = await curveView(page);
    await view.locator('#block-title', { hasText: plan.pinned }).waitFor();
    assert.deepEqual(await pinnedIds(view), [], 'nothing is pinned yet');
    assert.ok(await view.locator('#pins').isHidden(), 'the pin list is hidden while empty');
    let before = await draws(view);
    await view.locator('#pin-button').click();
    await view.locator('#pin-list li .pin-id', { hasText: plan.pinned }).waitFor();
    await redrawn(view, plan.pinned, before);
    before = await draws(view);
    await goToLine(page, plan.shown.line);
    await redrawn(view, plan.shown.id, before);
    assert.deepEqual(await pinnedIds(view), [plan.pinned], 'the pin list names the pinned run');
    assert.equal(clean(String(await view.locator('#pin-list li .pin-status').textContent())), ` — ${pinned.status}`);
    assert.ok(await view.locator('#pins').isVisible(), 'the pin list is shown');
    assert.equal(clean(await view.locator('#block-status').innerText()), shown.status);
    for (const canvas of ['#entropy-chart', '#beta-chart']) {
      assert.match(
        String(await view.locator(canvas).getAttribute('aria-label')),
        new RegExp(`for ${shown.id}$`),
        `${canvas} is drawn for the block under the cursor`,
      );
      const ink = await canvasInk(view, canvas);
      assert.ok(
        ink.painted > ink.total * 0.002 && ink.colours >= 2,
        `${canvas} shows a drawn curve: ${JSON.stringify(ink)}`,
      );
    }
    await shot(page, '14-curve-view-pinned');
  });

  it('saves both charts as a PNG through the save dialog, offered beside the note', async () => {
    const { page } = session();
    const view = await curveView(page);
    const file = join(scratchFolder(session()), 'charts.png');
    // The PNG is the two canvases stacked under a title band, at the canvases' device pixels.
    const sizes = await view
      .locator('canvas#entropy-chart, canvas#beta-chart')
      .evaluateAll((cs: any[]) => cs.map((c) => ({ width: Number(c.width), height: Number(c.height) })));
    await view.locator('#export-png').click();
    await shot(page, '15-save-png-dialog');
    const offered = await saveDialog(page, file);
    assert.equal(
      offered,
      join(dirname(note()), `${stem(shown.id)}-curve.png`),
      'the dialog offers a name made from the block id, beside the note',
    );
    const bytes = await waitForFile(file, isWholePng);
    const png = pngFacts(bytes);
    assert.ok(png.width > 0 && png.height > 0, `IHDR gives a size: ${png.width}×${png.height}`);
    assert.equal(png.width, Math.max(...sizes.map((c) => c.width)), 'as wide as the wider canvas');
    const stacked = sizes.reduce((h, c) => h + c.height, 0);
    assert.ok(
      png.height > stacked && png.height < stacked + 200,
      `as tall as both canvases and a title band: ${png.height} for ${stacked}`,
    );
    assert.equal(png.bitDepth, 8);
    const channels = ({ 0: 1, 2: 3, 4: 2, 6: 4 } as Record<number, number>)[png.colourType];
    assert.ok(channels, `a colour type of 8-bit images: ${png.colourType}`);
    assert.equal(png.pixelBytes, png.height * (1 + png.width * channels), 'the image data holds every scanline');
    assert.ok(png.distinctBytes > 16, `the image is not blank (${png.distinctBytes} distinct byte values)`);
    assert.ok(bytes.length > 5000 && bytes.length < 20e6, `a reasonable size: ${bytes.length} bytes`);
    await shot(page, '16-saved-png');
  });

  it('saves the shown and the pinned run as CSV, the numbers the core computes', async () => {
    const { page } = session();
    const view = await curveView(page);
    const file = join(scratchFolder(session()), 'curves.csv');
    await view.locator('#export-csv').click();
    const offered = await saveDialog(page, file);
    assert.equal(offered, join(dirname(note()), `${stem(shown.id)}-curve.csv`));
    const text = (await waitForFile(file, (b) => b.length > 0 && b.toString('utf8').endsWith('\r\n'))).toString('utf8');
    const rows = parseCsv(text);
    const head = rows[0]!;
    assert.deepEqual(head.slice(0, 4), ['run', 'series', 'm', 'energy_K'], `the header: ${head.join(',')}`);
    assert.equal(
      head[4],
      `energy_${shown.unit.name}`,
      'energies also in the block’s display unit (the page’s default)',
    );
    const records = csvRecords(rows);
    assert.deepEqual(
      [...new Set(records.map((r) => r.run))],
      [shown.id, pinned.id],
      'the shown run first, then the pinned one, nothing else',
    );
    for (const p of [shown, pinned]) {
      const measured = records.filter((r) => r.run === p.id && r.series === 'measured');
      assert.equal(measured.length, 1, `one measured row for ${p.id}`);
      const m = measured[0]!;
      const close = (cell: string, want: number, what: string): void =>
        assert.ok(
          Math.abs(Number(cell) - want) <= 1e-9 * Math.abs(want),
          `${p.id} ${what}: ${cell}, the core says ${want}`,
        );
      close(m.energy_K!, p.measured!.energy, 'energy_K');
      close(m.entropy_per_Nk!, p.measured!.entropy, 'entropy');
      assert.equal(
        records.filter((r) => r.run === p.id && r.series === 'large-N').length,
        p.curve.energy.length,
        `the whole large-N curve of ${p.id}`,
      );
    }
    // The inverted run's measured β is negative, the normal one's positive.
    const beta = (id: string): number =>
      Number(records.find((r) => r.run === id && r.series === 'measured')!.beta_per_K);
    assert.equal(Math.sign(beta(pinned.id)), Math.sign(pinned.measured!.beta!));
    assert.equal(Math.sign(beta(shown.id)), Math.sign(shown.measured!.beta!));
    assert.equal(text, curveCsv([shown, pinned], shown.unit), 'the file is the core’s CSV of both runs, byte for byte');
    await shot(page, '17-saved-csv');
  });

  it('copies a Markdown image link to a PNG it saves, relative to the note', async () => {
    const s = session();
    const { page } = s;
    // The workbench writes and reads the clipboard through navigator.clipboard, which a page may use only when allowed.
    await s.context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: new URL(page.url()).origin });
    await page.evaluate(() => (globalThis as any).navigator.clipboard.writeText('nothing copied yet'));
    const view = await curveView(page);
    // A name with a space, as users give them: the link must then be written in angle brackets.
    const file = join(scratchFolder(s), 'linked chart.png');
    await view.locator('#copy-link').click();
    await saveDialog(page, file);
    await page.locator('.statusbar', { hasText: 'image link copied' }).waitFor();
    pngFacts(await waitForFile(file, isWholePng));
    const copied = await page.evaluate(() => (globalThis as any).navigator.clipboard.readText() as Promise<string>);
    const target = relative(dirname(note()), file).split('\\').join('/');
    // CommonMark's form for a link destination with a space; a plain path would end the link at the space.
    assert.equal(copied, `![${shown.id}](<${target}>)`);
    assert.ok(!copied.includes(session().workspace), 'the link is relative, not absolute');
    assert.equal(readFileSync(note(), 'utf8'), plan.text, 'the note itself is not changed');
    await shot(page, '18-copied-image-link');
  });

  it('unpins the run: the pin list empties and the block under the cursor is drawn again', async () => {
    const { page } = session();
    const view = await curveView(page);
    const before = await draws(view);
    await view.locator('#pin-list li', { hasText: plan.pinned }).locator('vscode-button', { hasText: 'Unpin' }).click();
    await view.locator('#pin-list li').first().waitFor({ state: 'detached' });
    await redrawn(view, plan.shown.id, before);
    assert.deepEqual(await pinnedIds(view), []);
    assert.ok(await view.locator('#pins').isHidden(), 'the pin list is hidden again');
    await shot(page, '19-curve-view-unpinned');
  });
}

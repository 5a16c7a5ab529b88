import { strict as assert } from 'node:assert';
import { rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { shot, startSession, type Session } from './session';
import { clean, frameWith, pattern, runCommand } from './workbench';

// The demo notebook (demo/optical-bench.ipynb): its second cell holds the `Xe cell run 2` block.
const NOTEBOOK = 'optical-bench.ipynb';
// A notebook the last step writes into the workspace and removes.
const REFERRING = 'by-reference.ipynb';

function notebookSteps(version: host.Version): void {
  describe(`Boltzmark in a Jupyter notebook, in VS Code’s own notebook editor (e2e, ${host.TITLES[version]})`, function () {
    this.timeout(120000);
    let s: Session;
    let page: Page;

    before(async function () {
      this.timeout(15 * 60 * 1000);
      s = await startSession({ name: 'notebook', version });
      page = s.page;
      // The notebook editor is chosen from the extensions' contributions: wait until they are read (our own view's
      // title shows then), or the file opens as JSON text.
      await page.locator('.pane-header', { hasText: /levels run log/i }).waitFor();
    });

    afterEach(async function () {
      if (this.currentTest?.state === 'failed' && page)
        await shot(page, `failed-nb-${this.currentTest.title.slice(0, 40).replace(/[^\w]+/g, '-')}`).catch(
          () => undefined,
        );
    });

    after(async () => {
      await s?.close();
    });

    it('shows the results table after the block in the rendered Markdown cell', async () => {
      await page.locator(`.explorer-folders-view .monaco-list-row[aria-label="${NOTEBOOK}"]`).dblclick();
      await page.locator('.tabs-container .tab.active', { hasText: NOTEBOOK }).waitFor();
      const frame = await frameWith(page, '.boltzmark-results', 'Xe cell run 2');
      const results = frame.locator('.boltzmark-results', { hasText: 'Xe cell run 2' });
      const text = clean(await results.innerText());
      // T = 1/β with β from P = 0.0842 of 129Xe (spin 1/2): the table's T is the core's, shown with its unit.
      assert.match(text, /normal/);
      assert.match(text, /T\s+7\.08 ± 0\.26 µK/);
      assert.match(text, /P\s+8\.42 ± 0\.31 %/);
    });

    it('gives the block in a cell an inlay hint and a hover, positioned in that cell', async () => {
      const frame = await frameWith(page, '.boltzmark-results', 'Xe cell run 2');
      // Double-clicking the rendered cell opens it for editing, as a user would.
      await frame.getByText('Spin-exchange run 2').dblclick();
      const cell = page.locator('.notebook-editor .monaco-editor', { hasText: 'system: 129Xe' });
      await cell.waitFor();
      // The hint sits on the cell's own fence line (line 5 of the cell, not of the notebook file).
      const fence = cell.locator('.view-line', { hasText: pattern('T = 7.08') });
      await fence.waitFor();
      assert.match(clean(await fence.innerText()), /```levels/, 'the hint is on the fence line of the cell');
      // The block's hover, over its id's value (a key's name may answer with the key's own documentation).
      const word = cell
        .locator('.view-line', { hasText: pattern('id: Xe cell run 2') })
        .locator('span', { hasText: pattern('Xe cell run 2', true) })
        .last();
      const hover = page
        .locator('.monaco-hover-content')
        .filter({ hasText: /Xe cell run 2/ })
        .first();
      for (let attempt = 0; attempt < 5; attempt++) {
        // The cell can still be scrolling into place or re-laid out by arriving hints: find the word each time.
        await word.waitFor();
        await word.scrollIntoViewIfNeeded();
        const box = await word.boundingBox();
        if (!box) continue;
        await page.mouse.move(box.x + 10, box.y + box.height * 6);
        await page.mouse.move(box.x + 10, box.y + box.height / 2, { steps: 4 });
        try {
          await hover.waitFor({ state: 'visible', timeout: 6000 });
          break;
        } catch {
          // The line can move when the hints arrive; move away and come back.
        }
      }
      const text = clean(await hover.innerText());
      assert.match(text, /7\.08 ± 0\.26 µK/);
      // The notebook's file is not read beside its open cells: its runs are not each other's copies.
      const all = clean((await page.locator('.monaco-hover-content').allInnerTexts()).join('\n'));
      assert.doesNotMatch(all, /also the id of a block/);
    });

    it('opens the curve view from the lens in a cell, and the view follows the cursor into another cell', async () => {
      const cell = page.locator('.notebook-editor .monaco-editor', { hasText: 'system: 129Xe' });
      // The hover of the step before may still be open over the lens: the pointer leaves it, and it closes.
      await page.mouse.move(1, 1);
      await page.locator('.monaco-hover').first().waitFor({ state: 'hidden' });
      await cell.locator('.codelens-decoration a', { hasText: 'Show Curve View' }).first().click();
      const view = await frameWith(page, 'body[data-drawn] #block-title', 'Xe cell run 2');
      // The next cell with a block: opened for editing, the cursor put on its id line.
      const other = page.locator('.notebook-editor .monaco-editor', { hasText: 'id: probe pair T2' });
      // The panel opening beside the notebook re-lays the cells out: a double-click anywhere in the rendered cell
      // opens it for editing, so its own heading is clicked where it stands, past the layout checks. A click that
      // lands while the cells are still moving opens nothing (and the output frame may be made anew): the
      // frame is found again and the double-click repeated until the cell's editor is there.
      for (let attempt = 1; ; attempt++) {
        const frame = await frameWith(page, '.boltzmark-results', 'probe pair T2');
        await frame.getByText('Tuesday: the probe transition').dblclick({ force: true });
        const opened = await other
          .waitFor({ timeout: 10000 })
          .then(() => true)
          .catch(() => false);
        if (opened) break;
        assert.ok(attempt < 4, 'the rendered cell opens for editing on a double-click');
      }
      await other.locator('.view-line', { hasText: pattern('id: probe pair T2') }).click();
      await view.locator('#block-title', { hasText: 'probe pair T2' }).waitFor();
    });

    it('shows in a rendered cell the results of a run that takes its thermal signal from another cell', async () => {
      // Invented data: a 13C thermal reference in one cell, a hyperpolarized run taking it by reference in another.
      const cell = (lines: string[]): object => ({ cell_type: 'markdown', metadata: {}, source: lines });
      const notebook = {
        cells: [
          cell([
            'Thermal reference, 256 scans.\n',
            '\n',
            '```levels\n',
            'id: pyr thermal Sat\n',
            'system: 13C\n',
            'field: 1.4 T\n',
            'lattice: 295 K\n',
            'signal:\n',
            '  thermal: 412 ± 9\n',
            '  scans: { thermal: 256 }\n',
            '```',
          ]),
          cell([
            'Dissolution 1, one scan.\n',
            '\n',
            '```levels\n',
            'id: pyr dissolution 1\n',
            'system: 13C\n',
            'field: 1.4 T\n',
            'signal:\n',
            '  hyperpolarized: 8.1e5 ± 2e3\n',
            '  thermal: { run: pyr thermal Sat }\n',
            '  scans: { hyperpolarized: 1 }\n',
            '```',
          ]),
        ],
        metadata: {},
        nbformat: 4,
        nbformat_minor: 5,
      };
      const file = join(s.workspace, REFERRING);
      writeFileSync(file, JSON.stringify(notebook, null, 1));
      try {
        // The whole width for the notebook, so that both cells are rendered (cells out of sight are not).
        await runCommand(page, 'View: Close All Editors');
        await page.locator(`.explorer-folders-view .monaco-list-row[aria-label="${REFERRING}"]`).dblclick();
        await page.locator('.tabs-container .tab.active', { hasText: REFERRING }).waitFor();
        await frameWith(page, '.boltzmark-results', 'pyr thermal Sat');
        const list = page.locator('.notebook-editor .monaco-list').first();
        const box = await list.boundingBox();
        if (box) {
          await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
          await page.mouse.wheel(0, 600);
        }
        const frame = await frameWith(page, '.boltzmark-results', 'pyr dissolution 1');
        const results = frame.locator('.boltzmark-results', { hasText: 'pyr dissolution 1' });
        // The webview reads no other cell: the extension makes the results with the run log's runs and sends them
        // (ε = 8.1e5 / (412/256) = 5.03 × 10⁵); the cell may show where its values come from until they come.
        await results
          .filter({ hasText: /503000 ± 11000/ })
          .waitFor({ timeout: 60000 })
          .catch(() => undefined);
        const text = clean(await results.innerText());
        assert.match(text, /ε\s+503000 ± 11000/);
        assert.match(text, /normal/);
        assert.doesNotMatch(text, /invalid/);
        assert.match(text, /P\s+61\.4 ± 1\.3 %/);
        await results.scrollIntoViewIfNeeded().catch(() => undefined);
        await shot(page, 'notebook-cell-by-reference');
      } finally {
        rmSync(file, { force: true });
      }
    });
  });
}

for (const version of host.versionsToTest()) notebookSteps(version);

import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { shot, startSession, type Session } from './session';
import { clean, goToLine, hoverText, line, lineOf, openFromExplorer } from './workbench';

const NOTE = 'polarizer-log.md';
const TEXT = readFileSync(join(host.ROOT, 'demo', NOTE), 'utf8');
const FENCE_CELL_B = lineOf(TEXT, 'id: cell-B run 1') - 1;

/** Command lines of this machine's processes that run the installed extension's Node.js server bundle. */
function nodeServers(installed: string): string[] {
  const out: string[] = [];
  for (const pid of readdirSync('/proc').filter((p) => /^\d+$/.test(p))) {
    try {
      const cmd = readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').join(' ');
      if (cmd.includes(join(installed, 'dist', 'server.js'))) out.push(cmd);
    } catch {
      // The process ended while the list was read.
    }
  }
  return out;
}

function webSteps(version: host.Version): void {
  describe(`Boltzmark in the browser’s web worker extension host (e2e, ${host.TITLES[version]})`, function () {
    this.timeout(120000);
    let s: Session;
    let page: Page;

    before(async function () {
      this.timeout(15 * 60 * 1000);
      // VS Code's `remote.extensionKind` setting runs the extension where there is no Node.js: in the page's web
      // worker extension host, from the manifest's `browser` entry, with its server in a worker of its own.
      s = await startSession({
        name: 'web-worker',
        version,
        settings: { 'remote.extensionKind': { 'boltzmark.boltzmark': ['web'] } },
      });
      page = s.page;
      // The workbench reads the extension kinds once, before the user's settings arrive from the server, so the
      // setting applies from the next load of the window, as after a user's "Reload Window".
      await page.locator('.pane-header', { hasText: /levels run log/i }).waitFor();
      await page.reload();
      await page.locator('.monaco-workbench').waitFor({ timeout: 90000 });
    });

    afterEach(async function () {
      if (this.currentTest?.state === 'failed' && page)
        await shot(page, `failed-web-${this.currentTest.title.slice(0, 40).replace(/[^\w]+/g, '-')}`).catch(
          () => undefined,
        );
    });

    after(async () => {
      await s?.close();
    });

    it('draws the inlay hints of the demo note with no Node.js server behind them', async () => {
      await openFromExplorer(page, NOTE, 'Polarizer log');
      await goToLine(page, FENCE_CELL_B);
      const fence = line(page, 'T = 5.61 mK · P = 31.2 % · ε = 241');
      await fence.waitFor({ timeout: 90000 });
      assert.ok(clean(await fence.innerText()).startsWith('```levels'));
      assert.deepEqual(nodeServers(s.installed), [], 'the desktop server bundle was started');
      await shot(page, 'web-worker-inlay-hints');
    });

    it('shows the hover of a block, answered by the server in its web worker', async () => {
      await goToLine(page, FENCE_CELL_B + 1);
      const text = await hoverText(page, 'id: cell-B run 1', 'cell-B', /cell-B run 1/);
      assert.match(text, /5\.61/);
      assert.deepEqual(nodeServers(s.installed), []);
    });
  });
}

for (const version of host.versionsToTest()) webSteps(version);

import { strict as assert } from 'node:assert';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { shot, startSession, type Session } from './session';
import { hpBlock, refBlock } from '../support/runNotes';
import {
  clean,
  editor,
  frameWith,
  goToLine,
  line,
  openFromExplorer,
  runCommand,
  waitNoProblem,
  waitProblems,
} from './workbench';

// Runs by reference in a real VS Code: three notes of a folder written into the session's workspace (invented
// numbers; the physics is tested in test/core/runs/physics.test.ts). The reference note is never opened
// before F12 leads to it.
const REF_NOTE = '# Thermal reference\n\n' + refBlock('e2e ref Monday');
const runNote = (id: string, ref: string): string => `# ${id}\n\n` + hpBlock(id, ref);

/** Puts the cursor into a word of a note's line (the first starting with `lineStart` that holds it). */
async function cursorOn(page: Page, noteText: string, lineStart: string, word: string): Promise<void> {
  const lines = noteText.split('\n');
  const index = lines.findIndex((l) => l.startsWith(lineStart) && l.includes(word));
  assert.ok(index >= 0, `a line starting "${lineStart}" holds "${word}"`);
  // Go to Line puts the cursor inside the word (1-based column), wherever late code lenses have moved the line.
  await goToLine(page, index + 1, lines[index]!.indexOf(word) + 2);
}

function runRefSteps(version: host.Version): void {
  describe(`Boltzmark runs by reference across notes (e2e, ${host.TITLES[version]})`, function () {
    this.timeout(120000);
    let s: Session;
    let page: Page;

    before(async function () {
      this.timeout(15 * 60 * 1000);
      s = await startSession({ name: 'runrefs', version });
      page = s.page;
      const dir = join(s.workspace, 'day');
      mkdirSync(dir, { recursive: true });
      writeFileSync(join(dir, 'reference.md'), REF_NOTE);
      writeFileSync(join(dir, 'run-1.md'), runNote('e2e run 1', 'reference.md#e2e ref Monday'));
      writeFileSync(join(dir, 'run-2.md'), runNote('e2e run 2', 'e2e ref Monday'));
      await page.locator('.pane-header', { hasText: /levels run log/i }).waitFor();
      // The folder appears in the Explorer once the file watcher saw it.
      const folder = page.locator('.explorer-folders-view .monaco-list-row[aria-label="day"]');
      await folder.waitFor({ timeout: 60000 });
      await folder.click();
    });

    afterEach(async function () {
      if (this.currentTest?.state === 'failed' && page)
        await shot(page, `failed-refs-${this.currentTest.title.slice(0, 40).replace(/[^\w]+/g, '-')}`).catch(
          () => undefined,
        );
    });

    after(async () => {
      await s?.close();
    });

    it('goes to the referenced run in another note (Go to Definition, F12)', async () => {
      await openFromExplorer(page, 'run-1.md', '# e2e run 1');
      // The server answers for the note (its hint on the fence, from the referenced run's numbers): the
      // definition provider is there.
      await line(page, 'T = 3.06').waitFor({ timeout: 90000 });
      await cursorOn(page, runNote('e2e run 1', 'reference.md#e2e ref Monday'), '  thermal: { run: ', 'Monday');
      // F12's own command (the browser keeps the F12 key for its developer tools).
      await runCommand(page, 'Go to Definition');
      await page.locator('.tabs-container .tab.active', { hasText: 'reference.md' }).waitFor();
      // The cursor stands on the id line of the reference block (line 3 of its note).
      await editor(page).locator('.line-numbers.active-line-number', { hasText: /^4$/ }).waitFor();
      assert.match(clean(await line(page, 'id: ').innerText()), /id: e2e ref Monday/);
    });

    it('finds the references to the run in both notes', async () => {
      await cursorOn(page, REF_NOTE, 'id: ', 'Monday');
      // Shift+F12's own command.
      await runCommand(page, 'Go to References');
      const peek = page.locator('.zone-widget .ref-tree');
      await peek.waitFor();
      // The peek's tree names each note with its references.
      for (const name of ['run-1.md', 'run-2.md'])
        await page.locator('.zone-widget .ref-tree .monaco-list-row', { hasText: name }).first().waitFor();
      await page.keyboard.press('Escape');
    });

    it('renames the run and every reference, after the preview is accepted', async () => {
      await cursorOn(page, REF_NOTE, 'id: ', 'Monday');
      await page.keyboard.press('F2');
      const input = page.locator('.rename-box input, .rename-box .rename-input').first();
      await input.waitFor();
      await input.fill('e2e ref Mon 12 Apr');
      // Ctrl+Enter shows the edit in the refactor preview, to accept or discard.
      await page.keyboard.press('Control+Enter');
      const apply = page.locator('.monaco-button', { hasText: /^Apply$/ }).first();
      await apply.waitFor({ timeout: 30000 });
      // Nothing changed before the preview is accepted.
      assert.match(clean(await line(page, 'id: ').innerText()), /id: e2e ref Monday$/);
      await apply.click();
      await line(page, 'id: e2e ref Mon 12 Apr').waitFor();
      await openFromExplorer(page, 'run-2.md', '# e2e run 2');
      await line(page, 'thermal: { run: e2e ref Mon 12 Apr }').waitFor();
      await openFromExplorer(page, 'run-1.md', '# e2e run 1');
      await line(page, 'thermal: { run: reference.md#e2e ref Mon 12 Apr }').waitFor();
    });

    it('shows an error in a referring note when the referenced block breaks', async () => {
      await openFromExplorer(page, 'reference.md', '# Thermal reference');
      // The thermal signal replaced by a word: the reference block has an error, and so has each run using it.
      await cursorOn(page, REF_NOTE, '  thermal: ', '1.08e3');
      await page.keyboard.press('End');
      for (let i = 0; i < '1.08e3'.length; i++) await page.keyboard.press('Backspace');
      await page.keyboard.type('lots');
      await runCommand(page, 'View: Focus Problems (Errors, Warnings, Infos)');
      await waitProblems(page, [['reference-invalid', 'cannot be used', 'number-invalid']]);
      await cursorOn(page, REF_NOTE.replace('1.08e3', 'lots'), '  thermal: ', 'lots');
      await page.keyboard.press('End');
      for (let i = 0; i < 'lots'.length; i++) await page.keyboard.press('Backspace');
      await page.keyboard.type('1.08e3');
      await waitNoProblem(page, 'reference-invalid');
    });

    it('shows the referenced values in the Markdown preview of a referring note', async () => {
      await openFromExplorer(page, 'run-2.md', '# e2e run 2');
      await runCommand(page, 'Markdown: Open Preview to the Side');
      // The preview follows the reference through the run log's notes, and is refreshed (a new frame) once they
      // are read: the frame sought is the one whose table names the referenced run.
      const preview = await frameWith(page, '.boltzmark-results', 'thermal reference');
      const table = preview.locator('.boltzmark-results', { hasText: /thermal reference/i });
      const text = clean(await table.innerText());
      assert.match(text, /e2e ref Mon 12 Apr/);
      assert.match(text, /normal/);
      assert.doesNotMatch(text, /reference-unavailable|invalid/);
      await shot(page, 'refs-markdown-preview');
    });
  });
}

for (const version of host.versionsToTest()) runRefSteps(version);

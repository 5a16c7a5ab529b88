import { strict as assert } from 'node:assert';
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { curveExportSteps } from './curveExports.steps';
import { runLogSteps } from './runLog.steps';
import { spectraSteps } from './spectra.steps';
import { noteBytes, shot, startSession, type Session } from './session';
import {
  activeTabDirty,
  canvasInk,
  clean,
  dismissHover,
  focusEditor,
  frameWith,
  goToLine,
  hintPlacement,
  hoverText,
  clickLensAbove,
  line,
  lineOf,
  openFromExplorer,
  outlineLabels,
  problemRows,
  runCommand,
  squiggledText,
  suggestions,
  waitClean,
  waitProblems,
  waitSquiggles,
} from './workbench';

// The demo note every step works on, and where its blocks are (read from the
// committed file, so the steps follow the demo if it is edited).
const NOTE = 'polarizer-log.md';
const TEXT = readFileSync(join(host.ROOT, 'demo', NOTE), 'utf8');
const FENCE_CELL_B = lineOf(TEXT, 'id: cell-B run 1') - 1;
const LI_ID = lineOf(TEXT, 'id: Li inversion W-3');
const SYSTEM_C13 = lineOf(TEXT, 'system: C13');
const FIELD_MT = lineOf(TEXT, 'field: 7.05 MT');
const LATTICE_THURSDAY = lineOf(TEXT, 'lattice: 1.4 K', SYSTEM_C13);
const POLARISATION = lineOf(TEXT, 'polarisation: 0.28');
/** 1-based column of `word` on a 1-based line. */
const col = (lineNumber: number, word: string): number => TEXT.split('\n')[lineNumber - 1].indexOf(word) + 1;

// The same steps in each host under test: the oldest VS Code the manifest
// accepts and the newest (BOLTZMARK_VSCODE picks one; both by default).
for (const version of host.versionsToTest()) editorSteps(version);

function editorSteps(version: host.Version): void {
  describe(`Boltzmark in ${host.TITLES[version]}, browser-hosted (e2e)`, function () {
    // Generous limits for a loaded 2-core machine; every wait inside is on a DOM state.
    this.timeout(120000);
    let s: Session;
    let page: Page;

    before(async function () {
      // A fresh machine installs the host here (about two minutes); afterwards this takes seconds.
      this.timeout(15 * 60 * 1000);
      s = await startSession({ name: 'editor', version });
      page = s.page;
    });

    afterEach(async function () {
      // What the page looked like when a step failed.
      if (this.currentTest?.state === 'failed' && page)
        await shot(page, `failed-${this.currentTest.title.slice(0, 40).replace(/[^\w]+/g, '-')}`).catch(
          () => undefined,
        );
    });

    after(async () => {
      await s?.close();
    });

    it('installs the packaged .vsix as a user would, without sources or tests', () => {
      const files = readdirSync(s.installed, { recursive: true }).map(String);
      for (const f of ['package.json', 'dist/extension.js', 'dist/server.js', 'docs/format.md'])
        assert.ok(files.includes(f), `${f} is missing from the installed extension`);
      const stray = files.filter((f) => /^(src|test|node_modules|scripts)(\/|$)|\.ts$|\.map$/.test(f));
      assert.deepEqual(stray, [], 'the installed extension carries development files');
      assert.ok(!existsSync(join(s.installed, 'dist', 'cli.js')));
    });

    it('activates on the demo note and draws inlay hints after each block’s first line', async () => {
      await openFromExplorer(page, NOTE, 'Polarizer log');
      await goToLine(page, FENCE_CELL_B);
      // The block's results hint sits on the opening fence line, after "```levels".
      const fence = line(page, 'T = 5.61 mK · P = 31.2 % · ε = 241');
      await fence.waitFor({ timeout: 90000 });
      assert.ok(
        clean(await fence.innerText()).startsWith('```levels'),
        'the results hint is on the opening fence line',
      );
      const { hint, text } = await hintPlacement(fence, 'T = 5.61 mK', 'levels');
      assert.ok(
        hint.x >= text.x + text.width - 1,
        `the hint (x=${hint.x}) starts after the fence text (ends at ${text.x + text.width})`,
      );
      assert.ok(Math.abs(hint.y - text.y) < text.height, `the hint (y=${hint.y}) is on the fence line (y=${text.y})`);
      // Hints are decorations: the note's text is still "```levels" alone on that line.
      assert.equal(clean(TEXT.split('\n')[FENCE_CELL_B - 1]), '```levels');
      await shot(page, '02-inlay-hints');
    });

    it('shows the curve button in the editor title on a note with blocks, and not on one without', async () => {
      // The button's title is the command's, from package.nls.json; `when` gates it on boltzmark.noteHasBlocks.
      const nls = JSON.parse(readFileSync(join(host.ROOT, 'package.nls.json'), 'utf8')) as Record<string, string>;
      const title = nls['boltzmark.showCurve.title'];
      const button = page.locator(
        `.editor-group-container.active .editor-actions .action-label[aria-label="${title}"]`,
      );
      await button.waitFor({ state: 'visible' });
      await shot(page, '02b-title-button');
      // demo/README.md is Markdown without a `levels` block.
      await openFromExplorer(page, 'README.md', 'Demo notebook (invented)');
      // Whatever happens, the README is closed again, so that the later steps find the demo note active.
      const hidden = await button
        .waitFor({ state: 'detached', timeout: 20000 })
        .then(() => true)
        .catch(() => false);
      await runCommand(page, 'View: Close Editor');
      await page.locator('.tabs-container .tab.active', { hasText: NOTE }).waitFor();
      assert.ok(hidden, 'the curve button is not shown on a note without a levels block');
      await button.waitFor({ state: 'visible' });
    });

    it('lists the demo’s deliberate mistakes in the Problems panel with their codes and positions', async () => {
      await runCommand(page, 'View: Focus Problems (Errors, Warnings, Infos)');
      await waitProblems(page, [
        ['isotope-unknown', `[Ln ${SYSTEM_C13}, Col ${col(SYSTEM_C13, 'C13')}]`],
        ['unit-case', `[Ln ${FIELD_MT}, Col ${col(FIELD_MT, 'MT')}]`],
        ['key-unknown', `[Ln ${POLARISATION}, Col ${col(POLARISATION, 'polarisation')}]`],
      ]);
      const rows = await problemRows(page);
      const markers = rows.filter((r) => /\[Ln \d+, Col \d+\]/.test(r));
      assert.ok(markers.length >= 3, `problem rows: ${JSON.stringify(rows)}`);
      for (const m of markers)
        assert.match(
          m,
          /boltzmark\(?[a-z]+(-[a-z]+)+\)?\s*\[Ln/,
          `every problem comes from Boltzmark with a code: ${m}`,
        );
      await shot(page, '03-problems');
    });

    it('puts the squiggles on the misspelt isotope, the wrong-case unit and the unknown key', async () => {
      await goToLine(page, FIELD_MT);
      await waitSquiggles(page, 'error', 2);
      await waitSquiggles(page, 'warning', 1);
      const errors = await squiggledText(page, 'error');
      const warnings = await squiggledText(page, 'warning');
      assert.ok(errors.includes('C13'), `an error squiggle under "C13"; squiggled: ${JSON.stringify(errors)}`);
      assert.ok(errors.includes('MT'), `an error squiggle under "MT"; squiggled: ${JSON.stringify(errors)}`);
      assert.ok(
        warnings.includes('polarisation'),
        `a warning squiggle under "polarisation"; squiggled: ${JSON.stringify(warnings)}`,
      );
      await shot(page, '04-squiggles');
    });

    it('shows T, β, P and the status when hovering a block', async () => {
      await goToLine(page, FENCE_CELL_B + 1);
      const text = await hoverText(page, 'id: cell-B run 1', 'cell-B', /cell-B run 1/);
      assert.match(text, /normal: positive spin temperature/);
      assert.match(text, /T\s+5\.61 ± 0\.19 mK/);
      assert.match(text, /β\s+178\.2 ± 6\.1/);
      assert.match(text, /P\s+31\.2 ± 1\.0 %/);
      assert.match(text, /ε = P\/P_th\s+241/);
      await shot(page, '05-hover-block');
      await dismissHover(page);
    });

    it('says "inverted" when hovering an inverted block', async () => {
      await goToLine(page, LI_ID);
      const text = await hoverText(page, 'id: Li inversion W-3', 'Li', /Li inversion W-3/);
      assert.match(text, /inverted: more population per degeneracy above, a negative spin temperature/);
      assert.match(text, /T\s+−19\.18 ± 0\.18 mK/);
      await shot(page, '06-hover-inverted');
      await dismissHover(page);
    });

    it('corrects a wrong-case unit with a quick fix, and Undo restores the text', async () => {
      await goToLine(page, FIELD_MT, col(FIELD_MT, 'MT'));
      await page.keyboard.press('Control+.');
      const fix = page.locator('.action-widget .monaco-list-row', { hasText: 'mT' }).first();
      await fix.waitFor();
      // The menu opens with the preferred fix focused (VS Code 1.139 lists its chat's "Fix" and "Explain" after it).
      // Enter applies it (a click is caught by the menu's pointer block), but only once the menu holds the keyboard
      // focus: before that, Enter reaches the editor and splits the line.
      await page.locator('.action-widget .monaco-list:focus-within').waitFor();
      await shot(page, '07-quick-fix');
      assert.match((await fix.getAttribute('class')) ?? '', /\bfocused\b/, 'the fix is the focused entry');
      await page.keyboard.press('Enter');
      await line(page, 'field: 7.05 mT', true).waitFor();
      assert.ok(await activeTabDirty(page), 'the fix edits the note (unsaved)');
      await focusEditor(page);
      await page.keyboard.press('Control+z');
      await line(page, 'field: 7.05 MT', true).waitFor();
      await waitClean(page);
    });

    it('offers isotopes after "system: " and units after a number', async () => {
      // A new line at the end of the Thursday block; the space typed after the colon triggers completion.
      await goToLine(page, LATTICE_THURSDAY);
      await page.keyboard.press('End');
      await page.keyboard.press('Enter');
      await page.keyboard.type('system: ');
      const isotopes = await suggestions(page);
      for (const want of ['1H', '13C', '7Li'])
        assert.ok(isotopes.includes(want), `isotope ${want} offered; got ${JSON.stringify(isotopes)}`);
      await shot(page, '08-complete-isotopes');
      await page.keyboard.press('Escape');
      await page.locator('.editor-widget.suggest-widget').waitFor({ state: 'hidden' });
      await page.keyboard.press('Enter');
      await page.keyboard.type('field: 9.4 ');
      const units = await suggestions(page);
      for (const want of ['T', 'mT', 'G'])
        assert.ok(units.includes(want), `unit ${want} offered; got ${JSON.stringify(units)}`);
      await shot(page, '09-complete-units');
      await page.keyboard.press('Escape');
      await runCommand(page, 'File: Revert File');
      await waitClean(page);
      await line(page, 'field: 7.05 MT', true).waitFor();
    });

    it('lists the blocks by id in the Outline', async () => {
      await runCommand(page, 'Explorer: Focus on Outline View');
      const ids = [...TEXT.matchAll(/^id: (.+)$/gm)].map((m) => m[1]);
      const labels = await outlineLabels(page);
      for (const id of ids)
        assert.ok(
          labels.some((l) => l.startsWith(id)),
          `the Outline lists "${id}"; its rows: ${JSON.stringify(labels)}`,
        );
      await shot(page, '10-outline');
    });

    it('opens the curve view from the code lens; its canvas is drawn and it follows the cursor', async () => {
      await goToLine(page, FENCE_CELL_B + 1);
      // The view's page marks its state and counts its draws on <body> (media/src/view.ts).
      const view = await clickLensAbove(page, 'id: cell-B run 1', 'Show Curve View', (ms) =>
        frameWith(page, 'body[data-drawn] #block-title', undefined, ms),
      );
      await view.locator('#block-title', { hasText: 'cell-B run 1' }).waitFor();
      await view.locator('body[data-state="chart"]:not([data-drawn="0"])').waitFor();
      const facts = clean(await view.locator('#facts').innerText());
      assert.match(facts, /T = 5\.61 ± 0\.19 mK/);
      for (const canvas of ['#entropy-chart', '#beta-chart']) {
        const ink = await canvasInk(view, canvas);
        assert.ok(
          ink.painted > ink.total * 0.002 && ink.colours >= 2,
          `${canvas} shows a drawn curve: ${JSON.stringify(ink)}`,
        );
      }
      await shot(page, '11-curve-view');
      // Moving the cursor into another block redraws the view for that block.
      const draws = Number(await view.locator('body').getAttribute('data-drawn'));
      await goToLine(page, LI_ID);
      await view.locator('#block-title', { hasText: 'Li inversion W-3' }).waitFor();
      await view.locator(`body[data-state="chart"]:not([data-drawn="${draws}"])`).waitFor();
      assert.match(clean(await view.locator('#block-status').innerText()), /inverted/);
      await shot(page, '12-curve-view-follows');
    });

    // The view now shows the ⁷Li block: pin it, move on to cell-B, export, unpin (curveExports.steps.ts).
    curveExportSteps(() => s, {
      note: NOTE,
      text: TEXT,
      pinned: 'Li inversion W-3',
      shown: { id: 'cell-B run 1', line: FENCE_CELL_B + 1 },
    });

    it('shows each block’s results table in the Markdown preview', async () => {
      await focusEditor(page);
      await runCommand(page, 'Markdown: Open Preview to the Side');
      const preview = await frameWith(page, '.boltzmark-results', 'cell-B run 1');
      const tables = preview.locator('.boltzmark-results');
      const ids = [...TEXT.matchAll(/^id: (.+)$/gm)].map((m) => m[1]);
      assert.equal(await tables.count(), ids.length, 'one results table per block');
      const cellB = clean(await tables.filter({ hasText: 'cell-B run 1' }).innerText());
      assert.match(cellB, /normal/);
      assert.match(cellB, /T\s+5\.61 ± 0\.19 mK/);
      assert.match(cellB, /P\s+31\.2 ± 1\.0 %/);
      const hurried = clean(await tables.filter({ hasText: 'Thursday quick look' }).innerText());
      assert.match(hurried, /invalid/);
      await tables.filter({ hasText: 'cell-B run 1' }).scrollIntoViewIfNeeded();
      await shot(page, '13-markdown-preview');
    });

    // The run log in the Explorer, over every demo note (runLog.steps.ts).
    runLogSteps(() => s);

    // Spectrum references on the demo's spectra note (spectra.steps.ts).
    spectraSteps(() => s);

    it('leaves the notes’ bytes on disk unchanged and sends nothing beyond 127.0.0.1', () => {
      // Every file of the demo, those in its folders (the spectra) too.
      const notes = readdirSync(join(host.ROOT, 'demo'), { recursive: true })
        .map(String)
        .filter((f) => statSync(join(host.ROOT, 'demo', f)).isFile());
      assert.ok(notes.includes(NOTE));
      for (const name of notes) {
        const { original, now } = noteBytes(s, name);
        assert.ok(original.equals(now), `the demo note ${name} on disk was changed by the session`);
      }
      assert.deepEqual(
        readdirSync(s.workspace)
          .filter((f) => f.endsWith('.md'))
          .sort(),
        notes.filter((f) => f.endsWith('.md')).sort(),
        'no note was added or left behind',
      );
      assert.deepEqual(s.external, [], 'requests beyond 127.0.0.1');
    });
  });
}

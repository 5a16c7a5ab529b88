/**
 * e2e steps of the run log tree in the Explorer, registered into the editor
 * suite's `describe`. What the tree should hold is worked out here from the
 * committed demo notes: the block ids straight from their text, status and T
 * from the core's run log model, so the steps follow the demo when it changes.
 */
import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { measuredTemperatureText, RunLog, SpectrumShelf, STATUSES, type RunEntry, type Status } from '../../src/core';
import { noteSpectra } from '../../src/cli/spectra';
import { notification, pickMany, saveDialog } from './dialogs';
import { csvRecords, parseCsv, waitForFile } from './files';
import { scratchFolder, shot, type Session } from './session';
import { editor, line, runCommand } from './workbench';
import { expandPane, paneAction, treeRow, waitTreeRows, type TreeRow } from './views';

const NLS = JSON.parse(readFileSync(join(host.ROOT, 'package.nls.json'), 'utf8')) as Record<string, string>;
const VIEW = NLS['boltzmark.runLog.name']!;
const FILTER = NLS['boltzmark.runLog.filter.title']!;
const EXPORT = NLS['boltzmark.runLog.exportCsv.title']!;
const DEMO = join(host.ROOT, 'demo');
const NOTES = readdirSync(DEMO)
  .filter((f) => f.endsWith('.md') || f.endsWith('.ipynb'))
  .sort();
const TEXTS = new Map(NOTES.map((f) => [f, readFileSync(join(DEMO, f), 'utf8')]));
/** A note the steps add to the served folder and delete again (not in demo/). */
const ADDED = 'e2e-added-note.md';

/** The ids of a note's `levels` blocks, read from its text by line (not by the core's reader). */
function fencedIds(text: string): string[] {
  const ids: string[] = [];
  let inside = false;
  // A notebook's text is its JSON: its Markdown cells, read here with JSON.parse (not by the core's reader).
  const markdown = text.trimStart().startsWith('{')
    ? (JSON.parse(text) as { cells: { cell_type: string; source: string | string[] }[] }).cells
        .filter((c) => c.cell_type === 'markdown')
        .map((c) => (Array.isArray(c.source) ? c.source.join('') : c.source))
        .join('\n')
    : text;
  for (const l of markdown.split('\n')) {
    if (!inside && /^```levels\s*$/.test(l)) inside = true;
    else if (inside && /^```\s*$/.test(l)) inside = false;
    else if (inside && l.startsWith('id: ')) ids.push(l.slice(4).trim());
  }
  return ids;
}

/** The core's run log of notes named as the view names them in a one-folder workspace: the path inside the folder. */
function coreLog(texts: ReadonlyMap<string, string>): RunLog {
  const log = new RunLog();
  // Spectrum references read from the committed demo's files, as the extension's run log reads the served copy.
  const shelf = new SpectrumShelf();
  for (const [file, text] of texts) log.update(file, file, text, noteSpectra(shelf, join(DEMO, file), DEMO));
  return log;
}

/** The rows the tree should draw: one per note holding runs ("N runs"), then one per run ("status · T · date"). */
function expectedRows(log: RunLog, statuses: readonly Status[] | null = null): TreeRow[] {
  const run = (e: RunEntry): TreeRow => ({
    level: 2,
    label:
      e.id ?? (e.cell === null ? `block at line ${e.line + 1}` : `block at cell ${e.cell + 1}, line ${e.line + 1}`),
    description: [e.status, e.temperature ? measuredTemperatureText(e.temperature) : '', e.date ?? '']
      .filter((x) => x !== '')
      .join(' · '),
  });
  return log
    .groups('file', statuses)
    .flatMap((g) => [
      { level: 1, label: g.label, description: `${g.entries.length} run${g.entries.length === 1 ? '' : 's'}` },
      ...g.entries.map(run),
    ]);
}

/** Registers the steps; `session` gives the suite's session once its `before` ran. */
export function runLogSteps(session: () => Session): void {
  let section: Locator;
  const all = (): RunLog => coreLog(TEXTS);

  it(`lists every block of every demo note in the Explorer’s "${VIEW}", grouped by note, with status and T`, async () => {
    const { page } = session();
    section = await expandPane(page, VIEW);
    const want = expectedRows(all());
    const rows = await waitTreeRows(page, section, want);
    assert.deepEqual(rows, want);
    // The same blocks as the notes' text says, note by note, in order.
    const groups = rows.filter((r) => r.level === 1).map((r) => r.label);
    assert.deepEqual(
      groups,
      NOTES.filter((f) => fencedIds(TEXTS.get(f)!).length > 0),
    );
    const byNote = new Map<string, string[]>();
    let group = '';
    for (const r of rows) {
      if (r.level === 1) byNote.set((group = r.label), []);
      else byNote.get(group)?.push(r.label);
    }
    for (const f of NOTES)
      assert.deepEqual(byNote.get(f) ?? [], fencedIds(TEXTS.get(f)!), `the runs listed under ${f}`);
    // Temperatures as the hovers show them: GUM rounding with an uncertainty, an SI prefix, a true minus sign.
    assert.ok(
      rows.some((r) => / · T = [\d.]+ ± [\d.]+ mK/.test(r.description)),
      'runs with a temperature show it with its uncertainty',
    );
    assert.ok(
      rows.some((r) => / · T = −[\d.]+/.test(r.description)),
      'an inverted run shows a negative temperature',
    );
    await shot(page, '20-run-log');
  });

  it('filters the run log to the inverted runs with the filter button', async () => {
    const { page } = session();
    const want = expectedRows(all(), ['inverted']);
    assert.ok(
      want.some((r) => r.level === 2) && want.length < expectedRows(all()).length,
      'the demo has inverted and other runs',
    );
    await paneAction(section, FILTER);
    const offered = await pickMany(page, ['inverted']);
    assert.deepEqual(offered, [...STATUSES], 'the filter offers every status');
    await section.locator('.pane-header', { hasText: 'inverted' }).waitFor();
    const rows = await waitTreeRows(page, section, want);
    assert.deepEqual(rows, want);
    for (const r of rows.filter((x) => x.level === 2)) assert.match(r.description, /^inverted · /);
    await shot(page, '21-run-log-inverted');
  });

  it('opens the note at the block when a run is clicked', async () => {
    const { page } = session();
    // A run in a note that is not open yet, the lowest in its note, so the editor must open and scroll.
    const entries = all()
      .entries(['inverted'])
      .filter((e) => e.name !== 'polarizer-log.md');
    assert.ok(entries.length > 0, 'an inverted run outside the note the earlier steps opened');
    const target = entries.reduce((a, b) => (b.line > a.line ? b : a));
    const file = target.name;
    // The note opens in the active editor group: make it the first one (the curve view and preview are beside it).
    await runCommand(page, 'View: Focus First Editor Group');
    await treeRow(section, target.id!, 2).click();
    await page.locator('.editor-group-container.active .tabs-container .tab.active', { hasText: file }).waitFor();
    await editor(page)
      .locator('.line-numbers.active-line-number', { hasText: new RegExp(`^${target.line + 1}$`) })
      .waitFor();
    await line(page, `id: ${target.id}`).waitFor();
    const fence = TEXTS.get(file)!.split('\n')[target.line]!;
    assert.match(fence, /^```levels/, 'the cursor is on the block’s opening fence');
    await shot(page, '22-run-log-opens-note');
  });

  it('exports the run log as CSV through its button and the save dialog', async () => {
    const { page } = session();
    const log = all();
    await paneAction(section, FILTER);
    await pickMany(page, [...STATUSES]);
    const rows = await waitTreeRows(page, section, expectedRows(log));
    assert.deepEqual(rows, expectedRows(log), 'every run is back');
    const file = join(scratchFolder(session()), 'runs.csv');
    await paneAction(section, EXPORT);
    const offered = await saveDialog(page, file);
    assert.equal(offered, join(session().workspace, 'levels-runs.csv'));
    await notification(page, 'run log written to');
    const records = csvRecords(
      parseCsv((await waitForFile(file, (b) => b.toString('utf8').endsWith('\r\n'))).toString('utf8')),
    );
    assert.deepEqual(Object.keys(records[0] ?? {}), [
      'note',
      'line',
      'id',
      'date',
      'status',
      'temperature_K',
      'temperature_uncertainty_K',
      'beta_per_K',
      'beta_uncertainty_per_K',
      'polarization',
      'polarization_uncertainty',
      'temperature_low_95_K',
      'temperature_high_95_K',
      'beta_low_95_per_K',
      'beta_high_95_per_K',
      'polarization_low_95',
      'polarization_high_95',
      'cell',
    ]);
    const entries = log.entries();
    assert.equal(records.length, entries.length, 'one row per run');
    for (const e of entries) {
      // A notebook's runs are told apart by their cell as well (1-based; empty for a Markdown note).
      const cell = e.cell === null ? '' : String(e.cell + 1);
      const r = records.find((x) => x.note === e.name && Number(x.line) === e.line + 1 && x.cell === cell);
      assert.ok(r, `a row for ${e.name}:${e.line + 1}${cell ? ` in cell ${cell}` : ''}`);
      assert.equal(r.id, e.id ?? '');
      assert.equal(r.status, e.status, `the status of ${e.id}`);
      if (e.temperature)
        assert.ok(
          Math.abs(Number(r.temperature_K) - e.temperature.value) <= 1e-12 * Math.abs(e.temperature.value),
          `T of ${e.id}: ${r.temperature_K}`,
        );
      else assert.equal(r.temperature_K, '');
      // The k = 2 interval's ends (T's is the image of β ± 2u(β)), empty without an uncertainty. Compared to 1e-12,
      // as T is: the extension host of the newest VS Code runs another engine, whose Math functions may differ from
      // this process's in the last bit.
      const low = e.temperatureInterval?.[0];
      if (low === undefined || low === null) assert.equal(r.temperature_low_95_K, '');
      else
        assert.ok(
          Math.abs(Number(r.temperature_low_95_K) - low) <= 1e-12 * Math.abs(low),
          `T's interval of ${e.id}: ${r.temperature_low_95_K} against ${low}`,
        );
    }
    await shot(page, '23-run-log-csv');
  });

  it('follows notes on disk: a new note’s run appears, and goes when the note is deleted', async () => {
    const { page } = session();
    // One block copied from a demo note under a new id, so its results are known.
    const source = TEXTS.get('polarizer-log.md')!;
    const body = /^```levels\nid: cell-B run 1\n([\s\S]*?)^```$/m.exec(source);
    assert.ok(body, 'the demo note has the block the new note copies');
    const text = `# Added by the e2e test\n\n\`\`\`levels\nid: e2e added run\n${body[1]}\`\`\`\n`;
    const file = join(session().workspace, ADDED);
    writeFileSync(file, text);
    try {
      const added = expectedRows(coreLog(new Map([...TEXTS, [ADDED, text]])));
      assert.equal(added[0]!.label, ADDED, 'the new note sorts first');
      // Sorted first, its row appears at the top, where the list is scrolled.
      await treeRow(section, added[0]!.label, 1).waitFor();
      assert.deepEqual(await waitTreeRows(page, section, added), added);
      await shot(page, '24-run-log-added-note');
    } finally {
      // Gone even when the step fails, so the last step still judges the demo notes alone.
      rmSync(file, { force: true });
    }
    await treeRow(section, ADDED, 1).waitFor({ state: 'detached' });
    const rows = await waitTreeRows(page, section, expectedRows(all()));
    assert.deepEqual(rows, expectedRows(all()), 'the deleted note’s run is gone');
    assert.ok((await treeRow(section, 'e2e added run', 2).count()) === 0);
  });
}

import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { diskNotes } from '../../../src/server/runs/diskNotes';
import { Analyzer, LineIndex, resolveNotePath } from '../../../src/core';
import {
  badRunId,
  runDefinition,
  runHover,
  runPrepareRename,
  runRename,
  runSymbolAt,
  runSymbols,
} from '../../../src/server/features/runRefs';
import { ClosedReferrers } from '../../../src/server/runs/closedReferrers';
import { fileUri, WorkspaceRuns, type NoteFiles } from '../../../src/server/runs/workspaceRuns';
import type { NoteState } from '../../../src/server/state';

// Invented notes: only the index's bookkeeping is checked here (the LSP side is in test/protocol/runRefs.test.ts).
const fence = (body: string): string => '```levels\n' + body + '\n```\n';
const note = (id: string): string => fence(`id: ${id}\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2`);

/** A folder of notes in memory, as the server's disk reader would give them. */
function memoryFiles(files: Map<string, string>): NoteFiles {
  return {
    list: (folder) => Promise.resolve([...files.keys()].filter((u) => u.startsWith(folder + '/'))),
    read: (uri) => Promise.resolve(files.get(uri) ?? null),
    readNow: (uri) => files.get(uri) ?? null,
  };
}

describe('the workspace index of runs', () => {
  const folder = 'file:///lab';
  const a = 'file:///lab/a.md';
  const b = 'file:///lab/sub/b.md';

  it('reads every note of the folders, lets an open note win, and goes back to the file when it is closed', async () => {
    const files = new Map([
      [a, note('run a')],
      [b, note('run b')],
    ]);
    const changed: string[][] = [];
    const runs = new WorkspaceRuns((n) => changed.push([...n]), memoryFiles(files));
    await runs.setFolders([folder]);
    assert.deepEqual(
      runs.book
        .runs()
        .map((x) => x.id)
        .sort(),
      ['run a', 'run b'],
    );
    runs.edited(a, note('run a edited'));
    // A file event for an open note does not replace its unsaved text.
    files.set(a, note('run a on disk'));
    await runs.fileEvent(a, 'changed');
    assert.equal(runs.book.blocksOf(a)[0]!.id, 'run a edited');
    await runs.closed(a);
    assert.equal(runs.book.blocksOf(a)[0]!.id, 'run a on disk');
    // A deleted folder takes its notes with it.
    files.delete(b);
    await runs.fileEvent('file:///lab/sub', 'deleted');
    assert.equal(runs.book.hasNote(b), false);
    assert.ok(changed.some((c) => c.includes(b)));
  });

  it('reads nothing outside the workspace folders, and nothing without a file reader', async () => {
    const files = new Map([['file:///elsewhere/x.md', note('far')]]);
    const runs = new WorkspaceRuns(() => undefined, memoryFiles(files));
    await runs.setFolders([folder]);
    await runs.fileEvent('file:///elsewhere/x.md', 'created');
    assert.equal(runs.book.hasNote('file:///elsewhere/x.md'), false);
    const none = new WorkspaceRuns(() => undefined, null);
    await none.setFolders([folder]);
    assert.deepEqual(none.book.noteNames(), []);
  });

  it('spells a file URI as a reference resolved from a note of the folder does', () => {
    const from = fileUri('/lab notes/day 1/run #1.md');
    assert.equal(from, 'file:///lab%20notes/day%201/run%20%231.md');
    assert.equal(resolveNotePath(from, '../refs/mon (12).md'), fileUri('/lab notes/refs/mon (12).md'));
    assert.equal(fileUri('C:\\lab\\a.md'), 'file:///c%3A/lab/a.md');
  });
});

describe('runs in Jupyter notebooks', () => {
  // A notebook as nbformat 4 writes it (one JSON string per source line, indent 1): a code cell, then a Markdown cell
  // with the thermal reference of the day. Invented data.
  const cells = [
    { cell_type: 'code', metadata: {}, source: ['x = 1  # "```levels" in code is not read\n'], outputs: [] },
    {
      cell_type: 'markdown',
      metadata: {},
      source: [
        '## Reference, 2026-03-16\n',
        '\n',
        '```levels\n',
        'id: nb-ref Mon\n',
        'system: 13C\n',
        'field: 3 T\n',
        'lattice: 298 K\n',
        'signal:\n',
        '  thermal: 1.08e3\n',
        '```',
      ],
    },
  ];
  const raw = JSON.stringify({ cells, metadata: {}, nbformat: 4, nbformat_minor: 5 }, null, 1);
  const nb = 'file:///lab/day.ipynb';
  const md = 'file:///lab/run.md';
  const run = fence(
    'id: run 12\nsystem: 13C\nfield: 3 T\nsignal:\n  hyperpolarized: 2.41e6\n  thermal: { run: day.ipynb#nb-ref Mon }',
  );

  it('indexes the Markdown cells of a notebook, resolves a reference into it and sends a definition to the id in the file', async () => {
    const runs = new WorkspaceRuns(() => undefined, memoryFiles(new Map([[nb, raw]])));
    await runs.setFolders(['file:///lab']);
    assert.deepEqual(
      runs.book.blocksOf(nb).map((b) => b.id),
      ['nb-ref Mon'],
    );
    runs.edited(md, run);
    const report = new Analyzer().analyzeText(run, runs.book.externalsFor(md));
    assert.deepEqual(
      report.blocks[0]!.problems.map((p) => p.code),
      [],
    );
    assert.ok(report.blocks[0]!.results!.polarization!.value > 0);
    const state: NoteState = { uri: md, version: 1, text: run, lines: new LineIndex(run), report };
    const at = state.lines.positionAt(run.indexOf('nb-ref Mon') + 2);
    const [def] = runDefinition(runs, state, at);
    assert.equal(def!.uri, nb);
    // The id's place in the notebook's file: the line `  "id: nb-ref Mon\n",`, from the `n` of `nb-ref`.
    const fileLines = raw.split('\n');
    const line = fileLines.findIndex((l) => l.includes('"id: nb-ref Mon\\n"'));
    assert.ok(line > 0);
    assert.deepEqual(def!.range.start, { line, character: fileLines[line]!.indexOf('nb-ref') });
    assert.deepEqual(def!.range.end, { line, character: fileLines[line]!.indexOf('nb-ref') + 'nb-ref Mon'.length });
    // The hover on the reference says where the run is as the command line does: its cell and the line in it
    // (cell 2 of the file, after a code cell: the id is on line 4 of the cell).
    const hover = runHover(runs, state, at);
    assert.match((hover!.contents as { value: string }).value, /In day\\\.ipynb, cell 2, line 4/);
    // The run is a workspace symbol at the same place.
    const sym = runSymbols(runs, 'nbref').find((x) => x.location.uri === nb)!;
    assert.deepEqual(sym.location.range, def!.range);
    // Rename would have to edit the notebook's JSON: it is refused, naming the notebook.
    assert.throws(() => runRename(runs, state, at, 'nb-ref Tue', { annotations: false }), /day\.ipynb/);
  });

  it('pushes the reference diagnostics of a closed notebook at the reference in its JSON file', async () => {
    // The other way round: the notebook takes its thermal side from a run in a Markdown note, which breaks.
    const refMd = 'file:///lab/ref.md';
    const good = fence('id: md-ref Tue\nsystem: 13C\nfield: 3 T\nlattice: 298 K\nsignal:\n  thermal: 1.08e3');
    const user = [
      { cell_type: 'markdown', metadata: {}, source: ['# Tuesday\n'] },
      {
        cell_type: 'markdown',
        metadata: {},
        source: [
          '```levels\n',
          'id: run 40\n',
          'system: 13C\n',
          'field: 3 T\n',
          'signal:\n',
          '  hyperpolarized: 2.41e6\n',
          '  thermal: { run: ref.md#md-ref Tue }\n',
          '```',
        ],
      },
    ];
    const userRaw = JSON.stringify({ cells: user, metadata: {}, nbformat: 4, nbformat_minor: 5 }, null, 1);
    const files = new Map([
      [refMd, good],
      [nb, userRaw],
    ]);
    const runs = new WorkspaceRuns(() => undefined, memoryFiles(files));
    await runs.setFolders(['file:///lab']);
    const closed = new ClosedReferrers(runs, (uri) => runs.book.externalsFor(uri));
    assert.deepEqual(closed.update(), [], 'nothing to say while the reference holds');
    // The reference loses its thermal signal in the editor.
    runs.edited(refMd, good.replace('signal:\n  thermal: 1.08e3', 'signal: {}'));
    const sent = closed.update();
    assert.deepEqual(
      sent.map((p) => p.uri),
      [nb],
    );
    const [d] = sent[0]!.diagnostics;
    assert.equal(d!.code, 'reference-invalid');
    // On the reference's line of the notebook's file, inside its JSON string.
    const fileLines = userRaw.split('\n');
    const line = fileLines.findIndex((l) => l.includes('thermal: { run: ref.md#md-ref Tue }'));
    assert.ok(line > 0);
    assert.equal(d!.range.start.line, line);
    assert.equal(d!.range.end.line, line);
    assert.ok(fileLines[line]!.slice(d!.range.start.character, d!.range.end.character).includes('md-ref Tue'));
    // Mended: taken back.
    runs.edited(refMd, good);
    assert.deepEqual(closed.update(), [{ uri: nb, diagnostics: [] }]);
  });

  it('indexes the runs of a cell after a cell that leaves a fence or a comment open', async () => {
    // VS Code renders each Markdown cell on its own: an unclosed fence or `<!--` ends with its cell.
    for (const first of ['```levels\nid: draft\ngap: 1 K', '<!--\n```levels\nid: old\n```']) {
      const open = { cell_type: 'markdown', metadata: {}, source: [first] };
      const text = JSON.stringify({ cells: [open, ...cells], metadata: {}, nbformat: 4, nbformat_minor: 5 }, null, 1);
      const runs = new WorkspaceRuns(() => undefined, memoryFiles(new Map([[nb, text]])));
      await runs.setFolders(['file:///lab']);
      assert.deepEqual(
        runs.book
          .blocksOf(nb)
          .map((b) => b.id)
          .slice(-1),
        ['nb-ref Mon'],
        first,
      );
    }
  });

  it('reads a notebook open in the editor from its cells alone: no copy of its runs from the file, references still find them', async () => {
    // VS Code opens each Markdown cell of a notebook as a document of its own (`vscode-notebook-cell:` URIs); the
    // notebook's file on disk holds the same runs.
    const cell = 'vscode-notebook-cell:/lab/day.ipynb#W1sZmlsZQ%3D%3D';
    const cellText = cells[1]!.source.join('');
    const ref = 'file:///lab/ref.md';
    const other = fence('id: md-ref Tue\nsystem: 13C\nfield: 3 T\nlattice: 298 K\nsignal:\n  thermal: 1.08e3');
    const changed: string[][] = [];
    const files = new Map([
      [nb, raw],
      [ref, other],
    ]);
    const runs = new WorkspaceRuns((n) => changed.push([...n]), memoryFiles(files));
    await runs.setFolders(['file:///lab']);
    runs.edited(cell, cellText);
    const body = runs.book.blocksOf(cell)[0]!.block.body;
    assert.deepEqual(
      runs.book.copies(cell, 'nb-ref Mon', body).others,
      [],
      'the file is not a second copy of the cell',
    );
    assert.equal(runs.book.hasNote(nb), false);
    assert.ok(
      changed.some((c) => c.includes(nb)),
      'the file leaving the index is a change',
    );
    // A file event while the notebook is open does not bring the file back.
    await runs.fileEvent(nb, 'changed');
    assert.equal(runs.book.hasNote(nb), false);
    // A reference to the notebook by its path finds the run in the cell, and the run's place is in the cell.
    runs.edited(md, run);
    const report = new Analyzer().analyzeText(run, runs.book.externalsFor(md));
    assert.deepEqual(
      report.blocks[0]!.problems.map((p) => p.code),
      [],
    );
    const state: NoteState = { uri: md, version: 1, text: run, lines: new LineIndex(run), report };
    const [def] = runDefinition(runs, state, state.lines.positionAt(run.indexOf('nb-ref Mon') + 2));
    assert.equal(def!.uri, cell);
    assert.deepEqual(def!.range.start, { line: cellText.split('\n').indexOf('id: nb-ref Mon'), character: 4 });
    // Where the cell stands among the others the server is not told: the hover names the cell's line.
    const hover = runHover(runs, state, state.lines.positionAt(run.indexOf('nb-ref Mon') + 2));
    assert.match((hover!.contents as { value: string }).value, /In a cell of day\\\.ipynb, line 4/);
    // A path written in a cell is relative to the notebook's folder.
    const asking = fence(
      'id: cell run\nsystem: 13C\nfield: 3 T\nsignal:\n  hyperpolarized: 2.41e6\n  thermal: { run: ref.md#md-ref Tue }',
    );
    // A window on a remote workspace names the cell by its notebook there (`vscode-remote`, in the fragment); the
    // server beside the files knows the notebook as `file:///lab/day.ipynb` all the same.
    const second = 'vscode-notebook-cell://127.0.0.1:43133/lab/day.ipynb#W2sdnNjb2RlLXJlbW90ZQ%3D%3D';
    runs.edited(second, asking);
    const fromCell = new Analyzer().analyzeText(asking, runs.book.externalsFor(second));
    assert.deepEqual(
      fromCell.blocks[0]!.problems.map((p) => p.code),
      [],
    );
    // Closing one cell keeps the file out; closing the last brings it back.
    await runs.closed(second);
    assert.equal(runs.book.hasNote(nb), false);
    assert.equal(runs.book.hasNote(second), false);
    await runs.closed(cell);
    assert.deepEqual(
      runs.book.blocksOf(nb).map((b) => b.id),
      ['nb-ref Mon'],
    );
    assert.equal(runs.book.hasNote(cell), false);
  });

  it('lists the notebooks of a folder on disk with its Markdown notes, and reads them', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'bm-nb-'));
    try {
      writeFileSync(join(dir, 'day.ipynb'), raw);
      writeFileSync(join(dir, 'run.md'), run);
      writeFileSync(join(dir, 'data.json'), '{}');
      const listed = (await diskNotes.list(fileUri(dir))).map((u) => u.slice(u.lastIndexOf('/') + 1)).sort();
      assert.deepEqual(listed, ['day.ipynb', 'run.md']);
      const runs = new WorkspaceRuns(() => undefined, diskNotes);
      await runs.setFolders([fileUri(dir)]);
      assert.deepEqual(
        runs.book.blocksOf(fileUri(join(dir, 'day.ipynb'))).map((b) => b.id),
        ['nb-ref Mon'],
      );
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('run ids as symbols', () => {
  it('finds the id or the reference under a position, and refuses to rename anything else', () => {
    const text =
      note('ref 1') +
      '\n' +
      fence(
        'id: run 2\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2\nextrapolate: { from: 42 s, to: 0 s, decay: { run: ref 1 } }',
      );
    const uri = 'file:///lab/a.md';
    const runs = new WorkspaceRuns(() => undefined, null);
    runs.edited(uri, text);
    const state: NoteState = {
      uri,
      version: 1,
      text,
      lines: new LineIndex(text),
      report: new Analyzer().analyzeText(text),
    };
    const onId = runSymbolAt(runs, uri, text.indexOf('ref 1') + 2);
    assert.equal(onId?.kind, 'id');
    const onRef = runSymbolAt(runs, uri, text.lastIndexOf('ref 1') + 2);
    assert.equal(onRef?.kind, 'ref');
    assert.equal(runSymbolAt(runs, uri, text.indexOf('system')), null);
    assert.equal(runPrepareRename(runs, state, state.lines.positionAt(text.indexOf('0.2'))), null);
    const prep = runPrepareRename(runs, state, state.lines.positionAt(text.lastIndexOf('ref 1')));
    assert.equal(prep?.placeholder, 'ref 1');
  });

  it('takes only a new id that reads back as the same plain value', () => {
    assert.equal(badRunId('ref-13C Tuesday'), null);
    for (const bad of ['', ' x', 'a: b', 'a#b', '{x}', '- x', 'two\nlines', "it's"]) assert.ok(badRunId(bad), bad);
  });

  it('takes a new id only where the block and a reference read it back as exactly that text', () => {
    // Words YAML types (numbers, booleans, null: YAML 1.2.2 §10.3.2), control and invisible characters, and
    // characters with a meaning in YAML or in `note.md#id`: each is refused, or written plain it reads back whole.
    const names = [
      '1e3',
      '007',
      '0x1F',
      '.inf',
      '-.nan',
      'true',
      'False',
      'null',
      'Null',
      'NULL',
      '~',
      'a\u0000b',
      'esc\u001b[2J',
      'x\u2028y',
      'x\u0085y',
      '\u200bx',
      'safe\u202egnp',
      'a\u00a0b',
      'café 7',
      'Ar I 4p⁵',
      'x # y',
      'x #y',
      'a:b',
      'run 7 ',
      '?x',
      '%x',
      '@x',
      '`x`',
      'a|b',
      'a>b',
      '!tag',
      '*alias',
      '&anchor',
      '"q"',
      "'q'",
      '[x]',
      'a,b',
    ];
    for (const name of names) {
      if (badRunId(name) !== null) continue;
      const text = `${fence(`id: ${name}\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2`)}\n${fence(
        `id: other\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  hyperpolarized: 100\n  thermal: { run: ${name} }`,
      )}`;
      const [a, b] = new Analyzer().analyzeText(text).blocks;
      assert.equal(a!.meta.id, name, `the id ${JSON.stringify(name)}`);
      assert.equal(b!.meta.refs?.[0]?.id, name, `a reference to ${JSON.stringify(name)}`);
    }
    for (const refused of ['null', '~', 'a\u0000b', 'esc\u001b[2J', 'x\u2028y', '\u200bx', 'safe\u202egnp'])
      assert.ok(badRunId(refused), JSON.stringify(refused));
  });
});

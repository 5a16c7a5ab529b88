import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { Analyzer, isNotebookPath, notebookCells, RunLog } from '../../../src/core';

// The notebook format: Jupyter's nbformat 4 (cells with `cell_type` and `source`, a string or a list of lines
// with their line ends) and nbformat 3 (cells inside `worksheets`), as the nbformat documentation describes them.
const nb = (cells: unknown[]): string => JSON.stringify({ cells, metadata: {}, nbformat: 4, nbformat_minor: 5 });
const BLOCK = ['```levels\n', 'id: nb run\n', 'gap: 100 GHz\n', 'ratio: 0.9\n', '```\n'];

describe('Jupyter notebooks', () => {
  it('reads only the Markdown cells, each with its index among all cells and its source joined as written', () => {
    const text = nb([
      { cell_type: 'markdown', source: '# Title' },
      { cell_type: 'code', source: ['```levels\n', 'id: not ours\n', '```\n'] },
      { cell_type: 'raw', source: 'raw' },
      { cell_type: 'markdown', source: BLOCK },
    ]);
    const r = notebookCells(text);
    assert.equal(r.problem, null);
    assert.deepEqual(
      r.cells.map((c) => c.index),
      [0, 3],
    );
    assert.equal(r.cells[1]!.text, BLOCK.join(''));
  });

  it('reads the worksheets of nbformat 3', () => {
    const r = notebookCells(
      JSON.stringify({ nbformat: 3, worksheets: [{ cells: [{ cell_type: 'markdown', source: BLOCK }] }] }),
    );
    assert.equal(r.cells.length, 1);
  });

  it('gives a problem, never an exception, for JSON that is broken or not a notebook', () => {
    for (const text of ['{ "cells": [', '', 'null', '[]', '{"cells": 3}', '\u0000\u0001', '{"worksheets": "x"}']) {
      const r = notebookCells(text);
      assert.ok(r.problem, `a problem for ${JSON.stringify(text)}`);
      assert.equal(r.cells.length, 0);
      assert.match(r.problem.message, /not a notebook/);
    }
  });

  it('places a JSON fault on the line the parser names', () => {
    const text = '{\n "cells": [\n  {"cell_type": "markdown", "source": "x"},\n  oops\n ]\n}';
    const r = notebookCells(text);
    assert.ok(r.problem);
    // V8's message gives the offset of the fault ("… at position N" or "(line L column C)"); when it gives none the
    // problem sits on the first line.
    assert.ok(r.problem.line === 3 || r.problem.line === 0, `line ${r.problem.line}`);
  });

  it('skips cells whose source is not text, and names notebooks by their extension', () => {
    const r = notebookCells(nb([{ cell_type: 'markdown', source: 42 }, { cell_type: 'markdown' }, 'junk']));
    assert.deepEqual(r.cells, []);
    assert.ok(isNotebookPath('logs/2026/day.IPYNB'));
    assert.ok(!isNotebookPath('day.md'));
  });

  it('lists a notebook’s runs in the run log by cell, and the demo notebook’s blocks as the analyzer reads its cells', () => {
    const log = new RunLog();
    log.update(
      'file:///n.ipynb',
      'n.ipynb',
      nb([
        { cell_type: 'code', source: 'x' },
        { cell_type: 'markdown', source: BLOCK },
      ]),
    );
    const [run] = log.entries();
    assert.equal(run!.cell, 1);
    assert.equal(run!.line, 0);
    assert.equal(run!.id, 'nb run');
    const demo = readFileSync('demo/optical-bench.ipynb', 'utf8');
    const direct = notebookCells(demo).cells.flatMap((c) =>
      new Analyzer().analyzeText(c.text).blocks.map((b) => b.meta.id),
    );
    const logged = new RunLog();
    logged.update('file:///demo.ipynb', 'optical-bench.ipynb', demo);
    assert.deepEqual(
      logged.entries().map((e) => e.id),
      direct,
    );
    assert.ok(direct.length >= 2);
  });
});

import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import {
  Analyzer,
  cellAtLine,
  cellStarts,
  isNotebookPath,
  joinCells,
  notebookCells,
  RunBook,
  RunLog,
} from '../../../src/core';
import { jsonFault } from '../../../src/core/text/jupyter';

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
    // `o` of `oops`: line 3, column 2 (0-based), whichever way the platform's message names the place.
    assert.deepEqual([r.problem.line, r.problem.column], [3, 2]);
  });

  it('places every kind of JSON fault at its line and column, also where the parser’s message names no place', () => {
    // [text, 0-based line, 0-based column] of the first character that cannot go on (RFC 8259's grammar).
    const cases: [string, number, number][] = [
      // A trailing comma: `Unexpected token ']', … is not valid JSON` in V8, with no position.
      ['{\n  "cells": [\n    1,\n  ]\n}', 3, 2],
      // The end comes too early: `Unexpected end of JSON input`, no position either.
      ['{\n  "cells": [\n    {"a": 1}', 2, 12],
      ['{\n  "cells": tru', 1, 14],
      ['', 0, 0],
      // Faults the message places itself (`… at position N`).
      ['{\n  "cells": []\n  "more": 1\n}', 2, 2],
      ['{\n"a": "x\u0001"}', 1, 7],
      ['{\n "cells": []\n}\nx', 3, 0],
      // Numbers, escapes and keys.
      ['{\n "n": 01\n}', 1, 7],
      ['{\n "n": -\n}', 1, 7],
      ['{\n "n": 1.e5\n}', 1, 8],
      ['{\n "s": "a\\qb"\n}', 1, 9],
      ['{\n "s": "\\u12G4"\n}', 1, 11],
      ['{\n cells: []\n}', 1, 1],
      ['{\n "cells" []\n}', 1, 9],
    ];
    for (const [text, line, column] of cases) {
      const r = notebookCells(text);
      assert.ok(r.problem, JSON.stringify(text));
      assert.deepEqual([r.problem.line, r.problem.column], [line, column], JSON.stringify(text));
      // Where the platform's parser names a place, the grammar reading finds the same one.
      let said = '';
      try {
        JSON.parse(text);
      } catch (err) {
        said = (err as Error).message;
      }
      const at = /at position (\d+)/.exec(said);
      if (at) assert.equal(jsonFault(text), Number(at[1]), JSON.stringify(text));
    }
    assert.equal(jsonFault('{"cells": [{"a": [1, 2.5e-3, true, false, null, "\\u00e9\\n"]}]}'), null);
    // Deep nesting is read without recursion.
    assert.equal(jsonFault('['.repeat(100_000) + ']'.repeat(100_000)), null);
    assert.equal(jsonFault('['.repeat(100_000)), 100_000);
  });

  it('reads the place from both forms of V8’s message: `at position N` and `(line L column C)`', () => {
    const text = '{\n "cells": [\n  oops\n ]\n}';
    const parse = JSON.parse;
    try {
      // Newer V8 (Node.js 22 on) adds the line and column, 1-based; they are taken as they are.
      JSON.parse = () => {
        throw new SyntaxError('Unexpected token \'o\', "oops" is not valid JSON at position 99 (line 3 column 3)');
      };
      const withLine = notebookCells(text).problem;
      // Node.js 20 gives only the 0-based offset: 16 is `o` of `oops`, line 2 column 2 (0-based).
      JSON.parse = () => {
        throw new SyntaxError('Unexpected token \'o\', "oops" is not valid JSON at position 16');
      };
      const withPosition = notebookCells(text).problem;
      assert.deepEqual([withLine?.line, withLine?.column], [2, 2]);
      assert.deepEqual([withPosition?.line, withPosition?.column], [2, 2]);
    } finally {
      JSON.parse = parse;
    }
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

  it('finds each line of the joined cells in its own cell, whatever the cells leave open', () => {
    // Random cells: blank lines, unclosed fences and `<!--` (which add closing lines to the gap), empty cells.
    const pieces = ['text', '', '```levels', 'id: x', '<!--', '~~~~', '```', '-->', '    indented'];
    let seed = 7;
    const next = (n: number): number => ((seed = (seed * 1103515245 + 12345) % 2147483648), seed % n);
    for (let trial = 0; trial < 300; trial++) {
      const cells = Array.from({ length: 1 + next(5) }, (_, k) => ({
        index: 2 * k + next(2),
        text: Array.from({ length: next(6) }, () => pieces[next(pieces.length)]!).join('\n'),
      }));
      const joined = joinCells(cells).split('\n');
      const starts = cellStarts(cells);
      cells.forEach((c, k) =>
        c.text.split('\n').forEach((line, j) => {
          const at = starts[k]!.line + j;
          assert.equal(joined[at], line, `trial ${trial}, cell ${k}, line ${j}`);
          assert.deepEqual(cellAtLine(starts, at), { index: c.index, line: j });
        }),
      );
    }
  });

  it('names a run of a notebook by its cell and line where a reference cannot use it', () => {
    // Invented notes: cell 3 (index 2) holds a broken run on its second line's fence; the note refers to it.
    const cells = [
      { index: 0, text: '# Day' },
      { index: 2, text: 'Broken:\n```levels\nid: bad run\nsystem: 13C\nfield: 3 MT\nsignal:\n  thermal: 1e3\n```' },
    ];
    const starts = cellStarts(cells);
    const book = new RunBook({ cellStarts: (note) => (note === '/lab/day.ipynb' ? starts : null) });
    book.setNote('/lab/day.ipynb', joinCells(cells));
    const note =
      '```levels\nid: run 1\nsystem: 13C\nfield: 3 T\nsignal:\n  hyperpolarized: 2e6\n  thermal: { run: day.ipynb#bad run }\n```\n';
    book.setNote('/lab/run.md', note);
    const [b] = new Analyzer().analyzeText(note, book.externalsFor('/lab/run.md')).blocks;
    const p = b!.problems.find((x) => x.code === 'reference-invalid')!;
    // The first error, `field`'s unit, is on line 5 of cell 3.
    assert.match(p.message, /\(day\.ipynb, cell 3, line 5\)/);
  });
});

import assert from 'node:assert/strict';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

/** Runs the command line in `cwd`; returns its exit status and output. */
function run(args: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(args, { out: (s) => (out += s), err: (s) => (err += s), cwd });
  return { code, out, err };
}

// nbformat 4: cells with `cell_type` and `source` (a string or a list of lines), as Jupyter writes them.
const nb = (cells: unknown[]): string => JSON.stringify({ cells, metadata: {}, nbformat: 4, nbformat_minor: 5 });

describe('boltzmark report on Jupyter notebooks', () => {
  it('reports the blocks of Markdown cells by cell and line, and ignores code cells', () => {
    const dir = mkdtempSync(join(tmpdir(), 'bm-nb-'));
    try {
      writeFileSync(
        join(dir, 'day.ipynb'),
        nb([
          { cell_type: 'markdown', source: ['# Day\n'] },
          { cell_type: 'code', source: ['```levels\n', 'id: in code\n', 'gap: 10 K\n', 'ratio: 0.5\n', '```\n'] },
          {
            cell_type: 'markdown',
            source: ['Text\n', '\n', '```levels\n', 'id: pair\n', 'gap: 10 K\n', 'ratio: 0.5\n', '```\n'],
          },
        ]),
      );
      const { code, out } = run(['report', '.', '--format', 'json'], dir);
      assert.equal(code, 0);
      const entries = JSON.parse(out) as {
        file: string;
        cell: number | null;
        line: number;
        id: string;
        temperature: { value: number };
      }[];
      assert.deepEqual(
        entries.map((e) => [e.file, e.cell, e.line, e.id]),
        [['day.ipynb', 3, 3, 'pair']],
      );
      // T = (ΔE/k)/ln(1/r) = 10 K / ln 2 = 14.426 950 K (the two-level Boltzmann ratio).
      assert.ok(Math.abs(entries[0]!.temperature.value - 10 / Math.LN2) < 1e-9);
      const table = run(['report', 'day.ipynb'], dir).out;
      assert.match(table, /day\.ipynb, cell 3:3 +pair/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('reports a file that is not a notebook as an error entry, and every other file still', () => {
    const dir = mkdtempSync(join(tmpdir(), 'bm-nb-'));
    try {
      writeFileSync(join(dir, 'a-broken.ipynb'), '{\n "cells": [\n  oops\n ]\n}\n');
      writeFileSync(join(dir, 'b-note.md'), '```levels\nid: fine\ngap: 10 K\nratio: 0.5\n```\n');
      const { code, out } = run(['report', '.', '--format', 'json'], dir);
      assert.equal(code, 1, 'an error in one file makes the exit status 1');
      const entries = JSON.parse(out) as {
        file: string;
        status: string;
        diagnostics: { code: string; line: number }[];
      }[];
      assert.equal(entries.length, 2);
      assert.equal(entries[0]!.file, 'a-broken.ipynb');
      assert.equal(entries[0]!.status, 'invalid');
      assert.equal(entries[0]!.diagnostics[0]!.code, 'notebook-invalid');
      assert.equal(entries[1]!.file, 'b-note.md');
      assert.equal(entries[1]!.status, 'normal');
      const check = run(['check', '.'], dir);
      assert.match(check.out, /a-broken\.ipynb:\d+:\d+: error notebook-invalid/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('reads the demo notebook as the run log does: the ids of its Markdown cells', () => {
    const { out } = run(['report', 'demo/optical-bench.ipynb', '--format', 'json'], process.cwd());
    const ids = (JSON.parse(out) as { id: string }[]).map((e) => e.id);
    // Read independently of the core: the ids written in the notebook's Markdown cells.
    const cells = (
      JSON.parse(readFileSync('demo/optical-bench.ipynb', 'utf8')) as {
        cells: { cell_type: string; source: string[] }[];
      }
    ).cells;
    const written = cells
      .filter((c) => c.cell_type === 'markdown')
      .flatMap((c) => c.source.join('').split('\n'))
      .filter((l) => l.startsWith('id: '))
      .map((l) => l.slice(4));
    assert.deepEqual(ids, written);
  });
});

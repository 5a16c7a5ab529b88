import { strict as assert } from 'node:assert';
import {
  Analyzer,
  curveData,
  LineIndex,
  measurementRows,
  reportEntry,
  resultsHtml,
  RunBook,
  runPlaceText,
  DEFAULT_DISPLAY,
  type BlockReport,
} from '../../../src/core';
import { dayRefBlock, extrapolatedRun } from '../../support/runNotes';
import { shortNote } from '../../../src/core/runs/paths';

// How referenced values are shown. Invented numbers: the checks are about the wording and the escaping.
const REF = (id = 'ref-13C Monday'): string => dayRefBlock(id);
const RUN = (ref: string): string => extrapolatedRun('run 7', ref);

function analysed(ref: string, run: string): { block: BlockReport; text: string } {
  const book = new RunBook();
  book.setNote('/lab/ref.md', ref);
  book.setNote('/lab/run.md', run);
  const [block] = new Analyzer().analyzeText(run, book.externalsFor('/lab/run.md')).blocks;
  return { block: block!, text: run };
}

describe('runs by reference: what the hosts show', () => {
  it('hover and copied results: the thermal reference with its date and place, and P at the extrapolated time', () => {
    const { block } = analysed(REF(), RUN('ref.md#ref-13C Monday'));
    const rows = new Map(measurementRows(block.input, block.results!, DEFAULT_DISPLAY));
    assert.equal(rows.get('thermal reference'), 'ref-13C Monday, 2026-04-12 (ref.md, line 2)');
    assert.match(rows.get('P at 0 s')!, /^\d+(\.\d+)? ± \d+(\.\d+)? %$/);
    assert.match(rows.get('extrapolation')!, /^from 42 s along exp\(\(from − to\)\/T₁\), T₁ = 47\.9 ± 1\.2 s$/);
  });

  it('the preview says "thermal reference: <id>, <date>" and escapes an id that holds markup', () => {
    const evil = 'ref <img src=x onerror=alert(1)>';
    const { block } = analysed(REF(evil), RUN(`ref.md#${evil}`));
    assert.deepEqual(
      block.problems.map((p) => p.code),
      [],
    );
    const html = resultsHtml(block, DEFAULT_DISPLAY);
    assert.ok(
      html.includes('<th scope="row">thermal reference</th><td>ref &lt;img src=x onerror=alert(1)&gt;, 2026-04-12'),
      html,
    );
    assert.ok(!html.includes('<img'));
    assert.match(html, /<th scope="row">P at 0 s<\/th>/);
  });

  it('the curve view lists the reference and the extrapolated polarization among its facts', () => {
    const { block } = analysed(REF(), RUN('ref.md#ref-13C Monday'));
    const payload = curveData(block, { uri: 'file:///lab/run.md', version: 1 });
    assert.ok('facts' in payload);
    const facts = new Map(
      (payload as { facts: readonly { label: string; text: string }[] }).facts.map((f) => [f.label, f.text]),
    );
    assert.equal(facts.get('thermal reference'), 'ref-13C Monday, 2026-04-12');
    assert.match(facts.get('polarization, extrapolated')!, /^P\(0 s\) = /);
  });

  it('the reference block itself says it is one', () => {
    const book = new RunBook();
    book.setNote('/lab/ref.md', REF());
    const [block] = new Analyzer().analyzeText(REF(), book.externalsFor('/lab/ref.md')).blocks;
    const rows = new Map(measurementRows(block!.input, block!.results!, DEFAULT_DISPLAY));
    assert.equal(rows.get('thermal reference'), 'this block records only a thermal signal: P = P_th');
    assert.equal(rows.has('S_hp / S_th'), false);
  });

  it('the JSON entry carries polarizationAt and the reference', () => {
    const { block, text } = analysed(REF(), RUN('ref.md#ref-13C Monday'));
    const e = reportEntry('run.md', block, new LineIndex(text));
    assert.deepEqual(e.thermalReference, { id: 'ref-13C Monday', date: '2026-04-12' });
    assert.equal(e.polarizationAt!.time, 0);
    assert.equal(e.polarizationAt!.from, 42);
    assert.deepEqual(e.polarizationAt!.decay, { value: 47.9, uncertainty: 1.2, run: null });
    assert.equal(e.polarizationAt!.value, block.results!.polarizationAt!.value);
  });
});

describe('runs by reference: the names of notes in messages', () => {
  it('names a note by its file, never by a URI fragment, and keeps every character of a plain path', () => {
    // A notebook cell's URI (VS Code's) names the cell in its fragment; the run is in `day.ipynb`.
    assert.equal(shortNote('vscode-notebook-cell:/lab/day.ipynb#W1sZmlsZQ%3D%3D'), 'day.ipynb');
    assert.equal(shortNote('file:///lab/run%20%231.md'), 'run #1.md');
    assert.equal(shortNote('/lab/run #1.md'), 'run #1.md');
    assert.equal(shortNote('C:\\lab\\a#b.md'), 'a#b.md');
    assert.equal(
      runPlaceText({ note: 'vscode-notebook-cell:/lab/day.ipynb#W1s', span: { start: 0, end: 1 }, line: 3 }),
      'day.ipynb, line 4',
    );
  });
});

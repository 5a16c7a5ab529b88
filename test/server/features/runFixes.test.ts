import { strict as assert } from 'node:assert';
import { codeActions } from '../../../src/server/features/codeActions';
import { hover } from '../../../src/server/features/hover';
import { DEFAULT_SETTINGS } from '../../../src/shared/settings';
import { Analyzer, LineIndex, RunBook } from '../../../src/core';
import type { NoteState } from '../../../src/server/state';
import { note, URI } from '../helpers';

/** A note's state analysed with a book of runs, as the server does once the workspace index gives it one. */
function stateWithRuns(text: string, others: Record<string, string>): NoteState {
  const book = new RunBook();
  for (const [uri, t] of Object.entries(others)) book.setNote(uri, t);
  book.setNote(URI, text);
  const report = new Analyzer().analyzeText(text, book.externalsFor(URI));
  return { uri: URI, version: 1, text, lines: new LineIndex(text), report };
}

describe('code actions and hover: runs by reference', () => {
  it('offer the closest ids for an unknown reference, replacing only the id', () => {
    const ref =
      '```levels\nid: ref-13C Monday\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal: { thermal: 1 }\n```\n';
    const text = note(
      'id: run 1',
      'system: 13C',
      'field: 9.4 T',
      'signal:',
      '  hyperpolarized: 5',
      '  thermal: { run: ref.md#ref-13C Mondya }',
    );
    const state = stateWithRuns(text, { 'file:///lab/ref.md': ref });
    const at = text.indexOf('Mondya');
    const pos = state.lines.positionAt(at);
    const actions = codeActions(state, { start: pos, end: pos });
    assert.deepEqual(
      actions.map((a) => [a.title, String(a.diagnostics?.[0]?.code)]),
      [['Refer to `ref-13C Monday`', 'reference-unknown']],
    );
    const [edit] = actions[0]!.edit!.changes![URI]!;
    assert.equal(state.lines.offsetAt(edit!.range.start), text.indexOf('ref-13C Mondya'));
    assert.equal(state.lines.offsetAt(edit!.range.end), text.indexOf('ref-13C Mondya') + 'ref-13C Mondya'.length);
    assert.equal(edit!.newText, 'ref-13C Monday');
  });

  it('hover on the block names its thermal reference and shows P at the extrapolated time', () => {
    const ref =
      '```levels\nid: ref-13C Monday\ndate: 2026-04-12\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal: { thermal: 1, scans: { thermal: 16 } }\n```\n';
    const text = note(
      'id: run 1',
      'system: 13C',
      'field: 9.4 T',
      'signal:',
      '  hyperpolarized: 50',
      '  thermal: { run: ref.md#ref-13C Monday }',
      'extrapolate: { from: 42 s, to: 0 s, decay: 47.9 ± 1.2 s }',
    );
    const state = stateWithRuns(text, { 'file:///lab/ref.md': ref });
    const h = hover(state, state.lines.positionAt(text.indexOf('run 1') + 1), DEFAULT_SETTINGS);
    const value = (h?.contents as { value: string } | undefined)?.value ?? '';
    assert.match(value, /thermal reference/);
    assert.match(value, /ref\\-13C Monday, 2026\\-04\\-12 \\\(ref\\\.md, line 2\\\)/);
    assert.match(value, /P at 0 s/);
    assert.match(value, /\| P\\_th at 298\.0 K of ref\\-13C Monday \|/);
  });
});

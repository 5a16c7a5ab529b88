import { strict as assert } from 'node:assert';
import type { CodeAction, TextEdit } from 'vscode-languageserver';
import { codeActions, problemToDiagnostic } from '../../../src/server/features/codeActions';
import { FORMAT_DOC_URL } from '../../../src/server/docsLink';
import type { NoteState } from '../../../src/server/state';
import { everything, note, noteState, URI, withCursor } from '../helpers';

/** Applies one action's edits to the note text. */
function apply(state: NoteState, action: CodeAction): string {
  const edits = [...(action.edit?.changes?.[URI] ?? [])] as TextEdit[];
  assert.deepEqual(Object.keys(action.edit?.changes ?? {}), [URI], 'edits touch this note only');
  edits.sort((a, b) => state.lines.offsetAt(b.range.start) - state.lines.offsetAt(a.range.start));
  let text = state.text;
  for (const e of edits)
    text =
      text.slice(0, state.lines.offsetAt(e.range.start)) + e.newText + text.slice(state.lines.offsetAt(e.range.end));
  return text;
}

/** Quick fixes at the cursor: [title, diagnostic code, preferred, the note after applying it]. */
function check(marked: string, expected: readonly (readonly [string, string, boolean, string])[]): void {
  const { state, position } = withCursor(marked);
  const actions = codeActions(state, { start: position, end: position });
  assert.deepEqual(
    actions.map((a) => [a.title, String(a.diagnostics?.[0]?.code), a.isPreferred === true, apply(state, a)]),
    expected,
  );
  for (const a of actions) assert.equal(a.kind, 'quickfix');
}

describe('code actions', () => {
  it('turn a wrong-case unit into the right one, touching only the unit', () => {
    check(note('system: 1H', 'field: 9.4 M$0T', 'polarization: 0.001'), [
      ['Change unit to mT', 'unit-case', true, note('system: 1H', 'field: 9.4 mT', 'polarization: 0.001')],
    ]);
  });

  it('add the unit the block already uses to a bare level energy', () => {
    check(note('levels:', '  - { energy: 0 cm-1, population: 0.7 }', '  - { energy: 12$00, population: 0.3 }'), [
      [
        'Add the unit cm-1',
        'unit-missing',
        true,
        note('levels:', '  - { energy: 0 cm-1, population: 0.7 }', '  - { energy: 120 cm-1, population: 0.3 }'),
      ],
    ]);
  });

  it('offer the isotope the user meant', () => {
    check(note('system: C1$03', 'field: 9.4 T', 'polarization: 0.1'), [
      ['Change to 13C', 'isotope-unknown', true, note('system: 13C', 'field: 9.4 T', 'polarization: 0.1')],
    ]);
  });

  it('offer nothing where no problem with a fix is', () => {
    check(note('system: C13', 'field: 9.4 T', 'polarization: 0.1$0'), []);
    check(note('system: 13C', 'field: 9.4 T$0', 'polarization: 2'), []);
  });

  it('answer for every problem a wider range meets', () => {
    const state = noteState(note('system: C13', 'field: 9.4', 'polarization: 0.1'));
    const actions = codeActions(state, everything(state));
    assert.deepEqual(
      actions.map((a) => a.title),
      ['Change to 13C', 'Add the unit T'],
    );
  });

  it('prefer a fix only when it is the only one, and drop a fix that would edit outside the block', () => {
    const state = noteState(note('system: 1H', 'field: 9.4 MT', 'polarization: 0.001'));
    const b = state.report.blocks[0];
    const p = b.problems[0];
    const outside = { title: 'Edit the heading', span: { start: 0, end: 1 }, newText: '#' };
    const twice = { ...p, fixes: [...p.fixes!, { ...p.fixes![0], title: 'Change unit to T', newText: 'T' }, outside] };
    const changed: NoteState = { ...state, report: { ...state.report, blocks: [{ ...b, problems: [twice] }] } };
    const actions = codeActions(changed, everything(state));
    assert.deepEqual(
      actions.map((a) => [a.title, a.isPreferred]),
      [
        ['Change unit to mT', false],
        ['Change unit to T', false],
      ],
    );
  });

  it('build the diagnostic with its range, severity, code, source and a link to the code’s section', () => {
    const state = noteState(note('system: 1H', 'field: 9.4 MT', 'polarization: 0.001', 'colour: red'));
    const [unit, key] = state.report.blocks[0].problems;
    assert.deepEqual(problemToDiagnostic(state, unit), {
      range: { start: { line: 4, character: 11 }, end: { line: 4, character: 13 } },
      severity: 1,
      code: 'unit-case',
      codeDescription: { href: `${FORMAT_DOC_URL}#unit-case` },
      source: 'boltzmark',
      message: 'field: Units are case-sensitive: `MT` is not `mT`.',
    });
    assert.equal(problemToDiagnostic(state, key).severity, 2, 'a warning');
    assert.equal(problemToDiagnostic(state, { ...key, severity: 'info' }).severity, 3, 'an information');
    assert.equal(problemToDiagnostic(state, key).codeDescription?.href, `${FORMAT_DOC_URL}#key-unknown`);
  });
});

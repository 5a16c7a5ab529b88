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
  let text = state.text.slice();
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
      // With two problems of one fix each, "fix all" comes last.
      ['Change to 13C', 'Add the unit T', 'Fix all 2 problems in this note that have one fix'],
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

describe('typing that forgives', () => {
  it('reads a polarization written as a percentage, and offers % for a bare number above 1', () => {
    // ISO 80000-1: % stands for 0.01, so 24.5 ± 0.5 % is P = 0.245 ± 0.005.
    const p = noteState(note('system: 13C', 'field: 7.05 T', 'polarization: 24.5 ± 0.5 %')).report.blocks[0]!;
    assert.equal(p.problems.length, 0, JSON.stringify(p.problems));
    assert.ok(Math.abs(p.results!.polarization!.value - 0.245) < 1e-15);
    assert.ok(Math.abs(p.results!.polarization!.uncertainty! - 0.005) < 1e-15);
    check(note('system: 13C', 'field: 7.05 T', 'polarization: 24$0.5'), [
      [
        'Mark it as a percentage (add %)',
        'polarization-range',
        true,
        note('system: 13C', 'field: 7.05 T', 'polarization: 24.5 %'),
      ],
    ]);
  });

  it('reads an angle written with the degree sign and a reflectivity in percent', () => {
    // 10° = π/18 rad (SI Brochure, 9th ed., Table 8).
    const s = noteState(
      note(
        'series:',
        '  model: decay',
        '  time: [0 s, 10 s, 20 s, 30 s]',
        '  signal: [1.0, 0.74, 0.55, 0.40]',
        '  flip: 10°',
      ),
    ).report.blocks[0]!;
    assert.equal(s.problems.filter((x) => x.severity === 'error').length, 0, JSON.stringify(s.problems));
    assert.ok(Math.abs(s.input!.series!.flip! - Math.PI / 18) < 1e-15);
    const g = noteState(
      note(
        'gap: 1064 nm',
        'populations: [0 cm-3, 1e17 cm-3]',
        'cross-section: 2.8e-19 cm2',
        'length: 10 cm',
        'mirrors: [100 %, 90 %]',
      ),
    ).report.blocks[0]!;
    // R = 1 and 0.9 as in the threshold test: g_th = ln(1/0.9)/(2 · 10 cm) = 5.2680258e-3 cm⁻¹ (Saleh & Teich).
    assert.ok(Math.abs(g.results!.gain!.threshold! - 5.2680258e-3) < 1e-9);
  });

  it('takes one unit for a whole list of times as time/<unit>, in valid YAML', () => {
    const withKey = noteState(
      note('series:', '  model: decay', '  time/min: [0, 1, 2, 3]', '  signal: [1.0, 0.74, 0.55, 0.40]'),
    ).report.blocks[0]!;
    const spelled = noteState(
      note('series:', '  model: decay', '  time: [0 min, 1 min, 2 min, 3 min]', '  signal: [1.0, 0.74, 0.55, 0.40]'),
    ).report.blocks[0]!;
    assert.deepEqual(withKey.problems, []);
    assert.deepEqual(
      withKey.input!.series!.times,
      spelled.input!.series!.times,
      'the same times in seconds (1 min = 60 s)',
    );
    const bad = noteState(
      note('series:', '  model: decay', '  time/kg: [0, 1, 2, 3]', '  signal: [1.0, 0.74, 0.55, 0.40]'),
    );
    assert.equal(bad.report.blocks[0]!.problems[0]!.code, 'unit-unknown');
  });

  it('adds the unit to every bare number of a list at once, and fixes all one-fix problems of a note', () => {
    const marked = note(
      'series:',
      '  model: decay',
      '  time: [$00, 10, 20 s, 30]',
      '  signal: [1.0, 0.74, 0.55, 0.40]',
    );
    const { state, position } = withCursor(marked);
    const actions = codeActions(state, { start: position, end: position });
    const all = actions.find((a) => /to all 3 bare numbers/.test(a.title))!;
    assert.ok(all, actions.map((a) => a.title).join('; '));
    assert.equal(
      apply(state, all),
      note('series:', '  model: decay', '  time: [0 s, 10 s, 20 s, 30 s]', '  signal: [1.0, 0.74, 0.55, 0.40]'),
    );
    const fixAll = actions.find((a) => a.kind === 'source.fixAll.boltzmark');
    assert.equal(fixAll, undefined, 'one list fix is not "all problems"');
    const two = withCursor(`${marked}\n${note('system: 1H', 'field: 9.4 MT', 'polarization: 0.001')}`);
    const found = codeActions(two.state, { start: two.position, end: two.position }).find(
      (a) => a.kind === 'source.fixAll.boltzmark',
    )!;
    assert.ok(found);
    const fixed = apply(two.state, found);
    assert.match(fixed, /time: \[0 s, 10 s, 20 s, 30 s\]/);
    assert.match(fixed, /field: 9\.4 mT/);
  });

  it('gives unit-missing examples in the key’s own dimension and the number typed', () => {
    const message = (...body: string[]) =>
      noteState(note(...body)).report.blocks[0]!.problems.find((p) => p.code === 'unit-missing')!.message;
    assert.match(
      message('system: 13C', 'field: 7.05 T', 'lattice: 300', 'polarization: 0.1'),
      /such as `300 K` \(a temperature\)/,
    );
    assert.match(
      message('levels:', '  - { energy: 0 cm-1, population: 0.7 }', '  - { energy: 1200, population: 0.3 }'),
      /such as `1200 cm-1` \(an energy\)/,
    );
  });

  it('explains a value that needs quotes in plain words and offers to quote it', () => {
    // YAML 1.2.2 §7.3.3: a plain scalar cannot start with `[`; `[1-13C]pyruvic acid` is a flow sequence
    // followed by stray text, a syntax error.
    const body = ['system: 13C', 'field: 3 T', 'polarization: 0.1'];
    const { state, position } = withCursor(note('sample: [1-13C]pyr$0uvic acid', ...body));
    const p = state.report.blocks[0]!.problems.find((x) => x.code === 'yaml-syntax')!;
    assert.match(p.message, /^`sample`: .*put it in quotes/);
    assert.doesNotMatch(p.message, /Unexpected scalar/);
    const actions = codeActions(state, { start: position, end: position });
    const quote = actions.find((a) => a.title === 'Put the value in quotes')!;
    const fixed = apply(state, quote);
    assert.equal(fixed, note('sample: "[1-13C]pyruvic acid"', ...body));
    assert.equal(noteState(fixed).report.blocks[0]!.status, 'normal');
    // A list that is a list stays one: no quoting offered where YAML reads the line fine.
    assert.equal(noteState(note('sample: [a, b]', ...body)).report.blocks[0]!.problems.length, 0);
  });

  it('offers to list top-down levels bottom up where the note is marked and on every level item', () => {
    const items = [
      '  - { label: B, energy: 410 cm-1, g: 5, population: 0.05 }',
      '  - { label: A, energy: 120 cm-1, g: 3, population: 0.25 }',
      '  - { label: ground, energy: 0 cm-1, g: 1, population: 0.70 }',
    ];
    const bottomUp = note('levels:', items[2]!, items[1]!, items[0]!);
    for (const [line, col] of [
      [0, 3],
      [1, 12],
      [2, 30],
      [3, 20],
    ] as const) {
      const lines = ['levels:', ...items];
      lines[line] = lines[line]!.slice(0, col) + '$0' + lines[line]!.slice(col);
      const { state, position } = withCursor(note(...lines));
      const fix = codeActions(state, { start: position, end: position }).find(
        (a) => a.title === 'List the levels lowest energy first',
      );
      assert.ok(fix, `offered at line ${line}`);
      assert.equal(apply(state, fix), bottomUp);
    }
    const p = noteState(note('levels:', ...items)).report.blocks[0]!.problems.find(
      (x) => x.code === 'levels-descending',
    )!;
    assert.match(p.message, /listed from the top \(highest energy\) down/);
  });
});

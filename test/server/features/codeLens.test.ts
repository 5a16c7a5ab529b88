import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { codeLenses, LENS_TITLES, resultsMarkdown } from '../../../src/server/features/codeLens';
import { hover } from '../../../src/server/features/hover';
import { DEFAULT_SETTINGS } from '../../../src/shared/settings';
import { CONTRACT, note, noteState, settings, URI } from '../helpers';

/** Compares the lenses of a note as [line, title, command, arguments]. */
function check(text: string, expected: readonly (readonly [number, string, string, unknown[]])[]): void {
  const lenses = codeLenses(noteState(text));
  assert.deepEqual(
    lenses.map((l) => [l.range.start.line, l.command?.title, l.command?.command, l.command?.arguments]),
    expected,
  );
  for (const l of lenses) assert.equal(l.range.start.line, l.range.end.line, 'a lens sits on one line');
}

describe('code lenses', () => {
  it('put "Show Curve View" and "Copy Block Results" above every block, invalid ones included', () => {
    check(`${note(...CONTRACT)}\n${note('system: 1H', 'field: 9.4 MT', 'polarization: 0.001')}`, [
      [2, 'Show Curve View', 'boltzmark.showCurve', [URI, 2]],
      [2, 'Copy Block Results', 'boltzmark.copyResults', [URI, 2]],
      [12, 'Show Curve View', 'boltzmark.showCurve', [URI, 12]],
      [12, 'Copy Block Results', 'boltzmark.copyResults', [URI, 12]],
    ]);
  });

  it('name what the view shows for a block with only a series or emission lines', () => {
    const series = note(
      'series:',
      '  model: decay',
      '  time: [0 s, 10 s, 20 s, 30 s]',
      '  signal: [1.0, 0.74, 0.55, 0.40]',
    );
    const lines = note(
      'lines:',
      '  - { wavelength: 811.7542 nm, upper: 105462.7596 cm-1, g: 7, A: 3.3e7, intensity: 1 }',
      '  - { wavelength: 763.7208 nm, upper: 106237.5518 cm-1, g: 5, A: 2.45e7, intensity: 0.5 }',
    );
    assert.equal(codeLenses(noteState(series))[0]!.command!.title, 'Show Series Fit');
    assert.equal(codeLenses(noteState(lines))[0]!.command!.command, 'boltzmark.showBoltzmannPlot');
  });

  it('read exactly as the titles of the commands they run (package.nls.json)', () => {
    const nls = JSON.parse(readFileSync('package.nls.json', 'utf8')) as Record<string, string>;
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as {
      contributes: { commands: { command: string; title: string }[] };
    };
    for (const [command, title] of Object.entries(LENS_TITLES)) {
      const entry = manifest.contributes.commands.find((c) => c.command === command);
      assert.ok(entry, `${command} is contributed`);
      assert.equal(nls[entry.title.replace(/^%|%$/g, '')], title, command);
    }
  });

  it('copy the results as a Markdown table with the hover’s numbers', () => {
    const state = noteState(note(...CONTRACT));
    const md = resultsMarkdown(state, state.report.blocks[0], DEFAULT_SETTINGS);
    assert.equal(
      md,
      [
        '**cell\\-B run 7** — normal',
        '',
        '| result | value |',
        '| :-- | :-- |',
        '| T | 5.61 ± 0.19 mK |',
        '| β | 178.2 ± 6.1 K⁻¹ |',
        '| P | 31.2 ± 1.0 % |',
        '| P\\_th at 1\\.4 K | 0.129 % |',
        '| ε = P/P\\_th | 241.1 ± 7.7 |',
        '| S/(Nk) | 0.6437 |',
        '',
      ].join('\n'),
    );
    const h = hover(state, { line: 4, character: 1 }, DEFAULT_SETTINGS);
    const value = (h!.contents as { value: string }).value;
    for (const row of md.split('\n').filter((l) => l.startsWith('| ')))
      assert.ok(value.includes(row), `the hover lacks ${row}`);
  });

  it('copy the first error of an invalid block', () => {
    const state = noteState(note('id: hurried', 'system: 1H', 'field: 9.4 MT', 'polarization: 0.001'));
    assert.equal(
      resultsMarkdown(state, state.report.blocks[0], DEFAULT_SETTINGS),
      '**hurried** — invalid\n\nError `unit-case`: field: Units are case\\-sensitive: \\`MT\\` is not \\`mT\\`\\.\n',
    );
  });

  it('follow the display settings', () => {
    const state = noteState(note(...CONTRACT));
    const md = resultsMarkdown(
      state,
      state.report.blocks[0],
      settings({ polarization: 'fraction', temperature: 'beta-first' }),
    );
    assert.ok(md.indexOf('| β |') < md.indexOf('| T |'), md);
    assert.ok(md.includes('| P | 0.312 ± 0.010 |'), md);
  });
});

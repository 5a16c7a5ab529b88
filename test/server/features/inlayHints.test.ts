import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { inlayHints } from '../../../src/server/features/inlayHints';
import { DEFAULT_SETTINGS, type Settings } from '../../../src/shared/settings';
import { CONTRACT, everything, note, noteState, settings } from '../helpers';

type Range = { start: { line: number; character: number }; end: { line: number; character: number } };

/** Asks for the hints of a note (over `range`, or the whole note) and compares [line, character, label] triples. */
function check(
  text: string,
  expected: readonly (readonly [number, number, string])[],
  s: Settings = DEFAULT_SETTINGS,
  range?: Range,
): void {
  const state = noteState(text, s);
  const hints = inlayHints(state, range ?? everything(state), s);
  assert.deepEqual(
    hints.map((h) => [h.position.line, h.position.character, h.label]),
    expected,
  );
  for (const h of hints) assert.equal(h.paddingLeft, true, 'hints keep a space from the text');
}

const LEVELS = [
  'id: three',
  'levels:',
  '  - { label: ground, energy: 0 cm-1,   g: 1, population: 0.70 }',
  '  - { label: A,      energy: 120 cm-1, g: 3, population: 0.25 }',
  '  - { label: B,      energy: 410 cm-1, g: 5, population: 0.05 }',
];

describe('inlay hints', () => {
  it('put the short results of the format example at the end of the opening fence line', () => {
    check(note(...CONTRACT), [[2, 9, 'T = 5.61 mK · P = 31.2 % · ε = 241']]);
  });

  it('lead with β when the display setting asks for it', () => {
    check(note(...CONTRACT), [[2, 9, 'β = 178.2 K⁻¹ · P = 31.2 % · ε = 241']], settings({ temperature: 'beta-first' }));
  });

  it('mark an invalid block with its first error code', () => {
    check(note('system: 1H', 'field: 9.4 MT', 'polarization: 0.001'), [[2, 9, 'invalid: unit-case']]);
  });

  it('give each explicit level its n/g and, above the lowest, the pair temperature with the level below', () => {
    // Pair temperatures as in the hover test: 81.13 K (ground–A) and 196.8 K (A–B), shown with three digits.
    check(note(...LEVELS), [
      // Not one temperature: the hint does not show the fit's T as if it were one (the hover has the fit).
      [2, 9, 'non-thermal, no single T'],
      [5, 63, 'n/g = 0.700'],
      [6, 63, 'n/g = 0.0833 · T(A–ground) = 81.1 K'],
      [7, 63, 'n/g = 0.0100 · T(B–A) = 197 K'],
    ]);
  });

  it('give a negative pair temperature to an inverted pair', () => {
    check(
      note(
        'levels:',
        '  - { label: a, energy: 0 K, population: 0.5 }',
        '  - { label: b, energy: 10 K, population: 0.2 }',
        '  - { label: c, energy: 20 K, population: 0.3 }',
      ),
      [
        // T(a, b) = 10 K / ln(0.5/0.2) = 10.91 K; T(b, c) = 10 K / ln(0.2/0.3) = −24.66 K.
        [2, 9, 'non-thermal, no single T · inverted pair'],
        [4, 46, 'n/g = 0.500'],
        [5, 47, 'n/g = 0.200 · T(b–a) = 10.9 K'],
        [6, 47, 'n/g = 0.300 · T(c–b) = −24.7 K inverted'],
      ],
    );
  });

  it('say when n/g comes from populations normalised to sum 1', () => {
    // Counts 600 and 400 of 1000: n/g = 0.6 and 0.4 after normalising (the sum, 1000, is not 1).
    check(note('system: 1H', 'field: 9.4 T', 'populations: [600, 400]'), [
      [2, 9, 'T = 47.4 mK · P = 20.0 %'],
      [5, 17, 'n/g = 0.600 (normalised)'],
      [5, 22, 'n/g = 0.400 (normalised)'],
    ]);
  });

  it('keep the pair temperature when "normalised" would crowd it out, and say it on the lowest level', () => {
    // The demo's reference lamp: populations 1.0, 2.93e-3, 5.20e-3 (sum 1.00813) over g = 2, 2, 4.
    // T(P1/2–ground) = 12579 cm⁻¹ · c₂ / ln[(1.0/2)/(2.93e-3/2)] = 18098.4 K / 5.8329 = 3102.8 K → "3100 K"
    // (c₂ = hc/k = 1.438776877 cm K, CODATA 2018; three significant digits).
    check(
      note(
        'levels:',
        '  - { label: ground, energy: 0 cm-1,     g: 2, population: 1.0 }',
        '  - { label: P1/2,   energy: 12579 cm-1, g: 2, population: 2.93e-3 }',
        '  - { label: P3/2,   energy: 12817 cm-1, g: 4, population: 5.20e-3 }',
      ),
      [
        [2, 9, 'T = 3100.4 K'],
        [4, 64, 'n/g = 0.496 (normalised)'],
        [5, 68, 'n/g = 0.00145 · T(P1/2–ground) = 3100 K'],
        [6, 68, 'n/g = 0.00129 · T(P3/2–P1/2) = 2870 K'],
      ],
    );
  });

  it('stay within 40 characters on every block of the demo notebook', () => {
    // 40 characters: what an editor of ordinary width shows after a short line (common practice, no source).
    for (const f of readdirSync('demo').filter((x) => x.endsWith('.md'))) {
      const state = noteState(readFileSync(join('demo', f), 'utf8'), DEFAULT_SETTINGS);
      for (const h of inlayHints(state, everything(state), DEFAULT_SETTINGS))
        assert.ok([...(h.label as string)].length <= 40, `${f}: ${h.label as string}`);
    }
  });

  it('put the hint of a populations list right after each value', () => {
    check(note('system: 1H', 'field: 9.4 T', 'populations: [0.6, 0.4]'), [
      [2, 9, 'T = 47.4 mK · P = 20.0 %'],
      [5, 17, 'n/g = 0.600'],
      [5, 22, 'n/g = 0.400'],
    ]);
  });

  it('give no level hints when a ratio stands for both levels', () => {
    check(note('gap: 10 K', 'ratio: 0.5'), [[2, 9, 'T = 14.4 K · P = 33.3 %']]);
  });

  it('are all gone when switched off', () => {
    check(note(...LEVELS), [], settings({ inlayHints: false }));
  });

  it('keep to the requested range', () => {
    // The second block's fence is on line 12; its levels A and B on lines 16 and 17.
    const text = `${note(...CONTRACT)}\n${note(...LEVELS)}`;
    const range = { start: { line: 16, character: 0 }, end: { line: 17, character: 80 } };
    check(
      text,
      [
        [16, 63, 'n/g = 0.0833 · T(A–ground) = 81.1 K'],
        [17, 63, 'n/g = 0.0100 · T(B–A) = 197 K'],
      ],
      DEFAULT_SETTINGS,
      range,
    );
  });

  it('carry the longer results and the first error message as tooltips', () => {
    const ok = noteState(note(...CONTRACT));
    const [hint] = inlayHints(ok, everything(ok), DEFAULT_SETTINGS);
    assert.match((hint.tooltip as { value: string }).value, /\| T \| 5\.61 ± 0\.19 mK \|/);
    const bad = noteState(note('system: 1H', 'field: 9.4 MT', 'polarization: 0.001'));
    assert.equal(
      inlayHints(bad, everything(bad), DEFAULT_SETTINGS)[0].tooltip,
      'field: Units are case-sensitive: `MT` is not `mT`.',
    );
  });
});

import { strict as assert } from 'node:assert';
import { hover } from '../../../src/server/features/hover';
import { inlayHints } from '../../../src/server/features/inlayHints';
import { DEFAULT_SETTINGS } from '../../../src/shared/settings';
import { note, withCursor } from '../helpers';

/** An inlay hint's label as text (a string, or parts with values). */
const labelText = (label: string | readonly { value: string }[]): string =>
  typeof label === 'string' ? label : label.map((p) => p.value).join('');

// Balmer lines with NIST ASD vacuum wavelengths, upper energies, g and A (Kramida, Ralchenko, Reader & NIST ASD
// Team, export retrieved 2026-06-15); photon counts N ∝ gA e^(−E/kT) at 10 000 K for optically thin lines (the
// Boltzmann-plot relation: H. R. Griem, Principles of Plasma Spectroscopy, 1997, ch. 6), rounded to whole counts.
const LINES = [
  'detector: photon',
  'wavelengths: vacuum',
  'lines:',
  '  - { label: Hα, upper: 97492.304 cm-1, g: 18, A: 4.4101e7, intensity: 40000 }',
  '  - { label: Hβ, upper: 102823.904 cm-1, g: 32, A: 8.4193e6, intensity: 6$0304 }',
  '  - { label: Hγ, upper: 105291.657 cm-1, g: 50, A: 2.5304e6, intensity: 2076 }',
];

function hoverText(lines: string[]): string {
  const { state, position } = withCursor(note(...lines), DEFAULT_SETTINGS);
  const h = hover(state, position, DEFAULT_SETTINGS);
  assert.ok(h);
  return (h.contents as { value: string }).value;
}

describe('hover and hints for lines', () => {
  it('shows a line its point on the Boltzmann plot, in intensities, with its √N uncertainty', () => {
    const text = hoverText(LINES.map((l) => l.replace('6$0', '$06')));
    assert.match(text, /Hβ/);
    assert.match(text, /its point on the Boltzmann plot/);
    assert.ok(text.includes('ln\\(I/\\(gA\\)\\)'), text);
    // u(y) = √N/N for N = 6304 counts: 0.0126 (Poisson counting statistics).
    assert.ok(text.includes('0\\.013 = u\\(I\\)/I, with u\\(I\\) = √I \\(Poisson'), text);
    assert.match(text, /residual from the fit/);
    assert.ok(!text.includes('u(n)/n'), text);
  });

  it('names the excitation temperature with kT in eV in the block hover and the fence hint, with no P or ε', () => {
    const lines = LINES.map((l) => l.replace('$0', ''));
    const text = hoverText(['$0' + lines[0], ...lines.slice(1)]);
    // T = 10 000 K as generated; kT = 10 000 K / 11 604.518 K/eV = 0.862 eV (e/k exact, CODATA 2022).
    assert.ok(text.includes('| T\\_ex (excitation temperature) | 10000 ± 140 K (kT = 0.862 ± 0.012 eV) |'), text);
    assert.match(text, /normal: positive excitation temperature, more population per degeneracy below/);
    assert.ok(!/\| P |ε = P/.test(text), text);
    const { state } = withCursor(note(...lines, '$0'), DEFAULT_SETTINGS);
    const hints = inlayHints(
      state,
      { start: { line: 0, character: 0 }, end: { line: 20, character: 0 } },
      DEFAULT_SETTINGS,
    );
    assert.equal(labelText(hints[0]!.label), 'T_ex = 10000 K (kT = 0.862 eV)');
  });
});

describe('inlay hints of lines', () => {
  it('put each line’s distance from the fit after it, and say which side a flagged line lies on', () => {
    // The Hβ count lowered to 60 % (self-absorbed): four lines, one flagged below (counts N ∝ gA e^(−E/kT) at
    // 10 000 K as above, Hδ from the same NIST ASD export: E_u = 106 632.1681 cm⁻¹, g = 72, A = 9.7320 × 10⁵ s⁻¹).
    const lines = [
      ...LINES.slice(0, 4),
      '  - { label: Hβ, upper: 102823.904 cm-1, g: 32, A: 8.4193e6, intensity: 3782 }',
      LINES[5],
      '  - { label: Hδ, upper: 106632.1681 cm-1, g: 72, A: 9.732e5, intensity: 948 }',
      '$0',
    ];
    const { state } = withCursor(note(...lines), DEFAULT_SETTINGS);
    const hints = inlayHints(
      state,
      { start: { line: 0, character: 0 }, end: { line: 30, character: 0 } },
      DEFAULT_SETTINGS,
    ).map((h) => labelText(h.label));
    assert.equal(hints.length, 5, hints.join(' | '));
    assert.match(hints[2], /^outlier, below · Δy = −/);
    assert.ok(!hints.some((h) => h.includes('n/g')));
  });
});

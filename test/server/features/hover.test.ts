import { strict as assert } from 'node:assert';
import { hover } from '../../../src/server/features/hover';
import { pairTemperature } from '../../../src/core';
import { DEFAULT_SETTINGS, type Settings } from '../../../src/shared/settings';
import { CONTRACT, note, settings, withCursor } from '../helpers';

/** What a hover should show: its range as [line, character, line, character] and lines it must (not) contain. */
interface Expected {
  readonly range: readonly [number, number, number, number];
  readonly includes?: readonly string[];
  readonly excludes?: readonly string[];
}

/** Hovers at the cursor marker and compares the range and the Markdown. */
function check(marked: string, expected: Expected | null, s: Settings = DEFAULT_SETTINGS): string {
  const { state, position } = withCursor(marked, s);
  const h = hover(state, position, s);
  if (expected === null) {
    assert.equal(h, null);
    return '';
  }
  assert.ok(h, 'a hover was expected');
  const value = (h.contents as { kind: string; value: string }).value;
  assert.equal((h.contents as { kind: string }).kind, 'markdown');
  const [sl, sc, el, ec] = expected.range;
  assert.deepEqual(h.range, { start: { line: sl, character: sc }, end: { line: el, character: ec } });
  for (const text of expected.includes ?? [])
    assert.ok(value.includes(text), `missing ${JSON.stringify(text)} in:\n${value}`);
  for (const text of expected.excludes ?? [])
    assert.ok(!value.includes(text), `unexpected ${JSON.stringify(text)} in:\n${value}`);
  return value;
}

const contract = (cursorLine: number, column: number): string => {
  const body = [...CONTRACT];
  body[cursorLine] = body[cursorLine].slice(0, column) + '$0' + body[cursorLine].slice(column);
  return note(...body);
};

describe('hover', () => {
  describe('on a block', () => {
    it('shows the results of the format example with the numbers the report prints, over the whole block', () => {
      const value = check(contract(4, 3), { range: [2, 0, 8, 3] });
      assert.equal(
        value,
        [
          '**cell\\-B run 7** — normal: positive spin temperature, more population per degeneracy below',
          '',
          '| result | value |',
          '| :-- | :-- |',
          '| T | 5.61 ± 0.19 mK |',
          '| β | 178.2 ± 6.1 K⁻¹ |',
          '| P | 31.2 ± 1.0 % |',
          '| P\\_th at 1\\.4 K | 0.129 % |',
          // u(ε) = u(P)/P_th = 0.010 / 0.001294 = 7.7 by JCGM 100:2008 §5.1.2 (the lattice is exact here).
          '| ε = P/P\\_th | 241.1 ± 7.7 |',
          '| S/(Nk) | 0.6437 |',
          '',
          'P = (n\\_lower − n\\_upper)/(n\\_lower + n\\_upper), levels ordered by energy; P > 0 at positive spin temperature, whatever the sign of γ.',
        ].join('\n'),
      );
    });

    it('answers on the fence lines as well as on the body', () => {
      check(note('id: fenced$0', 'gap: 10 K', 'ratio: 0.5'), { range: [2, 0, 6, 3], includes: ['**fenced**'] });
      check(note('gap: 10 K', 'ratio: 0.5').replace('```levels', '``$0`levels'), {
        range: [2, 0, 5, 3],
        includes: ['levels block at line 3'],
      });
      check(note('gap: 10 K', 'ratio: 0.5').replace(/```\n$/, '`$0``\n'), {
        range: [2, 0, 5, 3],
        includes: ['T | 14.43 K'],
      });
    });

    it('gives nothing outside the blocks', () => {
      check(`# Lab$0 note\n\n${note('gap: 10 K', 'ratio: 0.5')}`, null);
    });

    it('puts β before T when the display setting leads with β', () => {
      const value = check(contract(0, 1), { range: [2, 0, 8, 3] }, settings({ temperature: 'beta-first' }));
      assert.ok(value.indexOf('| β | 178.2 ± 6.1 K⁻¹ |') < value.indexOf('| T | 5.61 ± 0.19 mK |'), value);
    });

    it('shows temperatures in kelvin when the setting asks for it', () => {
      check(
        contract(0, 1),
        { range: [2, 0, 8, 3], includes: ['| T | 0.00561 ± 0.00019 K |'] },
        settings({ temperature: 'kelvin' }),
      );
    });

    it('says inverted, with a negative temperature, for a population inversion', () => {
      // n_u/n_l = 2 over a 10 K gap: T = −10 K / ln 2 = −14.427 K; u(T) = T² u(β) = 0.42 K for u(ratio) = 0.04;
      // P = (1 − 2)/(1 + 2) = −1/3 with u(P) = 2 u(r)/(1 + r)² = 0.0089.
      check(note('gap: 10 K', 'ratio: 2.0 ± 0.04$0'), {
        range: [2, 0, 5, 3],
        includes: [
          '— inverted: more population per degeneracy above, a negative excitation temperature',
          '| T | −14.43 ± 0.42 K |',
          '| P | −33.33 ± 0.89 % |',
        ],
      });
    });

    it('says T → ±∞ for equal populations (saturation)', () => {
      check(note('system: 1H', 'field: 9.4 T', 'populations: [0.5, 0.5]$0'), {
        range: [2, 0, 6, 3],
        includes: [
          'saturated: β is zero',
          '| T | → ±∞ (saturated) |',
          '| β | 0 K⁻¹ |',
          'Add `lattice:` to get P\\_th and ε.',
        ],
      });
    });

    it('writes the T → 0⁺ limit when the upper level is empty', () => {
      check(note('gap: 10 K', 'populations: [1, 0]$0'), {
        range: [2, 0, 5, 3],
        includes: ['| T | → 0⁺ |', '| β | → +∞ |', '| S/(Nk) | 0 |'],
      });
    });

    it('escapes an id written as HTML, so that it shows as text', () => {
      const value = check(note('id: <img src=x onerror=alert(1)>$0', 'gap: 10 K', 'ratio: 0.5'), {
        range: [2, 0, 6, 3],
        includes: ['**&lt;img src=x onerror=alert\\(1\\)&gt;**'],
      });
      assert.ok(!value.includes('<'), value);
    });

    it('escapes Markdown in an id, so that it cannot break out of bold or a table', () => {
      check(note('id: "*run* | [x](y) `z`$0"', 'gap: 10 K', 'ratio: 0.5'), {
        range: [2, 0, 6, 3],
        includes: ['**\\*run\\* \\| \\[x\\]\\(y\\) \\`z\\`**'],
      });
    });

    it('shows invalid and the first error of a block with errors', () => {
      check(note('id: hurried', 'system: 1H', 'field: 9.4 MT', 'polarization: 0.001$0'), {
        range: [2, 0, 7, 3],
        includes: [
          '**hurried** — invalid: the block has an error',
          'Error `unit-case`: field: Units are case\\-sensitive: \\`MT\\` is not \\`mT\\`\\.',
        ],
        excludes: ['| T |'],
      });
    });

    it('calls P the vector polarization ⟨I_z⟩/I for a spin above 1/2', () => {
      check(note('id: na', 'system: 23Na', 'field: 9.4 T', '$0populations: [0.4, 0.3, 0.2, 0.1]'), {
        range: [2, 0, 7, 3],
        includes: ['| P = ⟨I\\_z⟩/I | 33.33 % |', 'P is the vector polarization ⟨I\\_z⟩/I under one spin temperature'],
      });
    });

    it('gives the weighted fit’s χ²/dof and verdict for three levels with uncertainties', () => {
      check(
        note(
          'id: w',
          'levels:',
          '  - { label: a, energy: 0 K, population: 0.60 ± 0.01 }',
          '  - { label: b, energy: 10 K, population: 0.25 ± 0.01 }',
          '  - { label: c, energy: 20 K, population: 0.15 ± 0.01 }',
          '$0',
        ),
        {
          range: [2, 0, 9, 3],
          includes: [
            'non-thermal',
            'Boltzmann fit weighted by u(n)/n: χ²/dof = 12.0/1; 1 % critical value 6.63: not consistent with one temperature.',
          ],
          excludes: ['| P |'],
        },
      );
    });

    it('gives the residual rule and names the inverted pairs by label without uncertainties', () => {
      check(
        note(
          'id: mixed',
          'levels:',
          '  - { label: ground, energy: 0 cm-1, population: 0.5 }',
          '  - { label: A, energy: 100 cm-1, population: 0.2 }',
          '  - { label: B, energy: 200 cm-1, population: 0.3 }',
          '$0',
        ),
        {
          range: [2, 0, 9, 3],
          includes: [
            '(residual rule): largest \\|Δ ln(n/g)\\| = 0.441, limit ln 1.05 = 0.0488: not consistent',
            'Inverted pairs (more population per degeneracy above): A ↔ B.',
          ],
        },
      );
    });

    it('says how many levels of an unweighted fit state an uncertainty, and that u(β) takes them in', () => {
      check(
        note(
          'levels:',
          '  - { energy: 0 K, population: 1.0 }',
          '  - { energy: 1 K, population: 0.37 ± 0.01 }',
          '  - { energy: 2 K, population: 0.135 }',
          '$0',
        ),
        {
          range: [2, 0, 8, 3],
          includes: ['Boltzmann fit unweighted, 1 of 3 levels with u(n)/n (u(β) takes them in'],
          excludes: ['without uncertainties'],
        },
      );
    });
  });

  describe('on a level', () => {
    const levels = (cursorItem: number, column: number): string => {
      const items = [
        '  - { label: ground, energy: 0 cm-1,   g: 1, population: 0.70 }',
        '  - { label: A,      energy: 120 cm-1, g: 3, population: 0.25, uncertainty: 0.01 }',
        '  - { label: B,      energy: 410 cm-1, g: 5, population: 0.05 }',
      ];
      items[cursorItem] = items[cursorItem].slice(0, column) + '$0' + items[cursorItem].slice(column);
      return note('id: three', 'levels:', ...items);
    };

    it('shows its energy, degeneracy, population, n/g and the pair temperatures with both neighbours', () => {
      // 120 cm⁻¹ = 172.653 K (c₂ = 1.438 777 K cm, exact); T(ground, A) = 172.653 K / ln(0.70 / (0.25/3)) = 81.125 K;
      // T(A, B) = (589.899 − 172.653) K / ln((0.25/3) / (0.05/5)) = 196.79 K (computed by hand with the exact constants).
      check(levels(1, 8), {
        range: [6, 4, 6, 82],
        includes: [
          '**A** · level 2 of 3 from the bottom · three',
          '| E | 120.0 cm⁻¹ = 172.7 K |',
          '| g | 3 |',
          '| population | 0.250 ± 0.010 (fraction 0.2500) |',
          '| n/g | 0.08333 |',
          '| T with ground (below) | 81.13 K |',
          '| T with B (above) | 196.8 K |',
          'Pair temperature T = (E\\_u − E\\_l)/ln[(n\\_l/g\\_l)/(n\\_u/g\\_u)]',
        ],
      });
    });

    it('has no neighbour below for the lowest level', () => {
      check(levels(0, 12), {
        range: [5, 4, 5, 63],
        includes: ['| T with A (above) | 81.13 K |'],
        excludes: ['(below)'],
      });
    });

    it('shows a value of a populations list as its Zeeman level', () => {
      // 1H at 9.4 T: ν = 42.577 478 MHz/T × 9.4 T = 400.228 MHz (IUPAC 2001 γ), hν/k = 19.208 mK;
      // T = 19.208 mK / ln(0.6/0.4) = 47.37 mK.
      check(note('system: 1H', 'field: 9.4 T', 'populations: [0.6, 0.$04]'), {
        range: [5, 19, 5, 22],
        includes: [
          '**m = −1/2** · level 2 of 2',
          '| E | 400.2 MHz = 19.21 mK |',
          '| T with m = \\+1/2 (below) | 47.37 mK |',
        ],
      });
    });

    it('falls back to the block when a ratio stands for both levels', () => {
      check(note('gap: 10 K', 'ratio: 2.$00'), { range: [2, 0, 5, 3], includes: ['inverted'] });
    });
  });

  describe('on a quantity', () => {
    it('converts a transition energy to K, cm⁻¹, GHz and eV', () => {
      // H I hyperfine line, ν = 1 420 405 751.768 Hz (Hellwig et al., IEEE Trans. Instrum. Meas. IM-19, 200 (1970)):
      // hν/k = 68.1687 mK, ν/c = 0.047 380 cm⁻¹, hν = 5.8743 µeV (exact SI constants).
      check(note('gap: 1420.40$05751768 MHz', 'g: [1, 3]', 'ratio: 2.99'), {
        range: [3, 5, 3, 23],
        includes: [
          '**gap** 1420\\.405751768 MHz — Energy of the single transition',
          '| E/k | 68.17 mK |',
          '| E/hc | 0.04738 cm⁻¹ |',
          '| E/h | 1.420 GHz |',
          '| E | 5.874 × 10⁻⁶ eV |',
        ],
      });
    });

    it('gives a field as the Larmor frequency and Zeeman spacing of the block’s isotope', () => {
      // 13C: γ/2π = 10.7084 MHz/T (IUPAC 2001, Harris et al., Pure Appl. Chem. 73, 1795); 7.05 T → 75.494 MHz, hν/k = 3.6231 mK.
      check(contract(2, 8), {
        range: [5, 7, 5, 13],
        includes: ['| B | 7.050 T |', '| Larmor frequency of 13C | 75.49 MHz |', '| Zeeman spacing hν/k | 3.623 mK |'],
      });
    });

    it('still converts a field when another key of the block has an error', () => {
      check(note('system: 13C', 'field: 7.0$05 T', 'polarization: 2'), {
        range: [4, 7, 4, 13],
        includes: ['| Larmor frequency of 13C | 75.49 MHz |'],
      });
    });

    it('gives the thermal energy kT of the lattice temperature', () => {
      // kT at 1.4 K: 0.973 05 cm⁻¹, 29.171 GHz, 120.64 µeV (exact SI constants).
      check(contract(3, 10), {
        range: [6, 9, 6, 14],
        includes: ['| kT/k | 1.400 K |', '| kT/hc | 0.9730 cm⁻¹ |', '| kT/h | 29.17 GHz |', '| kT | 0.0001206 eV |'],
      });
    });

    it('converts a level energy written inside a flow item', () => {
      check(
        note(
          'levels:',
          '  - { label: x, energy: 0 cm-1, population: 0.7 }',
          '  - { label: y, energy: "12$00 cm-1", population: 0.3 }',
        ),
        {
          range: [5, 24, 5, 34],
          includes: ['**energy** 120 cm\\-1', '| E/k | 172.7 K |', '| E/hc | 120.0 cm⁻¹ |'],
        },
      );
    });
  });

  describe('pair temperature', () => {
    it('follows Boltzmann’s relation and its limits', () => {
      // n_u/n_l = (g_u/g_l) e^(−ΔE/T): with ΔE = 10 K, g = 1 : 3 and n = 1 : 1, T = 10 K / ln 3 = 9.1024 K.
      const t = pairTemperature({ energy: 0, g: 1, population: 1 }, { energy: 10, g: 3, population: 1 });
      assert.equal(t.kind, 'value');
      assert.ok(t.kind === 'value' && Math.abs(t.kelvin - 10 / Math.log(3)) < 1e-12);
      assert.deepEqual(pairTemperature({ energy: 0, g: 1, population: 2 }, { energy: 5, g: 2, population: 4 }), {
        kind: 'infinite',
      });
      assert.deepEqual(pairTemperature({ energy: 0, g: 1, population: 1 }, { energy: 5, g: 1, population: 0 }), {
        kind: 'zero',
        sign: 1,
      });
      assert.deepEqual(pairTemperature({ energy: 0, g: 1, population: 0 }, { energy: 5, g: 1, population: 1 }), {
        kind: 'zero',
        sign: -1,
      });
      assert.deepEqual(pairTemperature({ energy: 0, g: 1, population: 0 }, { energy: 5, g: 1, population: 0 }), {
        kind: 'undefined',
      });
      assert.deepEqual(pairTemperature({ energy: 5, g: 1, population: 1 }, { energy: 5, g: 1, population: 2 }), {
        kind: 'undefined',
      });
    });

    it('is negative for an inverted pair', () => {
      const t = pairTemperature({ energy: 0, g: 1, population: 1 }, { energy: 10, g: 1, population: 2 });
      assert.ok(t.kind === 'value' && Math.abs(t.kelvin + 10 / Math.log(2)) < 1e-12, JSON.stringify(t));
    });
  });
});

describe('hover: what a practitioner reads', () => {
  it('shows a level energy in the unit it was typed with every digit typed, not rounded to four', () => {
    // 11502 cm⁻¹ typed; E/k = 11502 × 1.438776877 K = 16548.8 K (second radiation constant c₂ = hc/k, CODATA 2018).
    check(
      note(
        'levels:',
        '  - { label: x, energy: 0 cm-1, population: 0.7 }',
        '  - { label: y, energy: 115$002 cm-1, population: 0.3 }',
      ),
      { range: [5, 24, 5, 34], includes: ['| E/hc | 11502 cm⁻¹ |', '| E/k | 16550 K |'] },
    );
    // The level's own hover, from the item's label, writes the energy back in cm⁻¹ as typed.
    check(
      note(
        'levels:',
        '  - { label: x, energy: 0 cm-1, population: 0.7 }',
        '  - { la$0bel: y, energy: 11502 cm-1, population: 0.3 }',
      ),
      { range: [5, 4, 5, 53], includes: ['| E | 11502 cm⁻¹ = 16550 K |'] },
    );
  });

  it('does not describe a block with only a time series by a temperature it does not have', () => {
    const value = check(
      note(
        'id: decay only',
        'series:',
        '  model: decay',
        '  time: [0 s, 10 s, 20 s, 30 s]',
        '  signal: [1.0, 0.7$04, 0.55, 0.40]',
      ),
      { range: [2, 0, 8, 3], excludes: ['positive spin temperature', 'more population below'] },
    );
    assert.match(value, /— normal: the series was fitted; the block gives no temperature/);
  });

  it('calls the unweighted series scatter what it is, the residual standard error √(SSR/(n − p)), with its value', () => {
    const times = [0, 10, 20, 30, 40];
    const signal = [1.0, 0.74, 0.55, 0.4, 0.31];
    const marked = note(
      'series:',
      '  model: decay',
      `  time: [${times.map((t) => `${t} s`).join(', ')}]`,
      `  signal: [${signal.join(', ')}]$0`,
    );
    const value = check(marked, { range: [2, 0, 7, 3], excludes: ['rms residual'] }).replace(/\\/g, '');
    // Recomputed here from the fitted T₁ and S₀ the hover prints: S(t) = S₀ exp(−t/T₁), p = 2 parameters
    // (definition of the residual standard error: e.g. NIST/SEMATECH e-Handbook of Statistical Methods §4.4.4).
    const t1 = Number(/T₁ \(decay\) \| ([\d.]+) ± /.exec(value)![1]);
    const s0 = Number(/\| S₀ \| ([\d.]+) ± /.exec(value)![1]);
    const ssr = times.reduce((acc, t, i) => acc + (signal[i] - s0 * Math.exp(-t / t1)) ** 2, 0);
    const expected = Math.sqrt(ssr / (times.length - 2));
    const shown = Number(/residual standard error √\(SSR\/\(n − p\)\) = ([\d.]+)/.exec(value)![1]);
    assert.ok(Math.abs(shown - expected) <= 0.05 * expected + 2e-4, `${shown} vs ${expected}`);
  });

  it('names every factor of the thermal-reference scale in plain words, the number of scans as “scans”', () => {
    const value = check(
      note(
        'system: 13C',
        'field: 3 T',
        'lattice: 298 K',
        'signal:',
        '  hyperpolarized: 2.985e4',
        '  thermal: 1.08e3',
        '  scans: { hyperpolarized: 1, thermal: 2$056 }',
      ),
      { range: [2, 0, 10, 3], includes: ['scans·gain·sin θ·amount'] },
    );
    assert.doesNotMatch(value, /\bNS\b/);
  });

  it('suggests a lattice for P_th and ε only where a thermal polarization means something (spins)', () => {
    check(note('system: 13C', 'field: 7.05 T', 'polarization: 0.3$01'), {
      range: [2, 0, 6, 3],
      includes: ['Add `lattice:` to get P\\_th and ε.'],
    });
    // An optical transition at 1064 nm: kT at any lab temperature is far below hν, P_th ≈ 1, ε meaningless.
    check(note('gap: 1064 nm', 'populations: [0.7$0, 0.3]'), {
      range: [2, 0, 5, 3],
      excludes: ['lattice'],
    });
  });
});

describe('hover: honest intervals and the uncertainty budget', () => {
  /** The block hover's Markdown for a body (cursor on the first line's key). */
  function blockHover(...body: string[]): string {
    const { state, position } = withCursor(note(`$0${body[0]}`, ...body.slice(1)));
    const h = hover(state, position, DEFAULT_SETTINGS);
    assert.ok(h);
    return (h.contents as { value: string }).value;
  }

  it('lists each input’s share of the uncertainties when lattice and signals both carry one', () => {
    const value = blockHover(
      'system: 13C',
      'field: 3 T',
      'lattice: 298.15 ± 3 K',
      'signal:',
      '  hyperpolarized: 2.41e4 ± 20',
      '  thermal: 1.08e3 ± 1',
      '  scans: { hyperpolarized: 1, thermal: 256 }',
      '  flip: { hyperpolarized: 5 deg, thermal: 90 deg }',
    );
    assert.match(value, /Uncertainty budget/);
    assert.match(value, /GUM JCGM 100:2008/);
    // The lattice dominates u(P) here: 98 % of u² (u(T)/T = 1 % against the signals' 0.13 %).
    assert.match(value, /\| `lattice` 298\\\.15 ± 3 K \| [\d.]+ \(98 %\) \| [\d.]+ \(98 %\)/);
    assert.match(value, /\| the signals’ noise \|/);
  });

  it('shows no budget when only the measurement carries an uncertainty', () => {
    const value = blockHover(...CONTRACT);
    assert.doesNotMatch(value, /Uncertainty budget/);
  });

  it('escapes the bars of |T| so a saturated block keeps its table', () => {
    const value = blockHover('gap: 1 K', 'populations: [1.00 ± 0.05, 0.98 ± 0.05]');
    assert.match(value, /\| T \| \\\|T\\\| ≥ [\d.]+ K \(95 %\), either sign: saturated \|/);
  });

  it('names P per degeneracy for g = [1, 3] and gives the raw difference beside it', () => {
    const value = blockHover('gap: 100 GHz', 'g: [1, 3]', 'populations: [0.4, 0.6]');
    assert.match(value, /\| P per degeneracy \| 33\.33 % \|/);
    assert.match(value, /raw \(n\\_l − n\\_u\)\/\(n\\_l \+ n\\_u\) is −0\.200/);
  });

  it('says which u(β) a fit with χ²/dof > 1 shows, and gives it scaled by the Birge ratio', () => {
    const value = blockHover(
      'levels:',
      '  - { energy: 0 K, population: 1.0, uncertainty: 0.01 }',
      '  - { energy: 100 K, population: 0.42, uncertainty: 0.0042 }',
      '  - { energy: 200 K, population: 0.12, uncertainty: 0.0012 }',
    );
    assert.match(value, /comes from the stated uncertainties of the populations/);
    assert.match(value, /Birge ratio √\(χ²\/dof\) = [\d.]+/);
  });
});

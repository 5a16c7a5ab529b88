import { strict as assert } from 'node:assert';
import {
  type Dimension,
  type Quantity,
  type QuantityProblem,
  convert,
  formatUnitList,
  parseQuantity,
  unitsFor,
} from '../../../src/core/quantities/units';

function assertClose(actual: number, expected: number, rel: number, what: string): void {
  const delta = expected === 0 ? Math.abs(actual) : Math.abs(actual - expected) / Math.abs(expected);
  assert.ok(
    delta <= rel,
    `${what}: got ${actual}, expected ${expected}, relative Δ = ${delta.toExponential(2)} > ${rel}`,
  );
}

function parsed(text: string): Quantity {
  const result = parseQuantity(text);
  assert.ok('quantity' in result, `${text} should parse, got ${JSON.stringify(result)}`);
  return result.quantity;
}

/** The converted value and uncertainty of `text`, failing the test on any problem. */
function converted(text: string, dim: Dimension, defaultUnit?: string): { value: number; uncertainty: number | null } {
  const result = convert(parsed(text), dim, defaultUnit === undefined ? {} : { defaultUnit });
  assert.ok(!('problem' in result), `${text} as ${dim}: ${JSON.stringify(result)}`);
  return result;
}

/** The problem `text` gives as `dim`, from parsing or from conversion. */
function problemOf(text: string, dim: Dimension, defaultUnit?: string): QuantityProblem {
  const p = parseQuantity(text);
  const result = 'problem' in p ? p : convert(p.quantity, dim, defaultUnit === undefined ? {} : { defaultUnit });
  assert.ok('problem' in result, `${text} as ${dim} should be a problem, got ${JSON.stringify(result)}`);
  return result.problem;
}

describe('parseQuantity', () => {
  it('reads a number and a unit with their spans', () => {
    assert.deepEqual(parsed('7.05 T'), {
      value: 7.05,
      uncertainty: null,
      unit: 'T',
      valueSpan: { start: 0, end: 4 },
      uncertaintySpan: null,
      unitSpan: { start: 5, end: 6 },
    });
  });

  it('reads an uncertainty written with a plus-minus sign, with +- and with +/-', () => {
    for (const text of ['0.312 ± 0.010', '0.312 +- 0.010', '0.312 +/- 0.010', '0.312±0.010']) {
      const q = parsed(text);
      assert.equal(q.value, 0.312, text);
      assert.equal(q.uncertainty, 0.01, text);
      assert.equal(q.unit, null, text);
    }
    assert.deepEqual(parsed('0.312 +- 0.010').uncertaintySpan, { start: 9, end: 14 });
  });

  it('reads an uncertainty followed by a unit', () => {
    assert.deepEqual(parsed('7.05 ± 0.01 T'), {
      value: 7.05,
      uncertainty: 0.01,
      unit: 'T',
      valueSpan: { start: 0, end: 4 },
      uncertaintySpan: { start: 7, end: 11 },
      unitSpan: { start: 12, end: 13 },
    });
  });

  it('reads JavaScript-style decimals with exponents, signs and a leading point', () => {
    const cases: ReadonlyArray<readonly [string, number]> = [
      ['2.0e16', 2.0e16],
      ['-3.5E-4', -3.5e-4],
      ['.5', 0.5],
      ['+4', 4],
      ['5.', 5],
      ['1e-300', 1e-300], // 1e-999 would read as 0: refused (numberNotation.test.ts)
      ['0e-999', 0],
      ['\u22122.5', -2.5],
    ];
    for (const [text, value] of cases) assert.equal(parsed(text).value, value, text);
  });

  it('allows surrounding spaces and a unit written without a space', () => {
    const q = parsed('  300K ');
    assert.equal(q.value, 300);
    assert.equal(q.unit, 'K');
    assert.deepEqual(q.unitSpan, { start: 5, end: 6 });
    assert.equal(parsed('2eV').unit, 'eV');
  });

  it('keeps the unit text as written, leaving it to convert to judge', () => {
    assert.equal(parsed('3 furlongs').unit, 'furlongs');
    assert.equal(parsed('0.01 1/cm').unit, '1/cm');
  });

  it('rejects NaN, Infinity and values that overflow double precision', () => {
    for (const text of [
      'NaN',
      'nan K',
      'Infinity',
      '-Infinity K',
      'inf',
      '1e999',
      '-1e999 K',
      '0.3 ± 1e999',
      '1 ± NaN',
    ]) {
      const p = problemOf(text, 'energy');
      assert.equal(p.code, 'number-invalid', text);
    }
    assert.deepEqual(problemOf('1e999 K', 'energy').span, { start: 0, end: 5 });
  });

  it('rejects text that does not start with a number', () => {
    for (const text of ['', 'T', 'abc', '(T', '( ) T', '--3'])
      assert.equal(problemOf(text, 'field').code, 'number-invalid', text);
  });

  it('rejects a second number after the first', () => {
    const p = problemOf('0.3 0.1', 'energy');
    assert.equal(p.code, 'number-invalid');
    assert.deepEqual(p.span, { start: 4, end: 7 });
    assert.equal(problemOf('0.3 ± 0.1 ± 0.2', 'energy').code, 'number-invalid');
  });

  it('offers a decimal point for a decimal comma', () => {
    const p = problemOf('0,5 K', 'temperature');
    assert.equal(p.code, 'number-invalid');
    assert.deepEqual(p.replacement, { title: 'Use a decimal point', span: { start: 0, end: 3 }, newText: '0.5' });
  });

  it('rejects a negative uncertainty and offers its magnitude', () => {
    const p = problemOf('0.3 ± -0.1', 'energy');
    assert.equal(p.code, 'uncertainty-negative');
    assert.deepEqual(p.span, { start: 6, end: 10 });
    assert.equal(p.replacement?.newText, '0.1');
  });
});

/**
 * Every unit of the format against its value in the canonical unit. Sources:
 * [SI] exact constants of the 2019 SI and CODATA 2022 energy equivalents via the NIST listing
 *   (1 eV = 11 604.518 121 550 08 K, 1 cm⁻¹ = 1.438 776 877 503 934 K, 1 Hz = 4.799 243 073 366 221e-11 K);
 * [P] definitions of the SI prefixes and of G, min, h, °C, deg (SI Brochure, 9th ed.; from memory);
 * [D] photon energy hc/(λk) of 1064 nm = 13 522.339 K, derived with the exact constants.
 */
const CONVERSIONS: ReadonlyArray<readonly [text: string, dim: Dimension, expected: number, tolerance: number]> = [
  ['1 J', 'energy', 7.24297051603992e22, 1e-15], // [SI] 1/k
  ['1 eV', 'energy', 11604.51812155008, 1e-15], // [SI]
  ['1 meV', 'energy', 11.60451812155008, 1e-15], // [SI], [P]
  ['1 µeV', 'energy', 0.01160451812155008, 1e-15], // [SI], [P]
  ['1 ueV', 'energy', 0.01160451812155008, 1e-15], // [SI], [P]
  ['1 cm-1', 'energy', 1.438776877503934, 1e-15], // [SI]
  ['1 cm^-1', 'energy', 1.438776877503934, 1e-15], // [SI]
  ['1 /cm', 'energy', 1.438776877503934, 1e-15], // [SI]
  ['1 Hz', 'energy', 4.799243073366221e-11, 1e-15], // [SI]
  ['1 kHz', 'energy', 4.799243073366221e-8, 1e-15], // [SI], [P]
  ['1 MHz', 'energy', 4.799243073366221e-5, 1e-15], // [SI], [P]
  ['1 GHz', 'energy', 4.799243073366221e-2, 1e-15], // [SI], [P]
  ['1 THz', 'energy', 47.99243073366221, 1e-15], // [SI], [P]
  ['1 K', 'energy', 1, 0], // energy as E/k
  ['1420.405751768 MHz', 'energy', 0.068168725, 1e-8], // 21-cm line, Hellwig et al. 1970; hν/k derived [SI]
  ['1064 nm', 'wavelengthEnergy', 13522.339, 4e-8], // [D]
  ['1.064 µm', 'wavelengthEnergy', 13522.339, 4e-8], // [D]
  ['1.064 um', 'wavelengthEnergy', 13522.339, 4e-8], // [D]
  ['1 eV', 'wavelengthEnergy', 11604.51812155008, 1e-15], // [SI]
  ['120 cm-1', 'wavelengthEnergy', 172.6532253004721, 1e-15], // [SI] 120 × c₂
  ['1 T', 'field', 1, 0],
  ['1 mT', 'field', 1e-3, 1e-16], // [P]
  ['1 G', 'field', 1e-4, 1e-16], // [P] 1 G = 10⁻⁴ T
  ['1 kG', 'field', 0.1, 1e-16], // [P] 1 kG = 10³ G
  ['50 µT', 'field', 5e-5, 1e-15], // [P]
  ['50 uT', 'field', 5e-5, 1e-15], // [P]
  ['50 nT', 'field', 5e-8, 1e-15], // [P]
  ['1.4 K', 'temperature', 1.4, 0],
  ['1 mK', 'temperature', 1e-3, 1e-16], // [P]
  ['1 µK', 'temperature', 1e-6, 1e-16], // [P]
  ['1 uK', 'temperature', 1e-6, 1e-16], // [P]
  ['1 nK', 'temperature', 1e-9, 1e-16], // [P]
  ['25 °C', 'temperature', 298.15, 1e-15], // [P] T/K = t/°C + 273.15
  ['25 degC', 'temperature', 298.15, 1e-15], // [P]
  ['-273.15 °C', 'temperature', 0, 0], // [P]
  ['1 s', 'time', 1, 0],
  ['1 ms', 'time', 1e-3, 1e-16], // [P]
  ['1 min', 'time', 60, 0], // [P]
  ['1 µs', 'time', 1e-6, 1e-16], // [P]
  ['1 ns', 'time', 1e-9, 1e-16], // [P]
  ['1 h', 'time', 3600, 0], // [P]
  ['180 deg', 'angle', Math.PI, 1e-15], // [P] 1° = π/180 rad
  ['1 rad', 'angle', 1, 0],
  ['2.0e16 cm-3', 'density', 2.0e16, 0],
  ['1 m-3', 'density', 1e-6, 1e-15], // [P] 1 m⁻³ = 10⁻⁶ cm⁻³
  ['2.8e-19 cm2', 'crossSection', 2.8e-19, 0],
  ['2.8e-23 m2', 'crossSection', 2.8e-19, 1e-15], // [P] 1 m² = 10⁴ cm²
  ['1 m', 'length', 100, 0], // [P]
  ['10 cm', 'length', 10, 0],
  ['5 mm', 'length', 0.5, 1e-15], // [P]
  ['0.01 cm-1', 'attenuation', 0.01, 0],
  ['1 m-1', 'attenuation', 0.01, 1e-15], // [P]
];

describe('powers of ten written as in print', () => {
  /** The quantity after applying the problem's fix to `text`. */
  const fixed = (text: string): { problem: QuantityProblem; after: Quantity } => {
    const r = parseQuantity(text);
    assert.ok('problem' in r, `${text} should be a problem`);
    const { span, newText } = r.problem.replacement!;
    assert.equal(r.problem.code, 'number-invalid');
    return { problem: r.problem, after: parsed(text.slice(0, span.start) + newText + text.slice(span.end)) };
  };

  it('offers e-notation for ×, x, *, · and superscript powers, keeping the unit', () => {
    const cases: [string, number, string | null][] = [
      ['1.2 × 10^3 cm-1', 1200, 'cm-1'],
      ['1.2×10³ cm-1', 1200, 'cm-1'],
      ['1.2 x 10^-3', 0.0012, null],
      ['1.2 X 10^+3 Hz', 1200, 'Hz'],
      ['1.2 * 10^ 3 K', 1200, 'K'],
      ['3 · 10^8 Hz', 3e8, 'Hz'],
      ['10^16 cm-3', 1e16, 'cm-3'],
      ['10⁻³', 1e-3, null],
      ['−10^3', -1000, null],
    ];
    for (const [text, value, unit] of cases) {
      const { after } = fixed(text);
      assertClose(after.value, value, 1e-15, text);
      assert.equal(after.unit, unit, text);
    }
  });

  it('gives the power to the uncertainty too, as (2.0 ± 0.1) × 10⁻³ means, but not twice to a number with its own', () => {
    const both = fixed('2.0 ± 0.1 × 10⁻³ T');
    assert.equal(both.problem.replacement!.newText, '2.0e-3 ± 0.1e-3');
    assertClose(both.after.value, 2e-3, 1e-15, 'value');
    assertClose(both.after.uncertainty!, 1e-4, 1e-15, 'uncertainty');
    assert.equal(both.after.unit, 'T');
    const own = fixed('1.2e3 ± 0.1 × 10^3 K');
    assert.equal(own.problem.replacement!.newText, '0.1e3');
    assert.equal(own.after.value, 1200);
    assert.equal(own.after.uncertainty, 100);
  });

  it('reads the bracketed form of the GUM, (7.05 ± 0.01) T, as 7.05 ± 0.01 T, and takes a power after the bracket for both', () => {
    // JCGM 100:2008 §7.2.2 writes a result as m_S = (100.021 47 ± 0.000 35) g.
    for (const text of ['(7.05 ± 0.01) T', ' ( 7.05 +- 0.01 )T', '(100.02147 ± 0.00035) g']) {
      const q = parsed(text);
      const plain = parsed(text.replace(/[()]/g, ''));
      assert.equal(q.value, plain.value, text);
      assert.equal(q.uncertainty, plain.uncertainty, text);
      assert.equal(q.unit, plain.unit, text);
      assert.equal(Number(text.slice(q.valueSpan.start, q.valueSpan.end)), q.value, text);
    }
    assert.deepEqual(parsed('(7.05 ± 0.01) T').valueSpan, { start: 1, end: 5 });
    assert.deepEqual(parsed('(7.05 ± 0.01) T').unitSpan, { start: 14, end: 15 });
    const both = fixed('(3.2 ± 0.1) × 10^-5');
    assert.equal(both.problem.replacement!.newText, '3.2e-5 ± 0.1e-5');
    assertClose(both.after.uncertainty!, 1e-6, 1e-15, 'u');
    // Inside brackets the power is for both, an exponent of the value's own included.
    assert.equal(fixed('(1.2e3 ± 0.1) × 10^3 K').problem.replacement!.newText, '1.2e6 ± 0.1e3');
    const open = parseQuantity('(7.05 ± 0.01 T');
    assert.ok('problem' in open && /closes before the unit/.test(open.problem.message));
  });

  it('leaves units that merely start with x, a times sign without a power, and a bare 10 alone', () => {
    assert.equal(parsed('1.2 xHz').unit, 'xHz');
    assert.equal(parsed('1.2 × 10 K').unit, '× 10 K');
    assert.equal(parsed('10 K').value, 10);
  });
});

describe('a remark in brackets after a unit', () => {
  it('says where remarks go, with a fix that keeps the unit, and only after a unit of the right kind', () => {
    const p = problemOf('77 K (LN2)', 'temperature');
    assert.equal(p.code, 'unit-unknown');
    assert.match(p.message, /`\(LN2\)` after `K` is read as part of the unit\. A remark goes after `#`/);
    assert.deepEqual(p.span, { start: 3, end: 10 });
    assert.deepEqual(p.replacement, {
      title: 'Change unit to K, dropping (LN2)',
      span: { start: 3, end: 10 },
      newText: 'K',
    });
    assert.equal(problemOf('9.4 T [nominal]', 'field').replacement?.newText, 'T');
    // Not a unit of the key's kind, or not a unit at all: the usual message.
    assert.doesNotMatch(problemOf('77 Q (LN2)', 'temperature').message, /remark/);
    assert.doesNotMatch(problemOf('9.4 K (x)', 'field').message, /remark/);
  });
});

describe('units as print and PDFs write them', () => {
  it('reads cm⁻¹, cm⁻³, cm⁻², m⁻³, m⁻¹, s⁻¹, cm² and m² as their plain spellings', () => {
    const pairs: [string, string, Dimension][] = [
      ['12 cm⁻¹', '12 cm-1', 'energy'],
      ['2e17 cm⁻³', '2e17 cm-3', 'density'],
      ['4e21 cm⁻²', '4e21 cm-2', 'column'],
      ['2e23 m⁻³', '2e23 m-3', 'density'],
      ['0.5 m⁻¹', '0.5 m-1', 'attenuation'],
      ['6.4e6 s⁻¹', '6.4e6 s-1', 'rate'],
      ['2.8e-19 cm²', '2.8e-19 cm2', 'crossSection'],
      ['2.8e-23 m²', '2.8e-23 m2', 'crossSection'],
    ];
    for (const [sup, plain, dim] of pairs) assert.deepEqual(converted(sup, dim), converted(plain, dim), sup);
    // The kelvin sign (U+212A) and the degree-Celsius sign (U+2103), which look like K and °C.
    assert.deepEqual(converted('300 \u212A', 'temperature'), converted('300 K', 'temperature'));
    assert.deepEqual(converted('1.5 \u212A', 'energy'), converted('1.5 K', 'energy'));
    assert.deepEqual(converted('25 \u2103', 'temperature'), converted('25 °C', 'temperature'));
  });
});

describe('convert', () => {
  for (const [text, dim, expected, tolerance] of CONVERSIONS) {
    it(`converts ${text} as ${dim} to ${expected}`, () => {
      assertClose(converted(text, dim).value, expected, tolerance, text);
    });
  }

  it('converts every listed unit of every dimension', () => {
    const dims: Dimension[] = [
      'energy',
      'wavelengthEnergy',
      'field',
      'temperature',
      'time',
      'angle',
      'density',
      'crossSection',
      'length',
      'attenuation',
    ];
    for (const dim of dims) {
      for (const unit of unitsFor(dim))
        assert.ok(Number.isFinite(converted(`2 ${unit}`, dim).value), `${unit} as ${dim}`);
    }
  });

  it('lets the key decide the dimension of cm-1', () => {
    assert.equal(converted('0.5 cm-1', 'attenuation').value, 0.5);
    assertClose(converted('0.5 cm-1', 'energy').value, 0.719388438751967, 1e-15, 'wavenumber'); // [SI] 0.5 × c₂
  });

  it('scales the uncertainty with the unit and leaves it unchanged by the Celsius offset', () => {
    assert.deepEqual(converted('7.05 ± 0.01 T', 'field'), { value: 7.05, uncertainty: 0.01 });
    assertClose(converted('2 ± 0.5 mT', 'field').uncertainty ?? NaN, 5e-4, 1e-15, 'mT');
    assertClose(converted('25 ± 0.1 °C', 'temperature').uncertainty ?? NaN, 0.1, 0, '°C');
    assertClose(converted('1 ± 0.01 eV', 'energy').uncertainty ?? NaN, 116.0451812155008, 1e-15, 'eV');
  });

  it('propagates a wavelength uncertainty to first order', () => {
    // GUM (JCGM 100:2008) §5.1.2: u_E = |dE/dλ| u_λ = E u_λ / λ; E(1064 nm) = 13 522.339 K (derived).
    const e = converted('1064 ± 1 nm', 'wavelengthEnergy');
    assertClose(e.uncertainty ?? NaN, 13522.339 / 1064, 1e-7, 'u_E');
  });

  it('uses the default unit for a bare number when the caller gives one', () => {
    assert.deepEqual(converted('0.5', 'time', 's'), { value: 0.5, uncertainty: null });
    assert.equal(converted('90', 'angle', 'deg').value, Math.PI / 2);
    assert.equal(converted('2 mT', 'field', 'T').value, 2e-3);
  });

  it('reports a bare number without a default unit as unit-missing', () => {
    const p = problemOf('120', 'energy');
    assert.equal(p.code, 'unit-missing');
    assert.deepEqual(p.span, { start: 0, end: 3 });
    assert.match(p.message, /cm-1/);
    assert.equal(problemOf('0.3 ± 0.1', 'temperature').code, 'unit-missing');
  });

  const wrongCase: ReadonlyArray<readonly [string, Dimension, string]> = [
    ['7 MT', 'field', 'mT'],
    ['7 t', 'field', 'T'],
    ['7 g', 'field', 'G'],
    ['93.9 Mhz', 'energy', 'MHz'],
    ['93.9 Ghz', 'energy', 'GHz'],
    ['1 ev', 'energy', 'eV'],
    ['1 EV', 'energy', 'eV'],
    ['1 mk', 'temperature', 'mK'],
    ['1 UK', 'temperature', 'µK'],
    ['25 °c', 'temperature', '°C'],
    ['3 S', 'time', 's'],
    ['3 Min', 'time', 'min'],
    ['1 CM-1', 'attenuation', 'cm-1'],
    ['1 NM', 'wavelengthEnergy', 'nm'],
  ];
  for (const [text, dim, meant] of wrongCase) {
    it(`reports ${text} as ${dim} as unit-case with the fix ${meant}`, () => {
      const p = problemOf(text, dim);
      assert.equal(p.code, 'unit-case');
      const unitStart = text.indexOf(' ') + 1;
      const span = { start: unitStart, end: text.length };
      assert.deepEqual(p.span, span);
      assert.deepEqual(p.replacement, { title: `Change unit to ${meant}`, span, newText: meant });
    });
  }

  const misspelt: ReadonlyArray<readonly [string, Dimension, string]> = [
    ['0.01 1/cm', 'attenuation', 'cm-1'],
    ['120 1/cm', 'energy', 'cm-1'],
    ['120 cm**-1', 'energy', 'cm-1'],
    ['2e16 /cm3', 'density', 'cm-3'],
    ['25 deg C', 'temperature', '°C'],
    ['5 seconds', 'time', 's'],
    ['5 hours', 'time', 'h'],
    ['1.5 tesla', 'field', 'T'],
    ['93.9 Mhx', 'energy', 'MHz'],
    ['93.9 GHzz', 'energy', 'GHz'],
    ['4 mKK', 'temperature', 'mK'],
    ['5 degree', 'angle', 'deg'],
  ];
  for (const [text, dim, meant] of misspelt) {
    it(`reports ${text} as ${dim} as unit-unknown with the fix ${meant}`, () => {
      const p = problemOf(text, dim);
      assert.equal(p.code, 'unit-unknown');
      assert.equal(p.replacement?.newText, meant);
      assert.match(p.message, new RegExp(`did you mean \`${meant.replace(/[-^*]/g, '\\$&')}\``));
    });
  }

  it('reports an unknown unit without a fix when nothing is near, listing the accepted units', () => {
    const p = problemOf('3 furlongs', 'length');
    assert.equal(p.code, 'unit-unknown');
    assert.equal(p.replacement, undefined);
    assert.deepEqual(p.span, { start: 2, end: 10 });
    assert.match(p.message, /m, cm, mm/);
    assert.equal(problemOf('3 x', 'field').replacement, undefined);
  });

  it('reports a unit of another dimension as unit-dimension naming the dimension needed', () => {
    const p = problemOf('3 eV', 'field');
    assert.equal(p.code, 'unit-dimension');
    assert.deepEqual(p.span, { start: 2, end: 4 });
    assert.match(p.message, /magnetic field/);
    assert.equal(p.replacement, undefined);
    const cases: ReadonlyArray<readonly [string, Dimension, RegExp]> = [
      ['7.05 T', 'energy', /an energy/],
      ['1.4 K', 'field', /energy or a temperature/],
      ['5 s', 'temperature', /a temperature/],
      ['2 cm-1', 'length', /a length/],
      ['3 mT', 'time', /a time/],
      ['25 °C', 'energy', /an energy/],
      ['2 cm', 'attenuation', /attenuation/],
      ['2 cm2', 'density', /number density/],
      ['3 K', 'angle', /an angle/],
    ];
    for (const [text, dim, expected] of cases) {
      const q = problemOf(text, dim);
      assert.equal(q.code, 'unit-dimension', text);
      assert.match(q.message, expected, text);
    }
  });

  it('accepts a wavelength only for a transition energy', () => {
    const p = problemOf('1064 nm', 'energy');
    assert.equal(p.code, 'unit-dimension');
    assert.match(p.message, /transition energy/);
  });

  it('rejects a zero or negative wavelength', () => {
    assert.equal(problemOf('0 nm', 'wavelengthEnergy').code, 'number-invalid');
    assert.equal(problemOf('-500 nm', 'wavelengthEnergy').code, 'number-invalid');
  });

  it('rejects a value that overflows during conversion', () => {
    // 1e308 J / k exceeds the largest double.
    assert.equal(problemOf('1e308 J', 'energy').code, 'number-invalid');
  });

  it('treats names of JavaScript object properties as unknown units', () => {
    for (const unit of ['toString', 'constructor', '__proto__', 'hasOwnProperty']) {
      assert.equal(problemOf(`3 ${unit}`, 'field').code, 'unit-unknown', unit);
    }
  });

  it('reports an invalid default unit instead of throwing', () => {
    assert.equal(problemOf('3', 'field', 'eV').code, 'unit-dimension');
  });
});

describe('unit lists', () => {
  it('lists the canonical units of each dimension for completion', () => {
    assert.deepEqual(unitsFor('field'), ['T', 'mT', 'µT', 'nT', 'G', 'kG']);
    assert.deepEqual(unitsFor('temperature'), ['K', 'mK', 'µK', 'nK', '°C']);
    assert.deepEqual(unitsFor('energy'), ['J', 'eV', 'meV', 'µeV', 'cm-1', 'Hz', 'kHz', 'MHz', 'GHz', 'THz', 'K']);
    assert.deepEqual(unitsFor('wavelengthEnergy').slice(-5), ['nm', 'µm', 'Å', 'mm', 'cm']);
    assert.deepEqual(unitsFor('attenuation'), ['cm-1', 'm-1']);
  });

  it('formats a unit list for messages', () => {
    assert.equal(formatUnitList('time'), 's, ms, µs, ns, min, h');
  });
});

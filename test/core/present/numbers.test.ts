import { strict as assert } from 'node:assert';
import {
  formatFraction,
  formatInverseTemperature,
  formatMeasured,
  formatNumber,
  formatPlainNumber,
  formatTemperature,
} from '../../../src/core/present/numbers';

const NON_FINITE = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY];
/** Characters a display string may contain: printable ASCII plus ±, −, µ, ⁻, superscript digits, × and the dash. */
const DISPLAY_SAFE = /^[\x20-\x7E±\u2212µ⁻⁰¹²³⁴⁵⁶⁷⁸⁹×—]*$/;

describe('formatMeasured', () => {
  it('rounds the GUM example 10.057 62 with u = 0.027 18 to 10.058 ± 0.027', () => {
    // JCGM 100:2008 §7.2.6: y = 10.057 62 Ω, u_c = 27 mΩ → 10.058 Ω.
    assert.equal(formatMeasured(10.05762, 0.02718), '10.058 ± 0.027');
  });

  it('keeps two significant digits of uncertainty when rounding carries into a new digit', () => {
    // JCGM 100:2008 §7.2.6 (two significant digits); 0.0996 rounds to 0.10, 9.96 to 10.
    assert.equal(formatMeasured(1.23456, 0.0996), '1.23 ± 0.10');
    assert.equal(formatMeasured(123.456, 9.96), '123 ± 10');
  });

  it('rounds to tens or hundreds when the uncertainty is large', () => {
    // JCGM 100:2008 §7.2.6: value to the decimal position of the two-digit uncertainty.
    assert.equal(formatMeasured(12345, 270), '12350 ± 270');
  });

  it('writes negative values with the minus sign U+2212 and drops the sign of a rounded zero', () => {
    // Arbitrary inputs; U+2212 is the typographic minus (common practice, no source).
    assert.equal(formatMeasured(-0.312, 0.01), '\u22120.312 ± 0.010');
    assert.equal(formatMeasured(-0.0001, 0.02), '0.000 ± 0.020');
  });

  it('uses a common power of ten for very large and very small values', () => {
    // Arbitrary inputs; two-digit rounding by JCGM 100:2008 §7.2.6, the ×10ⁿ layout is common practice, no source.
    assert.equal(formatMeasured(2.4e16, 3e14), '(2.400 ± 0.030) × 10¹⁶');
    assert.equal(formatMeasured(3.2211855e-5, 1.2e-7), '(3.221 ± 0.012) × 10⁻⁵');
  });

  it('gives the requested significant digits when there is no uncertainty', () => {
    // Significant-digit rounding, common practice, no source.
    assert.equal(formatMeasured(10.05762, null), '10.06');
    assert.equal(formatMeasured(10.05762, null, { digits: 6 }), '10.0576');
    assert.equal(formatMeasured(10.05762, 0), '10.06');
  });

  it('shows a dash for a non-finite value or uncertainty and never NaN', () => {
    for (const x of NON_FINITE) {
      assert.equal(formatMeasured(x, 0.1), '—');
      assert.equal(formatMeasured(1.5, x), '1.500 ± —');
    }
  });
});

describe('formatNumber', () => {
  it('gives significant digits in fixed notation between 1e-4 and 1e6', () => {
    // Arbitrary inputs; significant-digit rounding, common practice, no source.
    assert.equal(formatNumber(0.0032211855), '0.003221');
    assert.equal(formatNumber(-14.42695), '\u221214.43');
    assert.equal(formatNumber(999.96), '1000');
    assert.equal(formatNumber(0.5), '0.5000');
    assert.equal(formatNumber(123456, 3), '123000');
  });

  it('switches to a power of ten outside that range', () => {
    // Arbitrary inputs; common practice, no source.
    assert.equal(formatNumber(3.2211855e-5, 5), '3.2212 × 10⁻⁵');
    assert.equal(formatNumber(-2.4e16, 2), '\u22122.4 × 10¹⁶');
    assert.equal(formatNumber(1e6, 1), '1 × 10⁶');
  });

  it('writes zero as 0 and a non-finite number as a dash', () => {
    assert.equal(formatNumber(0), '0');
    assert.equal(formatNumber(-0), '0');
    for (const x of NON_FINITE) assert.equal(formatNumber(x), '—');
  });
});

describe('formatTemperature', () => {
  it('writes T = 14.426 950 K with u = 0.416 274 K as 14.43 ± 0.42 K', () => {
    // Excitation temperature for ΔE/k = 10 K, r = 0.50 ± 0.01 (derived), rounded by JCGM 100:2008 §7.2.6.
    assert.equal(formatTemperature(14.42695, 0.416274), '14.43 ± 0.42 K');
  });

  it('keeps the sign of a negative temperature', () => {
    // The inverted case r = 2.00 ± 0.04 of the same derivation: T = −14.43 K, u = 0.42 K.
    assert.equal(formatTemperature(-14.42695, 0.416274), '\u221214.43 ± 0.42 K');
  });

  it('writes 0.005 613 K with u = 0.000 193 K as 5.61 ± 0.19 mK', () => {
    // JCGM 100:2008 §7.2.6 rounding after the milli prefix (example inputs; common practice, no source).
    assert.equal(formatTemperature(0.005613, 0.000193), '5.61 ± 0.19 mK');
  });

  it('picks the prefix from the size of the temperature', () => {
    // 13C at 9.4 T with P = 0.30: T_s = 7.803 8136 mK (derived from IUPAC 2001 γ and exact h/k).
    assert.equal(formatTemperature(7.8038136e-3, null), '7.804 mK');
    assert.equal(formatTemperature(-7.8038136e-3, null), '\u22127.804 mK');
    // Arbitrary inputs; JCGM 100:2008 §7.2.6 rounding after the SI prefix (common practice, no source).
    assert.equal(formatTemperature(2.5e-7, 3e-8), '250 ± 30 nK');
    assert.equal(formatTemperature(4.2e-6, null), '4.200 µK');
    assert.equal(formatTemperature(298.15, null), '298.2 K'); // half rounds away from zero on the decimal form
    assert.equal(formatTemperature(0, null), '0 K');
  });

  it('uses a power of ten at 1e5 K and above and below 1e-9 K', () => {
    // Arbitrary inputs except 19 508.61 K, the |T_ex| of an Nd:YAG-like inversion N₂/N₁ = 2 at 1064 nm
    // (derived with exact SI 2019 constants); layout common practice, no source.
    assert.equal(formatTemperature(1.2e5, null, { digits: 2 }), '1.2 × 10⁵ K');
    assert.equal(formatTemperature(-1.23e5, 5e3), '(\u22121.230 ± 0.050) × 10⁵ K');
    assert.equal(formatTemperature(5e-10, null), '5.000 × 10⁻¹⁰ K');
    assert.equal(formatTemperature(19508.61, null), '19510 K');
  });

  it('writes plain kelvin in kelvin mode', () => {
    // Same inputs as the millikelvin case; JCGM 100:2008 §7.2.6.
    assert.equal(formatTemperature(0.005613, 0.000193, { mode: 'kelvin' }), '0.00561 ± 0.00019 K');
  });

  it('shows a dash for an infinite temperature (beta = 0) and for NaN', () => {
    for (const x of NON_FINITE) assert.equal(formatTemperature(x, 1), '—');
  });
});

describe('formatInverseTemperature', () => {
  it('writes beta = 0.069 314 718 K⁻¹ with u = 0.002 K⁻¹ as 0.0693 ± 0.0020 K⁻¹', () => {
    // β = ln 2 / (10 K) with u = 0.01/(0.5 × 10 K) (derived), rounded by JCGM 100:2008 §7.2.6.
    assert.equal(formatInverseTemperature(0.069314718, 0.002), '0.0693 ± 0.0020 K⁻¹');
  });

  it('writes large and small inverse temperatures with a power of ten', () => {
    // Arbitrary inputs; JCGM 100:2008 §7.2.6 rounding, layout common practice, no source.
    assert.equal(formatInverseTemperature(1.234e8, 5.6e6), '(1.234 ± 0.056) × 10⁸ K⁻¹');
    assert.equal(formatInverseTemperature(-3.2e-5, null), '\u22123.200 × 10⁻⁵ K⁻¹');
  });

  it('writes zero and a dash for non-finite input', () => {
    // Common practice, no source.
    assert.equal(formatInverseTemperature(0, null), '0 K⁻¹');
    assert.equal(formatInverseTemperature(0, 0.004), '0.0000 ± 0.0040 K⁻¹');
    for (const x of NON_FINITE) assert.equal(formatInverseTemperature(x, null), '—');
  });
});

describe('formatFraction', () => {
  it('writes a polarization as a fraction or in percent by the GUM rule', () => {
    // P = 0.312 ± 0.010 are example inputs (common practice, no source); rounding JCGM 100:2008 §7.2.6.
    assert.equal(formatFraction(0.312, 0.01), '0.312 ± 0.010');
    assert.equal(formatFraction(0.312, 0.01, { percent: true }), '31.2 ± 1.0 %');
    // Free electron, 3.35 T, 1.2 K: P = 0.954 2581 (derived from CODATA 2022 γ_e and exact h/k).
    assert.equal(formatFraction(0.9542581, null, { percent: true }), '95.43 %');
  });

  it('writes a small thermal polarization with a power of ten', () => {
    // 13C, 9.4 T, 298.15 K: P = 8.101 403e-6 (derived from IUPAC 2001 γ and exact h/k).
    assert.equal(formatFraction(8.101403e-6, null), '8.101 × 10⁻⁶');
  });

  it('keeps percent for small values too, with a power of ten in the same unit', () => {
    // Same 13C value as above, 8.101 403e-6 = 8.101 403e-4 %: the unit the setting asks for, never a bare fraction.
    assert.equal(formatFraction(8.101403e-6, null, { percent: true }), '8.101 × 10⁻⁴ %');
    // A saturated proton line, P = 0.0004 ± 0.0005 (example input): 0.040 ± 0.050 % (JCGM 100:2008 §7.2.6).
    assert.equal(formatFraction(0.0004, 0.0005, { percent: true }), '0.040 ± 0.050 %');
    assert.equal(formatFraction(2.587e-6, 1e-7, { percent: true }), '(2.59 ± 0.10) × 10⁻⁴ %');
  });

  it('shows a dash for non-finite input', () => {
    for (const x of NON_FINITE) assert.equal(formatFraction(x, null, { percent: true }), '—');
  });
});

describe('formatPlainNumber', () => {
  it('writes the shortest ASCII text that reads back as the same number', () => {
    for (const x of [0.005613, 2.4e16, -3, 1e-7, 178.17, 1.438776877503934, 5e-324]) {
      const text = formatPlainNumber(x);
      assert.match(text, /^[-+.0-9e]+$/);
      assert.equal(Number(text), x);
    }
  });

  it('writes an empty cell for a non-finite number', () => {
    for (const x of NON_FINITE) assert.equal(formatPlainNumber(x), '');
  });
});

describe('display strings', () => {
  it('never contain NaN or Infinity and use only the allowed characters', () => {
    const values = [0, -0, 1, -1, 1e-320, 5e-324, 1e308, -1e308, 0.1, 123456.789, ...NON_FINITE];
    const uncertainties = [null, 0, 1e-320, 1e-3, 1e308, -1, ...NON_FINITE];
    for (const x of values) {
      for (const u of uncertainties) {
        const texts = [
          formatMeasured(x, u),
          formatTemperature(x, u),
          formatTemperature(x, u, { mode: 'kelvin' }),
          formatInverseTemperature(x, u),
          formatFraction(x, u),
          formatFraction(x, u, { percent: true }),
          formatNumber(x),
        ];
        for (const text of texts) {
          assert.doesNotMatch(text, /NaN|Infinity|undefined/, `${x}, ${u}: ${text}`);
          assert.match(text, DISPLAY_SAFE, `${x}, ${u}: ${text}`);
        }
      }
    }
  });
});

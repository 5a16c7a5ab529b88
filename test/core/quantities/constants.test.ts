import { strict as assert } from 'node:assert';
import {
  AVOGADRO,
  BOHR_MAGNETON,
  BOLTZMANN,
  CODATA_EDITION,
  ELECTRON_G_FACTOR,
  ELECTRON_GYROMAGNETIC_RATIO,
  ELEMENTARY_CHARGE,
  HBAR,
  KELVIN_PER_EV,
  KELVIN_PER_HERTZ,
  KELVIN_PER_JOULE,
  KELVIN_PER_WAVENUMBER,
  NUCLEAR_MAGNETON,
  PLANCK,
  PROTON_GYROMAGNETIC_RATIO,
  SPEED_OF_LIGHT,
  photonEnergyKelvinFromWavelength,
} from '../../../src/core/quantities/constants';

/** Fails with the relative difference when |actual − expected| > rel·|expected|. */
function assertClose(actual: number, expected: number, rel: number, what: string): void {
  const delta = Math.abs(actual - expected) / Math.abs(expected);
  assert.ok(
    delta <= rel,
    `${what}: got ${actual}, expected ${expected}, relative Δ = ${delta.toExponential(2)} > ${rel}`,
  );
}

describe('constants', () => {
  it('names the CODATA edition of the measured constants', () => {
    assert.equal(CODATA_EDITION, 'CODATA 2022');
  });

  it('uses the exact defining constants of the 2019 SI', () => {
    // BIPM SI Brochure, 9th ed. (2019); same digits in the NIST CODATA 2018 and 2022 listings.
    assert.equal(PLANCK, 6.62607015e-34);
    assert.equal(BOLTZMANN, 1.380649e-23);
    assert.equal(ELEMENTARY_CHARGE, 1.602176634e-19);
    assert.equal(SPEED_OF_LIGHT, 299792458);
    assert.equal(AVOGADRO, 6.02214076e23);
  });

  it('derives hbar as h over two pi', () => {
    // ħ = h/2π = 1.054 571 817 646 156 39… × 10⁻³⁴ J s, exact arithmetic on the SI 2019 h.
    assertClose(HBAR, 1.05457181764615639e-34, 2e-16, 'ħ');
  });

  it('uses the CODATA 2022 values of the measured constants', () => {
    // CODATA 2022 (Mohr, Newell, Taylor, Tiesinga, arXiv:2409.03787) via the NIST listing.
    assert.equal(BOHR_MAGNETON, 9.2740100657e-24);
    assert.equal(NUCLEAR_MAGNETON, 5.0507837393e-27);
    assert.equal(ELECTRON_G_FACTOR, -2.00231930436092);
    assert.equal(ELECTRON_GYROMAGNETIC_RATIO, 1.76085962784e11);
    assert.equal(PROTON_GYROMAGNETIC_RATIO, 2.6752218708e8);
  });

  it('keeps the electron g-factor negative and its gyromagnetic ratio a positive magnitude', () => {
    // CODATA lists |γ_e| and a negative g_e (CODATA 2022).
    assert.ok(ELECTRON_G_FACTOR < 0);
    assert.ok(ELECTRON_GYROMAGNETIC_RATIO > 0);
  });

  it('agrees with |g_e| μ_B / ħ = |γ_e| within the CODATA uncertainty', () => {
    // CODATA 2022: γ_e = 1.760 859 627 84(55) × 10¹¹, a relative standard uncertainty of 3.1e-10.
    assertClose((Math.abs(ELECTRON_G_FACTOR) * BOHR_MAGNETON) / HBAR, ELECTRON_GYROMAGNETIC_RATIO, 1e-9, '|g_e| μ_B/ħ');
  });

  it('gives the CODATA 2022 gyromagnetic ratios over two pi in MHz per tesla', () => {
    // CODATA 2022 via the NIST listing: γ_e/2π = 28 024.951 3861 MHz/T, γ_p/2π = 42.577 478 461 MHz/T.
    // The listing prints 12 digits, so rounding alone allows a relative 1.8e-12.
    assertClose(ELECTRON_GYROMAGNETIC_RATIO / (2 * Math.PI) / 1e6, 28024.9513861, 3e-12, 'γ_e/2π');
    assertClose(PROTON_GYROMAGNETIC_RATIO / (2 * Math.PI) / 1e6, 42.577478461, 1e-10, 'γ_p/2π');
  });

  it('converts one electronvolt to 11 604.518 121 55 K', () => {
    // CODATA 2022 via the NIST listing ("electron volt-kelvin relationship"), exact since the 2019 SI.
    assertClose(KELVIN_PER_EV, 11604.51812155008, 1e-15, 'e/k');
  });

  it('converts one reciprocal centimetre to 1.438 776 877 503 934 K, the second radiation constant', () => {
    // CODATA 2022 via the NIST listing (c₂ = 1.438 776 877… × 10⁻² m K), exact since the 2019 SI.
    assertClose(KELVIN_PER_WAVENUMBER, 1.438776877503934, 1e-15, '100 h c/k');
  });

  it('converts one hertz to 4.799 243 073 366 221e-11 K', () => {
    // CODATA 2022 via the NIST listing ("hertz-kelvin relationship"), exact since the 2019 SI.
    assertClose(KELVIN_PER_HERTZ, 4.799243073366221e-11, 1e-15, 'h/k');
  });

  it('converts one joule to 1/k kelvin', () => {
    // k = 1.380 649 × 10⁻²³ J/K exact (SI 2019) ⇒ 1 J ≙ 7.242 970 516 039 920e22 K (exact arithmetic).
    assertClose(KELVIN_PER_JOULE, 7.24297051603992e22, 1e-15, '1/k');
  });

  it('reproduces the inverse relationships of the CODATA listing', () => {
    // CODATA 2022 via the NIST listing, exact since 2019: 1 K = 0.695 034 800 486 127 cm⁻¹,
    // 1 K = 2.083 661 912 332 757e10 Hz, 1 K = 8.617 333 262e-5 eV, 1 eV = 8065.543 937 349 21 cm⁻¹.
    assertClose(1 / KELVIN_PER_WAVENUMBER, 0.695034800486127, 1e-15, 'k/hc');
    assertClose(1 / KELVIN_PER_HERTZ, 2.083661912332757e10, 1e-15, 'k/h');
    assertClose(1 / KELVIN_PER_EV, 8.617333262e-5, 1e-9, 'k/e');
    assertClose(KELVIN_PER_EV / KELVIN_PER_WAVENUMBER, 8065.54393734921, 1e-15, 'e/hc');
  });

  it('gives the photon energy of 1064 nm as 13 522.339 K and 1.165 265 eV', () => {
    // hc/(λk) for λ = 1064 nm, derived with exact SI 2019 constants (30-digit arithmetic): 13 522.339 K, 1.165 265 eV.
    const kelvin = photonEnergyKelvinFromWavelength(1064e-9);
    assert.ok(Math.abs(kelvin - 13522.339) < 5e-4, `got ${kelvin}`);
    assert.ok(Math.abs(kelvin / KELVIN_PER_EV - 1.165265) < 5e-7, `got ${kelvin / KELVIN_PER_EV} eV`);
  });

  it('gives the temperature equivalent of the hydrogen 21-cm line as 0.068 168 725 K', () => {
    // ν₁₀ = 1 420 405 751.768 Hz (Hellwig et al., IEEE Trans. Instrum. Meas. IM-19, 200 (1970));
    // hν/k = 0.068 168 725 K derived with the exact h/k.
    assertClose(1420405751.768 * KELVIN_PER_HERTZ, 0.068168725, 1e-8, 'T* of the 21-cm line');
  });

  it('returns Infinity for a zero wavelength and a negative energy for a negative one, leaving the domain check to callers', () => {
    assert.equal(photonEnergyKelvinFromWavelength(0), Infinity);
    assert.ok(photonEnergyKelvinFromWavelength(-1e-6) < 0);
  });
});

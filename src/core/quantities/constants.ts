/**
 * Physical constants in SI units, and energy equivalences expressed in kelvin.
 *
 * The defining constants (h, k, e, c, N_A) are exact since the 2019 revision
 * of the SI (BIPM SI Brochure, 9th edition). The measured constants all come
 * from one CODATA edition, named by {@link CODATA_EDITION}, as read in the NIST
 * listing of CODATA 2022 (Mohr, Newell, Taylor, Tiesinga, arXiv:2409.03787).
 * Mixing editions would show up in the 9th–10th digit of γ_e and γ_p.
 */

/** The CODATA edition of every measured constant in this file. */
export const CODATA_EDITION = 'CODATA 2022';

/** Planck constant h in J s (exact, SI 2019). */
export const PLANCK = 6.62607015e-34;

/** Reduced Planck constant ħ = h/2π in J s (exact by definition; rounded to double precision). */
export const HBAR = PLANCK / (2 * Math.PI);

/** Boltzmann constant k in J K⁻¹ (exact, SI 2019). */
export const BOLTZMANN = 1.380649e-23;

/** Elementary charge e in C (exact, SI 2019). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;

/** Speed of light in vacuum c in m s⁻¹ (exact, SI 2019). */
export const SPEED_OF_LIGHT = 299792458;

/** Avogadro constant N_A in mol⁻¹ (exact, SI 2019). */
export const AVOGADRO = 6.02214076e23;

/** Bohr magneton μ_B in J T⁻¹ (CODATA 2022: 9.274 010 0657(29) × 10⁻²⁴). */
export const BOHR_MAGNETON = 9.2740100657e-24;

/** Nuclear magneton μ_N in J T⁻¹ (CODATA 2022: 5.050 783 7393(16) × 10⁻²⁷). */
export const NUCLEAR_MAGNETON = 5.0507837393e-27;

/**
 * Free-electron g-factor g_e, dimensionless and negative (CODATA 2022:
 * −2.002 319 304 360 92(36)). The sign makes m = −1/2 the lower Zeeman level.
 */
export const ELECTRON_G_FACTOR = -2.00231930436092;

/**
 * Magnitude of the electron gyromagnetic ratio |γ_e| in s⁻¹ T⁻¹ (CODATA 2022:
 * 1.760 859 627 84(55) × 10¹¹). CODATA lists the magnitude; the sign is that of g_e.
 */
export const ELECTRON_GYROMAGNETIC_RATIO = 1.76085962784e11;

/** Proton gyromagnetic ratio γ_p in s⁻¹ T⁻¹ (bare proton, CODATA 2022: 2.675 221 8708(11) × 10⁸). */
export const PROTON_GYROMAGNETIC_RATIO = 2.6752218708e8;

/** Kelvin per joule, 1/k: the temperature equivalent of an energy of 1 J (exact). */
export const KELVIN_PER_JOULE = 1 / BOLTZMANN;

/** Kelvin per electronvolt, e/k ≈ 11 604.518 K (exact since 2019). */
export const KELVIN_PER_EV = ELEMENTARY_CHARGE / BOLTZMANN;

/**
 * Kelvin per wavenumber in cm⁻¹, 100 h c / k ≈ 1.438 777 K: the second radiation
 * constant c₂ expressed in cm K (exact since 2019).
 */
export const KELVIN_PER_WAVENUMBER = (100 * PLANCK * SPEED_OF_LIGHT) / BOLTZMANN;

/** Kelvin per hertz, h/k ≈ 4.799 243 × 10⁻¹¹ K (exact since 2019). */
export const KELVIN_PER_HERTZ = PLANCK / BOLTZMANN;

/**
 * Photon energy E = h c / λ of a vacuum wavelength, expressed in kelvin (E/k).
 *
 * @param lambdaMetres vacuum wavelength in metres; meaningful for λ > 0 only
 *   (λ = 0 gives Infinity, a negative λ a negative number; callers check the domain).
 * @returns h c / (λ k) in K.
 */
export function photonEnergyKelvinFromWavelength(lambdaMetres: number): number {
  return (PLANCK * SPEED_OF_LIGHT) / (lambdaMetres * BOLTZMANN);
}

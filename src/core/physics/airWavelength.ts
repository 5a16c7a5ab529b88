/**
 * Air and vacuum wavelengths. By the IAU convention, wavelengths above 200 nm
 * are quoted in standard air and those below in vacuum; a photon's energy is
 * E = hc/λ_vac, so an air wavelength must be turned into a vacuum one first.
 *
 * Refractive index of standard dry air (15 °C, 101 325 Pa, 0.045 % CO₂):
 * D. C. Morton, ApJS 130, 403 (2000), eq. 8 (the Edlén-type fit that the
 * IAU adopted), with σ = 1/λ_vac in µm⁻¹:
 *
 *   n − 1 = 8.34254 × 10⁻⁵ + 2.406147 × 10⁻² / (130 − σ²) + 1.5998 × 10⁻⁴ / (38.9 − σ²).
 *
 * (Coefficients from memory of Morton 2000; the tests check them against the
 * air and vacuum wavelengths of NIST ASD argon lines. P. E. Ciddor, Appl.
 * Opt. 35, 1566 (1996) gives the more general formula for other air
 * conditions.) Valid from 200 nm into the near infrared; the poles at
 * σ² = 38.9 and 130 µm⁻² lie below 200 nm.
 */

/** Shortest wavelength, in nm, that the IAU convention quotes in air. */
export const AIR_FROM_NM = 200;

/** Refractive index of standard air at the vacuum wavelength `vacuumNm` (nm), Morton (2000) eq. 8. */
export function airIndex(vacuumNm: number): number {
  const s2 = (1e3 / vacuumNm) ** 2;
  return 1 + 8.34254e-5 + 2.406147e-2 / (130 - s2) + 1.5998e-4 / (38.9 - s2);
}

/** λ_air = λ_vac / n(λ_vac), in nm. */
export function vacuumToAir(vacuumNm: number): number {
  return vacuumNm / airIndex(vacuumNm);
}

/**
 * λ_vac from λ_air (nm): the fixed point of λ_vac = λ_air · n(λ_vac). n varies
 * so slowly that each step gains about four digits; six steps reach double
 * precision. Below {@link AIR_FROM_NM} the value is returned unchanged (the
 * convention has no air wavelengths there).
 */
export function airToVacuum(airNm: number): number {
  if (!(airNm >= AIR_FROM_NM) || !Number.isFinite(airNm)) return airNm;
  let v = airNm;
  for (let i = 0; i < 6; i++) v = airNm * airIndex(v);
  return v;
}

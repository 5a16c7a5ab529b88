/**
 * Small-signal gain of an optical transition from absolute populations
 * (A. E. Siegman, Lasers, University Science Books 1986; O. Svelto,
 * Principles of Lasers, 5th ed., Springer 2010 — cited from memory):
 * g₀ = σ (N_u − (g_u/g_l) N_l); single-pass gain G = exp(g₀ L); threshold
 * from R₁R₂ exp[2(g_th − α)L] = 1, g_th = α + ln(1/(R₁R₂))/(2L)
 * (B. E. A. Saleh, M. C. Teich, Fundamentals of Photonics).
 */

/** Inversion density ΔN = N_u − (g_u/g_l)·N_l in cm⁻³ (Siegman 1986, ch. 1, cited from memory). */
export function inversionDensity(nLower: number, nUpper: number, gLower: number, gUpper: number): number {
  return nUpper - (gUpper / gLower) * nLower;
}

/** Threshold inversion ΔN_th = g_th/σ in cm⁻³, from g_th in cm⁻¹ and σ in cm² (g₀ = σ·ΔN at threshold). */
export function thresholdInversion(thresholdPerCm: number, sigma: number): number {
  return thresholdPerCm / sigma;
}

/** A power ratio in decibels, 10 log₁₀ G; for G = exp(g₀L) this is (10/ln 10)·g₀L, exact even where exp overflows. */
export function gainDecibels(g0: number, lengthCm: number): number {
  return (10 / Math.LN10) * g0 * lengthCm;
}

/** g₀ in cm⁻¹ from σ (cm²) and densities (cm⁻³) with degeneracies. */
export function gainCoefficient(sigma: number, nLower: number, nUpper: number, gLower: number, gUpper: number): number {
  return sigma * (nUpper - (gUpper / gLower) * nLower);
}

/** Single-pass power gain exp(g₀ L), L in cm. */
export function singlePassGain(g0: number, lengthCm: number): number {
  return Math.exp(g0 * lengthCm);
}

/** Threshold gain coefficient g_th = α + ln(1/(R₁R₂))/(2L) in cm⁻¹. */
export function thresholdGain(lossPerCm: number, r1: number, r2: number, lengthCm: number): number {
  return lossPerCm + Math.log(1 / (r1 * r2)) / (2 * lengthCm);
}

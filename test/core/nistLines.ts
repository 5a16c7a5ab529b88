/**
 * Emission lines for the Boltzmann-plot tests, from the NIST Atomic Spectra Database (A. Kramida, Yu. Ralchenko,
 * J. Reader and NIST ASD Team; tab-separated export retrieved 2026-06-15): vacuum λ (nm), upper-level energy
 * E_k (cm⁻¹), g_k, A_ki (s⁻¹).
 */

/** Ar I 4p → 4s (transition-probability reference T5223). */
export const ARGON = [
  [811.7542, 105462.7596, 7, 3.3e7],
  [763.7208, 106237.5518, 5, 2.45e7],
  [810.5921, 106087.2598, 3, 2.5e7],
  [801.699, 105617.27, 5, 9.3e6],
  [795.0362, 107131.7086, 3, 1.86e7],
  [751.6721, 107054.272, 1, 4.0e7],
  [738.6014, 107289.7001, 5, 8.5e6],
  [696.7352, 107496.4166, 3, 6.4e6],
  [750.5935, 108722.6194, 1, 4.5e7],
] as const;

/** H I Balmer lines (A-values attributed to Wiese & Fuhr, J. Phys. Chem. Ref. Data 38, 565 (2009)). */
export const BALMER = [
  [656.4632, 97492.304, 18, 4.4101e7],
  [486.2691, 102823.904, 32, 8.4193e6],
  [434.1691, 105291.657, 50, 2.5304e6],
  [410.28991, 106632.1681, 72, 9.732e5],
] as const;

/** Second radiation constant hc/k in cm K (exact since the 2019 SI; CODATA lists 1.438 776 877… × 10⁻² m K). */
export const C2 = 1.438776877503934;

/**
 * Radio-astronomy relations for one line or a ladder of lines.
 *
 * Sources: K. Rohlfs, T. L. Wilson, S. Hüttemeister, "Tools of Radio
 * Astronomy" (Springer; the radiative transfer of a uniform slab, with
 * brightness temperatures in the Rayleigh–Jeans scale, T_B = c²I_ν/(2kν²):
 * T_B = (J(T_ex) − J(T_bg))(1 − e^(−τ)), J(T) = (hν/k)/(e^(hν/kT) − 1),
 * which is T_B = (T_ex − T_bg)(1 − e^(−τ)) when hν ≪ kT); P. F.
 * Goldsmith, W. D. Langer, ApJ 517, 209 (1999) (the rotation diagram,
 * N_u = 8πkν²W/(hc³A), its optical-depth correction C_τ = τ/(1 − e^(−τ)) and
 * N = (N_u/g_u) Q(T) e^(E_u/kT)); G. B. Rybicki, A. P. Lightman, "Radiative
 * Processes in Astrophysics" (Wiley 1979), ch. 1 (the same slab solution).
 * Chapter and equation numbers are not given: cited from memory.
 *
 * Units: temperatures and energies (E/k) in K. Nothing here throws.
 */
import type { Measured } from '../types';

/**
 * C_τ = τ/(1 − e^(−τ)), the factor by which an optically thick line
 * underestimates its upper-level column density; 1 for τ → 0 (and for null).
 * Written with expm1 so small τ keep their digits.
 */
export function opticalDepthCorrection(tau: number | null): number {
  if (tau === null || !(tau > 0)) return 1;
  return tau / -Math.expm1(-tau);
}

/**
 * The radiation temperature of a black body at T seen at a line whose
 * photon energy is t0 = hν/k (K): J(T) = t0/(e^(t0/T) − 1), about T − t0/2
 * for T ≫ t0 (the Rayleigh–Jeans limit, where differences of J are those of T),
 * and 0 at T → 0
 * (the form and its name: Rohlfs, Wilson & Hüttemeister, from memory; the
 * same function is the Starlink SCUBA library's SCULIB_JNU, "the
 * Rayleigh-Jeans corrected brightness temperature"). 0 for T ≤ 0.
 */
export function radiationTemperature(t: number, t0: number): number {
  if (!(t > 0)) return 0;
  return t0 / Math.expm1(t0 / t);
}

/** dJ/dT = (x/(2 sinh(x/2)))² with x = t0/T: 1 in the Rayleigh–Jeans limit, 0 at T → 0 (and for T ≤ 0). */
function radiationSlope(t: number, t0: number): number {
  if (!(t > 0)) return 0;
  const x = t0 / t;
  const r = x / (2 * Math.sinh(x / 2));
  return Number.isFinite(r) ? r * r : 0;
}

/**
 * β = 1/T_ex of a line from its brightness temperature T_B (Rayleigh–Jeans
 * scale), optical depth τ > 0, background T_bg (0 when none) and photon
 * energy t0 = hν/k, all in K: the slab solution J(T_ex) = R with
 * R = T_B/(1 − e^(−τ)) + J(T_bg), so β = ln(1 + t0/R)/t0. Its first-order
 * uncertainty (GUM §5.1.2) from u(T_B), u(τ) and u(T_bg) through R:
 * ∂β/∂R = −1/(R(R + t0)), ∂R/∂T_B = 1/(1 − e^(−τ)),
 * ∂R/∂τ = −T_B e^(−τ)/(1 − e^(−τ))², ∂R/∂T_bg = dJ/dT_bg (the gap's share is
 * the uncertainty budget's). Null when R ≤ 0: with τ > 0 a line can absorb at
 * most J(T_bg)(1 − e^(−τ)) below the background, and a deeper one has no
 * positive excitation temperature (a negative one would need τ < 0).
 */
export function lineBeta(
  brightness: Measured,
  tau: Measured,
  background: Measured | null,
  t0: number,
): { value: number; uncertainty: number | null } | null {
  const d = -Math.expm1(-tau.value);
  const bg = background?.value ?? 0;
  const r = brightness.value / d + radiationTemperature(bg, t0);
  if (!(r > 0) || !(t0 > 0)) return null;
  const value = Math.log1p(t0 / r) / t0;
  const dBeta = 1 / (r * (r + t0));
  const parts: number[] = [];
  if (brightness.uncertainty !== null) parts.push(brightness.uncertainty / d);
  if (tau.uncertainty !== null) parts.push((brightness.value * Math.exp(-tau.value) * tau.uncertainty) / (d * d));
  if (background && background.uncertainty !== null) parts.push(radiationSlope(bg, t0) * background.uncertainty);
  const u = parts.length ? dBeta * Math.hypot(...parts) : null;
  return { value, uncertainty: u !== null && Number.isFinite(u) ? u : null };
}

/** The largest absorption (T_B < 0) a line of optical depth τ can show against T_bg: −J(T_bg)(1 − e^(−τ)), K. */
export function deepestAbsorption(tau: number, background: number, t0: number): number {
  return -radiationTemperature(background, t0) * -Math.expm1(-tau);
}

/**
 * Partition function of a rigid linear rotor, Q(T) = Σ_J (2J + 1) e^(−J(J+1) B/T)
 * with B = hB/k in K, summed until the terms fall below 10⁻¹⁵ of the sum
 * (a bound of 10⁶ terms keeps it finite). High-temperature limit
 * Q ≈ T/B + 1/3 (a standard expansion; from memory).
 * Domain: T > 0, B > 0; returns null otherwise.
 */
export function linearRotorPartition(temperature: number, rotor: number): number | null {
  if (!(temperature > 0) || !(rotor > 0) || !Number.isFinite(temperature / rotor)) return null;
  let q = 0;
  for (let J = 0; J < 1e6; J++) {
    const term = (2 * J + 1) * Math.exp((-J * (J + 1) * rotor) / temperature);
    q += term;
    if (J > 0 && term < 1e-15 * q && J * rotor > temperature) break;
  }
  return q;
}

/**
 * Total column density from a rotation diagram, N = Q(T) · e^a, where a is
 * the fitted intercept of ln(N_u/g_u) at E_u = 0 (energies from the ground
 * level), with u(N)/N = u(a) to first order (Q's dependence on T is left out
 * of the uncertainty: the docs say so).
 */
export function totalColumn(intercept: number, uIntercept: number | null, q: number): Measured {
  const value = q * Math.exp(intercept);
  return { value, uncertainty: uIntercept === null ? null : value * uIntercept };
}

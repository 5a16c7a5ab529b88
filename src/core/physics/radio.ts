/**
 * Radio-astronomy relations for one line or a ladder of lines.
 *
 * Sources: K. Rohlfs, T. L. Wilson, S. Hüttemeister, "Tools of Radio
 * Astronomy" (Springer; the radiative transfer of a uniform slab,
 * T_B = (T_ex − T_bg)(1 − e^(−τ)) in the Rayleigh–Jeans limit); P. F.
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
 * The excitation (spin) temperature of a line from its Rayleigh–Jeans
 * brightness temperature T_B, optical depth τ and background T_bg:
 * T = T_B/(1 − e^(−τ)) + T_bg, with first-order uncertainties (GUM §5.1.2):
 * ∂T/∂T_B = 1/(1 − e^(−τ)), ∂T/∂τ = −T_B e^(−τ)/(1 − e^(−τ))², ∂T/∂T_bg = 1.
 * Domain: τ > 0; T_bg ≥ 0 (0 when none is given).
 */
export function lineTemperature(
  brightness: Measured,
  tau: Measured,
  background: Measured | null,
): { value: number; uncertainty: number | null } {
  const d = -Math.expm1(-tau.value);
  const bg = background?.value ?? 0;
  const value = brightness.value / d + bg;
  const parts: number[] = [];
  if (brightness.uncertainty !== null) parts.push(brightness.uncertainty / d);
  if (tau.uncertainty !== null) parts.push((brightness.value * Math.exp(-tau.value) * tau.uncertainty) / (d * d));
  if (background && background.uncertainty !== null) parts.push(background.uncertainty);
  return { value, uncertainty: parts.length ? Math.hypot(...parts) : null };
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

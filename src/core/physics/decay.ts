/**
 * A polarization carried along an exponential decay to another time.
 *
 * Method: the exponential decay law of longitudinal relaxation towards a
 * negligible equilibrium, P(t) = P(t₀)·exp(−(t − t₀)/T₁) (Bloch, Phys. Rev.
 * 70, 460 (1946), eq. for M_z with M₀ ≪ M; for a hyperpolarized sample
 * P ≫ P_th, so the thermal offset is left out). Solved for an earlier (or
 * later) time: P(to) = P(from)·exp((from − to)/T₁).
 *
 * Uncertainty: first-order propagation of uncorrelated inputs, GUM
 * (JCGM 100:2008) §5.1.2, eq. (10), with the sensitivity coefficients
 * ∂P_to/∂P = e^x, ∂P_to/∂from = P_to/T₁, ∂P_to/∂to = −P_to/T₁,
 * ∂P_to/∂T₁ = −P_to·(from − to)/T₁², where x = (from − to)/T₁.
 *
 * Units: times and T₁ in seconds; P a fraction. Domain: T₁ > 0 and finite.
 */
import type { Measured } from '../types';

/** P(to) from P(from) and T₁, with its standard uncertainty (null when no input carries one); null outside the domain. */
export function polarizationAtTime(p: Measured, from: Measured, to: Measured, t1: Measured): Measured | null {
  if (!(t1.value > 0) || !Number.isFinite(t1.value)) return null;
  const x = (from.value - to.value) / t1.value;
  const growth = Math.exp(x);
  const value = p.value * growth;
  if (!Number.isFinite(value)) return null;
  const terms: number[] = [];
  if (p.uncertainty !== null) terms.push(growth * p.uncertainty);
  if (from.uncertainty !== null) terms.push((value / t1.value) * from.uncertainty);
  if (to.uncertainty !== null) terms.push((value / t1.value) * to.uncertainty);
  if (t1.uncertainty !== null) terms.push(((value * (from.value - to.value)) / t1.value ** 2) * t1.uncertainty);
  const uncertainty = terms.length === 0 ? null : Math.hypot(...terms);
  return { value, uncertainty: uncertainty !== null && Number.isFinite(uncertainty) ? uncertainty : null };
}

/**
 * Polarization of the measured state and of the thermal state at the
 * block's lattice temperature. Two levels: the difference per degeneracy,
 * P = (n_l/g_l − n_u/g_u)/(n_l/g_l + n_u/g_u), which is (n_l − n_u)/(n_l + n_u)
 * when g_l = g_u and is positive exactly when T > 0 (the contract's
 * "Polarization of a degenerate transition (v1.2)");
 * spins: the vector polarization ⟨I_z⟩/I with the sign that is positive at
 * positive temperature; explicit schemes of three or more levels: none.
 */
import type { BlockInput } from '../block/input';
import { spinPolarizationFromPopulations, thermalSpinPolarization } from '../physics/brillouin';
import { polarizationFromPopulations } from '../physics/twoLevel';
import type { Measured } from '../types';

/** Polarization of the measured populations, with propagated uncertainty. */
export function polarizationOf(input: BlockInput, fractions: readonly number[] | null): Measured | null {
  const levels = input.levels;
  const raw = levels.map((l) => l.population);
  if (raw.some((p) => p === null)) {
    if (!fractions || levels.length !== 2) return null;
    const p = polarizationFromPopulations(fractions[0] / levels[0].g, fractions[1] / levels[1].g);
    return p ? { value: p.value, uncertainty: null } : null;
  }
  const pops = raw as number[];
  if (input.spin)
    return spinPolarizationFromPopulations(
      pops,
      levels.map((l) => l.uPopulation),
    );
  if (levels.length !== 2) return null;
  // Per degeneracy: n/g and u(n)/g (exact degeneracies), then the two-level formula.
  const [lo, up] = levels;
  return polarizationFromPopulations(pops[0] / lo.g, pops[1] / up.g, {
    nLower: lo.uPopulation === null ? null : lo.uPopulation / lo.g,
    nUpper: up.uPopulation === null ? null : up.uPopulation / up.g,
  });
}

/** Thermal-equilibrium polarization at `lattice` (Brillouin function for spins; per degeneracy, tanh(ΔE/2kT), for two levels). */
export function thermalPolarizationOf(input: BlockInput): number | null {
  const T = input.lattice?.value;
  if (T === undefined || !(T > 0)) return null;
  if (input.spin) return thermalSpinPolarization(input.spin.species.spin, input.spin.spacing, T);
  if (input.levels.length !== 2) return null;
  // tanh(ΔE/2T) itself, not (n_l/g_l − n_u/g_u)/(n_l/g_l + n_u/g_u) of the thermal populations: that
  // difference of two nearly equal numbers keeps only ~1e-16/x of x = ΔE/T (a 1 kHz gap at 10⁶ K lost
  // its fourth digit), and the lattice's sensitivity coefficient, a central difference, inherits it.
  const [lo, up] = input.levels;
  const p = Math.tanh((up.energy - lo.energy) / (2 * T));
  return Number.isFinite(p) ? p + 0 : null;
}

/**
 * Polarization of the measured state and of the thermal state at the
 * block's lattice temperature. Two levels: P = (n_l − n_u)/(n_l + n_u);
 * spins: the vector polarization ⟨I_z⟩/I with the sign that is positive at
 * positive temperature; explicit schemes of three or more levels: none.
 */
import type { BlockInput } from '../block/input';
import { spinPolarizationFromPopulations, thermalSpinPolarization } from '../physics/brillouin';
import { thermalDistribution } from '../physics/entropy';
import { polarizationFromPopulations } from '../physics/twoLevel';
import type { Measured } from '../types';

/** Polarization of the measured populations, with propagated uncertainty. */
export function polarizationOf(input: BlockInput, fractions: readonly number[] | null): Measured | null {
  const levels = input.levels;
  const raw = levels.map((l) => l.population);
  if (raw.some((p) => p === null)) {
    if (!fractions || levels.length !== 2) return null;
    return { value: fractions[0] - fractions[1], uncertainty: null };
  }
  const pops = raw as number[];
  if (input.spin)
    return spinPolarizationFromPopulations(
      pops,
      levels.map((l) => l.uPopulation),
    );
  if (levels.length !== 2) return null;
  return polarizationFromPopulations(pops[0], pops[1], {
    nLower: levels[0].uPopulation,
    nUpper: levels[1].uPopulation,
  });
}

/** Thermal-equilibrium polarization at `lattice` (Brillouin function for spins; Boltzmann factors with degeneracies for two levels). */
export function thermalPolarizationOf(input: BlockInput): number | null {
  const T = input.lattice?.value;
  if (T === undefined || !(T > 0)) return null;
  if (input.spin) return thermalSpinPolarization(input.spin.species.spin, input.spin.spacing, T);
  if (input.levels.length !== 2) return null;
  const p = thermalDistribution(
    input.levels.map((l) => l.energy),
    input.levels.map((l) => l.g),
    1 / T,
  );
  return p ? p[0] - p[1] : null;
}

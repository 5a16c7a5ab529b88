/**
 * The excitation temperature of one pair of levels (used for the per-level
 * readings in hovers and hints). Pure numbers: energies as E/k in kelvin.
 */

/** The pairwise excitation temperature of two levels, or one of its limits. */
export type PairTemperature =
  | { readonly kind: 'value'; readonly kelvin: number }
  | { readonly kind: 'infinite' }
  | { readonly kind: 'zero'; readonly sign: 1 | -1 }
  | { readonly kind: 'undefined' };

/**
 * Excitation temperature of a pair of levels from Boltzmann's relation
 * n_u/n_l = (g_u/g_l) exp(−ΔE/kT) solved for T:
 * T = (E_u − E_l) / ln[(n_l/g_l)/(n_u/g_u)], in kelvin with energies as E/k
 * in kelvin and populations on any common scale (≥ 0). Negative for an
 * inverted pair; ±∞ when both hold the same population per degeneracy;
 * 0⁺ when only the lower is populated, 0⁻ when only the upper is; undefined
 * when both are empty or the energies are equal.
 */
export function pairTemperature(lower: PairLevel, upper: PairLevel): PairTemperature {
  const gap = upper.energy - lower.energy;
  const nl = lower.population / lower.g;
  const nu = upper.population / upper.g;
  if (!(gap !== 0) || (nl === 0 && nu === 0) || !Number.isFinite(nl) || !Number.isFinite(nu))
    return { kind: 'undefined' };
  if (nu === 0) return { kind: 'zero', sign: gap > 0 ? 1 : -1 };
  if (nl === 0) return { kind: 'zero', sign: gap > 0 ? -1 : 1 };
  const log = Math.log(nl / nu);
  if (log === 0) return { kind: 'infinite' };
  return { kind: 'value', kelvin: gap / log };
}

/** What {@link pairTemperature} needs of a level: E/k in K, degeneracy, population. */
export interface PairLevel {
  readonly energy: number;
  readonly g: number;
  readonly population: number;
}

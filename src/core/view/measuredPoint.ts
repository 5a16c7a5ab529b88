/**
 * The measured state as a point on the S(E) curve: its mean energy and Gibbs
 * entropy with first-order standard uncertainties (GUM, JCGM 100:2008
 * §5.1.2, inputs taken as uncorrelated), its β, and how far below the
 * thermal curve it sits.
 *
 * Entropy deficit and relative entropy. For a distribution p over levels with
 * mean energy E and the thermal distribution q with the same mean energy
 * (q_i = g_i e^(−βE_i)/Z), ln(p_i/q_i) = ln(p_i/g_i) + βE_i + ln Z, so
 * D(p‖q) = Σ p_i ln(p_i/q_i) = −S_p + β⟨E⟩_p + ln Z = S_q − S_p,
 * because S_q = ln Z + β⟨E⟩_q and ⟨E⟩_p = ⟨E⟩_q. The deficit
 * S_thermal(E) − S_measured and the relative entropy to the thermal state of
 * the same energy are therefore one number computed two ways; both are sent
 * so the view (and a test) can show that they agree.
 *
 * Units: energies E/k in K, entropies in k per system, β in K⁻¹.
 */
import type { BlockResults } from '../analysis/results';
import type { BlockInput } from '../block/input';
import { relativeEntropy, thermalDistribution } from '../physics/entropy';
import { thermalStateAtEnergy } from '../physics/curves';
import type { MeasuredPoint } from './payload';

/** Standard uncertainties of E and S, or null where they cannot be propagated. */
interface Spread {
  readonly uEnergy: number | null;
  readonly uEntropy: number | null;
}

const NONE: Spread = { uEnergy: null, uEntropy: null };

/**
 * u(E) and u(S) from measured populations n_j with uncertainties u_j, for
 * p_j = n_j/Σn: ∂E/∂n_j = (E_j − E)/Σn and ∂S/∂n_j = (−ln(p_j/g_j) − S)/Σn.
 * Every level must have a population and an uncertainty; u(S) is
 * null when an empty level has a non-zero uncertainty (the slope diverges there).
 */
function fromPopulations(input: BlockInput, p: readonly number[], energy: number, entropy: number): Spread {
  const levels = input.levels;
  const total = levels.reduce((sum, l) => sum + l.population!, 0);
  let varE = 0;
  let varS = 0;
  let entropyDefined = true;
  levels.forEach((l, j) => {
    const u = l.uPopulation!;
    varE += (((l.energy - energy) / total) * u) ** 2;
    if (p[j]! > 0) varS += (((-Math.log(p[j]! / l.g) - entropy) / total) * u) ** 2;
    else if (u > 0) entropyDefined = false;
  });
  return { uEnergy: finiteOrNull(Math.sqrt(varE)), uEntropy: entropyDefined ? finiteOrNull(Math.sqrt(varS)) : null };
}

/**
 * u(E) and u(S) when the populations are implied by β (a polarization or a
 * ratio was measured): dE/dβ = −Var(E) and dS/dβ = β dE/dβ for a thermal
 * distribution, so u(E) = Var(E)·u(β) and u(S) = |β|·Var(E)·u(β). The level
 * energies are held fixed: a gap uncertainty that the analysis folded into u(β)
 * is carried as if it came from the measured quantity (a first-order shortcut).
 */
function fromBeta(input: BlockInput, p: readonly number[], energy: number, beta: number, uBeta: number): Spread {
  let variance = 0;
  input.levels.forEach((l, j) => (variance += p[j]! * (l.energy - energy) ** 2));
  return { uEnergy: finiteOrNull(variance * uBeta), uEntropy: finiteOrNull(Math.abs(beta) * variance * uBeta) };
}

/**
 * A non-negative difference of entropies of size `scale`, with rounding noise
 * (below 64 ulp of the scale, e.g. 1e−16 for a thermal point) shown as exactly 0.
 */
function roundOff(x: number, scale: number): number {
  return x <= 64 * Number.EPSILON * Math.max(1, Math.abs(scale)) ? 0 : x;
}

function finiteOrNull(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

/**
 * The spread of the point: from the populations when every one carries an
 * uncertainty; otherwise from u(β) when the distribution is thermal by
 * construction (implied by a polarization, or two levels, e.g. a `ratio`);
 * otherwise none.
 */
function spreadOf(
  input: BlockInput,
  p: readonly number[],
  energy: number,
  entropy: number,
  beta: BlockResults['beta'],
): Spread {
  const complete = input.levels.every((l) => l.population !== null && l.uPopulation !== null);
  if (complete) return fromPopulations(input, p, energy, entropy);
  const thermal = input.levels.length === 2 || input.levels.every((l) => l.population === null);
  return thermal && beta && beta.uncertainty !== null ? fromBeta(input, p, energy, beta.value, beta.uncertainty) : NONE;
}

/**
 * The measured point of a block that read without errors, or null when its
 * results carry no distribution (no fractions, mean energy or entropy).
 */
export function measuredPoint(input: BlockInput, results: BlockResults): MeasuredPoint | null {
  const p = results.fractions;
  const energy = results.meanEnergy;
  const entropy = results.entropy;
  if (!p || energy === null || entropy === null || p.length !== input.levels.length) return null;
  const energies = input.levels.map((l) => l.energy);
  const g = input.levels.map((l) => l.g);
  const beta = results.beta;
  const spread = spreadOf(input, p, energy, entropy, beta);
  const thermal = thermalStateAtEnergy(energies, g, energy);
  const q = thermal ? thermalDistribution(energies, g, thermal.beta) : null;
  const d = q ? relativeEntropy(p, q) : null;
  return {
    energy,
    ...spread,
    entropy,
    beta: beta ? beta.value : null,
    uBeta: beta ? beta.uncertainty : null,
    limit: results.limit,
    thermalEntropy: thermal ? thermal.entropy : null,
    deficit: thermal ? roundOff(thermal.entropy - entropy, thermal.entropy) : null,
    relativeEntropy: d === null || !thermal ? d : roundOff(d, thermal.entropy),
  };
}

/**
 * β from measured populations: the two-level formula with first-order
 * propagation, or the weighted Boltzmann fit of ln(n/g) against E for three
 * or more levels.
 */
import type { BlockInput } from '../block/input';
import { boltzmannFit } from '../physics/fit';
import { betaFromPopulations } from '../physics/twoLevel';
import type { Measured, Problem } from '../types';
import type { BlockResults, FitSummary } from './results';

/** What the β step found, before the status is decided. */
export interface BetaFinding {
  readonly beta: Measured | null;
  readonly limit: BlockResults['limit'];
  readonly fit: FitSummary | null;
  /** Normalised measured populations, or null when only a polarization was given. */
  readonly fractions: number[] | null;
  /** A directly given polarization, carried through. */
  readonly polarization: Measured | null;
  readonly problems: readonly Problem[];
}

function normalise(values: readonly number[]): number[] {
  let sum = 0;
  for (const v of values) sum += v;
  return values.map((v) => v / sum);
}

/** β of two levels from their populations, or a T → 0± limit when one is empty. */
export function measureTwoLevels(input: BlockInput): BetaFinding {
  const [lo, up] = input.levels;
  const nl = lo.population!;
  const nu = up.population!;
  const fractions = normalise([nl, nu]);
  const problems: Problem[] = [];
  const gap = up.energy - lo.energy;
  if (nl === 0 || nu === 0) {
    const positive = nu === 0;
    const span = (positive ? up.populationSpan : lo.populationSpan) ?? { start: 0, end: 1 };
    problems.push({
      severity: 'info',
      code: 'temperature-zero',
      message: positive
        ? 'The upper level is empty: all population is in the lower level, so T → 0⁺ (β → +∞).'
        : 'The lower level is empty: all population is in the upper level, so T → 0⁻ (β → −∞), a complete inversion.',
      span,
    });
    return {
      beta: null,
      limit: positive ? 'zero-positive' : 'zero-negative',
      fit: null,
      fractions,
      polarization: null,
      problems,
    };
  }
  const beta = betaFromPopulations(nl, nu, lo.g, up.g, gap, {
    nLower: lo.uPopulation,
    nUpper: up.uPopulation,
    gap: input.uGap,
  });
  return { beta, limit: null, fit: null, fractions, polarization: null, problems };
}

/** β from the Boltzmann fit over three or more levels (empty levels are left out, with a note). */
export function fitManyLevels(input: BlockInput): BetaFinding {
  const levels = input.levels;
  const fractions = normalise(levels.map((l) => l.population ?? 0));
  const problems: Problem[] = [];
  // The levels that hold population, by index; their energies, populations, degeneracies and uncertainties.
  const used: number[] = [];
  const energies: number[] = [];
  const populations: number[] = [];
  const g: number[] = [];
  const u: number[] = [];
  let hasU = true;
  for (let i = 0; i < levels.length; i++) {
    const l = levels[i]!;
    if (l.population === 0) {
      problems.push({
        severity: 'info',
        code: 'population-zero-excluded',
        message: 'This level is empty; ln(n/g) is undefined there, so it is left out of the Boltzmann fit.',
        span: l.populationSpan ?? { start: 0, end: 1 },
      });
    }
    if (!((l.population ?? 0) > 0)) continue;
    used.push(i);
    energies.push(l.energy);
    populations.push(l.population!);
    g.push(l.g);
    u.push(l.uPopulation!);
    hasU &&= l.uPopulation !== null && l.uPopulation > 0;
  }
  if (!twoEnergies(energies)) {
    const allLow = used.every((i) => levels[i]!.energy === levels[0]!.energy);
    const allHigh = used.every((i) => levels[i]!.energy === levels[levels.length - 1]!.energy);
    const limit = allLow ? 'zero-positive' : allHigh ? 'zero-negative' : null;
    problems.push({
      severity: 'info',
      code: 'temperature-zero',
      message: 'Only one energy holds population, so no finite temperature fits the levels.',
      span: (used.length > 0 ? levels[used[0]!]!.populationSpan : null) ?? { start: 0, end: 1 },
    });
    return { beta: null, limit, fit: null, fractions, polarization: null, problems };
  }
  const fit = boltzmannFit(energies, populations, g, hasU ? u : null);
  if (!fit) return { beta: null, limit: null, fit: null, fractions, polarization: null, problems };
  const residuals: (number | null)[] = levels.map(() => null);
  for (let k = 0; k < used.length; k++) residuals[used[k]!] = fit.residuals[k]!;
  const summary: FitSummary = {
    chi2: fit.chi2,
    dof: fit.dof,
    weighted: fit.weighted,
    consistent: fit.consistent,
    residuals,
    critical: fit.chi2Limit,
  };
  return {
    beta: { value: fit.beta, uncertainty: fit.uBeta },
    limit: null,
    fit: summary,
    fractions,
    polarization: null,
    problems,
  };
}

/** True when the energies hold at least two distinct values (as a Set counts them: NaN equals NaN, −0 equals +0). */
function twoEnergies(energies: readonly number[]): boolean {
  const first = energies[0]!;
  for (const e of energies) if (e !== first && !(Number.isNaN(e) && Number.isNaN(first))) return true;
  return false;
}

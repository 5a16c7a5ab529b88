/**
 * β from measured populations: the two-level formula with first-order
 * propagation, or the Boltzmann fit of ln(n/g) against E for three or more
 * levels (weighted when every level states u(n)), with the judgement of the
 * empty levels it leaves out and a note when only some levels state u(n).
 */
import type { BlockInput } from '../block/input';
import { boltzmannFit, type BoltzmannFit } from '../physics/fit';
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

/** β from the Boltzmann fit over three or more levels (empty levels are left out of it and judged apart). */
export function fitManyLevels(input: BlockInput): BetaFinding {
  const levels = input.levels;
  const fractions = normalise(levels.map((l) => l.population ?? 0));
  const problems: Problem[] = [];
  // The levels that hold population, by index; their energies, populations, degeneracies and uncertainties.
  const used: number[] = [];
  const energies: number[] = [];
  const populations: number[] = [];
  const g: number[] = [];
  const u: (number | null)[] = [];
  for (let i = 0; i < levels.length; i++) {
    const l = levels[i]!;
    if (!((l.population ?? 0) > 0)) continue;
    used.push(i);
    energies.push(l.energy);
    populations.push(l.population!);
    g.push(l.g);
    u.push(l.uPopulation);
  }
  if (!twoEnergies(energies)) {
    noteEmptyLevels(levels, problems);
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
  const fit = boltzmannFit(energies, populations, g, u);
  if (!fit) {
    noteEmptyLevels(levels, problems);
    return { beta: null, limit: null, fit: null, fractions, polarization: null, problems };
  }
  const partial = partialNote(input, used, fit);
  if (partial) problems.push(partial);
  const emptyConsistent = judgeEmptyLevels(levels, energies, fit, problems);
  const residuals: (number | null)[] = levels.map(() => null);
  for (let k = 0; k < used.length; k++) residuals[used[k]!] = fit.residuals[k]!;
  const summary: FitSummary = {
    chi2: fit.chi2,
    dof: fit.dof,
    weighted: fit.weighted,
    stated: fit.stated,
    consistent: fit.consistent && emptyConsistent,
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

/**
 * An empty level predicted farther than this many standard uncertainties
 * from its stated 0 ± u is not consistent with the fitted temperature: the
 * two-sided 1 % point of the normal distribution (coverage factor 2.576 for
 * 99 %, JCGM 100:2008 Table G.1, from memory), the level of the χ² test of
 * the status rules.
 */
export const EMPTY_LEVEL_LIMIT = 2.576;

const EXCLUDED = 'This level is empty; ln(n/g) is undefined there, so it is left out of the Boltzmann fit.';

/** The plain note on every empty level, where no fit judges them. */
function noteEmptyLevels(levels: BlockInput['levels'], problems: Problem[]): void {
  for (const l of levels)
    if (l.population === 0)
      problems.push({ severity: 'info', code: 'population-zero-excluded', message: EXCLUDED, span: spanOf(l) });
}

/** Where a diagnostic about a level's population goes: the population itself, else the level's item. */
function spanOf(l: BlockInput['levels'][number]): { start: number; end: number } {
  return l.populationSpan ?? l.span ?? { start: 0, end: 1 };
}

/**
 * The population the fit predicts at energy E for degeneracy g, n = g·e^(a − βE),
 * with u(n) = n·u(a − βE) from the fit's covariance (first order, GUM §5.1.2), or null.
 */
function predicted(fit: BoltzmannFit, energy: number, g: number): { value: number; u: number | null } {
  const value = g * Math.exp(fit.intercept - fit.beta * energy);
  if (fit.uIntercept === null || fit.uBeta === null || fit.covariance === null) return { value, u: null };
  // y = a + bE with b = −β: var(y) = var(a) + E²var(b) + 2E cov(a, b).
  const v = fit.uIntercept ** 2 + (energy * fit.uBeta) ** 2 + 2 * energy * fit.covariance;
  const u = value * Math.sqrt(Math.max(0, v));
  return { value, u: Number.isFinite(u) ? u : null };
}

/**
 * Judges each empty level against the fit of the populated ones; true when all are consistent.
 *
 * At any finite temperature every level holds population, n ∝ g e^(−βE) > 0; only
 * T → 0± empties levels, and then all those above (below) the lowest (highest)
 * populated energy. So an empty level at or between the energies of populated
 * levels fits no temperature: not consistent, unless its zero states an
 * uncertainty, 0 ± u, which allows a small population; then the fit's
 * prediction n ± u(n) is compared with it and found inconsistent beyond
 * {@link EMPTY_LEVEL_LIMIT} combined standard uncertainties. An empty level
 * beyond the populated ones without an uncertainty is read as "below what was
 * detected": it stays out of the fit, with a note giving the prediction there.
 */
function judgeEmptyLevels(
  levels: BlockInput['levels'],
  usedEnergies: readonly number[],
  fit: BoltzmannFit,
  problems: Problem[],
): boolean {
  let lowest = Infinity;
  let highest = -Infinity;
  for (const e of usedEnergies) {
    lowest = Math.min(lowest, e);
    highest = Math.max(highest, e);
  }
  let consistent = true;
  for (const l of levels) {
    if (l.population !== 0) continue;
    const span = spanOf(l);
    const p = predicted(fit, l.energy, l.g);
    const n = p.value.toPrecision(3);
    const u = l.uPopulation !== null && l.uPopulation > 0 ? l.uPopulation : null;
    if (u === null && (l.energy < lowest || l.energy > highest)) {
      const message = `${EXCLUDED} The fit of the populated levels predicts n = ${n} here (on the block's scale); an empty reading means less than that was detected.`;
      problems.push({ severity: 'info', code: 'population-zero-excluded', message, span });
      continue;
    }
    if (u === null) {
      consistent = false;
      problems.push({
        severity: 'warning',
        code: 'population-zero-inconsistent',
        message: `This level is empty, yet populated levels lie at or below and at or above its energy: no temperature does that (a finite one populates every level; T → 0⁺ or 0⁻ empties only the levels above the lowest or below the highest populated energy), so the levels are not thermal. The fit of the populated levels predicts n = ${n} here. If the zero is a reading below detection, write it as 0 ± u and it is tested against that prediction instead.`,
        span,
      });
      continue;
    }
    const sigma = Math.hypot(u, p.u ?? 0);
    const z = p.value / sigma;
    const within = `the fit of the populated levels predicts n = ${n}${p.u === null ? '' : ` ± ${p.u.toPrecision(2)}`} here, ${Number.isFinite(z) ? z.toFixed(2) : 'many'} standard uncertainties from 0 ± ${u.toPrecision(2)}`;
    if (!(z <= EMPTY_LEVEL_LIMIT)) {
      consistent = false;
      problems.push({
        severity: 'warning',
        code: 'population-zero-inconsistent',
        message: `This level is empty, but ${within}: more than ${EMPTY_LEVEL_LIMIT}, the 1 % level, so the levels are not consistent with one temperature.`,
        span,
      });
    } else {
      const message = `${EXCLUDED} Its 0 ± ${u.toPrecision(2)} agrees with the prediction: ${within} (at most ${EMPTY_LEVEL_LIMIT}).`;
      problems.push({ severity: 'info', code: 'population-zero-excluded', message, span });
    }
  }
  return consistent;
}

/**
 * The note on a fit in which only some levels (or lines) state an uncertainty:
 * how many, and how the fit treats them (see {@link boltzmannFit}). On the
 * first one that states none. Null when all or none do.
 */
function partialNote(input: BlockInput, used: readonly number[], fit: BoltzmannFit): Problem | null {
  const n = used.length;
  const k = fit.stated;
  if (k === 0 || k === n) return null;
  const levels = input.levels;
  const first = used.find((i) => !((levels[i]!.uPopulation ?? 0) > 0));
  if (first === undefined) return null;
  const [one, many] = input.lines ? ['line', 'lines'] : ['level', 'levels'];
  const others =
    fit.dof > 0
      ? `with the scatter they leave unexplained, given to every ${one} alike`
      : `while the ${many} without one count as exact (two ${many} leave no scatter to judge them by)`;
  return {
    severity: 'info',
    code: 'uncertainty-partial',
    message: `Only ${k} of the ${n} ${many} in the fit state an uncertainty. Without weights for the others, β comes from the unweighted fit, and u(β) combines the stated uncertainties, propagated through its slope, ${others}; consistency is judged by the residual rule, not χ². Give every ${one} an uncertainty for a weighted fit and a χ² test.`,
    span: spanOf(levels[first]!),
  };
}

/** True when the energies hold at least two distinct values (as a Set counts them: NaN equals NaN, −0 equals +0). */
function twoEnergies(energies: readonly number[]): boolean {
  const first = energies[0]!;
  for (const e of energies) if (e !== first && !(Number.isNaN(e) && Number.isNaN(first))) return true;
  return false;
}

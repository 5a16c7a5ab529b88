/**
 * From a block's physical input to its results: β with its standard
 * uncertainty (first-order propagation, GUM §5.1.2), T = 1/β, polarization,
 * thermal polarization at the lattice temperature, enhancement, Gibbs
 * entropy, the Boltzmann fit for three or more levels, and the status word.
 */
import type { BlockInput } from '../block/input';
import { betaFromSpinPolarization } from '../physics/brillouin';
import { invertedPairs } from '../physics/fit';
import { gibbsEntropy, meanEnergy, thermalDistribution } from '../physics/entropy';
import { betaFromTwoLevelPolarization } from '../physics/twoLevel';
import type { Measured, Problem } from '../types';
import { fitManyLevels, measureTwoLevels, type BetaFinding } from './beta';
import { polarizationOf, thermalPolarizationOf } from './polarization';
import type { BlockResults } from './results';
import { lineOutliers, measureGain, measureSeries, measureSignal } from './measurements';
import type { SeriesFit } from '../physics/relaxation';
import { statusOf } from './status';

/** Settings that change results. */
export interface AnalysisOptions {
  /** β within this many standard uncertainties of zero counts as saturated (default 2). */
  readonly saturationSigma: number;
}

/** The contract's default settings. */
export const DEFAULT_ANALYSIS_OPTIONS: AnalysisOptions = { saturationSigma: 2 };

/** Analyses a block that read without errors. Never throws. */
export function analyse(input: BlockInput, options: AnalysisOptions = DEFAULT_ANALYSIS_OPTIONS): BlockResults {
  const problems: Problem[] = [];
  const series = measureSeries(input, problems);
  const signal = measureSignal(input, series, problems);
  // A referenced signal becomes the block's polarization; from there on it is a spin block like any other.
  const effective: BlockInput = signal ? { ...input, polarization: signal.polarization } : input;
  const finding = hasMeasurement(effective) ? findBeta(effective, problems) : NOTHING_MEASURED;
  const energies = input.levels.map((l) => l.energy);
  const g = input.levels.map((l) => l.g);
  // Emission lines sample only the upper levels: their "fractions" are not a distribution.
  const fractions = input.lines ? null : (finding.fractions ?? impliedFractions(energies, g, finding));
  const beta = finding.beta;
  const temperature = temperatureOf(beta, finding.limit);
  const polarization = input.lines ? null : (finding.polarization ?? polarizationOf(effective, fractions));
  const thermalPolarization = thermalPolarizationOf(input);
  const enhancement = polarization && thermalPolarization ? polarization.value / thermalPolarization : null;
  const uEnhancement =
    enhancement !== null && polarization && thermalPolarization
      ? enhancementUncertainty(input, polarization.value, polarization.uncertainty, thermalPolarization)
      : null;
  const outliers = lineOutliers(input, finding.fit, problems);
  const pairs = fractions ? invertedPairs(energies, fractions, g) : NONE;
  const all = finding.problems.length === 0 ? problems : [...problems, ...finding.problems];
  return {
    status: finding === NOTHING_MEASURED ? seriesStatus(series) : statusOf(beta, finding, options.saturationSigma),
    series,
    signal: signal?.result ?? null,
    gain: measureGain(input),
    outliers: outliers.length === 0 ? NONE : outliers,
    beta,
    limit: finding.limit,
    temperature,
    polarization,
    thermalPolarization,
    enhancement: enhancement !== null && Number.isFinite(enhancement) ? enhancement : null,
    enhancementUncertainty: enhancement !== null && Number.isFinite(enhancement) ? uEnhancement : null,
    entropy: fractions ? gibbsEntropy(fractions, g) : null,
    fit: finding.fit,
    invertedPairs: pairs.length === 0 ? NONE : pairs,
    fractions,
    meanEnergy: fractions ? meanEnergy(fractions, energies) : null,
    problems: all.length === 0 ? NONE : all,
  };
}

/**
 * The empty list every result without outliers, inverted pairs or problems
 * shares: results stay cached for every block of every note, and most of
 * these lists are empty. Frozen, as nothing may add to a shared list.
 */
const NONE: readonly never[] = Object.freeze([]);

/** What a block without populations or polarization (a bare series) finds. */
const NOTHING_MEASURED: BetaFinding = {
  beta: null,
  limit: null,
  fit: null,
  fractions: null,
  polarization: null,
  problems: [],
};

function hasMeasurement(input: BlockInput): boolean {
  return input.polarization !== null || input.levels.some((l) => l.population !== null);
}

/**
 * A bare series has no temperature; its sign still tells the story: a signal
 * in emission (negative amplitude, phased against a thermal spectrum) comes
 * from inverted populations.
 */
function seriesStatus(series: SeriesFit | null): BlockResults['status'] {
  const a = series?.amplitude.value ?? 0;
  return a > 0 ? 'normal' : a < 0 ? 'inverted' : 'saturated';
}

function findBeta(input: BlockInput, problems: Problem[]): BetaFinding {
  if (input.polarization) return fromPolarization(input, problems);
  const measured = input.levels.filter((l) => l.population !== null);
  if (measured.length === 2 && input.levels.length === 2) return measureTwoLevels(input);
  return fitManyLevels(input);
}

/** β from a directly given polarization (spin form). */
function fromPolarization(input: BlockInput, problems: Problem[]): BetaFinding {
  const spin = input.spin!;
  const p = input.polarization!;
  const base: BetaFinding = {
    beta: null,
    limit: null,
    fit: null,
    fractions: null,
    polarization: { value: p.value, uncertainty: p.uncertainty },
    problems: [],
  };
  if (Math.abs(p.value) === 1) {
    problems.push({
      severity: 'info',
      code: 'temperature-zero',
      message: `|P| = 1: every spin is in one level, so T → 0${p.value > 0 ? '⁺' : '⁻'} (β → ${p.value > 0 ? '+' : '−'}∞).`,
      span: p.span,
    });
    return { ...base, limit: p.value > 0 ? 'zero-positive' : 'zero-negative' };
  }
  const I = spin.species.spin;
  let beta: Measured | null;
  if (I === 0.5) {
    beta = betaFromTwoLevelPolarization(p.value, 1, 1, spin.spacing, p.uncertainty, spin.uSpacing);
  } else {
    const b = betaFromSpinPolarization(I, p.value, spin.spacing, p.uncertainty);
    // Add the spacing's share, ∂β/∂ΔE = −β/ΔE, in quadrature (GUM §5.1.2).
    const us = spin.uSpacing !== null && b ? Math.abs(b.value / spin.spacing) * spin.uSpacing : null;
    beta = b && us !== null ? { value: b.value, uncertainty: Math.hypot(b.uncertainty ?? 0, us) } : b;
  }
  return { ...base, beta };
}

/** Fractions implied by β when only a polarization was measured. */
function impliedFractions(energies: number[], g: number[], f: BetaFinding): number[] | null {
  if (f.beta) return thermalDistribution(energies, g, f.beta.value);
  if (f.limit === 'zero-positive') return energies.map((_, i) => (i === 0 ? 1 : 0));
  if (f.limit === 'zero-negative') return energies.map((_, i) => (i === energies.length - 1 ? 1 : 0));
  return null;
}

/** T = 1/β with u(T) = u(β)/β² (first order); null at β = 0; 0 in the T → 0 limits. */
function temperatureOf(beta: Measured | null, limit: BetaFinding['limit']): Measured | null {
  if (limit) return { value: 0, uncertainty: null };
  if (!beta || beta.value === 0) return null;
  const value = 1 / beta.value;
  if (!Number.isFinite(value)) return null;
  const u = beta.uncertainty === null ? null : beta.uncertainty / (beta.value * beta.value);
  return { value, uncertainty: u !== null && Number.isFinite(u) ? u : null };
}

/**
 * Standard uncertainty of ε = P / P_th(T_lattice) by first-order propagation
 * (JCGM 100:2008 §5.1.2, uncorrelated inputs): u(ε)² = (u(P)/P_th)² +
 * (P/P_th² · dP_th/dT · u(T))². dP_th/dT is a central difference of the same
 * thermal-polarization function with a step of 10⁻⁴ T (P_th is smooth in T > 0).
 * Null when neither P nor the lattice temperature has an uncertainty.
 */
export function enhancementUncertainty(input: BlockInput, p: number, uP: number | null, pTh: number): number | null {
  const uT = input.lattice?.uncertainty ?? null;
  const T = input.lattice?.value ?? NaN;
  let variance = 0;
  if (uP !== null && uP > 0) variance += (uP / pTh) ** 2;
  if (uT !== null && uT > 0 && input.lattice) {
    const h = T * 1e-4;
    const at = (t: number): number | null =>
      thermalPolarizationOf({ ...input, lattice: { ...input.lattice!, value: t } });
    const up = at(T + h);
    const down = at(T - h);
    if (up !== null && down !== null) variance += ((p / pTh ** 2) * ((up - down) / (2 * h)) * uT) ** 2;
  }
  const u = Math.sqrt(variance);
  return variance > 0 && Number.isFinite(u) ? u : null;
}

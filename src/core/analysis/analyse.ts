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
import { measureGain, measureSeries, measureSignal } from './measurements';
import { linePlot, tradeOf, tradeResults } from './trade';
import { deepestAbsorption, lineBeta } from '../physics/radio';
import type { SeriesFit } from '../physics/relaxation';
import { statusOf } from './status';
import { polarizationAtTime } from '../physics/decay';
import type { PolarizationAt } from '../runs/types';
import {
  combined,
  energiesLine,
  scalarLines,
  withBudget,
  withoutScalarUncertainties,
  type BudgetLine,
  type CoreValues,
} from './budget';
import { resultIntervals } from './intervals';
import { betaOutOfRange } from './outOfRange';

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
  // The measurement's own uncertainties are propagated analytically on the input with its scalar
  // inputs taken as exact; lattice and spacing get numerical sensitivities (analysis/budget.ts).
  const m = measure(withoutScalarUncertainties(input), series, problems);
  const { signal, finding, fractions } = m;
  // A measurement that gives no β, no T → 0 limit and no problem saying why has left the range of numbers.
  const noBeta =
    finding === NOTHING_MEASURED
      ? !!input.signal && !input.series && !signal
      : !finding.beta && !finding.limit && finding.problems.length === 0;
  const outOfRange = noBeta ? betaOutOfRange(input, problems) : null;
  if (outOfRange) problems.push(outOfRange);
  const lines = [measurementLine(m), ...scalarLines(input, (changed) => valuesOf(measure(changed, series, [])))];
  const energyShare = finding.fit ? energiesLine(input) : null;
  if (energyShare) lines.push(energyShare);
  const beta = withBudget(finding.beta?.value ?? null, lines, 'beta');
  const temperature = temperatureOf(beta, finding.limit);
  const polarization = withBudget(m.polarization?.value ?? null, lines, 'polarization');
  const thermalPolarization = m.thermalPolarization;
  const enhancement = enhancementOf(m);
  const energies = input.levels.map((l) => l.energy);
  const g = input.levels.map((l) => l.g);
  const plot = linePlot(input, problems);
  const outliers = plot?.outliers ?? [];
  const pairs = fractions ? invertedPairs(energies, fractions, g) : NONE;
  const status = finding === NOTHING_MEASURED ? seriesStatus(series) : statusOf(beta, finding, options.saturationSigma);
  const trade = tradeResults(input, { beta, temperature, saturated: status === 'saturated' }, plot, problems);
  const all = finding.problems.length === 0 ? problems : [...problems, ...finding.problems];
  const budget = lines.filter(contributes);
  const uEnhancement = enhancement === null ? null : combined(lines, 'enhancement');
  const polarizationAt = input.extrapolate ? extrapolated(input, polarization, problems) : null;
  return {
    polarizationAt,
    trade,
    status,
    series,
    signal: signal?.result ?? null,
    gain: measureGain(input),
    outliers: outliers.length === 0 ? NONE : outliers,
    beta,
    limit: finding.limit,
    temperature,
    polarization,
    thermalPolarization,
    uThermalPolarization: thermalPolarization === null ? null : combined(lines, 'thermalPolarization'),
    enhancement,
    uEnhancement,
    // One u(ε) everywhere: the budget's (every stated input, shared paths once); u(P) and u(lattice) in
    // quadrature only where the budget has none. Budget lines whose shares all vanish mean u(ε) = 0: a
    // thermal reference's ε = P_th/P_th is 1 whatever its lattice, not 1 ± √2·u(P_th)/P_th.
    enhancementUncertainty:
      uEnhancement ??
      (enhancement === null
        ? null
        : lines.some((l) => l.enhancement === 0) && lines.every((l) => l.enhancement === null || l.enhancement === 0)
          ? 0
          : polarization && thermalPolarization
            ? enhancementUncertainty(input, polarization.value, polarization.uncertainty, thermalPolarization)
            : null),
    intervals: resultIntervals(finding.limit ? null : beta, polarization),
    budget: budget.length === 0 ? NONE : budget,
    birge: birgeScaled(finding, lines),
    entropy: fractions ? gibbsEntropy(fractions, g) : null,
    fit: finding.fit,
    invertedPairs: pairs.length === 0 ? NONE : pairs,
    fractions,
    meanEnergy: fractions ? meanEnergy(fractions, energies) : null,
    problems: all.length === 0 ? NONE : all,
  };
}

/** `extrapolate:` applied to the block's polarization (a warning when the block has none). */
function extrapolated(input: BlockInput, p: Measured | null, problems: Problem[]): PolarizationAt | null {
  const x = input.extrapolate!;
  const at = p ? polarizationAtTime(p, x.from, x.to, x.decay) : null;
  if (!at) {
    problems.push({
      severity: 'warning',
      code: 'extrapolate-no-polarization',
      message: p
        ? 'extrapolate: the polarization carried to that time is not a finite number; check the times and T₁.'
        : 'extrapolate: this block gives no polarization to carry to another time.',
      span: x.keySpan,
    });
    return null;
  }
  return {
    time: x.to.value,
    value: at.value,
    uncertainty: at.uncertainty,
    from: x.from.value,
    decay: { value: x.decay.value, uncertainty: x.decay.uncertainty, run: x.decayRun?.id ?? null },
  };
}

/** What one evaluation of a block finds: β, the fractions, P and P_th (the referenced signal's P when there is one). */
interface Measurement {
  readonly signal: ReturnType<typeof measureSignal>;
  readonly finding: BetaFinding;
  readonly fractions: number[] | null;
  readonly polarization: Measured | null;
  readonly thermalPolarization: number | null;
}

/** One evaluation of the block's model: signal → P, β, fractions, P, P_th. */
function measure(input: BlockInput, series: SeriesFit | null, problems: Problem[]): Measurement {
  const signal = measureSignal(input, series, problems);
  // A referenced signal becomes the block's polarization; from there on it is a spin block like any other.
  const effective: BlockInput = signal ? { ...input, polarization: signal.polarization } : input;
  const finding = hasMeasurement(effective) ? findBeta(effective, problems) : NOTHING_MEASURED;
  const energies = input.levels.map((l) => l.energy);
  const g = input.levels.map((l) => l.g);
  // Emission lines sample only the upper levels: their "fractions" are not a distribution.
  const fractions = input.lines ? null : (finding.fractions ?? impliedFractions(energies, g, finding));
  // In radio astronomy "polarization" means the Stokes parameters and no bath sets an enhancement: neither is shown.
  const radio = tradeOf(input) === 'radio';
  const polarization = input.lines || radio ? null : (finding.polarization ?? polarizationOf(effective, fractions));
  return { signal, finding, fractions, polarization, thermalPolarization: radio ? null : thermalPolarizationOf(input) };
}

/** ε = P/P_th, or null when either is unknown or the ratio is not finite. */
function enhancementOf(m: Measurement): number | null {
  const p = m.polarization;
  const pth = m.thermalPolarization;
  if (!p || !pth) return null;
  const e = p.value / pth;
  return Number.isFinite(e) ? e : null;
}

/** The values of one evaluation, for the numerical sensitivities. */
function valuesOf(m: Measurement): CoreValues {
  return {
    beta: m.finding.beta?.value ?? null,
    polarization: m.polarization?.value ?? null,
    thermalPolarization: m.thermalPolarization,
    enhancement: enhancementOf(m),
  };
}

/** The measurement's own line: its analytic u(β) and u(P), and u(ε) = u(P)/|P_th| with P_th exact. */
function measurementLine(m: Measurement): BudgetLine {
  const finite = (x: number | null | undefined): number | null => (x != null && Number.isFinite(x) ? x : null);
  const uP = finite(m.polarization?.uncertainty);
  const pth = m.thermalPolarization;
  return {
    source: 'measurement',
    beta: finite(m.finding.beta?.uncertainty),
    polarization: uP,
    thermalPolarization: null,
    enhancement: uP !== null && pth ? finite(uP / Math.abs(pth)) : null,
  };
}

/** True when a line adds something to some result. */
function contributes(l: BudgetLine): boolean {
  return [l.beta, l.polarization, l.thermalPolarization, l.enhancement].some((v) => v !== null && v > 0);
}

/**
 * For a weighted fit with χ²/dof > 1, β with the fit's share of u(β) scaled by
 * the Birge ratio √(χ²/dof) (R. T. Birge, Phys. Rev. 40, 207 (1932), cited from memory; common
 * practice for inconsistent data), the other inputs' shares unchanged; null otherwise.
 */
function birgeScaled(f: BetaFinding, lines: readonly BudgetLine[]): BlockResults['birge'] {
  const fit = f.fit;
  if (!fit || !fit.weighted || !(fit.dof > 0) || !f.beta || !(fit.chi2 / fit.dof > 1)) return null;
  const ratio = Math.sqrt(fit.chi2 / fit.dof);
  const scaled = lines.map((l) => (l.source === 'measurement' && l.beta !== null ? { ...l, beta: l.beta * ratio } : l));
  const u = combined(scaled, 'beta');
  return Number.isFinite(ratio) && u !== null ? { ratio, beta: { value: f.beta.value, uncertainty: u } } : null;
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
  return input.polarization !== null || !!input.trade?.line || input.levels.some((l) => l.population !== null);
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
  if (input.trade?.line) return fromBrightness(input);
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

/**
 * β of a line from its brightness temperature, optical depth and background (physics/radio.ts): the slab
 * solution J(T_ex) = T_B/(1 − e^(−τ)) + J(T_bg) at the line's hν/k, the gap. A line deeper in absorption than
 * the background allows has no excitation temperature: an error on `brightness`, and no β.
 */
function fromBrightness(input: BlockInput): BetaFinding {
  const line = input.trade!.line!;
  const bg = input.trade!.background;
  const t0 = input.levels[1]!.energy - input.levels[0]!.energy;
  const beta = lineBeta(line.brightness, line.opticalDepth, bg, t0);
  const problems: Problem[] = [];
  if (!beta && t0 > 0) {
    const floor = deepestAbsorption(line.opticalDepth.value, bg?.value ?? 0, t0);
    const tb = line.brightness.value.toPrecision(4);
    problems.push({
      severity: 'error',
      code: 'absorption-too-deep',
      message: bg
        ? `brightness: with τ = ${line.opticalDepth.value.toPrecision(3)} against a background of ${bg.value.toPrecision(4)} K, a line at any positive excitation temperature absorbs at most to ${floor.toPrecision(4)} K (T_B = (J(T_ex) − J(T_bg))(1 − e^(−τ))), so ${tb} K gives none. Check the signs of T_B and τ, and the background.`
        : `brightness: without a background a line is seen only in emission (T_B = J(T_ex)(1 − e^(−τ)) > 0), so ${tb} K gives no excitation temperature. Give the \`background:\` the line absorbs against, or check the sign of T_B.`,
      span: line.brightness.span,
    });
  }
  return { beta, limit: null, fit: null, fractions: null, polarization: null, problems };
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

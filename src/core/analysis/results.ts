/** The physical results of one block, as the contract names them, plus what editors show. */
import type { SeriesFit } from '../physics/relaxation';
import type { Measured, Problem, Status } from '../types';
import type { TradeResults } from './trade';
import type { BudgetLine } from './budget';
import type { ResultIntervals } from './intervals';
import type { PolarizationAt, RunPlace } from '../runs/types';

/** Summary of the Boltzmann fit of a block with three or more levels. */
export interface FitSummary {
  readonly chi2: number;
  readonly dof: number;
  /** True when the fit used the populations' uncertainties as weights. */
  readonly weighted: boolean;
  /**
   * How many of the levels in the fit state an uncertainty: all of them when weighted; between 0 and all
   * in an unweighted fit, whose u(β) takes in those stated (docs/format.md, partly stated uncertainties).
   */
  readonly stated: number;
  /** True when the levels are consistent with one temperature (see docs/format.md#status). */
  readonly consistent: boolean;
  /** Residuals of ln(n/g) per level (null for a level left out of the fit). */
  readonly residuals: readonly (number | null)[];
  /** The 1 % critical value of χ² used, or null when the residual rule applied. */
  readonly critical: number | null;
}

/** How a signal was turned into a polarization, for audit. */
export interface SignalResult {
  /** Thermal polarization of the reference at `lattice`. */
  readonly pThermal: number;
  /** (scans_th·G_th sin θ_th n_th)/(scans_hp·G_hp sin θ_hp n_hp). */
  readonly factor: number;
  /** S_hp / S_th. */
  readonly ratio: number;
  readonly hyperpolarized: number;
  /** True when the hyperpolarized signal is the fitted amplitude of the series. */
  readonly fromSeries: boolean;
  /** True when the block records only a thermal signal: it is a thermal reference, P = P_th. */
  readonly thermalOnly?: boolean;
  /** The run the thermal reference was taken from (`thermal: { run: … }`), or null when typed in the block. */
  readonly thermalRun?: { readonly id: string; readonly place: RunPlace; readonly date: string | null } | null;
}

/** Gain of an optical transition. */
export interface GainResult {
  /** Small-signal gain coefficient g₀, cm⁻¹. */
  readonly coefficient: number;
  /** Standard uncertainty of g₀ from the densities' uncertainties, cm⁻¹, or null. */
  readonly uCoefficient: number | null;
  /** exp(g₀ L), or null without a length. */
  readonly singlePass: number | null;
  /** u(G) = G·L·u(g₀), or null. */
  readonly uSinglePass: number | null;
  /** The single-pass gain in decibels, 10 log₁₀ exp(g₀ L), or null without a length. */
  readonly singlePassDb: number | null;
  /** Inversion density ΔN = N_u − (g_u/g_l)·N_l, cm⁻³. */
  readonly inversion: number;
  /** Threshold inversion ΔN_th = g_th/σ, cm⁻³, or null without a threshold. */
  readonly thresholdInversion: number | null;
  /** Threshold gain coefficient, cm⁻¹, or null without length and mirrors. */
  readonly threshold: number | null;
  readonly aboveThreshold: boolean | null;
}

/** Results of a block that read without errors. */
export interface BlockResults {
  readonly status: Exclude<Status, 'invalid'>;
  /** Inverse temperature in K⁻¹, or null when it is ±∞ (see `limit`). */
  readonly beta: Measured | null;
  /** Set when all population sits in the lowest (`zero-positive`) or highest (`zero-negative`) level. */
  readonly limit: 'zero-positive' | 'zero-negative' | null;
  /** 1/β in K; null when β = 0; value 0 in a `limit`. */
  readonly temperature: Measured | null;
  readonly polarization: Measured | null;
  readonly thermalPolarization: number | null;
  /** Standard uncertainty of P_th from the stated u(lattice) and u(spacing), or null. */
  readonly uThermalPolarization: number | null;
  readonly enhancement: number | null;
  /** Standard uncertainty of ε from u(P) and u(lattice), or null when neither is known. */
  readonly enhancementUncertainty: number | null;
  /** Standard uncertainty of ε from every stated input uncertainty, or null. */
  readonly uEnhancement: number | null;
  /** The k = 2 coverage intervals of β, T and P (analysis/intervals.ts). */
  readonly intervals: ResultIntervals;
  /** Each input's share of the uncertainties (GUM §5.1.3), the measurement first; empty without uncertainties. */
  readonly budget: readonly BudgetLine[];
  /** For a weighted fit with χ²/dof > 1: the Birge ratio √(χ²/dof) and β with the fit's u scaled by it. */
  readonly birge: { readonly ratio: number; readonly beta: Measured } | null;
  /** Gibbs entropy S/(Nk) of the measured (or implied) distribution. */
  readonly entropy: number | null;
  readonly fit: FitSummary | null;
  /** Pairs of level indices (lowest first) with more population per degeneracy in the upper one. */
  readonly invertedPairs: readonly { readonly lower: number; readonly upper: number }[];
  /** Normalised population of each level (measured, or implied by β when a polarization was given). */
  readonly fractions: readonly number[] | null;
  /** Mean energy per system in kelvin, from `fractions`. */
  readonly meanEnergy: number | null;
  /** The fitted time series, when the block has one. */
  readonly series: SeriesFit | null;
  readonly signal: SignalResult | null;
  readonly gain: GainResult | null;
  /** Indices (levels order) of emission lines flagged as outliers. */
  readonly outliers: readonly number[];
  /** The polarization carried to another time by `extrapolate:`, or null (absent in results built before it). */
  readonly polarizationAt?: PolarizationAt | null;
  /** Warnings and notes found by the analysis (body-relative spans). */
  readonly problems: readonly Problem[];
  /** What the block's trade adds: its words, plot data, refit, column densities. */
  readonly trade: TradeResults;
}

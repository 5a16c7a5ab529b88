/**
 * The data the curve view draws for one block, computed by the core where it
 * runs (the language server) and sent to the webview as plain JSON. Energies
 * are E/k in kelvin per system, β in K⁻¹, entropies S/(Nk); the webview only
 * converts energies to the display unit with {@link DisplayUnit.kelvinPerUnit}.
 */
import type { Status } from '../types';
import type { SpectrumTrace } from './spectrumPanel';

/** Points of an S(E), β(E) curve in columns, ordered by increasing energy. */
export interface CurveColumns {
  /** Mean energy per system, K (E/k). */
  readonly energy: readonly number[];
  /** Entropy S/(Nk). */
  readonly entropy: readonly number[];
  /** Inverse temperature, K⁻¹. */
  readonly beta: readonly number[];
}

/** The exact finite-N curve ln C(N, m)/N of a two-level scheme. */
export interface FiniteNColumns extends CurveColumns {
  /** Number of systems N (the block's `count`). */
  readonly n: number;
  /** Number of systems in the upper level at each point. */
  readonly m: readonly number[];
}

/** The block's own energy unit, for the energy axis. */
export interface DisplayUnit {
  /** The unit as the note writes it (`cm-1`, `MHz`, `K` …). */
  readonly name: string;
  /** The unit for display (`cm⁻¹`). */
  readonly label: string;
  /** Kelvin per one of this unit: E/unit = (E/k in K) / kelvinPerUnit. */
  readonly kelvinPerUnit: number;
}

/** The measured (or implied) distribution of the block as a point on the curve. */
export interface MeasuredPoint {
  /** Mean energy per system, K, and its standard uncertainty (null when no input carried one). */
  readonly energy: number;
  readonly uEnergy: number | null;
  /** Gibbs entropy S/(Nk) of the distribution, and its standard uncertainty. */
  readonly entropy: number;
  readonly uEntropy: number | null;
  /** β in K⁻¹ with its standard uncertainty; null at a T → 0± limit or when undefined. */
  readonly beta: number | null;
  readonly uBeta: number | null;
  /** Set when all population sits in the lowest or highest level (β → ±∞). */
  readonly limit: 'zero-positive' | 'zero-negative' | null;
  /** Entropy of the thermal state with the same mean energy (the curve's value at `energy`). */
  readonly thermalEntropy: number | null;
  /** S_thermal(E) − S_measured, ≥ 0: how far below the curve the point sits. */
  readonly deficit: number | null;
  /** D(p ‖ p_thermal at the same E) in nats; equals `deficit` (see measuredPoint.ts). */
  readonly relativeEntropy: number | null;
}

/** The thermal-equilibrium state at the block's `lattice` temperature. */
export interface ThermalMarker {
  /** Lattice temperature in K. */
  readonly temperature: number;
  readonly beta: number;
  readonly energy: number;
  readonly entropy: number;
}

/** A labelled, already formatted value for the panel's fact list. */
export interface Fact {
  readonly label: string;
  readonly text: string;
}

/** One measured point of a measurement plot. */
export interface PlotPoint {
  readonly x: number;
  readonly y: number;
  /** Standard uncertainty of y, or null. */
  readonly u: number | null;
  /** True for a point the analysis flags (an emission line more than 3 σ off the fit). */
  readonly flagged: boolean;
  readonly label: string | null;
}

/**
 * What was measured, drawn as it was fitted: the Boltzmann plot of emission
 * lines (ln(Iλ/gA) or ln(I/gA) against the upper-level energy, with the fitted
 * line of slope −β), or a time series with its fitted model and residuals.
 */
export interface MeasurementPlot {
  readonly kind: 'boltzmann' | 'series';
  readonly title: string;
  readonly xTitle: string;
  readonly yTitle: string;
  readonly points: readonly PlotPoint[];
  /** The fitted model, sampled densely, ordered by x. */
  readonly fit: { readonly x: readonly number[]; readonly y: readonly number[] };
  /** Residual (measured − fitted) at each point's x. */
  readonly residuals: readonly { readonly x: number; readonly y: number }[];
}

/** Where a payload comes from: the note, its version and the block's opening-fence line. */
export interface PayloadSource {
  readonly uri: string;
  readonly version: number;
  /** 0-based line of the block's opening fence. */
  readonly line: number;
}

/** Everything the view draws for a block that read without errors. */
export interface CurvePayload extends PayloadSource {
  readonly kind: 'curve';
  /** The block's `id`, or a stand-in naming its line. Untrusted text: show it as text only. */
  readonly id: string;
  readonly status: Exclude<Status, 'invalid'>;
  readonly unit: DisplayUnit;
  /** Level energies (K, lowest first) and degeneracies. */
  readonly scheme: { readonly energies: readonly number[]; readonly g: readonly number[] };
  /** Mean energy at β = 0 (saturation), K; above it β < 0 (population inversion). */
  readonly saturationEnergy: number;
  /** ln Σg, the entropy at saturation. */
  readonly maxEntropy: number;
  /** The large-N curve. */
  readonly curve: CurveColumns;
  /** The exact finite-N staircase (block with `count`, two levels), or null. */
  readonly finiteN: FiniteNColumns | null;
  readonly measured: MeasuredPoint | null;
  readonly thermal: ThermalMarker | null;
  readonly facts: readonly Fact[];
  /** Sentences about what is not drawn and why. */
  readonly notes: readonly string[];
  /** The measurement behind the point (a series fit), or null. */
  readonly plot: MeasurementPlot | null;
  /** The spectra the block's references integrate (view/spectrumPanel.ts); absent when it has none. */
  readonly spectra?: readonly SpectrumTrace[];
}

/** What the view shows instead of a chart: the block's first error, or why nothing can be drawn. */
export interface ProblemPayload extends PayloadSource {
  readonly kind: 'problem';
  readonly id: string | null;
  /** The diagnostic's stable code, or null when the block has no error but nothing to draw. */
  readonly code: string | null;
  readonly message: string;
  /** A measurement to draw although there is no S(E) curve (emission lines, a bare series), or null. */
  readonly plot: MeasurementPlot | null;
  /** The spectra the block's references integrate, as far as they were read; absent when none. */
  readonly spectra?: readonly SpectrumTrace[];
}

/** One block's view data. */
export type ViewPayload = CurvePayload | ProblemPayload;

/**
 * The panel's title for a payload, naming what it shows: `Curve: <id>`, `Series fit: <id>` or
 * `Boltzmann plot: <id>` for a block that has only that plot, `No curve: <id>` otherwise; the block's
 * line when it has no id. Plain text (VS Code shows a panel title as text).
 */
export function payloadTitle(p: ViewPayload): string {
  const name = p.id ?? `block at line ${p.line + 1}`;
  if (p.kind === 'curve') return `Curve: ${name}`;
  if (p.plot) return `${p.plot.kind === 'series' ? 'Series fit' : 'Boltzmann plot'}: ${name}`;
  return `No curve: ${name}`;
}

/**
 * The physical input of one block, read from its YAML: the level scheme
 * (energies in kelvin, sorted lowest first) and what was measured. Spans are
 * body-relative so the hosts can point at what the user wrote.
 */
import type { SpectrumUse } from '../spectra/types';
import type { SpinSpecies } from '../quantities/isotopes';
import type { Span } from '../types';
import type { BlockForm } from './schema';
import type { ReadValue } from './values';
import type { RunPlace, RunRef } from '../runs/types';

/** One level of the scheme. */
export interface LevelInput {
  readonly label: string | null;
  /** Energy E/k in kelvin. */
  readonly energy: number;
  /** Standard uncertainty of the energy, K, when written (`levels` form), else null. */
  readonly uEnergy?: number | null;
  readonly g: number;
  /** Population on the block's own scale, or null when not measured directly. */
  readonly population: number | null;
  readonly uPopulation: number | null;
  /** The whole item (for hovers), and its population's span when written. */
  readonly span: Span | null;
  readonly populationSpan: Span | null;
}

/** A spin in a field: what the Zeeman levels were built from. */
export interface SpinInput {
  readonly species: SpinSpecies;
  /** Level spacing per Δm = 1, in kelvin, with its uncertainty. */
  readonly spacing: number;
  readonly uSpacing: number | null;
  /** Field in tesla (given or inferred from the frequency). */
  readonly field: number | null;
  /** Larmor frequency in Hz (given or computed). */
  readonly frequency: number;
}

/** A signal compared with a thermal reference (hyperpolarization practice). */
export interface SignalInput {
  /** Hyperpolarized signal, or null when a time series supplies it (its fitted amplitude). */
  readonly hyperpolarized: number | null;
  readonly uHyperpolarized: number | null;
  readonly thermal: number;
  readonly uThermal: number | null;
  /** `[hyperpolarized, thermal]` pairs; flips in radians. */
  readonly scans: readonly [number, number];
  readonly flip: readonly [number, number];
  readonly gain: readonly [number, number];
  readonly amount: readonly [number, number];
  readonly span: Span;
  /** The run the thermal side was taken from (`thermal: { run: … }`), or null when typed here. */
  readonly thermalRun?: ThermalRun | null;
}

/** `extrapolate:`: carry the block's polarization from `from` to `to` along a decay with time constant `decay` (T₁). */
export interface ExtrapolateInput {
  /** Times in s, with their spans. */
  readonly from: ReadValue;
  readonly to: ReadValue;
  /** T₁ in s (typed, or the decay run's fitted T₁ with the span of the reference). */
  readonly decay: ReadValue;
  /** The decay run T₁ came from, or null when typed. */
  readonly decayRun: {
    readonly id: string;
    readonly place: RunPlace;
    readonly date: string | null;
    readonly span: Span;
  } | null;
  /** The value's span and the key's, body-relative. */
  readonly span: Span;
  readonly keySpan: Span;
}

/** A thermal reference taken from another run: what it gave and where it is. */
export interface ThermalRun {
  readonly id: string;
  readonly place: RunPlace;
  /** The reference block's `date`, as written, or null. */
  readonly date: string | null;
  /** The reference's spin (isotope, level spacing, field): P_th is computed with it. */
  readonly spin: SpinInput;
  /** The reference's lattice temperature, with the span of the reference in this block. */
  readonly lattice: ReadValue | null;
  /** The reference value and its id part in this block (body-relative). */
  readonly span: Span;
  readonly idSpan: Span;
}

/** A time series of signals. */
export interface SeriesInput {
  readonly model: 'decay' | 'buildup';
  /** Times in s, increasing. */
  readonly times: readonly number[];
  readonly signals: readonly number[];
  /** Per-point standard uncertainties, or null. */
  readonly uSignals: readonly number[] | null;
  /** Readout flip angle in rad (decays), or null. */
  readonly flip: number | null;
  readonly span: Span;
  /** Spans of each signal value, for per-point notes. */
  readonly signalSpans: readonly Span[];
}

/** One emission line. */
export interface LineInput {
  readonly label: string | null;
  /** Wavelength in nm, or null (photon-counting detectors do not need it). */
  readonly wavelength: number | null;
  /** Upper-level energy E/k in K. */
  readonly upper: number;
  readonly g: number;
  /** Transition probability in s⁻¹. */
  readonly A: number;
  readonly intensity: number;
  readonly uIntensity: number | null;
  readonly span: Span;
  /** True when u(I) = √I was assumed for photon counts written without ±. */
  readonly poisson?: boolean;
  /** Line frequency in Hz (radiometer lines), or null. */
  readonly frequency?: number | null;
  /** Optical depth at the line centre (radiometer lines), or null for an optically thin line. */
  readonly opticalDepth?: number | null;
}

/** Emission lines of one species. */
export interface LinesInput {
  /** How intensities were measured: energy-calibrated, photon counts, or integrated brightness temperatures (K km/s). */
  readonly detector: 'energy' | 'photon' | 'radiometer';
  /** True when the block did not say (`energy` is then assumed). */
  readonly detectorAssumed?: boolean;
  readonly lines: readonly LineInput[];
}

/** Gain of an optical transition, from absolute populations. */
export interface GainInput {
  /** σ in cm². */
  readonly crossSection: number;
  /** Medium length in cm, or null. */
  readonly length: number | null;
  readonly mirrors: readonly [number, number] | null;
  /** Distributed loss α in cm⁻¹ (0 when not given). */
  readonly loss: number;
}

/** A line's excitation (spin) temperature from its brightness temperature, optical depth and background. */
export interface LineTemperatureInput {
  /** Rayleigh–Jeans brightness temperature T_B in K, with its uncertainty. */
  readonly brightness: ReadValue;
  /** Optical depth τ at the line centre. */
  readonly opticalDepth: ReadValue;
}

/**
 * What the emission and radio trades add to a block: the wavelength medium,
 * the background temperature, a line temperature from T_B and τ, a linear
 * rotor's constant (for the partition function) and column densities.
 */
export interface TradeInput {
  /** Medium of the block's optical wavelengths; `stated` false when the IAU convention was assumed. */
  readonly medium: { readonly kind: 'air' | 'vacuum'; readonly stated: boolean } | null;
  /** Background (or bath) radiation temperature in K, e.g. the 2.725 K cosmic background. */
  readonly background: ReadValue | null;
  readonly line: LineTemperatureInput | null;
  /** Rotational constant B of a linear rotor as hB/k in K, or null. */
  readonly rotor: ReadValue | null;
  /** True when the populations are column densities (cm⁻²). */
  readonly columns: boolean;
}

/** Everything the analysis needs from a block that read without errors. */
export interface BlockInput {
  readonly form: BlockForm;
  /** Levels sorted by energy, lowest first. */
  readonly levels: readonly LevelInput[];
  /** The unit the block wrote its energies in (for display), or null. */
  readonly energyUnit: string | null;
  readonly spin: SpinInput | null;
  /** A directly given polarization (spin form), as a fraction. */
  readonly polarization: ReadValue | null;
  /** A directly given ratio n_upper/n_lower (transition form). */
  readonly ratio: ReadValue | null;
  /** Transition gap uncertainty in kelvin (two-level forms). */
  readonly uGap: number | null;
  readonly lattice: ReadValue | null;
  readonly count: number | null;
  /** True when every population was given as a number density (cm⁻³). */
  readonly densities: boolean;
  readonly signal: SignalInput | null;
  readonly series: SeriesInput | null;
  readonly lines: LinesInput | null;
  readonly gain: GainInput | null;
  /** The emission and radio additions; absent in blocks built before them (tests, other hosts). */
  readonly trade?: TradeInput;
  /** `extrapolate:` (the polarization at another time), or absent/null. */
  readonly extrapolate?: ExtrapolateInput | null;
}

/** The block's label and the spans of its keys, kept even when the block has errors. */
export interface BlockMeta {
  readonly id: string | null;
  readonly idSpan: Span | null;
  /** Key name → spans of the key and its value, for hovers and completions. */
  readonly keys: ReadonlyMap<string, { key: Span; value: Span }>;
  /** The block's `date` as written (free text), or null. */
  readonly date: string | null;
  /** The runs the block refers to (`{ run: … }`), with body-relative spans; absent or empty when none. */
  readonly refs?: readonly RunRef[];
  /** The block's spectrum references in text order (block/spectrumRef.ts); absent or empty when none. */
  readonly spectra?: readonly SpectrumUse[];
}

/** What one form's reader returns; the block reader adds the keys common to all forms. */
export type FormRead = Omit<
  BlockInput,
  'lattice' | 'count' | 'series' | 'signal' | 'lines' | 'gain' | 'densities' | 'trade'
> &
  Partial<Pick<BlockInput, 'signal' | 'lines' | 'gain' | 'densities'>> & {
    /** The form's share of the trade keys (medium, line temperature, columns). */
    readonly trade?: Partial<TradeInput>;
  };

/**
 * The physical input of one block, read from its YAML: the level scheme
 * (energies in kelvin, sorted lowest first) and what was measured. Spans are
 * body-relative so the hosts can point at what the user wrote.
 */
import type { SpinSpecies } from '../isotopes';
import type { Span } from '../types';
import type { BlockForm } from './schema';
import type { ReadValue } from './values';

/** One level of the scheme. */
export interface LevelInput {
  readonly label: string | null;
  /** Energy E/k in kelvin. */
  readonly energy: number;
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
}

/** The block's label and the spans of its keys, kept even when the block has errors. */
export interface BlockMeta {
  readonly id: string | null;
  readonly idSpan: Span | null;
  /** Key name → spans of the key and its value, for hovers and completions. */
  readonly keys: ReadonlyMap<string, { key: Span; value: Span }>;
}

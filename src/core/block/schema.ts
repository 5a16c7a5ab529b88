/**
 * The keys a `levels` block understands, with one-line documentation each.
 * One definition feeds the reader (unknown-key warnings and suggestions),
 * completions and hovers in the editor, and docs/format.md.
 */

/** The three ways a block can describe its level scheme. */
export type BlockForm = 'levels' | 'spin' | 'transition';

/** One documented key. */
export interface KeyDoc {
  readonly key: string;
  /** Which form the key belongs to, or `any`. */
  readonly form: BlockForm | 'any';
  readonly summary: string;
  /** An example value as it would be written. */
  readonly example: string;
}

/** Top-level keys of a block. */
export const BLOCK_KEYS: readonly KeyDoc[] = [
  { key: 'id', form: 'any', summary: 'Label of the run, used in hovers, the outline and reports.', example: 'cell-B run 7' },
  { key: 'levels', form: 'levels', summary: 'Explicit levels: a list of `{ label, energy, g, population }` items (order does not matter).', example: '' },
  { key: 'system', form: 'spin', summary: 'Isotope symbol, mass number first (`1H`, `13C`, `129Xe`), or `electron`.', example: '13C' },
  { key: 'field', form: 'spin', summary: 'Magnetic field: gives the Zeeman splitting from the isotope table’s γ (`T`, `mT`, `G`).', example: '9.4 T' },
  { key: 'frequency', form: 'spin', summary: 'Observed Larmor frequency (includes the sample’s shielding); may replace `field`.', example: '100.66 MHz' },
  { key: 'g-factor', form: 'spin', summary: 'Electron g-factor when it differs from the free electron’s.', example: '2.0036' },
  { key: 'populations', form: 'any', summary: 'Populations in order of increasing energy, on any common scale (only ratios matter).', example: '[0.70, 0.30]' },
  { key: 'polarization', form: 'spin', summary: 'Polarization instead of populations (⟨I_z⟩/I for spin > 1/2); `±` allowed.', example: '0.312 ± 0.010' },
  { key: 'gap', form: 'transition', summary: 'Energy of the single transition (energy, frequency, wavenumber or wavelength).', example: '1420.405751768 MHz' },
  { key: 'g', form: 'transition', summary: 'Degeneracies `[lower, upper]`; default `[1, 1]`.', example: '[1, 3]' },
  { key: 'ratio', form: 'transition', summary: 'Population ratio n_upper / n_lower instead of populations.', example: '2.9979' },
  { key: 'lattice', form: 'any', summary: 'Bath (lattice) temperature: gives the thermal-equilibrium polarization and the enhancement.', example: '1.4 K' },
  { key: 'count', form: 'any', summary: 'Number of independent systems N; curves then show the exact finite-N entropy.', example: '1000' },
  { key: 'uncertainty', form: 'any', summary: 'Standard uncertainty of the block’s `polarization` or `ratio` (instead of `±`).', example: '0.01' },
  { key: 'note', form: 'any', summary: 'Free text, kept and never computed on.', example: '' },
  { key: 'sample', form: 'any', summary: 'Free text naming the sample.', example: '' },
  { key: 'date', form: 'any', summary: 'Date of the run (free text; ISO 8601 recommended).', example: '2026-03-14' },
];

/** Keys of one item of an explicit `levels` list. */
export const LEVEL_KEYS: readonly KeyDoc[] = [
  { key: 'label', form: 'levels', summary: 'Name of the level.', example: 'ground' },
  { key: 'energy', form: 'levels', summary: 'Level energy with a unit; only differences matter, negative values are fine.', example: '120 cm-1' },
  { key: 'g', form: 'levels', summary: 'Degeneracy, a whole number ≥ 1 (default 1).', example: '3' },
  { key: 'population', form: 'levels', summary: 'Population (≥ 0) on any scale shared by the block; `±` allowed.', example: '0.25' },
  { key: 'uncertainty', form: 'levels', summary: 'Standard uncertainty of this level’s population.', example: '0.01' },
];

/** Names of the top-level keys, for lookups. */
export const BLOCK_KEY_NAMES: ReadonlySet<string> = new Set(BLOCK_KEYS.map((k) => k.key));
/** Names of the level item keys. */
export const LEVEL_KEY_NAMES: ReadonlySet<string> = new Set(LEVEL_KEYS.map((k) => k.key));

/**
 * The keys a `levels` block understands, with one-line documentation each.
 * One definition feeds the reader (unknown-key warnings and suggestions),
 * completions and hovers in the editor, and docs/format.md.
 */

/**
 * How a block describes what was measured: the three level schemes of the
 * format, emission `lines` (a Boltzmann plot), or a bare time `series`.
 */
export type BlockForm = 'levels' | 'spin' | 'transition' | 'lines' | 'series';

/** One documented key. */
export interface KeyDoc {
  readonly key: string;
  /** Which form the key belongs to, or `any`. */
  readonly form: BlockForm | 'any';
  readonly summary: string;
  /** An example value as it would be written. */
  readonly example: string;
  /** For a key shared by some forms only: every form it belongs to (`form` is then the first). */
  readonly forms?: readonly BlockForm[];
}

/** Whether a key belongs to a block of this form. */
export function keyFitsForm(doc: KeyDoc, form: BlockForm): boolean {
  return doc.form === 'any' || doc.form === form || (doc.forms?.includes(form) ?? false);
}

/** The forms that speak of lines and transitions rather than spins. */
const LINE_FORMS: readonly BlockForm[] = ['transition', 'lines', 'levels'];

/** Top-level keys of a block. */
export const BLOCK_KEYS: readonly KeyDoc[] = [
  {
    key: 'id',
    form: 'any',
    summary: 'Label of the run, used in hovers, the outline and reports.',
    example: 'cell-B run 7',
  },
  {
    key: 'levels',
    form: 'levels',
    summary: 'Explicit levels: a list of `{ label, energy, g, population }` items (order does not matter).',
    example: '',
  },
  {
    key: 'system',
    form: 'spin',
    summary: 'Isotope symbol, mass number first (`1H`, `13C`, `129Xe`), or `electron`.',
    example: '13C',
  },
  {
    key: 'field',
    form: 'spin',
    summary: 'Magnetic field: gives the Zeeman splitting from the isotope table’s γ (`T`, `mT`, `G`).',
    example: '9.4 T',
  },
  {
    key: 'frequency',
    form: 'spin',
    summary: 'Observed Larmor frequency (includes the sample’s shielding); may replace `field`.',
    example: '100.66 MHz',
  },
  {
    key: 'g-factor',
    form: 'spin',
    summary: 'Electron g-factor when it differs from the free electron’s.',
    example: '2.0036',
  },
  {
    key: 'populations',
    form: 'any',
    summary: 'Populations in order of increasing energy, on any common scale (only ratios matter).',
    example: '[0.70, 0.30]',
  },
  {
    key: 'polarization',
    form: 'spin',
    summary: 'Polarization instead of populations (⟨I_z⟩/I for spin > 1/2); `±` allowed.',
    example: '0.312 ± 0.010',
  },
  {
    key: 'gap',
    form: 'transition',
    summary: 'Energy of the single transition (energy, frequency, wavenumber or wavelength).',
    example: '1420.405751768 MHz',
  },
  { key: 'g', form: 'transition', summary: 'Degeneracies `[lower, upper]`; default `[1, 1]`.', example: '[1, 3]' },
  {
    key: 'ratio',
    form: 'transition',
    summary: 'Population ratio n_upper / n_lower instead of populations.',
    example: '2.9979',
  },
  {
    key: 'signal',
    form: 'spin',
    summary:
      'Signal against a thermal reference: `hyperpolarized`, `thermal` (a number, or `{ run: <id> }` to take it from a thermal reference run), and optional `scans`, `flip`, `gain`, `amount`, `noise` (each `{ hyperpolarized, thermal }`). Without `hyperpolarized` the block is a thermal reference itself.',
    example: '',
  },
  {
    key: 'extrapolate',
    form: 'any',
    summary:
      'Carry the polarization from the time it was measured (`from`) to another (`to`) along a decay of time constant `decay` (T₁, typed or `{ run: <decay run> }`): result `polarizationAt`.',
    example: '{ from: 42 s, to: 0 s, decay: 47.9 ± 1.2 s }',
  },
  {
    key: 'spectrum',
    form: 'any',
    summary:
      'Default spectrum file (relative to the note, `/` as separator) for the block’s spectrum references `{ region: [from, to] }`.',
    example: 'spectra/run12.jdx',
  },
  {
    key: 'series',
    form: 'any',
    summary:
      'A time series: `model` (`decay` or `buildup`), `time` and `signal` lists, and `flip` (readout flip angle) for decays.',
    example: '',
  },
  {
    key: 'lines',
    form: 'lines',
    summary: 'Emission lines of one species for a Boltzmann plot: `{ wavelength, upper, g, A, intensity }` items.',
    example: '',
  },
  {
    key: 'detector',
    form: 'lines',
    summary:
      'How line intensities were measured: `energy` (energy-calibrated, assumed when absent), `photon` (photon counting; √N uncertainties when none is written) or `radiometer` (integrated brightness temperatures in K km/s: a rotation diagram).',
    example: 'energy',
  },
  {
    key: 'cross-section',
    form: 'transition',
    summary: 'Stimulated-emission cross-section σ of the transition (with absolute populations): gives the gain.',
    example: '2.8e-19 cm2',
  },
  {
    key: 'length',
    form: 'transition',
    summary: 'Length of the gain medium: gives the single-pass gain and the threshold.',
    example: '10 cm',
  },
  {
    key: 'mirrors',
    form: 'transition',
    summary: 'Mirror reflectivities `[R1, R2]` of the resonator, for the threshold check.',
    example: '[0.995, 0.95]',
  },
  { key: 'loss', form: 'transition', summary: 'Distributed loss α of the medium (default 0).', example: '0.01 cm-1' },
  {
    key: 'brightness',
    form: 'transition',
    summary:
      'Brightness temperature T_B of the line (Rayleigh–Jeans scale), with `optical-depth`: J(T_ex) = T_B/(1 − e^(−τ)) + J(T_bg), J(T) = (hν/k)/(e^(hν/kT) − 1).',
    example: '35 ± 1 K',
  },
  {
    key: 'optical-depth',
    form: 'transition',
    summary: 'Optical depth τ at the line centre, with `brightness`.',
    example: '0.8 ± 0.1',
  },
  {
    key: 'background',
    form: 'transition',
    forms: LINE_FORMS,
    summary:
      'Background radiation temperature T_bg (the cosmic background is 2.725 K): added to a line temperature, and an excitation temperature below it is warned about.',
    example: '2.725 K',
  },
  {
    key: 'wavelengths',
    form: 'transition',
    forms: LINE_FORMS,
    summary:
      'Whether optical wavelengths are in `air` or `vacuum`; without it the IAU convention is assumed: air from 200 nm up, vacuum below.',
    example: 'air',
  },
  {
    key: 'rotational-constant',
    form: 'transition',
    forms: LINE_FORMS,
    summary: 'Rotational constant B of a linear rotor: gives the partition function Q(T) and the total column density.',
    example: '57.635968 GHz',
  },
  {
    key: 'lattice',
    form: 'any',
    summary: 'Bath (lattice) temperature: gives the thermal-equilibrium polarization and the enhancement.',
    example: '1.4 K',
  },
  {
    key: 'count',
    form: 'any',
    summary: 'Number of independent systems N; curves then show the exact finite-N entropy.',
    example: '1000',
  },
  {
    key: 'uncertainty',
    form: 'any',
    summary: 'Standard uncertainty of the block’s `polarization` or `ratio` (instead of `±`).',
    example: '0.01',
  },
  { key: 'note', form: 'any', summary: 'Free text, kept and never computed on.', example: '' },
  { key: 'sample', form: 'any', summary: 'Free text naming the sample.', example: '' },
  { key: 'date', form: 'any', summary: 'Date of the run (free text; ISO 8601 recommended).', example: '2026-03-14' },
];

/** Keys of one item of an explicit `levels` list. */
export const LEVEL_KEYS: readonly KeyDoc[] = [
  { key: 'label', form: 'levels', summary: 'Name of the level.', example: 'ground' },
  {
    key: 'energy',
    form: 'levels',
    summary: 'Level energy with a unit; only differences matter, negative values are fine.',
    example: '120 cm-1',
  },
  { key: 'g', form: 'levels', summary: 'Degeneracy, a whole number ≥ 1 (default 1).', example: '3' },
  {
    key: 'population',
    form: 'levels',
    summary: 'Population (≥ 0) on any scale shared by the block; `±` allowed.',
    example: '0.25',
  },
  { key: 'uncertainty', form: 'levels', summary: 'Standard uncertainty of this level’s population.', example: '0.01' },
];

/** Keys of one emission line. */
export const LINE_KEYS: readonly KeyDoc[] = [
  {
    key: 'wavelength',
    form: 'lines',
    summary: 'Wavelength of the line (needed for energy-calibrated intensities).',
    example: '696.54 nm',
  },
  { key: 'upper', form: 'lines', summary: 'Energy of the upper level of the line.', example: '13.328 eV' },
  { key: 'g', form: 'lines', summary: 'Degeneracy of the upper level.', example: '3' },
  { key: 'A', form: 'lines', summary: 'Transition probability (Einstein A) in s⁻¹.', example: '6.39e6' },
  {
    key: 'intensity',
    form: 'lines',
    summary: 'Measured line intensity (any common scale); `±` allowed.',
    example: '1520 ± 40',
  },
  { key: 'uncertainty', form: 'lines', summary: 'Standard uncertainty of the intensity.', example: '40' },
  {
    key: 'species',
    form: 'lines',
    summary: 'Species of the line (all lines of a block must share it).',
    example: 'Ar I',
  },
  { key: 'label', form: 'lines', summary: 'Name of the line.', example: 'Ar I 696.5' },
  {
    key: 'frequency',
    form: 'lines',
    summary: 'Frequency of the line (needed by `detector: radiometer`).',
    example: '115.2712018 GHz',
  },
  {
    key: 'optical-depth',
    form: 'lines',
    summary: 'Optical depth τ of the line (radiometer): corrects N_u by τ/(1 − e^(−τ)).',
    example: '0.5',
  },
];

/** Keys of `signal:` (thermal reference). */
export const SIGNAL_KEYS: readonly string[] = ['hyperpolarized', 'thermal', 'scans', 'flip', 'gain', 'amount', 'noise'];
/** Keys of `series:`. */
export const SERIES_KEYS: readonly string[] = ['model', 'time', 'signal', 'flip', 'noise'];

/** Names of the top-level keys, for lookups. */
export const BLOCK_KEY_NAMES: ReadonlySet<string> = new Set(BLOCK_KEYS.map((k) => k.key));
/** Names of the level item keys. */
export const LEVEL_KEY_NAMES: ReadonlySet<string> = new Set(LEVEL_KEYS.map((k) => k.key));

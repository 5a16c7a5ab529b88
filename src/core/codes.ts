/**
 * Every diagnostic code the core can emit, with its usual severity and a
 * one-line explanation. docs/format.md has a section per code (its anchor is
 * the code itself); a test keeps the two in step.
 */
import type { Severity } from './types';

/** One documented diagnostic. */
export interface CodeDoc {
  readonly severity: Severity;
  readonly summary: string;
}

/** The registry, grouped as docs/format.md groups them. */
export const CODES: Readonly<Record<string, CodeDoc>> = {
  // The fence and the YAML
  'fence-unclosed': { severity: 'warning', summary: 'The block has no closing fence and runs to the end of the note.' },
  'block-empty': { severity: 'error', summary: 'The block has no content.' },
  'yaml-syntax': { severity: 'error', summary: 'The body is not valid YAML.' },
  'yaml-duplicate-key': { severity: 'error', summary: 'A key appears twice in one mapping.' },
  'yaml-alias': { severity: 'error', summary: 'An alias refers to an anchor that does not exist.' },
  'yaml-tab-indent': { severity: 'error', summary: 'Tabs are used for indentation, which YAML forbids.' },
  'yaml-warning': { severity: 'warning', summary: 'YAML accepted the text but warns about it.' },
  'alias-expansion': { severity: 'error', summary: 'Aliases would expand past the bound (an "alias bomb").' },
  'nesting-too-deep': {
    severity: 'error',
    summary: 'Lists and mappings nest deeper than the 64 levels a block is read to.',
  },
  'block-large': { severity: 'error', summary: 'A block body above 500,000 characters; not read in the editor.' },
  'problems-not-listed': {
    severity: 'info',
    summary: 'A block with more than 100 problems: how many more there are than those listed.',
  },
  'body-not-mapping': { severity: 'error', summary: 'The body must be a mapping of key: value lines.' },
  'text-expected': { severity: 'warning', summary: 'A list or mapping where a label (`id`, `date`) is text; ignored.' },
  'key-unknown': { severity: 'warning', summary: 'A key the block does not know; ignored, with a suggestion.' },
  // The form
  'form-missing': { severity: 'error', summary: 'None of `levels`, `system` or `gap` was given.' },
  'form-conflict': { severity: 'error', summary: 'More than one of `levels`, `system`, `gap` was given.' },
  'measurement-missing': { severity: 'error', summary: 'The block gives no populations, polarization or ratio.' },
  'populations-and-polarization': { severity: 'error', summary: 'Both `populations` and `polarization` were given.' },
  'populations-and-ratio': { severity: 'error', summary: 'Both `populations` and `ratio` were given.' },
  'populations-misplaced': { severity: 'error', summary: 'A `populations` list next to explicit `levels`.' },
  // Values and units
  'value-missing': { severity: 'error', summary: 'A key has no value.' },
  'number-invalid': { severity: 'error', summary: 'Not a finite number (NaN, infinity, overflow, or not a number).' },
  'unit-missing': { severity: 'error', summary: 'A bare number where a unit is required; the fix adds one.' },
  'unit-case': { severity: 'error', summary: 'A unit written in the wrong case (`MT` for `mT`); the fix corrects it.' },
  'unit-unknown': { severity: 'error', summary: 'A unit that is not in the table; a close match is offered.' },
  'unit-dimension': {
    severity: 'error',
    summary: 'A valid unit of the wrong kind for the key (a field unit for an energy).',
  },
  'unit-unexpected': { severity: 'error', summary: 'A unit on a value that must be a plain number.' },
  'uncertainty-negative': { severity: 'error', summary: 'A standard uncertainty below zero.' },
  'uncertainty-twice': { severity: 'error', summary: 'Both `±` and an `uncertainty` key for the same value.' },
  'list-expected': { severity: 'error', summary: 'A list was expected.' },
  // The spin form
  'isotope-unknown': {
    severity: 'error',
    summary: 'An isotope not in the table; a "did you mean" fix when one is close.',
  },
  'field-missing': { severity: 'error', summary: 'A spin needs `field` or `frequency`.' },
  'field-not-positive': { severity: 'error', summary: 'The field must be positive.' },
  'frequency-not-positive': { severity: 'error', summary: 'The frequency must be positive.' },
  'field-frequency-mismatch': {
    severity: 'warning',
    summary: 'Field and frequency disagree with the isotope table by more than 1 %.',
  },
  'g-factor-not-electron': { severity: 'error', summary: '`g-factor` was given for a nucleus.' },
  'g-factor-zero': { severity: 'error', summary: 'A zero g-factor.' },
  'g-factor-invalid': { severity: 'error', summary: 'A g-factor that cannot be used.' },
  'populations-length': { severity: 'error', summary: 'The populations list does not have 2I + 1 (or 2) values.' },
  'polarization-range': { severity: 'error', summary: '|P| > 1 (perhaps a percentage written as a fraction).' },
  // The transition form and the levels form
  'gap-not-positive': { severity: 'error', summary: 'The gap must be positive.' },
  'degeneracy-length': { severity: 'error', summary: '`g` must list two degeneracies.' },
  'degeneracy-invalid': { severity: 'error', summary: 'A degeneracy must be a whole number ≥ 1.' },
  'ratio-negative': { severity: 'error', summary: 'A population ratio below zero.' },
  'levels-too-few': { severity: 'error', summary: 'Fewer than two levels.' },
  'level-not-mapping': { severity: 'error', summary: 'A level item is not a mapping.' },
  'energy-missing': { severity: 'error', summary: 'A level without `energy`.' },
  'population-missing': { severity: 'error', summary: 'A level without `population`.' },
  'levels-descending': { severity: 'info', summary: 'Levels listed from the top down; a fix lists them lowest first.' },
  'energy-equal': { severity: 'error', summary: 'All levels at one energy: no temperature is defined.' },
  // Populations
  'population-negative': { severity: 'error', summary: 'A negative population.' },
  'populations-zero': { severity: 'error', summary: 'All populations are zero.' },
  'population-zero-excluded': { severity: 'info', summary: 'An empty level is left out of the Boltzmann fit.' },
  'population-zero-inconsistent': {
    severity: 'warning',
    summary: 'An empty level that no temperature explains: between populated levels, or too far from its 0 ± u.',
  },
  'uncertainty-partial': {
    severity: 'info',
    summary:
      'Only some levels or lines state an uncertainty: an unweighted fit, u(β) from the stated ones and the scatter.',
  },
  'temperature-zero': { severity: 'info', summary: 'All population in the lowest (T → 0⁺) or highest (T → 0⁻) level.' },
  'beta-out-of-range': {
    severity: 'error',
    summary: 'Finite inputs whose β is not a finite number (a spacing that rounds to 0 or to infinity).',
  },
  // Measurement inputs (signals, series, lines, gain)
  'key-not-for-form': {
    severity: 'warning',
    summary: 'A key of another form (e.g. `detector` in a spin block); ignored.',
  },
  'measurement-conflict': { severity: 'error', summary: '`signal` together with `populations` or `polarization`.' },
  'signal-not-mapping': { severity: 'error', summary: '`signal` (or one of its pairs) is not a mapping.' },
  'signal-incomplete': { severity: 'error', summary: 'A required part of `signal` is missing.' },
  'signal-thermal-zero': { severity: 'error', summary: 'A zero thermal reference signal.' },
  'signal-factor-invalid': { severity: 'error', summary: 'A scan count, gain, amount or flip angle out of range.' },
  'signal-lattice-missing': { severity: 'error', summary: 'A thermal reference needs `lattice`, its temperature.' },
  'signal-polarization-range': { severity: 'error', summary: 'The referenced polarization comes out beyond ±1.' },
  // Spectra by reference (block/spectrumRef.ts)
  'spectrum-reference': {
    severity: 'error',
    summary: 'A spectrum reference without a file or region, or with a region, noise or baseline not written as one.',
  },
  'spectrum-missing': {
    severity: 'error',
    summary: 'The referenced spectrum file does not exist (or cannot be read here).',
  },
  'spectrum-malformed': {
    severity: 'error',
    summary: 'The referenced file is not a readable spectrum; the message gives its line.',
  },
  'spectrum-region': {
    severity: 'error',
    summary: 'A region or noise region beyond the file’s x range, or with fewer than 3 points.',
  },
  'spectrum-unit': { severity: 'error', summary: 'A region unit that does not convert to the file’s x unit.' },
  'spectrum-outside': {
    severity: 'error',
    summary: 'A spectrum path outside the workspace (editor) or the note’s folder tree (command line); not read.',
  },
  'spectrum-units-differ': {
    severity: 'warning',
    summary: 'Values the block compares are integrals over different x units (y·Hz against y·ppm).',
  },
  'spectrum-large': { severity: 'error', summary: 'A spectrum file above 64 MB; not read.' },
  'noise-replaced': {
    severity: 'warning',
    summary:
      'A typed `noise` for a value whose spectrum reference has a noise region; the region’s uncertainty is used.',
  },
  'scans-invalid': { severity: 'error', summary: 'A number of scans must be a whole number ≥ 1.' },
  'series-not-mapping': { severity: 'error', summary: '`series` is not a mapping.' },
  'series-incomplete': { severity: 'error', summary: '`series` lacks `model`, `time` or `signal`.' },
  'series-model': { severity: 'error', summary: '`series.model` is neither `decay` nor `buildup`.' },
  'series-length-mismatch': { severity: 'error', summary: 'Times and signals of unequal length.' },
  'series-times-order': { severity: 'error', summary: 'Times that do not increase.' },
  'series-too-short': {
    severity: 'error',
    summary: 'Fewer points than the model has parameters (error), or exactly as many (warning: no uncertainties).',
  },
  'series-sign-change': { severity: 'error', summary: 'A decaying signal that changes sign (or is all zero).' },
  'series-no-convergence': { severity: 'warning', summary: 'The nonlinear fit did not converge.' },
  'flip-too-large': { severity: 'error', summary: 'A decay readout flip angle of 90 deg or more (or ≤ 0).' },
  'flip-ignored': {
    severity: 'warning',
    summary: 'A flip angle on a build-up: the correction applies to decays only.',
  },
  'detector-unknown': { severity: 'error', summary: '`detector` is neither `energy`, `photon` nor `radiometer`.' },
  'detector-assumed': { severity: 'info', summary: 'No `detector`: energy-calibrated intensities are assumed.' },
  'lines-too-few': { severity: 'error', summary: 'Fewer than two emission lines.' },
  'lines-mixed-species': { severity: 'error', summary: 'Lines of different species in one Boltzmann plot.' },
  'line-not-mapping': { severity: 'error', summary: 'An emission line is not a mapping.' },
  'line-wavelength-missing': {
    severity: 'error',
    summary: 'A line without `wavelength` (needed for energy-calibrated intensities).',
  },
  'line-upper-missing': { severity: 'error', summary: 'A line without its upper-level energy.' },
  'line-g-missing': { severity: 'error', summary: 'A line without the upper level’s degeneracy.' },
  'line-a-missing': { severity: 'error', summary: 'A line without its transition probability `A`.' },
  'line-intensity-missing': { severity: 'error', summary: 'A line without `intensity`.' },
  'line-a-invalid': { severity: 'error', summary: 'A transition probability ≤ 0.' },
  'line-wavelength-invalid': { severity: 'error', summary: 'A wavelength ≤ 0.' },
  'line-intensity-invalid': { severity: 'error', summary: 'An intensity ≤ 0 (its logarithm is plotted).' },
  'line-outlier': {
    severity: 'warning',
    summary: 'A line more than 3 σ off the line refitted without the outliers (iterative clipping).',
  },
  'line-frequency-missing': { severity: 'error', summary: 'A radiometer line without its frequency.' },
  'line-frequency-invalid': { severity: 'error', summary: 'A line frequency ≤ 0.' },
  'intensity-unit': { severity: 'error', summary: 'An integrated brightness in a unit other than K km/s.' },
  'absorption-too-deep': {
    severity: 'error',
    summary: 'A line deeper in absorption than the background allows at its optical depth: no excitation temperature.',
  },
  'optical-depth-invalid': { severity: 'error', summary: 'An optical depth ≤ 0.' },
  'energy-implausible': {
    severity: 'warning',
    summary: 'An upper-level energy far above any atomic or ionic level seen in emission.',
  },
  'energy-span-small': {
    severity: 'warning',
    summary: 'The upper-level energies span less than kT: the slope, and so T, is poorly defined.',
  },
  'temperature-below-background': {
    severity: 'warning',
    summary: 'A positive excitation temperature below the background or bath temperature.',
  },
  'line-temperature-incomplete': {
    severity: 'error',
    summary: '`brightness` without `optical-depth`, or the reverse.',
  },
  'populations-and-line-temperature': {
    severity: 'error',
    summary: 'Populations or a ratio together with `brightness`/`optical-depth`.',
  },
  'populations-mixed-units': {
    severity: 'error',
    summary: 'Populations mixing number densities, column densities and plain numbers.',
  },
  'wavelengths-unknown': { severity: 'error', summary: '`wavelengths` is neither `air` nor `vacuum`.' },
  'background-not-positive': { severity: 'error', summary: 'A background temperature ≤ 0 K.' },
  'rotor-not-positive': { severity: 'error', summary: 'A rotational constant ≤ 0.' },
  'gain-cross-section-missing': { severity: 'error', summary: 'Gain keys without `cross-section`.' },
  'gain-needs-densities': { severity: 'error', summary: 'The gain needs populations as number densities (cm⁻³).' },
  'gain-value-not-positive': { severity: 'error', summary: 'A cross-section or length ≤ 0.' },
  'gain-length-missing': { severity: 'warning', summary: '`mirrors` without `length`: no threshold.' },
  'mirrors-invalid': { severity: 'error', summary: 'Mirror reflectivities must be two numbers in (0, 1].' },
  'loss-negative': { severity: 'error', summary: 'A negative distributed loss.' },
  // Runs by reference
  'id-duplicate': { severity: 'warning', summary: 'Another block of the workspace carries the same id.' },
  'reference-syntax': { severity: 'error', summary: 'A `{ run: … }` reference that is malformed or names no id.' },
  'reference-unavailable': {
    severity: 'error',
    summary: 'A reference to another run where the host follows none (a lone text, no notes given).',
  },
  'reference-unknown': {
    severity: 'error',
    summary: 'No block has the referenced id, or the named note does not exist; the closest ids are offered.',
  },
  'reference-cycle': { severity: 'error', summary: 'References that lead back to the referring block.' },
  'reference-invalid': {
    severity: 'error',
    summary: 'The referenced block has an error (named, with where it is) and gives no value.',
  },
  'reference-chain': {
    severity: 'error',
    summary: 'A run at the start of a chain of references more than 32 runs deep (named by `reference-invalid`).',
  },
  'reference-kind': {
    severity: 'error',
    summary: 'The referenced block lacks the quantity (a thermal signal, a fitted decay).',
  },
  'reference-mismatch': { severity: 'error', summary: 'A thermal reference of another isotope.' },
  'reference-field': {
    severity: 'warning',
    summary: 'A thermal reference recorded at a field more than 1 % from this block’s.',
  },
  'reference-shadowed': {
    severity: 'warning',
    summary: 'A thermal-side value (or `lattice`) written next to a thermal reference by run; it is ignored.',
  },
  'extrapolate-incomplete': { severity: 'error', summary: '`extrapolate` lacks `from`, `to` or `decay`.' },
  'extrapolate-decay-invalid': { severity: 'error', summary: 'A decay time constant T₁ that is not positive.' },
  'extrapolate-no-polarization': {
    severity: 'warning',
    summary: '`extrapolate` on a block that gives no (finite) polarization to carry.',
  },
  // Other keys
  'lattice-not-positive': { severity: 'error', summary: 'The lattice temperature must be above 0 K.' },
  'count-invalid': { severity: 'error', summary: '`count` must be a whole number ≥ 1.' },
  'internal-error': { severity: 'error', summary: 'A fault in Boltzmark itself; please report it.' },
  // The whole note
  'note-bounded': {
    severity: 'warning',
    summary: 'The note is larger than the editor reads as you type; later blocks get no results there.',
  },
  // The file (command line)
  'file-unreadable': {
    severity: 'error',
    summary: 'The command line could not read the file (missing, not permitted, a broken link, not a regular file).',
  },
  'notebook-invalid': {
    severity: 'error',
    summary: 'A `.ipynb` file is not a Jupyter notebook (not JSON, or no cells); its Markdown cells cannot be read.',
  },
  'text-encoding-invalid': {
    severity: 'warning',
    summary: 'Bytes of the block are not UTF-8; each bad sequence is read as U+FFFD.',
  },
};

/** The section of docs/format.md that explains a code. */
export function codeDocAnchor(code: string): string {
  return `docs/format.md#${code}`;
}

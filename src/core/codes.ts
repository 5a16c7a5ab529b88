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
  'body-not-mapping': { severity: 'error', summary: 'The body must be a mapping of key: value lines.' },
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
  'unit-dimension': { severity: 'error', summary: 'A valid unit of the wrong kind for the key (a field unit for an energy).' },
  'unit-unexpected': { severity: 'error', summary: 'A unit on a value that must be a plain number.' },
  'uncertainty-negative': { severity: 'error', summary: 'A standard uncertainty below zero.' },
  'uncertainty-twice': { severity: 'error', summary: 'Both `±` and an `uncertainty` key for the same value.' },
  'list-expected': { severity: 'error', summary: 'A list was expected.' },
  // The spin form
  'isotope-unknown': { severity: 'error', summary: 'An isotope not in the table; a "did you mean" fix when one is close.' },
  'field-missing': { severity: 'error', summary: 'A spin needs `field` or `frequency`.' },
  'field-not-positive': { severity: 'error', summary: 'The field must be positive.' },
  'frequency-not-positive': { severity: 'error', summary: 'The frequency must be positive.' },
  'field-frequency-mismatch': { severity: 'warning', summary: 'Field and frequency disagree with the isotope table by more than 1 %.' },
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
  'temperature-zero': { severity: 'info', summary: 'All population in the lowest (T → 0⁺) or highest (T → 0⁻) level.' },
  // Other keys
  'lattice-not-positive': { severity: 'error', summary: 'The lattice temperature must be above 0 K.' },
  'count-invalid': { severity: 'error', summary: '`count` must be a whole number ≥ 1.' },
  'internal-error': { severity: 'error', summary: 'A fault in Boltzmark itself; please report it.' },
};

/** The section of docs/format.md that explains a code. */
export function codeDocAnchor(code: string): string {
  return `docs/format.md#${code}`;
}

/**
 * Spin species: nuclear isotopes and the electron, with spin quantum number I
 * and signed gyromagnetic ratio γ, plus the Zeeman quantities derived from them.
 *
 * Nuclear γ are the bare-nucleus values of the IUPAC 2001 table (Harris et al.,
 * Pure Appl. Chem. 73, 1795 (2001)), which is what level energies need; the
 * observed Larmor frequency of a sample also carries chemical shielding. The
 * electron uses CODATA 2022 (see constants.ts).
 */
import { BOHR_MAGNETON, BOLTZMANN, CODATA_EDITION, ELECTRON_GYROMAGNETIC_RATIO, HBAR } from './constants';
import { closest } from '../text/suggest';

/** A particle with a spin in a magnetic field. */
export interface SpinSpecies {
  /** Symbol as written in a block: mass number first (`13C`), or `electron`. */
  readonly symbol: string;
  /** Spin quantum number I (0.5, 1, 1.5, …); 2I + 1 Zeeman levels. */
  readonly spin: number;
  /** Gyromagnetic ratio γ in rad s⁻¹ T⁻¹, signed: γ < 0 puts m = −I lowest. */
  readonly gamma: number;
  /** Where γ and I come from. */
  readonly source: string;
}

const IUPAC_2001 = 'IUPAC 2001 (Harris et al., Pure Appl. Chem. 73, 1795), bare nucleus';

/** γ in units of 10⁷ rad s⁻¹ T⁻¹, as tabulated by IUPAC. */
const NUCLEI: ReadonlyArray<readonly [symbol: string, spin: number, gamma1e7: number]> = [
  ['1H', 0.5, 26.7522128],
  ['2H', 1, 4.10662791],
  ['3He', 0.5, -20.3801587],
  ['7Li', 1.5, 10.3977013],
  ['13C', 0.5, 6.728284],
  ['15N', 0.5, -2.71261804],
  ['17O', 2.5, -3.62808],
  ['19F', 0.5, 25.18148],
  ['23Na', 1.5, 7.0808493],
  ['29Si', 0.5, -5.319],
  ['31P', 0.5, 10.8394],
  ['129Xe', 0.5, -7.452103],
];

/** The free electron: I = 1/2, γ = −|γ_e| (sign of g_e), CODATA 2022. */
export const ELECTRON: SpinSpecies = {
  symbol: 'electron',
  spin: 0.5,
  gamma: -ELECTRON_GYROMAGNETIC_RATIO,
  source: `${CODATA_EDITION}, |γ_e| with the sign of g_e`,
};

const TABLE: ReadonlyMap<string, SpinSpecies> = new Map<string, SpinSpecies>([
  ...NUCLEI.map(([symbol, spin, g]): [string, SpinSpecies] => [
    symbol,
    { symbol, spin, gamma: g * 1e7, source: IUPAC_2001 },
  ]),
  ['electron', ELECTRON],
]);

/**
 * An electron with a given g-factor (for example a measured EPR g value):
 * γ = g μ_B / ħ (μ_B from CODATA 2022). Write g negative for the sign
 * convention of the free electron (g_e ≈ −2.0023); only |γ| enters level spacings.
 *
 * @returns the species, or null when g is zero or not finite.
 */
export function electronWithGFactor(g: number): SpinSpecies | null {
  if (!Number.isFinite(g) || g === 0) return null;
  return {
    symbol: 'electron',
    spin: 0.5,
    gamma: (g * BOHR_MAGNETON) / HBAR,
    source: `g = ${g} given in the block; μ_B from ${CODATA_EDITION}`,
  };
}

/** Every accepted symbol, nuclei by mass number then `electron`, for completions. */
export function speciesSymbols(): string[] {
  return [...TABLE.keys()];
}

/** Names people write instead of a symbol, lower-cased, mapped to the symbol. */
const ALIASES: Readonly<Record<string, string>> = {
  e: 'electron',
  'e-': 'electron',
  'e−': 'electron',
  electron: 'electron',
  electrons: 'electron',
  proton: '1H',
  protons: '1H',
  deuteron: '2H',
  deuterium: '2H',
  d: '2H',
  helion: '3He',
};

/** Element names for `carbon-13`-style spellings (only elements of the table). */
const ELEMENT_NAMES: Readonly<Record<string, string>> = {
  hydrogen: 'H',
  helium: 'He',
  lithium: 'Li',
  carbon: 'C',
  nitrogen: 'N',
  oxygen: 'O',
  fluorine: 'F',
  sodium: 'Na',
  silicon: 'Si',
  phosphorus: 'P',
  xenon: 'Xe',
};

/** The element symbol for a lower-cased name or symbol: `carbon` → `C`, `xe` → `Xe`. */
function elementSymbol(lower: string): string {
  return Object.hasOwn(ELEMENT_NAMES, lower) ? ELEMENT_NAMES[lower] : lower.charAt(0).toUpperCase() + lower.slice(1);
}

/** Puts `C13`, `13c`, `13 C`, `c-13`, `carbon-13` into the `13C` form, or returns null. */
function normaliseSymbol(text: string): string | null {
  const compact = text.replace(/[\s_\-–]+/g, '').replace(/^\^/, '');
  const match = /^(\d+)([a-z]+)$/i.exec(compact) ?? /^([a-z]+)(\d+)$/i.exec(compact);
  if (!match) return null;
  const [mass, letters] = /^\d/.test(match[1]) ? [match[1], match[2]] : [match[2], match[1]];
  const lower = letters.toLowerCase();
  const element = elementSymbol(lower);
  return `${Number(mass)}${element}`;
}

/**
 * Finds a species by its symbol. Only the exact symbol is accepted (`13C`,
 * `electron`); any other spelling gives a suggestion: first by normalising
 * (mass number first, element capitalised: `C13`, `13c`, `Xe129`, `13 C` →
 * `13C`; `Electron`, `e-` → `electron`), then by edit distance ≤ 2 on the
 * lower-cased text. Never throws.
 *
 * @returns `{ species }`, or `{ suggestion }` with the intended symbol or null.
 */
export function lookupSpecies(text: string): { species: SpinSpecies } | { suggestion: string | null } {
  const exact = TABLE.get(text);
  if (exact) return { species: exact };
  const trimmed = text.trim();
  if (TABLE.has(trimmed)) return { suggestion: trimmed };
  if (Object.hasOwn(ALIASES, trimmed.toLowerCase())) return { suggestion: ALIASES[trimmed.toLowerCase()] };
  const normal = normaliseSymbol(trimmed);
  if (normal !== null && TABLE.has(normal)) return { suggestion: normal };
  const symbols = speciesSymbols();
  if (normal !== null) {
    // A listed element with another mass number (`14N` → `15N`), else a misspelt
    // element with a listed mass number (`13Cc` → `13C`); an unlisted nucleus gets nothing.
    const [, mass, element] = /^(\d+)(.*)$/.exec(normal) ?? ['', '', ''];
    const sameElement = symbols.filter((s) => s.replace(/^\d+/, '') === element);
    const sameMass = symbols.filter((s) => s.startsWith(mass) && /^\D/.test(s.slice(mass.length)));
    return { suggestion: closest(normal, sameElement, 3) ?? closest(normal, sameMass, 2, { ignoreCase: true }) };
  }
  // An element without a mass number (`Xe`, `carbon`): its first isotope in the table.
  const bare = trimmed.toLowerCase();
  const element = elementSymbol(bare);
  const first = symbols.find((s) => s.replace(/^\d+/, '') === element);
  if (first !== undefined) return { suggestion: first };
  const limit = trimmed.length <= 3 ? 1 : 2;
  return { suggestion: closest(normal ?? trimmed, symbols, limit, { ignoreCase: true }) };
}

/**
 * Larmor frequency ν = |γ| B / 2π in Hz for a field B in tesla (bare-nucleus γ,
 * so no chemical shielding). Valid for any finite B; the result is ≥ 0 for B ≥ 0.
 */
export function larmorFrequencyHz(species: SpinSpecies, fieldT: number): number {
  return (Math.abs(species.gamma) * fieldT) / (2 * Math.PI);
}

/**
 * Zeeman level spacing per Δm = 1, |γ| ħ B / k, in kelvin, for a field B in
 * tesla (ħ and k exact, SI 2019). Equal to h ν / k with ν the Larmor frequency.
 */
export function zeemanSpacingKelvin(species: SpinSpecies, fieldT: number): number {
  return (Math.abs(species.gamma) * HBAR * fieldT) / BOLTZMANN;
}

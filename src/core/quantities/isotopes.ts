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
import { fromSuperscript } from './quantityText';

/** A particle with a spin in a magnetic field. */
export interface SpinSpecies {
  /** Symbol as written in a block: mass number first (`13C`), or `electron`. */
  readonly symbol: string;
  /** Spin quantum number I (0.5, 1, 1.5, …); 2I + 1 Zeeman levels. */
  readonly spin: number;
  /** Gyromagnetic ratio γ in rad s⁻¹ T⁻¹, signed: γ < 0 puts m = −I lowest. */
  readonly gamma: number;
  /** Natural abundance in %, or null (the electron; nuclei not found in nature). */
  readonly abundance: number | null;
  /** Where γ and I come from. */
  readonly source: string;
}

const IUPAC_2001 = 'IUPAC 2001 (Harris et al., Pure Appl. Chem. 73, 1795), bare nucleus';

/**
 * Every stable nucleus with nonzero spin, and the long-lived ones in common
 * use (3H, 40K, 50V, 87Rb, 99Tc, 113Cd, 115In, 138La, 176Lu, 187Re, 235U),
 * of Table 1 of the IUPAC 2001 recommendations (R. K. Harris, E. D. Becker,
 * S. M. Cabral de Menezes, R. Goodfellow, P. Granger, Pure Appl. Chem. 73,
 * 1795 (2001)), ordered by mass number: spin I, the signed magnetogyric
 * ratio γ in 10⁷ rad s⁻¹ T⁻¹ as tabulated, and the natural abundance in %
 * (null for nuclei not found in nature). Rows marked "from memory" were
 * recalled rather than copied from the table.
 */
const NUCLEI: ReadonlyArray<readonly [symbol: string, spin: number, gamma1e7: number, abundance: number | null]> = [
  ['1H', 0.5, 26.7522128, 99.9885],
  ['2H', 1, 4.10662791, 0.0115],
  ['3H', 0.5, 28.5349779, null],
  ['3He', 0.5, -20.3801587, 0.000137],
  ['6Li', 1, 3.9371709, 7.59],
  ['7Li', 1.5, 10.3977013, 92.41],
  ['9Be', 1.5, -3.759666, 100],
  ['10B', 3, 2.8746786, 19.9],
  ['11B', 1.5, 8.5847044, 80.1],
  ['13C', 0.5, 6.728284, 1.07],
  ['14N', 1, 1.9337792, 99.632],
  ['15N', 0.5, -2.71261804, 0.368],
  ['17O', 2.5, -3.62808, 0.038],
  ['19F', 0.5, 25.18148, 100],
  ['21Ne', 1.5, -2.11308, 0.27],
  ['23Na', 1.5, 7.0808493, 100],
  ['25Mg', 2.5, -1.63887, 10.0],
  ['27Al', 2.5, 6.9762715, 100],
  ['29Si', 0.5, -5.319, 4.6832],
  ['31P', 0.5, 10.8394, 100],
  ['33S', 1.5, 2.055685, 0.76],
  ['35Cl', 1.5, 2.624198, 75.78],
  ['37Cl', 1.5, 2.184368, 24.22],
  ['39K', 1.5, 1.2500608, 93.2581],
  ['40K', 4, -1.5542854, 0.0117],
  ['41K', 1.5, 0.68606808, 6.7302],
  ['43Ca', 3.5, -1.803069, 0.135],
  ['45Sc', 3.5, 6.5087973, 100],
  ['47Ti', 2.5, -1.5105, 7.44],
  ['49Ti', 3.5, -1.51095, 5.41],
  ['50V', 6, 2.670649, 0.25],
  ['51V', 3.5, 7.0455117, 99.75],
  ['53Cr', 1.5, -1.5152, 9.501],
  ['55Mn', 2.5, 6.6452546, 100],
  ['57Fe', 0.5, 0.8680624, 2.119],
  ['59Co', 3.5, 6.332, 100],
  ['61Ni', 1.5, -2.3948, 1.1399],
  ['63Cu', 1.5, 7.111789, 69.17],
  ['65Cu', 1.5, 7.60435, 30.83],
  ['67Zn', 2.5, 1.676688, 4.1],
  ['69Ga', 1.5, 6.438855, 60.108],
  ['71Ga', 1.5, 8.181171, 39.892],
  ['73Ge', 4.5, -0.9360303, 7.73],
  ['75As', 1.5, 4.596163, 100],
  ['77Se', 0.5, 5.1253857, 7.63],
  ['79Br', 1.5, 6.725616, 50.69],
  ['81Br', 1.5, 7.249776, 49.31],
  ['83Kr', 4.5, -1.0331, 11.49],
  ['85Rb', 2.5, 2.592705, 72.17],
  ['87Rb', 1.5, 8.7864, 27.83],
  ['87Sr', 4.5, -1.1639376, 7.0],
  ['89Y', 0.5, -1.3162791, 100],
  ['91Zr', 2.5, -2.49743, 11.22],
  ['93Nb', 4.5, 6.5674, 100],
  ['95Mo', 2.5, -1.751, 15.92],
  ['97Mo', 2.5, -1.788, 9.55],
  ['99Tc', 4.5, 6.046, null],
  ['99Ru', 2.5, -1.229, 12.76],
  ['101Ru', 2.5, -1.377, 17.06],
  ['103Rh', 0.5, -0.8468, 100],
  ['105Pd', 2.5, -1.23, 22.33],
  ['107Ag', 0.5, -1.0889181, 51.839],
  ['109Ag', 0.5, -1.2518634, 48.161],
  ['111Cd', 0.5, -5.6983131, 12.8],
  ['113Cd', 0.5, -5.9609155, 12.22],
  ['113In', 4.5, 5.8845, 4.29],
  ['115Sn', 0.5, -8.8013, 0.34],
  ['115In', 4.5, 5.8972, 95.71],
  ['117Sn', 0.5, -9.58879, 7.68],
  ['119Sn', 0.5, -10.0317, 8.59],
  ['121Sb', 2.5, 6.4435, 57.21],
  ['123Te', 0.5, -7.059098, 0.89],
  ['123Sb', 3.5, 3.4892, 42.79],
  ['125Te', 0.5, -8.5108404, 7.07],
  ['127I', 2.5, 5.389573, 100],
  ['129Xe', 0.5, -7.452103, 26.44],
  ['131Xe', 1.5, 2.209076, 21.18],
  ['133Cs', 3.5, 3.5332539, 100],
  ['135Ba', 1.5, 2.6755, 6.592],
  ['137Ba', 1.5, 2.99295, 11.232],
  ['138La', 5, 3.557239, 0.09],
  ['139La', 3.5, 3.8083318, 99.91],
  // Lanthanide rows from memory, each checked against γ = μ·μ_N/(ħI) with moments also recalled from memory.
  ['141Pr', 2.5, 8.1907, 100],
  ['143Nd', 3.5, -1.457, 12.2],
  ['145Nd', 3.5, -0.898, 8.3],
  ['147Sm', 3.5, -1.115, 14.99],
  ['149Sm', 3.5, -0.9192, 13.82],
  ['151Eu', 2.5, 6.651, 47.81],
  ['153Eu', 2.5, 2.9369, 52.19],
  ['155Gd', 1.5, -0.82132, 14.8],
  ['157Gd', 1.5, -1.0769, 15.65],
  ['159Tb', 1.5, 6.4306, 100],
  ['161Dy', 2.5, -0.9201, 18.91],
  ['163Dy', 2.5, 1.289, 24.9],
  ['165Ho', 3.5, 5.71, 100],
  ['167Er', 3.5, -0.77157, 22.93],
  ['169Tm', 0.5, -2.218, 100], // from memory
  ['171Yb', 0.5, 4.7288, 14.28], // from memory
  ['173Yb', 2.5, -1.3025, 16.13],
  ['175Lu', 3.5, 3.0552, 97.41],
  ['176Lu', 7, 2.1684, 2.59],
  ['177Hf', 3.5, 1.086, 18.6],
  ['179Hf', 4.5, -0.6821, 13.62],
  ['181Ta', 3.5, 3.2438, 99.988],
  ['183W', 0.5, 1.1282403, 14.31],
  ['185Re', 2.5, 6.1057, 37.4],
  ['187Os', 0.5, 0.6192895, 1.96],
  ['187Re', 2.5, 6.1682, 62.6],
  ['189Os', 1.5, 2.10713, 16.15],
  ['191Ir', 1.5, 0.4812, 37.3],
  ['193Ir', 1.5, 0.5227, 62.7],
  ['195Pt', 0.5, 5.8385, 33.832],
  ['197Au', 1.5, 0.47306, 100],
  ['199Hg', 0.5, 4.8457916, 16.87],
  ['201Hg', 1.5, -1.788769, 13.18],
  ['203Tl', 0.5, 15.5393338, 29.524],
  ['205Tl', 0.5, 15.6921808, 70.476],
  // As tabulated in 2001; later measurements of the 207Pb moment give about 5.676 (from memory).
  ['207Pb', 0.5, 5.58046, 22.1],
  ['209Bi', 4.5, 4.375, 100],
  ['235U', 3.5, -0.52, 0.72], // from memory
];

/** The free electron: I = 1/2, γ = −|γ_e| (sign of g_e), CODATA 2022. */
export const ELECTRON: SpinSpecies = {
  symbol: 'electron',
  spin: 0.5,
  gamma: -ELECTRON_GYROMAGNETIC_RATIO,
  abundance: null,
  source: `${CODATA_EDITION}, |γ_e| with the sign of g_e`,
};

const TABLE: ReadonlyMap<string, SpinSpecies> = new Map<string, SpinSpecies>([
  ...NUCLEI.map(([symbol, spin, g, abundance]): [string, SpinSpecies] => [
    symbol,
    { symbol, spin, gamma: g * 1e7, abundance, source: IUPAC_2001 },
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
    abundance: null,
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

/** Element names for `carbon-13`-style spellings (the elements of the table; both spellings where two are in use). */
const ELEMENT_NAMES: Readonly<Record<string, string>> = {
  hydrogen: 'H',
  helium: 'He',
  lithium: 'Li',
  beryllium: 'Be',
  boron: 'B',
  carbon: 'C',
  nitrogen: 'N',
  oxygen: 'O',
  fluorine: 'F',
  neon: 'Ne',
  sodium: 'Na',
  magnesium: 'Mg',
  aluminium: 'Al',
  aluminum: 'Al',
  silicon: 'Si',
  phosphorus: 'P',
  sulfur: 'S',
  sulphur: 'S',
  chlorine: 'Cl',
  potassium: 'K',
  calcium: 'Ca',
  scandium: 'Sc',
  titanium: 'Ti',
  vanadium: 'V',
  chromium: 'Cr',
  manganese: 'Mn',
  iron: 'Fe',
  cobalt: 'Co',
  nickel: 'Ni',
  copper: 'Cu',
  zinc: 'Zn',
  gallium: 'Ga',
  germanium: 'Ge',
  arsenic: 'As',
  selenium: 'Se',
  bromine: 'Br',
  krypton: 'Kr',
  rubidium: 'Rb',
  strontium: 'Sr',
  yttrium: 'Y',
  zirconium: 'Zr',
  niobium: 'Nb',
  molybdenum: 'Mo',
  technetium: 'Tc',
  ruthenium: 'Ru',
  rhodium: 'Rh',
  palladium: 'Pd',
  silver: 'Ag',
  cadmium: 'Cd',
  indium: 'In',
  tin: 'Sn',
  antimony: 'Sb',
  tellurium: 'Te',
  iodine: 'I',
  xenon: 'Xe',
  caesium: 'Cs',
  cesium: 'Cs',
  barium: 'Ba',
  lanthanum: 'La',
  praseodymium: 'Pr',
  neodymium: 'Nd',
  samarium: 'Sm',
  europium: 'Eu',
  gadolinium: 'Gd',
  terbium: 'Tb',
  dysprosium: 'Dy',
  holmium: 'Ho',
  erbium: 'Er',
  thulium: 'Tm',
  ytterbium: 'Yb',
  lutetium: 'Lu',
  hafnium: 'Hf',
  tantalum: 'Ta',
  tungsten: 'W',
  rhenium: 'Re',
  osmium: 'Os',
  iridium: 'Ir',
  platinum: 'Pt',
  gold: 'Au',
  mercury: 'Hg',
  thallium: 'Tl',
  lead: 'Pb',
  bismuth: 'Bi',
  uranium: 'U',
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
 * `electron`, and `¹³C` with the mass number as a superscript, as print
 * writes it); any other spelling gives a suggestion: first by normalising
 * (mass number first, element capitalised: `C13`, `13c`, `Xe129`, `13 C` →
 * `13C`; `Electron`, `e-` → `electron`), then by edit distance ≤ 2 on the
 * lower-cased text. Never throws.
 *
 * @returns `{ species }`, or `{ suggestion }` with the intended symbol or null.
 */
export function lookupSpecies(written: string): { species: SpinSpecies } | { suggestion: string | null } {
  // The mass number as print writes it, a superscript before the symbol (`¹³C`, `¹²⁹Xe`), is the same isotope.
  const text = /^\s*[⁰¹²³⁴⁵⁶⁷⁸⁹]/.test(written) ? fromSuperscript(written) : written;
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

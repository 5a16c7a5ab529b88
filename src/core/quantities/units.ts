/**
 * Quantity strings of the notebook format: `"<number> [± <number>] [<unit>]"`.
 *
 * parseQuantity (quantityText.ts) reads the syntax only; {@link convert} checks the unit
 * against the dimension the key asks for and converts to the canonical unit.
 * Units are case-sensitive as SI writes them (`MT` is not `mT`). Accepted
 * beyond the unit table of the block format: the Greek letter μ (U+03BC) wherever the micro
 * sign µ (U+00B5) or `u` is, `^` forms (`cm^-3`, `m^2`, `m^-1`) for every
 * power unit, and `/m` for `m-1`. Neither function throws: both return a value
 * or a problem. Energies convert to kelvin (E/k) with the exact SI 2019 constants.
 */
import {
  KELVIN_PER_EV,
  KELVIN_PER_HERTZ,
  KELVIN_PER_JOULE,
  KELVIN_PER_WAVENUMBER,
  photonEnergyKelvinFromWavelength,
} from './constants';
import { closest } from '../text/suggest';
import { problem, type Quantity, type QuantityProblem } from './quantityText';

export { parseQuantity, type Quantity, type QuantityProblem } from './quantityText';

/** What a key measures; decides which units are valid. `wavelengthEnergy` is an energy that may also be a photon wavelength. */
export type Dimension =
  | 'energy'
  | 'wavelengthEnergy'
  | 'field'
  | 'temperature'
  | 'time'
  | 'angle'
  | 'density'
  | 'column'
  | 'crossSection'
  | 'length'
  | 'attenuation'
  | 'rate';

/** How one unit converts: canonical = value × scale + offset, or, for a wavelength, hc/(λ k) with λ = value × scale in m. */
interface Rule {
  readonly scale: number;
  readonly offset?: number;
  readonly wavelength?: boolean;
}

const ENERGY: Record<string, Rule> = {
  J: { scale: KELVIN_PER_JOULE },
  eV: { scale: KELVIN_PER_EV },
  meV: { scale: 1e-3 * KELVIN_PER_EV },
  µeV: { scale: 1e-6 * KELVIN_PER_EV },
  'cm-1': { scale: KELVIN_PER_WAVENUMBER },
  Hz: { scale: KELVIN_PER_HERTZ },
  kHz: { scale: 1e3 * KELVIN_PER_HERTZ },
  MHz: { scale: 1e6 * KELVIN_PER_HERTZ },
  GHz: { scale: 1e9 * KELVIN_PER_HERTZ },
  THz: { scale: 1e12 * KELVIN_PER_HERTZ },
  K: { scale: 1 },
};

/** Canonical spellings per dimension, in completion order, with their conversion to the canonical unit. */
const TABLE: Record<Dimension, Record<string, Rule>> = {
  energy: ENERGY,
  wavelengthEnergy: {
    ...ENERGY,
    nm: { scale: 1e-9, wavelength: true },
    µm: { scale: 1e-6, wavelength: true },
    Å: { scale: 1e-10, wavelength: true },
    mm: { scale: 1e-3, wavelength: true },
    cm: { scale: 1e-2, wavelength: true },
  },
  // µT and nT for low-field work (optical magnetometers, Earth's-field NMR); kG as older magnet sheets give it.
  field: {
    T: { scale: 1 },
    mT: { scale: 1e-3 },
    µT: { scale: 1e-6 },
    nT: { scale: 1e-9 },
    G: { scale: 1e-4 },
    kG: { scale: 1e-1 },
  },
  temperature: {
    K: { scale: 1 },
    mK: { scale: 1e-3 },
    µK: { scale: 1e-6 },
    nK: { scale: 1e-9 },
    '°C': { scale: 1, offset: 273.15 },
  },
  // µs and ns for electron spins' relaxation and for pulsed lasers.
  time: {
    s: { scale: 1 },
    ms: { scale: 1e-3 },
    µs: { scale: 1e-6 },
    ns: { scale: 1e-9 },
    min: { scale: 60 },
    h: { scale: 3600 },
  },
  angle: { deg: { scale: Math.PI / 180 }, rad: { scale: 1 } },
  density: { 'cm-3': { scale: 1 }, 'm-3': { scale: 1e-6 } },
  column: { 'cm-2': { scale: 1 }, 'm-2': { scale: 1e-4 } },
  crossSection: { cm2: { scale: 1 }, m2: { scale: 1e4 } },
  length: {
    m: { scale: 100 },
    cm: { scale: 1 },
    mm: { scale: 0.1 },
    µm: { scale: 1e-4 },
    nm: { scale: 1e-7 },
    Å: { scale: 1e-8 },
  },
  attenuation: { 'cm-1': { scale: 1 }, 'm-1': { scale: 0.01 } },
  rate: { 's-1': { scale: 1 } },
};

/** Other accepted spellings of a canonical unit (valid in every dimension that has the canonical one). */
const ALIASES: Record<string, string> = {
  ueV: 'µeV',
  μeV: 'µeV',
  'cm^-1': 'cm-1',
  '/cm': 'cm-1',
  um: 'µm',
  μm: 'µm',
  uK: 'µK',
  μK: 'µK',
  uT: 'µT',
  μT: 'µT',
  us: 'µs',
  μs: 'µs',
  degC: '°C',
  'cm^-3': 'cm-3',
  'cm^-2': 'cm-2',
  'm^-2': 'm-2',
  '\u212B': 'Å',
  // The kelvin and degree-Celsius signs of Unicode's compatibility block, as some PDFs and keyboards give them.
  '\u212A': 'K',
  '\u2103': '°C',
  'm^-3': 'm-3',
  'cm^2': 'cm2',
  'm^2': 'm2',
  'm^-1': 'm-1',
  '/m': 'm-1',
  's^-1': 's-1',
  '/s': 's-1',
  // The degree sign, as people write angles (`10°`, `5 °`): SI Brochure (9th ed.) Table 8 writes the degree so.
  '°': 'deg',
};

const DIMENSION_NAMES: Record<Dimension, string> = {
  energy: 'an energy',
  wavelengthEnergy: 'an energy (or photon wavelength)',
  field: 'a magnetic field',
  temperature: 'a temperature',
  time: 'a time',
  angle: 'an angle',
  density: 'a number density',
  column: 'a column density',
  crossSection: 'a cross-section',
  length: 'a length',
  attenuation: 'an attenuation coefficient',
  rate: 'a rate (transition probability)',
};

/** True when `unit` (or one of its accepted spellings) belongs to `dim`. */
export function acceptsUnit(unit: string, dim: Dimension): boolean {
  return resolve(unit, dim) !== null;
}

/** Canonical units of a dimension, for completions (aliases such as `ueV` or `/cm` are accepted but not listed). */
export function unitsFor(dim: Dimension): string[] {
  return Object.keys(TABLE[dim]);
}

/** The units of a dimension as a comma-separated list for messages, e.g. `T, mT, G`. */
export function formatUnitList(dim: Dimension): string {
  return unitsFor(dim).join(', ');
}

/** The unit every dimension converts to: energies as E/k in K, fields in T, populations per cm³, and so on. */
export const CANONICAL_UNITS: Readonly<Record<Dimension, string>> = {
  energy: 'K',
  wavelengthEnergy: 'K',
  field: 'T',
  temperature: 'K',
  time: 's',
  angle: 'rad',
  density: 'cm-3',
  column: 'cm-2',
  crossSection: 'cm2',
  length: 'cm',
  attenuation: 'cm-1',
  rate: 's-1',
};

const DIMENSIONS = Object.keys(TABLE) as Dimension[];

/** The canonical spelling of `unit` in `dim` (following aliases), or null. */
function resolve(unit: string, dim: Dimension): string | null {
  return RESOLVED[dim].get(unit) ?? null;
}

/** Per dimension, every accepted spelling with its canonical one: the canonical units, then the aliases of those. */
const RESOLVED = {} as Record<Dimension, ReadonlyMap<string, string>>;
for (const dim of DIMENSIONS) {
  const spelled = new Map<string, string>(Object.keys(TABLE[dim]).map((u) => [u, u]));
  for (const [alias, canonical] of Object.entries(ALIASES)) {
    if (!spelled.has(alias) && Object.hasOwn(TABLE[dim], canonical)) spelled.set(alias, canonical);
  }
  // Each canonical unit with a power also as the SI Brochure (9th ed.) and papers print it: cm-1 as cm⁻¹, cm2 as cm².
  for (const unit of Object.keys(TABLE[dim])) {
    const power = /^([a-z]+)(-?)(\d)$/.exec(unit);
    if (power) spelled.set(`${power[1]}${power[2] ? '⁻' : ''}${'⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(power[3])]}`, unit);
  }
  RESOLVED[dim] = spelled;
}

/** Every accepted spelling in `dim`, canonical ones first. */
function spellings(dim: Dimension): string[] {
  return [...unitsFor(dim), ...Object.keys(ALIASES).filter((a) => resolve(a, dim) !== null)];
}

function resolveIgnoringCase(unit: string, dim: Dimension): string | null {
  const hit = spellings(dim).find((s) => s.toLowerCase() === unit.toLowerCase());
  return hit === undefined ? null : resolve(hit, dim);
}

/** Spelled-out names, lower-cased, that stand for a unit. */
const WORDS: Record<string, string> = {
  sec: 's',
  secs: 's',
  second: 's',
  seconds: 's',
  msec: 'ms',
  mins: 'min',
  minute: 'min',
  minutes: 'min',
  hr: 'h',
  hrs: 'h',
  hour: 'h',
  hours: 'h',
  degree: 'deg',
  degrees: 'deg',
  radian: 'rad',
  radians: 'rad',
  tesla: 'T',
  millitesla: 'mT',
  gauss: 'G',
  kelvin: 'K',
  millikelvin: 'mK',
  microkelvin: 'µK',
  nanokelvin: 'nK',
  celsius: '°C',
  degreesc: '°C',
  joule: 'J',
  joules: 'J',
  electronvolt: 'eV',
  electronvolts: 'eV',
  hertz: 'Hz',
  wavenumber: 'cm-1',
  wavenumbers: 'cm-1',
  nanometre: 'nm',
  nanometer: 'nm',
  micron: 'µm',
  microns: 'µm',
  metre: 'm',
  meter: 'm',
  centimetre: 'cm',
  centimeter: 'cm',
  millimetre: 'mm',
  millimeter: 'mm',
  angstrom: 'Å',
  angstroms: 'Å',
  ångström: 'Å',
};

/** Rewrites `1/cm`, `cm⁻¹`, `cm**-1`, `/cm3`, `℃`, `deg C`, `seconds` … into an accepted spelling where one is meant. */
function normaliseUnit(unit: string): string {
  const n = unit
    .replace(/\s+/g, '')
    .replace(/\u207B|\u2212/g, '-')
    .replace(/\u00B9/g, '1')
    .replace(/\u00B2/g, '2')
    .replace(/\u00B3/g, '3')
    .replace(/\*\*|[()^]/g, '')
    .replace(/\u2103/g, '°C')
    .replace(/\u00BA/g, '°')
    .replace(/^1\//, '/');
  const inverse = /^\/(c?m)([23]?)$/.exec(n);
  if (inverse) return `${inverse[1]}-${inverse[2] || '1'}`;
  return Object.hasOwn(WORDS, n.toLowerCase()) ? WORDS[n.toLowerCase()] : n;
}

function unitProblem(quantity: Quantity, unit: string, dim: Dimension): { problem: QuantityProblem } {
  const span = quantity.unitSpan ?? quantity.valueSpan;
  const fix = (code: string, message: string, to: string) =>
    problem(code, message, span, { title: `Change unit to ${to}`, span, newText: to });
  const needed = `${DIMENSION_NAMES[dim]} (${formatUnitList(dim)})`;
  const cased = resolveIgnoringCase(unit, dim);
  if (cased !== null) return fix('unit-case', `Units are case-sensitive: \`${unit}\` is not \`${cased}\`.`, cased);
  // A remark in brackets after a good unit (`77 K (LN2)`): say where remarks go.
  const remark = /^(\S+)\s*(\([^()]*\)|\[[^[\]]*\])$/.exec(unit);
  const kept = remark ? resolve(remark[1]!, dim) : null;
  if (remark && kept !== null)
    return problem(
      'unit-unknown',
      `\`${remark[2]}\` after \`${remark[1]}\` is read as part of the unit. A remark goes after \`#\` (a YAML comment) or under \`note:\`.`,
      span,
      { title: `Change unit to ${kept}, dropping ${remark[2]}`, span, newText: kept },
    );
  const normal = normaliseUnit(unit);
  const meant = resolve(normal, dim) ?? resolveIgnoringCase(normal, dim);
  if (meant !== null) return fix('unit-unknown', `Unknown unit \`${unit}\`; did you mean \`${meant}\`?`, meant);
  const others = DIMENSIONS.filter(
    (d) => d !== 'wavelengthEnergy' && (resolve(unit, d) ?? resolve(normal, d)) !== null,
  );
  if (others.length === 0 && resolve(normal, 'wavelengthEnergy') !== null) others.push('wavelengthEnergy');
  if (others.length > 0) {
    const what = others
      .map((d) => (d === 'wavelengthEnergy' ? 'a photon wavelength' : DIMENSION_NAMES[d]))
      .join(' or ');
    const wavelength = dim === 'energy' && resolve(normal, 'wavelengthEnergy') !== null;
    const hint = wavelength ? ' A wavelength is accepted only for a transition energy such as `gap`.' : '';
    return problem('unit-dimension', `\`${unit}\` measures ${what}; ${needed} is needed here.${hint}`, span);
  }
  const limit = unit.length <= 1 ? 0 : unit.length <= 3 ? 1 : 2;
  const near = closest(unit, spellings(dim), limit, { ignoreCase: true });
  if (near !== null)
    return fix(
      'unit-unknown',
      `Unknown unit \`${unit}\`; did you mean \`${resolve(near, dim)}\`?`,
      resolve(near, dim) ?? near,
    );
  return problem('unit-unknown', `Unknown unit \`${unit}\`: ${needed} is needed here.`, span);
}

/** Options of {@link convert}. */
export interface ConvertOptions {
  /** Unit assumed for a bare number (when the key documents one); without it a bare number is `unit-missing`. */
  readonly defaultUnit?: string;
}

/**
 * Converts a parsed quantity to the canonical unit of `dim` ({@link CANONICAL_UNITS}):
 * energies to kelvin as E/k (h, k, e, c exact, SI 2019), photon wavelengths by
 * E = hc/(λk) with first-order uncertainty u_E = E u_λ/λ, °C by adding 273.15.
 * Range checks (a positive temperature, a positive gap) are left to the caller,
 * except that a wavelength must be positive and results must stay finite.
 */
export function convert(
  quantity: Quantity,
  dim: Dimension,
  options: ConvertOptions = {},
): { value: number; uncertainty: number | null } | { problem: QuantityProblem } {
  const unit = quantity.unit ?? options.defaultUnit ?? null;
  if (unit === null) {
    return problem(
      'unit-missing',
      `A unit is needed: ${DIMENSION_NAMES[dim]} (${formatUnitList(dim)}).`,
      quantity.valueSpan,
    );
  }
  const canonical = resolve(unit, dim);
  if (canonical === null) return unitProblem(quantity, unit, dim);
  const rule = TABLE[dim][canonical];
  const { value: x, uncertainty: u } = quantity;
  let value: number;
  let uncertainty: number | null;
  if (rule.wavelength) {
    if (!(x > 0)) return problem('number-invalid', 'A photon wavelength must be positive.', quantity.valueSpan);
    value = photonEnergyKelvinFromWavelength(x * rule.scale);
    uncertainty = u === null ? null : (value * u) / x;
  } else {
    value = x * rule.scale + (rule.offset ?? 0);
    uncertainty = u === null ? null : u * rule.scale;
  }
  if (!Number.isFinite(value) || (uncertainty !== null && !Number.isFinite(uncertainty))) {
    return problem(
      'number-invalid',
      `The value is out of range after conversion to ${CANONICAL_UNITS[dim]}.`,
      quantity.valueSpan,
    );
  }
  return { value, uncertainty };
}

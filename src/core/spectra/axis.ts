/**
 * Units of a spectrum's x axis and the conversion of a region between them.
 *
 * Two families, which do not mix:
 * - the NMR axis: `Hz`, `kHz`, `MHz` (offsets from the carrier, as NMR files
 *   store them) and `ppm` (chemical shift). ppm ↔ Hz goes through the observe
 *   frequency ν₀ in MHz: Δν / Hz = δ / ppm × ν₀ / MHz (IUPAC Recommendations
 *   2001, Harris et al., Pure Appl. Chem. 73, 1795, eq. (6): δ = (ν − ν_ref)/ν_ref,
 *   with ν_ref ≈ ν₀ to the precision a region needs);
 * - the optical axis: `cm-1` (wavenumber), `nm` and `µm` (vacuum wavelength):
 *   λ / nm = 10⁷ / (ν̃ / cm⁻¹), λ / µm = 10⁴ / (ν̃ / cm⁻¹).
 * An NMR file's Hz are offsets, not absolute frequencies, so Hz never converts
 * to a wavenumber.
 */

/** The x-axis units a spectrum may carry. */
export type XUnit = 'Hz' | 'kHz' | 'MHz' | 'ppm' | 'cm-1' | 'nm' | 'µm';

/** Every x unit, in the order completions list them. */
export const X_UNITS: readonly XUnit[] = ['ppm', 'Hz', 'kHz', 'MHz', 'cm-1', 'nm', 'µm'];

const SPELLINGS: ReadonlyMap<string, XUnit> = new Map<string, XUnit>([
  ['ppm', 'ppm'],
  ['hz', 'Hz'],
  ['khz', 'kHz'],
  ['mhz', 'MHz'],
  ['cm-1', 'cm-1'],
  ['cm^-1', 'cm-1'],
  ['/cm', 'cm-1'],
  ['1/cm', 'cm-1'],
  ['cm⁻¹', 'cm-1'],
  ['wavenumbers', 'cm-1'],
  ['nm', 'nm'],
  ['nanometers', 'nm'],
  ['nanometres', 'nm'],
  ['µm', 'µm'],
  ['μm', 'µm'],
  ['um', 'µm'],
  ['micrometers', 'µm'],
  ['micrometres', 'µm'],
  ['microns', 'µm'],
]);

/**
 * The x unit a name stands for, case aside (`HZ`, `PPM`, `1/CM`, `NANOMETERS`
 * as JCAMP-DX writes them; `ppm`, `cm-1`, `um` as people do), or null.
 * MHz and mHz are told apart only here, where a millihertz axis does not occur.
 */
export function parseXUnit(name: string): XUnit | null {
  const t = name.trim();
  return SPELLINGS.get(t) ?? SPELLINGS.get(t.toLowerCase()) ?? null;
}

const NMR_HZ: Readonly<Partial<Record<XUnit, number>>> = { Hz: 1, kHz: 1e3, MHz: 1e6 };
const OPTICAL: ReadonlySet<XUnit> = new Set<XUnit>(['cm-1', 'nm', 'µm']);

/** Why a value could not be converted, in words for a message. */
export interface AxisProblem {
  readonly problem: string;
}

/**
 * Converts one x value from `from` to `to`. `observeMHz` is the observe
 * frequency that ppm ↔ Hz needs. Returns the value or why not.
 */
export function convertX(value: number, from: XUnit, to: XUnit, observeMHz: number | null): number | AxisProblem {
  if (from === to) return value;
  const fromNmr = from === 'ppm' || NMR_HZ[from] !== undefined;
  const toNmr = to === 'ppm' || NMR_HZ[to] !== undefined;
  if (fromNmr && toNmr) {
    let hz: number;
    if (from === 'ppm') {
      if (!(observeMHz !== null && observeMHz > 0))
        return { problem: `ppm converts to ${to} only through an observe frequency, and the file gives none` };
      hz = value * observeMHz;
    } else hz = value * NMR_HZ[from]!;
    if (to === 'ppm') {
      if (!(observeMHz !== null && observeMHz > 0))
        return { problem: `${from} converts to ppm only through an observe frequency, and the file gives none` };
      return hz / observeMHz;
    }
    return hz / NMR_HZ[to]!;
  }
  if (OPTICAL.has(from) && OPTICAL.has(to)) {
    const wavenumber = from === 'cm-1' ? value : from === 'nm' ? 1e7 / value : 1e4 / value;
    if (!Number.isFinite(wavenumber) || wavenumber <= 0)
      return { problem: `${value} ${from} has no ${to} equivalent (it must be positive)` };
    return to === 'cm-1' ? wavenumber : to === 'nm' ? 1e7 / wavenumber : 1e4 / wavenumber;
  }
  return {
    problem: `${from} and ${to} belong to different axes (${fromNmr ? 'NMR' : 'optical'} and ${toNmr ? 'NMR' : 'optical'}), which do not convert`,
  };
}

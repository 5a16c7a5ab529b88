/**
 * The energy unit a block wrote its energies in, as a display unit of the
 * curve view: the conversion factor comes from the core's unit table
 * (exact SI 2019 constants), so the axis and the note agree to the last digit.
 */
import { convert, parseQuantity } from '../quantities/units';
import type { DisplayUnit } from './payload';

/** Kelvin, the core's own energy unit (E/k). */
export const KELVIN_UNIT: DisplayUnit = { name: 'K', label: 'K', kelvinPerUnit: 1 };

/** Readable forms of unit spellings that use ASCII exponents. */
const LABELS: Readonly<Record<string, string>> = { 'cm-1': 'cm⁻¹' };

/**
 * The display unit for a block's energy unit: its kelvin-per-unit factor from
 * the energy table of `units.ts`. Units that are not linear energies (a photon
 * wavelength in nm converts as hc/λ) and unknown or missing units give kelvin.
 */
export function displayUnitFor(unit: string | null): DisplayUnit {
  if (unit === null || unit === 'K') return KELVIN_UNIT;
  const parsed = parseQuantity(`1 ${unit}`);
  if ('problem' in parsed) return KELVIN_UNIT;
  const c = convert(parsed.quantity, 'energy');
  if ('problem' in c || !(c.value > 0) || !Number.isFinite(c.value)) return KELVIN_UNIT;
  return { name: unit, label: LABELS[unit] ?? unit, kelvinPerUnit: c.value };
}

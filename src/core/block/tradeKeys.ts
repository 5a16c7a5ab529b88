/**
 * The keys the emission and radio trades add: `wavelengths` (air or vacuum),
 * `background` (the radiation bath, e.g. the 2.725 K cosmic background),
 * `brightness` with `optical-depth` (a line's temperature) and
 * `rotational-constant` (a linear rotor's partition function).
 */
import { AIR_FROM_NM, airToVacuum } from '../physics/airWavelength';
import type { TradeInput } from './input';
import { readNumber, readQuantity, readText, report, type ReadContext, type ReadValue } from './values';
import type { Entry } from './yamlTree';
import type { TreeNode } from './tree';

/** What `wavelengths:` says: stated air or vacuum, or null to follow the IAU convention. Reports other words. */
export function readMedium(ctx: ReadContext, e: Entry | undefined): { kind: 'air' | 'vacuum' } | null | undefined {
  if (!e) return null;
  const t = readText(ctx, e.value);
  if (t && (t.text === 'air' || t.text === 'vacuum')) return { kind: t.text };
  report(
    ctx,
    'error',
    'wavelengths-unknown',
    'wavelengths: say `air` or `vacuum` (without it, the IAU convention is assumed: air above 200 nm, vacuum below).',
    t?.span ?? e.keySpan,
  );
  return undefined;
}

/** Units in which a wavelength is optical (the IAU air convention applies); `mm` and `cm` are radio wavelengths, c/ν. */
const OPTICAL = new Map<string, number>([
  ['nm', 1],
  ['µm', 1e3],
  ['um', 1e3],
  ['μm', 1e3],
  ['Å', 0.1],
  ['\u212B', 0.1],
]);

/** True when `unit` writes an optical wavelength (nm, µm, Å). */
export function isOpticalUnit(unit: string | null): boolean {
  return unit !== null && OPTICAL.has(unit);
}

/** The written wavelength in nm when `unit` is an optical wavelength unit, else null. */
export function opticalNm(value: number, unit: string | null): number | null {
  const per = unit === null ? undefined : OPTICAL.get(unit);
  return per === undefined ? null : value * per;
}

/**
 * The medium a wavelength of `nm` is taken in: the stated one, or by the IAU
 * convention air from 200 nm up and vacuum below.
 */
export function mediumFor(
  stated: { kind: 'air' | 'vacuum' } | null,
  nm: number,
): { kind: 'air' | 'vacuum'; stated: boolean } {
  if (stated) return { kind: stated.kind, stated: true };
  return { kind: nm >= AIR_FROM_NM ? 'air' : 'vacuum', stated: false };
}

/** A wavelength in nm as a vacuum wavelength (unchanged when in vacuum). */
export function vacuumNm(nm: number, medium: 'air' | 'vacuum'): number {
  return medium === 'air' ? airToVacuum(nm) : nm;
}

/** `background:`, a positive temperature. */
export function readBackground(ctx: ReadContext, e: Entry | undefined): ReadValue | null {
  if (!e) return null;
  const v = readQuantity(ctx, e.value, 'temperature', 'background', { suggestUnit: 'K' });
  if (v && !(v.value > 0)) {
    report(ctx, 'error', 'background-not-positive', 'background: a radiation temperature must be above 0 K.', v.span);
    return null;
  }
  return v;
}

/** `rotational-constant:`, the B of a linear rotor, as hB/k in K. */
export function readRotor(ctx: ReadContext, e: Entry | undefined): ReadValue | null {
  if (!e) return null;
  const v = readQuantity(ctx, e.value, 'energy', 'rotational-constant', { suggestUnit: 'GHz' });
  if (v && !(v.value > 0)) {
    report(ctx, 'error', 'rotor-not-positive', 'rotational-constant: B must be positive.', v.span);
    return null;
  }
  return v;
}

/** An optical depth τ ≥ 0 (a plain number, `±` allowed); `subject` names it in messages. */
export function readOpticalDepth(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  const v = readNumber(ctx, node, subject);
  if (v && !(v.value > 0)) {
    report(
      ctx,
      'error',
      'optical-depth-invalid',
      `${subject}: an optical depth must be positive (leave it out for an optically thin line).`,
      v.span,
    );
    return null;
  }
  return v;
}

/**
 * `brightness:` and `optical-depth:` of a single transition: the line's
 * excitation temperature, from J(T_ex) = T_B/(1 − e^(−τ)) + J(T_bg). Returns undefined on an error,
 * null when the block gives neither.
 */
export function readLineTemperature(
  ctx: ReadContext,
  byKey: ReadonlyMap<string, Entry>,
): TradeInput['line'] | undefined {
  const be = byKey.get('brightness');
  const te = byKey.get('optical-depth');
  if (!be && !te) return null;
  if (!be || !te) {
    const [has, lacks] = be ? ['brightness', 'optical-depth'] : ['optical-depth', 'brightness'];
    report(
      ctx,
      'error',
      'line-temperature-incomplete',
      `\`${has}\` needs \`${lacks}\` too: the line's excitation temperature follows from J(T_ex) = T_B/(1 − e^(−τ)) + J(T_bg).`,
      (be ?? te)!.keySpan,
    );
    return undefined;
  }
  const brightness = readQuantity(ctx, be.value, 'temperature', 'brightness', { suggestUnit: 'K' });
  const tau = readOpticalDepth(ctx, te.value, 'optical-depth');
  if (!brightness || !tau) return undefined;
  return { brightness, opticalDepth: tau };
}

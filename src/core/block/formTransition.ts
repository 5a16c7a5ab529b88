/**
 * Form 3 of the contract: a single transition, `gap` with degeneracies
 * `g: [lower, upper]` and `populations: [lower, upper]` or `ratio`
 * (n_upper / n_lower).
 */
import { BOLTZMANN, PLANCK, SPEED_OF_LIGHT } from '../quantities/constants';
import { GAIN_KEYS, readGain } from './gain';
import { isOpticalUnit, mediumFor, readLineTemperature, readMedium, vacuumNm } from './tradeKeys';
import type { FormRead, LevelInput, TradeInput } from './input';
import { acceptsUnit } from '../quantities/units';
import { bothGiven, measurementMissing, readPopulationList, withSiblingUncertainty } from './populations';
import {
  nonEmpty,
  readInteger,
  readList,
  readNumber,
  readQuantity,
  report,
  type ReadContext,
  type ReadValue,
} from './values';
import type { Entry } from './yamlTree';

/** Reads `gap`, `g` and `populations`/`ratio`. */
export function readTransitionForm(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>): FormRead | null {
  const ge = byKey.get('gap')!;
  const stated = readMedium(ctx, byKey.get('wavelengths'));
  const written = readQuantity(ctx, ge.value, 'wavelengthEnergy', 'gap', { suggestUnit: 'cm-1' });
  // The written wavelength in nm, back from E/k = hc/(λk), when the gap is an optical wavelength.
  const optical =
    written && written.value > 0 && isOpticalUnit(written.unit)
      ? (1e9 * PLANCK * SPEED_OF_LIGHT) / (BOLTZMANN * written.value)
      : null;
  const medium = optical !== null && stated !== undefined ? mediumFor(stated, optical) : null;
  // E = hc/λ_vac: an air wavelength is first turned into a vacuum one (IAU convention, Morton 2000).
  const toVacuum = medium && optical !== null ? optical / vacuumNm(optical, medium.kind) : 1;
  const gap: ReadValue | null = written
    ? {
        ...written,
        value: written.value * toVacuum,
        uncertainty: written.uncertainty === null ? null : written.uncertainty * toVacuum,
      }
    : null;
  if (gap && !(gap.value > 0)) {
    report(
      ctx,
      'error',
      'gap-not-positive',
      'gap: the transition energy must be positive (the upper level lies above the lower).',
      gap.span,
    );
  }
  const g = readDegeneracies(ctx, byKey.get('g'));
  const measured = readTransitionMeasurement(ctx, byKey, ge);
  // Percentages are fractions on another scale, as plain numbers are: neither is a density.
  const units =
    measured?.populations && !measured.ratio ? measured.populations.map((p) => (p.unit === '%' ? null : p.unit)) : [];
  const columns = units.length > 0 && units.every((u) => u !== null && acceptsUnit(u, 'column'));
  const densities = units.length > 0 && units.every((u) => u !== null && acceptsUnit(u, 'density'));
  if (units.length > 0 && !columns && !densities && units.some((u) => u !== null)) {
    report(
      ctx,
      'error',
      'populations-mixed-units',
      'populations: give both as number densities (cm-3), both as column densities (cm-2), or both without a unit.',
      byKey.get('populations')!.valueSpan,
    );
    return null;
  }
  const gain = measured ? readGain(ctx, byKey, densities, byKey.get('populations')) : null;
  const gainFailed = GAIN_KEYS.some((k) => byKey.has(k)) && !gain;
  if (!gap || !(gap.value > 0) || !g || !measured || gainFailed) return null;
  const [lower, upper] = measured.populations ?? [null, null];
  const level = (energy: number, gi: number, p: ReadValue | null, label: string): LevelInput => ({
    label,
    energy,
    g: gi,
    population: p ? p.value : null,
    uPopulation: p ? p.uncertainty : null,
    span: p ? p.span : null,
    populationSpan: p ? p.span : null,
  });
  return {
    form: 'transition',
    levels: [level(0, g[0], lower, 'lower'), level(gap.value, g[1], upper, 'upper')],
    energyUnit: gap.unit,
    spin: null,
    polarization: null,
    ratio: measured.ratio,
    uGap: gap.uncertainty,
    densities,
    gain,
    trade: { medium, line: measured.line, columns },
  };
}

function readDegeneracies(ctx: ReadContext, e: Entry | undefined): [number, number] | null {
  if (!e) return [1, 1];
  const items = readList(ctx, e.value, 'g', e.valueSpan);
  if (!items) return null;
  if (items.length !== 2) {
    report(
      ctx,
      'error',
      'degeneracy-length',
      `g: give the two degeneracies [lower, upper]; ${items.length} given.`,
      nonEmpty(e.valueSpan),
    );
    return null;
  }
  const lower = readInteger(ctx, items[0], 'g (lower)', 'degeneracy-invalid', 1);
  const upper = readInteger(ctx, items[1], 'g (upper)', 'degeneracy-invalid', 1);
  return lower && upper ? [lower.value, upper.value] : null;
}

function readTransitionMeasurement(
  ctx: ReadContext,
  byKey: ReadonlyMap<string, Entry>,
  gapEntry: Entry,
): { populations: ReadValue[] | null; ratio: ReadValue | null; line: TradeInput['line'] } | null {
  const pe = byKey.get('populations');
  const re = byKey.get('ratio');
  const le = byKey.get('brightness') ?? byKey.get('optical-depth');
  if (le && (pe || re)) {
    bothGiven(ctx, pe ? 'populations' : 'ratio', le, 'populations-and-line-temperature');
    return null;
  }
  if (le) {
    const line = readLineTemperature(ctx, byKey);
    return line ? { populations: null, ratio: null, line } : null;
  }
  if (pe && re) {
    bothGiven(ctx, 'populations', re, 'populations-and-ratio');
    return null;
  }
  if (!pe && !re) {
    measurementMissing(
      ctx,
      '`populations: [lower, upper]`, `ratio:` (n_upper / n_lower), or `brightness:` with `optical-depth:`',
      gapEntry.keySpan,
    );
    return null;
  }
  if (pe) {
    const list = readPopulationList(ctx, pe, 2, 'a single transition');
    return list ? { populations: list, ratio: null, line: null } : null;
  }
  const r0 = readNumber(ctx, re!.value, 'ratio');
  const r = r0 ? withSiblingUncertainty(ctx, r0, byKey.get('uncertainty'), 'ratio') : null;
  if (!r) return null;
  if (r.value < 0) {
    report(ctx, 'error', 'ratio-negative', 'ratio: n_upper / n_lower cannot be negative.', r.span);
    return null;
  }
  // The ratio is carried as populations [1, r] so every later step sees one shape.
  const one: ReadValue = { value: 1, uncertainty: null, span: r.span, unit: null };
  return { populations: [one, r], ratio: r, line: null };
}

/**
 * Form 3 of the contract: a single transition, `gap` with degeneracies
 * `g: [lower, upper]` and `populations: [lower, upper]` or `ratio`
 * (n_upper / n_lower).
 */
import { GAIN_KEYS, readGain } from './gain';
import type { FormRead, LevelInput } from './input';
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
  const gap = readQuantity(ctx, ge.value, 'wavelengthEnergy', 'gap', { suggestUnit: 'cm-1' });
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
  const densities = !!measured?.populations && !measured.ratio && measured.populations.every((p) => p.unit !== null);
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
): { populations: ReadValue[] | null; ratio: ReadValue | null } | null {
  const pe = byKey.get('populations');
  const re = byKey.get('ratio');
  if (pe && re) {
    bothGiven(ctx, 'populations', re, 'populations-and-ratio');
    return null;
  }
  if (!pe && !re) {
    measurementMissing(ctx, '`populations: [lower, upper]` or `ratio:` (n_upper / n_lower)', gapEntry.keySpan);
    return null;
  }
  if (pe) {
    const list = readPopulationList(ctx, pe, 2, 'a single transition');
    return list ? { populations: list, ratio: null } : null;
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
  return { populations: [one, r], ratio: r };
}

/**
 * Form 2 of the contract: a spin in a field. The Zeeman levels of spin I are
 * 2I + 1 equally spaced levels, |γ|ħB apart (or hν apart for a given Larmor
 * frequency ν, which already includes the sample's shielding).
 */
import { KELVIN_PER_HERTZ } from '../quantities/constants';
import { electronWithGFactor, lookupSpecies, zeemanSpacingKelvin, type SpinSpecies } from '../quantities/isotopes';
import type { FormRead, LevelInput, SignalInput, SpinInput } from './input';
import { readSignal } from './signal';
import {
  bothGiven,
  measurementMissing,
  readPopulation,
  readPopulationList,
  withSiblingUncertainty,
} from './populations';
import {
  readFraction,
  readList,
  readNumber,
  readQuantity,
  readText,
  report,
  type ReadContext,
  type ReadValue,
} from './values';
import type { Entry } from './yamlTree';

/** Field and frequency may disagree by this fraction before a warning (the contract's 1 %). */
export const FIELD_FREQUENCY_TOLERANCE = 0.01;

/** Reads `system`, `field`/`frequency` and `populations`/`polarization`. */
export function readSpinForm(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>): FormRead | null {
  // Every key is read even when the isotope is unknown, so all problems show at once.
  const species = readSpecies(ctx, byKey);
  const spin = readSplitting(ctx, byKey, species);
  const measured = readSpinMeasurement(ctx, byKey, species);
  if (!species || !spin || !measured) return null;
  const n = Math.round(2 * species.spin + 1);
  const labels = levelLabels(species, n);
  // Mapped from the labels (one per level): a list of exactly n without holes. A list grown by push keeps spare
  // room, and this one stays cached with the block; one made at its length has holes, and the engine compiles the
  // code that reads it apart from the lists without.
  const levels = labels.map((label, k): LevelInput => {
    const pop = measured.populations?.[k] ?? null;
    return {
      label,
      energy: k * spin.spacing,
      g: 1,
      population: pop ? pop.value : null,
      uPopulation: pop ? pop.uncertainty : null,
      span: pop ? pop.span : null,
      populationSpan: pop ? pop.span : null,
    };
  });
  return {
    form: 'spin',
    levels,
    energyUnit: 'MHz',
    spin,
    polarization: measured.polarization,
    ratio: null,
    uGap: spin.uSpacing,
    signal: measured.signal,
  };
}

/** Labels already made, by spin and sign of γ (a notebook uses a handful of species). */
const LABELS = new Map<number, readonly string[]>();

/** `m = …` of each of the n levels from the bottom, made once per spin and sign of γ. */
function levelLabels(species: SpinSpecies, n: number): readonly string[] {
  const key = 4 * species.spin + (species.gamma >= 0 ? 1 : 0);
  let labels = LABELS.get(key);
  if (!labels) {
    labels = Array.from({ length: n }, (_, k) => `m = ${mLabel(species, k)}`);
    if (LABELS.size < 100) LABELS.set(key, labels);
  }
  return labels;
}

/** Magnetic quantum number of the k-th level from the bottom, as a fraction. */
function mLabel(species: SpinSpecies, k: number): string {
  // Positive γ: the lowest level is m = +I; negative γ (and the electron): m = −I.
  const m = species.gamma >= 0 ? species.spin - k : -species.spin + k;
  const twice = Math.round(2 * m);
  const sign = twice < 0 ? '−' : twice > 0 ? '+' : '';
  return twice % 2 === 0 ? `${sign}${Math.abs(twice / 2)}` : `${sign}${Math.abs(twice)}/2`;
}

function readSpecies(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>): SpinSpecies | null {
  const e = byKey.get('system')!;
  const t = readText(ctx, e.value);
  if (!t || t.text === '') {
    report(ctx, 'error', 'value-missing', 'system: name an isotope (`1H`, `13C`, …) or `electron`.', e.keySpan);
    return null;
  }
  const found = lookupSpecies(t.text);
  if (!('species' in found)) {
    const fixes = found.suggestion
      ? [{ title: `Change to ${found.suggestion}`, span: t.span, newText: found.suggestion }]
      : [];
    const hint = found.suggestion
      ? ` Did you mean \`${found.suggestion}\`?`
      : ' Write the mass number first, as in `13C`.';
    report(ctx, 'error', 'isotope-unknown', `system: unknown isotope \`${t.text}\`.${hint}`, t.span, fixes);
    return null;
  }
  const gf = byKey.get('g-factor');
  if (!gf) return found.species;
  if (found.species.symbol !== 'electron') {
    report(
      ctx,
      'error',
      'g-factor-not-electron',
      '`g-factor` applies to `system: electron` only; nuclei use the isotope table.',
      gf.keySpan,
    );
    return null;
  }
  const g = readNumber(ctx, gf.value, 'g-factor');
  if (!g) return null;
  if (g.value === 0) {
    report(ctx, 'error', 'g-factor-zero', 'g-factor: a zero g-factor gives no Zeeman splitting.', g.span);
    return null;
  }
  // EPR practice writes g > 0; the electron's levels order as for g < 0 whatever the sign written.
  const custom = electronWithGFactor(-Math.abs(g.value));
  if (!custom) report(ctx, 'error', 'g-factor-invalid', 'g-factor: not a usable g-factor.', g.span);
  return custom;
}

function readSplitting(
  ctx: ReadContext,
  byKey: ReadonlyMap<string, Entry>,
  species: SpinSpecies | null,
): SpinInput | null {
  const fe = byKey.get('field');
  const qe = byKey.get('frequency');
  const field = fe
    ? positive(ctx, readQuantity(ctx, fe.value, 'field', 'field', { suggestUnit: 'T' }), 'field', 'field-not-positive')
    : null;
  const freq = qe
    ? positive(
        ctx,
        readQuantity(ctx, qe.value, 'energy', 'frequency', { suggestUnit: 'MHz' }),
        'frequency',
        'frequency-not-positive',
      )
    : null;
  if (!fe && !qe) {
    report(
      ctx,
      'error',
      'field-missing',
      'A spin needs `field:` (e.g. `9.4 T`) or the observed Larmor `frequency:`.',
      byKey.get('system')!.keySpan,
    );
    return null;
  }
  if ((fe && !field) || (qe && !freq) || !species) return null;
  const fromField = field ? zeemanSpacingKelvin(species, field.value) : null;
  if (freq && fromField !== null) {
    const rel = Math.abs(freq.value - fromField) / fromField;
    if (rel > FIELD_FREQUENCY_TOLERANCE) {
      report(
        ctx,
        'warning',
        'field-frequency-mismatch',
        `frequency and field disagree by ${(rel * 100).toFixed(1)} % for ${species.symbol} (the table expects ${formatMHz(fromField)} at this field); the frequency is used.`,
        freq.span,
      );
    }
  }
  const spacing = freq ? freq.value : fromField!;
  const uSpacing = freq
    ? freq.uncertainty
    : field!.uncertainty !== null
      ? (field!.uncertainty / field!.value) * spacing
      : null;
  return {
    species,
    spacing,
    uSpacing,
    field: field ? field.value : null,
    frequency: spacing / KELVIN_PER_HERTZ,
  };
}

function formatMHz(kelvin: number): string {
  return `${(kelvin / KELVIN_PER_HERTZ / 1e6).toPrecision(6)} MHz`;
}

function positive(ctx: ReadContext, v: ReadValue | null, subject: string, code: string): ReadValue | null {
  if (v && !(v.value > 0)) {
    report(ctx, 'error', code, `${subject} must be positive.`, v.span);
    return null;
  }
  return v;
}

interface SpinMeasurement {
  readonly populations: ReadValue[] | null;
  readonly polarization: ReadValue | null;
  readonly signal: SignalInput | null;
}

function readSpinMeasurement(
  ctx: ReadContext,
  byKey: ReadonlyMap<string, Entry>,
  species: SpinSpecies | null,
): SpinMeasurement | null {
  const pe = byKey.get('populations');
  const pol = byKey.get('polarization');
  const sig = byKey.get('signal');
  if (pe && pol) {
    bothGiven(ctx, 'populations', pol, 'populations-and-polarization');
    return null;
  }
  if (sig && (pe || pol)) {
    bothGiven(ctx, pe ? 'populations' : 'polarization', sig, 'measurement-conflict');
    return null;
  }
  if (sig) {
    const signal = readSignal(ctx, sig);
    return signal ? { populations: null, polarization: null, signal } : null;
  }
  if (!pe && !pol) {
    // A bare time series needs no population measurement: it gives a time constant.
    if (byKey.has('series')) return { populations: null, polarization: null, signal: null };
    measurementMissing(
      ctx,
      '`populations:` (in order of increasing energy), `polarization:` or `signal:`',
      byKey.get('system')!.keySpan,
    );
    return null;
  }
  if (pe && !species) {
    // Without a known spin the length cannot be checked; the values still are.
    const items = readList(ctx, pe.value, 'populations', pe.valueSpan);
    items?.forEach((item, i) => readPopulation(ctx, item, `populations[${i}]`));
    return null;
  }
  if (pe && species) {
    const n = Math.round(2 * species.spin + 1);
    const spinText = Number.isInteger(species.spin) ? `${species.spin}` : `${Math.round(2 * species.spin)}/2`;
    const list = readPopulationList(ctx, pe, n, `${species.symbol} (spin ${spinText})`);
    return list ? { populations: list, polarization: null, signal: null } : null;
  }
  // A fraction (0.245) or a percentage with its sign (24.5 %, 24.5 ± 0.5 %).
  const p0 = readFraction(ctx, pol!.value, 'polarization');
  const p = p0 ? withSiblingUncertainty(ctx, p0, byKey.get('uncertainty'), 'polarization') : null;
  if (!p) return null;
  if (Math.abs(p.value) > 1) {
    // A bare number between 1 and 100 is most likely a percentage written without its sign.
    const fixes =
      p.unit === null && Math.abs(p.value) <= 100
        ? [{ title: 'Mark it as a percentage (add %)', span: { start: p.span.end, end: p.span.end }, newText: ' %' }]
        : [];
    report(
      ctx,
      'error',
      'polarization-range',
      `polarization: |P| cannot exceed 1 (got ${p.unit === '%' ? `${p.value * 100} %` : p.value}); write a fraction (0.245) or a percentage with its sign (24.5 %).`,
      p.span,
      fixes,
    );
    return null;
  }
  return { populations: null, polarization: p, signal: null };
}

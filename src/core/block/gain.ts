/**
 * Gain keys of the single-transition form: `cross-section`, `length`,
 * `mirrors`, `loss`. They need absolute populations (number densities).
 */
import type { GainInput } from './input';
import { readFraction, readList, readQuantity, report, type ReadContext, type ReadValue } from './values';
import type { Entry } from './yamlTree';

/** Keys that make a transition block a gain calculation. */
export const GAIN_KEYS = ['cross-section', 'length', 'mirrors', 'loss'] as const;

/** Reads the gain keys; null (with problems) on an error, or when none is given. */
export function readGain(
  ctx: ReadContext,
  byKey: ReadonlyMap<string, Entry>,
  densities: boolean,
  populations: Entry | undefined,
): GainInput | null {
  const given = GAIN_KEYS.filter((k) => byKey.has(k));
  if (given.length === 0) return null;
  const xe = byKey.get('cross-section');
  if (!xe) {
    report(
      ctx,
      'error',
      'gain-cross-section-missing',
      `\`${given[0]}\` is given but the gain needs \`cross-section:\` (e.g. \`2.8e-19 cm2\`).`,
      byKey.get(given[0])!.keySpan,
    );
    return null;
  }
  if (!densities) {
    report(
      ctx,
      'error',
      'gain-needs-densities',
      'The gain needs absolute populations: give `populations` as number densities, e.g. `[2.0e16 cm-3, 8.0e16 cm-3]`.',
      populations?.keySpan ?? xe.keySpan,
    );
  }
  const sigma = positive(
    ctx,
    readQuantity(ctx, xe.value, 'crossSection', 'cross-section', { suggestUnit: 'cm2' }),
    'cross-section',
  );
  const le = byKey.get('length');
  const length = le
    ? positive(ctx, readQuantity(ctx, le.value, 'length', 'length', { suggestUnit: 'cm' }), 'length')
    : null;
  const lo = byKey.get('loss');
  const loss = lo ? readQuantity(ctx, lo.value, 'attenuation', 'loss', { suggestUnit: 'cm-1' }) : null;
  if (loss && loss.value < 0)
    report(ctx, 'error', 'loss-negative', 'loss: a distributed loss cannot be negative.', loss.span);
  const me = byKey.get('mirrors');
  const mirrors = me ? readMirrors(ctx, me) : null;
  if (me && mirrors && !le)
    report(
      ctx,
      'warning',
      'gain-length-missing',
      'mirrors: the threshold needs the medium’s `length:` as well.',
      me.keySpan,
    );
  if (!densities || !sigma || (le && !length) || (lo && (!loss || loss.value < 0)) || (me && !mirrors)) return null;
  return { crossSection: sigma.value, length: length ? length.value : null, mirrors, loss: loss ? loss.value : 0 };
}

function positive(ctx: ReadContext, v: ReadValue | null, subject: string): ReadValue | null {
  if (v && !(v.value > 0)) {
    report(ctx, 'error', 'gain-value-not-positive', `${subject} must be positive.`, v.span);
    return null;
  }
  return v;
}

function readMirrors(ctx: ReadContext, e: Entry): [number, number] | null {
  const items = readList(ctx, e.value, 'mirrors', e.valueSpan);
  if (!items) return null;
  if (items.length !== 2) {
    report(
      ctx,
      'error',
      'mirrors-invalid',
      `mirrors: give the two reflectivities [R1, R2]; ${items.length} given.`,
      e.valueSpan,
    );
    return null;
  }
  const out: number[] = [];
  for (const [i, item] of items.entries()) {
    const r = readFraction(ctx, item, `mirrors[${i}]`);
    if (!r) return null;
    if (!(r.value > 0 && r.value <= 1)) {
      report(
        ctx,
        'error',
        'mirrors-invalid',
        `mirrors[${i}]: a reflectivity lies in (0, 1]: a fraction (0.995) or a percentage with its sign (99.5 %).`,
        r.span,
      );
      return null;
    }
    out.push(r.value);
  }
  return [out[0], out[1]];
}

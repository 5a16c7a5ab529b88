/**
 * `extrapolate: { from: 42 s, to: 0 s, decay: … }`: the block's polarization,
 * measured at `from`, carried to `to` along an exponential decay whose time
 * constant T₁ is typed (`decay: 47.9 ± 1.2 s`) or taken from a decay run
 * (`decay: { run: run 4 decay }`, its fitted T₁ with its uncertainty).
 */
import type { ExtrapolateInput } from './input';
import { followRun, isRunRefNode, readRunRef } from './runRef';
import { readQuantity, report, type ReadContext, type ReadValue } from './values';
import { entries, isMap, spanOf, type Entry } from './yamlTree';
import { unknownKey } from './unknownKey';

/** The keys of `extrapolate:`. */
export const EXTRAPOLATE_KEYS: readonly string[] = ['from', 'to', 'decay'];

/** Reads `extrapolate:`; null (with problems) when anything is missing or wrong. */
export function readExtrapolate(ctx: ReadContext, e: Entry): ExtrapolateInput | null {
  if (!isMap(e.value)) {
    report(
      ctx,
      'error',
      'extrapolate-incomplete',
      'extrapolate: give `{ from: 42 s, to: 0 s, decay: 47.9 ± 1.2 s }` (or `decay: { run: <id of the decay run> }`).',
      e.keySpan,
    );
    return null;
  }
  const byKey = new Map(entries(e.value).map((x) => [x.key, x] as const));
  for (const x of byKey.values())
    if (!EXTRAPOLATE_KEYS.includes(x.key)) unknownKey(ctx, x, new Set(EXTRAPOLATE_KEYS), byKey);
  const missing = EXTRAPOLATE_KEYS.filter((k) => !byKey.has(k));
  if (missing.length > 0) {
    report(
      ctx,
      'error',
      'extrapolate-incomplete',
      `extrapolate: ${missing.map((k) => `\`${k}\``).join(' and ')} ${missing.length > 1 ? 'are' : 'is'} missing (give \`from\`, \`to\` and \`decay\`).`,
      e.keySpan,
    );
  }
  const time = (key: string): ReadValue | null => {
    const x = byKey.get(key);
    return x ? readQuantity(ctx, x.value, 'time', `extrapolate.${key}`, { suggestUnit: 's' }) : null;
  };
  const from = time('from');
  const to = time('to');
  const d = byKey.get('decay');
  let decay: ReadValue | null = null;
  let decayRun: ExtrapolateInput['decayRun'] = null;
  if (d && isRunRefNode(d.value)) {
    const ref = readRunRef(ctx, d.value, 'decay', 'extrapolate.decay');
    const run = ref ? followRun(ctx, ref, 'extrapolate.decay') : null;
    if (ref && run) {
      const fit = run.results?.series ?? null;
      if (!fit || fit.model !== 'decay') {
        report(
          ctx,
          'error',
          'reference-kind',
          `extrapolate.decay: the run \`${run.id}\` has no fitted decay (a \`series:\` with \`model: decay\`), so it gives no T₁.`,
          ref.span,
        );
      } else {
        decay = { value: fit.timeConstant.value, uncertainty: fit.timeConstant.uncertainty, span: ref.span, unit: 's' };
        decayRun = { id: run.id, place: run.place, date: run.date, span: ref.span };
      }
    }
  } else if (d) {
    decay = readQuantity(ctx, d.value, 'time', 'extrapolate.decay', { suggestUnit: 's' });
  }
  if (decay && !(decay.value > 0 && Number.isFinite(decay.value))) {
    report(
      ctx,
      'error',
      'extrapolate-decay-invalid',
      'extrapolate.decay: T₁ must be a positive, finite time.',
      decay.span,
    );
    return null;
  }
  if (!from || !to || !decay) return null;
  return { from, to, decay, decayRun, span: spanOf(e.value) ?? e.keySpan, keySpan: e.keySpan };
}

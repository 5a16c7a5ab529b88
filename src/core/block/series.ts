/**
 * `series:` — signals read at increasing times, for a `decay` (relaxation of
 * a hyperpolarized signal, each readout with flip angle θ leaving cos θ of the
 * magnetization) or a `buildup` fit.
 */
import { readNumberOrSpectrum } from './spectrumRef';
import type { TreeNode } from './tree';
import type { SeriesInput } from './input';
import { SERIES_KEYS } from './schema';
import { unknownKey } from './unknownKey';
import {
  nonEmpty,
  readList,
  readNumber,
  readQuantity,
  readText,
  report,
  uncertaintyFromRegion,
  type ReadContext,
  type ReadValue,
} from './values';
import { entries, entrySpan, isMap, type Entry } from './yamlTree';
import { convert, formatUnitList, parseQuantity } from '../quantities/units';

/** Fewest points that determine each model's parameters. */
export const SERIES_PARAMETERS = { decay: 2, buildup: 3 } as const;

/** Reads `series:`; never throws. */
export function readSeries(ctx: ReadContext, e: Entry): SeriesInput | null {
  if (!isMap(e.value)) {
    report(ctx, 'error', 'series-not-mapping', 'series: give `model`, `time` and `signal` as a mapping.', e.keySpan);
    return null;
  }
  const byKey = new Map(entries(e.value).map((x) => [x.key, x] as const));
  // `time/s: [0, 6, 12]`: one unit for the whole list, written as quantity/unit the way tables head their
  // columns (ISO 80000-1 §6.1; IUPAC Green Book §1.4); a number with its own unit still keeps it.
  const unitKey = [...byKey.values()].find((x) => /^time\s*\/\s*\S/.test(x.key));
  for (const x of byKey.values())
    if (!SERIES_KEYS.includes(x.key) && x !== unitKey) unknownKey(ctx, x, new Set(SERIES_KEYS), byKey);
  const model = readModel(ctx, byKey.get('model'), e);
  const listUnit = unitKey && !byKey.has('time') ? timeUnit(ctx, unitKey) : null;
  if (unitKey && !byKey.has('time') && listUnit === null) return null;
  const te = byKey.get('time') ?? (listUnit !== null ? unitKey : undefined);
  const se = byKey.get('signal');
  if (!te || !se) {
    report(ctx, 'error', 'series-incomplete', `series: \`${!te ? 'time' : 'signal'}\` is missing.`, e.keySpan);
    return null;
  }
  const times = readValues(
    ctx,
    te,
    (node, s) =>
      readQuantity(ctx, node, 'time', s, listUnit !== null ? { defaultUnit: listUnit } : { suggestUnit: 's' }),
    'series.time',
  );
  const signals = readValues(ctx, se, (node, s) => readNumberOrSpectrum(ctx, node, s), 'series.signal');
  const noise = byKey.get('noise') ? readNumber(ctx, byKey.get('noise')!.value, 'series.noise') : null;
  const flipEntry = byKey.get('flip');
  const flip = flipEntry ? readQuantity(ctx, flipEntry.value, 'angle', 'series.flip', { suggestUnit: 'deg' }) : null;
  if (!model || !times || !signals || (flipEntry && !flip) || (byKey.get('noise') && !noise)) return null;
  if (times.length !== signals.length) {
    report(
      ctx,
      'error',
      'series-length-mismatch',
      `series: ${times.length} times but ${signals.length} signals; give one signal per time.`,
      nonEmpty(se.valueSpan),
    );
    return null;
  }
  for (let i = 1; i < times.length; i++) {
    if (!(times[i].value > times[i - 1].value)) {
      report(
        ctx,
        'error',
        'series-times-order',
        `series.time[${i}]: times must increase (this one is not after the one before).`,
        times[i].span,
      );
      return null;
    }
  }
  const need = SERIES_PARAMETERS[model];
  if (times.length < need) {
    report(
      ctx,
      'error',
      'series-too-short',
      `series: a ${model} fit has ${need} parameters and needs at least ${need} points; ${times.length} given.`,
      nonEmpty(se.valueSpan),
    );
    return null;
  }
  if (flip && !checkFlip(ctx, model, flip)) return null;
  if (model === 'decay' && !sameSign(ctx, signals)) return null;
  const uSignals = uncertainties(ctx, signals, noise, byKey.get('noise'));
  if (uSignals === undefined) return null;
  return {
    model,
    times: times.map((t) => t.value),
    signals: signals.map((s) => s.value),
    uSignals,
    flip: flip ? flip.value : null,
    span: e.keySpan,
    signalSpans: signals.map((s) => s.span),
  };
}

function readModel(ctx: ReadContext, m: Entry | undefined, e: Entry): 'decay' | 'buildup' | null {
  if (!m) {
    report(ctx, 'error', 'series-incomplete', 'series: `model:` is missing (`decay` or `buildup`).', e.keySpan);
    return null;
  }
  const t = readText(ctx, m.value);
  if (t && (t.text === 'decay' || t.text === 'buildup')) return t.text;
  const fixes =
    t && /^build[\s_-]?up$/i.test(t.text)
      ? [{ title: 'Change to buildup', span: t.span, newText: 'buildup' }]
      : t && /^decay$/i.test(t.text)
        ? [{ title: 'Change to decay', span: t.span, newText: 'decay' }]
        : [];
  report(ctx, 'error', 'series-model', 'series.model: use `decay` or `buildup`.', t?.span ?? m.keySpan, fixes);
  return null;
}

function readValues(
  ctx: ReadContext,
  e: Entry,
  read: (node: TreeNode | null, subject: string) => ReadValue | null,
  subject: string,
): ReadValue[] | null {
  const items = readList(ctx, e.value, subject, e.valueSpan);
  if (!items) return null;
  const out: ReadValue[] = [];
  let ok = true;
  const before = ctx.problems.length;
  items.forEach((item, i) => {
    const v = read(item, `${subject}[${i}]`);
    if (v) out.push(v);
    else ok = false;
  });
  unitForWholeList(ctx, before, subject);
  return ok ? out : null;
}

/** The unit of a `time/<unit>` key, checked to be a time unit; null (with a problem on the key) otherwise. */
function timeUnit(ctx: ReadContext, x: Entry): string | null {
  const unit = x.key.slice(x.key.indexOf('/') + 1).trim();
  const q = parseQuantity(`1 ${unit}`);
  const c = 'problem' in q ? q : convert(q.quantity, 'time');
  if ('problem' in c) {
    report(
      ctx,
      'error',
      'unit-unknown',
      `series: \`${x.key}\` gives the times' unit after the slash; \`${unit}\` is not a time unit (${formatUnitList('time')}).`,
      x.keySpan,
    );
    return null;
  }
  return unit;
}

/**
 * When several numbers of one list lack their unit, each such problem also offers to add the unit to
 * every bare number of the list at once (one edit the user picks), besides its own.
 */
function unitForWholeList(ctx: ReadContext, from: number, subject: string): void {
  const missing = ctx.problems.slice(from).filter((p) => p.code === 'unit-missing' && p.fixes?.length === 1);
  if (missing.length < 2) return;
  const inserts = missing.map((p) => p.fixes![0]!);
  const unit = inserts[0]!.newText.trim();
  if (!inserts.every((f) => f.newText === inserts[0]!.newText)) return;
  for (let k = from; k < ctx.problems.length; k++) {
    const p = ctx.problems[k]!;
    if (!missing.includes(p)) continue;
    const own = p.fixes![0]!;
    const all = {
      title: `Add the unit ${unit} to all ${missing.length} bare numbers of ${subject}`,
      span: inserts[0]!.span,
      newText: inserts[0]!.newText,
      more: inserts.slice(1).map((f) => ({ span: f.span, newText: f.newText })),
    };
    ctx.problems[k] = { ...p, fixes: [all, own] };
  }
}

function checkFlip(ctx: ReadContext, model: 'decay' | 'buildup', flip: ReadValue): boolean {
  if (model === 'buildup') {
    report(
      ctx,
      'warning',
      'flip-ignored',
      'series.flip: the cos^(n−1) θ readout correction applies to decays only; a build-up under repeated readout needs a rate model, so the flip angle is not used here.',
      flip.span,
    );
    return true;
  }
  // cos 90° is 6e-17 in floating point: anything that close to 90° counts as 90°.
  if (!(flip.value > 0) || !(Math.cos(flip.value) > 1e-9)) {
    report(
      ctx,
      'error',
      'flip-too-large',
      'series.flip: a decay readout angle must lie between 0 and 90 deg, so that each readout leaves cos θ > 0 of the magnetization.',
      flip.span,
    );
    return false;
  }
  return true;
}

function sameSign(ctx: ReadContext, signals: ReadValue[]): boolean {
  const first = signals.find((s) => s.value !== 0);
  if (!first) {
    report(ctx, 'error', 'series-sign-change', 'series.signal: every signal is zero; nothing decays.', signals[0].span);
    return false;
  }
  const bad = signals.find((s) => s.value !== 0 && Math.sign(s.value) !== Math.sign(first.value));
  if (bad) {
    report(
      ctx,
      'error',
      'series-sign-change',
      'series.signal: a decaying signal keeps its sign; this value has the opposite sign of the first one (phase the spectra alike, or model it as a build-up).',
      bad.span,
    );
    return false;
  }
  return true;
}

/**
 * Per-point uncertainties: `±` on every value, or one common `noise`; undefined after an error. A signal
 * from a spectrum reference with a noise region keeps that region's uncertainty (notebook format v1.2: it
 * replaces a typed `noise`); the typed `noise` then serves the other signals only, with a warning on it.
 */
function uncertainties(
  ctx: ReadContext,
  signals: ReadValue[],
  noise: ReadValue | null,
  noiseEntry: Entry | undefined,
): number[] | null | undefined {
  if (noise) {
    if (noise.value < 0) {
      report(
        ctx,
        'error',
        'uncertainty-negative',
        'series.noise: a standard uncertainty cannot be negative.',
        noise.span,
      );
      return undefined;
    }
    if (signals.some((s) => s.uncertainty !== null && !uncertaintyFromRegion(s))) {
      report(ctx, 'error', 'uncertainty-twice', 'series: give `noise` or `±` on the signals, not both.', noise.span);
      return undefined;
    }
    const replaced = signals.flatMap((s, i) => (uncertaintyFromRegion(s) ? [i] : []));
    if (replaced.length === 0) return noise.value > 0 ? signals.map(() => noise.value) : null;
    const all = replaced.length === signals.length;
    const which = replaced.map((i) => `series.signal[${i}]`).join(', ');
    report(
      ctx,
      'warning',
      'noise-replaced',
      all
        ? 'series.noise: replaced by the noise regions of the spectra, which give every signal its uncertainty; this typed noise is ignored.'
        : `series.noise: replaced by the noise regions of the spectra for ${which}; this typed noise is ignored there and serves the other signals.`,
      noiseEntry ? entrySpan(noiseEntry) : noise.span,
    );
    const u = signals.map((s) => (uncertaintyFromRegion(s) ? s.uncertainty! : noise.value));
    return u.every((x) => x > 0) ? u : null;
  }
  if (signals.every((s) => s.uncertainty !== null && s.uncertainty > 0)) return signals.map((s) => s.uncertainty!);
  return null;
}

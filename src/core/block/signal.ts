/**
 * `signal:` — a hyperpolarized signal compared with a thermal reference:
 * P = P_th(lattice) · (S_hp/S_th) · (scans_th·G_th sin θ_th n_th)/(scans_hp·G_hp sin θ_hp n_hp),
 * with the numbers of scans, linear receiver gains G, flip angles θ and relative amounts
 * n each defaulting to 1 (90 deg for θ). Common practice in dissolution-DNP,
 * PHIP and SEOP work; it assumes spectra summed over scans and signals
 * linear in receiver gain.
 */
import type { TreeNode } from './tree';
import type { SignalInput } from './input';
import {
  readInteger,
  readNumber,
  readQuantity,
  report,
  uncertaintyFromRegion,
  type ReadContext,
  type ReadValue,
} from './values';
import { entries, entrySpan, isMap, spanOf, type Entry } from './yamlTree';
import { SIGNAL_KEYS } from './schema';
import { unknownKey } from './unknownKey';
import { followRun, isRunRefNode, readRunRef } from './runRef';
import type { ThermalRun } from './input';
import { readNumberOrSpectrum } from './spectrumRef';

type Pair = readonly [number, number];
const SIDES = ['hyperpolarized', 'thermal'] as const;

/** Reads `signal:`; without `hyperpolarized:` a `series:` supplies it, or the block is a thermal reference. */
export function readSignal(ctx: ReadContext, e: Entry): SignalInput | null {
  if (!isMap(e.value)) {
    report(
      ctx,
      'error',
      'signal-not-mapping',
      'signal: give `hyperpolarized:` and `thermal:` (and optionally `scans`, `flip`, `gain`, `amount`, `noise`) as a mapping.',
      e.keySpan,
    );
    return null;
  }
  const byKey = new Map(entries(e.value).map((x) => [x.key, x] as const));
  for (const x of byKey.values()) if (!SIGNAL_KEYS.includes(x.key)) unknownKey(ctx, x, new Set(SIGNAL_KEYS), byKey);
  const noise = readPair(
    ctx,
    byKey.get('noise'),
    'noise',
    (node, s) => readNumber(ctx, node, s),
    null,
    (v) => v >= 0,
    'noise must be ≥ 0',
  );
  const hpEntry = byKey.get('hyperpolarized');
  let hp: ReadValue | null = null;
  if (hpEntry) {
    const v = readNumberOrSpectrum(ctx, hpEntry.value, 'signal.hyperpolarized');
    hp = v ? withNoise(ctx, v, given(noise?.[0]), 'signal.hyperpolarized', byKey) : null;
  }
  // Without `hyperpolarized:` and a series the block is a thermal reference itself: P = P_th.
  const thEntry = byKey.get('thermal');
  let th: ReadValue | null = null;
  let byRun: { run: ThermalRun; sides: SignalSides } | null = null;
  let runFailed = false;
  if (!thEntry)
    report(ctx, 'error', 'signal-incomplete', 'signal: the `thermal:` reference signal is missing.', e.keySpan);
  else if (isRunRefNode(thEntry.value)) {
    byRun = thermalByRun(ctx, thEntry, byKey);
    runFailed = byRun === null;
    if (byRun) th = { value: byRun.sides.thermal, uncertainty: byRun.sides.uThermal, span: byRun.run.span, unit: null };
  } else {
    const v = readNumberOrSpectrum(ctx, thEntry.value, 'signal.thermal');
    th = v ? withNoise(ctx, v, given(noise?.[1]), 'signal.thermal', byKey) : null;
    if (th && th.value === 0) {
      report(
        ctx,
        'error',
        'signal-thermal-zero',
        'signal.thermal: a zero thermal signal gives no reference to scale by.',
        th.span,
      );
      th = null;
    }
  }
  const scans = readPair(
    ctx,
    byKey.get('scans'),
    'scans',
    (node, s) => readInteger(ctx, node, s, 'scans-invalid', 1),
    1,
    () => true,
    '',
  );
  const flip = readPair(
    ctx,
    byKey.get('flip'),
    'flip',
    (node, s) => readQuantity(ctx, node, 'angle', s, { suggestUnit: 'deg' }),
    Math.PI / 2,
    (v) => Math.sin(v) > 1e-12,
    'the flip angle must lie strictly between 0 and 180 deg (sin θ > 0)',
  );
  const gain = readPair(
    ctx,
    byKey.get('gain'),
    'gain',
    (node, s) => readNumber(ctx, node, s),
    1,
    (v) => v > 0,
    'a receiver gain must be positive',
  );
  const amount = readPair(
    ctx,
    byKey.get('amount'),
    'amount',
    (node, s) => readNumber(ctx, node, s),
    1,
    (v) => v > 0,
    'a relative amount must be positive',
  );
  if (runFailed || (hpEntry && !hp) || !th || !scans || !flip || !gain || !amount || (byKey.has('noise') && !noise))
    return null;
  const theirs = byRun?.sides;
  return {
    hyperpolarized: hp ? hp.value : null,
    uHyperpolarized: hp ? hp.uncertainty : null,
    thermal: th.value,
    uThermal: th.uncertainty,
    scans: theirs ? [scans[0], theirs.scans] : scans,
    flip: theirs ? [flip[0], theirs.flip] : flip,
    gain: theirs ? [gain[0], theirs.gain] : gain,
    amount: theirs ? [amount[0], theirs.amount] : amount,
    span: e.keySpan,
    thermalRun: byRun?.run ?? null,
  };
}

/** The thermal side of a signal as a reference run recorded it. */
interface SignalSides {
  readonly thermal: number;
  readonly uThermal: number | null;
  readonly scans: number;
  readonly flip: number;
  readonly gain: number;
  readonly amount: number;
}

/**
 * `thermal: { run: … }`: the thermal signal, its acquisition factors and its noise come from the referenced
 * run (and, in interpret.ts, its lattice temperature and field). Thermal sides written here as well are
 * ignored, with a warning on each.
 */
function thermalByRun(
  ctx: ReadContext,
  thEntry: Entry,
  byKey: ReadonlyMap<string, Entry>,
): { run: ThermalRun; sides: SignalSides } | null {
  const ref = readRunRef(ctx, thEntry.value, 'thermal', 'signal.thermal');
  if (!ref) return null;
  for (const name of ['scans', 'flip', 'gain', 'amount', 'noise']) {
    const pair = byKey.get(name);
    const side = pair && isMap(pair.value) ? entries(pair.value).find((x) => x.key === 'thermal') : undefined;
    if (side)
      report(
        ctx,
        'warning',
        'reference-shadowed',
        `signal.${name}.thermal: the thermal side comes from the run \`${ref.id}\`; this value is ignored.`,
        side.keySpan,
      );
  }
  const run = followRun(ctx, ref, 'signal.thermal');
  if (!run) return null;
  const sig = run.input?.signal ?? null;
  const spin = run.input?.spin ?? null;
  if (!sig || !spin) {
    report(
      ctx,
      'error',
      'reference-kind',
      `signal.thermal: the run \`${run.id}\` records no thermal signal (a spin block with \`signal: { thermal: … }\`), so it cannot serve as a thermal reference.`,
      ref.span,
    );
    return null;
  }
  const lattice = run.input?.lattice ?? null;
  return {
    run: {
      id: run.id,
      place: run.place,
      date: run.date,
      spin,
      lattice: lattice ? { ...lattice, span: ref.span } : null,
      span: ref.span,
      idSpan: ref.idSpan,
    },
    sides: {
      thermal: sig.thermal,
      uThermal: sig.uThermal,
      scans: sig.scans[1],
      flip: sig.flip[1],
      gain: sig.gain[1],
      amount: sig.amount[1],
    },
  };
}

/** A side of a pair, or null when it was left out (NaN). */
function given(x: number | undefined): number | null {
  return x === undefined || Number.isNaN(x) ? null : x;
}

/** The `noise.<side>` entry of the signal, when written. */
function noiseSide(byKey: ReadonlyMap<string, Entry>, side: (typeof SIDES)[number]): Entry | undefined {
  const pair = byKey.get('noise');
  return pair && isMap(pair.value) ? entries(pair.value).find((x) => x.key === side) : undefined;
}

/**
 * A side's value with its typed `noise`. A typed `±` and a typed `noise` are two answers to one question
 * (`uncertainty-twice`). A spectrum reference with a noise region answers it from the spectrum itself
 * (notebook format v1.2: it replaces a typed `noise`), so that uncertainty is kept and the typed one is
 * ignored, with a warning on it.
 */
function withNoise(
  ctx: ReadContext,
  v: ReadValue,
  noise: number | null,
  subject: string,
  byKey: ReadonlyMap<string, Entry>,
): ReadValue | null {
  if (noise === null) return v;
  if (uncertaintyFromRegion(v)) {
    const side = subject.slice(subject.indexOf('.') + 1) as (typeof SIDES)[number];
    const noiseEntry = noiseSide(byKey, side);
    report(
      ctx,
      'warning',
      'noise-replaced',
      `signal.noise.${side}: replaced by the noise region of the spectrum at ${subject}, which gives this side's uncertainty; this typed noise is ignored.`,
      noiseEntry ? entrySpan(noiseEntry) : v.span,
    );
    return v;
  }
  if (v.uncertainty !== null) {
    report(ctx, 'error', 'uncertainty-twice', `${subject} carries ± and a \`noise\` entry; keep one.`, v.span);
    return null;
  }
  return { ...v, uncertainty: noise };
}

/** Reads `{ hyperpolarized: x, thermal: y }` with a default for each missing side (null default: a missing side is NaN). */
function readPair(
  ctx: ReadContext,
  e: Entry | undefined,
  name: string,
  read: (node: TreeNode | null, subject: string) => ReadValue | null,
  fallback: number | null,
  valid: (v: number) => boolean,
  why: string,
): Pair | null {
  if (!e) return fallback === null ? null : [fallback, fallback];
  if (!isMap(e.value)) {
    report(
      ctx,
      'error',
      'signal-not-mapping',
      `signal.${name}: give \`{ hyperpolarized: …, thermal: … }\`.`,
      spanOf(e.value) ?? e.keySpan,
    );
    return null;
  }
  const byKey = new Map(entries(e.value).map((x) => [x.key, x] as const));
  for (const x of byKey.values())
    if (!(SIDES as readonly string[]).includes(x.key)) unknownKey(ctx, x, new Set(SIDES), byKey);
  const out: number[] = [];
  for (const side of SIDES) {
    const x = byKey.get(side);
    if (!x) {
      // Without a default (noise) a side may be left out: NaN stands for "not given".
      out.push(fallback ?? NaN);
      continue;
    }
    const v = read(x.value, `signal.${name}.${side}`);
    if (!v) return null;
    if (!valid(v.value)) {
      report(ctx, 'error', 'signal-factor-invalid', `signal.${name}.${side}: ${why}.`, v.span);
      return null;
    }
    out.push(v.value);
  }
  return [out[0], out[1]];
}

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
import { readInteger, readNumber, readQuantity, report, type ReadContext, type ReadValue } from './values';
import { entries, isMap, spanOf, type Entry } from './yamlTree';
import { SIGNAL_KEYS } from './schema';
import { unknownKey } from './unknownKey';
import { readNumberOrSpectrum } from './spectrumRef';

type Pair = readonly [number, number];
const SIDES = ['hyperpolarized', 'thermal'] as const;

/** Reads `signal:`; `fromSeries` means a time series supplies the hyperpolarized signal. */
export function readSignal(ctx: ReadContext, e: Entry, fromSeries: boolean): SignalInput | null {
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
  for (const x of byKey.values()) if (!SIGNAL_KEYS.includes(x.key)) unknownKey(ctx, x, new Set(SIGNAL_KEYS));
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
    hp = v ? withNoise(ctx, v, noise?.[0] ?? null, 'signal.hyperpolarized') : null;
  } else if (!fromSeries) {
    report(
      ctx,
      'error',
      'signal-incomplete',
      'signal: `hyperpolarized:` is missing (or give a `series:` whose fitted amplitude is the hyperpolarized signal).',
      e.keySpan,
    );
  }
  const thEntry = byKey.get('thermal');
  let th: ReadValue | null = null;
  if (!thEntry)
    report(ctx, 'error', 'signal-incomplete', 'signal: the `thermal:` reference signal is missing.', e.keySpan);
  else {
    const v = readNumberOrSpectrum(ctx, thEntry.value, 'signal.thermal');
    th = v ? withNoise(ctx, v, noise?.[1] ?? null, 'signal.thermal') : null;
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
  if ((hpEntry && !hp) || !th || !scans || !flip || !gain || !amount || (byKey.has('noise') && !noise)) return null;
  return {
    hyperpolarized: hp ? hp.value : null,
    uHyperpolarized: hp ? hp.uncertainty : null,
    thermal: th.value,
    uThermal: th.uncertainty,
    scans,
    flip,
    gain,
    amount,
    span: e.keySpan,
  };
}

function withNoise(ctx: ReadContext, v: ReadValue, noise: number | null, subject: string): ReadValue | null {
  if (noise === null) return v;
  if (v.uncertainty !== null) {
    report(ctx, 'error', 'uncertainty-twice', `${subject} carries ± and a \`noise\` entry; keep one.`, v.span);
    return null;
  }
  return { ...v, uncertainty: noise };
}

/** Reads `{ hyperpolarized: x, thermal: y }` with a default for each missing side (null default: both required… or absent). */
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
  for (const x of byKey.values()) if (!(SIDES as readonly string[]).includes(x.key)) unknownKey(ctx, x, new Set(SIDES));
  const out: number[] = [];
  for (const side of SIDES) {
    const x = byKey.get(side);
    if (!x) {
      if (fallback === null) {
        report(ctx, 'error', 'signal-incomplete', `signal.${name}: \`${side}\` is missing.`, e.keySpan);
        return null;
      }
      out.push(fallback);
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

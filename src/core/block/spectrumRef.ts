/**
 * A spectrum reference in place of a signal or intensity number:
 * `{ spectrum: spectra/run12.jdx, region: [168 ppm, 174 ppm], baseline: linear, noise: [200 ppm, 230 ppm] }`
 * (docs/format.md, "Spectra by reference"). The file comes from the host's
 * `Externals.spectra` (spectra/types.ts); the integral enters the block as the
 * typed number would, and each reference is kept on the block
 * (`BlockMeta.spectra`) for hovers, links, the curve view and the JSON.
 */
import type { TreeNode } from './tree';
import { deref, entries, isMap, isSeq, spanOf, type Entry } from './yamlTree';
import {
  depend,
  nonEmpty,
  readNumber,
  readText,
  report,
  type ReadContext,
  type ReadValue,
  type SpectrumRefs,
} from './values';
import { unknownKey } from './unknownKey';
import { parseQuantity } from '../quantities/units';
import { convertX, parseXUnit, X_UNITS, type XUnit } from '../spectra/axis';
import { integralUncertainty, integrateRegion, noiseSigma, type RegionProblem } from '../spectra/integrate';
import type { BaselineKind, Spectrum, SpectrumIntegral } from '../spectra/types';
import type { Problem, Span } from '../types';

/** Keys of a spectrum reference. */
export const SPECTRUM_REF_KEYS: readonly string[] = ['spectrum', 'region', 'baseline', 'noise'];
const KNOWN = new Set(SPECTRUM_REF_KEYS);

/** True when the node is a mapping that reads as a spectrum reference (it has `spectrum` or `region`). */
export function isSpectrumRef(node: TreeNode | null): boolean {
  const n = deref(node);
  return isMap(n) && entries(n).some((e) => e.key === 'spectrum' || e.key === 'region');
}

/**
 * Reads a number, or a spectrum reference in its place; `key` is the dotted
 * path of the value (`signal.thermal`, `series.signal[3]`, `lines[2].intensity`).
 */
export function readNumberOrSpectrum(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  return isSpectrumRef(node) ? readSpectrumRef(ctx, node, subject) : readNumber(ctx, node, subject);
}

interface Bound {
  readonly value: number;
  readonly unit: XUnit | null;
  readonly span: Span;
}

/** Reads `[from, to]` with optional x units; null (reported) when it is not such a pair. */
function readRange(ctx: ReadContext, node: TreeNode | null, subject: string, at: Span): [Bound, Bound] | null {
  const n = deref(node);
  if (!isSeq(n) || n.items.length !== 2) {
    report(
      ctx,
      'error',
      'spectrum-reference',
      `${subject}: give \`[from, to]\` on the file's x axis, such as \`[168 ppm, 174 ppm]\`.`,
      nonEmpty(spanOf(n) ?? at),
    );
    return null;
  }
  const out: Bound[] = [];
  for (const item of n.items) {
    const t = readText(ctx, item);
    const q = t ? parseQuantity(t.text) : null;
    const span = t?.span ?? nonEmpty(spanOf(item) ?? at);
    if (!t || !q || 'problem' in q || q.quantity.uncertainty !== null) {
      report(
        ctx,
        'error',
        'spectrum-reference',
        `${subject}: \`${t?.text ?? ''}\` is not an x value such as \`172.4 ppm\` or \`656.3 nm\`.`,
        span,
      );
      return null;
    }
    let unit: XUnit | null = null;
    if (q.quantity.unit !== null) {
      unit = parseXUnit(q.quantity.unit);
      if (!unit) {
        report(
          ctx,
          'error',
          'spectrum-unit',
          `${subject}: \`${q.quantity.unit}\` is not a unit of a spectrum's x axis (${X_UNITS.join(', ')}).`,
          span,
        );
        return null;
      }
    }
    out.push({ value: q.quantity.value, unit, span });
  }
  return [out[0]!, out[1]!];
}

/** The pair in the spectrum's unit, low to high, or null (reported) when a unit does not convert. */
function inFileUnit(
  ctx: ReadContext,
  pair: readonly [Bound, Bound],
  s: Spectrum,
  subject: string,
  fallback: XUnit | null = null,
): { lo: number; hi: number; unit: XUnit | null } | null {
  // A text file without a unit of its own is read in the region's unit (its first stated one).
  const unit = s.xUnit ?? fallback ?? pair[0].unit ?? pair[1].unit;
  const values: number[] = [];
  for (const b of pair) {
    if (b.unit === null || unit === null || b.unit === unit) {
      values.push(b.value);
      continue;
    }
    const c = convertX(b.value, b.unit, unit, s.observeMHz);
    if (typeof c !== 'number') {
      report(
        ctx,
        'error',
        'spectrum-unit',
        `${subject}: ${c.problem}${s.xUnit ? ` (the file's x axis is in ${s.xUnit})` : ''}.`,
        b.span,
      );
      return null;
    }
    values.push(c);
  }
  return { lo: Math.min(values[0]!, values[1]!), hi: Math.max(values[0]!, values[1]!), unit };
}

function regionMessage(p: RegionProblem, what: string, unit: XUnit | null, file: string): string {
  const u = unit ? ` ${unit}` : '';
  return p.kind === 'outside'
    ? `${what} reaches beyond the x range of ${file}, ${fmt(p.min)} … ${fmt(p.max)}${u}.`
    : `${what} holds ${p.points} point${p.points === 1 ? '' : 's'} of ${file}; at least 3 are needed.`;
}

function fmt(v: number): string {
  return Number(v.toPrecision(6)).toString();
}

/** Reads a spectrum reference into its integral (as a value with its uncertainty), or null with a problem. */
export function readSpectrumRef(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  const n = deref(node);
  const span = nonEmpty(spanOf(n) ?? { start: 0, end: 0 });
  const byKey = new Map(entries(n).map((x) => [x.key, x] as const));
  for (const x of byKey.values()) if (!KNOWN.has(x.key)) unknownKey(ctx, x, KNOWN, byKey);
  const fileEntry = byKey.get('spectrum');
  const own = fileEntry ? readText(ctx, fileEntry.value) : null;
  if (fileEntry && (!own || own.text.trim() === '' || isMap(deref(fileEntry.value)) || isSeq(deref(fileEntry.value)))) {
    report(
      ctx,
      'error',
      'spectrum-reference',
      `${subject}: \`spectrum:\` names a file, such as \`spectra/run12.jdx\`.`,
      nonEmpty(spanOf(fileEntry.value) ?? fileEntry.keySpan),
    );
    return null;
  }
  const file = own ? { text: own.text.trim(), span: own.span } : (ctx.spectra?.fallback ?? null);
  if (!file) {
    report(
      ctx,
      'error',
      'spectrum-reference',
      `${subject}: name the file with \`spectrum: <path>\` here or once for the block.`,
      fileEntry ? nonEmpty(spanOf(fileEntry.value) ?? fileEntry.keySpan) : span,
    );
    return null;
  }
  if (file.text.includes('\\')) {
    // The format's separator is `/` on every system; a `\` would be a folder on one and part of a name on another.
    const at = own ? file.span : span;
    const plain = own !== null && ctx.body.slice(own.span.start, own.span.end) === own.text;
    report(
      ctx,
      'error',
      'spectrum-reference',
      `${subject}: write the path of ${file.text} with \`/\` between folders, as on every system.`,
      at,
      plain ? [{ title: 'Write the path with `/`', span: own.span, newText: own.text.replace(/\\/g, '/') }] : [],
    );
    return null;
  }
  const regionEntry = byKey.get('region');
  if (!regionEntry) {
    report(ctx, 'error', 'spectrum-reference', `${subject}: give the \`region: [from, to]\` to integrate.`, span);
    return null;
  }
  const region = readRange(ctx, regionEntry.value, `${subject}.region`, regionEntry.keySpan);
  const noiseEntry = byKey.get('noise');
  const noise = noiseEntry ? readRange(ctx, noiseEntry.value, `${subject}.noise`, noiseEntry.keySpan) : null;
  let baseline: BaselineKind = 'linear';
  const be = byKey.get('baseline');
  if (be) {
    const t = readText(ctx, be.value);
    if (t?.text === 'linear' || t?.text === 'none') baseline = t.text;
    else {
      report(
        ctx,
        'error',
        'spectrum-reference',
        `${subject}.baseline: \`linear\` (the default) or \`none\`.`,
        nonEmpty(t?.span ?? spanOf(be.value) ?? be.keySpan),
        t ? [{ title: 'Change to `linear`', span: t.span, newText: 'linear' }] : [],
      );
      return null;
    }
  }
  if (!region || (noiseEntry && !noise)) return null;
  const use = (source: string | null, result: SpectrumIntegral | null): void => {
    ctx.spectra?.uses.push({ key: subject, file: file.text, span, fileSpan: file.span, source, result });
  };
  const source = ctx.externals?.spectra;
  if (!source) {
    report(
      ctx,
      'error',
      'spectrum-missing',
      `${subject}: ${file.text} cannot be read here; spectrum files are read where the note is on disk (the editor, the command line).`,
      span,
    );
    use(null, null);
    return null;
  }
  // Problems of the file go on its path when the reference names it, on the reference when the block default does.
  const fileAt = own ? file.span : span;
  const answer = source.lookup(file.text);
  if (answer.state !== 'outside') depend(ctx, answer.key, answer.stamp);
  switch (answer.state) {
    case 'outside':
      report(
        ctx,
        'error',
        'spectrum-outside',
        `${subject}: ${file.text} lies outside ${answer.where}; it is not read.`,
        fileAt,
      );
      use(null, null);
      return null;
    case 'missing':
      report(ctx, 'error', 'spectrum-missing', `${subject}: there is no file ${file.text}.`, fileAt);
      use(answer.key, null);
      return null;
    case 'large':
      report(
        ctx,
        'error',
        'spectrum-large',
        `${subject}: ${file.text} has ${(answer.size / 1048576).toFixed(1)} MB, above the 64 MB a spectrum may have; it is not read.`,
        fileAt,
      );
      use(answer.key, null);
      return null;
    case 'malformed':
      report(
        ctx,
        'error',
        'spectrum-malformed',
        `${subject}: ${file.text}${answer.line !== null && !answer.message.startsWith('line ') ? `, line ${answer.line}` : ''}: ${answer.message}.`,
        fileAt,
      );
      use(answer.key, null);
      return null;
    case 'pending':
      if (ctx.spectra) ctx.spectra.pending++;
      use(answer.key, null);
      return null;
    default:
      break;
  }
  const s = answer.spectrum;
  const r = inFileUnit(ctx, region, s, `${subject}.region`);
  const nz = noise && r ? inFileUnit(ctx, noise, s, `${subject}.noise`, r.unit) : null;
  if (!r || (noise && !nz)) {
    use(answer.key, null);
    return null;
  }
  const integral = integrateRegion(s, r.lo, r.hi, baseline);
  if ('kind' in integral) {
    report(
      ctx,
      'error',
      'spectrum-region',
      `${subject}: the region ${regionMessage(integral, '', r.unit, file.text).trimStart()}`,
      nonEmpty(spanOf(regionEntry.value) ?? regionEntry.keySpan),
    );
    use(answer.key, null);
    return null;
  }
  let sigma: number | null = null;
  let noisePoints = 0;
  if (nz) {
    const sg = noiseSigma(s, nz.lo, nz.hi);
    if ('kind' in sg) {
      report(
        ctx,
        'error',
        'spectrum-region',
        `${subject}: the noise region ${regionMessage(sg, '', nz.unit, file.text).trimStart()}`,
        nonEmpty(spanOf(noiseEntry!.value) ?? noiseEntry!.keySpan),
      );
      use(answer.key, null);
      return null;
    }
    sigma = sg.sigma;
    noisePoints = sg.points;
  }
  const uncertainty = sigma === null ? null : integralUncertainty(sigma, integral.spacing, integral.points);
  use(answer.key, {
    value: integral.value,
    uncertainty,
    uncertaintyWithBaseline: sigma === null || baseline !== 'linear' ? null : sigma * integral.fullFactor,
    points: integral.points,
    unit: r.unit,
    region: [r.lo, r.hi],
    baseline,
    baselineLine: integral.baselineLine,
    noise: nz ? [nz.lo, nz.hi] : null,
    sigma,
    noisePoints,
  });
  return { value: integral.value, uncertainty, span, unit: null, fromSpectrum: true };
}

/**
 * The reference bookkeeping of one block: its list of uses and its
 * block-level `spectrum:` default (a path as text; anything else is reported).
 */
export function spectrumRefs(body: string, problems: Problem[], e: Entry | undefined): SpectrumRefs {
  if (!e) return { uses: [], fallback: null, pending: 0 };
  const ctx: ReadContext = { body, problems };
  const t = readText(ctx, e.value);
  if (!t || t.text.trim() === '' || isMap(deref(e.value)) || isSeq(deref(e.value))) {
    report(
      ctx,
      'error',
      'spectrum-reference',
      '`spectrum:` at the top of a block names the default file of its references, such as `spectra/run12.jdx`.',
      nonEmpty(spanOf(e.value) ?? e.keySpan),
    );
    return { uses: [], fallback: null, pending: 0 };
  }
  return { uses: [], fallback: { text: t.text.trim(), span: t.span }, pending: 0 };
}

/** The group a reference's value belongs to: values compared with each other (a signal's two sides, a series, the lines). */
function group(key: string): string {
  return key.startsWith('signal.')
    ? 'signal'
    : key.startsWith('series.')
      ? 'series'
      : key.startsWith('lines[')
        ? 'lines'
        : key;
}

/**
 * Warns where values that the block compares come from files integrated on
 * different x units (y·Hz against y·ppm, say): their ratio would carry the
 * units' factor. Called once the block is read.
 */
export function unitsAgree(ctx: ReadContext): void {
  const first = new Map<string, { unit: string | null; file: string }>();
  for (const u of ctx.spectra?.uses ?? []) {
    if (!u.result) continue;
    const g = group(u.key);
    const seen = first.get(g);
    if (!seen) first.set(g, { unit: u.result.unit, file: u.file });
    else if (seen.unit !== u.result.unit)
      report(
        ctx,
        'warning',
        'spectrum-units-differ',
        `${u.key}: this integral is in y × ${u.result.unit ?? 'no unit'} (${u.file}), the one it is compared with in y × ${seen.unit ?? 'no unit'} (${seen.file}); their ratio carries the units' factor. Give both files the same x unit.`,
        u.span,
      );
  }
}

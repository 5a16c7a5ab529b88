/**
 * Typed reading of YAML values: quantities, numbers, integers, strings and
 * lists, each with its body-relative span. Problems are collected in the
 * reader's list; nothing throws.
 */
import type { TreeNode } from './tree';
import { isNullScalar, isScalar, isSeq, spanOf, deref } from './yamlTree';
import { convert, parseQuantity, type Dimension, type QuantityProblem } from '../quantities/units';
import type { Problem, Replacement, Severity, Span } from '../types';
import type { UnitChoice } from './unitChoice';
import type { Dependency, Externals } from './externals';
import type { RunRef } from '../runs/types';
import type { SpectrumUse } from '../spectra/types';

/** The spectrum references a block reader meets (block/spectrumRef.ts). */
export interface SpectrumRefs {
  /** Every reference met, in the order of the block's text. */
  readonly uses: SpectrumUse[];
  /** The block-level `spectrum:` default, as written, or null. */
  readonly fallback: { readonly text: string; readonly span: Span } | null;
  /** References whose file the host is still reading: the block has no input until they are ready. */
  pending: number;
}

/** What a block reader carries while it walks the YAML. */
export interface ReadContext {
  readonly body: string;
  readonly problems: Problem[];
  /** The host's sources for values given by reference (spectrum files, other runs); absent where there are none. */
  readonly externals?: Externals | null;
  /** What the reader took from outside the block, for the analyzer's cache (see block/externals.ts). */
  readonly deps?: Dependency[];
  /** The references to other runs the block makes, as read (see block/runRef.ts). */
  readonly refs?: RunRef[];
  /** The spectrum references met so far and the block's default file; absent in readers that take none. */
  readonly spectra?: SpectrumRefs;
}

/** Records that the block read `key` from outside, as it was at `stamp`. */
export function depend(ctx: ReadContext, key: string, stamp: string | null): void {
  if (ctx.deps && !ctx.deps.some((d) => d.key === key)) ctx.deps.push({ key, stamp });
}

/** A number read from the block, in canonical units, with where it was written. */
export interface ReadValue {
  readonly value: number;
  readonly uncertainty: number | null;
  readonly span: Span;
  /** The unit as written, or null for a bare number. */
  readonly unit: string | null;
  /** True when the value is a spectrum's integral (block/spectrumRef.ts) rather than a typed number. */
  readonly fromSpectrum?: boolean;
}

/**
 * True when a value's uncertainty comes from a spectrum's noise region (notebook format v1.2: it replaces a typed
 * `noise` for that value).
 */
export function uncertaintyFromRegion(v: ReadValue): boolean {
  return v.fromSpectrum === true && v.uncertainty !== null;
}

/** Adds a problem to the context. */
export function report(
  ctx: ReadContext,
  severity: Severity,
  code: string,
  message: string,
  span: Span,
  fixes?: Replacement[],
): void {
  const at = insideBody(span, ctx.body);
  ctx.problems.push(
    fixes && fixes.length > 0 ? { severity, code, message, span: at, fixes } : { severity, code, message, span: at },
  );
}

/** The span clamped to the body (a one-character span widened past the body's end becomes empty there). */
export function insideBody(span: Span, body: string): Span {
  const start = Math.max(0, Math.min(span.start, body.length));
  return { start, end: Math.max(start, Math.min(span.end, body.length)) };
}

/**
 * The scalar's text as written and the body offset of its first character,
 * so that spans inside the text map back to the note. Quoted scalars start
 * one character in; escapes inside quotes may shift later spans, which are
 * then clamped to the node.
 */
function scalarSource(ctx: ReadContext, node: TreeNode | null): { text: string; base: number; span: Span } | null {
  if (!isScalar(node) || !node.range) return null;
  const span = spanOf(node)!;
  const raw = ctx.body.slice(span.start, span.end);
  if (node.type === 'QUOTE_DOUBLE' || node.type === 'QUOTE_SINGLE') {
    return { text: typeof node.value === 'string' ? node.value : raw.slice(1, -1), base: span.start + 1, span };
  }
  if (node.type === 'PLAIN') return { text: raw, base: span.start, span };
  return { text: typeof node.value === 'string' ? node.value : raw, base: span.start, span };
}

function shift(base: number, s: { start: number; end: number }, within: Span): Span {
  const start = Math.min(Math.max(base + s.start, within.start), within.end);
  const end = Math.min(Math.max(base + s.end, start), within.end);
  return { start, end: end > start ? end : Math.min(start + 1, Math.max(within.end, start + 1)) };
}

function quantityProblem(ctx: ReadContext, p: QuantityProblem, base: number, within: Span, subject: string): void {
  const fixes: Replacement[] = [];
  if (p.replacement) {
    fixes.push({
      title: p.replacement.title,
      span: shift(base, p.replacement.span, within),
      newText: p.replacement.newText,
    });
  }
  report(ctx, 'error', p.code, `${subject}: ${p.message}`, shift(base, p.span, within), fixes);
}

/** Options of {@link readQuantity}. */
export interface QuantityOptions {
  /** Unit assumed for a bare number; without it a bare number is an error with a fix. */
  readonly defaultUnit?: string;
  /** Unit offered by the "add a unit" fix for a bare number. */
  readonly suggestUnit?: string;
  /**
   * Units to offer for a bare number, judged by its magnitude (best first),
   * with the ones ruled out named in the message; overrides `suggestUnit`.
   */
  readonly unitChoice?: (value: number) => UnitChoice;
}

/** Reads `"<number> [± u] <unit>"` (or a bare number) into canonical units; reports and returns null on a problem. */
export function readQuantity(
  ctx: ReadContext,
  node: TreeNode | null,
  dim: Dimension,
  subject: string,
  opts: QuantityOptions = {},
): ReadValue | null {
  const n = deref(node);
  const src = scalarSource(ctx, n);
  if (!src || src.text.trim() === '' || isNullScalar(n)) {
    const span = spanOf(n) ?? { start: 0, end: 0 };
    report(
      ctx,
      'error',
      'value-missing',
      `${subject}: a value is needed here, such as ${example(dim)}.`,
      nonEmpty(span),
    );
    return null;
  }
  const parsed = parseQuantity(src.text);
  if ('problem' in parsed) {
    quantityProblem(ctx, parsed.problem, src.base, src.span, subject);
    return null;
  }
  const q = parsed.quantity;
  if (q.unit === null && opts.defaultUnit === undefined) {
    const choice = opts.unitChoice ? opts.unitChoice(q.value) : null;
    const units = choice ? choice.offer : opts.suggestUnit ? [opts.suggestUnit] : [];
    const end = shift(src.base, { start: q.valueSpan.end, end: q.valueSpan.end }, src.span).start;
    const at = q.uncertaintySpan ? shift(src.base, q.uncertaintySpan, src.span).end : end;
    const fixes: Replacement[] = units.map((unit) => ({
      title: `Add the unit ${unit}`,
      span: { start: at, end: at },
      newText: ` ${unit}`,
    }));
    const ruled = choice?.ruledOut.length
      ? ` Not offered, as the magnitude would be implausible here: ${choice.ruledOut.map((r) => `${q.value} ${r.unit}`).join(', ')}.`
      : '';
    report(
      ctx,
      'error',
      'unit-missing',
      `${subject}: a bare number needs a unit here, ${units[0] ? `such as \`${src.text.trim()} ${units[0]}\`` : `e.g. ${example(dim)}`} (${DIMENSION_WORDS[dim]}).${ruled}`,
      src.span,
      fixes,
    );
    return null;
  }
  const c = convert(q, dim, opts.defaultUnit !== undefined ? { defaultUnit: opts.defaultUnit } : {});
  if ('problem' in c) {
    quantityProblem(ctx, c.problem, src.base, src.span, subject);
    return null;
  }
  return { value: c.value, uncertainty: c.uncertainty, span: src.span, unit: q.unit };
}

/** What each dimension is, in words, for messages. */
const DIMENSION_WORDS: Readonly<Record<Dimension, string>> = {
  energy: 'an energy',
  wavelengthEnergy: 'an energy or a wavelength',
  field: 'a magnetic field',
  temperature: 'a temperature',
  time: 'a time',
  angle: 'an angle',
  density: 'a number density',
  crossSection: 'a cross-section',
  length: 'a length',
  attenuation: 'a loss per length',
  rate: 'a rate',
} as Record<Dimension, string>;

function example(dim: Dimension): string {
  switch (dim) {
    case 'energy':
      return '`120 cm-1` or `9.4 GHz`';
    case 'wavelengthEnergy':
      return '`1420.405751768 MHz` or `1064 nm`';
    case 'field':
      return '`9.4 T`';
    case 'temperature':
      return '`1.4 K`';
    case 'time':
      return '`30 s`';
    case 'angle':
      return '`5 deg`';
    case 'density':
      return '`2.0e16 cm-3`';
    case 'column':
      return '`3.1e14 cm-2`';
    case 'crossSection':
      return '`2.8e-19 cm2`';
    case 'length':
      return '`10 cm`';
    case 'attenuation':
      return '`0.01 cm-1`';
    default:
      return 'a number with a unit';
  }
}

function nonEmpty(span: Span): Span {
  return span.end > span.start ? span : { start: span.start, end: span.start + 1 };
}

/**
 * Reads a fraction (a polarization, a reflectivity): a plain number, or a
 * percentage written with `%` (`24.5 %`, `24.5 ± 0.5 %`), which is divided
 * by 100 (ISO 80000-1: % stands for the number 0.01). The value returned is
 * always the fraction; `unit` keeps `%` when it was written.
 */
export function readFraction(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  const n = deref(node);
  const src = scalarSource(ctx, n);
  const parsed = src ? parseQuantity(src.text) : null;
  if (!src || !parsed || 'problem' in parsed || parsed.quantity.unit !== '%') return readNumber(ctx, node, subject);
  const q = parsed.quantity;
  return {
    value: q.value / 100,
    uncertainty: q.uncertainty === null ? null : q.uncertainty / 100,
    span: src.span,
    unit: '%',
  };
}

/**
 * Reads a plain number, optionally with `± u` (no unit allowed). Used for
 * populations, polarization, ratios and the like.
 */
export function readNumber(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  const n = deref(node);
  const src = scalarSource(ctx, n);
  if (!src || src.text.trim() === '' || isNullScalar(n)) {
    report(
      ctx,
      'error',
      'value-missing',
      `${subject}: a number is needed here.`,
      nonEmpty(spanOf(n) ?? { start: 0, end: 0 }),
    );
    return null;
  }
  const parsed = parseQuantity(src.text);
  if ('problem' in parsed) {
    quantityProblem(ctx, parsed.problem, src.base, src.span, subject);
    return null;
  }
  const q = parsed.quantity;
  if (q.unit !== null) {
    const us = q.unitSpan ? shift(src.base, q.unitSpan, src.span) : src.span;
    report(
      ctx,
      'error',
      'unit-unexpected',
      `${subject}: a plain number is expected here, without the unit \`${q.unit}\`.`,
      us,
    );
    return null;
  }
  return { value: q.value, uncertainty: q.uncertainty, span: src.span, unit: null };
}

/** Reads a whole number ≥ `min`; reports `code` otherwise. */
export function readInteger(
  ctx: ReadContext,
  node: TreeNode | null,
  subject: string,
  code: string,
  min: number,
): ReadValue | null {
  const v = readNumber(ctx, node, subject);
  if (!v) return null;
  if (!Number.isInteger(v.value) || v.value < min || v.uncertainty !== null) {
    report(
      ctx,
      'error',
      code,
      `${subject} must be a whole number ≥ ${min}; \`${ctx.body.slice(v.span.start, v.span.end)}\` is not.`,
      v.span,
    );
    return null;
  }
  return v;
}

/** Reads a scalar as text (numbers are kept as written). */
export function readText(ctx: ReadContext, node: TreeNode | null): { text: string; span: Span } | null {
  const n = deref(node);
  const src = scalarSource(ctx, n);
  if (!src) return null;
  return { text: isScalar(n) && n.value !== null ? String(n.value as string | number | boolean) : '', span: src.span };
}

/** The items of a YAML sequence, or null (with a problem) when the node is not one. */
export function readList(
  ctx: ReadContext,
  node: TreeNode | null,
  subject: string,
  span: Span,
): (TreeNode | null)[] | null {
  const n = deref(node);
  if (!isSeq(n)) {
    report(
      ctx,
      'error',
      'list-expected',
      `${subject} must be a list, e.g. \`[0.7, 0.3]\`.`,
      nonEmpty(spanOf(n) ?? span),
    );
    return null;
  }
  return n.items.map((i) => deref(i));
}

export { nonEmpty };

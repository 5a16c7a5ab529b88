/**
 * Reading measured populations: plain numbers on any scale (fractions,
 * counts) with an optional `± u`, or absolute number densities with a unit
 * (`2.0e16 cm-3`). All are ≥ 0; only their ratios matter.
 */
import type { TreeNode } from './tree';
import { acceptsUnit, parseQuantity } from '../quantities/units';
import type { Span } from '../types';
import { readFraction, readList, readNumber, readQuantity, report, type ReadContext, type ReadValue } from './values';
import { deref, isScalar, type Entry } from './yamlTree';

const LETTER = /[a-zA-Zµ]/;

/** Reads one population; reports negative values. */
export function readPopulation(ctx: ReadContext, node: TreeNode | null, subject: string): ReadValue | null {
  const n = deref(node);
  // A letter other than an exponent's `e` means a unit; text without any letter needs no closer look
  // (nor typing: a number's text has no letter but an exponent's, and the typed value is only read for text).
  const text = isScalar(n) && LETTER.test(n.source) && typeof n.value === 'string' ? n.value : '';
  const unit = LETTER.test(text) && LETTER.test(text.replace(/e[+-]?\d/gi, ''));
  // A column density (`cm-2`, radio and absorption work) is read as such; every other unit as a number density.
  const dim = unit && isColumn(text) ? 'column' : 'density';
  const v = unit ? readQuantity(ctx, n, dim, subject) : readFraction(ctx, n, subject);
  if (v && v.value < 0) {
    report(ctx, 'error', 'population-negative', `${subject}: a population cannot be negative.`, v.span);
    return null;
  }
  return v;
}

/** True when the written quantity's unit is a column density (`cm-2`, `m-2`, `cm^-2`). */
function isColumn(text: string): boolean {
  const q = parseQuantity(text);
  return !('problem' in q) && q.quantity.unit !== null && acceptsUnit(q.quantity.unit, 'column');
}

/** Reads the `populations` list and checks its length. */
export function readPopulationList(ctx: ReadContext, e: Entry, expected: number, why: string): ReadValue[] | null {
  const items = readList(ctx, e.value, 'populations', e.valueSpan);
  if (!items) return null;
  if (items.length !== expected) {
    report(
      ctx,
      'error',
      'populations-length',
      `populations: ${why} needs ${expected} values in order of increasing energy; ${items.length} given.`,
      e.valueSpan,
    );
    return null;
  }
  const out: ReadValue[] = [];
  let ok = true;
  items.forEach((item, i) => {
    const v = readPopulation(ctx, item, `populations[${i}]`);
    if (v) out.push(v);
    else ok = false;
  });
  if (!ok) return null;
  if (out.every((v) => v.value === 0)) {
    report(
      ctx,
      'error',
      'populations-zero',
      'populations: all populations are zero, so nothing can be computed.',
      e.valueSpan,
    );
    return null;
  }
  return out;
}

/**
 * Attaches a block-level `uncertainty:` sibling to a value written without
 * `±`; both at once is an error.
 */
export function withSiblingUncertainty(
  ctx: ReadContext,
  v: ReadValue,
  sibling: Entry | undefined,
  subject: string,
): ReadValue | null {
  if (!sibling) return v;
  const u = readNumber(ctx, sibling.value, 'uncertainty');
  if (!u) return null;
  if (v.uncertainty !== null) {
    report(
      ctx,
      'error',
      'uncertainty-twice',
      `${subject} already carries an uncertainty (±); remove one of the two.`,
      sibling.keySpan,
    );
    return null;
  }
  if (u.value < 0) {
    report(ctx, 'error', 'uncertainty-negative', 'uncertainty: a standard uncertainty cannot be negative.', u.span);
    return null;
  }
  return { ...v, uncertainty: u.value };
}

/** Reports that two alternative keys were both given. */
export function bothGiven(ctx: ReadContext, a: string, b: Entry, code: string): void {
  report(ctx, 'error', code, `Give either \`${a}\` or \`${b.key}\`, not both.`, b.keySpan);
}

/** Reports that neither of the measurement keys was given. */
export function measurementMissing(ctx: ReadContext, keys: string, span: Span): void {
  report(ctx, 'error', 'measurement-missing', `Nothing measured: add ${keys}.`, span);
}

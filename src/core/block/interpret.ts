/**
 * Turns a block body into its physical input: YAML → keys → one of the three
 * forms of the contract. Every problem is collected with its span; the input
 * is null when any error was found, so the analysis only sees clean data.
 */
import type { Problem, Span } from '../types';
import { readSpinForm } from './formSpin';
import { readLevelsForm } from './formLevels';
import { readTransitionForm } from './formTransition';
import type { BlockInput, BlockMeta } from './input';
import { BLOCK_KEY_NAMES, type BlockForm } from './schema';
import { unknownKey } from './unknownKey';
import { nonEmpty, readInteger, readQuantity, readText, report, type ReadContext, type ReadValue } from './values';
import { entries, isMap, parseBody, spanOf, type Entry } from './yamlTree';

/** What reading a block gave: its label and key spans, its input (null on errors) and its problems. */
export interface Interpretation {
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly problems: Problem[];
}

const FORM_KEYS: readonly [string, BlockForm][] = [['levels', 'levels'], ['system', 'spin'], ['gap', 'transition']];

/** Reads one block body (the text between the fences). Never throws. */
export function interpretBody(body: string): Interpretation {
  const problems: Problem[] = [];
  const emptyMeta: BlockMeta = { id: null, idSpan: null, keys: new Map() };
  const firstLine: Span = { start: 0, end: Math.max(1, body.search(/\r|\n|$/)) };
  if (body.trim() === '') {
    problems.push({ severity: 'error', code: 'block-empty', message: 'The block is empty: describe the levels with `levels:`, `system:` + `field:`, or `gap:`.', span: firstLine });
    return { meta: emptyMeta, input: null, problems };
  }
  const parsed = parseBody(body);
  problems.push(...parsed.problems);
  const doc = parsed.doc;
  if (!doc) return { meta: emptyMeta, input: null, problems };
  if (!isMap(doc.contents)) {
    const span = spanOf(doc.contents) ?? firstLine;
    problems.push({ severity: 'error', code: 'body-not-mapping', message: 'The block must be a YAML mapping of `key: value` lines.', span: nonEmpty(span) });
    return { meta: emptyMeta, input: null, problems };
  }
  const ctx: ReadContext = { doc, body, problems };
  const all = entries(doc, doc.contents);
  const byKey = new Map<string, Entry>();
  const keys = new Map<string, { key: Span; value: Span }>();
  for (const e of all) {
    byKey.set(e.key, e);
    keys.set(e.key, { key: e.keySpan, value: e.valueSpan });
    if (!BLOCK_KEY_NAMES.has(e.key)) unknownKey(ctx, e, BLOCK_KEY_NAMES);
  }
  const idEntry = byKey.get('id');
  const idText = idEntry ? readText(ctx, idEntry.value) : null;
  const meta: BlockMeta = { id: idText && idText.text !== '' ? idText.text : null, idSpan: idText?.span ?? null, keys };

  const forms = FORM_KEYS.filter(([k]) => byKey.has(k)).sort((a, b) => byKey.get(a[0])!.keySpan.start - byKey.get(b[0])!.keySpan.start);
  let input: BlockInput | null = null;
  if (forms.length === 0) {
    report(ctx, 'error', 'form-missing', 'Describe the levels in one of three ways: `levels:` (explicit levels), `system:` with `field:` (a spin in a field) or `gap:` (a single transition).', firstLine);
  } else if (forms.length > 1) {
    const [first, second] = forms;
    report(ctx, 'error', 'form-conflict', `Use one way of describing the levels: \`${first[0]}\` and \`${second[0]}\` cannot be combined.`, byKey.get(second[0])!.keySpan);
  } else {
    const lattice = readLattice(ctx, byKey.get('lattice'));
    const count = readCount(ctx, byKey.get('count'));
    const errorsBefore = countErrors(problems);
    const form = forms[0][1];
    const common = { lattice, count: count?.value ?? null };
    const read = form === 'levels' ? readLevelsForm(ctx, byKey) : form === 'spin' ? readSpinForm(ctx, byKey) : readTransitionForm(ctx, byKey);
    if (read && countErrors(problems) === errorsBefore && countErrors(problems) === 0) input = { ...read, ...common };
  }
  if (countErrors(problems) > 0) input = null;
  return { meta, input, problems };
}

function countErrors(problems: readonly Problem[]): number {
  let n = 0;
  for (const p of problems) if (p.severity === 'error') n++;
  return n;
}

function readLattice(ctx: ReadContext, e: Entry | undefined): ReadValue | null {
  if (!e) return null;
  const v = readQuantity(ctx, e.value, 'temperature', 'lattice', { suggestUnit: 'K' });
  if (v && !(v.value > 0)) {
    report(ctx, 'error', 'lattice-not-positive', 'lattice: a bath temperature must be above absolute zero.', v.span);
    return null;
  }
  return v;
}

function readCount(ctx: ReadContext, e: Entry | undefined): ReadValue | null {
  if (!e) return null;
  return readInteger(ctx, e.value, 'count', 'count-invalid', 1);
}

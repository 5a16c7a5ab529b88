/**
 * Turns a block body into its physical input: YAML → keys → one of the three
 * forms of the contract. Every problem is collected with its span; the input
 * is null when any error was found, so the analysis only sees clean data.
 */
import type { Problem, Span } from '../types';
import { NO_DEPENDENCIES, type Dependency, type Externals } from './externals';
import { readSpinForm } from './formSpin';
import { readLevelsForm } from './formLevels';
import { readTransitionForm } from './formTransition';
import type { BlockInput, BlockMeta, FormRead, SpinInput, ThermalRun, TradeInput } from './input';
import { BLOCK_KEY_NAMES, BLOCK_KEYS, keyFitsForm, type BlockForm, type KeyDoc } from './schema';
import { readLinesForm } from './formLines';
import { readBackground, readRotor } from './tradeKeys';
import { readSeries } from './series';
import { KeySpans } from './keySpans';
import { unknownKey } from './unknownKey';
import { readExtrapolate } from './extrapolate';
import { shortNote } from '../runs/paths';
import type { RunRef } from '../runs/types';
import {
  insideBody,
  nonEmpty,
  readInteger,
  readQuantity,
  readText,
  report,
  type ReadContext,
  type ReadValue,
} from './values';
import { deref, entries, isMap, isScalar, isSeq, parseBody, spanOf, type Entry } from './yamlTree';
import { spectrumRefs, unitsAgree } from './spectrumRef';

/** What reading a block gave: its label and key spans, its input (null on errors) and its problems. */
export interface Interpretation {
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly problems: Problem[];
  /** What the block took from outside its text (spectrum files, other runs), with the stamps read. */
  readonly deps: readonly Dependency[];
}

/** Each schema key name, to keep that string rather than the parser's copy. */
const KEY_NAMES: ReadonlyMap<string, string> = new Map([...BLOCK_KEY_NAMES].map((k) => [k, k]));

function keepName(key: string): string {
  return KEY_NAMES.get(key) ?? key;
}

/** Keys that say how levels are filled, which mean nothing until a form says what the levels are. */
const FILLING_KEYS = ['populations', 'polarization', 'ratio'] as const;
type FillingKey = (typeof FILLING_KEYS)[number];

/** The forms each of those keys belongs to (notebook-format.md, "exactly one of three forms"). */
const FILLED_BY: Record<FillingKey, string> = {
  populations:
    'say which levels these fill: add `system:` with `field:` (a spin in a field) or `gap:` (a single transition), or give them as `levels:` with an energy each',
  polarization: 'say which spin this is of: add `system:` with `field:` (a spin in a field)',
  ratio: 'say which transition this is of: add `gap:` (a single transition; the ratio is n_upper / n_lower)',
};

const FORM_KEYS: readonly [string, BlockForm][] = [
  ['levels', 'levels'],
  ['system', 'spin'],
  ['gap', 'transition'],
  ['lines', 'lines'],
];

/**
 * Reads one block body (the text between the fences). Never throws. Values
 * given by reference are taken from `externals` (see block/externals.ts);
 * without it, such a reference is reported as one that cannot be followed.
 */
export function interpretBody(body: string, externals: Externals | null = null): Interpretation {
  const problems: Problem[] = [];
  const emptyMeta: BlockMeta = { id: null, idSpan: null, keys: new Map(), date: null };
  if (!/\S/.test(body)) {
    problems.push({
      severity: 'error',
      code: 'block-empty',
      message: 'The block is empty: describe the levels with `levels:`, `system:` + `field:`, or `gap:`.',
      span: firstLine(body),
    });
    return { meta: emptyMeta, input: null, problems, deps: NO_DEPENDENCIES };
  }
  const parsed = parseBody(body);
  // One by one: a spread of a few hundred thousand problems (repeated keys) would overflow the stack.
  for (const p of parsed.problems) problems.push(p);
  const doc = parsed.doc;
  if (!doc) return { meta: emptyMeta, input: null, problems, deps: NO_DEPENDENCIES };
  if (!isMap(doc.contents)) {
    const span = spanOf(doc.contents) ?? firstLine(body);
    problems.push({
      severity: 'error',
      code: 'body-not-mapping',
      message: 'The block must be a YAML mapping of `key: value` lines.',
      span: insideBody(nonEmpty(span), body),
    });
    return { meta: emptyMeta, input: null, problems, deps: NO_DEPENDENCIES };
  }
  const deps: Dependency[] = [];
  const refs: RunRef[] = [];
  const all = entries(doc.contents);
  const byKey = new Map<string, Entry>();
  // Kept for as long as the block is cached; the spans are found again when first asked for.
  const keys = new KeySpans(body, keepName);
  for (const e of all) {
    byKey.set(e.key, e);
  }
  const spectra = spectrumRefs(body, problems, byKey.get('spectrum'));
  const ctx: ReadContext = { body, problems, externals, deps, refs, spectra };
  for (const e of all) if (!BLOCK_KEY_NAMES.has(e.key)) unknownKey(ctx, e, BLOCK_KEY_NAMES, byKey);
  const idEntry = byKey.get('id');
  const idText = idEntry ? readId(ctx, idEntry) : null;
  const dateEntry = byKey.get('date');
  const dateText = dateEntry ? readLabel(ctx, dateEntry) : null;
  const meta: BlockMeta = {
    id: idText && idText.text !== '' ? idText.text : null,
    idSpan: idText?.span ?? null,
    keys,
    date: dateText && dateText.text !== '' ? dateText.text : null,
    refs,
    spectra: spectra.uses,
  };
  if (meta.id !== null && meta.idSpan) duplicateId(ctx, meta.id, meta.idSpan);

  const forms: [string, BlockForm][] = [];
  for (const f of FORM_KEYS) if (byKey.has(f[0])) forms.push(f);
  if (forms.length > 1) forms.sort((a, b) => byKey.get(a[0])!.keySpan.start - byKey.get(b[0])!.keySpan.start);
  let input: BlockInput | null = null;
  if (forms.length === 0 && !byKey.has('series')) {
    // Populations or a polarization without the levels they fill: said on that key, with the two forms that take it.
    const filled = FILLING_KEYS.map((k) => byKey.get(k)).find((e) => e !== undefined);
    report(
      ctx,
      'error',
      'form-missing',
      filled
        ? `${filled.key}: ${FILLED_BY[filled.key as FillingKey]}.`
        : 'Describe the levels in one of three ways: `levels:` (explicit levels), `system:` with `field:` (a spin in a field) or `gap:` (a single transition); or give emission `lines:` or a time `series:`.',
      filled ? filled.keySpan : firstLine(body),
    );
  } else if (forms.length > 1) {
    const [first, second] = forms;
    report(
      ctx,
      'error',
      'form-conflict',
      `Use one way of describing the levels: \`${first[0]}\` and \`${second[0]}\` cannot be combined.`,
      byKey.get(second[0])!.keySpan,
    );
  } else {
    const form: BlockForm = forms.length === 1 ? forms[0][1] : 'series';
    misplacedKeys(ctx, byKey, form);
    const lattice = readLattice(ctx, byKey.get('lattice'));
    const count = readCount(ctx, byKey.get('count'));
    const series = byKey.has('series') ? readSeries(ctx, byKey.get('series')!) : null;
    const read = readForm(ctx, byKey, form);
    const background = readBackground(ctx, byKey.get('background'));
    const rotor = readRotor(ctx, byKey.get('rotational-constant'));
    const extrapolate = byKey.has('extrapolate') ? readExtrapolate(ctx, byKey.get('extrapolate')!) : null;
    const thermalRun = read?.signal?.thermalRun ?? null;
    if (thermalRun && read?.spin) sameSpin(ctx, read.spin, thermalRun);
    if (thermalRun?.lattice && lattice)
      report(
        ctx,
        'warning',
        'reference-shadowed',
        `lattice: the thermal reference \`${thermalRun.id}\` gives the lattice temperature (its own); this value is ignored.`,
        byKey.get('lattice')!.keySpan,
      );
    if (read?.signal && !lattice && !thermalRun?.lattice) {
      report(
        ctx,
        'error',
        'signal-lattice-missing',
        'signal: give `lattice:`, the temperature of the thermal reference, so its polarization is known.',
        byKey.get('signal')!.keySpan,
      );
    }
    if (read && countErrors(problems) === 0) {
      input = {
        form: read.form,
        levels: read.levels,
        energyUnit: read.energyUnit,
        spin: read.spin,
        polarization: read.polarization,
        ratio: read.ratio,
        uGap: read.uGap,
        lattice: thermalRun?.lattice ?? lattice,
        count: count?.value ?? null,
        densities: read.densities ?? false,
        signal: read.signal ?? null,
        series,
        lines: read.lines ?? null,
        gain: read.gain ?? null,
        trade:
          read.trade?.medium || read.trade?.line || read.trade?.columns || background || rotor
            ? {
                medium: read.trade?.medium ?? null,
                background,
                line: read.trade?.line ?? null,
                rotor,
                columns: read.trade?.columns ?? false,
              }
            : NO_TRADE,
        extrapolate,
      };
    }
  }
  // The references are met in reading order (a series before the signal, `hyperpolarized` before `thermal`); the
  // list is given in the order of the block's text (notebook-format contract, "Spectra and runs by reference").
  spectra.uses.sort((a, b) => a.span.start - b.span.start);
  unitsAgree(ctx);
  // A spectrum the host is still reading leaves the block without input (and without an error) until it is ready.
  if (countErrors(problems) > 0 || spectra.pending > 0) input = null;
  return { meta, input, problems, deps: deps.length > 0 ? deps : NO_DEPENDENCIES };
}

/**
 * The block's id as written. An id is a label, never a number: a plain scalar that the core schema would type as
 * a number or a boolean (`007`, `1e3`, `0x1F`, `1.50`) keeps its text, which is also the text a reference
 * `{ run: 007 }` is matched with. A null scalar (`id:`, `id: ~`) gives no id.
 */
function readId(ctx: ReadContext, e: Entry): { text: string; span: Span } | null {
  const t = readLabel(ctx, e);
  const n = deref(e.value);
  return t && isScalar(n) && !n.isNull ? { text: n.source, span: t.span } : t;
}

/** A label's text (`id`, `date`), or null; a list or mapping in its place is a warning and gives none. */
function readLabel(ctx: ReadContext, e: Entry): { text: string; span: Span } | null {
  const t = readText(ctx, e.value);
  const n = deref(e.value);
  if (!t && (isMap(n) || isSeq(n)))
    report(
      ctx,
      'warning',
      'text-expected',
      `\`${e.key}\` is a label: write it as text on one line; this ${isMap(n) ? 'mapping' : 'list'} is ignored.`,
      nonEmpty(spanOf(n) ?? e.keySpan),
    );
  return t;
}

/** `id-duplicate`: the id is carried by other blocks of the workspace too (asked of the host's runs). */
function duplicateId(ctx: ReadContext, id: string, span: Span): void {
  const runs = ctx.externals?.runs;
  if (!runs || !ctx.externals) return;
  const copies = runs.copies(ctx.externals.note, id, ctx.body);
  if (ctx.deps && !ctx.deps.some((d) => d.key === copies.key)) ctx.deps.push({ key: copies.key, stamp: copies.stamp });
  if (copies.others.length === 0) return;
  const here = ctx.externals.note;
  const notes = copies.others.map((p) => (p.note === here ? 'this note' : `\`${shortNote(p.note)}\``));
  const named = [...new Set(notes)];
  report(
    ctx,
    'warning',
    'id-duplicate',
    `id: \`${id}\` is also the id of ${copies.others.length === 1 ? 'a block' : `${copies.others.length} blocks`} in ${named.join(', ')}; ids name runs across the workspace, so give each run its own.`,
    span,
  );
}

/** `reference-mismatch` (another isotope) and `reference-field` (a field more than 1 % away) for a thermal reference run. */
function sameSpin(ctx: ReadContext, spin: SpinInput, run: ThermalRun): void {
  if (spin.species.symbol !== run.spin.species.symbol) {
    report(
      ctx,
      'error',
      'reference-mismatch',
      `signal.thermal: the run \`${run.id}\` is a ${run.spin.species.symbol} reference; this block measures ${spin.species.symbol}.`,
      run.span,
    );
    return;
  }
  const a = spin.field;
  const b = run.spin.field;
  if (a !== null && b !== null && Math.abs(a - b) > 0.01 * Math.abs(b)) {
    report(
      ctx,
      'warning',
      'reference-field',
      `signal.thermal: the run \`${run.id}\` was recorded at ${fmtField(b)}, this block at ${fmtField(a)} (${((100 * (a - b)) / b).toFixed(1)} %); its thermal polarization is computed at its own field.`,
      run.span,
    );
  }
}

function fmtField(t: number): string {
  return `${Number(t.toPrecision(4))} T`;
}

/** The body's first line, where problems of the block as a whole point (at least one character). */
export function firstLine(body: string): Span {
  return { start: 0, end: Math.max(1, body.search(/\r|\n|$/)) };
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

/** What most blocks carry for the trade keys: nothing, shared and frozen. */
const NO_TRADE: TradeInput = Object.freeze({ medium: null, background: null, line: null, rotor: null, columns: false });

const SERIES_ONLY: FormRead = {
  form: 'series',
  levels: [],
  energyUnit: null,
  spin: null,
  polarization: null,
  ratio: null,
  uGap: null,
};

function readForm(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>, form: BlockForm): FormRead | null {
  switch (form) {
    case 'levels':
      return readLevelsForm(ctx, byKey);
    case 'spin':
      return readSpinForm(ctx, byKey);
    case 'transition':
      return readTransitionForm(ctx, byKey);
    case 'lines':
      return readLinesForm(ctx, byKey);
    default:
      return SERIES_ONLY;
  }
}

/** Warns about keys of another form (`detector` in a spin block, `signal` with explicit levels…); they are ignored. */
function misplacedKeys(ctx: ReadContext, byKey: ReadonlyMap<string, Entry>, form: BlockForm): void {
  for (const doc of FOREIGN_KEYS[form]) {
    const e = byKey.get(doc.key);
    if (e)
      report(
        ctx,
        'warning',
        'key-not-for-form',
        `\`${doc.key}\` belongs to ${doc.forms ? 'blocks of lines, transitions or levels' : FORM_NAMES[doc.form as BlockForm]}; it is ignored in ${FORM_NAMES[form]}.`,
        e.keySpan,
      );
  }
}

/**
 * Per form, the keys that belong to another form, in schema order, worked out
 * once instead of for every block. The form keys themselves (`levels`,
 * `system`, `gap`, `lines`) are left out: two of them together are reported
 * as a conflict instead.
 */
const FOREIGN_KEYS: Record<BlockForm, readonly KeyDoc[]> = {
  levels: foreignKeys('levels'),
  spin: foreignKeys('spin'),
  transition: foreignKeys('transition'),
  lines: foreignKeys('lines'),
  series: foreignKeys('series'),
};

function foreignKeys(form: BlockForm): KeyDoc[] {
  return BLOCK_KEYS.filter((doc) => !keyFitsForm(doc, form) && !FORM_KEYS.some(([k]) => k === doc.key));
}

const FORM_NAMES: Record<BlockForm, string> = {
  levels: 'a block of explicit levels',
  spin: 'a spin block (`system:`)',
  transition: 'a single-transition block (`gap:`)',
  lines: 'an emission-lines block',
  series: 'a bare time series',
};

/**
 * Completions. Inside a block: keys at a key position (never one already in
 * that mapping, nor one of another form), isotope symbols after `system:`,
 * units after a number. Outside blocks, at a line start: snippets that
 * insert a new block (newBlocks.ts).
 *
 * The context is read from the lines' text rather than from the YAML tree:
 * while a line is being typed the block is usually not valid YAML.
 */
import { CompletionItemKind, MarkupKind, type CompletionItem, type Position, type Range } from 'vscode-languageserver';
import {
  BLOCK_KEYS,
  keyFitsForm,
  convert,
  formatNumber,
  LEVEL_KEYS,
  LINE_KEYS,
  lookupSpecies,
  parseQuantity,
  speciesSymbols,
  unitsFor,
  type BlockForm,
  type Dimension,
  type KeyDoc,
} from '../../core';
import { back, blockAt, toOffset, type NoteState } from '../state';
import { snippetItems } from './newBlocks';

/**
 * The completions at a position. `snippets` is false for a client without
 * snippet support (`completionItem.snippetSupport`): the new-block templates
 * then come as plain text with each placeholder's default.
 */
export function completion(state: NoteState, position: Position, snippets = true): CompletionItem[] {
  const b = blockAt(state, toOffset(state.lines, position));
  const lineText = textOfLine(state, position.line);
  const before = lineText.slice(0, position.character);
  if (!b) return lineText.slice(position.character).trim() === '' ? snippetItems(position, before, snippets) : [];
  const inBody = position.line > b.block.openLine && (b.block.closeLine === null || position.line < b.block.closeLine);
  if (!inBody) return [];
  const body: Body = {
    state,
    first: b.block.openLine + 1,
    last: b.block.closeLine === null ? state.lines.lineCount - 1 : b.block.closeLine - 1,
    current: position.line,
  };
  return (
    speciesItems(position, before) ??
    unitItems(body, position, before) ??
    keyItems(body, position, lineText, before) ??
    []
  );
}

// ---- reading the block's lines ----

/** The body lines of the block being edited (0-based, inclusive) and the cursor's line. */
interface Body {
  readonly state: NoteState;
  readonly first: number;
  readonly last: number;
  readonly current: number;
}

const KEY = /^\s*(?:-\s+)?([A-Za-z_][\w-]*)\s*:(?:\s|$)/;

function textOfLine(state: NoteState, line: number): string {
  return state.text.slice(state.lines.lineStart(line), state.lines.lineEnd(line));
}

function indentOf(text: string): number {
  return /^ */.exec(text)![0].length;
}

/** Lines holding YAML content: not blank, not a comment. */
function isContent(text: string): boolean {
  return !/^\s*(?:#.*)?$/.test(text);
}

/** Indentation of the block's top-level mapping: its first content line other than the cursor's. */
function topIndent(body: Body): number {
  for (let n = body.first; n <= body.last; n++) {
    const t = textOfLine(body.state, n);
    if (n !== body.current && isContent(t)) return indentOf(t);
  }
  return indentOf(textOfLine(body.state, body.current));
}

/** The top-level keys written in the block, the cursor's line excepted. */
function topKeys(body: Body, top: number): Set<string> {
  const keys = new Set<string>();
  for (let n = body.first; n <= body.last; n++) {
    const t = textOfLine(body.state, n);
    const m = n !== body.current && indentOf(t) === top && !/^\s*-/.test(t) ? KEY.exec(t) : null;
    if (m) keys.add(m[1]);
  }
  return keys;
}

/** The top-level key whose value holds the cursor's line (the line's own key when it is a top-level line). */
function regionKey(body: Body, top: number): string | null {
  for (let n = body.current; n >= body.first; n--) {
    const t = textOfLine(body.state, n);
    if (n !== body.current && !isContent(t)) continue;
    if (indentOf(t) <= top && (n !== body.current || KEY.test(t))) return KEY.exec(t)?.[1] ?? null;
  }
  return null;
}

/** Keys of the block-style list item (`- label: A` and the lines under it) holding the cursor's line. */
function blockItemKeys(body: Body): Set<string> {
  const keys = new Set<string>();
  let start = body.current;
  const ci = indentOf(textOfLine(body.state, start));
  if (!/^\s*-/.test(textOfLine(body.state, start))) {
    for (start = body.current - 1; start >= body.first; start--) {
      const t = textOfLine(body.state, start);
      if (isContent(t) && indentOf(t) < ci) break;
    }
    if (start < body.first || !/^\s*-\s/.test(textOfLine(body.state, start))) return keys;
  }
  const dash = indentOf(textOfLine(body.state, start));
  for (let n = start; n <= body.last; n++) {
    const t = textOfLine(body.state, n);
    if (n > start && isContent(t) && indentOf(t) <= dash) break;
    const m = n !== body.current ? KEY.exec(t) : null;
    if (m) keys.add(m[1]);
  }
  return keys;
}

/** The innermost `{` left open before the cursor, or −1. */
function openBrace(before: string): number {
  const opens: number[] = [];
  for (let i = 0; i < before.length; i++) {
    if (before[i] === '{') opens.push(i);
    else if (before[i] === '}') opens.pop();
  }
  return opens.length > 0 ? opens[opens.length - 1] : -1;
}

/** The keys of the flow mapping `{ … }` that opens at `brace` on this line. */
function flowKeys(lineText: string, brace: number): Set<string> {
  const close = lineText.indexOf('}', brace);
  const inside = lineText.slice(brace + 1, close < 0 ? lineText.length : close);
  return new Set([...inside.matchAll(/(?:^|,)\s*([A-Za-z_][\w-]*)\s*:/g)].map((m) => m[1]));
}

// ---- keys ----

const FORM_KEYS: Readonly<Record<string, BlockForm>> = {
  levels: 'levels',
  system: 'spin',
  gap: 'transition',
  lines: 'lines',
};
/** Keys that exclude each other (docs/format.md: populations-and-polarization, populations-and-ratio, measurement-conflict). */
const EXCLUSIVE: readonly (readonly [string, string])[] = [
  ['populations', 'polarization'],
  ['populations', 'ratio'],
  ['signal', 'populations'],
  ['signal', 'polarization'],
];

/** Whether a top-level key fits a block that already has `present`: new, of the block's form, not excluded. */
function fits(doc: KeyDoc, present: ReadonlySet<string>): boolean {
  if (present.has(doc.key)) return false;
  const forms = [...present].map((k) => FORM_KEYS[k]).filter((f) => f !== undefined);
  if (forms.length === 1) {
    if (!keyFitsForm(doc, forms[0])) return false;
    // Explicit levels carry their own populations and uncertainties (populations-misplaced).
    if (forms[0] === 'levels' && (doc.key === 'populations' || doc.key === 'uncertainty')) return false;
  }
  return !EXCLUSIVE.some(([a, c]) => (doc.key === a && present.has(c)) || (doc.key === c && present.has(a)));
}

function keyItem(doc: KeyDoc, index: number, range: Range): CompletionItem {
  const example = doc.example !== '' ? `\n\n\`${doc.key}: ${doc.example}\`` : '';
  return {
    label: doc.key,
    kind: CompletionItemKind.Property,
    detail: doc.form === 'any' ? 'any block' : `${(doc.forms ?? [doc.form]).join(', ')} form`,
    documentation: { kind: MarkupKind.Markdown, value: `${doc.summary}${example}` },
    textEdit: { range, newText: `${doc.key}: ` },
    sortText: String(index).padStart(3, '0'),
  };
}

/** Keys at a key position: the block's keys at its indentation, level keys inside a `levels` item. */
function keyItems(body: Body, position: Position, lineText: string, before: string): CompletionItem[] | null {
  const top = topIndent(body);
  const brace = openBrace(before);
  const flow = brace >= 0 ? /[{,]\s*([\w-]*)$/.exec(before) : null;
  const itemKeys = (region: string | null): readonly KeyDoc[] | null =>
    region === 'levels' ? LEVEL_KEYS : region === 'lines' ? LINE_KEYS : null;
  if (flow) {
    const docs = itemKeys(regionKey(body, top));
    if (!docs) return null;
    const present = flowKeys(lineText, brace);
    return docs
      .map((d, i) => ({ d, i }))
      .filter(({ d }) => !present.has(d.key))
      .map(({ d, i }) => keyItem(d, i, back(position, flow[1].length)));
  }
  const atStart = /^\s*(-\s+)?([\w-]*)$/.exec(before);
  if (!atStart || !/^\s*(?:-\s+)?[\w-]*\s*$/.test(lineText)) return null;
  const range = back(position, atStart[2].length);
  const indent = indentOf(before);
  if (!atStart[1] && indent === top) {
    const present = topKeys(body, top);
    return BLOCK_KEYS.map((d, i) => ({ d, i }))
      .filter(({ d }) => fits(d, present))
      .map(({ d, i }) => keyItem(d, i, range));
  }
  const docs = indent > top ? itemKeys(regionKey(body, top)) : null;
  if (!docs) return null;
  const present = blockItemKeys(body);
  return docs
    .map((d, i) => ({ d, i }))
    .filter(({ d }) => !present.has(d.key))
    .map(({ d, i }) => keyItem(d, i, range));
}

// ---- isotopes ----

/** Spin as written in tables: `1/2`, `1`, `5/2`. */
function spinText(spin: number): string {
  return Number.isInteger(spin) ? String(spin) : `${Math.round(2 * spin)}/2`;
}

/** Signed γ/2π with six significant digits, in MHz/T (GHz/T from 1000 MHz/T on, for the electron). */
function gammaText(gamma: number): string {
  const mhz = gamma / (2 * Math.PI) / 1e6;
  const [value, unit] = Math.abs(mhz) >= 1000 ? [mhz / 1000, 'GHz/T'] : [mhz, 'MHz/T'];
  return `${value > 0 ? '+' : ''}${formatNumber(value, 6)} ${unit}`;
}

/** Isotope symbols after `system:`, by mass number (the electron last), with spin and γ/2π from the table. */
function speciesItems(position: Position, before: string): CompletionItem[] | null {
  const m = /^\s*system\s*:\s*["']?([\w-]*)$/.exec(before);
  if (!m) return null;
  const mass = (s: string): number => Number.parseInt(s, 10) || Number.MAX_SAFE_INTEGER;
  const symbols = speciesSymbols().sort((a, c) => mass(a) - mass(c));
  return symbols.flatMap((symbol, i): CompletionItem[] => {
    const found = lookupSpecies(symbol);
    if (!('species' in found)) return [];
    const s = found.species;
    return [
      {
        label: symbol,
        kind: CompletionItemKind.EnumMember,
        detail: `I = ${spinText(s.spin)} · γ/2π = ${gammaText(s.gamma)}`,
        documentation: {
          kind: MarkupKind.Markdown,
          value: `${Math.round(2 * s.spin + 1)} Zeeman levels, |γ|ħB apart.${s.abundance === null ? '' : ` Natural abundance ${formatNumber(s.abundance, 6)} %.`} Spin and γ: ${s.source}.`,
        },
        textEdit: { range: back(position, m[1].length), newText: symbol },
        sortText: String(i).padStart(3, '0'),
      },
    ];
  });
}

// ---- units ----

/** What each quantity key measures, for its unit list. */
const UNIT_KEYS: Readonly<Record<string, Dimension>> = {
  field: 'field',
  lattice: 'temperature',
  gap: 'wavelengthEnergy',
  energy: 'energy',
  frequency: 'energy',
  populations: 'density',
  population: 'density',
};
/** The canonical unit each dimension converts to, for the item details. */
const CANONICAL: Partial<Record<Dimension, string>> = {
  field: 'T',
  temperature: 'K',
  energy: 'K (E/k)',
  wavelengthEnergy: 'K (E/k)',
  density: 'cm⁻³',
};

const NUM = String.raw`[+\-\u2212]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+\-\u2212]?\d+)?`;
const PM = String.raw`\s*(?:±|\+\/-|\+-)\s*`;
/**
 * A number with an optional `± u`, or both in brackets as the GUM writes them (`(7.05 ± 0.01)`), then optional
 * spaces and the start of a unit, at the end of the text before the cursor.
 */
const AFTER_NUMBER = new RegExp(
  String.raw`(?:\(\s*${NUM}(?:${PM}${NUM})?\s*\)|${NUM}(?:${PM}${NUM})?)(?<space>\s*)(?<partial>[A-Za-zµμ°/^][^\s,\]}"'#]*|)$`,
);

/** The key whose value the number starting at `at` belongs to: `key: 9.4`, `key: [0.4, 0.6`, or a `- 0.4` item. */
function valueKey(body: Body, before: string, at: number): string | null {
  const prefix = before.slice(0, at);
  const m =
    /([A-Za-z_][\w-]*)\s*:\s*["']?$/.exec(prefix) ?? /([A-Za-z_][\w-]*)\s*:\s*\[(?:[^[\]]*,)?\s*["']?$/.exec(prefix);
  if (m) return m[1];
  return /^\s*-\s+["']?$/.test(prefix) ? regionKey(body, topIndent(body)) : null;
}

/** What one unit is, e.g. `1 mT = 0.001 T`, `photon wavelength, E = hc/λ`. */
function unitDetail(unit: string, dim: Dimension): string {
  if (unit === '°C') return 't/°C + 273.15 = T/K';
  if (dim === 'wavelengthEnergy' && !unitsFor('energy').includes(unit)) return 'photon wavelength, E = hc/λ';
  const q = parseQuantity(`1 ${unit}`);
  const c = 'problem' in q ? null : convert(q.quantity, dim);
  return c && !('problem' in c)
    ? `1 ${unit} = ${trimZeros(formatNumber(c.value, 7))} ${CANONICAL[dim] ?? ''}`.trimEnd()
    : unit;
}

/** Drops trailing zeros of a displayed mantissa: `1.000000` → `1`, `1.000000 × 10⁻⁶` → `1 × 10⁻⁶`. */
function trimZeros(text: string): string {
  return text.replace(/(\.\d*?)0+(?=$| ×)/, '$1').replace(/\.(?=$| ×)/, '');
}

/** Units after a number written as the value of a quantity key. */
function unitItems(body: Body, position: Position, before: string): CompletionItem[] | null {
  const m = AFTER_NUMBER.exec(before);
  const key = m ? valueKey(body, before, m.index) : null;
  const dim = key !== null ? UNIT_KEYS[key] : undefined;
  if (!m || dim === undefined) return null;
  const { space, partial } = m.groups as { space: string; partial: string };
  // Right after the number (`1.`) the unit needs its separating space.
  const lead = space === '' ? ' ' : '';
  return unitsFor(dim).map((unit, i) => ({
    label: unit,
    kind: CompletionItemKind.Unit,
    detail: unitDetail(unit, dim),
    textEdit: { range: back(position, partial.length), newText: `${lead}${unit}` },
    filterText: unit,
    // A `frequency` is written in hertz far more often than in other energy units.
    sortText: `${key === 'frequency' && unit.endsWith('Hz') ? 0 : 1}${String(i).padStart(3, '0')}`,
  }));
}

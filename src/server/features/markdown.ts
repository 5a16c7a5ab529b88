/**
 * Markdown building shared by hovers, inlay-hint tooltips and "Copy Block Results":
 * escaping of user text, small tables, and the results table of a block.
 * The numbers come from the core's display functions, so every surface shows
 * the same strings as the `boltzmark report` table.
 */
import {
  measurementRows,
  betaText,
  clipText,
  enhancementText,
  formatNumber,
  formatTemperature,
  fractionText,
  NAME_CHARS,
  statusWords,
  temperatureSymbol,
  withoutSymbol,
  polarizationText,
  temperatureIntervalText,
  type BlockReport,
  type DisplayOptions,
  type Span,
} from '../../core';
import type { NoteState } from '../state';

/**
 * Escapes text the user wrote (ids, labels, values) so that Markdown and HTML
 * show it literally: `<`, `>` and `&` become entity references (never read as
 * HTML), other ASCII punctuation that CommonMark could read as syntax gets a
 * backslash (`|` cannot end a table cell, `*` starts no emphasis), and line
 * breaks become spaces so the text stays on its line.
 */
export function escapeMarkdown(text: string): string {
  const entities: Readonly<Record<string, string>> = { '<': '&lt;', '>': '&gt;', '&': '&amp;' };
  return text.replace(/\r\n|\r|\n/g, ' ').replace(/[\\`*_{}[\]()<>#+\-.!|~&]/g, (c) => entities[c] ?? `\\${c}`);
}

/** A two-column Markdown table; cells are Markdown already (escape user text before). */
export function markdownTable(header: readonly [string, string], rows: readonly (readonly [string, string])[]): string {
  const line = (cells: readonly string[]): string => `| ${cells.join(' | ')} |`;
  return [line(header), '| :-- | :-- |', ...rows.map(line)].join('\n');
}

/** The note text of a span, without the quotes a YAML scalar may carry. */
export function writtenText(state: NoteState, span: Span): string {
  const raw = state.text.slice(span.start, span.end).trim();
  return /^(["']).*\1$/s.test(raw) ? raw.slice(1, -1) : raw;
}

/** How a block is named: its id (escaped, a long one clipped), or its place in the note. */
export function blockName(b: BlockReport): string {
  return b.meta.id !== null
    ? escapeMarkdown(clipText(b.meta.id, NAME_CHARS))
    : `levels block at line ${b.block.openLine + 1}`;
}

/** A core display string without its leading symbol: `T = 5.61 mK` → `5.61 mK`, `T → 0⁺` → `→ 0⁺`. */
function valuePart(text: string, symbol: string): string {
  if (text.startsWith(`${symbol} = `)) return text.slice(symbol.length + 3);
  return text.startsWith(`${symbol} `) ? text.slice(symbol.length + 1) : text;
}

/** The label of P in tables: for spins above 1/2 the vector polarization; for a degenerate transition P per degeneracy. */
function polarizationLabel(b: BlockReport): string {
  const spin = b.input?.spin?.species.spin ?? 0.5;
  if (spin > 0.5) return 'P = ⟨I\\_z⟩/I';
  const levels = b.input?.levels;
  return !b.input?.spin && levels?.length === 2 && levels[0].g !== levels[1].g ? 'P per degeneracy' : 'P';
}

/**
 * The rows of a valid block's results, in the order of the settings (β first
 * when asked): T, β, P, P_th at the lattice temperature as written, ε, S/(Nk).
 * Unknown quantities are left out rather than shown as dashes.
 */
export function resultRows(state: NoteState, b: BlockReport, o: DisplayOptions): [string, string][] {
  const r = b.results;
  if (!r) return [];
  // Each trade's word: spin temperature for spins, excitation temperature (T_ex) for lines and transitions;
  // `|T| ≥ …` of a saturated block: a bare `|` would end the table cell.
  const sym = temperatureSymbol(r);
  const t: [string, string] = [
    sym === 'T' ? 'T' : `T\\_ex (${r.trade.temperatureName})`,
    withoutSymbol(temperatureIntervalText(r, o)).replace(/\|/g, '\\|'),
  ];
  const beta: [string, string] = ['β', valuePart(betaText(r, o), 'β')];
  // A bare time series has no temperature; its rows are the fit's.
  const rows: [string, string][] =
    !r.beta && !r.limit && r.series ? [] : o.temperature === 'beta-first' ? [beta, t] : [t, beta];
  if (r.polarization) rows.push([polarizationLabel(b), polarizationText(r, o)]);
  const lattice = b.input?.lattice;
  if (r.thermalPolarization !== null && lattice) {
    // Three digits, as the report table prints P_th: it is a derived reference value.
    // A lattice taken from a thermal reference run is written there, not here: its value and the run's id.
    const run = r.signal?.thermalRun;
    const where = run
      ? `${formatTemperature(lattice.value, lattice.uncertainty, { digits: o.digits })} of ${escapeMarkdown(run.id)}`
      : escapeMarkdown(writtenText(state, b.toNote(lattice.span)));
    const pth = { value: r.thermalPolarization, uncertainty: r.uThermalPolarization };
    rows.push([`P\\_th at ${where}`, fractionText(pth, { ...o, digits: Math.min(o.digits, 3) })]);
  }
  if (r.enhancement !== null) rows.push(['ε = P/P\\_th', enhancementText(r.enhancement, o, r.enhancementUncertainty)]);
  if (r.entropy !== null) rows.push(['S/(Nk)', formatNumber(r.entropy, o.digits)]);
  for (const [label, value] of measurementRows(b.input, r, o))
    rows.push([escapeMarkdown(label), escapeMarkdown(value)]);
  return rows;
}

/** The first error of a block, if any. */
export function firstError(b: BlockReport): BlockReport['problems'][number] | undefined {
  return b.problems.find((p) => p.severity === 'error');
}

/**
 * The compact results of a block: a title line (name and status) and the
 * results table, or for an invalid block its first error. Used by the hover
 * (with `explain`, the status in words) and by "Copy Block Results".
 */
export function blockResultsMarkdown(state: NoteState, b: BlockReport, o: DisplayOptions, explain = false): string {
  const title = `**${blockName(b)}** — ${explain ? statusWords(b.status, b.results) : b.status}`;
  if (!b.results) {
    const e = firstError(b);
    return e ? `${title}\n\nError \`${e.code}\`: ${escapeMarkdown(e.message)}` : title;
  }
  return `${title}\n\n${markdownTable(['result', 'value'], resultRows(state, b, o))}`;
}

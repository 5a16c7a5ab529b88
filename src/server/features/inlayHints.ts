/**
 * Inlay hints: the block's short results at the end of its opening fence
 * line (`T = 5.61 mK · P = 31.2 % · ε = 241`), and after each level its
 * population per degeneracy and the pair temperature with the level below.
 * Plain text, no colours; the tooltip carries the longer form.
 */
import { MarkupKind, type InlayHint, type Position, type Range } from 'vscode-languageserver';
import { formatNumber, shortSummary, type BlockReport, type DisplayOptions } from '../../core';
import type { Settings } from '../../shared/settings';
import { blocksBetween, displayOptions, type NoteState } from '../state';
import { pairTemperature, type PairLevel } from '../../core';
import { pairTemperatureText } from './hover';
import { blockResultsMarkdown, firstError } from './markdown';

/** The hints whose position lies in the range; none when hints are switched off. */
export function inlayHints(state: NoteState, range: Range, settings: Settings): InlayHint[] {
  if (!settings.inlayHints) return [];
  const o = displayOptions(settings);
  const hints: InlayHint[] = [];
  const from = state.lines.lineStart(range.start.line);
  const to = state.lines.lineEnd(range.end.line);
  for (const b of blocksBetween(state, from, to)) {
    const first = state.lines.positionAt(b.block.openStart).line;
    const last = state.lines.positionAt(b.block.blockEnd).line;
    if (last < range.start.line || first > range.end.line) continue;
    hints.push(blockHint(state, b, o), ...levelHints(state, b, o));
  }
  return hints.filter((h) => inRange(h.position, range));
}

function inRange(p: Position, r: Range): boolean {
  const before = (a: Position, b: Position): boolean =>
    a.line < b.line || (a.line === b.line && a.character <= b.character);
  return before(r.start, p) && before(p, r.end);
}

/**
 * The block's hint, at the end of the opening fence line: that line holds
 * only the fence, so the hint never crowds the YAML and stays put while the
 * body is edited.
 */
function blockHint(state: NoteState, b: BlockReport, o: DisplayOptions): InlayHint {
  const position = state.lines.positionAt(b.block.openEnd);
  if (!b.results) {
    const e = firstError(b);
    return {
      position,
      label: e ? `invalid: ${e.code}` : 'invalid',
      paddingLeft: true,
      ...(e ? { tooltip: e.message } : {}),
    };
  }
  return {
    position,
    label: blockLabel(b, o),
    paddingLeft: true,
    tooltip: { kind: MarkupKind.Markdown, value: blockResultsMarkdown(state, b, o, true) },
  };
}

/** Longest hint, in characters: short enough not to wrap or be cut in an editor of ordinary width. */
export const HINT_WIDTH = 40;

/** Joins ` · `-separated parts, dropping trailing ones (never the first) until the label fits {@link HINT_WIDTH}. */
export function fitHint(parts: readonly string[]): string {
  const kept = [parts[0] ?? ''];
  for (const p of parts.slice(1)) {
    const next = [...kept, p].join(' · ');
    if ([...next].length > HINT_WIDTH) break;
    kept.push(p);
  }
  return kept.join(' · ');
}

/**
 * The block's label: the short summary, except for a non-thermal scheme, whose fitted T is no
 * temperature of the levels: it says so and whether a pair is inverted (the hover has the fit).
 */
function blockLabel(b: BlockReport, o: DisplayOptions): string {
  const r = b.results!;
  if (r.status === 'non-thermal') {
    const n = r.invertedPairs.length;
    return fitHint(['non-thermal, no single T', ...(n > 0 ? [n === 1 ? 'inverted pair' : `${n} pairs inverted`] : [])]);
  }
  return fitHint(shortSummary(r, o).split(' · '));
}

/** A level's name for a hint: its label cut to 6 characters, or its number from the bottom. */
function shortName(label: string | null, i: number): string {
  if (label === null) return `${i + 1}`;
  const chars = [...label];
  return chars.length <= 6 ? label : `${chars.slice(0, 5).join('')}…`;
}

/**
 * One hint per measured level: after the line of an explicit level item, or
 * right after a value of a `populations` list. Levels that share one span (a
 * transition given by its `ratio`) get none: the hint could not say which is which.
 */
function levelHints(state: NoteState, b: BlockReport, o: DisplayOptions): InlayHint[] {
  const input = b.input;
  const fractions = b.results?.fractions;
  if (input?.lines && b.results?.trade.plot) return lineHints(state, b, o);
  if (!input || !fractions) return [];
  const short: DisplayOptions = { ...o, digits: Math.min(o.digits, 3) };
  const levels = input.levels;
  const spans = levels.map((l) => (l.span ? b.toNote(l.span) : null));
  const starts = spans.map((s) => s?.start);
  const out: InlayHint[] = [];
  // Normalised when the populations as written do not already sum to 1 (counts, densities, or a slip).
  const written = levels.map((l) => l.population);
  const sum = written.reduce<number>((a, p) => a + (p ?? NaN), 0);
  const normalised = !(Math.abs(sum - 1) <= 1e-6);
  levels.forEach((level, i) => {
    const span = spans[i];
    if (!span || starts.indexOf(span.start) !== starts.lastIndexOf(span.start)) return;
    const pair = (k: number): PairLevel => ({ energy: levels[k].energy, g: levels[k].g, population: fractions[k] });
    const name = (k: number): string => levels[k].label ?? `level ${k + 1}`;
    const ng = `n/g = ${formatNumber(fractions[i] / level.g, short.digits)}`;
    const parts = [`${ng}${normalised ? ' (normalised)' : ''}`];
    let tooltip = `${name(i)}: population per degeneracy n/g = ${formatNumber(fractions[i] / level.g, o.digits)}${normalised ? ' (the populations as given, normalised to sum 1)' : ' (the populations sum to 1 as given)'}.`;
    // With two levels the pair temperature is the block's own T, already in the block hint.
    if (i > 0 && levels.length > 2) {
      const t = pairTemperature(pair(i - 1), pair(i));
      const which = `${shortName(levels[i].label, i)}–${shortName(levels[i - 1].label, i - 1)}`;
      const inverted = t.kind === 'value' && t.kelvin < 0;
      parts.push(`T(${which}) = ${pairTemperatureText(t, short)}${inverted ? ' inverted' : ''}`);
      tooltip += ` Excitation temperature of the pair ${name(i)}–${name(i - 1)} (this level and the one below): ${pairTemperatureText(t, o)}${inverted ? ', negative: the pair is inverted' : ''}.`;
    }
    // The pair temperature matters more than the reminder: when both do not fit, the reminder goes (it
    // stays on the lowest level, which has no pair, and in every tooltip).
    const whole = parts.join(' · ');
    const label =
      [...whole].length <= HINT_WIDTH || parts.length === 1 ? fitHint(parts) : fitHint([ng, ...parts.slice(1)]);
    out.push({
      position: levelHintPosition(state, input.form === 'levels', span, spans),
      label,
      paddingLeft: true,
      tooltip,
    });
  });
  return out;
}

/**
 * One hint per emission or radio line, after its item: its distance from the
 * fit (Δy), and for a flagged line on which side of the refitted line it lies.
 * Lines are intensities, not populations, so no n/g is shown.
 */
function lineHints(state: NoteState, b: BlockReport, o: DisplayOptions): InlayHint[] {
  const input = b.input!;
  const plot = b.results!.trade.plot!;
  const spans = input.levels.map((l) => (l.span ? b.toNote(l.span) : null));
  const out: InlayHint[] = [];
  for (const p of plot.points) {
    const span = spans[p.index];
    if (!span) continue;
    const delta = `Δy = ${p.residual > 0 ? '+' : ''}${formatNumber(p.residual, Math.min(o.digits, 2))}`;
    out.push({
      position: levelHintPosition(state, true, span, spans),
      label: p.flag ? `outlier, ${p.flag} · ${delta}` : delta,
      paddingLeft: true,
      tooltip: `${p.label ?? `line ${p.index + 1}`}: ${plot.ordinate} − fit = ${formatNumber(p.residual, o.digits)}${p.flag ? `; flagged, ${p.flag} the line refitted without the flagged lines` : ''}.`,
    });
  }
  return out;
}

/**
 * Where a level's hint goes: the end of the last line of an explicit level
 * item (unless another item continues on that line), else right after the value.
 */
function levelHintPosition(
  state: NoteState,
  wholeLine: boolean,
  span: { start: number; end: number },
  all: readonly ({ start: number } | null)[],
): Position {
  const end = state.lines.positionAt(span.end);
  if (!wholeLine) return end;
  const line = state.lines.positionAt(Math.max(span.start, span.end - 1)).line;
  const lineEnd = state.lines.lineEnd(line);
  const crowded = all.some((s) => s !== null && s.start >= span.end && s.start < lineEnd);
  return crowded ? end : state.lines.positionAt(lineEnd);
}

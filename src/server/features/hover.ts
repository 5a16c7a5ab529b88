/**
 * Hovers inside `levels` blocks. Three kinds, most specific first:
 * a quantity (a field, frequency, gap, lattice temperature or level energy,
 * shown converted), a single level (its populations and pairwise excitation
 * temperatures), and the block as a whole (its results, status, fit and
 * inverted pairs).
 */
import { MarkupKind, type Hover, type Position } from 'vscode-languageserver';
import {
  linePointRows,
  pairTemperature,
  RESIDUAL_TOLERANCE,
  type PairLevel,
  type PairTemperature,
  BLOCK_KEYS,
  convert,
  formatMeasured,
  formatNumber,
  formatTemperature,
  KELVIN_PER_EV,
  KELVIN_PER_HERTZ,
  KELVIN_PER_WAVENUMBER,
  larmorFrequencyHz,
  LEVEL_KEYS,
  lookupSpecies,
  parseQuantity,
  zeemanSpacingKelvin,
  type BlockReport,
  type Dimension,
  type DisplayOptions,
  type Span,
  type SpinSpecies,
} from '../../core';
import type { Settings } from '../../shared/settings';
import { blockAt, displayOptions, toOffset, toRange, type NoteState } from '../state';
import { blockName, blockResultsMarkdown, escapeMarkdown, markdownTable, writtenText } from './markdown';
import { birgeText, budgetMarkdown, degeneratePolarizationText } from './uncertainty';

/** The hover at a position, or null outside every block. */
export function hover(state: NoteState, position: Position, settings: Settings): Hover | null {
  const offset = toOffset(state.lines, position);
  const b = blockAt(state, offset);
  if (!b) return null;
  const o = displayOptions(settings);
  const found =
    quantityHover(state, b, offset, o) ??
    lineHover(b, offset, o) ??
    levelHover(b, offset, o) ??
    blockHover(state, b, o);
  return { contents: { kind: MarkupKind.Markdown, value: found.value }, range: toRange(state.lines, found.span) };
}

/** True when the offset lies on one of the span's characters. */
function within(span: Span, offset: number): boolean {
  return offset >= span.start && offset < span.end;
}

/** The whole block's hover: results table, what P means, the fit and the inverted pairs. */
function blockHover(state: NoteState, b: BlockReport, o: DisplayOptions): { value: string; span: Span } {
  const span = { start: b.block.openStart, end: b.block.blockEnd };
  const parts = [blockResultsMarkdown(state, b, o, true)];
  const r = b.results;
  if (!r || !b.input) {
    const others = b.problems.length - 1;
    if (others > 0) parts.push(`${others} more problem${others === 1 ? '' : 's'} in this block.`);
    return { value: parts.join('\n\n'), span };
  }
  const input = b.input;
  const degenerate = r.polarization ? degeneratePolarizationText(b, r) : null;
  if (degenerate) parts.push(degenerate);
  else if (r.polarization) {
    const sign = input.spin
      ? 'P > 0 at positive spin temperature, whatever the sign of γ.'
      : 'P > 0 at positive temperature.';
    parts.push(
      input.spin && input.spin.species.spin > 0.5
        ? `P is the vector polarization ⟨I\\_z⟩/I under one spin temperature; ${sign}`
        : `P = (n\\_lower − n\\_upper)/(n\\_lower + n\\_upper), levels ordered by energy; ${sign}`,
    );
  }
  // A thermal polarization means something for spins in a field (P_th of the lattice); for an optical
  // transition at kT far below its gap it is 1 and ε says nothing, so no lattice is suggested there.
  if (r.thermalPolarization === null && r.polarization && !input.lattice && input.spin)
    parts.push('Add `lattice:` to get P\\_th and ε.');
  if (r.fit) parts.push(fitText(r.fit, input.lines ? (r.trade.plot?.ordinate ?? 'ln(I/gA)') : null));
  const birge = birgeText(r);
  if (birge) parts.push(birge);
  const budget = budgetMarkdown(state, b, r);
  if (budget) parts.push(budget);
  if (input.levels.length >= 3 && r.invertedPairs.length > 0) {
    const name = (i: number): string => escapeMarkdown(input.levels[i].label ?? `level ${i + 1}`);
    const shown = r.invertedPairs.slice(0, 6).map((p) => `${name(p.lower)} ↔ ${name(p.upper)}`);
    const more = r.invertedPairs.length - shown.length;
    parts.push(
      `Inverted pairs (more population per degeneracy above): ${shown.join(', ')}${more > 0 ? `, and ${more} more` : ''}.`,
    );
  }
  return { value: parts.join('\n\n'), span };
}

/**
 * The residual rule's limit, ln 1.05: without uncertainties a level more than
 * 5 % off the fitted line per degeneracy makes the block non-thermal
 * (docs/format.md#status). Mirrors the core's rule, which the core's index does not export.
 */

/** One line on the Boltzmann fit: χ² test when weighted, the 5 % residual rule otherwise (docs/format.md#status). */
function fitText(fit: NonNullable<NonNullable<BlockReport['results']>['fit']>, ordinate: string | null): string {
  const verdict = fit.consistent ? 'consistent with one temperature' : 'not consistent with one temperature';
  // Lines are measured as intensities: their weights and residuals are spoken of as such.
  const [weights, quantity] = ordinate !== null ? ['u(I)/I', ordinate] : ['u(n)/n', 'ln(n/g)'];
  if (fit.weighted) {
    const critical = fit.critical !== null ? `; 1 % critical value ${formatNumber(fit.critical, 3)}` : '';
    return `Boltzmann fit weighted by ${weights}: χ²/dof = ${formatNumber(fit.chi2, 3)}/${fit.dof}${critical}: ${verdict}.`;
  }
  // A loop, not a spread: a series of a few hundred thousand points would overflow the stack.
  const worst = fit.residuals.reduce<number>((w, x) => (x === null ? w : Math.max(w, Math.abs(x))), 0);
  const used = fit.residuals.reduce<number>((n, x) => (x === null ? n : n + 1), 0);
  const which =
    fit.stated > 0
      ? `unweighted, ${fit.stated} of ${used} ${ordinate !== null ? 'lines' : 'levels'} with ${weights} (u(β) takes them in, with the scatter they leave)`
      : 'without uncertainties';
  return `Boltzmann fit ${which} (residual rule): largest \\|Δ ${quantity}\\| = ${formatNumber(worst, 3)}, limit ln 1.05 = ${formatNumber(RESIDUAL_TOLERANCE, 3)}: ${verdict}.`;
}

// ---- one level ----

/** A pair temperature as shown, e.g. `164.3 K`, `−14.4 K`, `±∞`, `0⁺`. */
export function pairTemperatureText(t: PairTemperature, o: DisplayOptions): string {
  switch (t.kind) {
    case 'value':
      return formatTemperature(t.kelvin, null, {
        digits: o.digits,
        mode: o.temperature === 'kelvin' ? 'kelvin' : 'auto',
      });
    case 'infinite':
      return '±∞';
    case 'zero':
      return t.sign > 0 ? '0⁺' : '0⁻';
    default:
      return '—';
  }
}

/** The level whose item or population value holds the offset; levels sharing one span (a `ratio`) are not told apart. */
function levelAt(b: BlockReport, offset: number): number | null {
  const levels = b.input?.levels ?? [];
  for (let i = 0; i < levels.length; i++) {
    const s = levels[i].span ?? levels[i].populationSpan;
    if (!s || !within(b.toNote(s), offset)) continue;
    const shared = levels.some(
      (l, j) => j !== i && l.span !== null && l.span.start === s.start && l.span.end === s.end,
    );
    return shared ? null : i;
  }
  return null;
}

/**
 * The hover of one emission or radio line: its point on the Boltzmann plot
 * (or rotation diagram), spoken of as intensities, not populations: E_u, the
 * ordinate with its uncertainty (√N for photon counts), the residual and
 * whether the line is flagged, above or below the refitted line.
 */
function lineHover(b: BlockReport, offset: number, o: DisplayOptions): { value: string; span: Span } | null {
  if (!b.input?.lines || !b.results) return null;
  const i = levelAt(b, offset);
  if (i === null) return null;
  const rows = linePointRows(b.results, i, o);
  const level = b.input.levels[i];
  if (!rows || !level.span) return null;
  const name = escapeMarkdown(level.label ?? `line ${i + 1}`);
  const what = b.input.lines.detector === 'radiometer' ? 'rotation diagram' : 'Boltzmann plot';
  const title = `**${name}** · its point on the ${what} · ${blockName(b)}`;
  const table = markdownTable(
    ['line', 'value'],
    rows.map(([k, v]) => [escapeMarkdown(k), escapeMarkdown(v)] as [string, string]),
  );
  return {
    value: `${title}

${table}`,
    span: b.toNote(level.span),
  };
}

/** The hover of one level: energy, g, population, n/g and the pair temperatures with its neighbours. */
function levelHover(b: BlockReport, offset: number, o: DisplayOptions): { value: string; span: Span } | null {
  const i = levelAt(b, offset);
  const fractions = b.results?.fractions;
  if (i === null || !b.input || !fractions) return null;
  const levels = b.input.levels;
  const level = levels[i];
  const name = (k: number): string => escapeMarkdown(levels[k].label ?? `level ${k + 1}`);
  const pair = (k: number): PairLevel => ({ energy: levels[k].energy, g: levels[k].g, population: fractions[k] });
  const rows: [string, string][] = [
    ['E', energyText(level.energy, b.input.energyUnit, o, b.input.form === 'levels')],
    ['g', String(level.g)],
  ];
  const share = `fraction ${formatNumber(fractions[i], o.digits)}`;
  rows.push([
    'population',
    level.population !== null
      ? `${formatMeasured(level.population, level.uPopulation, { digits: o.digits })} (${share})`
      : `${share}, implied by β`,
  ]);
  rows.push(['n/g', formatNumber(fractions[i] / level.g, o.digits)]);
  if (i > 0)
    rows.push([`T with ${name(i - 1)} (below)`, pairTemperatureText(pairTemperature(pair(i - 1), pair(i)), o)]);
  if (i + 1 < levels.length)
    rows.push([`T with ${name(i + 1)} (above)`, pairTemperatureText(pairTemperature(pair(i), pair(i + 1)), o)]);
  const residual = b.results?.fit?.residuals[i];
  if (residual !== undefined && residual !== null)
    rows.push(['Δ ln(n/g) from the fit', `${residual > 0 ? '+' : ''}${formatNumber(residual, 3)}`]);
  const title = `**${name(i)}** · level ${i + 1} of ${levels.length} from the bottom · ${blockName(b)}`;
  const formula =
    'Pair temperature T = (E\\_u − E\\_l)/ln[(n\\_l/g\\_l)/(n\\_u/g\\_u)]; negative when the pair is inverted.';
  const span = b.toNote((level.span ?? level.populationSpan)!);
  return { value: `${title}\n\n${markdownTable(['level', 'value'], rows)}\n\n${formula}`, span };
}

/** A level energy in the block's own unit (when it converts linearly) and as E/k. */
function energyText(kelvin: number, unit: string | null, o: DisplayOptions, typed: boolean): string {
  const k = formatTemperature(kelvin, null, { digits: o.digits, mode: o.temperature === 'kelvin' ? 'kelvin' : 'auto' });
  const per = unit !== null && unit !== 'K' ? kelvinPer(unit) : null;
  if (per === null) return k;
  // A typed energy (an explicit `levels` list) back in the block's unit is what the user typed: never
  // rounded below the digits they wrote. Energies the block computes (Zeeman levels) keep the usual digits.
  const own = kelvin / per;
  return `${formatNumber(own, typed ? Math.max(o.digits, keptDigits(own)) : o.digits)} ${escapeMarkdown(prettyUnit(unit!))} = ${k}`;
}

/**
 * Significant digits of a number read back from a conversion (12 digits, then trailing zeros dropped):
 * 11502 → 5, 0.0250 → 2, 107496.4166 → 10. Enough to show a typed value as typed after E/k and back.
 */
export function keptDigits(x: number): number {
  if (!Number.isFinite(x) || x === 0) return 1;
  const mantissa = Math.abs(x).toPrecision(12).split('e')[0].replace('.', '').replace(/^0+/, '').replace(/0+$/, '');
  return Math.max(1, mantissa.length);
}

/** Significant digits of the number a quantity was written with: `11502 cm-1` → 5, `2.80e-19 cm2` → 3. */
export function writtenDigits(written: string): number {
  const m = /^\s*[+-]?(\d*)(?:\.(\d*))?/.exec(written);
  if (!m) return 1;
  const digits = (m[1] + (m[2] ?? '')).replace(/^0+/, '');
  // Trailing zeros of an integer (11500) are ambiguous; those after a decimal point (2.50) are significant.
  const counted = m[2] === undefined ? digits.replace(/0+$/, '') || digits : digits;
  return Math.max(1, counted.length);
}

/** Kelvin (E/k) per one `unit` of energy, or null when the unit is not a linear energy unit. */
function kelvinPer(unit: string): number | null {
  const q = parseQuantity(`1 ${unit}`);
  if ('problem' in q) return null;
  const c = convert(q.quantity, 'energy');
  return 'problem' in c ? null : c.value;
}

/** `cm-1` → `cm⁻¹`, `cm-3` → `cm⁻³`, for display only. */
function prettyUnit(unit: string): string {
  return unit
    .replace(/^\/cm$/, 'cm-1')
    .replace(/\^?-1$/, '⁻¹')
    .replace(/\^?-3$/, '⁻³');
}

// ---- one quantity ----

/** Top-level keys holding a quantity, and what they measure. */
const QUANTITY_KEYS: ReadonlyArray<readonly [string, Dimension]> = [
  ['field', 'field'],
  ['frequency', 'energy'],
  ['gap', 'wavelengthEnergy'],
  ['lattice', 'temperature'],
];

/** The quantity under the offset: a top-level value, or a level's `energy`. */
function quantityAt(
  state: NoteState,
  b: BlockReport,
  offset: number,
): { key: string; dim: Dimension; span: Span } | null {
  for (const [key, dim] of QUANTITY_KEYS) {
    const k = b.meta.keys.get(key);
    const span = k ? b.toNote(k.value) : null;
    if (span && within(span, offset)) return { key, dim, span };
  }
  if (b.input?.form !== 'levels') return null;
  for (const level of b.input.levels) {
    const item = level.span ? b.toNote(level.span) : null;
    if (!item || !within(item, offset)) continue;
    const m = /(^|[\s{,])energy[ \t]*:[ \t]*("[^"\n]*"|'[^'\n]*'|[^,}\n\r#]*[^,}\s#])/.exec(
      state.text.slice(item.start, item.end),
    );
    if (!m) return null;
    const start = item.start + m.index + m[0].length - m[2].length;
    const span = { start, end: start + m[2].length };
    return within(span, offset) ? { key: 'energy', dim: 'energy', span } : null;
  }
  return null;
}

/** The hover of a quantity: its value converted to the units spectroscopists compare. */
function quantityHover(
  state: NoteState,
  b: BlockReport,
  offset: number,
  o: DisplayOptions,
): { value: string; span: Span } | null {
  const q = quantityAt(state, b, offset);
  if (!q) return null;
  const written = writtenText(state, q.span);
  const parsed = parseQuantity(written);
  const c = 'problem' in parsed ? null : convert(parsed.quantity, q.dim);
  if (!c || 'problem' in c) return null;
  const doc = (q.key === 'energy' ? LEVEL_KEYS : BLOCK_KEYS).find((d) => d.key === q.key)?.summary ?? '';
  const head = `**${q.key}** ${escapeMarkdown(written)} — ${doc}`;
  // Every row is the canonical value times a constant factor, so the uncertainty scales with it.
  // The row in the unit the user typed keeps every digit they typed: `energy: 11502 cm-1` shows 11502 cm⁻¹,
  // not 11500; the other rows are conversions, shown with the usual digits.
  const typedUnit = 'problem' in parsed || parsed.quantity.unit === null ? null : prettyUnit(parsed.quantity.unit);
  const show: Shown = (factor, unit) => {
    const digits = unit === typedUnit ? Math.max(o.digits, writtenDigits(written)) : o.digits;
    const u = c.uncertainty === null ? null : c.uncertainty * Math.abs(factor);
    return unit === 'K'
      ? formatTemperature(c.value * factor, u, { digits })
      : `${formatMeasured(c.value * factor, u, { digits })} ${unit}`;
  };
  const species = speciesOf(state, b);
  let rows: [string, string][];
  if (q.dim === 'field') rows = fieldRows(species, c.value, show);
  else if (q.dim === 'temperature') rows = energyRows('kT', show);
  else {
    rows = energyRows('E', show);
    if (q.key === 'frequency' && species)
      rows.push([
        `field for ${escapeMarkdown(species.symbol)} (bare nucleus)`,
        show(1 / zeemanSpacingKelvin(species, 1), 'T'),
      ]);
  }
  return { value: `${head}\n\n${markdownTable(['as', 'value'], rows)}`, span: q.span };
}

/** The hovered quantity times a factor, in a unit, with its uncertainty scaled alike. */
type Shown = (factor: number, unit: string) => string;

/** An energy (or kT) given in kelvin as E/k, E/hc, E/h and E, in K, cm⁻¹, GHz and eV (exact SI constants). */
function energyRows(symbol: string, show: Shown): [string, string][] {
  return [
    [`${symbol}/k`, show(1, 'K')],
    [`${symbol}/hc`, show(1 / KELVIN_PER_WAVENUMBER, 'cm⁻¹')],
    [`${symbol}/h`, show(1 / (KELVIN_PER_HERTZ * 1e9), 'GHz')],
    [symbol, show(1 / KELVIN_PER_EV, 'eV')],
  ];
}

/** A field in tesla as the Larmor frequency ν = |γ|B/2π and Zeeman spacing hν/k of the block's species (bare-nucleus γ). */
function fieldRows(species: SpinSpecies | null, tesla: number, show: Shown): [string, string][] {
  const rows: [string, string][] = [['B', show(1, 'T')]];
  const nu = species ? larmorFrequencyHz(species, tesla) : 0;
  if (!species || !(nu > 0)) return rows;
  const power = Math.min(12, Math.max(0, 3 * Math.floor(Math.log10(nu) / 3)));
  const unit = ({ 0: 'Hz', 3: 'kHz', 6: 'MHz', 9: 'GHz', 12: 'THz' } as Record<number, string>)[power];
  rows.push([
    `Larmor frequency of ${escapeMarkdown(species.symbol)}`,
    show(larmorFrequencyHz(species, 1) / 10 ** power, unit),
  ]);
  rows.push(['Zeeman spacing hν/k', show(zeemanSpacingKelvin(species, 1), 'K')]);
  return rows;
}

/** The block's spin species: from its input, or from `system:` when other keys have errors. */
function speciesOf(state: NoteState, b: BlockReport): SpinSpecies | null {
  if (b.input?.spin) return b.input.spin.species;
  const k = b.meta.keys.get('system');
  const found = k ? lookupSpecies(writtenText(state, b.toNote(k.value))) : null;
  return found && 'species' in found ? found.species : null;
}

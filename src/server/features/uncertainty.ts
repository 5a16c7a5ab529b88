/**
 * The hover's uncertainty parts: the budget (which input's stated
 * uncertainty adds how much to each result, GUM JCGM 100:2008 §5.1.3), the
 * Birge-scaled u(β) of an inconsistent weighted fit, and what P means for a
 * degenerate transition. The numbers come from the core's analysis.
 */
import { formatNumber, type BlockReport, type BudgetLine } from '../../core';
import type { NoteState } from '../state';
import { escapeMarkdown, writtenText } from './markdown';

type Results = NonNullable<BlockReport['results']>;
type Column = 'beta' | 'polarization' | 'thermalPolarization' | 'enhancement';

const HEADS: Readonly<Record<Column, string>> = {
  beta: 'u(β) / K⁻¹',
  polarization: 'u(P)',
  thermalPolarization: 'u(P\\_th)',
  enhancement: 'u(ε)',
};

/** The name of a budget line as the note wrote the input, e.g. `lattice 298.15 ± 3 K`. */
function lineName(state: NoteState, b: BlockReport, l: BudgetLine): string {
  const input = b.input!;
  const written = (key: string): string => {
    const at = b.meta.keys.get(key);
    return at ? `\`${key}\` ${escapeMarkdown(writtenText(state, b.toNote(at.value)))}` : `\`${key}\``;
  };
  if (l.source === 'lattice') return written('lattice');
  if (l.source === 'reference-spacing')
    return `the field of the thermal reference ${escapeMarkdown(input.signal?.thermalRun?.id ?? '')}`;
  if (l.source === 'energies' || (l.source === 'spacing' && input.form === 'levels')) return 'the level energies';
  if (l.source === 'spacing')
    return written(input.spin ? (b.meta.keys.has('frequency') ? 'frequency' : 'field') : 'gap');
  if (input.signal) return 'the signals’ noise';
  if (input.lines) return 'the line intensities';
  if (input.ratio) return '`ratio`';
  if (input.polarization) return '`polarization`';
  if (b.results?.fit && !b.results.fit.weighted) return 'the scatter about the Boltzmann fit';
  return 'the populations';
}

/** The total u of a column, √Σ line² (GUM §5.1.2), or null when no line has it. */
function total(lines: readonly BudgetLine[], c: Column): number | null {
  const parts = lines.map((l) => l[c]).filter((v): v is number => v !== null);
  return parts.length === 0 ? null : Math.hypot(...parts);
}

/**
 * The budget as a Markdown table: one row per input with a stated
 * uncertainty, each cell |c·u| and its share of u², or null when fewer than
 * two inputs carry one (a budget of one line says nothing the results do not).
 */
export function budgetMarkdown(state: NoteState, b: BlockReport, r: Results): string | null {
  const lines = r.budget;
  if (lines.length < 2) return null;
  const columns = (['beta', 'polarization', 'thermalPolarization', 'enhancement'] as const).filter((c) => {
    const t = total(lines, c);
    return t !== null && t > 0;
  });
  if (columns.length === 0) return null;
  const cell = (l: BudgetLine, c: Column): string => {
    const v = l[c];
    const t = total(lines, c)!;
    if (v === null) return '—';
    const share = Math.round((100 * v * v) / (t * t));
    return `${formatNumber(v, 2)} (${share} %)`;
  };
  const head = `| input | ${columns.map((c) => HEADS[c]).join(' | ')} |`;
  const rule = `| :-- | ${columns.map(() => '--:').join(' | ')} |`;
  const rows = lines.map((l) => `| ${lineName(state, b, l)} | ${columns.map((c) => cell(l, c)).join(' | ')} |`);
  return [
    'Uncertainty budget: each input’s contribution |c·u| and its share of u² (first order, GUM JCGM 100:2008 §5.1.2–5.1.3):',
    '',
    head,
    rule,
    ...rows,
  ].join('\n');
}

/** For a weighted fit with χ²/dof > 1: which u(β) is shown, and u(β) scaled by the Birge ratio. */
export function birgeText(r: Results): string | null {
  const birge = r.birge;
  if (!birge || !r.fit || birge.beta.uncertainty === null) return null;
  const shown = r.beta?.uncertainty;
  return (
    `u(β) shown${shown != null ? ` (${formatNumber(shown, 2)} K⁻¹)` : ''} comes from the stated uncertainties of the populations. ` +
    `With χ²/dof = ${formatNumber(r.fit.chi2 / r.fit.dof, 3)} > 1 the data scatter more than they say; ` +
    `scaled by the Birge ratio √(χ²/dof) = ${formatNumber(birge.ratio, 3)} (common practice for inconsistent data), ` +
    `u(β) = ${formatNumber(birge.beta.uncertainty, 2)} K⁻¹.`
  );
}

/**
 * What P means for a single transition whose degeneracies differ: the
 * difference per degeneracy, and the raw (n_l − n_u)/(n_l + n_u) beside it, which
 * can have the other sign at a positive temperature.
 */
export function degeneratePolarizationText(b: BlockReport, r: Results): string | null {
  const input = b.input;
  if (!input || input.spin || input.levels.length !== 2 || !r.fractions) return null;
  const [lo, up] = input.levels;
  if (lo.g === up.g) return null;
  const raw = r.fractions[0] - r.fractions[1];
  return (
    `P is the difference per degeneracy, (n\\_l/g\\_l − n\\_u/g\\_u)/(n\\_l/g\\_l + n\\_u/g\\_u) with g = [${lo.g}, ${up.g}]: ` +
    `P > 0 exactly when T > 0. The raw (n\\_l − n\\_u)/(n\\_l + n\\_u) is ${formatNumber(raw, 3)}, ` +
    'which changes sign at a positive temperature when g\\_l ≠ g\\_u.'
  );
}

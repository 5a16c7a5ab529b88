/**
 * The results of one block as HTML for the Markdown preview: a compact table
 * with the same GUM formatting and status words as the hover, and the S(E)
 * sparkline. Every string from the note is escaped.
 */
import type { BlockResults } from '../../analysis/results';
import type { BlockInput, BlockMeta } from '../../block/input';
import { measurementRows } from '../measurementSummary';
import {
  betaText,
  DEFAULT_DISPLAY,
  enhancementText,
  fractionText,
  statusWords,
  temperatureSymbol,
  withoutSymbol,
  polarizationText,
  temperatureIntervalText,
  type DisplayOptions,
} from '../summary';
import type { Problem, Status } from '../../types';
import { formatNumber } from '../numbers';
import { escapeText, sparklineSvg } from './sparkline';

/** What the preview needs of an analysed block. */
export interface PreviewBlock {
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  readonly problems: readonly Problem[];
}

/** HTML of the results that follow a `levels` block in the preview. */
export function resultsHtml(b: PreviewBlock, o: DisplayOptions = DEFAULT_DISPLAY): string {
  const error = b.problems.find((p) => p.severity === 'error');
  const status: Status = error || !b.results ? 'invalid' : b.results.status;
  const name = b.meta.id ?? 'levels block';
  const head = `<p class="boltzmark-title"><strong>${escapeText(name)}</strong> — <span class="boltzmark-status boltzmark-status-${status}">${escapeText(statusWords(status, b.results))}</span></p>`;
  if (error || !b.results) {
    const msg = error ? `<code>${escapeText(error.code)}</code>: ${escapeText(error.message)}` : 'no results';
    return `<div class="boltzmark-results">${head}<p class="boltzmark-error">${msg}</p></div>`;
  }
  const r = b.results;
  const rows = tableRows(b, r, o)
    .map(([k, v]) => `<tr><th scope="row">${escapeText(k)}</th><td>${escapeText(v)}</td></tr>`)
    .join('');
  const svg = sparkline(b, r, name);
  return `<div class="boltzmark-results">${head}<table class="boltzmark-table"><tbody>${rows}</tbody></table>${svg ?? ''}</div>`;
}

function tableRows(b: PreviewBlock, r: BlockResults, o: DisplayOptions): [string, string][] {
  const rows: [string, string][] = [];
  if (r.beta || r.limit) {
    const sym = temperatureSymbol(r);
    rows.push([
      sym === 'T' ? 'T' : `${sym} (${r.trade.temperatureName})`,
      withoutSymbol(temperatureIntervalText(r, o)),
    ]);
    rows.push(['β', betaText(r, o).replace(/^β = /, '')]);
  }
  if (r.polarization) rows.push(['P', polarizationText(r, o)]);
  if (r.thermalPolarization !== null)
    rows.push([
      'P_th',
      fractionText(
        { value: r.thermalPolarization, uncertainty: r.uThermalPolarization },
        { ...o, digits: Math.min(o.digits, 3) },
      ),
    ]);
  if (r.enhancement !== null) rows.push(['ε', enhancementText(r.enhancement, o, r.enhancementUncertainty)]);
  if (r.entropy !== null) rows.push(['S/(Nk)', formatNumber(r.entropy, o.digits)]);
  if (r.fit)
    rows.push([
      'fit',
      `χ²/dof = ${formatNumber(r.fit.chi2, 3)}/${r.fit.dof}, ${r.fit.consistent ? 'one temperature' : 'not one temperature'}`,
    ]);
  for (const [k, v] of measurementRows(b.input, r, o)) rows.push([k, v]);
  return rows;
}

function sparkline(b: PreviewBlock, r: BlockResults, name: string): string | null {
  const input = b.input;
  if (!input || input.levels.length < 2 || input.lines) return null;
  const point = r.meanEnergy !== null && r.entropy !== null ? { energy: r.meanEnergy, entropy: r.entropy } : null;
  return sparklineSvg(
    input.levels.map((l) => l.energy),
    input.levels.map((l) => l.g),
    point,
    `S(E) of ${name}${point ? ' with the measured state' : ''}`,
  );
}

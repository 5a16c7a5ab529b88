/**
 * Code lenses above each block: "Show Curve View" (or the plot the block has) and "Copy
 * results". Both take the note's URI and the 0-based line of the opening
 * fence, which is how the client's commands find the block again.
 */
import type { CodeLens } from 'vscode-languageserver';
import type { BlockReport } from '../../core';
import type { Settings } from '../../shared/settings';
import { displayOptions, toRange, type NoteState } from '../state';
import { blockResultsMarkdown } from './markdown';

/**
 * The titles of the commands the lenses run, word for word as package.nls.json gives them to the
 * command palette (a test keeps the two equal), so a lens and its command read the same.
 */
export const LENS_TITLES = {
  'boltzmark.showCurve': 'Show Curve View',
  'boltzmark.showSeriesFit': 'Show Series Fit',
  'boltzmark.showBoltzmannPlot': 'Show Boltzmann Plot',
  'boltzmark.copyResults': 'Copy Block Results',
} as const;

/**
 * What the view shows for the block, named as it is: the S(E) curve, or for a block that has none
 * the plot it does have (a time series' fit, the Boltzmann plot of emission lines).
 */
function showLens(b: BlockReport): [string, keyof typeof LENS_TITLES] {
  const r = b.results;
  const command = b.input?.lines
    ? 'boltzmark.showBoltzmannPlot'
    : b.input?.series && r && !r.beta && !r.limit
      ? 'boltzmark.showSeriesFit'
      : 'boltzmark.showCurve';
  return [LENS_TITLES[command], command];
}

/**
 * Two lenses per block. Invalid blocks get them too: lenses that come and go
 * while a line is being typed would make the text below them jump.
 */
export function codeLenses(state: NoteState): CodeLens[] {
  return state.report.blocks.flatMap((b) => {
    const range = toRange(state.lines, { start: b.block.openStart, end: b.block.openEnd });
    const args = [state.uri, b.block.openLine];
    const [title, command] = showLens(b);
    return [
      { range, command: { title, command, arguments: args } },
      {
        range,
        command: { title: LENS_TITLES['boltzmark.copyResults'], command: 'boltzmark.copyResults', arguments: args },
      },
    ];
  });
}

/**
 * The block's results as compact Markdown (title with status, then the
 * table), the same strings as the hover; an invalid block gives its first
 * error. Used by "Copy Block Results" and the preview.
 */
export function resultsMarkdown(state: NoteState, block: BlockReport, settings: Settings): string {
  return `${blockResultsMarkdown(state, block, displayOptions(settings))}\n`;
}

/**
 * Code lenses above each block: "Show Curve View" and "Copy
 * results". Both take the note's URI and the 0-based line of the opening
 * fence, which is how the client's commands find the block again.
 */
import type { CodeLens } from 'vscode-languageserver';
import type { BlockReport } from '../../core';
import type { Settings } from '../../shared/settings';
import { displayOptions, toRange, type NoteState } from '../state';
import { blockResultsMarkdown } from './markdown';

/**
 * Two lenses per block. Invalid blocks get them too: lenses that come and go
 * while a line is being typed would make the text below them jump.
 */
export function codeLenses(state: NoteState): CodeLens[] {
  return state.report.blocks.flatMap((b) => {
    const range = toRange(state.lines, { start: b.block.openStart, end: b.block.openEnd });
    const args = [state.uri, b.block.openLine];
    return [
      { range, command: { title: 'Show Curve View', command: 'boltzmark.showCurve', arguments: args } },
      { range, command: { title: 'Copy results', command: 'boltzmark.copyResults', arguments: args } },
    ];
  });
}

/**
 * The block's results as compact Markdown (title with status, then the
 * table), the same strings as the hover; an invalid block gives its first
 * error. Used by "Copy results" and the preview.
 */
export function resultsMarkdown(state: NoteState, block: BlockReport, settings: Settings): string {
  return `${blockResultsMarkdown(state, block, displayOptions(settings))}\n`;
}

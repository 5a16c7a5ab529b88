/**
 * Shared helpers of the server feature tests: a note's analysed state from
 * its text, with an optional cursor marker (`$0`, or else the first `|`).
 */
import { strict as assert } from 'node:assert';
import { Analyzer, LineIndex } from '../../src/core';
import { DEFAULT_SETTINGS, type Settings } from '../../src/shared/settings';
import type { NoteState } from '../../src/server/state';

/** The URI every test note has. */
export const URI = 'file:///lab/note.md';

/** The analysed state of a note. */
export function noteState(text: string, settings: Settings = DEFAULT_SETTINGS): NoteState {
  const analyzer = new Analyzer({ saturationSigma: settings.saturationSigma, infoStrings: settings.extraInfoStrings });
  return { uri: URI, version: 1, text, lines: new LineIndex(text), report: analyzer.analyzeText(text) };
}

/** A note with a cursor marker: the state without the marker and the cursor's position. */
export function withCursor(
  marked: string,
  settings: Settings = DEFAULT_SETTINGS,
): { state: NoteState; position: { line: number; character: number } } {
  const marker = marked.includes('$0') ? '$0' : '|';
  const at = marked.indexOf(marker);
  assert.ok(at >= 0, 'the note needs a cursor marker ($0 or |)');
  const text = marked.slice(0, at) + marked.slice(at + marker.length);
  const state = noteState(text, settings);
  return { state, position: state.lines.positionAt(at) };
}

/** A `levels` block after a heading, body lines joined: line 2 is the opening fence, line 3 the first body line. */
export function note(...body: string[]): string {
  return ['# Lab note', '', '```levels', ...body, '```', ''].join('\n');
}

/** Settings with some fields changed. */
export function settings(changes: Partial<Settings>): Settings {
  return { ...DEFAULT_SETTINGS, ...changes };
}

/**
 * The worked example of the format reference (docs/format.md, "Where a block
 * lives"): 13C at 7.05 T, P = 0.312 ± 0.010, lattice 1.4 K. The core gives
 * T = 5.61 ± 0.19 mK, β = 178.2 ± 6.1 K⁻¹, P_th = 0.129 %, ε = 241.
 */
export const CONTRACT = [
  'id: cell-B run 7',
  'system: 13C',
  'field: 7.05 T',
  'lattice: 1.4 K',
  'polarization: 0.312 ± 0.010',
];

/** The whole note as a range. */
export function everything(state: NoteState): {
  start: { line: number; character: number };
  end: { line: number; character: number };
} {
  return { start: { line: 0, character: 0 }, end: state.lines.positionAt(state.text.length) };
}

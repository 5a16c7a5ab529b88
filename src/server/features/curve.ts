/**
 * The curve view's data: finds the block at a line and lets the core build
 * its payload (curves, measured point, markers, or its first error).
 */
import {
  curveData,
  DEFAULT_CURVE_DATA_OPTIONS,
  spectrumTraces,
  type BlockReport,
  type Spectrum,
  type ViewPayload,
} from '../../core';
import type { Settings } from '../../shared/settings';
import { blockAt, displayOptions, type NoteState } from '../state';

/**
 * The block whose fences enclose a 0-based line (the opening and closing
 * fence lines included, indented fences too), or undefined.
 */
export function blockAtLine(state: NoteState, line: number): BlockReport | undefined {
  if (!Number.isSafeInteger(line) || line < 0) return undefined;
  const start = state.lines.offsetAt({ line, character: 0 });
  const end = state.lines.offsetAt({ line: line + 1, character: 0 });
  // An indented fence starts after the line's first offset; its last character is still on the line.
  return blockAt(state, start) ?? blockAt(state, Math.max(start, end - 1));
}

/**
 * The payload of the block at `line`, or null when the line is outside every block. `spectrumFor` gives the
 * parsed spectrum behind a reference's dependency key, for the spectrum panel (decimated here, in the server).
 */
export function curvePayload(
  state: NoteState,
  line: number,
  settings: Settings,
  spectrumFor: (source: string) => Spectrum | null = () => null,
): ViewPayload | null {
  const block = blockAtLine(state, line);
  if (!block) return null;
  const payload = curveData(
    block,
    { uri: state.uri, version: state.version },
    { ...DEFAULT_CURVE_DATA_OPTIONS, display: displayOptions(settings) },
  );
  if (!block.meta.spectra?.length) return payload;
  return { ...payload, spectra: spectrumTraces(block.meta.spectra, spectrumFor, settings.significantDigits) };
}

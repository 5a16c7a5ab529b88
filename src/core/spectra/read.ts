/** Reads a spectrum file's text by its kind: JCAMP-DX (`.jdx`, `.dx`, `.jcamp`, or `##` labels) or two-column text. */
import { looksLikeJcamp, readJcamp } from './jcamp';
import { readTextColumns } from './textColumns';
import type { SpectrumRead } from './types';

/** File name endings read as JCAMP-DX. */
export const JCAMP_EXTENSIONS: readonly string[] = ['.jdx', '.dx', '.jcamp', '.jcm'];
/** File name endings read as two-column text. */
export const TEXT_EXTENSIONS: readonly string[] = ['.csv', '.tsv', '.txt'];
/** Every file name ending a spectrum reference may point at (for completions and file watching). */
export const SPECTRUM_EXTENSIONS: readonly string[] = [...JCAMP_EXTENSIONS, ...TEXT_EXTENSIONS];

/**
 * Reads the text of a spectrum file. `fileName` (a path or a bare name)
 * decides the reader by its ending; a file of another ending is read as
 * JCAMP-DX when it starts with a `##` label, else as two-column text.
 * Never throws: a file that is not a spectrum gives `ok: false` with the line.
 */
export function readSpectrum(text: string, fileName: string): SpectrumRead {
  const lower = fileName.toLowerCase();
  const jcamp = JCAMP_EXTENSIONS.some((e) => lower.endsWith(e))
    ? true
    : TEXT_EXTENSIONS.some((e) => lower.endsWith(e))
      ? false
      : looksLikeJcamp(text);
  try {
    return jcamp ? readJcamp(text) : readTextColumns(text);
  } catch (e) {
    // The readers do not throw by design; this keeps a host alive should a package change under them.
    return { ok: false, line: null, message: `unreadable (${e instanceof Error ? e.message : String(e)})` };
  }
}

/** Memory a parsed spectrum holds, in bytes (its two arrays and a little bookkeeping). */
export function spectrumBytes(read: SpectrumRead): number {
  return read.ok ? read.spectrum.x.byteLength + read.spectrum.y.byteLength + 256 : 256 + read.message.length * 2;
}

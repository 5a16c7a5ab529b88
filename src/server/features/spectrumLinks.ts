/**
 * Document links on the paths of spectrum references (a reference's
 * `spectrum:` value and a block's `spectrum:` default): each opens the file
 * it resolves to. A path refused as outside the workspace gets no link.
 */
import type { DocumentLink } from 'vscode-languageserver';
import { locateSpectrum } from '../spectra';
import { toRange, type NoteState } from '../state';

/** The links of every spectrum path in the note, once per written path. */
export function spectrumLinks(state: NoteState, folders: readonly string[]): DocumentLink[] {
  const out: DocumentLink[] = [];
  for (const b of state.report.blocks) {
    const seen = new Set<number>();
    for (const use of b.meta.spectra ?? []) {
      if (seen.has(use.fileSpan.start)) continue;
      seen.add(use.fileSpan.start);
      const at = locateSpectrum(state.uri, use.file, folders);
      if ('outside' in at) continue;
      out.push({
        range: toRange(state.lines, b.toNote(use.fileSpan)),
        target: at.uri,
        tooltip: 'Open the spectrum file',
      });
    }
  }
  return out;
}

/**
 * Folding: each block folds from its opening fence to its closing fence
 * (or to the note's last line when the fence is never closed).
 */
import { FoldingRangeKind, type FoldingRange } from 'vscode-languageserver';
import type { NoteState } from '../state';

/** One region per block that spans more than one line. */
export function foldingRanges(state: NoteState): FoldingRange[] {
  const out: FoldingRange[] = [];
  for (const b of state.report.blocks) {
    const startLine = b.block.openLine;
    const endLine = b.block.closeLine ?? state.lines.positionAt(b.block.blockEnd).line;
    if (endLine > startLine) out.push({ startLine, endLine, kind: FoldingRangeKind.Region });
  }
  return out;
}

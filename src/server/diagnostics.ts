/**
 * Diagnostics of a note: every problem of every block, with the exact range,
 * the stable code and a link to its section of docs/format.md. Served by pull
 * (LSP 3.17 `textDocument/diagnostic`) when the client supports it, otherwise
 * pushed after a short pause in typing.
 */
import type { Diagnostic } from 'vscode-languageserver';
import { problemToDiagnostic } from './features/codeActions';
import { blocksWithProblems, type NoteState } from './state';

/** All diagnostics of a note: the note's own (such as `note-bounded`) first, then block by block in position order. */
export function noteDiagnostics(state: NoteState): Diagnostic[] {
  const out: Diagnostic[] = state.report.problems.map((p) => problemToDiagnostic(state, p));
  for (const b of blocksWithProblems(state)) for (const p of b.problems) out.push(problemToDiagnostic(state, p));
  return out;
}

/**
 * Quick fixes: each fix the core attached to a problem (a wrong-case unit, a
 * missing unit, a misspelt isotope …) offered as a code action. The core
 * only proposes replacements; the edit is applied when the user picks it.
 */
import {
  CodeActionKind,
  DiagnosticSeverity,
  type CodeAction,
  type Diagnostic,
  type Range,
} from 'vscode-languageserver';
import type { BlockReport, Problem, Severity, Span } from '../../core';
import { codeLink } from '../docsLink';
import { toOffset, toRange, type NoteState } from '../state';

/** Where each diagnostic code is explained: docs/format.md, whose section anchors are the codes. */

const SEVERITY: Readonly<Record<Severity, DiagnosticSeverity>> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  info: DiagnosticSeverity.Information,
};

/** The LSP diagnostic of a core problem (note offsets → range), linked to its section of the format reference. */
export function problemToDiagnostic(state: NoteState, problem: Problem): Diagnostic {
  return {
    range: toRange(state.lines, problem.span),
    severity: SEVERITY[problem.severity],
    code: problem.code,
    codeDescription: { href: codeLink(problem.code) },
    source: 'boltzmark',
    message: problem.message,
  };
}

/** True when the span and the offsets [from, to] share a point (an empty range touching a span counts). */
function touches(span: Span, from: number, to: number): boolean {
  return span.start <= to && from <= span.end;
}

/** True when a replacement stays inside the block's body, so a fix never edits the note around it. */
function insideBlock(b: BlockReport, span: Span): boolean {
  return span.start >= b.block.openEnd && span.end <= b.block.blockEnd;
}

/** Quick fixes for the problems whose span meets the range, one action per proposed replacement. */
export function codeActions(state: NoteState, range: Range): CodeAction[] {
  const from = toOffset(state.lines, range.start);
  const to = toOffset(state.lines, range.end);
  const actions: CodeAction[] = [];
  for (const b of state.report.blocks) {
    if (!touches({ start: b.block.openStart, end: b.block.blockEnd }, from, to)) continue;
    for (const p of b.problems) {
      const fixes = (p.fixes ?? []).filter((f) => insideBlock(b, f.span));
      if (fixes.length === 0 || !touches(p.span, from, to)) continue;
      const diagnostic = problemToDiagnostic(state, p);
      for (const f of fixes) {
        actions.push({
          title: f.title,
          kind: CodeActionKind.QuickFix,
          diagnostics: [diagnostic],
          isPreferred: fixes.length === 1,
          edit: { changes: { [state.uri]: [{ range: toRange(state.lines, f.span), newText: f.newText }] } },
        });
      }
    }
  }
  return actions;
}

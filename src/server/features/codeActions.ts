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
  type TextEdit,
} from 'vscode-languageserver';
import type { BlockReport, Problem, Replacement, Severity, Span } from '../../core';
import { codeLink } from '../docsLink';
import { blocksBetween, blocksWithProblems, toOffset, toRange, type NoteState } from '../state';

/** Where each diagnostic code is explained: docs/format.md, whose section anchors are the codes. */

const SEVERITY: Readonly<Record<Severity, DiagnosticSeverity>> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  info: DiagnosticSeverity.Information,
};

/** The LSP diagnostic of a core problem (note offsets → range), linked to its section of the format reference. */
export function problemToDiagnostic(state: NoteState, problem: Problem): Diagnostic {
  return problemAt(toRange(state.lines, problem.span), problem);
}

/** The LSP diagnostic of a core problem at a range already found (a notebook's places are in its JSON file). */
export function problemAt(range: Range, problem: Problem): Diagnostic {
  return {
    range,
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
  for (const b of blocksBetween(state, from, to)) {
    if (!touches({ start: b.block.openStart, end: b.block.blockEnd }, from, to)) continue;
    for (const p of b.problems) {
      const fixes = (p.fixes ?? []).filter(
        (f) => insideBlock(b, f.span) && (f.more ?? []).every((m) => insideBlock(b, m.span)),
      );
      // Offered where the problem is marked and also where its fix would edit (e.g. on any item of a list
      // the fix reorders), so the fix is found from the text it changes.
      if (fixes.length === 0 || !(touches(p.span, from, to) || fixes.some((f) => touches(f.span, from, to)))) continue;
      const diagnostic = problemToDiagnostic(state, p);
      for (const f of fixes) {
        actions.push({
          title: f.title,
          kind: CodeActionKind.QuickFix,
          diagnostics: [diagnostic],
          isPreferred: fixes.length === 1,
          edit: { changes: { [state.uri]: edits(state, f) } },
        });
      }
    }
  }
  const all = fixAll(state);
  if (all && actions.length > 0) actions.push(all);
  return actions;
}

/** The text edits of one fix: its replacement and any further ones, in note order. */
function edits(state: NoteState, f: Replacement): TextEdit[] {
  return [f, ...(f.more ?? [])]
    .slice()
    .sort((a, b) => a.span.start - b.span.start)
    .map((e) => ({ range: toRange(state.lines, e.span), newText: e.newText }));
}

/**
 * "Fix all": one action applying, for every problem of the note that has exactly one fix, that fix.
 * Problems with a choice of fixes (which isotope was meant?) are left to the user. Edits that would
 * overlap one another are dropped (the first in the note wins), so the edit is always well formed.
 * Null when fewer than two problems can be fixed so.
 */
export function fixAll(state: NoteState): CodeAction | null {
  const chosen: TextEdit[] = [];
  const taken: Span[] = [];
  let fixed = 0;
  for (const b of blocksWithProblems(state)) {
    for (const p of b.problems) {
      const fixes = p.fixes ?? [];
      // One fix, or a list-wide one offered first (the unit for every bare number of a list).
      if (fixes.length !== 1 && !fixes[0]?.more) continue;
      const f = fixes[0]!;
      const spans = [f, ...(f.more ?? [])].map((e) => e.span);
      if (!spans.every((s) => insideBlock(b, s))) continue;
      if (
        spans.some(
          (s) =>
            taken.some((t) => s.start < t.end && t.start < s.end) ||
            taken.some((t) => t.start === s.start && t.end === s.end),
        )
      )
        continue;
      taken.push(...spans);
      chosen.push(...edits(state, f));
      fixed++;
    }
  }
  if (fixed < 2) return null;
  return {
    title: `Fix all ${fixed} problems in this note that have one fix`,
    kind: CODE_ACTION_FIX_ALL,
    edit: { changes: { [state.uri]: chosen } },
  };
}

/** The code-action kind of "fix all" (LSP's source.fixAll, with our name). */
export const CODE_ACTION_FIX_ALL = `${CodeActionKind.SourceFixAll}.boltzmark`;

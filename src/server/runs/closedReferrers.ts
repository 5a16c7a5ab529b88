/**
 * Diagnostics of notes that are not open but take values from other runs.
 * When a referenced block changes (or breaks), the notes that refer to it
 * must say so, open or not: an open note is analysed again and its
 * diagnostics pulled or pushed as usual; a closed one is analysed here and
 * gets its reference diagnostics (`reference-*`, `id-duplicate`) pushed, so
 * the Problems panel names every note a change affects. Only those codes
 * are sent for a closed note: its other problems are its own and are shown
 * when it is opened, as for any closed note. A note is analysed again only
 * when what it read from other runs changed (its dependency stamps), and
 * what was sent is taken back when the note opens (its pulled or pushed
 * diagnostics then take over) or stops referring to runs.
 */
import type { Diagnostic } from 'vscode-languageserver';
import { Analyzer, dependenciesHold, type Dependency, type Externals } from '../../core';
import { problemAt } from '../features/codeActions';
import { SERVER_LIMITS } from '../notes';
import type { WorkspaceRuns } from './workspaceRuns';

/** Whether a diagnostic code belongs to runs by reference. */
export function isReferenceCode(code: unknown): boolean {
  return typeof code === 'string' && (code.startsWith('reference-') || code === 'id-duplicate');
}

interface Sent {
  readonly deps: readonly Dependency[];
  readonly externals: Externals;
  /** How many diagnostics were last sent (0: nothing to take back). */
  readonly count: number;
}

/** What the server should push: each note's new reference diagnostics (empty to take them back). */
export type Publication = { readonly uri: string; readonly diagnostics: Diagnostic[] };

export class ClosedReferrers {
  private readonly sent = new Map<string, Sent>();
  private readonly analyzer = new Analyzer({ limits: SERVER_LIMITS });

  constructor(
    private readonly runs: WorkspaceRuns,
    private readonly externalsFor: (uri: string) => Externals,
  ) {}

  /** The closed referring notes whose reference diagnostics changed since they were last sent. */
  update(): Publication[] {
    const out: Publication[] = [];
    const now = new Set(this.runs.closedReferrers());
    for (const [uri, was] of this.sent)
      if (!now.has(uri)) {
        this.sent.delete(uri);
        if (was.count > 0 && !this.runs.isOpen(uri)) out.push({ uri, diagnostics: [] });
      }
    for (const uri of now) {
      const was = this.sent.get(uri);
      if (was && dependenciesHold(was.deps, uri, was.externals)) continue;
      const text = this.runs.textOf(uri);
      if (text === null) continue;
      const externals = this.externalsFor(uri);
      const report = this.analyzer.analyzeText(text, externals);
      // Places through the index: a notebook's are in its JSON file, where the editor shows them.
      const diagnostics: Diagnostic[] = [];
      for (const p of [...report.problems, ...report.blocks.flatMap((b) => b.problems)]) {
        if (!isReferenceCode(p.code)) continue;
        const range = this.runs.rangeOf(uri, p.span);
        if (range) diagnostics.push(problemAt(range, p));
      }
      const deps = report.blocks.flatMap((b) => b.deps);
      this.sent.set(uri, { deps, externals, count: diagnostics.length });
      if (diagnostics.length > 0 || (was?.count ?? 0) > 0) out.push({ uri, diagnostics });
    }
    return out;
  }

  /** A note was opened: true when reference diagnostics had been sent for it (the server takes them back). */
  opened(uri: string): boolean {
    const was = this.sent.get(uri);
    this.sent.delete(uri);
    return (was?.count ?? 0) > 0;
  }
}

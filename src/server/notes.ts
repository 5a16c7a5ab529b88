/**
 * The open notes and their analyses. A note is analysed lazily, once per
 * version and per set of analysis settings, by a core Analyzer shared by
 * every note with those settings (whose per-block cache makes an edit
 * re-read only the blocks it touched). Settings that only change how
 * results are shown never cause a new analysis.
 */
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { Analyzer, dependenciesHold, LineIndex, type AnalyzerLimits, type Dependency, type Externals } from '../core';
import type { AnalysisStats } from '../shared/protocol';
import type { Settings } from '../shared/settings';
import { analysisKey } from './settingsStore';
import type { NoteState } from './state';

/**
 * How much of a note the server reads (docs/format.md#note-bounded): about
 * 2.5 times the 2,000-run notebook of the benchmarks, whose full analysis
 * takes a fraction of a second, so the first analysis of any note stays
 * under a couple of seconds and an edit stays instant. Past the bound the
 * note gets one `note-bounded` warning on its first line.
 */
export const SERVER_LIMITS: AnalyzerLimits = { maxBlocks: 5_000, maxBodyChars: 2_000_000 };

/** Analyzers kept at once: one per distinct set of analysis settings in use (usually one). */
const MAX_ANALYZERS = 8;

/** Builds analyzer options from the settings. */
function analyzerFor(s: Settings): Analyzer {
  return new Analyzer({ saturationSigma: s.saturationSigma, infoStrings: s.extraInfoStrings, limits: SERVER_LIMITS });
}

/** Cache of note analyses, keyed by URI, version and analysis settings. */
export class Notes {
  /**
   * @param externalsFor the sources a note's blocks may read values from by reference (spectrum files, other
   *   runs; see src/server/externals.ts), or null where there are none
   */
  constructor(private readonly externalsFor: (uri: string) => Externals | null = () => null) {}

  private readonly analyzers = new Map<string, Analyzer>();
  private readonly states = new Map<
    string,
    { state: NoteState; key: string; deps: readonly Dependency[]; externals: Externals | null }
  >();
  private readonly stats = new Map<string, AnalysisStats>();
  private readonly runs = new Map<string, number>();

  /** The analysis of this version of the document with these settings, computed on first use. */
  get(doc: TextDocument, settings: Settings): NoteState {
    const key = analysisKey(settings);
    const known = this.states.get(doc.uri);
    if (
      known &&
      known.state.version === doc.version &&
      known.key === key &&
      dependenciesHold(known.deps, doc.uri, known.externals)
    )
      return known.state;
    const text = doc.getText();
    const externals = this.externalsFor(doc.uri);
    const report = this.analyzer(key, settings).analyzeText(text, externals);
    const state: NoteState = { uri: doc.uri, version: doc.version, text, lines: new LineIndex(text), report };
    const runs = (this.runs.get(doc.uri) ?? 0) + 1;
    this.runs.set(doc.uri, runs);
    this.states.set(doc.uri, { state, key, deps: allDependencies(report.blocks), externals });
    this.stats.set(doc.uri, { version: doc.version, blocks: report.blocks.length, runs, ...report.stats });
    return state;
  }

  /**
   * True when the note was analysed and something its blocks read from outside (another run, a file) has
   * changed since: the note's diagnostics must be published again.
   */
  stale(uri: string): boolean {
    const known = this.states.get(uri);
    return !!known && !dependenciesHold(known.deps, uri, known.externals);
  }

  /** Statistics of the latest analysis of a note. */
  statsOf(uri: string): AnalysisStats | null {
    return this.stats.get(uri) ?? null;
  }

  /** The notes whose latest analysis read any of these dependency keys (to refresh them when one changes). */
  usersOf(keys: ReadonlySet<string>): string[] {
    const out: string[] = [];
    for (const [uri, known] of this.states) if (known.deps.some((d) => keys.has(d.key))) out.push(uri);
    return out;
  }

  /** Forgets a closed note. */
  forget(uri: string): void {
    this.states.delete(uri);
    this.stats.delete(uri);
    this.runs.delete(uri);
  }

  /** The analyzer for a set of analysis settings; the least recently created one goes past MAX_ANALYZERS. */
  private analyzer(key: string, settings: Settings): Analyzer {
    let a = this.analyzers.get(key);
    if (!a) {
      a = analyzerFor(settings);
      this.analyzers.set(key, a);
      if (this.analyzers.size > MAX_ANALYZERS) this.analyzers.delete(this.analyzers.keys().next().value!);
    }
    return a;
  }
}

/** Every dependency of a note's blocks, each key once (most notes have none). */
function allDependencies(blocks: readonly { readonly deps: readonly Dependency[] }[]): readonly Dependency[] {
  const seen = new Map<string, Dependency>();
  for (const b of blocks) for (const d of b.deps) if (!seen.has(d.key)) seen.set(d.key, d);
  return [...seen.values()];
}

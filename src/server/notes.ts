/**
 * The open notes and their analyses. A note is analysed lazily, once per
 * version, by one shared core Analyzer (whose per-block cache makes an edit
 * re-read only the blocks it touched).
 */
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { Analyzer, LineIndex, type AnalyzerLimits } from '../core';
import type { AnalysisStats } from '../shared/protocol';
import type { Settings } from '../shared/settings';
import type { NoteState } from './state';

/**
 * How much of a note the server reads (docs/format.md#note-bounded): about
 * 2.5 times the 2,000-run notebook of the benchmarks, whose full analysis
 * takes a fraction of a second, so the first analysis of any note stays
 * under a couple of seconds and an edit stays instant. Past the bound the
 * note gets one `note-bounded` warning on its first line.
 */
export const SERVER_LIMITS: AnalyzerLimits = { maxBlocks: 5_000, maxBodyChars: 2_000_000 };

/** Builds analyzer options from the settings. */
function analyzerFor(s: Settings): Analyzer {
  return new Analyzer({ saturationSigma: s.saturationSigma, infoStrings: s.extraInfoStrings, limits: SERVER_LIMITS });
}

/** Cache of note analyses, keyed by URI and version. */
export class Notes {
  private analyzer: Analyzer;
  private readonly states = new Map<string, NoteState>();
  private readonly stats = new Map<string, AnalysisStats>();

  constructor(private settings: Settings) {
    this.analyzer = analyzerFor(settings);
  }

  /** The current settings. */
  get current(): Settings {
    return this.settings;
  }

  /** The analysis of this version of the document, computed on first use. */
  get(doc: TextDocument): NoteState {
    const known = this.states.get(doc.uri);
    if (known && known.version === doc.version) return known;
    const text = doc.getText();
    const report = this.analyzer.analyzeText(text);
    const state: NoteState = { uri: doc.uri, version: doc.version, text, lines: new LineIndex(text), report };
    this.states.set(doc.uri, state);
    this.stats.set(doc.uri, { version: doc.version, blocks: report.blocks.length, ...report.stats });
    return state;
  }

  /** Statistics of the latest analysis of a note. */
  statsOf(uri: string): AnalysisStats | null {
    return this.stats.get(uri) ?? null;
  }

  /** Forgets a closed note. */
  forget(uri: string): void {
    this.states.delete(uri);
    this.stats.delete(uri);
  }

  /** New settings: results may change, so every cached analysis is dropped. */
  reconfigure(settings: Settings): void {
    this.settings = settings;
    this.analyzer = analyzerFor(settings);
    this.states.clear();
  }
}

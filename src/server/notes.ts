/**
 * The open notes and their analyses. A note is analysed lazily, once per
 * text and per set of analysis settings, by a core Analyzer shared by
 * every note with those settings (whose per-block cache makes an edit
 * re-read only the blocks it touched, and whose memory of the note, with the
 * change the document recorded, makes it scan only where the note changed).
 * Settings that only change how results are shown never cause a new analysis.
 *
 * A large note is not read whole before the first answer: its blocks are
 * read into the cache in slices of a few milliseconds that yield to every
 * request in between ({@link Notes.prepare}), while a request about a few
 * blocks (a hover, the hints of the visible lines) reads just those now
 * ({@link Notes.around}). Once every block is cached the whole analysis
 * takes the cached results, and from then on edits are incremental.
 */
import {
  blocksMeeting,
  Analyzer,
  SERVER_BLOCK_CHARS,
  movedBlock,
  dependenciesHold,
  type AnalyzerLimits,
  type Dependency,
  type Externals,
  type FencedBlock,
  type NoteText,
} from '../core';
import type { AnalysisStats } from '../shared/protocol';
import type { Settings } from '../shared/settings';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { NoteDocument } from './noteDocument';
import { analysisKey } from './settingsStore';
import type { NoteState } from './state';

/**
 * How much of a note the server reads (docs/format.md#note-bounded): no bound
 * on the number of blocks, which the slices below keep from blocking the
 * editor, and one on the size of the blocks' bodies that no real note meets
 * (100 million characters, some 200,000 blocks), past which a note is beyond
 * what the editor should hold in memory as analyses; and one on a single
 * block's body (half a million characters), which is read in one piece that no
 * slice can interrupt.
 */
export const SERVER_LIMITS: AnalyzerLimits = {
  maxBlocks: Infinity,
  maxBodyChars: 100_000_000,
  maxBlockChars: SERVER_BLOCK_CHARS,
};

/** Blocks kept in each analyzer's cache: more than the bounded note above holds in ordinary blocks. */
const SERVER_CACHE_BLOCKS = 250_000;

/**
 * Characters of block bodies each analyzer keeps besides the note analysed last (tens of MB at most): a
 * megabyte-long body edited keystroke by keystroke leaves a megabyte behind each time.
 */
const SERVER_CACHE_CHARS = 16_000_000;

/** Analyzers kept at once: one per distinct set of analysis settings in use (usually one). */
const MAX_ANALYZERS = 8;

/** Notes with fewer `levels` fences than this are read whole at once (a fraction of a second at most). */
const READ_AT_ONCE = 400;

/**
 * Milliseconds of reading per slice before yielding to the requests waiting. A request arriving meanwhile waits
 * for the slice that is running. The Node server hears the client's bytes as they arrive (transportInput.ts,
 * through {@link Notes.heard}), so the slice queued next stands aside while the request is read and answered;
 * where the transport is not watched, a request may wait two or three slices (its header and content read in
 * separate turns, each behind one). A quarter of a millisecond keeps either wait short; the turns in between
 * cost the reading of the note little (bench/scale.ts).
 */
const SLICE_MS = 0.25;

/** Builds analyzer options from the settings. */
function analyzerFor(s: Settings): Analyzer {
  return new Analyzer({
    saturationSigma: s.saturationSigma,
    infoStrings: s.extraInfoStrings,
    limits: SERVER_LIMITS,
    cacheSize: SERVER_CACHE_BLOCKS,
    cacheChars: SERVER_CACHE_CHARS,
  });
}

/** A note being read in slices: its fence scan, for the requests about a few blocks meanwhile. */
interface Warming {
  /** The version whose fences were found, and its text. */
  readonly version: number;
  readonly text: NoteText;
  readonly key: string;
  /** Every fenced block of that version, in order (ours are told apart as they are read). */
  readonly blocks: readonly FencedBlock[];
  readonly done: Promise<void>;
}

/**
 * Yields to the event loop: every message waiting is handled before the next slice. `setImmediate` in Node.js;
 * the browser server (a web worker) has none, and takes a zero timeout.
 */
const later: (f: () => void) => unknown =
  typeof setImmediate === 'function' ? setImmediate : (f: () => void) => setTimeout(f, 0);
const yieldToRequests = (): Promise<void> => new Promise((resolve) => void later(resolve));

/** Milliseconds after a message during which no slice runs: the turns an answer takes to be written. */
const QUIET_MS = 4;

/** Waits a little (a timer, so that the turns of the event loop in between serve the messages). */
const pause = (): Promise<void> => new Promise((resolve) => setTimeout(resolve, 1));

/** A note's latest analysis, with what it read from outside. */
interface Known {
  readonly state: NoteState;
  /** The analysis settings' key. */
  readonly key: string;
  /** The text analysed (the document tells the change since it). */
  readonly text: NoteText;
  /** Every dependency of its blocks; null until first asked for. */
  deps: readonly Dependency[] | null;
  readonly externals: Externals | null;
  /** The sources' change token when the analysis began (Externals.changes), or null. */
  readonly token: string | null;
}

/** Cache of note analyses, keyed by URI, text and analysis settings. */
export class Notes {
  /**
   * @param externalsFor the sources a note's blocks may read values from by reference (spectrum files, other
   *   runs; see src/server/externals.ts), or null where there are none
   */
  constructor(private readonly externalsFor: (uri: string) => Externals | null = () => null) {}

  private readonly analyzers = new Map<string, Analyzer>();
  private readonly states = new Map<string, Known>();
  private readonly stats = new Map<string, AnalysisStats>();
  private readonly runs = new Map<string, number>();
  private readonly warming = new Map<string, Warming>();
  /** Requests about a few blocks being answered (see {@link answering}). */
  private nearInFlight = 0;
  /** When the latest message from the client came in (see {@link heard}). */
  private lastMessage = -Infinity;

  /** Records that a message from the client came in: the slices that read large notes wait a little. */
  heard(): void {
    this.lastMessage = performance.now();
  }

  /**
   * Runs `f` (a request about a few blocks) with the slices that read large notes held back until it is over,
   * so that it never waits behind one.
   */
  async answering<T>(f: () => Promise<T>): Promise<T> {
    this.nearInFlight++;
    try {
      return await f();
    } finally {
      this.nearInFlight--;
    }
  }

  /** The analysis of this version of the document with these settings, computed on first use. */
  get(given: TextDocument, settings: Settings): NoteState {
    const doc = noteDocument(given);
    const key = analysisKey(settings);
    const known = this.states.get(doc.uri);
    // Keyed by the text itself, not by its version number: a client that sends a change with the version it had
    // (or an older one, or opens the note again with the same one) still gets the analysis of the text it has.
    const same = known && known.text === doc.pieces && known.state.version === doc.version && known.key === key;
    if (same && this.holds(doc.uri, known)) return known.state;
    const text = doc.pieces;
    const externals = this.externalsFor(doc.uri);
    // The change since the version analysed last: the analyzer reads the note again only around it.
    const change = known && known.key === key ? doc.changeSince(known.text) : undefined;
    const token = externals?.changes?.() ?? null;
    const report = this.analyzer(key, settings).analyzeText(text, externals, change);
    const state: NoteState = { uri: doc.uri, version: doc.version, text, lines: text, report };
    const runs = (this.runs.get(doc.uri) ?? 0) + 1;
    this.runs.set(doc.uri, runs);
    this.states.set(doc.uri, { state, key, text, deps: null, externals, token });
    this.stats.set(doc.uri, { version: doc.version, blocks: report.blocks.length, runs, ...report.stats });
    return state;
  }

  /**
   * True when what the note's analysis read from outside is unchanged: at once when the sources' change token
   * is the one of the analysis, otherwise by asking for every stamp (the dependencies gathered on first need).
   */
  private holds(uri: string, known: Known): boolean {
    if (known.token !== null && known.externals?.changes?.() === known.token) return true;
    return dependenciesHold(this.depsOf(known), uri, known.externals);
  }

  /** Every dependency of a note's blocks, each key once, gathered when first asked for. */
  private depsOf(known: Known): readonly Dependency[] {
    known.deps ??= allDependencies(known.state.report.blocks);
    return known.deps;
  }

  /**
   * True when the note was analysed and something its blocks read from outside (another run, a file) has
   * changed since: the note's diagnostics must be published again.
   */
  stale(uri: string): boolean {
    const known = this.states.get(uri);
    return !!known && !this.holds(uri, known);
  }

  /** True when {@link get} is quick: the note was analysed with these settings before (later versions are incremental). */
  ready(given: TextDocument, settings: Settings): boolean {
    const doc = noteDocument(given);
    return this.states.get(doc.uri)?.key === analysisKey(settings);
  }

  /**
   * Resolves when {@link get} will be quick for this note: at once for a note
   * analysed before or a small one; otherwise after its blocks are read into
   * the cache in slices that yield to requests between them.
   */
  prepare(given: TextDocument, settings: Settings): Promise<void> {
    const doc = noteDocument(given);
    if (this.ready(doc, settings)) return Promise.resolve();
    return this.warm(doc, settings)?.done ?? Promise.resolve();
  }

  /**
   * The analysis of the blocks that overlap the note offsets [from, to] (fence
   * lines included), read now if need be, as a note state holding only them:
   * what a hover or the hints of the visible lines need while a large note is
   * still being read. The whole note's state once that is quick.
   */
  around(given: TextDocument, settings: Settings, from: number, to: number): NoteState {
    const doc = noteDocument(given);
    const w = this.ready(doc, settings) ? undefined : this.warm(doc, settings);
    if (!w) return this.get(doc, settings);
    // The fences were found in the version the note opened with; an edit since moved those after it, and those
    // it touched are not known until the whole note is read (a request there waits for that).
    let shift = { delta: 0, lines: 0 };
    let [a, b] = [from, to];
    if (w.text !== doc.pieces) {
      const change = doc.changeSince(w.text);
      const delta = doc.pieces.length - w.text.length;
      if (!change) return this.get(doc, settings);
      if (to < change.prefix) {
        // Before the change: the blocks are where they were.
      } else if (from >= doc.pieces.length - change.suffix) {
        shift = { delta, lines: doc.pieces.lineCount - w.text.lineCount };
        [a, b] = [from - delta, to - delta];
      } else return this.get(doc, settings);
    }
    const analyzer = this.analyzer(w.key, settings);
    const near: FencedBlock[] = [];
    for (const f of blocksMeeting(w.blocks, (x) => x, a, b))
      if (analyzer.isLevelsFence(f))
        near.push(shift.delta === 0 && shift.lines === 0 ? f : movedBlock(f, shift.delta, shift.lines));
    const blocks = analyzer.reportsOf(near, this.externalsFor(doc.uri));
    return {
      uri: doc.uri,
      version: doc.version,
      text: doc.pieces,
      lines: doc.lines,
      report: { blocks, stats: { analysed: 0, reused: 0 }, bounded: null, problems: [] },
    };
  }

  /** Starts (or finds) the slices that read a large note; undefined for a note small enough to read at once. */
  private warm(doc: NoteDocument, settings: Settings): Warming | undefined {
    const key = analysisKey(settings);
    // One reading per note and settings: an edit while it goes on does not start it again (the cache is by
    // body, so what it reads serves every version).
    const current = this.warming.get(doc.uri);
    if (current && current.key === key) return current;
    const analyzer = this.analyzer(key, settings);
    const blocks = doc.fences();
    if (blocks.length < READ_AT_ONCE) return undefined;
    const read = async (): Promise<void> => {
      let i = 0;
      while (i < blocks.length) {
        // A request about a few blocks (a hover, the visible hints) is answered first: no slice while one is out,
        // nor just after any message came in (its answer takes a few turns of the event loop to go out).
        if (this.nearInFlight > 0 || performance.now() - this.lastMessage < QUIET_MS) {
          await pause();
          continue;
        }
        const until = performance.now() + SLICE_MS;
        const externals = this.externalsFor(doc.uri);
        while (i < blocks.length && performance.now() < until) {
          const b = blocks[i++]!;
          if (analyzer.isLevelsFence(b)) analyzer.warm(b.body, externals);
        }
        await yieldToRequests();
        // Other settings took over, or the note was closed: the cache keeps what was read.
        if (this.warming.get(doc.uri)?.key !== key) return;
      }
      this.warming.delete(doc.uri);
    };
    const w: Warming = { version: doc.version, text: doc.pieces, key, blocks, done: Promise.resolve() };
    const started: Warming = { ...w, done: yieldToRequests().then(read) };
    this.warming.set(doc.uri, started);
    return started;
  }

  /** Statistics of the latest analysis of a note. */
  statsOf(uri: string): AnalysisStats | null {
    return this.stats.get(uri) ?? null;
  }

  /** The notes whose latest analysis read any of these dependency keys (to refresh them when one changes). */
  usersOf(keys: ReadonlySet<string>): string[] {
    const out: string[] = [];
    for (const [uri, known] of this.states) if (this.depsOf(known).some((d) => keys.has(d.key))) out.push(uri);
    return out;
  }

  /** Forgets a closed note. */
  forget(uri: string): void {
    this.states.delete(uri);
    this.stats.delete(uri);
    this.runs.delete(uri);
    this.warming.delete(uri);
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

/** Server documents taken as they are; another TextDocument (a test's) as a note document of its version. */
const copies = new WeakMap<TextDocument, NoteDocument>();
function noteDocument(doc: TextDocument): NoteDocument {
  if (doc instanceof NoteDocument) return doc;
  let copy = copies.get(doc);
  if (copy?.version !== doc.version) {
    copy = new NoteDocument(doc.uri, doc.languageId, doc.version, doc.getText());
    copies.set(doc, copy);
  }
  return copy;
}

/**
 * A note's blocks, read and analysed. Each block's work is cached by its
 * body text, so after an edit only the blocks whose text changed are read
 * again; positions are mapped to the note on every call (cheap). The
 * `Analyzer` here is the thin public layer over the cache (blockCache.ts),
 * the re-read around a change (aroundChange.ts) and the bounded reading of a
 * whole note (boundedReading.ts); the names hosts import from this file are
 * defined in options.ts and documentReport.ts.
 */
import type { Externals } from '../block/externals';
import { readAroundChange } from './aroundChange';
import { BlockCache, type Cached } from './blockCache';
import { boundedProblem, firstLineEnd, readWhole } from './boundedReading';
import type { BlockReport, DocumentReport } from './documentReport';
import { DEFAULT_ANALYZER_OPTIONS, type AnalyzerOptions } from './options';
import { flatText, planReuse, type AnyText, type NoteMemory, type TextChange } from './rescanPlan';
import { isLevelsInfo, type FencedBlock } from '../text/fences';

export { DEFAULT_ANALYZER_OPTIONS, UNBOUNDED, type AnalyzerLimits, type AnalyzerOptions } from './options';
export type { BlockReport, Bounded, DocumentReport } from './documentReport';
export type { Cached } from './blockCache';

/** How many notes an Analyzer remembers for re-reading them where they changed (a host edits a few at a time). */
const NOTES_REMEMBERED = 4;

/**
 * Reads and analyses notes, caching per block body, and remembering the
 * last few notes so that a new version of one is scanned only where it
 * changed (see rescanPlan.ts). One per host is enough.
 */
export class Analyzer {
  private readonly cache: BlockCache;
  /** The notes analysed last, most recent first. */
  private notes: NoteMemory<BlockReport, Cached>[] = [];
  readonly options: AnalyzerOptions;

  constructor(options: Partial<AnalyzerOptions> = {}) {
    this.options = { ...DEFAULT_ANALYZER_OPTIONS, ...options };
    this.cache = new BlockCache(this.options);
  }

  /** True when a fence's info string marks one of our blocks. */
  isLevelsFence(block: FencedBlock): boolean {
    return isLevelsInfo(block, this.options.infoStrings);
  }

  /**
   * Finds, reads and analyses every `levels` block of a note, within the
   * limits. Never throws. The result is the same as a fresh Analyzer's; only
   * the work differs: unchanged blocks come from the cache, and a note
   * analysed recently is scanned again only from its last fence before the
   * change to its first fence after it.
   *
   * `externals` are the note's sources for values given by reference
   * (block/externals.ts). A block that read from them is reused only while
   * what it read is unchanged, so calling this again with the same text
   * after a referenced file or run changed reads exactly those blocks again.
   *
   * A host that knows where the note changed since its last analysis passes
   * it as `change`, and the two versions are not compared.
   */
  analyzeText(given: AnyText, externals: Externals | null = null, change?: TextChange): DocumentReport {
    const generation = ++this.cache.generation;
    const reuse = planReuse(this.notes, given, change);
    // A text in pieces is read in windows around the change when a remembered version is known; otherwise whole.
    const text: AnyText = typeof given !== 'string' && !reuse ? flatText(given) : given;
    const token = externals?.changes?.() ?? null;
    const memory =
      (reuse && readAroundChange(this.cache, reuse, text, externals, generation)) ??
      readWhole(this.cache, reuse, text, externals, generation);
    const full: NoteMemory<BlockReport, Cached> = { ...memory, text: given, note: externals?.note ?? null, token };
    this.remember(full, reuse?.memory ?? null);
    this.evictIfFull();
    const bounded = memory.bounded;
    const problems = bounded ? [boundedProblem(firstLineEnd(text), bounded, this.options.limits)] : [];
    const blocks = memory.reports;
    return {
      blocks,
      stats: { analysed: memory.analysed, reused: blocks.length - memory.analysed },
      bounded,
      problems,
      withProblems: memory.withProblems,
    };
  }

  /**
   * Reads one block body into the cache unless it is there, so that a later
   * analysis of its note finds it: a host warms the cache in slices of a large
   * note, between requests, before the note's first whole analysis. Returns
   * whether the body was read (false: it was cached, and what it read from
   * `externals` still holds).
   */
  warm(body: string, externals: Externals | null = null): boolean {
    if (!this.cache.warm(body, externals)) return false;
    this.evictIfFull();
    return true;
  }

  /**
   * The reports of some blocks of a note (found by the fence scan, ours only),
   * each read now unless cached: what a host needs to answer about a few
   * blocks of a note whose whole analysis is not done yet.
   */
  reportsOf(blocks: readonly FencedBlock[], externals: Externals | null = null): BlockReport[] {
    const reports = this.cache.reportsOf(blocks, externals);
    this.evictIfFull();
    return reports;
  }

  /** Reads and analyses one block body; never throws (an internal failure becomes a problem). */
  analyseBody(body: string, externals: Externals | null = null): Cached {
    return this.cache.analyseBody(body, externals);
  }

  /** Trims the cache when it is full; the remembered notes then go too (their blocks may have been dropped). */
  private evictIfFull(): void {
    if (this.cache.evictIfFull()) this.notes = [];
  }

  /** Keeps the note just analysed in place of the version it was read from (or of the oldest note). */
  private remember(note: NoteMemory<BlockReport, Cached>, from: NoteMemory<BlockReport, Cached> | null): void {
    const others = this.notes.filter((n) => n !== from);
    this.notes = [note, ...others].slice(0, NOTES_REMEMBERED);
  }

  /**
   * Forgets every cached block and remembered note (after a settings change, or after each note of the command
   * line; see BlockCache.clear for why the cache starts a new map).
   */
  clear(): void {
    this.cache.clear();
    this.notes = [];
  }
}

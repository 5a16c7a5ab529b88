/**
 * A note's blocks, read and analysed. Each block's work is cached by its
 * body text, so after an edit only the blocks whose text changed are read
 * again; positions are mapped to the note on every call (cheap).
 */
import { analyse, DEFAULT_ANALYSIS_OPTIONS, type AnalysisOptions } from '../analysis/analyse';
import type { BlockResults } from '../analysis/results';
import type { BlockInput, BlockMeta } from '../block/input';
import { interpretBody } from '../block/interpret';
import {
  dependenciesHold,
  mayHaveChanged,
  NO_DEPENDENCIES,
  type Dependency,
  type Externals,
  type KeyChanges,
} from '../block/externals';
import {
  flatText,
  movedBlock,
  planReuse,
  resumeAt,
  type AnyText,
  firstAtOrAfter,
  type NoteMemory,
  type Reuse,
  type TextChange,
} from './rescanPlan';
import { largeBlockProblem, listedProblems } from './blockBounds';
import { scanInWindows } from './windows';
import { NO_PROBLEMS, problemIndices, report, shiftReport } from './report';
import { ownCopy } from '../text/common';
import { isLevelsInfo, scanFencedBlocks, type FencedBlock } from '../text/fences';
import type { Problem, Span, Status } from '../types';

/**
 * How much of one note an analysis reads. A host that must stay responsive
 * (the language server) bounds it; reading stops before the first `levels`
 * block that would pass a bound, and the report says where and why.
 */
export interface AnalyzerLimits {
  /** Most `levels` blocks read per note. */
  readonly maxBlocks: number;
  /** Most characters of `levels` block bodies read per note, all blocks together. */
  readonly maxBodyChars: number;
  /**
   * Most characters of one block's body that are read (no bound when absent): a longer body is not read
   * and gets the error `block-large` (see blockBounds.ts).
   */
  readonly maxBlockChars?: number;
}

/** No bound: every block is read (the command line reports whole notebooks). */
export const UNBOUNDED: AnalyzerLimits = { maxBlocks: Infinity, maxBodyChars: Infinity };

/** Options of an {@link Analyzer}. */
export interface AnalyzerOptions extends AnalysisOptions {
  /** Extra fence info strings treated as `levels` blocks. */
  readonly infoStrings: readonly string[];
  /** Most blocks kept in the cache. */
  readonly cacheSize: number;
  /**
   * Most characters of block bodies kept in the cache besides those of the note analysed last: a long
   * body edited keystroke by keystroke leaves a new body each time, which a count of blocks alone would
   * let pile up to gigabytes.
   */
  readonly cacheChars: number;
  /** How much of a note is read; unbounded by default. */
  readonly limits: AnalyzerLimits;
}

/** The contract's defaults. */
export const DEFAULT_ANALYZER_OPTIONS: AnalyzerOptions = {
  ...DEFAULT_ANALYSIS_OPTIONS,
  infoStrings: [],
  cacheSize: 20_000,
  cacheChars: Infinity,
  limits: UNBOUNDED,
};

/** Where a bounded analysis stopped: the first block not read, and the bound it would have passed. */
export interface Bounded {
  /** Note offset and 0-based line of the opening fence of the first block not read. */
  readonly offset: number;
  readonly line: number;
  readonly reason: 'blocks' | 'size';
}

/** Everything known about one block; spans are offsets into the note. */
export interface BlockReport {
  readonly block: FencedBlock;
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  readonly status: Status;
  /** Every problem of the block, sorted by position, with note offsets. */
  readonly problems: readonly Problem[];
  /** What the block took from outside its text (spectrum files, other runs); empty for most blocks. */
  readonly deps: readonly Dependency[];
  /** Maps a body-relative span (as in `meta` and `results`) to note offsets. */
  toNote(span: Span): Span;
}

/** The analysis of one note. */
export interface DocumentReport {
  readonly blocks: readonly BlockReport[];
  /** How many blocks were read afresh and how many came from the cache. */
  readonly stats: { readonly analysed: number; readonly reused: number };
  /** Set when the analysis stopped at a bound (see {@link AnalyzerLimits}); the blocks from there on are not in `blocks`. */
  readonly bounded: Bounded | null;
  /** Problems of the note as a whole (note offsets), such as `note-bounded`. */
  readonly problems: readonly Problem[];
  /** Indices in `blocks` of the blocks that have problems, ascending (a host lists them without visiting every block). */
  readonly withProblems?: readonly number[];
}

export interface Cached {
  /** The body read, as stored in the cache. */
  readonly body: string;
  /** The analysis that last used it (for evicting the least recently used). */
  used: number;
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  /** Body-relative problems. */
  readonly problems: readonly Problem[];
  /** What the analysis read from outside the block, and for which note (null when nothing was read). */
  readonly deps: readonly Dependency[];
  readonly readFor: string | null;
}

/** What one analysis of a note made: its blocks and their cache entries, and how it ended. */
interface Reading {
  readonly reports: BlockReport[];
  readonly entries: Cached[];
  readonly complete: boolean;
  readonly bodyChars: number;
  readonly withProblems: readonly number[];
  readonly analysed: number;
  readonly bounded: Bounded | null;
}

/** How many notes an Analyzer remembers for re-reading them where they changed (a host edits a few at a time). */
const NOTES_REMEMBERED = 4;

/**
 * Reads and analyses notes, caching per block body, and remembering the
 * last few notes so that a new version of one is scanned only where it
 * changed (see rescanPlan.ts). One per host is enough.
 */
export class Analyzer {
  private cache = new Map<string, Cached>();
  /** Characters of the bodies in the cache. */
  private cachedChars = 0;
  /**
   * Characters past which the cache is trimmed: the bound, or half the bound more than were left at the last
   * trimming (which keeps the last note whole), so that reading a note larger than the bound trims rarely.
   */
  private evictAbove: number;
  /** The notes analysed last, most recent first. */
  private notes: NoteMemory<BlockReport, Cached>[] = [];
  /** Counts analyses, to date each cache entry's last use. */
  private generation = 0;
  readonly options: AnalyzerOptions;

  constructor(options: Partial<AnalyzerOptions> = {}) {
    this.options = { ...DEFAULT_ANALYZER_OPTIONS, ...options };
    this.evictAbove = this.options.cacheChars;
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
    const generation = ++this.generation;
    const reuse = planReuse(this.notes, given, change);
    // A text in pieces is read in windows around the change when a remembered version is known; otherwise whole.
    const text: AnyText = typeof given !== 'string' && !reuse ? flatText(given) : given;
    const token = externals?.changes?.() ?? null;
    const memory =
      (reuse && this.incremental(reuse, text, externals, generation)) ?? this.whole(reuse, text, externals, generation);
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
   * The analysis of a note from a version analysed just before, where the host said what changed: the
   * blocks before the change are taken over as they are, the note is read in windows around the change, the
   * blocks after it are the old ones (moved when the change moved them), and of these only those whose
   * outside inputs may have changed are asked again. Nothing here visits every block unless the host cannot
   * say which inputs changed or the length of the note moved the blocks after the change. Null when this does
   * not apply (no hint, a bounded note, or a bound within reach): the caller reads the note whole.
   */
  private incremental(
    reuse: Reuse<BlockReport, Cached>,
    text: AnyText,
    externals: Externals | null,
    generation: number,
  ): Reading | null {
    const old = reuse.memory;
    const { maxBlocks, maxBodyChars } = this.options.limits;
    if (!reuse.hinted || !old.complete || old.reports.length * 2 > maxBlocks || old.bodyChars * 2 > maxBodyChars)
      return null;
    let analysed = 0;
    let bodyChars = old.bodyChars;
    const fresh: BlockReport[] = [];
    const freshEntries: Cached[] = [];
    let end = old.reports.length;
    let tail: BlockReport[] = [];
    let tailEntries: readonly Cached[] = [];
    let shift = 0;
    if (!reuse.same) {
      let resume = -1;
      let lines = 0;
      const found =
        typeof text === 'string'
          ? scanFencedBlocks(text, reuse.from, reuse.line)
          : scanInWindows(text, reuse.from, reuse.line, reuse.syncFrom);
      for (const block of found) {
        const r = resumeAt(reuse, block);
        if (r >= 0) {
          resume = r;
          lines = block.openLine - old.reports[r]!.block.openLine;
          break;
        }
        if (!this.isLevelsFence(block)) continue;
        const entry = this.entryFor(block.body, externals, () => analysed++);
        entry.used = generation;
        fresh.push(report(block, entry));
        freshEntries.push(entry);
        bodyChars += entry.body.length;
      }
      end = resume >= 0 ? resume : old.reports.length;
      for (let i = reuse.keep; i < end; i++) bodyChars -= old.entries[i]!.body.length;
      if (resume >= 0 && (reuse.delta !== 0 || lines !== 0)) {
        // Moved by the change: each report is moved where it is (the only walk over the blocks after the change,
        // a few additions per block). The version read before is left behind by this one: its reports are not
        // read again (the host asks for the latest version, and the memory of the old one goes below).
        for (let i = resume; i < old.reports.length; i++) shiftReport(old.reports[i]!, reuse.delta, lines);
      }
      shift = fresh.length - (end - reuse.keep);
      if (resume >= 0 && shift !== 0) {
        tail = old.reports.slice(resume);
        tailEntries = old.entries.slice(resume);
      }
    }
    // One copy of the old lists with the changed stretch put in (or the new stretch between the two ends).
    const inPlace = reuse.same || shift === 0;
    const reports = inPlace ? old.reports.slice() : old.reports.slice(0, reuse.keep).concat(fresh, tail);
    const entries = inPlace ? old.entries.slice() : old.entries.slice(0, reuse.keep).concat(freshEntries, tailEntries);
    if (inPlace && !reuse.same)
      for (let i = 0; i < fresh.length; i++) {
        reports[reuse.keep + i] = fresh[i]!;
        entries[reuse.keep + i] = freshEntries[i]!;
      }
    if (reports.length > maxBlocks || bodyChars > maxBodyChars) return null;
    // The blocks with problems: the old ones before and after the change, and the new ones.
    const withProblems: number[] = [];
    for (const i of old.withProblems) if (i < reuse.keep) withProblems.push(i);
    for (let i = 0; i < fresh.length; i++) if (fresh[i]!.problems.length > 0) withProblems.push(reuse.keep + i);
    for (const i of old.withProblems) if (i >= end) withProblems.push(i + shift);
    // The blocks taken over whose outside inputs may have changed are asked; one that changed is read again.
    const changes: KeyChanges | null =
      externals?.changedSince && old.token !== null && old.note === externals.note
        ? externals.changedSince(old.token)
        : null;
    const freshFrom = reuse.keep;
    const freshTo = reuse.keep + fresh.length;
    let rechecked = false;
    const recheck = (i: number): void => {
      if (i >= freshFrom && i < freshTo) return;
      const e = entries[i]!;
      if (e.deps.length === 0 || dependenciesHold(e.deps, e.readFor, externals)) return;
      const entry = this.entryFor(e.body, externals, () => analysed++);
      entries[i] = entry;
      reports[i] = report(reports[i]!.block, entry);
      rechecked = true;
    };
    if (changes === null) {
      for (let i = 0; i < entries.length; i++) recheck(i);
    } else if (!changes.none) {
      const offsets = externals && changes.offsetsIn ? changes.offsetsIn(externals.note) : null;
      if (offsets) {
        for (const o of offsets) {
          const i = firstAtOrAfter(reports, o);
          if (i < reports.length && reports[i]!.block.openStart === o) recheck(i);
        }
      } else for (let i = 0; i < entries.length; i++) if (mayHaveChanged(entries[i]!.deps, changes)) recheck(i);
    }
    return {
      reports,
      entries,
      complete: true,
      bodyChars,
      withProblems: rechecked ? problemIndices(reports) : withProblems,
      analysed,
      bounded: null,
    };
  }

  /** The analysis of a note read from the top, or from where a remembered version (if any) stops holding. */
  private whole(
    reuse: Reuse<BlockReport, Cached> | null,
    text: AnyText,
    externals: Externals | null,
    generation: number,
  ): Reading {
    const { maxBlocks, maxBodyChars } = this.options.limits;
    const reports: BlockReport[] = [];
    const entries: Cached[] = [];
    let analysed = 0;
    let bodyChars = 0;
    let bounded: Bounded | null = null;
    // A remembered block holds while what it read from outside is unchanged. Its report is made again: the
    // memory it comes from may be another note's, and a report belongs to one memory (the incremental path moves
    // reports where they are).
    const admit = (r: BlockReport, e: Cached): boolean => {
      let entry = e;
      if (!dependenciesHold(e.deps, e.readFor, externals)) entry = this.entryFor(e.body, externals, () => analysed++);
      const report0 = report(r.block, entry);
      bodyChars += entry.body.length;
      if (reports.length >= maxBlocks || bodyChars > maxBodyChars) {
        const b = report0.block;
        bounded = { offset: b.openStart, line: b.openLine, reason: reports.length >= maxBlocks ? 'blocks' : 'size' };
        return false;
      }
      reports.push(report0);
      entries.push(entry);
      return true;
    };
    let open = true;
    const old = reuse?.memory;
    for (let i = 0; open && reuse && i < reuse.keep; i++) open = admit(old!.reports[i]!, old!.entries[i]!);
    if (open && !reuse?.same) {
      const found =
        typeof text === 'string'
          ? scanFencedBlocks(text, reuse?.from ?? 0, reuse?.line ?? 0)
          : scanInWindows(text, reuse?.from ?? 0, reuse?.line ?? 0, reuse?.syncFrom ?? 0);
      for (const block of found) {
        const resume = reuse ? resumeAt(reuse, block) : -1;
        if (resume >= 0) {
          // From here on the old scan holds, moved by the edit: the rest of the note is not scanned.
          const lines = block.openLine - old!.reports[resume]!.block.openLine;
          const delta = reuse!.delta;
          for (let i = resume; open && i < old!.reports.length; i++) {
            const r = old!.reports[i]!;
            const e = old!.entries[i]!;
            open = admit(delta === 0 && lines === 0 ? r : { ...r, block: movedBlock(r.block, delta, lines) }, e);
          }
          break;
        }
        if (!this.isLevelsFence(block)) continue;
        // The bound is checked on the body's length before the block is read.
        if (reports.length >= maxBlocks || bodyChars + block.body.length > maxBodyChars) {
          bodyChars += block.body.length;
          bounded = {
            offset: block.openStart,
            line: block.openLine,
            reason: reports.length >= maxBlocks ? 'blocks' : 'size',
          };
          break;
        }
        const entry = this.entryFor(block.body, externals, () => analysed++);
        open = admit(report(block, entry), entry);
      }
    }
    for (const e of entries) e.used = generation;
    return {
      reports,
      entries,
      complete: bounded === null,
      bodyChars,
      withProblems: problemIndices(reports),
      analysed,
      bounded,
    };
  }

  /**
   * The cache's reading of a body that holds for these sources, read now (and counted) when there is none.
   * The body is a stretch of this version of the note; the cache keeps a copy of its own, made before the
   * lookup, so that its hash, computed once by the lookup, serves the insertion too.
   */
  private entryFor(found: string, externals: Externals | null, counted: () => void): Cached {
    const known = this.cache.get(found);
    if (known && dependenciesHold(known.deps, known.readFor, externals)) return known;
    counted();
    const body = known ? known.body : ownCopy(found);
    const entry = this.analyseBody(body, externals);
    this.store(entry);
    return entry;
  }

  /**
   * Reads one block body into the cache unless it is there, so that a later
   * analysis of its note finds it: a host warms the cache in slices of a large
   * note, between requests, before the note's first whole analysis. Returns
   * whether the body was read (false: it was cached, and what it read from
   * `externals` still holds).
   */
  warm(body: string, externals: Externals | null = null): boolean {
    const known = this.cache.get(body);
    if (known && dependenciesHold(known.deps, known.readFor, externals)) return false;
    this.store(this.analyseBody(known ? known.body : ownCopy(body), externals));
    this.evictIfFull();
    return true;
  }

  /**
   * The reports of some blocks of a note (found by the fence scan, ours only),
   * each read now unless cached: what a host needs to answer about a few
   * blocks of a note whose whole analysis is not done yet.
   */
  reportsOf(blocks: readonly FencedBlock[], externals: Externals | null = null): BlockReport[] {
    const reports = blocks.map((b) => {
      let entry = this.cache.get(b.body);
      if (!entry || !dependenciesHold(entry.deps, entry.readFor, externals)) {
        entry = this.analyseBody(entry ? entry.body : ownCopy(b.body), externals);
        this.store(entry);
      }
      entry.used = this.generation;
      return report(b, entry);
    });
    this.evictIfFull();
    return reports;
  }

  /** Puts an entry in the cache, in place of the one of the same body if there is one, counting its characters. */
  private store(entry: Cached): void {
    const before = this.cache.get(entry.body);
    if (before) this.cachedChars -= before.body.length;
    this.cache.set(entry.body, entry);
    this.cachedChars += entry.body.length;
  }

  private evictIfFull(): void {
    if (this.cache.size > this.options.cacheSize || this.cachedChars > this.evictAbove) this.evict();
  }

  /** Keeps the note just analysed in place of the version it was read from (or of the oldest note). */
  private remember(note: NoteMemory<BlockReport, Cached>, from: NoteMemory<BlockReport, Cached> | null): void {
    const others = this.notes.filter((n) => n !== from);
    this.notes = [note, ...others].slice(0, NOTES_REMEMBERED);
  }

  /**
   * Drops the least recently used entries, down to nine tenths of the cache
   * size and half its characters, so that eviction stays rare. The characters
   * of the last analysis's blocks are not counted against the bound: a note
   * larger than it is kept whole. The remembered notes go too: their blocks
   * may be among those dropped, and must then be read again.
   */
  private evict(): void {
    const keep = Math.floor(0.9 * this.options.cacheSize);
    const keepChars = this.options.cacheChars / 2;
    const byAge = [...this.cache.values()].sort((a, b) => a.used - b.used);
    let current = 0;
    for (const e of byAge) if (e.used === this.generation) current += e.body.length;
    for (const e of byAge) {
      const overCount = this.cache.size > keep;
      if (!overCount && (e.used === this.generation || this.cachedChars - current <= keepChars)) break;
      this.cache.delete(e.body);
      this.cachedChars -= e.body.length;
      if (e.used === this.generation) current -= e.body.length;
    }
    this.evictAbove = Math.max(this.options.cacheChars, this.cachedChars + this.options.cacheChars / 2);
    this.notes = [];
  }

  /** Reads and analyses one block body; never throws (an internal failure becomes a problem). */
  analyseBody(body: string, externals: Externals | null = null): Cached {
    try {
      const maxBlockChars = this.options.limits.maxBlockChars ?? Infinity;
      if (body.length > maxBlockChars) return this.unread(body, largeBlockProblem(body, maxBlockChars));
      const interp = interpretBody(body, externals);
      const results = interp.input ? analyse(interp.input, this.options) : null;
      const all = [...interp.problems, ...(results?.problems ?? [])];
      const problems =
        all.length > 1
          ? listedProblems(
              all.sort((a, b) => a.span.start - b.span.start),
              body,
            )
          : all.length === 1
            ? all
            : NO_PROBLEMS;
      const deps = interp.deps;
      const readFor = deps.length > 0 && externals ? externals.note : null;
      return { body, used: this.generation, meta: interp.meta, input: interp.input, results, problems, deps, readFor };
    } catch (err) {
      return this.unread(body, {
        severity: 'error',
        code: 'internal-error',
        message: `Boltzmark failed on this block: ${(err as Error).message}. Please report it.`,
        span: { start: 0, end: Math.max(1, body.length) },
      });
    }
  }

  /** A block that is not read, with the one problem that says why. */
  private unread(body: string, problem: Problem): Cached {
    return {
      body,
      used: this.generation,
      meta: { id: null, idSpan: null, keys: new Map(), date: null },
      input: null,
      results: null,
      problems: [problem],
      deps: NO_DEPENDENCIES,
      readFor: null,
    };
  }

  /**
   * Forgets every cached block and remembered note (after a settings change, or after each note of the command
   * line). A new map rather than the old one emptied: an emptied map keeps a link from its old table, which the
   * collector holds as old, to the new one, so the blocks read after it outlive the young generation (over a
   * thousand notes read one after another, the young collections then took about twice as long).
   */
  clear(): void {
    this.cache = new Map();
    this.cachedChars = 0;
    this.evictAbove = this.options.cacheChars;
    this.notes = [];
  }
}

/** The note-level warning of a bounded analysis, on the note's first line. */
function boundedProblem(firstLine: number, b: Bounded, limits: AnalyzerLimits): Problem {
  const why =
    b.reason === 'blocks'
      ? `it has more than ${limits.maxBlocks.toLocaleString('en-US')} \`levels\` blocks`
      : `its \`levels\` blocks hold more than ${limits.maxBodyChars.toLocaleString('en-US')} characters`;
  return {
    severity: 'warning',
    code: 'note-bounded',
    message: `This note is read only up to line ${b.line + 1}: ${why}, more than the editor reads as you type. Blocks from line ${b.line + 1} on get no results here; \`boltzmark report\` reads the whole note, and splitting the notebook keeps every block live.`,
    span: { start: 0, end: firstLine },
  };
}

/** Offset of the end of the text's first line (before its break). */
function firstLineEnd(text: AnyText): number {
  return typeof text === 'string' ? text.search(/\r|\n|$/) : text.lineEnd(0);
}

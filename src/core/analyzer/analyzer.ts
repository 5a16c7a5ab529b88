/**
 * A note's blocks, read and analysed. Each block's work is cached by its
 * body text, so after an edit only the blocks whose text changed are read
 * again; positions are mapped to the note on every call (cheap).
 */
import { analyse, DEFAULT_ANALYSIS_OPTIONS, type AnalysisOptions } from '../analysis/analyse';
import type { BlockResults } from '../analysis/results';
import type { BlockInput, BlockMeta } from '../block/input';
import { interpretBody } from '../block/interpret';
import { dependenciesHold, NO_DEPENDENCIES, type Dependency, type Externals } from '../block/externals';
import { movedBlock, planReuse, resumeAt, type FenceRecord, type NoteMemory, type TextChange } from './rescanPlan';
import { bodyToDocument, isLevelsInfo, scanFencedBlocks, type FencedBlock } from '../text/fences';
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
}

/** No bound: every block is read (the command line reports whole notebooks). */
export const UNBOUNDED: AnalyzerLimits = { maxBlocks: Infinity, maxBodyChars: Infinity };

/** Options of an {@link Analyzer}. */
export interface AnalyzerOptions extends AnalysisOptions {
  /** Extra fence info strings treated as `levels` blocks. */
  readonly infoStrings: readonly string[];
  /** Most blocks kept in the cache. */
  readonly cacheSize: number;
  /** How much of a note is read; unbounded by default. */
  readonly limits: AnalyzerLimits;
}

/** The contract's defaults. */
export const DEFAULT_ANALYZER_OPTIONS: AnalyzerOptions = {
  ...DEFAULT_ANALYSIS_OPTIONS,
  infoStrings: [],
  cacheSize: 20_000,
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
}

interface Cached {
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

/** A fence as remembered between analyses. */
type Fence = FenceRecord<BlockReport, Cached>;

/** How many notes an Analyzer remembers for re-reading them where they changed (a host edits a few at a time). */
const NOTES_REMEMBERED = 4;

/**
 * Reads and analyses notes, caching per block body, and remembering the
 * last few notes so that a new version of one is scanned only where it
 * changed (see rescanPlan.ts). One per host is enough.
 */
export class Analyzer {
  private readonly cache = new Map<string, Cached>();
  /** The notes analysed last, most recent first. */
  private notes: NoteMemory<BlockReport, Cached>[] = [];
  /** Counts analyses, to date each cache entry's last use. */
  private generation = 0;
  readonly options: AnalyzerOptions;

  constructor(options: Partial<AnalyzerOptions> = {}) {
    this.options = { ...DEFAULT_ANALYZER_OPTIONS, ...options };
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
  analyzeText(text: string, externals: Externals | null = null, change?: TextChange): DocumentReport {
    const { maxBlocks, maxBodyChars } = this.options.limits;
    const generation = ++this.generation;
    const reuse = planReuse(this.notes, text, change);
    const fences: Fence[] = [];
    const blocks: BlockReport[] = [];
    let analysed = 0;
    let bodyChars = 0;
    let bounded: Bounded | null = null;
    // A remembered fence holds while what its block read from outside is unchanged.
    const stillHolds = (f: Fence): boolean => !f.entry || dependenciesHold(f.entry.deps, f.entry.readFor, externals);
    // Takes one fence into the analysis; false when a bound stops it there (our blocks only).
    const admit = (given: Fence): boolean => {
      const f = stillHolds(given) ? given : this.reread(given, externals, () => analysed++);
      if (f.report !== null) {
        bodyChars += f.report.block.body.length;
        if (blocks.length >= maxBlocks || bodyChars > maxBodyChars) {
          bounded = { offset: f.openStart, line: f.openLine, reason: blocks.length >= maxBlocks ? 'blocks' : 'size' };
          return false;
        }
        blocks.push(f.report);
      }
      fences.push(f);
      return true;
    };
    let open = true;
    for (let i = 0; open && reuse && i < reuse.keep; i++) open = admit(reuse.memory.fences[i]!);
    if (open && !reuse?.same) {
      for (const block of scanFencedBlocks(text, reuse?.from ?? 0, reuse?.line ?? 0)) {
        const resume = reuse ? resumeAt(reuse, block) : -1;
        if (resume >= 0) {
          // From here on the old scan holds, moved by the edit: the rest of the note is not scanned.
          const old = reuse!.memory.fences;
          const lines = block.openLine - old[resume]!.openLine;
          for (let i = resume; open && i < old.length; i++) open = admit(moved(old[i]!, reuse!.delta, lines));
          break;
        }
        if (!this.isLevelsFence(block)) {
          fences.push({ openStart: block.openStart, openLine: block.openLine, report: null, entry: null });
          continue;
        }
        // The bound is checked on the body's length before the block is read.
        if (blocks.length >= maxBlocks || bodyChars + block.body.length > maxBodyChars) {
          bodyChars += block.body.length;
          bounded = {
            offset: block.openStart,
            line: block.openLine,
            reason: blocks.length >= maxBlocks ? 'blocks' : 'size',
          };
          break;
        }
        // The body is a stretch of this version of the note; the cache keeps a copy of its own. The copy is
        // made before the lookup, so that its hash, computed once by the lookup, serves the insertion too.
        const body = ownCopy(block.body);
        let entry = this.cache.get(body);
        if (!entry || !dependenciesHold(entry.deps, entry.readFor, externals)) {
          analysed++;
          entry = this.analyseBody(body, externals);
          this.cache.set(body, entry);
        }
        open = admit({ openStart: block.openStart, openLine: block.openLine, report: report(block, entry), entry });
      }
    }
    for (const f of fences) if (f.entry) f.entry.used = generation;
    this.remember({ text, fences, complete: bounded === null }, reuse?.memory ?? null);
    if (this.cache.size > this.options.cacheSize) this.evict();
    const problems = bounded ? [boundedProblem(text, bounded, this.options.limits)] : [];
    return { blocks, stats: { analysed, reused: blocks.length - analysed }, bounded, problems };
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
    const own = ownCopy(body);
    this.cache.set(own, this.analyseBody(own, externals));
    if (this.cache.size > this.options.cacheSize) this.evict();
    return true;
  }

  /**
   * The reports of some blocks of a note (found by the fence scan, ours only),
   * each read now unless cached: what a host needs to answer about a few
   * blocks of a note whose whole analysis is not done yet.
   */
  reportsOf(blocks: readonly FencedBlock[], externals: Externals | null = null): BlockReport[] {
    return blocks.map((b) => {
      let entry = this.cache.get(b.body);
      if (!entry || !dependenciesHold(entry.deps, entry.readFor, externals)) {
        const own = ownCopy(b.body);
        entry = this.analyseBody(own, externals);
        this.cache.set(own, entry);
      }
      entry.used = this.generation;
      return report(b, entry);
    });
  }

  /**
   * A remembered block whose outside inputs changed, read again at the same place (the cache entry too,
   * unless the cache already holds a reading that still holds).
   */
  private reread(f: Fence, externals: Externals | null, counted: () => void): Fence {
    const body = f.entry!.body;
    let entry = this.cache.get(body);
    if (!entry || !dependenciesHold(entry.deps, entry.readFor, externals)) {
      counted();
      entry = this.analyseBody(body, externals);
      this.cache.set(body, entry);
    }
    return { openStart: f.openStart, openLine: f.openLine, report: report(f.report!.block, entry), entry };
  }

  /** Keeps the note just analysed in place of the version it was read from (or of the oldest note). */
  private remember(note: NoteMemory<BlockReport, Cached>, from: NoteMemory<BlockReport, Cached> | null): void {
    const others = this.notes.filter((n) => n !== from);
    this.notes = [note, ...others].slice(0, NOTES_REMEMBERED);
  }

  /**
   * Drops the least recently used entries, down to nine tenths of the cache
   * size, so that eviction stays rare. The remembered notes go too: their
   * blocks may be among those dropped, and must then be read again.
   */
  private evict(): void {
    const keep = Math.floor(0.9 * this.options.cacheSize);
    const byAge = [...this.cache.values()].sort((a, b) => a.used - b.used);
    for (let i = 0; i < byAge.length - keep; i++) this.cache.delete(byAge[i]!.body);
    this.notes = [];
  }

  /** Reads and analyses one block body; never throws (an internal failure becomes a problem). */
  analyseBody(body: string, externals: Externals | null = null): Cached {
    try {
      const interp = interpretBody(body, externals);
      const results = interp.input ? analyse(interp.input, this.options) : null;
      const all = [...interp.problems, ...(results?.problems ?? [])];
      const problems =
        all.length > 1 ? all.sort((a, b) => a.span.start - b.span.start) : all.length === 1 ? all : NO_PROBLEMS;
      const deps = interp.deps;
      const readFor = deps.length > 0 && externals ? externals.note : null;
      return { body, used: this.generation, meta: interp.meta, input: interp.input, results, problems, deps, readFor };
    } catch (err) {
      const problem: Problem = {
        severity: 'error',
        code: 'internal-error',
        message: `Boltzmark failed on this block: ${(err as Error).message}. Please report it.`,
        span: { start: 0, end: Math.max(1, body.length) },
      };
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
  }

  /** Forgets every cached block and remembered note (after a settings change). */
  clear(): void {
    this.cache.clear();
    this.notes = [];
  }
}

/**
 * A copy of a string that shares no memory with the string it came from.
 * JavaScript engines keep a substring as a view into its parent (V8 does for
 * 13 characters and more), so a cached block body sliced from the note would
 * keep that whole version of the note alive for as long as it stays cached.
 * Slicing a concatenation makes the engine lay the concatenation out flat
 * first, in new memory, and the slice then views that copy: one copy of the
 * body, far cheaper than a round trip through JSON.
 */
function ownCopy(s: string): string {
  return (s + ' ').slice(0, -1);
}

/** A remembered fence moved by an edit before it; our block's report is made again for its new place. */
function moved(f: Fence, delta: number, lines: number): Fence {
  if (delta === 0 && lines === 0) return f;
  const r = f.report;
  return {
    openStart: f.openStart + delta,
    openLine: f.openLine + lines,
    report: r && report(movedBlock(r.block, delta, lines), f.entry!),
    entry: f.entry,
  };
}

/**
 * The report of one block at its place in the note. The block is kept with
 * the cache's copy of its body (and of its info string), so that a report
 * carried over to later versions of the note holds on to none of this one.
 */
function report(found: FencedBlock, c: Cached): BlockReport {
  const levels = found.info === 'levels';
  const block: FencedBlock = {
    info: levels ? found.info : ownCopy(found.info),
    language: levels ? found.language : ownCopy(found.language),
    openLine: found.openLine,
    closeLine: found.closeLine,
    openStart: found.openStart,
    openEnd: found.openEnd,
    blockEnd: found.blockEnd,
    body: c.body,
    bodyStart: found.bodyStart,
    lines: found.lines,
    bodyLine: found.bodyLine,
  };
  const mapped = c.problems.map((p) => ({
    ...p,
    span: spanToNote(block, p.span),
    ...(p.fixes
      ? {
          fixes: p.fixes.map((f) => ({
            ...f,
            span: spanToNote(block, f.span),
            ...(f.more ? { more: f.more.map((m) => ({ ...m, span: spanToNote(block, m.span) })) } : {}),
          })),
        }
      : {}),
  }));
  const unclosed: Problem | null =
    block.closeLine !== null
      ? null
      : {
          severity: 'warning',
          code: 'fence-unclosed',
          message: 'This block has no closing fence, so it runs to the end of the note.',
          span: { start: block.openStart, end: block.openEnd },
        };
  const problems: readonly Problem[] = unclosed ? [unclosed, ...mapped] : mapped.length > 0 ? mapped : NO_PROBLEMS;
  const hasError = problems.some((p) => p.severity === 'error');
  const status: Status = hasError || !c.results ? 'invalid' : c.results.status;
  return {
    block,
    meta: c.meta,
    input: c.input,
    results: hasError ? null : c.results,
    status,
    problems,
    deps: c.deps,
    toNote: reportToNote,
  };
}

/**
 * The problem list of every block without problems (most blocks): one frozen
 * empty list instead of one per block and per version of the report.
 */
const NO_PROBLEMS: readonly Problem[] = Object.freeze([]);

/** `toNote` of every report, one function for all (a copy of a report keeps it, and it reads the copy's block). */
function reportToNote(this: BlockReport, span: Span): Span {
  return spanToNote(this.block, span);
}

/** A body-relative span as note offsets; clamped to the body first, so every span lands inside the block. */
function spanToNote(block: FencedBlock, s: Span): Span {
  const last = block.body.length;
  const from = Math.max(0, Math.min(s.start, last));
  const start = bodyToDocument(block, from);
  const end = Math.max(start, bodyToDocument(block, Math.max(from, Math.min(s.end, last))));
  return { start, end };
}

/** The note-level warning of a bounded analysis, on the note's first line. */
function boundedProblem(text: string, b: Bounded, limits: AnalyzerLimits): Problem {
  const why =
    b.reason === 'blocks'
      ? `it has more than ${limits.maxBlocks.toLocaleString('en-US')} \`levels\` blocks`
      : `its \`levels\` blocks hold more than ${limits.maxBodyChars.toLocaleString('en-US')} characters`;
  const firstLine = text.search(/\r|\n|$/);
  return {
    severity: 'warning',
    code: 'note-bounded',
    message: `This note is read only up to line ${b.line + 1}: ${why}, more than the editor reads as you type. Blocks from line ${b.line + 1} on get no results here; \`boltzmark report\` reads the whole note, and splitting the notebook keeps every block live.`,
    span: { start: 0, end: firstLine },
  };
}

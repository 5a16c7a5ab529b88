/**
 * The Analyzer's cache of block bodies: each body read once (and again only
 * when what it read from outside changed), kept by its text, dated by the
 * analysis that last used it, and trimmed to its bounds on blocks and
 * characters, the least recently used first. Also the ways a host reads a few
 * blocks alone: warming the cache in slices of a large note, and the reports
 * of some blocks before the note's whole analysis is done.
 */
import { analyse } from '../analysis/analyse';
import type { BlockResults } from '../analysis/results';
import type { BlockInput, BlockMeta } from '../block/input';
import { interpretBody } from '../block/interpret';
import { dependenciesHold, NO_DEPENDENCIES, type Dependency, type Externals } from '../block/externals';
import { largeBlockProblem, listedProblems } from './blockBounds';
import type { BlockReport } from './documentReport';
import type { AnalyzerOptions } from './options';
import { NO_PROBLEMS, report } from './report';
import { ownCopy } from '../text/common';
import type { FencedBlock } from '../text/fences';
import type { Problem } from '../types';

/** The cache's reading of one block body (body-relative), and when it was last used. */
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

/**
 * Block bodies read and analysed, by their text. One per Analyzer, which
 * dates each analysis with {@link generation} and forgets the notes it
 * remembers whenever {@link evictIfFull} drops entries.
 */
export class BlockCache {
  private cache = new Map<string, Cached>();
  /** Characters of the bodies in the cache. */
  private cachedChars = 0;
  /**
   * Characters past which the cache is trimmed: the bound, or half the bound more than were left at the last
   * trimming (which keeps the last note whole), so that reading a note larger than the bound trims rarely.
   */
  private evictAbove: number;
  /** Counts analyses, to date each cache entry's last use (the Analyzer counts one up per note analysed). */
  generation = 0;

  constructor(readonly options: AnalyzerOptions) {
    this.evictAbove = options.cacheChars;
  }

  /**
   * The cache's reading of a body that holds for these sources, read now (and counted) when there is none.
   * The body is a stretch of this version of the note; the cache keeps a copy of its own, made before the
   * lookup, so that its hash, computed once by the lookup, serves the insertion too.
   */
  entryFor(found: string, externals: Externals | null, counted: () => void): Cached {
    const known = this.cache.get(found);
    if (known && dependenciesHold(known.deps, known.readFor, externals)) return known;
    counted();
    const body = known ? known.body : ownCopy(found);
    const entry = this.analyseBody(body, externals);
    this.store(entry);
    return entry;
  }

  /**
   * Reads one block body into the cache unless it is there; returns whether it was read (false: it was
   * cached, and what it read from `externals` still holds). The caller trims the cache after.
   */
  warm(body: string, externals: Externals | null): boolean {
    const known = this.cache.get(body);
    if (known && dependenciesHold(known.deps, known.readFor, externals)) return false;
    this.store(this.analyseBody(known ? known.body : ownCopy(body), externals));
    return true;
  }

  /** The reports of some blocks of a note, each read now unless cached. The caller trims the cache after. */
  reportsOf(blocks: readonly FencedBlock[], externals: Externals | null): BlockReport[] {
    return blocks.map((b) => {
      let entry = this.cache.get(b.body);
      if (!entry || !dependenciesHold(entry.deps, entry.readFor, externals)) {
        entry = this.analyseBody(entry ? entry.body : ownCopy(b.body), externals);
        this.store(entry);
      }
      entry.used = this.generation;
      return report(b, entry);
    });
  }

  /** Puts an entry in the cache, in place of the one of the same body if there is one, counting its characters. */
  private store(entry: Cached): void {
    const before = this.cache.get(entry.body);
    if (before) this.cachedChars -= before.body.length;
    this.cache.set(entry.body, entry);
    this.cachedChars += entry.body.length;
  }

  /** Trims the cache when it is past one of its bounds; true when it did (the remembered notes must then go). */
  evictIfFull(): boolean {
    const full = this.cache.size > this.options.cacheSize || this.cachedChars > this.evictAbove;
    if (full) this.evict();
    return full;
  }

  /**
   * Drops the least recently used entries, down to nine tenths of the cache
   * size and half its characters, so that eviction stays rare. The characters
   * of the last analysis's blocks are not counted against the bound: a note
   * larger than it is kept whole. The Analyzer's remembered notes go too
   * (see {@link evictIfFull}): their blocks may be among those dropped, and
   * must then be read again.
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
  }

  /** Reads and analyses one block body; never throws (an internal failure becomes a problem). */
  analyseBody(body: string, externals: Externals | null): Cached {
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
   * Forgets every cached block. A new map rather than the old one emptied: an emptied map keeps a link from
   * its old table, which the collector holds as old, to the new one, so the blocks read after it outlive the
   * young generation (over a thousand notes read one after another, the young collections then took about
   * twice as long).
   */
  clear(): void {
    this.cache = new Map();
    this.cachedChars = 0;
    this.evictAbove = this.options.cacheChars;
  }
}

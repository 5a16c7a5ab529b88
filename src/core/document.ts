/**
 * A note's blocks, read and analysed. Each block's work is cached by its
 * body text, so after an edit only the blocks whose text changed are read
 * again; positions are mapped to the note on every call (cheap).
 */
import { analyse, DEFAULT_ANALYSIS_OPTIONS, type AnalysisOptions } from './analysis/analyse';
import type { BlockResults } from './analysis/results';
import type { BlockInput, BlockMeta } from './block/input';
import { interpretBody } from './block/interpret';
import { bodyToDocument, findFencedBlocks, type FencedBlock } from './text/fences';
import type { Problem, Span, Status } from './types';

/** Options of an {@link Analyzer}. */
export interface AnalyzerOptions extends AnalysisOptions {
  /** Extra fence info strings treated as `levels` blocks. */
  readonly infoStrings: readonly string[];
  /** Most blocks kept in the cache. */
  readonly cacheSize: number;
}

/** The contract's defaults. */
export const DEFAULT_ANALYZER_OPTIONS: AnalyzerOptions = { ...DEFAULT_ANALYSIS_OPTIONS, infoStrings: [], cacheSize: 20_000 };

/** Everything known about one block; spans are offsets into the note. */
export interface BlockReport {
  readonly block: FencedBlock;
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  readonly status: Status;
  /** Every problem of the block, sorted by position, with note offsets. */
  readonly problems: readonly Problem[];
  /** Maps a body-relative span (as in `meta` and `results`) to note offsets. */
  readonly toNote: (span: Span) => Span;
}

/** The analysis of one note. */
export interface DocumentReport {
  readonly blocks: readonly BlockReport[];
  /** How many blocks were read afresh and how many came from the cache. */
  readonly stats: { readonly analysed: number; readonly reused: number };
}

interface Cached {
  readonly meta: BlockMeta;
  readonly input: BlockInput | null;
  readonly results: BlockResults | null;
  /** Body-relative problems. */
  readonly problems: readonly Problem[];
}

/** Reads and analyses notes, caching per block body. One per host is enough. */
export class Analyzer {
  private readonly cache = new Map<string, Cached>();
  readonly options: AnalyzerOptions;

  constructor(options: Partial<AnalyzerOptions> = {}) {
    this.options = { ...DEFAULT_ANALYZER_OPTIONS, ...options };
  }

  /** True when a fence's info string marks one of our blocks. */
  isLevelsFence(block: FencedBlock): boolean {
    return block.language === 'levels' || this.options.infoStrings.includes(block.language) || this.options.infoStrings.includes(block.info);
  }

  /** Finds, reads and analyses every `levels` block of a note. Never throws. */
  analyzeText(text: string): DocumentReport {
    const blocks: BlockReport[] = [];
    let analysed = 0;
    let reused = 0;
    for (const block of findFencedBlocks(text)) {
      if (!this.isLevelsFence(block)) continue;
      let entry = this.cache.get(block.body);
      if (entry) {
        reused++;
        // Refresh its place so the cache evicts the least recently used first.
        this.cache.delete(block.body);
      } else {
        analysed++;
        entry = this.analyseBody(block.body);
      }
      this.cache.set(block.body, entry);
      blocks.push(report(block, entry));
    }
    while (this.cache.size > this.options.cacheSize) this.cache.delete(this.cache.keys().next().value as string);
    return { blocks, stats: { analysed, reused } };
  }

  /** Reads and analyses one block body; never throws (an internal failure becomes a problem). */
  analyseBody(body: string): Cached {
    try {
      const interp = interpretBody(body);
      const results = interp.input ? analyse(interp.input, this.options) : null;
      const problems = [...interp.problems, ...(results?.problems ?? [])].sort((a, b) => a.span.start - b.span.start);
      return { meta: interp.meta, input: interp.input, results, problems };
    } catch (err) {
      const problem: Problem = { severity: 'error', code: 'internal-error', message: `Boltzmark failed on this block: ${(err as Error).message}. Please report it.`, span: { start: 0, end: Math.max(1, body.length) } };
      return { meta: { id: null, idSpan: null, keys: new Map(), date: null }, input: null, results: null, problems: [problem] };
    }
  }

  /** Forgets every cached block (after a settings change). */
  clear(): void {
    this.cache.clear();
  }
}

function report(block: FencedBlock, c: Cached): BlockReport {
  const toNote = (s: Span): Span => {
    const start = bodyToDocument(block, s.start);
    const end = Math.max(start, bodyToDocument(block, s.end));
    return { start, end };
  };
  const problems: Problem[] = c.problems.map((p) => ({
    ...p,
    span: toNote(p.span),
    ...(p.fixes ? { fixes: p.fixes.map((f) => ({ ...f, span: toNote(f.span) })) } : {}),
  }));
  if (block.closeLine === null) {
    problems.unshift({
      severity: 'warning',
      code: 'fence-unclosed',
      message: 'This block has no closing fence, so it runs to the end of the note.',
      span: { start: block.openStart, end: block.openEnd },
    });
  }
  const hasError = problems.some((p) => p.severity === 'error');
  const status: Status = hasError || !c.results ? 'invalid' : c.results.status;
  return { block, meta: c.meta, input: c.input, results: hasError ? null : c.results, status, problems, toNote };
}

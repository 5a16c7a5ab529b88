/**
 * How the book of runs (runBook.ts) resolves a reference: where it leads (the
 * index), whether it closes a cycle on the graph of written references (found
 * before anything is evaluated, so the evaluation of a referenced block always
 * ends), and the run it names as a referring block sees it, evaluated by the
 * analyzer once per stamp and refused past {@link MAX_CHAIN} links.
 */
import type { Analyzer } from '../analyzer/analyzer';
import type { Externals } from '../block/externals';
import { lineOf, type BookBlock } from './bookBlocks';
import { nearIds, type BookIndex } from './bookIndex';
import type { BookStamps } from './bookStamps';
import { ChainLengths, pathTo } from './referenceGraph';
import { cellAtLine, type CellLine } from '../text/jupyter';
import {
  runCopiesKey,
  runRefKey,
  type RunAnswer,
  type RunCopies,
  type RunError,
  type RunFacts,
  type RunPlace,
} from './types';

/** The longest chain of references a run may stand at the start of: each link is evaluated inside the next. */
export const MAX_CHAIN = 32;

/** The answers of one book. */
export class BookAnswers {
  /** Chain lengths known since the last change. */
  private readonly chains: ChainLengths;

  /**
   * `externalsFor`: the analyzer's sources for a note of the book, to evaluate its blocks with; `cellStarts`:
   * where the cells of a notebook set whole start (RunBookOptions.cellStarts).
   */
  constructor(
    private readonly index: BookIndex,
    private readonly stamps: BookStamps,
    private readonly analyzer: Analyzer,
    private readonly externalsFor: (note: string) => Externals,
    private readonly cellStarts: ((note: string) => readonly CellLine[] | null) | null = null,
  ) {
    this.chains = new ChainLengths(index.follow);
  }

  /** The answer to a reference written in `from`, in the block whose body is `at`. */
  resolve(from: string, ref: { readonly note: string | null; readonly id: string }, at: string): RunAnswer {
    const key = runRefKey(from, ref.note, ref.id);
    const r = this.index.locate(from, ref);
    if (r.kind === 'missing') {
      const why = this.index.whyMissing(r.note);
      return why === null
        ? { kind: 'note-missing', note: r.note, key, stamp: this.stamps.stamp(key) }
        : { kind: 'note-missing', note: r.note, why, key, stamp: this.stamps.stamp(key) };
    }
    if (r.kind === 'unknown')
      return { kind: 'unknown', known: nearIds(ref.id, r.among), key, stamp: this.stamps.stamp(key) };
    const self = this.index.blockAt(from, at);
    if (self) {
      const chain = pathTo(r.block, self, this.index.follow);
      if (chain)
        return {
          kind: 'cycle',
          chain: [self.id ?? '?', ...chain.map((b) => b.id ?? '?')],
          key,
          stamp: this.stamps.stamp(key),
        };
    }
    return { kind: 'found', run: this.facts(r.block), key, stamp: this.stamps.stamp(key) };
  }

  /** The other blocks carrying `id`, as the block of `from` whose body is `at` sees them. */
  copies(from: string, id: string, at: string): RunCopies {
    const key = runCopiesKey(id);
    const self = this.index.blockAt(from, at, id);
    const others: RunPlace[] = [];
    for (const b of this.index.blocksWithId(id)) if (b !== self && b.place) others.push(b.place);
    return { others, key, stamp: this.stamps.stamp(key) };
  }

  /** The run a block of the book is, as a referring block sees it (evaluated once per stamp). */
  facts(b: BookBlock): RunFacts {
    const stamp = this.stamps.closure(b);
    const memo = this.stamps.evaluated.get(b);
    // The facts name lines: a block moved by an edit above it is evaluated again.
    if (memo && memo.stamp === stamp && memo.line === b.block.openLine) return memo.facts;
    const place = this.inCell(
      b.place ?? {
        note: b.note,
        span: { start: b.block.openStart, end: b.block.openEnd },
        line: b.block.openLine,
      },
    );
    if (this.chains.of(b, MAX_CHAIN + 1, this.stamps.changes) > MAX_CHAIN) {
      // Evaluated one inside the other, a longer chain could exhaust the stack: refused before it is read.
      const facts: RunFacts = {
        id: b.id ?? '',
        place,
        date: null,
        input: null,
        results: null,
        status: 'invalid',
        error: {
          code: 'reference-chain',
          message: `its references go more than ${MAX_CHAIN} runs deep; take a value from a run nearer its source`,
          severity: 'error',
          line: place.line,
          ...(place.cell ? { cell: place.cell } : {}),
        },
      };
      this.stamps.evaluated.set(b, { stamp, facts, line: b.block.openLine });
      return facts;
    }
    const c = this.analyzer.analyseBody(b.block.body, this.externalsFor(b.note));
    const first = c.problems.find((p) => p.severity === 'error') ?? null;
    const errorLine = first ? lineOf(b.block, first.span.start) : 0;
    const errorCell = first ? this.cellOf(b.note, errorLine) : null;
    const error: RunError | null = first
      ? {
          code: first.code,
          message: first.message,
          severity: first.severity,
          line: errorLine,
          ...(errorCell ? { cell: errorCell } : {}),
        }
      : null;
    const facts: RunFacts = {
      id: b.id ?? '',
      place,
      date: c.meta.date,
      input: c.input,
      results: error ? null : c.results,
      status: error || !c.results ? 'invalid' : c.results.status,
      error,
    };
    // Stamped as read: the runs it reaches were evaluated with it, and the lines where they break are now known.
    this.stamps.evaluated.set(b, { stamp: this.stamps.closure(b), facts, line: b.block.openLine });
    return facts;
  }

  /** A run's place with its cell and line in it, when the host sets its note as a notebook whole. */
  private inCell(place: RunPlace): RunPlace {
    const cell = this.cellOf(place.note, place.line);
    return cell ? { ...place, cell } : place;
  }

  /** The cell and the line in it of a line of a notebook set whole; null for another note. */
  private cellOf(note: string, line: number): CellLine | null {
    const starts = this.cellStarts?.(note) ?? null;
    return starts ? cellAtLine(starts, line) : null;
  }
}

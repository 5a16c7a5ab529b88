/**
 * A block's report at its place in a note: made from the cache's reading of
 * the body (body-relative) and the block's place, moved in place when an edit
 * before it moves the block (aroundChange.ts, the incremental path).
 */
import type { Cached } from './blockCache';
import type { BlockReport } from './documentReport';
import { shiftBlock } from './rescanPlan';
import { clipQuotes, ownCopy } from '../text/common';
import { bodyToDocument, type FencedBlock } from '../text/fences';
import type { Problem, Span, Status } from '../types';

/**
 * The report of one block at its place in the note. The block is kept with
 * the cache's copy of its body (and of its info string), so that a report
 * carried over to later versions of the note holds on to none of this one.
 */
export function report(found: FencedBlock, c: Cached): BlockReport {
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
    message: clipQuotes(p.message),
    span: spanToNote(block, p.span),
    ...(p.fixes
      ? {
          fixes: p.fixes.map((f) => ({
            ...f,
            title: clipQuotes(f.title),
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
export const NO_PROBLEMS: readonly Problem[] = Object.freeze([]);

/** `toNote` of every report, one function for all (a copy of a report keeps it, and it reads the copy's block). */
function reportToNote(this: BlockReport, span: Span): Span {
  return spanToNote(this.block, span);
}

/** A body-relative span as note offsets; clamped to the body first, so every span lands inside the block. */
export function spanToNote(block: FencedBlock, s: Span): Span {
  const last = block.body.length;
  const from = Math.max(0, Math.min(s.start, last));
  const start = bodyToDocument(block, from);
  const end = Math.max(start, bodyToDocument(block, Math.max(from, Math.min(s.end, last))));
  return { start, end };
}

/** Indices of the reports that have problems. */
export function problemIndices(reports: readonly BlockReport[]): number[] {
  const out: number[] = [];
  for (let i = 0; i < reports.length; i++) if (reports[i]!.problems.length > 0) out.push(i);
  return out;
}

/** A report's positions moved by `delta` characters and `lines` lines, in place (see {@link Analyzer.incremental}). */
export function shiftReport(r: BlockReport, delta: number, lines: number): void {
  shiftBlock(r.block, delta, lines);
  for (const p of r.problems) {
    shiftSpan(p.span, delta);
    for (const f of p.fixes ?? []) {
      shiftSpan(f.span, delta);
      for (const m of f.more ?? []) shiftSpan(m.span, delta);
    }
  }
}

/** A span's offsets moved by `delta`, in place. */
function shiftSpan(s: Span, delta: number): void {
  const w = s as { start: number; end: number };
  w.start += delta;
  w.end += delta;
}

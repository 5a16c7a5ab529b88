/**
 * Reading a note within the Analyzer's limits: from the top, or from where a
 * remembered version stops holding, up to the first `levels` block that would
 * pass a bound on blocks or characters; and the note-level warning
 * `note-bounded` that says where such a reading stopped and why.
 */
import { dependenciesHold, type Externals } from '../block/externals';
import type { BlockCache, Cached } from './blockCache';
import type { BlockReport, Bounded, Reading } from './documentReport';
import type { AnalyzerLimits } from './options';
import { problemIndices, report } from './report';
import { movedBlock, resumeAt, type AnyText, type Reuse } from './rescanPlan';
import { scanInWindows } from './windows';
import { isLevelsInfo, scanFencedBlocks } from '../text/fences';
import type { Problem } from '../types';

/** The analysis of a note read from the top, or from where a remembered version (if any) stops holding. */
export function readWhole(
  cache: BlockCache,
  reuse: Reuse<BlockReport, Cached> | null,
  text: AnyText,
  externals: Externals | null,
  generation: number,
): Reading {
  const { infoStrings, limits } = cache.options;
  const { maxBlocks, maxBodyChars } = limits;
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
    if (!dependenciesHold(e.deps, e.readFor, externals)) entry = cache.entryFor(e.body, externals, () => analysed++);
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
      if (!isLevelsInfo(block, infoStrings)) continue;
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
      const entry = cache.entryFor(block.body, externals, () => analysed++);
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

/** The note-level warning of a bounded analysis, on the note's first line. */
export function boundedProblem(firstLine: number, b: Bounded, limits: AnalyzerLimits): Problem {
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
export function firstLineEnd(text: AnyText): number {
  return typeof text === 'string' ? text.search(/\r|\n|$/) : text.lineEnd(0);
}

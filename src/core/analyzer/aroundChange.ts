/**
 * The incremental re-read of an edited note: when the host says where a note
 * analysed just before changed, only the stretch around the change is scanned
 * (in windows, for a text in pieces), the blocks before and after it are taken
 * over from the remembered version (moved in place when the change moved
 * them), and of these only those whose outside inputs may have changed are
 * read again. The Analyzer falls back to boundedReading.ts when this does not
 * apply.
 */
import { dependenciesHold, mayHaveChanged, type Externals, type KeyChanges } from '../block/externals';
import type { BlockCache, Cached } from './blockCache';
import type { BlockReport, Reading } from './documentReport';
import { problemIndices, report, shiftReport } from './report';
import { firstAtOrAfter, resumeAt, type AnyText, type Reuse } from './rescanPlan';
import { scanInWindows } from './windows';
import { isLevelsInfo, scanFencedBlocks } from '../text/fences';

/**
 * The analysis of a note from a version analysed just before, where the host said what changed: the
 * blocks before the change are taken over as they are, the note is read in windows around the change, the
 * blocks after it are the old ones (moved when the change moved them), and of these only those whose
 * outside inputs may have changed are asked again. Nothing here visits every block unless the host cannot
 * say which inputs changed or the length of the note moved the blocks after the change. Null when this does
 * not apply (no hint, a bounded note, or a bound within reach): the caller reads the note whole.
 */
export function readAroundChange(
  cache: BlockCache,
  reuse: Reuse<BlockReport, Cached>,
  text: AnyText,
  externals: Externals | null,
  generation: number,
): Reading | null {
  const old = reuse.memory;
  const { infoStrings, limits } = cache.options;
  const { maxBlocks, maxBodyChars } = limits;
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
      if (!isLevelsInfo(block, infoStrings)) continue;
      const entry = cache.entryFor(block.body, externals, () => analysed++);
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
    const entry = cache.entryFor(e.body, externals, () => analysed++);
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

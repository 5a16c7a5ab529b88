/**
 * What one block may cost (docs/format.md#block-large, #problems-not-listed).
 * In the editor a note may hold any number of blocks (the analyzer reads them
 * in slices), but one block is read in one piece, so the server bounds its size
 * (AnalyzerLimits.maxBlockChars): past half a million characters of body (a
 * series of some 50,000 numbers, far beyond a block typed into a notebook; long
 * data belong in a spectrum file) the YAML parser alone takes seconds that no
 * slice can interrupt. The command line reads every block whole. And a broken
 * block can give a problem per line: everywhere, the first hundred are listed,
 * errors before warnings, with a note of how many more there are, so that a
 * pasted log does not send hundreds of thousands of diagnostics to the editor.
 */
import { firstLine } from '../block/interpret';
import type { Problem, Severity } from '../types';

/** Most characters of one block body the language server reads. */
export const SERVER_BLOCK_CHARS = 500_000;

/** Most problems listed for one block (one more says how many are not). */
export const MAX_BLOCK_PROBLEMS = 100;

/** The error of a body above `bound` characters, on its first line; the block is not read. */
export function largeBlockProblem(body: string, bound: number): Problem {
  return {
    severity: 'error',
    code: 'block-large',
    message: `This block holds ${body.length.toLocaleString('en-US')} characters, more than the ${bound.toLocaleString('en-US')} the editor reads of one block; it is not read here (the command line reads it). Keep long data in a spectrum or text file and refer to it, or split the block.`,
    span: firstLine(body),
  };
}

const RANK: Readonly<Record<Severity, number>> = { error: 0, warning: 1, info: 2 };

/**
 * The problems of one block as listed, in body order: all of them when there are at most
 * {@link MAX_BLOCK_PROBLEMS}; otherwise that many, errors first, then warnings, then notes, each
 * kind in body order, and one note on the body's first line saying how many are not listed.
 */
export function listedProblems(sorted: Problem[], body: string): Problem[] {
  if (sorted.length <= MAX_BLOCK_PROBLEMS) return sorted;
  const kept = sorted
    .map((p, i) => ({ p, i }))
    .sort((a, b) => RANK[a.p.severity] - RANK[b.p.severity] || a.i - b.i)
    .slice(0, MAX_BLOCK_PROBLEMS)
    .sort((a, b) => a.i - b.i)
    .map((x) => x.p);
  const left = sorted.length - MAX_BLOCK_PROBLEMS;
  const errorsLeft =
    sorted.filter((p) => p.severity === 'error').length - kept.filter((p) => p.severity === 'error').length;
  kept.unshift({
    severity: 'info',
    code: 'problems-not-listed',
    message: `This block has ${left.toLocaleString('en-US')} more problem${left === 1 ? '' : 's'} than the ${MAX_BLOCK_PROBLEMS} listed${errorsLeft > 0 ? ` (${errorsLeft.toLocaleString('en-US')} of them errors)` : ''}; they show as those listed are fixed.`,
    span: firstLine(body),
  });
  return kept;
}

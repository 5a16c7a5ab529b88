/**
 * The core's speed on a large note, as ratios measured side by side:
 *
 * - full analysis (find, parse, read and analyse every block, with a fresh
 *   Analyzer so nothing is cached) against the YAML floor: `parseDocument`
 *   of the `yaml` package, with the options the block reader passes, over
 *   the same block bodies and nothing else;
 * - for information, full analysis against the package's parser alone (its
 *   `Parser`, the syntax tree without the composer), which is all of the
 *   package that plain bodies go through (src/core/block/plainBody.ts): what
 *   the reading and the physics cost on top of the least YAML work there is;
 * - an incremental edit (one character changed inside one block, then the
 *   whole note analysed again by a warm Analyzer) against the full analysis:
 *   the median of 4 × `repetitions` edits over the median full analysis.
 *
 * Each repetition times both sides back to back, alternating which goes
 * first, in a process that has been running them for a while (no forced
 * collection in between: a collector run just before a section slows what
 * follows it, both sides alike, and hides the steady state a language server
 * lives in). The ratio reported is the median of the per-repetition ratios,
 * which a busy machine disturbs least.
 */
import { parseDocument, Parser } from 'yaml';
import { Analyzer, findFencedBlocks } from '../src/core';
import { YAML_OPTIONS } from '../src/core/block/yamlTree';
import { generateNote } from './note';
import { median, timeOnce } from './stats';

/** What {@link measureCore} reports. */
export interface CoreFigures {
  readonly blocks: number;
  readonly lines: number;
  readonly megabytes: number;
  readonly repetitions: number;
  readonly floorMs: number;
  readonly fullMs: number;
  /** Median over repetitions of full / floor. */
  readonly fullRatio: number;
  /** The package's parser alone over the same bodies. */
  readonly parserMs: number;
  /** Median over repetitions of full / parser alone. */
  readonly parserRatio: number;
  readonly incrementalMs: number;
  /** Median incremental time over the median full time (both measured here). */
  readonly incrementalRatio: number;
}

/** The note of the benchmarks: 2,000 blocks, about 40,000 lines. */
export function benchNote(): string {
  return generateNote({ blocks: 2000 });
}

/**
 * The note with one character of block `index` changed: the last digit of its
 * `id` line becomes `digit`. A fresh (block, digit) pair gives a body the
 * analyzer has never seen, so exactly that block is read again.
 */
export function editNote(note: string, index: number, digit: string): string {
  const marker = `id: run ${index + 1}\n`;
  const at = note.indexOf(marker);
  if (at < 0) throw new Error(`block ${index} not found`);
  const pos = at + marker.length - 2;
  return note.slice(0, pos) + digit + note.slice(pos + 1);
}

/** Runs the measurements; `repetitions` pairs of each. */
export function measureCore(repetitions: number): CoreFigures {
  const note = benchNote();
  const bodies = findFencedBlocks(note)
    .filter((b) => b.language === 'levels')
    .map((b) => b.body);
  const floor = (): void => {
    for (const body of bodies) parseDocument(body, YAML_OPTIONS);
  };
  const full = (): void => {
    new Analyzer().analyzeText(note);
  };
  let tokens = 0;
  const parser = (): void => {
    for (const body of bodies) for (const _ of new Parser().parse(body)) tokens++;
  };
  // Warm-up: the JIT compiles both paths before anything is timed.
  for (let i = 0; i < 3; i++) {
    floor();
    full();
    parser();
  }
  const floorMs: number[] = [];
  const fullMs: number[] = [];
  const parserMs: number[] = [];
  const ratios: number[] = [];
  const parserRatios: number[] = [];
  for (let i = 0; i < repetitions; i++) {
    const times = new Map<() => void, number>();
    // The order turns each repetition, so that no side always runs first (or after the same one).
    const sides = [floor, full, parser];
    for (let k = 0; k < 3; k++) {
      const side = sides[(i + k) % 3]!;
      times.set(side, timeOnce(side));
    }
    floorMs.push(times.get(floor)!);
    fullMs.push(times.get(full)!);
    parserMs.push(times.get(parser)!);
    ratios.push(times.get(full)! / times.get(floor)!);
    parserRatios.push(times.get(full)! / times.get(parser)!);
  }
  if (tokens === 0) throw new Error('the parser gave no tokens');

  // The edit loop runs on its own, on a warm analyzer, so no full analysis leaves garbage for it to collect.
  const warm = new Analyzer();
  warm.analyzeText(note);
  const incMs: number[] = [];
  for (let i = 0; i < 4 * repetitions; i++) {
    // A different block each time (the previous one returns to its cached text).
    const edited = editNote(note, (i * 97 + 13) % 2000, 'x');
    // The engine joins an edited string lazily and its first reader pays for the copy: that is
    // receiving the edit (the server's document pays it too), not re-analysing, so it is paid here.
    void edited.indexOf('\u0000');
    let analysed = -1;
    incMs.push(
      timeOnce(() => {
        analysed = warm.analyzeText(edited).stats.analysed;
      }),
    );
    if (analysed !== 1) throw new Error(`an edit of one block re-read ${analysed} blocks`);
  }
  return {
    blocks: bodies.length,
    lines: note.split('\n').length,
    megabytes: note.length / 1e6,
    repetitions,
    floorMs: median(floorMs),
    fullMs: median(fullMs),
    fullRatio: median(ratios),
    parserMs: median(parserMs),
    parserRatio: median(parserRatios),
    incrementalMs: median(incMs),
    incrementalRatio: median(incMs) / median(fullMs),
  };
}

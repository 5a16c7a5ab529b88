/**
 * How the time to read one block grows with its size: a block of n keys
 * against a block of 10 n keys, through the whole Analyzer (fences, YAML,
 * the block readers and their diagnostics). Linear work gives a ratio near
 * 10; a stage that compares each key with every earlier one (the fault that
 * made 40,000 keys take seconds) gives near 100. Two bodies: plain keys,
 * which the plain-body reader reads from the parser's syntax tree, and the
 * same keys after a tab, which sends the body through the `yaml` composer.
 *
 * Each repetition times the small and the large block back to back,
 * alternating which goes first; the ratio reported is the median of the
 * per-repetition ratios.
 */
import { Analyzer } from '../src/core';
import { median, timeOnce } from './stats';

/** What {@link measureBlockSize} reports for one kind of body. */
export interface BlockSizeFigures {
  readonly keys: number;
  readonly smallMs: number;
  readonly largeMs: number;
  /** Median over repetitions of large / small. */
  readonly ratio: number;
}

/** A note holding one block of n distinct keys; `composer` starts it with a tab the plain reader leaves alone. */
export function keysNote(n: number, composer: boolean): string {
  const lines = composer ? ['first:\t0'] : [];
  for (let i = 0; i < n; i++) lines.push(`key${i}: ${i} K`);
  return '```levels\n' + lines.join('\n') + '\n```\n';
}

/** Times a block of `keys` keys against one of 10 × `keys`; `repetitions` pairs. */
export function measureBlockSize(keys: number, composer: boolean, repetitions: number): BlockSizeFigures {
  const small = keysNote(keys, composer);
  const large = keysNote(10 * keys, composer);
  let blocks = 0;
  const run = (note: string) => (): void => {
    blocks += new Analyzer().analyzeText(note).blocks.length;
  };
  const sides = [run(small), run(large)];
  // Warm-up: the JIT compiles the path before anything is timed.
  for (let i = 0; i < 2; i++) for (const side of sides) side();
  const smallMs: number[] = [];
  const largeMs: number[] = [];
  const ratios: number[] = [];
  for (let i = 0; i < repetitions; i++) {
    const first = i % 2;
    const t = [0, 0];
    t[first] = timeOnce(sides[first]!);
    t[1 - first] = timeOnce(sides[1 - first]!);
    smallMs.push(t[0]!);
    largeMs.push(t[1]!);
    ratios.push(t[1]! / t[0]!);
  }
  if (blocks !== 2 * (2 + repetitions)) throw new Error(`${blocks} blocks read`);
  return { keys, smallMs: median(smallMs), largeMs: median(largeMs), ratio: median(ratios) };
}

/**
 * Run parameters of the property-based tests: a fixed seed, so CI runs the
 * same cases every time and a failure reproduces, and run counts sized to keep
 * the suites within a couple of minutes on two cores. `FC_SEED=<n>` explores
 * other cases; `FC_RUNS_SCALE=<x>` multiplies every run count.
 */
import type { Parameters } from 'fast-check';

const SEED =
  Number.isSafeInteger(Number(process.env.FC_SEED)) && process.env.FC_SEED ? Number(process.env.FC_SEED) : 20260314;
const SCALE = Number(process.env.FC_RUNS_SCALE) > 0 ? Number(process.env.FC_RUNS_SCALE) : 1;

/** fast-check parameters with the suite's seed and `numRuns` cases (scaled). */
export function runs<T>(numRuns: number): Parameters<T> {
  return { seed: SEED, numRuns: Math.max(1, Math.round(numRuns * SCALE)) };
}

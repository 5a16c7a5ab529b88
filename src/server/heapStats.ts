/**
 * The server's memory use, for the tests and benchmarks
 * (`boltzmark/memory`): heap and resident set after a full garbage
 * collection when the process was started with `--expose-gc`, as is.
 */
import type { MemoryStats } from '../shared/protocol';

/** Current memory use, collected first when the collector is exposed. */
export function memoryStats(): MemoryStats {
  const gc = (globalThis as { gc?: () => void }).gc;
  gc?.();
  // In a web worker there is no process: the figures are then unknown (0), never an exception.
  const usage = (globalThis as { process?: { memoryUsage?: () => { heapUsed: number; rss: number } } }).process
    ?.memoryUsage;
  const m = usage ? usage() : { heapUsed: 0, rss: 0 };
  return { heapUsed: m.heapUsed, rss: m.rss, collected: typeof gc === 'function' };
}

/** Helpers of the spectrum file tests: a workspace in memory and spectra with known integrals. */
import type { FileStat } from '../../src/core';
import type { SpectrumFileAccess } from '../../src/server/spectra';

/** A workspace of files in memory (also used by the feature tests): URI → text and modification time; counts what was read. */
export class FakeDisk implements SpectrumFileAccess {
  readonly files = new Map<string, { text: string; mtime: number }>();
  readonly reads: string[] = [];
  readonly links = new Map<string, string>();
  put(uri: string, text: string, mtime = 1): void {
    this.files.set(uri, { text, mtime });
  }
  stat(uri: string): Promise<FileStat | null> {
    const f = this.files.get(uri);
    return Promise.resolve(f ? { size: f.text.length, mtime: f.mtime } : null);
  }
  read(uri: string): Promise<string | null> {
    this.reads.push(uri);
    return Promise.resolve(this.files.get(uri)?.text ?? null);
  }
  real(uri: string): Promise<string | null> {
    return Promise.resolve(this.links.get(uri) ?? uri);
  }
}

/**
 * A flat spectrum y = `level` on x = 0, 1, …, 100 (ppm): with `baseline: none` the trapezoidal integral over
 * [10, 20] is exactly 10 × level (common practice, no source: the trapezoid rule is exact for a constant).
 */
export function flat(level: number): string {
  const rows = ['ppm,intensity'];
  for (let x = 0; x <= 100; x++) rows.push(`${x},${level}`);
  return rows.join('\n');
}

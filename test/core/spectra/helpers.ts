/** Test hosts for spectrum references: files held in a map, read through the core's shelf like a real host. */
import { Analyzer, shelfSource, SpectrumShelf, type BlockReport, type Externals } from '../../../src/core';

/** A folder of files in memory at `/lab`; `..` and absolute paths are outside it. Change `files` and bump `versions`. */
export class MemoryFolder {
  readonly files = new Map<string, string>();
  readonly versions = new Map<string, number>();
  readonly shelf = new SpectrumShelf();

  set(name: string, text: string): this {
    this.files.set(`/lab/${name}`, text);
    this.versions.set(`/lab/${name}`, (this.versions.get(`/lab/${name}`) ?? 0) + 1);
    return this;
  }

  delete(name: string): void {
    this.files.delete(`/lab/${name}`);
  }

  externals(note = '/lab/note.md'): Externals {
    const stat = (path: string): { size: number; mtime: number } | null => {
      const t = this.files.get(path);
      return t === undefined ? null : { size: t.length, mtime: this.versions.get(path) ?? 0 };
    };
    return {
      note,
      stamp: (key) => {
        const s = stat(key.slice('file:'.length));
        return s ? `${s.size}:${s.mtime}` : null;
      },
      spectra: shelfSource(this.shelf, { stat, readText: (p) => this.files.get(p) ?? null }, (written) =>
        written.startsWith('/') || written.split('/').includes('..')
          ? { outside: 'the folder /lab' }
          : { path: `/lab/${written}` },
      ),
    };
  }

  /** Analyses one block body as a note in this folder. */
  block(body: string, analyzer = new Analyzer()): { report: BlockReport; text: string } {
    const text = `# run\n\n\`\`\`levels\n${body}\n\`\`\`\n`;
    return { report: analyzer.analyzeText(text, this.externals()).blocks[0]!, text };
  }
}

/** Two-column CSV text of a spectrum, with a header naming the x unit. */
export function csv(x: ArrayLike<number>, y: ArrayLike<number>, unit = 'ppm'): string {
  const lines = [`${unit},intensity`];
  for (let i = 0; i < x.length; i++) lines.push(`${x[i]},${y[i]}`);
  return lines.join('\n') + '\n';
}

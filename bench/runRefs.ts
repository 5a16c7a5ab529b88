/**
 * Runs by reference at the scale of a year of hyperpolarization days: a
 * workspace of 2,000 notes on disk holding 20,000 references to 40 thermal
 * reference runs (each one used by 500 runs). Measured in-process with the
 * server's own index (src/server/runs) reading the notes from disk:
 *
 * - the time to build the index (walk the folder, read and index every note);
 * - the memory it holds (heap after a garbage collection, when `--expose-gc`
 *   allows one);
 * - the cost of an edit to a reference used by 500 runs: the index updated,
 *   the notes whose analysis is stale found among the 2,000, and those notes
 *   analysed again, as the server does for open notes; set against analysing
 *   the same 500 notes afresh, and counted (only the 500 users' notes may be
 *   analysed again).
 *
 * Invented notes: only their shape matters here.
 */
import { mkdtempSync, mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { Analyzer } from '../src/core';
import { noteExternals } from '../src/server/externals';
import { Notes } from '../src/server/notes';
import { diskNotes } from '../src/server/runs/diskNotes';
import { fileUri, WorkspaceRuns } from '../src/server/runs/workspaceRuns';
import { DEFAULT_SETTINGS } from '../src/shared/settings';
import { median, now } from './stats';

const NOTES = 2000;
const RUNS_PER_NOTE = 10;
const REFERENCES = 40;

const fence = (body: string): string => '```levels\n' + body + '\n```\n';
const refBlock = (k: number, thermal: number): string =>
  fence(`id: ref ${k}
date: 2026-04-12
system: 13C
field: 9.4 T
lattice: 298 K
signal:
  thermal: ${thermal}
  scans: { thermal: 256 }
  noise: { thermal: 12 }`);
const runBlock = (id: string, ref: number): string =>
  fence(`id: ${id}
system: 13C
field: 9.4 T
signal:
  hyperpolarized: 2.985e4
  thermal: { run: ref ${ref} }
  flip: { hyperpolarized: 5 deg }`);

/** The note texts: note n holds runs 10n … 10n+9, run i referring to `ref (i mod 40)`; notes 0–39 also hold ref n. */
function noteText(n: number, thermal = 1.08e3): string {
  const parts = [`# Day ${n}\n`];
  if (n < REFERENCES) parts.push(refBlock(n, thermal));
  for (let j = 0; j < RUNS_PER_NOTE; j++) {
    const i = n * RUNS_PER_NOTE + j;
    parts.push(runBlock(`run ${i}`, i % REFERENCES));
  }
  return parts.join('\n');
}

export interface RunRefsFigures {
  readonly notes: number;
  readonly references: number;
  readonly buildMs: number;
  /** Heap held by the index, MB (null without `--expose-gc`). */
  readonly heapMb: number | null;
  readonly editMs: number;
  /** Analysing the 500 users' notes afresh, ms (the same work without the index's bookkeeping). */
  readonly freshMs: number;
  /** Notes found stale and analysed again after the edit. */
  readonly reanalysed: number;
  /** Notes that use the edited reference. */
  readonly users: number;
}

const gc = (globalThis as { gc?: () => void }).gc;

export async function measureRunRefs(reps: number): Promise<RunRefsFigures> {
  const dir = mkdtempSync(join(tmpdir(), 'bm-bench-runs-'));
  try {
    for (let n = 0; n < NOTES; n++) {
      const sub = join(dir, `month-${Math.floor(n / 200)}`);
      mkdirSync(sub, { recursive: true });
      writeFileSync(join(sub, `day-${n}.md`), noteText(n));
    }
    const uriOf = (n: number): string => fileUri(join(dir, `month-${Math.floor(n / 200)}`, `day-${n}.md`));
    gc?.();
    const heapBefore = process.memoryUsage().heapUsed;
    const t0 = now();
    const runs = new WorkspaceRuns(() => undefined, diskNotes);
    await runs.setFolders([fileUri(dir)]);
    const buildMs = now() - t0;
    gc?.();
    const heapMb = gc ? (process.memoryUsage().heapUsed - heapBefore) / 1e6 : null;
    const references = runs.book
      .noteNames()
      .reduce((k, note) => k + runs.book.blocksOf(note).reduce((m, b) => m + b.refs.length, 0), 0);

    // Every note analysed once, as if all were open.
    const notes = new Notes((uri) => noteExternals(uri, [runs]));
    const docs = Array.from({ length: NOTES }, (_, n) => TextDocument.create(uriOf(n), 'markdown', 1, noteText(n)));
    for (const d of docs) notes.get(d, DEFAULT_SETTINGS);
    const users = docs.filter((_, n) => (n * RUNS_PER_NOTE) % REFERENCES === 0).length;

    const edits: number[] = [];
    const fresh: number[] = [];
    let reanalysed = 0;
    for (let r = 0; r < reps; r++) {
      // An edit of ref 0's thermal signal (a new value each time), then what the server does for open notes.
      const text = noteText(0, 1.08e3 + r + 1);
      const start = now();
      runs.edited(uriOf(0), text);
      const stale = docs.filter((d) => d.uri !== uriOf(0) && notes.stale(d.uri));
      for (const d of stale) notes.get(d, DEFAULT_SETTINGS);
      edits.push(now() - start);
      reanalysed = stale.length;
      // The same notes analysed by an analyzer that has never seen them.
      const analyzer = new Analyzer();
      const s2 = now();
      for (const d of stale) analyzer.analyzeText(d.getText(), runs.book.externalsFor(d.uri));
      fresh.push(now() - s2);
    }
    return {
      notes: runs.book.noteNames().length,
      references,
      buildMs,
      heapMb,
      editMs: median(edits),
      freshMs: median(fresh),
      reanalysed,
      users: users - 1, // note 0 itself is the edited one
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * The run log over a large workspace (issue 18): 10,000 generated notes of
 * 20 blocks (200,000 runs) written to a temporary folder, then read as the
 * extension's run log reads a workspace (src/client/runLogView.ts: the list of
 * notes first, then the notes 16 at a time, each given to the core's RunLog),
 * in a child process started with `--expose-gc` so that its memory is its own:
 *
 * - time to the first listing (the first 16 notes read and grouped);
 * - time to read every note, and the heap after a full collection (bytes per run);
 * - one changed note: the file rewritten with one character changed and read
 *   again (only that note), and the whole listing grouped again after it
 *   (medians of 9).
 *
 * Run as `node --expose-gc --import tsx bench/workspace.ts <notes>` it prints its figures as JSON.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { RunLog } from '../src/core';
import { generateNote } from './note';
import { median, now } from './stats';

/** What {@link measureWorkspace} reports. */
export interface WorkspaceFigures {
  readonly notes: number;
  readonly runs: number;
  readonly firstListingMs: number;
  readonly allMs: number;
  readonly heapBytes: number;
  /** One changed note read again (RunLog.update), and the listing grouped again after it: medians, ms. */
  readonly changedNoteMs: number;
  readonly relistMs: number;
}

/** Reads the folder into a RunLog as the extension does, and measures (in this process). */
function readWorkspace(dir: string): WorkspaceFigures {
  const gc = (globalThis as { gc?: () => void }).gc;
  const t0 = now();
  const files = readdirSync(dir)
    .filter((f) => f.endsWith('.md'))
    .sort();
  const log = new RunLog();
  const read = (f: string): void => void log.update(join(dir, f), f, readFileSync(join(dir, f), 'utf8'));
  let firstListingMs = NaN;
  for (let i = 0; i < files.length; i += 16) {
    for (const f of files.slice(i, i + 16)) read(f);
    if (i === 0) {
      log.groups('file');
      firstListingMs = now() - t0;
    }
  }
  const runs = log.groups('file').reduce((n, g) => n + g.entries.length, 0);
  const allMs = now() - t0;
  gc?.();
  const heapBytes = process.memoryUsage().heapUsed;
  const changed: number[] = [];
  const relist: number[] = [];
  for (let k = 0; k < 9; k++) {
    const f = files[(k * 997 + 3) % files.length]!;
    const path = join(dir, f);
    const text = readFileSync(path, 'utf8').replace('id: ', `id: changed ${k} `);
    writeFileSync(path, text);
    const t = now();
    read(f);
    const t1 = now();
    log.groups('file');
    changed.push(t1 - t);
    relist.push(now() - t1);
  }
  return {
    notes: files.length,
    runs,
    firstListingMs,
    allMs,
    heapBytes,
    changedNoteMs: median(changed),
    relistMs: median(relist),
  };
}

/** Writes the workspace, reads it in a child process, removes it. */
export function measureWorkspace(notes = 10_000, blocksPerNote = 20): WorkspaceFigures {
  const dir = mkdtempSync(join(tmpdir(), 'boltzmark-bench-workspace-'));
  try {
    const note = generateNote({ blocks: blocksPerNote });
    for (let i = 0; i < notes; i++)
      writeFileSync(join(dir, `note-${String(i).padStart(5, '0')}.md`), note.replace(/id: run /g, `id: n${i} run `));
    const r = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', __filename, dir], {
      encoding: 'utf8',
      maxBuffer: 1 << 24,
    });
    if (r.status !== 0) throw new Error(`workspace bench failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as WorkspaceFigures;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[1]?.endsWith('workspace.ts') && process.argv[2]) {
  const arg = process.argv[2];
  if (/^\d+$/.test(arg)) console.log(JSON.stringify(measureWorkspace(Number(arg)), null, 2));
  else console.log(JSON.stringify(readWorkspace(arg)));
}

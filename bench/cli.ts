/**
 * The command line over many notes (issue 18): `boltzmark report --format
 * json` over a generated folder of 1,000 notes of 20 blocks, in a fresh
 * process, against the floor script bench/cliFloor.mjs (walk, read, find the
 * fences, `parseDocument` each body) in a fresh process too. CPU time of the
 * whole process (every thread) from bench/cpuOnExit.cjs, with `--workers 1`;
 * wall time measured here, with the default (one thread per core). The notes are written to a temporary folder and removed after.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateNote } from './note';
import { median, now } from './stats';

/** What {@link measureCli} reports (medians over the repetitions). */
export interface CliFigures {
  readonly notes: number;
  readonly blocksPerNote: number;
  readonly cliCpuMs: number;
  readonly floorCpuMs: number;
  /** Median of the per-repetition ratios. */
  readonly cpuRatio: number;
  readonly cliWallMs: number;
  readonly floorWallMs: number;
  readonly wallRatio: number;
  /** Peak resident set of the report over 250 and over 1,000 notes (max RSS of the child, kB → bytes). */
  readonly peakRssSmall: number | null;
  readonly peakRssLarge: number | null;
}

interface Run {
  readonly cpuMs: number;
  readonly wallMs: number;
}

function runNode(args: readonly string[]): Run {
  const t = now();
  const r = spawnSync(process.execPath, ['-r', join(__dirname, 'cpuOnExit.cjs'), ...args], {
    encoding: 'utf8',
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  const wallMs = now() - t;
  const m = /cpu-us (\d+)/.exec(r.stderr);
  if (r.status !== 0 && r.status !== 1) throw new Error(`${args.join(' ')} failed: ${r.stderr}`);
  return { cpuMs: m ? Number(m[1]) / 1000 : NaN, wallMs };
}

/** Peak resident set of one run, from GNU time when the machine has it (null otherwise). */
function peakRss(args: readonly string[]): number | null {
  const r = spawnSync('/usr/bin/time', ['-f', 'maxrss-kb %M', process.execPath, ...args], {
    encoding: 'utf8',
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  const m = /maxrss-kb (\d+)/.exec(r.stderr ?? '');
  return m ? Number(m[1]) * 1024 : null;
}

/** Writes `count` notes of `blocks` blocks into a new temporary folder. */
function writeNotes(count: number, blocks: number): string {
  const dir = mkdtempSync(join(tmpdir(), 'boltzmark-bench-cli-'));
  const note = generateNote({ blocks });
  for (let i = 0; i < count; i++)
    writeFileSync(join(dir, `note-${String(i).padStart(5, '0')}.md`), note.replace(/id: run /g, `id: n${i} run `));
  return dir;
}

export function measureCli(repetitions: number, extraArgs: readonly string[] = []): CliFigures {
  const notes = 1000;
  const blocksPerNote = 20;
  const dir = writeNotes(notes, blocksPerNote);
  const small = writeNotes(250, blocksPerNote);
  try {
    // CPU on one thread (`--workers 1`); wall time as the command runs by default (one thread per core).
    const single = ['dist/cli.js', 'report', dir, '--format', 'json', '--workers', '1', ...extraArgs];
    const cli = ['dist/cli.js', 'report', dir, '--format', 'json', ...extraArgs];
    const floor = [join(__dirname, 'cliFloor.mjs'), dir];
    const ratios: number[] = [];
    const wallRatios: number[] = [];
    const c: Run[] = [];
    const cw: Run[] = [];
    const fl: Run[] = [];
    for (let i = 0; i < repetitions; i++) {
      // The order turns round each repetition.
      const order = [0, 1, 2].map((k) => (k + i) % 3);
      const runs: Run[] = [];
      for (const k of order) runs[k] = runNode([single, cli, floor][k]!);
      const [a, w, b] = runs as [Run, Run, Run];
      c.push(a);
      cw.push(w);
      fl.push(b);
      ratios.push(a.cpuMs / b.cpuMs);
      wallRatios.push(w.wallMs / b.wallMs);
    }
    return {
      notes,
      blocksPerNote,
      cliCpuMs: median(c.map((x) => x.cpuMs)),
      floorCpuMs: median(fl.map((x) => x.cpuMs)),
      cpuRatio: median(ratios),
      cliWallMs: median(cw.map((x) => x.wallMs)),
      floorWallMs: median(fl.map((x) => x.wallMs)),
      wallRatio: median(wallRatios),
      peakRssSmall: peakRss(['dist/cli.js', 'report', small, '--format', 'json', '--workers', '1', ...extraArgs]),
      peakRssLarge: peakRss(single),
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
    rmSync(small, { recursive: true, force: true });
  }
}

if (process.argv[1]?.endsWith('cli.ts')) console.log(JSON.stringify(measureCli(Number(process.argv[2] ?? 3)), null, 2));

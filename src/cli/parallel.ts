/**
 * The JSON report on threads, for notes that need no book of runs (each note
 * then reads the same alone as among the others): the notes, read and
 * decoded here, are handed out to the threads one at a time; each thread
 * analyses its note and sends back the note's JSON entries, which are written
 * here in the order of the files, each as soon as every note before it is
 * written. A thread that fails hands its note back, and the note is analysed
 * here instead: no note's results are lost to another's failure.
 *
 * The threads run this same script (the `boltzmark` bundle), which starts
 * {@link serveNotes} when it is not the main thread.
 */
import { dirname } from 'node:path';
import { parentPort, Worker, workerData } from 'node:worker_threads';
import { Analyzer, SpectrumShelf, type Externals, type Status } from '../core';
import { jsonElement } from './formats';
import type { Io } from './main';
import { rowsOfNote, type ReadNote } from './notes';
import { noteSpectra } from './spectra';

/** One note to analyse: its place in the report, the note as read, and the folder names are relative to. */
interface Task {
  readonly index: number;
  readonly note: ReadNote;
  readonly cwd: string;
}

/** A note's part of the report. */
interface Done {
  readonly index: number;
  /** Its entries shown (the status filter applied), each formatted as inside the JSON array. */
  readonly entries: readonly string[];
  /** True when any of its blocks (shown or not) has an error. */
  readonly error: boolean;
  /** Its warnings, for standard error. */
  readonly err: string;
}

/** What a thread keeps between notes: its analyzer, and the spectrum files it parsed. */
interface Reader {
  readonly analyzer: Analyzer;
  readonly spectra: (note: string) => Externals;
}

function reader(): Reader {
  const shelf = new SpectrumShelf();
  return { analyzer: new Analyzer(), spectra: (note) => noteSpectra(shelf, note, dirname(note)) };
}

/** Analyses one note into its part of the report. */
function analyseTask(r: Reader, task: Task, statuses: readonly Status[] | null): Done {
  let err = '';
  const rows = rowsOfNote(r.analyzer, task.note, { err: (s) => void (err += s), cwd: task.cwd }, r.spectra);
  r.analyzer.clear();
  const error = rows.some((row) => row.entry.diagnostics.some((d) => d.severity === 'error'));
  const entries = rows
    .filter((row) => !statuses || statuses.includes(row.entry.status))
    .map((row) => jsonElement(row.entry));
  return { index: task.index, entries, error, err };
}

/** The thread's side: analyses each note it is sent until the main thread lets it go. */
export function serveNotes(): void {
  const port = parentPort;
  if (!port) return;
  const statuses = (workerData as { statuses: Status[] | null } | undefined)?.statuses ?? null;
  const r = reader();
  port.on('message', (task: Task) => port.postMessage(analyseTask(r, task, statuses)));
}

/**
 * Writes the JSON report of the notes using `workers` threads running `script`; resolves with the exit status
 * (1 when any block has an error).
 */
export function reportJsonParallel(
  notes: readonly ReadNote[],
  io: Io,
  statuses: readonly Status[] | null,
  workers: number,
  script: string,
): Promise<number> {
  return new Promise((resolve) => {
    const done = new Map<number, Done>();
    let nextTask = 0;
    let nextWrite = 0;
    let first = true;
    let error = false;
    let finished = false;
    let local: Reader | null = null;
    const here = (index: number): Done =>
      analyseTask((local ??= reader()), { index, note: notes[index]!, cwd: io.cwd }, statuses);
    const threads: Worker[] = [];
    const write = (): void => {
      for (let d = done.get(nextWrite); d; d = done.get(nextWrite)) {
        done.delete(nextWrite++);
        if (d.err) io.err(d.err);
        if (d.error) error = true;
        let chunk = '';
        for (const e of d.entries) {
          chunk += (first ? '[\n' : ',\n') + e;
          first = false;
        }
        if (chunk !== '') io.out(chunk);
      }
      if (nextWrite === notes.length && !finished) {
        finished = true;
        io.out(first ? '[]\n' : '\n]\n');
        for (const t of threads) void t.terminate();
        resolve(error ? 1 : 0);
      }
    };
    const give = (w: Worker, held: { task: number }): void => {
      if (nextTask >= notes.length) {
        held.task = -1;
        return;
      }
      held.task = nextTask;
      w.postMessage({ index: nextTask, note: notes[nextTask]!, cwd: io.cwd } satisfies Task);
      nextTask++;
    };
    const count = Math.max(1, Math.min(workers, notes.length));
    let alive = count;
    for (let i = 0; i < count; i++) {
      const w = new Worker(script, { workerData: { statuses } });
      const held = { task: -1 };
      threads.push(w);
      w.on('message', (d: Done) => {
        done.set(d.index, d);
        give(w, held);
        write();
      });
      w.on('error', () => {
        // This thread is gone: its note is analysed here, and the others carry on with the rest.
        if (held.task >= 0) done.set(held.task, here(held.task));
        held.task = -1;
        // With no thread left, the notes not handed out yet are analysed here too.
        if (--alive === 0) for (; nextTask < notes.length; nextTask++) done.set(nextTask, here(nextTask));
        write();
      });
      give(w, held);
    }
    write();
  });
}

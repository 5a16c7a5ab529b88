/**
 * The JSON report on threads, for notes that need no book of runs (each note
 * then reads the same alone as among the others): the notes, read and
 * decoded here, are handed out one at a time, to this thread and to the
 * others (two at a time to each of those, so the next is there while this
 * thread is busy); each thread analyses its note and sends back the note's
 * JSON entries, which are written here in the order of the files, each as
 * soon as every note before it is written. This thread starts on the first
 * notes at once, while the others start. A thread that fails or ends hands
 * back the notes it held, and they are analysed here instead: no note's
 * results are lost to another's failure.
 *
 * When a folder is given, the threads are started before the notes are read
 * ({@link startThreads}): a thread takes about as long to start as this one
 * takes to read a thousand notes and decide they need no book of runs, so
 * the two overlap. When the notes turn out to need the book, or to be too
 * few to share out, the threads are stopped unused ({@link stopThreads}).
 *
 * The threads run this same script (the `boltzmark` bundle), which starts
 * {@link serveNotes} when it is not the main thread.
 */
import { statSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
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

/** Notes a thread holds at once: the next is there when it sends back the last, while this thread is busy. */
const IN_FLIGHT = 2;

/** A thread started for the report, and what became of it before the report took it over. */
export interface Started {
  readonly worker: Worker;
  /** It runs: notes may be sent to it. */
  online: boolean;
  /** It failed or ended: it is given nothing. */
  gone: boolean;
}

/**
 * Starts `count` threads running `script`. Until the report takes them over they are only watched: a thread that
 * fails meanwhile is marked gone (an error with no listener would end the process).
 */
export function startThreads(count: number, script: string, statuses: readonly Status[] | null): Started[] {
  const out: Started[] = [];
  for (let i = 0; i < count; i++) {
    const t: Started = { worker: new Worker(script, { workerData: { statuses } }), online: false, gone: false };
    t.worker.on('online', () => (t.online = true));
    t.worker.on('error', () => (t.gone = true));
    t.worker.on('exit', () => (t.gone = true));
    out.push(t);
  }
  return out;
}

/** Stops threads the report does not use; the process does not wait for them. */
export function stopThreads(threads: readonly Started[]): void {
  for (const t of threads) {
    t.worker.unref();
    void t.worker.terminate();
  }
}

/** True when a path names a folder: then there are likely notes enough to share out, and threads start at once. */
export function folderGiven(paths: readonly string[], cwd: string): boolean {
  return paths.some((p) => {
    try {
      return p !== '-' && statSync(resolve(cwd, p)).isDirectory();
    } catch {
      return false;
    }
  });
}

/**
 * Writes the JSON report of the notes on `threads` threads, this one among them: `threads - 1` run `script`
 * (those of `started` when given, started before the notes were read), and this thread analyses the next note
 * whenever it is not writing, so it works from the first moment while the others start. Resolves with the exit
 * status (1 when any block has an error).
 */
export function reportJsonParallel(
  notes: readonly ReadNote[],
  io: Io,
  statuses: readonly Status[] | null,
  threads: number,
  script: string,
  started: readonly Started[] = [],
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
    const others: Worker[] = [];
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
        for (const t of others) void t.terminate();
        resolve(error ? 1 : 0);
      }
    };
    const give = (w: Worker, held: Set<number>): void => {
      while (held.size < IN_FLIGHT && nextTask < notes.length) {
        held.add(nextTask);
        w.postMessage({ index: nextTask, note: notes[nextTask]!, cwd: io.cwd } satisfies Task);
        nextTask++;
      }
    };
    const count = Math.max(0, Math.min(threads - 1, notes.length - 1));
    // Threads started early beyond what the notes need are stopped; those missing are started now.
    stopThreads(started.slice(count));
    const pool = [
      ...started.slice(0, count),
      ...startThreads(count - Math.min(count, started.length), script, statuses),
    ];
    for (const t of pool) {
      const w = t.worker;
      const held = new Set<number>();
      let gone = t.gone;
      others.push(w);
      w.on('message', (d: Done) => {
        // A message that comes after the thread was given up is of a note this thread analysed in its place.
        if (gone) return;
        held.delete(d.index);
        done.set(d.index, d);
        give(w, held);
        write();
      });
      // A thread that is gone (failed, or ended) leaves the notes it held to this thread; the others carry on.
      const lost = (): void => {
        gone = true;
        for (const index of held) done.set(index, here(index));
        held.clear();
        write();
      };
      w.on('error', lost);
      w.on('exit', lost);
      // Notes go to a thread once it runs: until then this thread takes them in order, and writes as it goes.
      if (t.online && !gone) give(w, held);
      else
        w.on('online', () => {
          if (!gone) give(w, held);
        });
    }
    // This thread's share: one note, then a turn of the event loop for the others' results, until none is left.
    const step = (): void => {
      if (finished) return;
      if (nextTask < notes.length) {
        const index = nextTask++;
        done.set(index, here(index));
        write();
      }
      if (nextTask < notes.length) setImmediate(step);
    };
    step();
  });
}

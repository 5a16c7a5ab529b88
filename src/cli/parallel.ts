/**
 * The JSON report on worker threads: the notes are listed here, shared out
 * to the workers one at a time (each worker reads its note, analyses it and
 * sends back the note's JSON entries), and written here in the order of the
 * files, each as soon as every note before it is written. A worker that
 * fails hands its note back, and the note is analysed here instead: no
 * note's results are lost to another's failure.
 *
 * The workers run this same script (the `boltzmark` bundle, or the module
 * named by the caller), which starts {@link serveNotes} when it is not the
 * main thread.
 */
import { parentPort, Worker, workerData } from 'node:worker_threads';
import { Analyzer, type Status } from '../core';
import { readNote, type ListedNote, type Note } from './files';
import { jsonElement } from './formats';
import { CLI_CACHE_BLOCKS, noteRows, type Io } from './main';

/** One note to analyse: its place in the report and what to read. */
interface Task {
  readonly index: number;
  readonly note: Note | ListedNote;
}

/** A note's part of the report. */
interface Done {
  readonly index: number;
  /** Its entries, each formatted as inside the JSON array. */
  readonly entries: readonly string[];
  /** True when any of its blocks (shown or not) has an error. */
  readonly error: boolean;
  /** Its warnings, for standard error. */
  readonly err: string;
}

/** Analyses one note into its part of the report. */
function analyseTask(analyzer: Analyzer, task: Task, statuses: readonly Status[] | null): Done {
  const note = 'path' in task.note ? readNote(task.note.name, task.note.path) : task.note;
  let err = '';
  const rows = noteRows(analyzer, note, { err: (s) => void (err += s) });
  const error = rows.some((r) => r.entry.diagnostics.some((d) => d.severity === 'error'));
  const entries = rows.filter((r) => !statuses || statuses.includes(r.entry.status)).map((r) => jsonElement(r.entry));
  return { index: task.index, entries, error, err };
}

/** The worker's side: analyses each task it is sent until the main thread lets it go. */
export function serveNotes(): void {
  const port = parentPort;
  if (!port) return;
  const statuses = (workerData as { statuses: Status[] | null } | undefined)?.statuses ?? null;
  const analyzer = new Analyzer({ cacheSize: CLI_CACHE_BLOCKS });
  port.on('message', (task: Task) => port.postMessage(analyseTask(analyzer, task, statuses)));
}

/**
 * Writes the JSON report of the listed notes using `workers` threads running
 * `script`; resolves with the exit status (1 when any block has an error).
 */
export function reportJsonParallel(
  listed: readonly (Note | ListedNote)[],
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
    const local = new Analyzer({ cacheSize: CLI_CACHE_BLOCKS });
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
      if (nextWrite === listed.length && !finished) {
        finished = true;
        io.out(first ? '[]\n' : '\n]\n');
        for (const t of threads) void t.terminate();
        resolve(error ? 1 : 0);
      }
    };
    const give = (w: Worker, held: { task: number }): void => {
      if (nextTask >= listed.length) {
        held.task = -1;
        return;
      }
      held.task = nextTask;
      w.postMessage({ index: nextTask, note: listed[nextTask] } satisfies Task);
      nextTask++;
    };
    const count = Math.max(1, Math.min(workers, listed.length));
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
        // This worker is gone: its note is analysed here, and the others carry on with the rest.
        if (held.task >= 0)
          done.set(held.task, analyseTask(local, { index: held.task, note: listed[held.task]! }, statuses));
        held.task = -1;
        // With no worker left, the notes not given out yet are analysed here too.
        if (--alive === 0)
          for (; nextTask < listed.length; nextTask++)
            done.set(nextTask, analyseTask(local, { index: nextTask, note: listed[nextTask]! }, statuses));
        write();
      });
      give(w, held);
    }
    write();
  });
}

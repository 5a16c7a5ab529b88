/**
 * The worker thread that parses spectrum files for the Node language server
 * (`dist/spectrumWorker.js`, started by `spectraNode.ts`), so that a large
 * file never holds up a keystroke. It takes `{ id, text, name }` and answers
 * `{ id, read }`, handing the spectrum's arrays over without copying them.
 */
import { parentPort } from 'node:worker_threads';
import { readSpectrum } from '../core';

interface Job {
  readonly id: number;
  readonly text: string;
  readonly name: string;
}

parentPort?.on('message', (job: Job) => {
  const read = readSpectrum(job.text, job.name);
  const transfer = read.ok ? [read.spectrum.x.buffer, read.spectrum.y.buffer] : [];
  parentPort!.postMessage({ id: job.id, read }, transfer as ArrayBuffer[]);
});

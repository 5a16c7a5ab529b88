/**
 * The Node language server's side of spectrum files: the disk through
 * `fs/promises` (regular files only, links followed for the workspace
 * boundary, never more than 64 MB read) and the parse in a worker thread
 * (`spectrumWorker.ts`, bundled beside the server as `dist/spectrumWorker.js`).
 * Where the worker's bundle is not there (the unbundled sources in tests) or
 * the worker fails, files are parsed in-process after the request that asked
 * for them has been answered.
 */
import { existsSync } from 'node:fs';
import { open, readdir, realpath, stat } from 'node:fs/promises';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import {
  decodeUtf8,
  readSpectrum,
  SPECTRUM_EXTENSIONS,
  SPECTRUM_MAX_BYTES,
  type FileStat,
  type SpectrumRead,
} from '../core';
import type { SpectrumFileAccess, SpectrumParser } from './spectra';

function pathOf(uri: string): string | null {
  if (!uri.startsWith('file:')) return null;
  try {
    return fileURLToPath(uri);
  } catch {
    return null;
  }
}

/** The disk, for `file:` URIs (any other scheme reads as missing). */
export const diskSpectrumAccess: SpectrumFileAccess = {
  async stat(uri: string): Promise<FileStat | null> {
    const path = pathOf(uri);
    if (!path) return null;
    try {
      const st = await stat(path);
      return st.isFile() ? { size: st.size, mtime: st.mtimeMs } : null;
    } catch {
      return null;
    }
  },
  async read(uri: string): Promise<string | null> {
    const path = pathOf(uri);
    if (!path) return null;
    let handle;
    try {
      handle = await open(path, 'r');
    } catch {
      return null;
    }
    try {
      const st = await handle.stat();
      if (!st.isFile() || st.size > SPECTRUM_MAX_BYTES) return null;
      const chunks: Buffer[] = [];
      let total = 0;
      for (;;) {
        const chunk = Buffer.allocUnsafe(Math.max(65536, Math.min(st.size - total + 1, 1 << 24)));
        const { bytesRead } = await handle.read(chunk, 0, chunk.length, null);
        if (bytesRead === 0) break;
        total += bytesRead;
        if (total > SPECTRUM_MAX_BYTES) return null;
        chunks.push(chunk.subarray(0, bytesRead));
      }
      return decodeUtf8(Buffer.concat(chunks, total)).text;
    } catch {
      return null;
    } finally {
      await handle.close();
    }
  },
  async real(uri: string): Promise<string | null> {
    const path = pathOf(uri);
    if (!path) return null;
    try {
      return pathToFileURL(await realpath(path)).href;
    } catch {
      return null;
    }
  },
};

/** Parses in this thread, after the current request has been answered. */
export const inProcessParser: SpectrumParser = (text, name) =>
  new Promise((resolve) => setImmediate(() => resolve(readSpectrum(text, name))));

/**
 * A parser in one long-lived worker thread (unreferenced, so it never keeps the process alive); falls back to
 * {@link inProcessParser} when `workerFile` is absent or the worker fails.
 */
export function workerParser(workerFile: string = join(__dirname, 'spectrumWorker.js')): SpectrumParser {
  if (!existsSync(workerFile)) return inProcessParser;
  let worker: Worker | null = null;
  let broken = false;
  let next = 0;
  const waiting = new Map<number, { resolve: (r: SpectrumRead) => void; text: string; name: string }>();
  const fail = (): void => {
    broken = true;
    worker = null;
    for (const [, w] of waiting) void inProcessParser(w.text, w.name).then(w.resolve);
    waiting.clear();
  };
  const start = (): Worker => {
    const w = new Worker(workerFile);
    w.unref();
    w.on('message', (m: { id: number; read: SpectrumRead }) => {
      const job = waiting.get(m.id);
      waiting.delete(m.id);
      job?.resolve(m.read);
    });
    w.on('error', fail);
    w.on('exit', () => {
      if (waiting.size > 0) fail();
      worker = null;
    });
    return w;
  };
  return (text, name) => {
    if (broken) return inProcessParser(text, name);
    return new Promise((resolve) => {
      const id = next++;
      waiting.set(id, { resolve, text, name });
      try {
        worker ??= start();
        worker.postMessage({ id, text, name });
      } catch {
        fail();
      }
    });
  };
}

/** Folders the listing for completions does not enter. */
const SKIPPED = new Set(['node_modules', '.git']);

/**
 * Spectrum files under a folder (URIs), for the completions after `spectrum: `: at most `max` files, at most
 * `depth` folders deep, skipping hidden folders and `node_modules`.
 */
export async function listSpectrumFiles(folderUri: string, max = 500, depth = 4): Promise<string[]> {
  const root = pathOf(folderUri);
  if (!root) return [];
  const out: string[] = [];
  const walk = async (dir: string, level: number): Promise<void> => {
    let items;
    try {
      items = await readdir(dir, { withFileTypes: true });
    } catch {
      return;
    }
    for (const it of items) {
      if (out.length >= max) return;
      const full = join(dir, it.name);
      if (it.isDirectory()) {
        if (level < depth && !it.name.startsWith('.') && !SKIPPED.has(it.name)) await walk(full, level + 1);
      } else if (it.isFile() && SPECTRUM_EXTENSIONS.some((e) => it.name.toLowerCase().endsWith(e)))
        out.push(pathToFileURL(full).href);
    }
  };
  await walk(root, 0);
  return out;
}

/**
 * Parsed spectra kept by file identity (path, size, modification time),
 * within a memory bound: a file is parsed once however many blocks and notes
 * use it, and again only when its size or time changes. Host-neutral: the
 * command line feeds it from `fs`, the language server from its reader
 * off the request path, a test from a map. The least recently used spectra
 * are dropped first when the bound is passed (the newest one stays even if
 * it alone exceeds the bound).
 */
import { readSpectrum, spectrumBytes } from './read';
import { SPECTRUM_MAX_BYTES, type SpectrumAnswer, type SpectrumRead, type SpectrumSource } from './types';

/** What identifies a file's contents without reading them. */
export interface FileStat {
  readonly size: number;
  /** Modification time in milliseconds. */
  readonly mtime: number;
}

/** The dependency stamp of a file: changes whenever its size or modification time does. */
export function fileStamp(stat: FileStat): string {
  return `${stat.size}:${stat.mtime}`;
}

/** Default memory bound of a shelf: eight 1 M-point spectra. */
export const DEFAULT_SHELF_BYTES = 128 * 1024 * 1024;

interface Held {
  readonly stamp: string;
  readonly read: SpectrumRead;
  readonly bytes: number;
}

export class SpectrumShelf {
  private readonly held = new Map<string, Held>();
  private total = 0;
  /** How many times {@link readInto} parsed a file (for tests and the benchmark: a file is parsed once). */
  parses = 0;

  constructor(readonly maxBytes: number = DEFAULT_SHELF_BYTES) {}

  /** The parsed file at `path` if it was parsed with this identity, or undefined. */
  get(path: string, stat: FileStat): SpectrumRead | undefined {
    const h = this.held.get(path);
    if (!h || h.stamp !== fileStamp(stat)) return undefined;
    // Most recently used last.
    this.held.delete(path);
    this.held.set(path, h);
    return h.read;
  }

  /** Keeps a parsed file under its identity, dropping the least recently used beyond the bound. */
  put(path: string, stat: FileStat, read: SpectrumRead): void {
    this.forget(path);
    const bytes = spectrumBytes(read);
    this.held.set(path, { stamp: fileStamp(stat), read, bytes });
    this.total += bytes;
    for (const [p, h] of this.held) {
      if (this.total <= this.maxBytes || p === path) break;
      this.held.delete(p);
      this.total -= h.bytes;
    }
  }

  /** Parses `text` as the file at `path` with this identity, keeps and returns it. */
  readInto(path: string, stat: FileStat, text: string): SpectrumRead {
    this.parses++;
    const read = readSpectrum(text, path);
    this.put(path, stat, read);
    return read;
  }

  /** Drops a file (changed or deleted). */
  forget(path: string): void {
    const h = this.held.get(path);
    if (!h) return;
    this.held.delete(path);
    this.total -= h.bytes;
  }

  /** Bytes held. */
  get bytes(): number {
    return this.total;
  }

  /** Files held. */
  get size(): number {
    return this.held.size;
  }
}

/** A host's synchronous view of its files (the command line's `fs`, a test's map). */
export interface SyncFileAccess {
  /** Size and modification time, or null when there is no such file. */
  stat(path: string): FileStat | null;
  /** The file's text (UTF-8, or Latin-1 where not valid UTF-8, as the host decides), or null when it cannot be read. */
  readText(path: string): string | null;
}

/** Where a path written in a note leads: a file the host may read, or a refusal naming the boundary. */
export type Located = { readonly path: string } | { readonly outside: string };

/**
 * A {@link SpectrumSource} that reads synchronously through `access`,
 * parsing through `shelf`. `locate` turns a path as written into the host's
 * path or refuses it; dependency keys are `file:<path>`.
 */
export function shelfSource(
  shelf: SpectrumShelf,
  access: SyncFileAccess,
  locate: (written: string) => Located,
): SpectrumSource {
  return {
    lookup(written: string): SpectrumAnswer {
      const at = locate(written);
      if ('outside' in at) return { state: 'outside', key: null, where: at.outside };
      const key = `file:${at.path}`;
      const stat = access.stat(at.path);
      if (!stat) return { state: 'missing', key, stamp: null };
      const stamp = fileStamp(stat);
      if (stat.size > SPECTRUM_MAX_BYTES) return { state: 'large', key, stamp, size: stat.size };
      let read = shelf.get(at.path, stat);
      if (!read) {
        const text = access.readText(at.path);
        if (text === null) return { state: 'missing', key, stamp: null };
        read = shelf.readInto(at.path, stat, text);
      }
      return read.ok
        ? { state: 'ready', key, stamp, spectrum: read.spectrum }
        : { state: 'malformed', key, stamp, line: read.line, message: read.message };
    },
  };
}

/**
 * Spectrum files for a host that reads them asynchronously (docs/format.md,
 * "Spectra by reference"): the `SpectrumSource` each note's blocks read
 * through, and the stamps of the files they read. The language server uses it
 * as its `ExternalPart` (src/server/spectra.ts); the client's run log, loaded
 * through the note reader, uses it over `vscode.workspace.fs`.
 *
 * A lookup answers at once from what is known. A file not yet known (or
 * reported changed by the file watcher) is looked at and parsed off the
 * request path: its stat and bytes come from the host's {@link SpectrumFileAccess}
 * (the disk in the Node server, the client's file system in the browser), the
 * parse from the host's {@link SpectrumParser} (a worker thread in the Node
 * server, in-process after the request in the browser); meanwhile the answer
 * is `pending` with a stamp of its own, and when the file is known its stamp
 * changes, so every block that used it is read again and `onChange` tells the
 * server which keys to refresh diagnostics for. Parsed spectra live in a
 * {@link SpectrumShelf} keyed by the file's identity (URI, size, time) within
 * a memory bound: a file is parsed once however many blocks and notes use it.
 *
 * Paths resolve and are held to the workspace in spectrumPaths.ts.
 * This file uses no Node built-in and no editor API: it is part of the browser server and the client too.
 */
import {
  fileStamp,
  readSpectrum,
  SPECTRUM_MAX_BYTES,
  SpectrumShelf,
  type FileStat,
  type Spectrum,
  type SpectrumAnswer,
  type SpectrumRead,
  type SpectrumSource,
} from '../core';
import { decodedUri, locateSpectrum, uriFileName, uriWithin } from './spectrumPaths';

export { locateSpectrum, noteFileUri, uriFileName, uriWithin, type SpectrumLocation } from './spectrumPaths';

/** Prefix of the dependency keys of spectrum files: `file:` then the file's URI. */
export const SPECTRUM_KEY_PREFIX = 'file:';

/** What the server may learn about a file without parsing it. */
export interface SpectrumFileAccess {
  /** Size and modification time of a regular file, or null when there is none (or it is not a regular file). */
  stat(uri: string): Promise<FileStat | null>;
  /** The file's text, or null when it cannot be read (or has grown past the bound). */
  read(uri: string): Promise<string | null>;
  /**
   * Where the file really lies when links are followed (a URI), or null when that cannot be told; a link that
   * leads out of the workspace is refused. Optional: hosts without links omit it.
   */
  real?(uri: string): Promise<string | null>;
}

/** Parses a file's text off the request path. Must never reject: a failure is `ok: false`. */
export type SpectrumParser = (text: string, fileName: string) => Promise<SpectrumRead>;

/** What is known of one file. */
type Known =
  | { readonly kind: 'missing' }
  | { readonly kind: 'outside'; readonly where: string }
  | { readonly kind: 'large'; readonly stat: FileStat }
  | { readonly kind: 'read'; readonly stat: FileStat };

interface Entry {
  /** Last settled state, or null before the first look. */
  known: Known | null;
  /** A look in progress (a stat, a read, a parse). */
  busy: boolean;
  /** A look was asked for while one was in progress: look again after it. */
  again: boolean;
  /** Generation, for the pending stamp. */
  gen: number;
}

/**
 * Parses in this thread after the current request has been answered (the browser server, which already runs
 * in a web worker of its own, so the editor's typing never waits on it).
 */
export const deferredParser: SpectrumParser = (text, name) =>
  new Promise((resolve) => setTimeout(() => resolve(readSpectrum(text, name)), 0));

/** Files a {@link SpectrumFiles} keeps track of at most, beside those holding a parsed spectrum. */
export const MAX_KNOWN_FILES = 2000;

/** Options of {@link SpectrumFiles}. */
export interface SpectrumFilesOptions {
  readonly access: SpectrumFileAccess;
  readonly parse: SpectrumParser;
  /** The workspace folders now (URIs). */
  readonly folders: () => readonly string[];
  /** Called with the keys whose answer changed after a look: the server re-analyses and refreshes the notes using them. */
  readonly onChange: (keys: readonly string[]) => void;
  /** Logs a failure that is not the file's fault (a parser that rejected). */
  readonly log?: (message: string) => void;
  /** Memory bound of the parsed spectra, bytes. */
  readonly maxBytes?: number;
}

/** A host's spectrum files: one per host, shared by every note. */
export class SpectrumFiles {
  private readonly entries = new Map<string, Entry>();
  private readonly shelf: SpectrumShelf;
  /** Parses done (tests and the benchmark check that a file is parsed once). */
  parses = 0;
  /** Looks in progress, for {@link settled}. */
  private inFlight = 0;
  /** Counts every change of what {@link stamp} may answer (see {@link changes}). */
  private version = 0;
  private waiters: (() => void)[] = [];

  constructor(private readonly options: SpectrumFilesOptions) {
    this.shelf = new SpectrumShelf(options.maxBytes);
  }

  /** A count that moves whenever a file's stamp may have changed. */
  changes(): number {
    return this.version;
  }

  /** Since `since`: nothing, or any file (the blocks that read one are few; each asks for its file's stamp). */
  changedSince(since: number): { readonly none: boolean; has(key: string): boolean } {
    return since === this.version
      ? { none: true, has: () => false }
      : { none: false, has: (key) => key.startsWith(SPECTRUM_KEY_PREFIX) };
  }

  owns(key: string): boolean {
    return key.startsWith(SPECTRUM_KEY_PREFIX);
  }

  /** The stamp of a file now, as the lookups answer it (see {@link answer}). */
  stamp(key: string): string | null {
    const e = this.entries.get(key.slice(SPECTRUM_KEY_PREFIX.length));
    if (!e || !e.known) return e ? `pending:${e.gen}` : null;
    return this.stampOf(e);
  }

  /** The note's `spectra` source (see externals.ts). */
  sourcesFor(noteUri: string): { spectra: SpectrumSource } {
    return { spectra: this.sourceFor(noteUri) };
  }

  /** The source a note's blocks read through. */
  sourceFor(noteUri: string): SpectrumSource {
    return { lookup: (written) => this.lookup(noteUri, written) };
  }

  /** The spectrum at a resolved URI when it is parsed and held (for the curve view), else null. */
  spectrumAt(uri: string): Spectrum | null {
    const e = this.entries.get(uri);
    if (!e?.known || e.known.kind !== 'read') return null;
    const r = this.shelf.get(uri, e.known.stat);
    return r?.ok ? r.spectrum : null;
  }

  /** The spectrum behind a dependency key (`file:<uri>`) when parsed and held, else null. */
  spectrumAtKey(key: string): Spectrum | null {
    return this.owns(key) ? this.spectrumAt(key.slice(SPECTRUM_KEY_PREFIX.length)) : null;
  }

  /** The files known (URIs), for the watcher's events and the tests. */
  get known(): readonly string[] {
    return [...this.entries.keys()];
  }

  /**
   * A file changed, appeared or was deleted (a watcher's event): it is looked at again when known. The old answer
   * stands until the new one is ready, so an edit of a spectrum does not flash an empty block.
   */
  changed(uri: string): void {
    if (this.entries.has(uri)) {
      this.look(uri);
      return;
    }
    // The client may spell a URI differently (`%3A` for a drive letter's colon): compare decoded.
    const want = decodedUri(uri);
    for (const known of this.entries.keys()) if (decodedUri(known) === want) this.look(known);
  }

  /** Resolves when no look is in progress (tests, the benchmark). */
  settled(): Promise<void> {
    if (this.inFlight === 0) return Promise.resolve();
    return new Promise((resolve) => this.waiters.push(resolve));
  }

  lookup(noteUri: string, written: string): SpectrumAnswer {
    const at = locateSpectrum(noteUri, written, this.options.folders());
    if ('outside' in at) return { state: 'outside', key: null, where: at.outside };
    const key = `${SPECTRUM_KEY_PREFIX}${at.uri}`;
    let e = this.entries.get(at.uri);
    if (!e) {
      this.prune();
      e = { known: null, busy: false, again: false, gen: 0 };
      this.entries.set(at.uri, e);
      this.version++;
      this.look(at.uri, at.root);
    }
    const k = e.known;
    if (!k) return { state: 'pending', key, stamp: `pending:${e.gen}` };
    switch (k.kind) {
      case 'missing':
        return { state: 'missing', key, stamp: null };
      case 'outside':
        return { state: 'outside', key: null, where: k.where };
      case 'large':
        return { state: 'large', key, stamp: fileStamp(k.stat), size: k.stat.size };
      default: {
        const read = this.shelf.get(at.uri, k.stat);
        if (!read) {
          // Dropped from the shelf by the memory bound: read again.
          e.known = null;
          e.gen++;
          this.version++;
          this.look(at.uri, at.root);
          return { state: 'pending', key, stamp: `pending:${e.gen}` };
        }
        const stamp = fileStamp(k.stat);
        return read.ok
          ? { state: 'ready', key, stamp, spectrum: read.spectrum }
          : { state: 'malformed', key, stamp, line: read.line, message: read.message };
      }
    }
  }

  /**
   * Keeps the files known within {@link MAX_KNOWN_FILES}: typing a path looks up every prefix of it, each a file
   * that is not there. The oldest entries that hold no spectrum go first.
   */
  private prune(): void {
    if (this.entries.size < MAX_KNOWN_FILES) return;
    for (const [uri, e] of this.entries) {
      if (this.entries.size < MAX_KNOWN_FILES * 0.9) break;
      if (!e.busy && e.known && e.known.kind !== 'read') {
        this.entries.delete(uri);
        this.roots.delete(uri);
        this.version++;
      }
    }
  }

  private stampOf(e: Entry): string | null {
    const k = e.known!;
    if (k.kind === 'missing' || k.kind === 'outside') return null;
    return fileStamp(k.stat);
  }

  /** Roots by URI, remembered from the lookups (a watcher's event carries no note). */
  private readonly roots = new Map<string, string>();

  private look(uri: string, root?: string): void {
    if (root) this.roots.set(uri, root);
    const e = this.entries.get(uri);
    if (!e) return;
    if (e.busy) {
      e.again = true;
      return;
    }
    e.busy = true;
    this.inFlight++;
    const before = e.known === null ? `pending:${e.gen}` : this.stampOf(e);
    void this.settle(uri)
      .catch((err: unknown): Known => {
        this.options.log?.(`boltzmark: reading ${uri} failed: ${String(err)}`);
        return { kind: 'missing' };
      })
      .then((known) => {
        this.version++;
        e.known = known;
        e.busy = false;
        const after = this.stampOf(e);
        const again = e.again;
        e.again = false;
        if (again) this.look(uri);
        this.inFlight--;
        if (after !== before || known.kind === 'outside') this.options.onChange([`${SPECTRUM_KEY_PREFIX}${uri}`]);
        if (this.inFlight === 0) for (const w of this.waiters.splice(0)) w();
      });
  }

  /** Looks at a file: stat, boundary after links, size, and the parse unless this identity is held already. */
  private async settle(uri: string): Promise<Known> {
    const { access } = this.options;
    const stat = await access.stat(uri);
    if (!stat) {
      this.shelf.forget(uri);
      return { kind: 'missing' };
    }
    const root = this.roots.get(uri);
    if (access.real && root) {
      const [real, realRoot] = await Promise.all([access.real(uri), access.real(root)]);
      if (real && realRoot && !uriWithin(realRoot, real)) return { kind: 'outside', where: 'the workspace folder' };
    }
    if (stat.size > SPECTRUM_MAX_BYTES) return { kind: 'large', stat };
    if (this.shelf.get(uri, stat)) return { kind: 'read', stat };
    const text = await access.read(uri);
    if (text === null) return { kind: 'missing' };
    this.parses++;
    const read = await this.options.parse(text, uriFileName(uri));
    this.shelf.put(uri, stat, read);
    return { kind: 'read', stat };
  }
}

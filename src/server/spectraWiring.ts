/**
 * Wires the server's spectrum files to the connection: the host's file
 * access (the disk in the Node server) with the client's file system for
 * other schemes (and for everything in the browser), the watcher of spectrum
 * files (`workspace/didChangeWatchedFiles`, registered dynamically so that
 * the client watches them) and the refresh of every open note that uses a
 * file whose answer changed: its diagnostics are pushed again (push clients)
 * or the client is asked to pull them again, with its lenses and hints.
 */
import { CodeLensRefreshRequest, type Connection, type TextDocuments } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { SPECTRUM_EXTENSIONS, type FileStat } from '../core';
import { FileStatRequest, FileTextRequest } from '../shared/protocol';
import { background, type ClientCaps } from './clientCaps';
import type { Notes } from './notes';
import { SpectrumFiles, type SpectrumFileAccess, type SpectrumParser } from './spectra';

/** What the host (Node or browser) gives for spectrum files; absent parts fall back to the client and in-process. */
export interface SpectrumHost {
  /** The host's own access (the disk, for `file:` URIs); other URIs go to the client. */
  readonly access?: SpectrumFileAccess;
  /** The parse off the request path (a worker thread in Node). */
  readonly parse: SpectrumParser;
  /** Spectrum files under a folder (URIs), for completions; bounded by the host. */
  readonly list?: (folderUri: string) => Promise<string[]>;
}

/** The glob the client watches: every ending a spectrum reference may point at. */
export const SPECTRUM_GLOB = `**/*.{${SPECTRUM_EXTENSIONS.map((e) => e.slice(1)).join(',')}}`;

/** File access through the client's `vscode.workspace.fs` (`boltzmark/fileStat`, `boltzmark/fileText`). */
export function clientAccess(connection: Connection): SpectrumFileAccess {
  return {
    stat: (uri) =>
      connection.sendRequest(FileStatRequest, { uri }).then(
        (r): FileStat | null => (r && typeof r.size === 'number' && typeof r.mtime === 'number' ? r : null),
        () => null,
      ),
    read: (uri) =>
      connection.sendRequest(FileTextRequest, { uri }).then(
        (r) => (typeof r === 'string' ? r : null),
        () => null,
      ),
  };
}

/** The host's access for `file:` URIs, the client's for the rest. */
function combined(own: SpectrumFileAccess | undefined, client: SpectrumFileAccess): SpectrumFileAccess {
  if (!own) return client;
  const pick = (uri: string): SpectrumFileAccess => (uri.startsWith('file:') ? own : client);
  return {
    stat: (uri) => pick(uri).stat(uri),
    read: (uri) => pick(uri).read(uri),
    real: (uri) => pick(uri).real?.(uri) ?? Promise.resolve(null),
  };
}

/** What {@link wireSpectra} needs of the server. */
export interface SpectraWiringContext {
  readonly connection: Connection;
  readonly documents: TextDocuments<TextDocument>;
  readonly notes: () => Notes;
  readonly caps: () => ClientCaps;
  readonly folders: () => readonly string[];
  /** Pushes a note's diagnostics (push clients). */
  readonly push: (uri: string) => void;
}

/** Creates the server's spectrum files and follows their changes. */
export function wireSpectra(ctx: SpectraWiringContext, host: SpectrumHost): SpectrumFiles {
  const { connection } = ctx;
  const files = new SpectrumFiles({
    access: combined(host.access, clientAccess(connection)),
    parse: host.parse,
    folders: ctx.folders,
    log: (m) => connection.console.warn(m),
    onChange: (keys) => refresh(new Set(keys)),
  });
  const refresh = (keys: ReadonlySet<string>): void => {
    const users = ctx.notes().usersOf(keys);
    if (users.length === 0) return;
    const caps = ctx.caps();
    if (!caps.pull) {
      for (const uri of users) if (ctx.documents.get(uri)) ctx.push(uri);
    } else if (caps.refresh.diagnostics)
      background(connection, 'workspace/diagnostic/refresh', connection.languages.diagnostics.refresh());
    if (caps.refresh.inlayHints)
      background(connection, 'workspace/inlayHint/refresh', connection.languages.inlayHint.refresh());
    if (caps.refresh.codeLens)
      background(connection, 'workspace/codeLens/refresh', connection.sendRequest(CodeLensRefreshRequest.type));
  };
  // server.ts passes the watched-file events on to `files.changed` (one handler serves spectra and notes).
  return files;
}

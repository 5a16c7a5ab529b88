/**
 * Wires the LSP connection to the features: the client's capabilities and
 * settings, the open notes' lifecycle, the workspace's runs and spectrum
 * files, and `serve`, the one shape of every request about a note (find the
 * note, return empty when it is unknown, stop when cancelled, delegate to the
 * feature, return), whose routes are in featureRequests.ts. No logic lives
 * here.
 */
import { noteExternals, type ExternalPart } from './externals';
import {
  CodeActionKind,
  CodeLensRefreshRequest,
  DidChangeConfigurationNotification,
  DidChangeWatchedFilesNotification,
  ResponseError,
  FileChangeType,
  WatchKind,
  TextDocuments,
  TextDocumentSyncKind,
  type CancellationToken,
  type Connection,
  type InitializeParams,
  type InitializeResult,
} from 'vscode-languageserver';
import { version } from '../../package.json';
import { background, clientCaps, refreshAfter, type ClientCaps } from './clientCaps';
import { noteDiagnostics } from './diagnostics';
import { Debouncer } from '../shared/debouncer';
import { CODE_ACTION_FIX_ALL } from './features/codeActions';
import { cancelled, routeFeatures } from './featureRequests';
import { Notes } from './notes';
import type { ProtocolGuard } from './protocolGuard';
import { ClosedReferrers } from './runs/closedReferrers';
import { notebookOfCell, WorkspaceRuns, type NoteFiles } from './runs/workspaceRuns';
import { noteDocuments, type NoteDocument } from './noteDocument';
import type { Settings } from '../shared/settings';
import { SettingsStore, type SettingsChange } from './settingsStore';
import type { NoteState } from './state';
import { deferredParser } from './spectra';
import { SPECTRUM_GLOB, wireSpectra, type SpectrumHost } from './spectraWiring';

/** The debouncer's key of a change in the index of runs. */
const RUNS_CHANGED = '\u0000runs';

/** What the host gives the server beyond the connection. */
export interface ServerHost {
  /** Reads the notes of the workspace folders that are not open (for runs by reference); without it only the open notes are indexed. */
  readonly notes?: NoteFiles | null;
  /**
   * How spectrum files are read and parsed (the Node server: the disk and a worker thread); without it, files
   * come through the client's file system and are parsed in-process after the request.
   */
  readonly spectra?: SpectrumHost;
  /**
   * Calls `heard` whenever bytes from the client arrive, before they are read as a message: the slices that read
   * a large note then stand aside at once, not after the message is parsed and queued behind the next slice.
   */
  readonly onInput?: (heard: () => void) => void;
  /**
   * The protocol's rules at the door (protocolGuard.ts), given to the connection as its message strategy when it
   * was made; attached here. Without it the connection takes every message as it comes.
   */
  readonly guard?: ProtocolGuard;
}

/** Pause after the last keystroke before pushed diagnostics are sent. */
const PUSH_DELAY_MS = 200;

/**
 * Starts serving on a connection (stdio, IPC or socket: the connection decides), with what the host can do
 * (see {@link ServerHost}).
 */
export function startServer(connection: Connection, host: ServerHost = {}): void {
  const files = host.notes ?? null;
  const spectrumHost: SpectrumHost = host.spectra ?? { parse: deferredParser };
  // stdout may be the protocol channel: route console output to the client's log instead.
  console.log = connection.console.log.bind(connection.console);
  console.info = connection.console.info.bind(connection.console);
  console.warn = connection.console.warn.bind(connection.console);
  console.error = connection.console.error.bind(connection.console);
  host.guard?.attach(connection, (message) => connection.console.warn(message));

  const documents = new TextDocuments<NoteDocument>(noteDocuments);
  // The sources values by reference come from (spectrum files, other runs); each adds its part.
  const externalParts: ExternalPart[] = [];
  const notes = new Notes((uri) => (externalParts.length > 0 ? noteExternals(uri, externalParts) : null));
  host.onInput?.(() => notes.heard());
  const pushes = new Debouncer(PUSH_DELAY_MS);
  // Every run of the workspace, for `{ run: … }` references; a change re-publishes the notes that used it.
  // A referenced block whose own values come from spectrum files reads them as its note does.
  const runs = new WorkspaceRuns(
    () => pushes.schedule(RUNS_CHANGED, () => republishStale()),
    files,
    undefined,
    (note) => noteExternals(note, [spectra]),
  );
  externalParts.push(runs);
  let caps: ClientCaps = clientCaps(undefined);
  const log = (message: string): void => connection.console.warn(message);
  const changed = (change: SettingsChange): void =>
    refreshAfter(connection, caps, change, documents, (uri) => pushes.schedule(uri, () => push(uri)));
  let settings = new SettingsStore(null, log, changed);
  let folders: string[] = [];
  const spectra = wireSpectra(
    { connection, documents, notes: () => notes, caps: () => caps, folders: () => folders, push: (uri) => push(uri) },
    spectrumHost,
  );
  externalParts.push(spectra);
  // Closed notes that refer to a changed run get their reference diagnostics pushed (runs/closedReferrers.ts).
  const closedReferrers = new ClosedReferrers(runs, (uri) => noteExternals(uri, externalParts));

  /**
   * The note's analysis and settings, once its folder's settings are known; null for an unknown note. With `near`
   * (a range of lines), a note still being read in slices answers at once with the blocks in that range only;
   * without, the answer waits for the whole note's analysis.
   */
  const note = async (
    uri: string,
    near?: { startLine: number; endLine: number },
  ): Promise<{ state: NoteState; settings: Settings } | null> => {
    if (!documents.get(uri)) return null;
    const s = await settings.get(uri);
    let doc = documents.get(uri); // the latest version: an edit may have come in while the settings did
    if (doc && near) {
      const from = doc.lines.lineStart(near.startLine);
      const to = doc.lines.lineEnd(near.endLine);
      return { state: notes.around(doc, s, from, to), settings: s };
    }
    if (doc) await notes.prepare(doc, s);
    doc = documents.get(uri); // and again after the slices
    return doc ? { state: notes.get(doc, s), settings: s } : null;
  };
  /**
   * Runs a feature for a request about an open note; `empty` for a note that is not open. A request the client
   * cancelled fails with RequestCancelled (-32800), as the protocol advises, rather than answering empty, which a
   * client could take for the note's answer. `near`: see `note`.
   */
  const serve = async <T>(
    uri: string,
    token: CancellationToken | undefined,
    empty: T,
    fn: (s: NoteState, settings: Settings) => T,
    near?: { startLine: number; endLine: number },
  ): Promise<T> => {
    notes.heard();
    if (token?.isCancellationRequested) throw cancelled();
    try {
      const n = near ? await notes.answering(() => note(uri, near)) : await note(uri);
      if (token?.isCancellationRequested) throw cancelled();
      if (!n) return empty;
      return fn(n.state, n.settings);
    } catch (err) {
      // A refusal meant for the user (an id a rename cannot take) goes back as the request's error.
      if (err instanceof ResponseError) throw err;
      connection.console.error(`boltzmark: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
      return empty;
    }
  };
  const push = (uri: string): void => {
    const sent = note(uri).then((n) =>
      n
        ? connection.sendDiagnostics({ uri, version: n.state.version, diagnostics: noteDiagnostics(n.state) })
        : undefined,
    );
    background(connection, 'publishing diagnostics', sent);
  };

  /**
   * After the index of runs changed: the open notes whose analysis read a run that changed are published again
   * (pushed, or the client is asked to pull again); the others keep their analysis.
   */
  const republishStale = (): void => {
    for (const p of closedReferrers.update())
      background(connection, 'publishing the diagnostics of a closed note', connection.sendDiagnostics(p));
    const stale = documents.all().filter((d) => notes.stale(d.uri));
    if (stale.length === 0) return;
    if (!caps.pull) for (const d of stale) push(d.uri);
    else if (caps.refresh.diagnostics)
      background(connection, 'workspace/diagnostic/refresh', connection.languages.diagnostics.refresh());
    if (caps.refresh.codeLens && caps.lensCommands)
      background(connection, 'workspace/codeLens/refresh', connection.sendRequest(CodeLensRefreshRequest.type));
  };
  /** Like `serve`, once the first reading of the workspace's notes is over (for features that span notes). */
  const serveRuns = async <T>(
    uri: string,
    token: CancellationToken | undefined,
    empty: T,
    fn: (s: NoteState, settings: Settings) => T,
  ): Promise<T> => {
    await runs.ready();
    return serve(uri, token, empty, fn);
  };

  connection.onInitialize((params: InitializeParams): InitializeResult => {
    caps = clientCaps(params.capabilities);
    settings = new SettingsStore(
      caps.configuration
        ? (scopeUri) => connection.workspace.getConfiguration({ scopeUri, section: 'boltzmark' }) as Promise<unknown>
        : null,
      log,
      changed,
    );
    settings.setFallback(params.initializationOptions);
    folders = params.workspaceFolders?.map((f) => f.uri) ?? (params.rootUri ? [params.rootUri] : []);
    settings.setFolders(folders);
    return {
      capabilities: {
        textDocumentSync: TextDocumentSyncKind.Incremental,
        hoverProvider: true,
        inlayHintProvider: true,
        codeActionProvider: { codeActionKinds: [CodeActionKind.QuickFix, CODE_ACTION_FIX_ALL] },
        completionProvider: { triggerCharacters: [' ', ':', '{', ','] },
        documentSymbolProvider: true,
        foldingRangeProvider: true,
        ...(caps.lensCommands ? { codeLensProvider: { resolveProvider: false } } : {}),
        definitionProvider: true,
        referencesProvider: true,
        renameProvider: { prepareProvider: true },
        workspaceSymbolProvider: true,
        documentLinkProvider: { resolveProvider: false },
        ...(caps.pull
          ? {
              diagnosticProvider: {
                identifier: 'boltzmark',
                // A note's diagnostics depend on the runs it refers to in other notes.
                interFileDependencies: true,
                workspaceDiagnostics: false,
              },
            }
          : {}),
        ...(caps.workspaceFolders
          ? { workspace: { workspaceFolders: { supported: true, changeNotifications: true } } }
          : {}),
      },
      serverInfo: { name: 'boltzmark-lsp', version },
    };
  });

  connection.onInitialized(() => {
    background(connection, 'reading the notes of the workspace', runs.setFolders(folders));
    if (caps.watchedFiles)
      background(
        connection,
        'registering for file events of notes and spectrum files',
        // One registration: the notes (runs by reference) and the spectrum files references read.
        connection.client.register(DidChangeWatchedFilesNotification.type, {
          watchers: [
            { globPattern: '**/*.{md,markdown,ipynb}' },
            { globPattern: SPECTRUM_GLOB },
            // A deleted folder takes its notes and files with it.
            { globPattern: '**/*', kind: WatchKind.Delete },
          ],
        }),
      );
    // Without a registration VS Code's client sends no configuration changes (the static
    // `synchronize.configurationSection` it used to read is deprecated); other clients send them unasked.
    if (caps.configurationChange)
      background(
        connection,
        'registering for configuration changes',
        connection.client.register(DidChangeConfigurationNotification.type, { section: 'boltzmark' }),
      );
    if (caps.workspaceFolders)
      connection.workspace.onDidChangeWorkspaceFolders((e) => {
        const removed = new Set(e.removed.map((f) => f.uri));
        folders = [...folders.filter((f) => !removed.has(f)), ...e.added.map((f) => f.uri)];
        background(connection, 'reading the notes of the changed folders', runs.setFolders(folders));
        const open = documents.all().map((d) => d.uri);
        background(
          connection,
          'reading the settings of the changed folders',
          settings.reload(open, folders).then(changed),
        );
      });
  });
  /** Asks for the settings again (or takes the pushed ones) and refreshes only what a changed value affects. */
  const reload = async (pushed?: unknown): Promise<void> => {
    const change = caps.configuration
      ? await settings.reload(documents.all().map((d) => d.uri))
      : settings.setFallback(pushed);
    changed(change);
  };
  connection.onDidChangeConfiguration((p) => {
    const section = (p.settings as { boltzmark?: unknown } | null | undefined)?.boltzmark;
    if (!caps.configuration && section === undefined) return;
    background(connection, 'reading the changed settings', reload(section));
  });

  // A note is read from the moment it opens, in slices that yield to requests (notes.ts), not at its first request.
  documents.onDidOpen((e) => {
    const uri = e.document.uri;
    e.document.fences(); // found now, while the note is taken, so that a first request finds its block at once
    const read = settings.get(uri).then((s) => {
      const doc = documents.get(uri);
      return doc ? notes.prepare(doc, s) : undefined;
    });
    background(connection, 'reading the opened note', read);
    // Its own diagnostics take over from the reference diagnostics sent while it was closed; a cell's take over
    // from those sent to its notebook's file.
    for (const closed of [uri, notebookOfCell(uri)])
      if (closed !== null && closedReferrers.opened(closed))
        background(
          connection,
          'taking back the diagnostics of a closed note',
          connection.sendDiagnostics({ uri: closed, diagnostics: [] }),
        );
  });
  documents.onDidChangeContent((e) => {
    notes.heard();
    // The fences the document found (on opening) spare the book its own scan when it indexes the note whole.
    runs.edited(
      e.document.uri,
      e.document.pieces,
      (previous) => e.document.changeSince(previous),
      () => e.document.fences(),
    );
    if (!caps.pull) pushes.schedule(e.document.uri, () => push(e.document.uri));
  });
  documents.onDidClose((e) => {
    pushes.cancel(e.document.uri);
    notes.forget(e.document.uri);
    background(
      connection,
      'reading a closed note again',
      runs.closed(e.document.uri).then(() => pushes.schedule(RUNS_CHANGED, () => republishStale())),
    );
    if (!caps.pull)
      background(
        connection,
        'clearing diagnostics',
        connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] }),
      );
  });

  // One handler for every watched file (a second registration would replace the first): spectra and notes.
  connection.onDidChangeWatchedFiles((p) => {
    for (const c of p.changes) {
      spectra.changed(c.uri);
      const kind =
        c.type === FileChangeType.Created ? 'created' : c.type === FileChangeType.Deleted ? 'deleted' : 'changed';
      background(connection, `reading ${c.uri}`, runs.fileEvent(c.uri, kind));
    }
  });
  routeFeatures(connection, {
    serve,
    serveRuns,
    notes,
    runs,
    spectra,
    listSpectrumFiles: spectrumHost.list,
    caps: () => caps,
    folders: () => folders,
  });

  documents.listen(connection);
  connection.listen();
}

/**
 * Wires the LSP connection to the features. Every handler has one shape:
 * find the note, return empty when it is unknown, stop when cancelled,
 * delegate to the feature, return. No logic lives here.
 */
import { noteExternals, type ExternalPart } from './externals';
import {
  CodeActionKind,
  DidChangeConfigurationNotification,
  DocumentDiagnosticReportKind,
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
import { CODE_ACTION_FIX_ALL, codeActions } from './features/codeActions';
import { codeLenses, resultsMarkdown } from './features/codeLens';
import { completion } from './features/completion';
import { curvePayload } from './features/curve';
import { foldingRanges } from './features/folding';
import { hover } from './features/hover';
import { inlayHints } from './features/inlayHints';
import { documentSymbols, flatSymbols } from './features/symbols';
import { Notes } from './notes';
import { noteDocuments, type NoteDocument } from './noteDocument';
import { memoryStats } from './heapStats';
import { AnalysisStatsRequest, CurveDataRequest, MemoryRequest, ResultsMarkdownRequest } from '../shared/protocol';
import type { Settings } from '../shared/settings';
import { SettingsStore, type SettingsChange } from './settingsStore';
import { blockAt, type NoteState } from './state';

/** Pause after the last keystroke before pushed diagnostics are sent. */
const PUSH_DELAY_MS = 200;

/** Starts serving on a connection (stdio, IPC or socket: the connection decides). */
export function startServer(connection: Connection): void {
  // stdout may be the protocol channel: route console output to the client's log instead.
  console.log = connection.console.log.bind(connection.console);
  console.info = connection.console.info.bind(connection.console);
  console.warn = connection.console.warn.bind(connection.console);
  console.error = connection.console.error.bind(connection.console);

  const documents = new TextDocuments<NoteDocument>(noteDocuments);
  // The sources values by reference come from (spectrum files, other runs); each adds its part.
  const externalParts: ExternalPart[] = [];
  const notes = new Notes((uri) => (externalParts.length > 0 ? noteExternals(uri, externalParts) : null));
  const pushes = new Debouncer(PUSH_DELAY_MS);
  let caps: ClientCaps = clientCaps(undefined);
  const log = (message: string): void => connection.console.warn(message);
  const changed = (change: SettingsChange): void =>
    refreshAfter(connection, caps, change, documents, (uri) => pushes.schedule(uri, () => push(uri)));
  let settings = new SettingsStore(null, log, changed);
  let folders: string[] = [];

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
  /** Runs a feature for a known, not cancelled request; empty otherwise. `near`: see `note`. */
  const serve = async <T>(
    uri: string,
    token: CancellationToken | undefined,
    empty: T,
    fn: (s: NoteState, settings: Settings) => T,
    near?: { startLine: number; endLine: number },
  ): Promise<T> => {
    if (token?.isCancellationRequested) return empty;
    try {
      const n = await note(uri, near);
      if (!n || token?.isCancellationRequested) return empty;
      return fn(n.state, n.settings);
    } catch (err) {
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
        codeLensProvider: { resolveProvider: false },
        ...(caps.pull
          ? {
              diagnosticProvider: {
                identifier: 'boltzmark',
                interFileDependencies: false,
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
  });
  documents.onDidChangeContent((e) => {
    if (!caps.pull) pushes.schedule(e.document.uri, () => push(e.document.uri));
  });
  documents.onDidClose((e) => {
    pushes.cancel(e.document.uri);
    notes.forget(e.document.uri);
    if (!caps.pull)
      background(
        connection,
        'clearing diagnostics',
        connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] }),
      );
  });

  connection.languages.diagnostics.on(async (p, token) => ({
    kind: DocumentDiagnosticReportKind.Full,
    items: await serve(p.textDocument.uri, token, [], noteDiagnostics),
  }));
  const lineOf = (p: { line: number }) => ({ startLine: p.line, endLine: p.line });
  connection.onHover((p, token) =>
    serve(p.textDocument.uri, token, null, (s, set) => hover(s, p.position, set), lineOf(p.position)),
  );
  connection.languages.inlayHint.on((p, token) =>
    serve(p.textDocument.uri, token, [], (s, set) => inlayHints(s, p.range, set), {
      startLine: p.range.start.line,
      endLine: p.range.end.line,
    }),
  );
  connection.onCodeAction((p, token) => serve(p.textDocument.uri, token, [], (s) => codeActions(s, p.range)));
  connection.onCompletion((p, token) =>
    serve(p.textDocument.uri, token, [], (s) => completion(s, p.position, caps.snippets)),
  );
  connection.onDocumentSymbol((p, token) =>
    serve(p.textDocument.uri, token, [], (s) =>
      caps.hierarchicalSymbols ? documentSymbols(s) : flatSymbols(s.uri, documentSymbols(s)),
    ),
  );
  connection.onFoldingRanges((p, token) => serve(p.textDocument.uri, token, [], foldingRanges));
  connection.onCodeLens((p, token) => serve(p.textDocument.uri, token, [], codeLenses));
  connection.onRequest(ResultsMarkdownRequest, (p, token) =>
    serve(p.uri, token, null, (s, set) => {
      const b = blockAt(s, s.lines.offsetAt({ line: p.line, character: 0 }));
      return b ? resultsMarkdown(s, b, set) : null;
    }),
  );
  connection.onRequest(AnalysisStatsRequest, (p) => notes.statsOf(p.uri));
  connection.onRequest(MemoryRequest, memoryStats);
  connection.onRequest(CurveDataRequest, (p, token) =>
    serve(p.uri, token, null, (s, set) => curvePayload(s, p.line, set)),
  );

  documents.listen(connection);
  connection.listen();
}

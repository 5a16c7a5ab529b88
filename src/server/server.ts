/**
 * Wires the LSP connection to the features. Every handler has one shape:
 * find the note, return empty when it is unknown, stop when cancelled,
 * delegate to the feature, return. No logic lives here.
 */
import {
  CodeActionKind,
  DocumentDiagnosticReportKind,
  TextDocuments,
  TextDocumentSyncKind,
  type CancellationToken,
  type Connection,
  type InitializeParams,
  type InitializeResult,
} from 'vscode-languageserver';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { Debouncer, noteDiagnostics } from './diagnostics';
import { CODE_ACTION_FIX_ALL, codeActions } from './features/codeActions';
import { codeLenses, resultsMarkdown } from './features/codeLens';
import { completion } from './features/completion';
import { curvePayload } from './features/curve';
import { foldingRanges } from './features/folding';
import { hover } from './features/hover';
import { inlayHints } from './features/inlayHints';
import { documentSymbols } from './features/symbols';
import { Notes } from './notes';
import { memoryStats } from './heapStats';
import { AnalysisStatsRequest, CurveDataRequest, MemoryRequest, ResultsMarkdownRequest } from '../shared/protocol';
import { DEFAULT_SETTINGS, fromSection } from '../shared/settings';
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

  const documents = new TextDocuments(TextDocument);
  const notes = new Notes(DEFAULT_SETTINGS);
  const pushes = new Debouncer(PUSH_DELAY_MS);
  let pull = false;
  let configurable = false;

  const note = (uri: string): NoteState | null => {
    const doc = documents.get(uri);
    return doc ? notes.get(doc) : null;
  };
  /** Runs a feature for a known, not cancelled request; empty otherwise. */
  const serve = <T>(uri: string, token: CancellationToken | undefined, empty: T, fn: (s: NoteState) => T): T => {
    if (token?.isCancellationRequested) return empty;
    const s = note(uri);
    if (!s || token?.isCancellationRequested) return empty;
    try {
      return fn(s);
    } catch (err) {
      connection.console.error(`boltzmark: ${(err as Error).stack ?? err}`);
      return empty;
    }
  };
  const push = (uri: string): void => {
    const s = note(uri);
    if (s) void connection.sendDiagnostics({ uri, version: s.version, diagnostics: noteDiagnostics(s) });
  };

  connection.onInitialize((params: InitializeParams): InitializeResult => {
    pull = !!params.capabilities.textDocument?.diagnostic;
    configurable = !!params.capabilities.workspace?.configuration;
    if (params.initializationOptions) notes.reconfigure(fromSection(params.initializationOptions));
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
        ...(pull
          ? {
              diagnosticProvider: {
                identifier: 'boltzmark',
                interFileDependencies: false,
                workspaceDiagnostics: false,
              },
            }
          : {}),
      },
      serverInfo: { name: 'boltzmark-lsp', version: '0.1.0' },
    };
  });

  const loadSettings = async (): Promise<void> => {
    if (!configurable) return;
    const section: unknown = await connection.workspace.getConfiguration('boltzmark');
    notes.reconfigure(fromSection(section));
    if (pull) connection.languages.diagnostics.refresh();
    else documents.all().forEach((d) => push(d.uri));
    connection.languages.inlayHint.refresh();
    connection.sendRequest('workspace/codeLens/refresh').catch(() => undefined);
  };
  connection.onInitialized(() => void loadSettings().catch((e) => connection.console.error(String(e))));
  connection.onDidChangeConfiguration(() => void loadSettings().catch((e) => connection.console.error(String(e))));

  documents.onDidChangeContent((e) => {
    if (!pull) pushes.schedule(e.document.uri, () => push(e.document.uri));
  });
  documents.onDidClose((e) => {
    pushes.cancel(e.document.uri);
    notes.forget(e.document.uri);
    if (!pull) void connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] });
  });

  connection.languages.diagnostics.on((p, token) => ({
    kind: DocumentDiagnosticReportKind.Full,
    items: serve(p.textDocument.uri, token, [], noteDiagnostics),
  }));
  connection.onHover((p, token) => serve(p.textDocument.uri, token, null, (s) => hover(s, p.position, notes.current)));
  connection.languages.inlayHint.on((p, token) =>
    serve(p.textDocument.uri, token, [], (s) => inlayHints(s, p.range, notes.current)),
  );
  connection.onCodeAction((p, token) =>
    serve(p.textDocument.uri, token, [], (s) => codeActions(s, p.range, notes.current)),
  );
  connection.onCompletion((p, token) =>
    serve(p.textDocument.uri, token, [], (s) => completion(s, p.position, notes.current)),
  );
  connection.onDocumentSymbol((p, token) => serve(p.textDocument.uri, token, [], documentSymbols));
  connection.onFoldingRanges((p, token) => serve(p.textDocument.uri, token, [], foldingRanges));
  connection.onCodeLens((p, token) => serve(p.textDocument.uri, token, [], codeLenses));
  connection.onRequest(ResultsMarkdownRequest, (p, token) =>
    serve(p.uri, token, null, (s) => {
      const b = blockAt(s, s.lines.offsetAt({ line: p.line, character: 0 }));
      return b ? resultsMarkdown(s, b, notes.current) : null;
    }),
  );
  connection.onRequest(AnalysisStatsRequest, (p) => notes.statsOf(p.uri));
  connection.onRequest(MemoryRequest, memoryStats);
  connection.onRequest(CurveDataRequest, (p, token) =>
    serve(p.uri, token, null, (s) => curvePayload(s, p.line, notes.current)),
  );

  documents.listen(connection);
  connection.listen();
}

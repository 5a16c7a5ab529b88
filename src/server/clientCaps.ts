/**
 * What the client said it can do, read once from `initialize`, and the
 * server-to-client requests that depend on it. A request the client did not
 * declare is never sent, and every one that is sent is caught: a client that
 * answers with an error (or not at all) costs a log line, never the server.
 */
import {
  CodeLensRefreshRequest,
  type ClientCapabilities,
  type Connection,
  type TextDocuments,
} from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { LENS_COMMANDS_CAPABILITY } from '../shared/protocol';
import type { SettingsChange } from './settingsStore';

/** The optional client capabilities the server uses. */
export interface ClientCaps {
  /** LSP 3.17 pull diagnostics; otherwise the server pushes them. */
  readonly pull: boolean;
  /** `completionItem.snippetSupport`: the new-block templates come as snippets, else as plain text. */
  readonly snippets: boolean;
  /** `documentSymbol.hierarchicalDocumentSymbolSupport`: the outline nests levels in blocks, else it is flat. */
  readonly hierarchicalSymbols: boolean;
  /** `workspace/configuration`: settings are asked for per note. */
  readonly configuration: boolean;
  /** `workspaceFolders`: settings are kept per folder and the folders followed. */
  readonly workspaceFolders: boolean;
  /** The client accepts a dynamic registration of `workspace/didChangeConfiguration`. */
  readonly configurationChange: boolean;
  /** `workspace/didChangeWatchedFiles` with dynamic registration: the server asks for the file events of notes and spectra. */
  readonly watchedFiles: boolean;
  /** A workspace edit may be `documentChanges` with change annotations (a rename then asks for confirmation). */
  readonly annotatedEdits: boolean;
  /** The client runs the commands of the code lenses (protocol.ts, LENS_COMMANDS_CAPABILITY): lenses are offered. */
  readonly lensCommands: boolean;
  /** `workspace/{inlayHint,codeLens,diagnostic}/refresh` declared with `refreshSupport`. */
  readonly refresh: { readonly inlayHints: boolean; readonly codeLens: boolean; readonly diagnostics: boolean };
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null;

/** Reads the capabilities the server cares about; anything absent counts as unsupported. */
export function clientCaps(c: ClientCapabilities | undefined): ClientCaps {
  const w = c?.workspace;
  return {
    pull: !!c?.textDocument?.diagnostic,
    snippets: c?.textDocument?.completion?.completionItem?.snippetSupport === true,
    hierarchicalSymbols: c?.textDocument?.documentSymbol?.hierarchicalDocumentSymbolSupport === true,
    configuration: w?.configuration === true,
    workspaceFolders: w?.workspaceFolders === true,
    configurationChange: w?.didChangeConfiguration?.dynamicRegistration === true,
    watchedFiles: w?.didChangeWatchedFiles?.dynamicRegistration === true,
    annotatedEdits: w?.workspaceEdit?.documentChanges === true && !!w?.workspaceEdit?.changeAnnotationSupport,
    lensCommands: isRecord(c?.experimental) && c.experimental[LENS_COMMANDS_CAPABILITY] === true,
    refresh: {
      inlayHints: w?.inlayHint?.refreshSupport === true,
      codeLens: w?.codeLens?.refreshSupport === true,
      diagnostics: w?.diagnostics?.refreshSupport === true,
    },
  };
}

/** Logs a failed server-to-client request instead of letting its rejection float. */
export function background(connection: Connection, what: string, p: Promise<unknown>): void {
  p.catch((err: unknown) => connection.console.warn(`boltzmark: ${what} failed: ${String(err)}`));
}

/**
 * After a settings change: asks the client to fetch again what the change
 * affects, as far as it declared it can. Diagnostics, code lenses (which
 * blocks exist) and inlay hints follow the analysis; inlay hints also
 * follow the display settings. In push mode the diagnostics are pushed again.
 */
export function refreshAfter(
  connection: Connection,
  caps: ClientCaps,
  change: SettingsChange,
  documents: Pick<TextDocuments<TextDocument>, 'all'>,
  push: (uri: string) => void,
): void {
  if (change.analysis) {
    if (!caps.pull) for (const d of documents.all()) push(d.uri);
    else if (caps.refresh.diagnostics)
      background(connection, 'workspace/diagnostic/refresh', connection.languages.diagnostics.refresh());
    if (caps.refresh.codeLens)
      background(connection, 'workspace/codeLens/refresh', connection.sendRequest(CodeLensRefreshRequest.type));
  }
  if (change.any && caps.refresh.inlayHints)
    background(connection, 'workspace/inlayHint/refresh', connection.languages.inlayHint.refresh());
}

/**
 * The requests about notes, each routed to its feature in the one shape of
 * the server (server.ts): `serve` finds the note's analysis, answers empty
 * when the note is unknown or the request cancelled, and hands the note's
 * state to a feature, a pure function of it (features/*.ts).
 */
import {
  DocumentDiagnosticReportKind,
  LSPErrorCodes,
  ResponseError,
  type CancellationToken,
  type Connection,
} from 'vscode-languageserver';
import type { Settings } from '../shared/settings';
import {
  AnalysisStatsRequest,
  CurveDataRequest,
  MemoryRequest,
  ResultsMarkdownRequest,
  SpectrumStatsRequest,
} from '../shared/protocol';
import type { ClientCaps } from './clientCaps';
import { noteDiagnostics } from './diagnostics';
import { codeActions } from './features/codeActions';
import { codeLenses, resultsMarkdown } from './features/codeLens';
import { completion } from './features/completion';
import { curvePayload } from './features/curve';
import { foldingRanges } from './features/folding';
import { hover } from './features/hover';
import { inlayHints } from './features/inlayHints';
import {
  runCompletion,
  runDefinition,
  runHover,
  runLinks,
  runPrepareRename,
  runReferences,
  runRename,
  runSymbols,
} from './features/runRefs';
import { spectrumFileCompletion } from './features/spectrumCompletion';
import { spectrumHover } from './features/spectrumHover';
import { spectrumLinks } from './features/spectrumLinks';
import { documentSymbols, flatSymbols } from './features/symbols';
import { memoryStats } from './heapStats';
import type { Notes } from './notes';
import type { WorkspaceRuns } from './runs/workspaceRuns';
import type { SpectrumFiles } from './spectra';
import type { SpectrumHost } from './spectraWiring';
import { blockAt, clampPosition as at, displayOptions, type NoteState } from './state';

/** Longest the outline waits for the spectrum files its note's blocks are reading. */
const OUTLINE_WAIT_MS = 3000;

/** A feature's function of a note's state and settings. */
type Feature<T> = (s: NoteState, settings: Settings) => T;

/** What the routes need from the server. */
export interface FeatureRoutes {
  /**
   * Runs a feature for a known, not cancelled request; `empty` otherwise. With `near` (a range of lines), a note
   * still being read in slices answers at once with the blocks in that range.
   */
  readonly serve: <T>(
    uri: string,
    token: CancellationToken | undefined,
    empty: T,
    fn: Feature<T>,
    near?: { startLine: number; endLine: number },
  ) => Promise<T>;
  /** Like `serve`, once the first reading of the workspace's notes is over (for features that span notes). */
  readonly serveRuns: <T>(uri: string, token: CancellationToken | undefined, empty: T, fn: Feature<T>) => Promise<T>;
  readonly notes: Notes;
  readonly runs: WorkspaceRuns;
  readonly spectra: SpectrumFiles;
  /** Spectrum files under a folder, for completions (the host's; none without). */
  readonly listSpectrumFiles: SpectrumHost['list'];
  /** What the client declared (it changes at initialization). */
  readonly caps: () => ClientCaps;
  /** The workspace folders (they change with the client's). */
  readonly folders: () => readonly string[];
}

const lineOf = (p: { line: number }) => ({ startLine: p.line, endLine: p.line });

/** The error of a request the client cancelled (LSP 3.17, "Cancellation Support"). */
export function cancelled(): ResponseError<void> {
  return new ResponseError(LSPErrorCodes.RequestCancelled, 'The request was cancelled.');
}

/** Registers the handler of every request about notes. */
export function routeFeatures(connection: Connection, r: FeatureRoutes): void {
  const { serve, serveRuns, notes, runs, spectra, listSpectrumFiles, caps, folders } = r;
  connection.languages.diagnostics.on(async (p, token) => ({
    kind: DocumentDiagnosticReportKind.Full,
    items: await serve(p.textDocument.uri, token, [], noteDiagnostics),
  }));
  connection.onHover((p, token) =>
    serve(
      p.textDocument.uri,
      token,
      null,
      (s, set) =>
        runHover(runs, s, at(s, p.position), displayOptions(set)) ??
        spectrumHover(s, at(s, p.position), set) ??
        hover(s, at(s, p.position), set),
      lineOf(p.position),
    ),
  );
  connection.onDefinition((p, token) =>
    serveRuns(p.textDocument.uri, token, [], (s) => runDefinition(runs, s, at(s, p.position))),
  );
  connection.onReferences((p, token) =>
    serveRuns(p.textDocument.uri, token, [], (s) =>
      runReferences(runs, s, at(s, p.position), p.context.includeDeclaration),
    ),
  );
  connection.onPrepareRename((p, token) =>
    serveRuns(p.textDocument.uri, token, null, (s) => runPrepareRename(runs, s, at(s, p.position))),
  );
  connection.onRenameRequest((p, token) =>
    serveRuns(p.textDocument.uri, token, null, (s) =>
      runRename(runs, s, at(s, p.position), p.newName, { annotations: caps().annotatedEdits }),
    ),
  );
  connection.onWorkspaceSymbol(async (p, token) => {
    await runs.ready();
    if (token.isCancellationRequested) throw cancelled();
    return runSymbols(runs, p.query);
  });
  connection.onDocumentLinks((p, token) =>
    serve(p.textDocument.uri, token, [], (s) => [...runLinks(runs, s), ...spectrumLinks(s, folders())]),
  );
  connection.languages.inlayHint.on((p, token) =>
    serve(p.textDocument.uri, token, [], (s, set) => inlayHints(s, p.range, set), {
      startLine: p.range.start.line,
      endLine: p.range.end.line,
    }),
  );
  connection.onCodeAction((p, token) => serve(p.textDocument.uri, token, [], (s) => codeActions(s, p.range)));
  connection.onCompletion(async (p, token) => {
    const files = await spectrumFileCompletion(
      () => serve(p.textDocument.uri, token, null, (s) => s),
      p.position,
      listSpectrumFiles,
    );
    return (
      files ??
      serveRuns(
        p.textDocument.uri,
        token,
        [],
        (s) => runCompletion(runs, s, at(s, p.position)) ?? completion(s, at(s, p.position), caps().snippets),
      )
    );
  });
  connection.onDocumentSymbol(async (p, token) => {
    const symbols = () =>
      serve(p.textDocument.uri, token, [], (s) =>
        caps().hierarchicalSymbols ? documentSymbols(s) : flatSymbols(s.uri, documentSymbols(s)),
      );
    // The outline is asked for once per edit and has no refresh request: a block whose spectrum file is still
    // being read would stay "invalid" there after the file is in. So it waits (a little) for the files the
    // note's analysis asked for, then answers from the analysis that has them.
    await symbols();
    await Promise.race([spectra.settled(), new Promise((resolve) => setTimeout(resolve, OUTLINE_WAIT_MS))]);
    return symbols();
  });
  connection.onFoldingRanges((p, token) => serve(p.textDocument.uri, token, [], foldingRanges));
  // Only a client that runs the lenses' commands gets lenses (clientCaps.ts); another that asks anyway gets none.
  connection.onCodeLens((p, token) =>
    caps().lensCommands ? serve(p.textDocument.uri, token, [], codeLenses) : Promise.resolve([]),
  );
  connection.onRequest(ResultsMarkdownRequest, (p, token) =>
    serve(p.uri, token, null, (s, set) => {
      const b = blockAt(s, s.lines.offsetAt({ line: p.line, character: 0 }));
      return b ? resultsMarkdown(s, b, set) : null;
    }),
  );
  connection.onRequest(AnalysisStatsRequest, (p) => {
    notes.heard();
    return notes.statsOf(p.uri);
  });
  connection.onRequest(MemoryRequest, memoryStats);
  connection.onRequest(SpectrumStatsRequest, () => ({ files: spectra.known.length, parses: spectra.parses }));
  connection.onRequest(CurveDataRequest, (p, token) =>
    serve(p.uri, token, null, (s, set) => curvePayload(s, p.line, set, (key) => spectra.spectrumAtKey(key))),
  );
}

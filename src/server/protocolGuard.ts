/**
 * The protocol's rules at the door, for any client: every message from the
 * client passes here before the connection hands it to a handler
 * (vscode-jsonrpc's `messageStrategy`).
 *
 * - Before `initialize`, a request is refused with ServerNotInitialized
 *   (-32002) and a notification other than `exit` is dropped; after
 *   `shutdown`, a request is refused with InvalidRequest (-32600) and a
 *   notification other than `exit` is dropped (LSP 3.17, "Lifecycle
 *   Messages"). A second `initialize` is refused too.
 * - The parameters of every request and notification the server serves are
 *   checked against the shape the protocol gives them (a position's line and
 *   character are LSP `uinteger`s, a URI is a string, …). A request whose
 *   parameters are not of that shape is refused with InvalidParams (-32602)
 *   naming the first field at fault, rather than failing inside a feature; a
 *   notification of that shape is dropped and said in the log. Fields the
 *   server does not read are not checked.
 *
 * A refused request still gets its answer through the connection: it is
 * passed on renamed to {@link REFUSED_METHOD}, whose handler throws the
 * refusal as the response's error.
 */
import { ErrorCodes, Message, ResponseError, type MessageStrategy, type RequestMessage } from 'vscode-languageserver';

/** The method a refused request is renamed to (see {@link ProtocolGuard.attach}); never one a client may call. */
export const REFUSED_METHOD = '$/boltzmark/refused';

/** Why a message's parameters are not of the protocol's shape, or null when they are. */
type Check = (params: unknown) => string | null;

const isObject = (x: unknown): x is Record<string, unknown> => typeof x === 'object' && x !== null && !Array.isArray(x);

/** LSP `uinteger` (an integer from 0 to 2³¹ − 1), or why `x`, the field `where`, is not one. */
function uinteger(x: unknown, where: string): string | null {
  return Number.isInteger(x) && (x as number) >= 0 && (x as number) <= 2 ** 31 - 1
    ? null
    : `${where} must be a whole number from 0 to 2147483647`;
}

function position(p: unknown, where: string): string | null {
  if (!isObject(p)) return `${where} must be an object { line, character }`;
  return uinteger(p.line, `${where}.line`) ?? uinteger(p.character, `${where}.character`);
}

function range(r: unknown, where: string): string | null {
  if (!isObject(r)) return `${where} must be an object { start, end }`;
  return position(r.start, `${where}.start`) ?? position(r.end, `${where}.end`);
}

function uriField(o: Record<string, unknown>, key: string, where: string): string | null {
  return typeof o[key] === 'string' ? null : `${where}.${key} must be a string`;
}

/** Parameters that are an object (`shape` says which), and then whatever `more` asks of them. */
function object(shape: string, more?: (p: Record<string, unknown>) => string | null): Check {
  return (p) => (isObject(p) ? (more?.(p) ?? null) : `the parameters must be an object${shape}`);
}

/** `{ textDocument: { uri } }`, and then whatever `more` asks of the parameters. */
function onDocument(more?: (p: Record<string, unknown>) => string | null): Check {
  return object('', (p) =>
    isObject(p.textDocument)
      ? (uriField(p.textDocument, 'uri', 'textDocument') ?? more?.(p) ?? null)
      : 'textDocument must be an object { uri }',
  );
}

const atPosition = (more?: (p: Record<string, unknown>) => string | null): Check =>
  onDocument((p) => position(p.position, 'position') ?? more?.(p) ?? null);

const inRange = (more?: (p: Record<string, unknown>) => string | null): Check =>
  onDocument((p) => range(p.range, 'range') ?? more?.(p) ?? null);

/** `{ uri, line }` of Boltzmark's block requests (src/shared/protocol.ts). */
const blockParams = object(' { uri, line }', (p) => uriField(p, 'uri', 'params') ?? uinteger(p.line, 'line'));

const nothing: Check = () => null;

/** The requests the server serves, by method. */
const REQUESTS: Readonly<Record<string, Check>> = {
  initialize: object('', (p) => {
    // Refused before the handlers, which would fail half-way (the server then running with no folders read).
    if (!isObject(p.capabilities)) return 'capabilities must be an object';
    if (p.rootUri !== undefined && p.rootUri !== null && typeof p.rootUri !== 'string')
      return 'rootUri must be a string or null';
    const folders = p.workspaceFolders;
    if (folders === undefined || folders === null) return null;
    if (!Array.isArray(folders)) return 'workspaceFolders must be an array or null';
    for (let i = 0; i < folders.length; i++) {
      const f: unknown = folders[i];
      if (!isObject(f) || typeof f.uri !== 'string') return `workspaceFolders[${i}] must be an object { uri, name }`;
    }
    return null;
  }),
  shutdown: nothing,
  'textDocument/hover': atPosition(),
  'textDocument/completion': atPosition(),
  'textDocument/definition': atPosition(),
  'textDocument/prepareRename': atPosition(),
  'textDocument/references': atPosition((p) =>
    isObject(p.context) && typeof p.context.includeDeclaration === 'boolean'
      ? null
      : 'context must be an object { includeDeclaration: boolean }',
  ),
  'textDocument/rename': atPosition((p) => (typeof p.newName === 'string' ? null : 'newName must be a string')),
  'textDocument/inlayHint': inRange(),
  'textDocument/codeAction': inRange((p) =>
    isObject(p.context) && Array.isArray(p.context.diagnostics)
      ? null
      : 'context must be an object { diagnostics: [] }',
  ),
  'textDocument/documentSymbol': onDocument(),
  'textDocument/codeLens': onDocument(),
  'textDocument/foldingRange': onDocument(),
  'textDocument/documentLink': onDocument(),
  'textDocument/diagnostic': onDocument(),
  'workspace/symbol': object(' { query }', (p) => (typeof p.query === 'string' ? null : 'query must be a string')),
  'boltzmark/resultsMarkdown': blockParams,
  'boltzmark/curveData': blockParams,
  'boltzmark/analysisStats': object(' { uri }', (p) => uriField(p, 'uri', 'params')),
};

/** One content change of `didChange`: the whole text, or a range and its new text. */
function contentChange(c: unknown, where: string): string | null {
  if (!isObject(c)) return `${where} must be an object { text } or { range, text }`;
  if (typeof c.text !== 'string') return `${where}.text must be a string`;
  return c.range === undefined ? null : range(c.range, `${where}.range`);
}

/** The notifications the server reads, by method. */
const NOTIFICATIONS: Readonly<Record<string, Check>> = {
  'textDocument/didOpen': onDocument((p) => {
    const d = p.textDocument as Record<string, unknown>;
    if (typeof d.text !== 'string') return 'textDocument.text must be a string';
    if (typeof d.languageId !== 'string') return 'textDocument.languageId must be a string';
    return Number.isInteger(d.version) ? null : 'textDocument.version must be an integer';
  }),
  'textDocument/didChange': onDocument((p) => {
    const d = p.textDocument as Record<string, unknown>;
    if (!Number.isInteger(d.version)) return 'textDocument.version must be an integer';
    if (!Array.isArray(p.contentChanges)) return 'contentChanges must be an array';
    for (let i = 0; i < p.contentChanges.length; i++) {
      const problem = contentChange(p.contentChanges[i], `contentChanges[${i}]`);
      if (problem) return problem;
    }
    return null;
  }),
  'textDocument/didClose': onDocument(),
  'textDocument/didSave': onDocument(),
  'workspace/didChangeWatchedFiles': (p) => {
    if (!isObject(p) || !Array.isArray(p.changes)) return 'changes must be an array';
    for (let i = 0; i < p.changes.length; i++) {
      const c: unknown = p.changes[i];
      if (!isObject(c) || typeof c.uri !== 'string') return `changes[${i}].uri must be a string`;
      if (c.type !== 1 && c.type !== 2 && c.type !== 3) return `changes[${i}].type must be 1, 2 or 3`;
    }
    return null;
  },
  'workspace/didChangeWorkspaceFolders': (p) => {
    const e = isObject(p) ? p.event : undefined;
    if (!isObject(e) || !Array.isArray(e.added) || !Array.isArray(e.removed))
      return 'event must be an object { added: [], removed: [] }';
    for (const f of [...(e.added as unknown[]), ...(e.removed as unknown[])])
      if (!isObject(f) || typeof f.uri !== 'string') return 'each workspace folder must be an object { uri, name }';
    return null;
  },
  'workspace/didChangeConfiguration': object(''),
  // Read by the connection itself, whose handler fails on anything but { value } (a log line, nothing set).
  '$/setTrace': object(' { value }', (p) =>
    p.value === 'off' || p.value === 'messages' || p.value === 'verbose'
      ? null
      : "value must be 'off', 'messages' or 'verbose'",
  ),
  initialized: nothing,
};

/** Where the server is in the protocol's lifecycle. */
type Stage = 'before-initialize' | 'running' | 'shut-down';

/** The guard of one connection: its message strategy, and what it needs of the connection once made. */
export interface ProtocolGuard {
  /** Give as the connection's `messageStrategy`. */
  readonly messageStrategy: MessageStrategy;
  /**
   * Once the connection exists: registers the handler that answers refused requests, and where dropped
   * notifications are said (the connection's log).
   */
  attach(
    connection: { onRequest(method: string, handler: (params: unknown) => never): unknown },
    warn: (message: string) => void,
  ): void;
}

/** A guard for a new connection (see the file's comment). */
export function protocolGuard(): ProtocolGuard {
  let stage: Stage = 'before-initialize';
  let warn: (message: string) => void = () => undefined;
  const refuse = (m: RequestMessage, code: number, message: string): RequestMessage => ({
    jsonrpc: m.jsonrpc,
    id: m.id,
    method: REFUSED_METHOD,
    params: { code, message },
  });
  const messageStrategy: MessageStrategy = {
    handleMessage(message, next) {
      if (Message.isRequest(message)) {
        const m = message;
        const no = (code: number, text: string) => next(refuse(m, code, text));
        if (m.method === REFUSED_METHOD) return no(ErrorCodes.MethodNotFound, `Unhandled method ${REFUSED_METHOD}`);
        if (stage === 'shut-down')
          return no(ErrorCodes.InvalidRequest, `${m.method}: the server is shutting down (shutdown was received)`);
        if (stage === 'before-initialize' && m.method !== 'initialize')
          return no(
            ErrorCodes.ServerNotInitialized,
            `${m.method}: the server is not initialized yet (send initialize first)`,
          );
        if (stage === 'running' && m.method === 'initialize')
          return no(ErrorCodes.InvalidRequest, 'initialize: the server was initialized already');
        const problem = REQUESTS[m.method]?.(m.params);
        if (problem) return no(ErrorCodes.InvalidParams, `${m.method}: ${problem}`);
        if (m.method === 'initialize') stage = 'running';
        else if (m.method === 'shutdown') stage = 'shut-down';
        return next(m);
      }
      if (Message.isNotification(message)) {
        if (message.method === 'exit') return next(message);
        if (stage !== 'running') return;
        const problem = NOTIFICATIONS[message.method]?.(message.params);
        if (problem) {
          warn(`boltzmark: ${message.method} dropped: ${problem}`);
          return;
        }
      }
      return next(message);
    },
  };
  return {
    messageStrategy,
    attach(connection, say) {
      warn = say;
      connection.onRequest(REFUSED_METHOD, (params) => {
        const p = params as { code: number; message: string };
        throw new ResponseError(p.code, p.message);
      });
    },
  };
}

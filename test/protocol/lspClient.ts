/**
 * A small LSP client for the protocol tests: spawns the bundled server over
 * stdio and speaks JSON-RPC to it with vscode-jsonrpc, the same library VS
 * Code's client uses.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import {
  createMessageConnection,
  ErrorCodes,
  ResponseError,
  StreamMessageReader,
  StreamMessageWriter,
  type MessageConnection,
} from 'vscode-jsonrpc/node';
import { LENS_COMMANDS_CAPABILITY } from '../../src/shared/protocol';

/** Diagnostics the server pushed, by URI. */
export type Pushed = Map<
  string,
  { version?: number; diagnostics: { code?: string | number; message: string; range: unknown }[] }
>;

/** A running server and a connection to it. */
export interface LspSession {
  readonly conn: MessageConnection;
  readonly proc: ChildProcess;
  readonly pushed: Pushed;
  /** The `initialize` result. */
  readonly initialized: { capabilities: Record<string, unknown>; serverInfo?: { name: string; version?: string } };
  /** Messages the server logged (`window/logMessage`), in order. */
  readonly logs: string[];
  /** Server-to-client requests, in the order they arrived (method and params). */
  readonly requests: { method: string; params: unknown }[];
  /** What the server wrote to stderr so far. */
  stderr(): string;
  /** Rejects if the server process exits before `close()`; race a request with it to fail fast on a crash. */
  readonly gone: Promise<never>;
  /** Resolves when the next push for `uri` arrives (or one already matching `pred`). */
  waitForPush(uri: string, pred?: (d: Pushed extends Map<string, infer V> ? V : never) => boolean): Promise<void>;
  close(): Promise<void>;
}

/** Options: whether to announce pull diagnostics and configuration support, and the settings to answer with. */
export interface StartOptions {
  readonly pull?: boolean;
  /** The `boltzmark` section to answer `workspace/configuration` with: fixed, or per `scopeUri`. */
  readonly settings?: unknown;
  /** Node options for the server process, e.g. `--expose-gc`. */
  readonly execArgv?: readonly string[];
  /** The client's capabilities as sent, replacing the defaults entirely (for the minimal clients). */
  readonly capabilities?: Record<string, unknown>;
  /** Server-to-client requests answered with MethodNotFound instead: the named ones, or `all`. */
  readonly refuse?: 'all' | readonly string[];
  readonly initializationOptions?: unknown;
  readonly workspaceFolders?: readonly { readonly uri: string; readonly name: string }[] | null;
}

/** Spawns `node dist/server.js --stdio` and initializes it. */
export async function startLsp(opts: StartOptions = {}): Promise<LspSession> {
  if (!existsSync('dist/server.js'))
    throw new Error('dist/server.js is missing: run `npm run build` first (npm test does)');
  const proc = spawn(process.execPath, [...(opts.execArgv ?? []), 'dist/server.js', '--stdio'], {
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  let stderr = '';
  proc.stderr!.on('data', (b: Buffer) => (stderr += b.toString()));
  const exited = new Promise<never>((_, reject) =>
    proc.once('exit', (code) =>
      reject(new Error(`the server exited with code ${code} before answering: ${stderr.slice(-2000)}`)),
    ),
  );
  exited.catch(() => undefined);
  const conn = createMessageConnection(new StreamMessageReader(proc.stdout!), new StreamMessageWriter(proc.stdin!));
  const pushed: Pushed = new Map();
  const waiters: { uri: string; pred: (d: never) => boolean; resolve: () => void }[] = [];
  conn.onNotification('textDocument/publishDiagnostics', (p: { uri: string; version?: number; diagnostics: [] }) => {
    pushed.set(p.uri, p);
    for (const w of [...waiters])
      if (w.uri === p.uri && w.pred(p as never)) {
        waiters.splice(waiters.indexOf(w), 1);
        w.resolve();
      }
  });
  const logs: string[] = [];
  const requests: { method: string; params: unknown }[] = [];
  const refused = (method: string): boolean => opts.refuse === 'all' || (opts.refuse ?? []).includes(method);
  const settings = opts.settings;
  const answers: Record<string, (params: unknown) => unknown> = {
    'workspace/configuration': (p) =>
      (p as { items: { section?: string; scopeUri?: string }[] }).items.map((item) =>
        typeof settings === 'function' ? (settings as (scope?: string) => unknown)(item.scopeUri) : (settings ?? {}),
      ),
    'client/registerCapability': () => null,
    'workspace/inlayHint/refresh': () => null,
    'workspace/codeLens/refresh': () => null,
    'workspace/diagnostic/refresh': () => null,
  };
  // Every server-to-client request is recorded; a refused or unknown one gets MethodNotFound, as from a client without it.
  conn.onRequest((method: string, params: unknown) => {
    requests.push({ method, params });
    const answer = answers[method];
    if (!answer || refused(method)) throw new ResponseError(ErrorCodes.MethodNotFound, `Unhandled method ${method}`);
    return answer(params);
  });
  conn.onNotification('window/logMessage', (p: { message: string }) => void logs.push(p.message));
  conn.listen();
  const initialized = (await Promise.race([
    exited,
    conn.sendRequest('initialize', {
      processId: process.pid,
      rootUri: null,
      workspaceFolders: opts.workspaceFolders ?? null,
      initializationOptions: opts.initializationOptions,
      capabilities: opts.capabilities ?? {
        // As the VS Code extension's client declares: it runs the commands the code lenses name.
        experimental: { [LENS_COMMANDS_CAPABILITY]: true },
        workspace: { configuration: true },
        textDocument: {
          hover: { contentFormat: ['markdown', 'plaintext'] },
          completion: { completionItem: { snippetSupport: true } },
          documentSymbol: { hierarchicalDocumentSymbolSupport: true },
          ...(opts.pull ? { diagnostic: { dynamicRegistration: false } } : {}),
          publishDiagnostics: { versionSupport: true },
        },
      },
    }),
  ])) as LspSession['initialized'];
  await conn.sendNotification('initialized', {});
  return {
    conn,
    proc,
    pushed,
    initialized,
    logs,
    requests,
    stderr: () => stderr,
    gone: exited,
    waitForPush(uri, pred = () => true) {
      const have = pushed.get(uri);
      if (have && pred(have)) return Promise.resolve();
      return new Promise((resolve) => waiters.push({ uri, pred: pred as (d: never) => boolean, resolve }));
    },
    async close() {
      await conn.sendRequest('shutdown');
      await conn.sendNotification('exit');
      await new Promise<void>((resolve) => (proc.exitCode !== null ? resolve() : proc.once('exit', () => resolve())));
      conn.dispose();
    },
  };
}

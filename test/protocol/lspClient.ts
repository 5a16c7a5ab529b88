/**
 * A small LSP client for the protocol tests: spawns the bundled server over
 * stdio and speaks JSON-RPC to it with vscode-jsonrpc, the same library VS
 * Code's client uses.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import {
  createMessageConnection,
  StreamMessageReader,
  StreamMessageWriter,
  type MessageConnection,
} from 'vscode-jsonrpc/node';

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
  /** Resolves when the next push for `uri` arrives (or one already matching `pred`). */
  waitForPush(uri: string, pred?: (d: Pushed extends Map<string, infer V> ? V : never) => boolean): Promise<void>;
  close(): Promise<void>;
}

/** Options: whether to announce pull diagnostics and configuration support, and the settings to answer with. */
export interface StartOptions {
  readonly pull?: boolean;
  readonly settings?: unknown;
  /** Node options for the server process, e.g. `--expose-gc`. */
  readonly execArgv?: readonly string[];
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
  conn.onRequest('workspace/configuration', (p: { items: { section?: string }[] }) =>
    p.items.map(() => opts.settings ?? {}),
  );
  conn.onRequest('client/registerCapability', () => null);
  conn.onRequest('workspace/inlayHint/refresh', () => null);
  conn.onRequest('workspace/codeLens/refresh', () => null);
  conn.onRequest('workspace/diagnostic/refresh', () => null);
  conn.onNotification('window/logMessage', () => undefined);
  conn.listen();
  await Promise.race([
    exited,
    conn.sendRequest('initialize', {
      processId: process.pid,
      rootUri: null,
      capabilities: {
        workspace: { configuration: true },
        textDocument: {
          hover: { contentFormat: ['markdown', 'plaintext'] },
          ...(opts.pull ? { diagnostic: { dynamicRegistration: false } } : {}),
          publishDiagnostics: { versionSupport: true },
        },
      },
    }),
  ]);
  await conn.sendNotification('initialized', {});
  return {
    conn,
    proc,
    pushed,
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

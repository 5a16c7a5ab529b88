/**
 * Entry point of the language server in a web worker (`dist/web/server.js`),
 * for VS Code in the browser: the same server as `index.ts`, spoken to over
 * the worker's message port instead of stdio or IPC. The bundle has no Node
 * built-in (esbuild refuses one for the browser platform).
 */
import { BrowserMessageReader, BrowserMessageWriter, createConnection } from 'vscode-languageserver/browser';
import { protocolGuard } from './protocolGuard';
import { startServer } from './server';

/**
 * The worker's own scope is the port the client talks to. Its type (`DedicatedWorkerGlobalScope`) lives in the
 * WebWorker type library, which the server's tsconfig (Node.js) does not load, hence the cast.
 */
const port = globalThis as never;

const guard = protocolGuard();
startServer(
  createConnection(new BrowserMessageReader(port), new BrowserMessageWriter(port), {
    messageStrategy: guard.messageStrategy,
  }),
  {
    guard,
    // Each message from the client as it arrives, besides the reader's own handler.
    onInput: (heard) =>
      (port as { addEventListener(type: 'message', f: () => void): void }).addEventListener('message', heard),
  },
);

/**
 * The browser entry point (`browser` in package.json), for VS Code in a web
 * page with no Node.js behind the extension: the language server runs in a
 * web worker (`dist/web/server.js`), spoken to over its message port.
 * Everything else is the desktop extension's own code.
 */
import * as vscode from 'vscode';
import { LanguageClient } from 'vscode-languageclient/browser';
import { activateWith, deactivateClient, type BoltzmarkApi } from './activate';
import { CLIENT_ID } from './clientOptions';

/** The web worker constructor of the browser (the web extension host has one; Node's type library does not). */
/** What the browser client takes as its server: a worker (parameter 3 of its constructor, after id and name). */
type ServerWorker = ConstructorParameters<typeof LanguageClient>[2];
declare const Worker: new (url: string, options?: { name?: string }) => ServerWorker;
declare const Blob: new (parts: Uint8Array[], options: { type: string }) => object;
declare const URL: { createObjectURL(blob: object): string };

/**
 * The server's worker. An extension served over http(s) (vscode.dev, a web server) starts it from its URL; one
 * installed where the page reaches it only through the editor's file system (a remote folder) starts it from the
 * script's bytes. The worker's name carries the link of the docs it points diagnostics at.
 */
async function serverWorker(ctx: vscode.ExtensionContext): Promise<ServerWorker> {
  const script = vscode.Uri.joinPath(ctx.extensionUri, 'dist/web/server.js');
  const docs = vscode.Uri.joinPath(ctx.extensionUri, 'docs/format.md').toString(true);
  if (script.scheme === 'http' || script.scheme === 'https') return startWorker(script.toString(true), docs);
  const bytes = await vscode.workspace.fs.readFile(script);
  return startWorker(URL.createObjectURL(new Blob([bytes], { type: 'text/javascript' })), docs);
}

function startWorker(url: string, docs: string): ServerWorker {
  return new Worker(url, { name: docs });
}

/** Activates on the first Markdown document (or one of the commands or views). */
export function activate(context: vscode.ExtensionContext): Promise<BoltzmarkApi> {
  return activateWith(
    context,
    async (options, ctx) => new LanguageClient(CLIENT_ID, 'Boltzmark', await serverWorker(ctx), options),
  );
}

/** Stops the language server (and so its worker). */
export function deactivate(): Promise<void> {
  return deactivateClient();
}

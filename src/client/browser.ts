/**
 * The browser entry point (`browser` in package.json), for VS Code in a web
 * page with no Node.js behind the extension: the language server runs in a
 * web worker (`dist/web/server.js`), spoken to over its message port.
 * Everything else is the desktop extension's own code.
 */
import * as vscode from 'vscode';
import { LanguageClient } from 'vscode-languageclient/browser';
import { activateWith, deactivateClient, type BoltzmarkApi } from './activate';

/** The web worker constructor of the browser (the web extension host has one; Node's type library does not). */
declare const Worker: new (url: string) => ConstructorParameters<typeof LanguageClient>[3];

/** Activates on the first Markdown document (or one of the commands or views). */
export function activate(context: vscode.ExtensionContext): Promise<BoltzmarkApi> {
  return activateWith(context, (options, ctx) => {
    const main = vscode.Uri.joinPath(ctx.extensionUri, 'dist/web/server.js');
    const worker = new Worker(main.toString(true));
    return new LanguageClient('boltzmark', 'Boltzmark', options, worker);
  });
}

/** Stops the language server (and so its worker). */
export function deactivate(): Promise<void> {
  return deactivateClient();
}

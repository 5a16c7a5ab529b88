/**
 * The desktop entry point (`main` in package.json): the language server runs
 * as a Node.js process beside the extension host, over IPC.
 */
import type * as vscode from 'vscode';
import { LanguageClient, TransportKind, type ServerOptions } from 'vscode-languageclient/node';
import { activateWith, deactivateClient, type BoltzmarkApi } from './activate';
import { CLIENT_ID } from './clientOptions';

export type { BoltzmarkApi } from './activate';

/** Activates on the first Markdown document (or one of the commands or views). */
export function activate(context: vscode.ExtensionContext): Promise<BoltzmarkApi> {
  return activateWith(context, (options, ctx) => {
    const module = ctx.asAbsolutePath('dist/server.js');
    const serverOptions: ServerOptions = {
      run: { module, transport: TransportKind.ipc },
      debug: { module, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--inspect=6009'] } },
    };
    return new LanguageClient(CLIENT_ID, 'Boltzmark', serverOptions, options);
  });
}

/** Stops the language server. */
export function deactivate(): Promise<void> {
  return deactivateClient();
}

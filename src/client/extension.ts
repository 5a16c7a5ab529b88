/**
 * The VS Code extension: starts the language server for Markdown notes and
 * registers the commands. It never changes a note itself; edits reach a note
 * only as quick fixes the user picks.
 */
import * as vscode from 'vscode';
import { LanguageClient, TransportKind, type LanguageClientOptions, type ServerOptions } from 'vscode-languageclient/node';
import { registerCommands } from './commands';

let client: LanguageClient | undefined;

/** Activates on the first Markdown document (or one of the commands). */
export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const log = vscode.window.createOutputChannel('Boltzmark', { log: true });
  context.subscriptions.push(log);
  try {
    const module = context.asAbsolutePath('dist/server.js');
    const serverOptions: ServerOptions = {
      run: { module, transport: TransportKind.ipc },
      debug: { module, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--inspect=6009'] } },
    };
    const clientOptions: LanguageClientOptions = {
      // Every scheme: the server reads only the text it is sent, so virtual and untitled notes work too.
      documentSelector: [{ language: 'markdown' }],
      outputChannel: log,
      synchronize: { configurationSection: 'boltzmark' },
    };
    client = new LanguageClient('boltzmark', 'Boltzmark', serverOptions, clientOptions);
    registerCommands(context, () => client, log);
    await client.start();
    log.info('Boltzmark language server started');
  } catch (err) {
    const message = `Boltzmark could not start its language server: ${(err as Error).message}`;
    log.error(message);
    void vscode.window.showErrorMessage(message, 'Show log').then((pick) => pick && log.show());
  }
}

/** Stops the language server. */
export async function deactivate(): Promise<void> {
  await client?.stop();
  client = undefined;
}

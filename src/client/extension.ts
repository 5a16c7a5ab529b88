/**
 * The VS Code extension: starts the language server for Markdown notes and
 * registers the commands. It never changes a note itself; edits reach a note
 * only as quick fixes the user picks.
 */
import * as vscode from 'vscode';
import {
  LanguageClient,
  TransportKind,
  type LanguageClientOptions,
  type ServerOptions,
} from 'vscode-languageclient/node';
import type MarkdownIt from 'markdown-it';
import { registerCommands } from './commands';
import { displayOptions } from './display';
import { followCursor } from './curveFollow';
import { registerCurveSerializer } from './curveSerializer';
import { noteReader } from './loadNoteReader';
import { registerRunLog } from './runLogView';

let client: LanguageClient | undefined;

/** What the extension gives VS Code's Markdown preview. */
export interface BoltzmarkApi {
  extendMarkdownIt(md: MarkdownIt): MarkdownIt;
}

/** Activates on the first Markdown document (or one of the commands or views). */
export async function activate(context: vscode.ExtensionContext): Promise<BoltzmarkApi> {
  const api: BoltzmarkApi = {
    extendMarkdownIt: (md) =>
      noteReader().levelsPreview(md, { infoStrings: previewInfoStrings, display: () => displayOptions() }),
  };
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
    context.subscriptions.push(
      followCursor(),
      registerCurveSerializer({ extensionUri: context.extensionUri, client: () => client, log }),
    );
    registerRunLog(context, log, { extensionUri: context.extensionUri, client: () => client, log });
    await client.start();
    log.info('Boltzmark language server started');
  } catch (err) {
    const message = `Boltzmark could not start its language server: ${(err as Error).message}`;
    log.error(message);
    void vscode.window.showErrorMessage(message, 'Show log').then((pick) => pick && log.show());
  }
  return api;
}

/** The extra info strings from the settings, read when the preview renders. */
function previewInfoStrings(): readonly string[] {
  return vscode.workspace.getConfiguration('boltzmark').get<string[]>('blocks.extraInfoStrings', []);
}

/** Stops the language server. */
export async function deactivate(): Promise<void> {
  await client?.stop();
  client = undefined;
}

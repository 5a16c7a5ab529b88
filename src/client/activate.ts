/**
 * What the extension does on activation, the same on the desktop and in the
 * browser: start the language client that the host's entry point makes,
 * register the commands, the curve view and the run log, and hand VS Code
 * the Markdown preview plugin. It never changes a note itself; edits reach a
 * note only as quick fixes the user picks.
 */
import * as vscode from 'vscode';
import type { BaseLanguageClient, LanguageClientOptions } from 'vscode-languageclient';
import type MarkdownIt from 'markdown-it';
import { registerCommands } from './commands';
import { displayOptions } from './display';
import { followCursor } from './curveFollow';
import { registerCurveSerializer } from './curveSerializer';
import { noteReader } from './loadNoteReader';
import { registerRunLog } from './runLogView';
import { registerCellRendererMessaging } from './cellRendererMessaging';

/** What the extension gives VS Code's Markdown preview. */
export interface BoltzmarkApi {
  extendMarkdownIt(md: MarkdownIt): MarkdownIt;
}

/** Makes the host's language client (over IPC on the desktop, a web worker in the browser). */
export type ClientFactory = (
  options: LanguageClientOptions,
  context: vscode.ExtensionContext,
) => BaseLanguageClient | Promise<BaseLanguageClient>;

let client: BaseLanguageClient | undefined;

/** The client options both hosts share. */
export function clientOptions(log: vscode.LogOutputChannel): LanguageClientOptions {
  return {
    // Markdown of every scheme: notes on disk, untitled and virtual ones, and the Markdown cells of notebooks
    // (`vscode-notebook-cell:` documents), which the server reads like notes of their own.
    documentSelector: [{ language: 'markdown' }],
    outputChannel: log,
    synchronize: { configurationSection: 'boltzmark' },
  };
}

/** Activates on the first Markdown document (or one of the commands or views). */
export async function activateWith(context: vscode.ExtensionContext, makeClient: ClientFactory): Promise<BoltzmarkApi> {
  const api: BoltzmarkApi = {
    extendMarkdownIt: (md) =>
      noteReader().levelsPreview(md, { infoStrings: previewInfoStrings, display: () => displayOptions() }),
  };
  const log = vscode.window.createOutputChannel('Boltzmark', { log: true });
  context.subscriptions.push(log);
  try {
    client = await makeClient(clientOptions(log), context);
    registerCommands(context, () => client, log);
    context.subscriptions.push(
      followCursor(),
      registerCurveSerializer({ extensionUri: context.extensionUri, client: () => client, log }),
      registerCellRendererMessaging(),
    );
    registerRunLog(context, log);
    await client.start();
    log.info('Boltzmark language server started');
  } catch (err) {
    const message = `Boltzmark could not start its language server: ${(err as Error).message}`;
    log.error(message);
    if (err instanceof Error && err.stack) log.debug(err.stack);
    void vscode.window.showErrorMessage(message, 'Show log').then((pick) => pick && log.show());
  }
  return api;
}

/** The extra info strings from the settings, read when the preview renders. */
export function previewInfoStrings(): readonly string[] {
  return vscode.workspace.getConfiguration('boltzmark').get<string[]>('blocks.extraInfoStrings', []);
}

/** Stops the language server. */
export async function deactivateClient(): Promise<void> {
  await client?.stop();
  client = undefined;
}

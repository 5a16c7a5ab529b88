/**
 * What the extension does on activation, the same on the desktop and in the
 * browser: start the language client that the host's entry point makes,
 * register the commands, the curve view and the run log, and hand VS Code
 * the Markdown preview plugin. It never changes a note itself; edits reach a
 * note only as quick fixes the user picks.
 */
import * as vscode from 'vscode';
import type { BaseLanguageClient, LanguageClientOptions, StaticFeature } from 'vscode-languageclient';
import { LENS_COMMANDS_CAPABILITY } from '../shared/protocol';
import type MarkdownIt from 'markdown-it';
import { background } from './background';
import { BLOCKS_KEY_DELAY_MS, BlocksKey, NOTE_HAS_BLOCKS } from './blocksKey';
import { clientOptions } from './clientOptions';
import { registerCommands } from './commands';
import { displayOptions } from './display';
import { followCursor } from './curveFollow';
import { registerCurveSerializer } from './curveSerializer';
import { noteReader } from './loadNoteReader';
import { registerRunLog, type PreviewSources } from './runLogView';
import { registerCellRendererMessaging } from './cellRendererMessaging';
import { serveSpectrumFiles } from './spectrumFiles';

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

/** Tells the server that this client runs the commands its code lenses name (src/shared/protocol.ts). */
const LENS_COMMANDS: StaticFeature = {
  fillClientCapabilities(capabilities) {
    const given: unknown = capabilities.experimental;
    const others = typeof given === 'object' && given !== null ? (given as Record<string, unknown>) : {};
    capabilities.experimental = { ...others, [LENS_COMMANDS_CAPABILITY]: true };
  },
  initialize: () => undefined,
  getState: () => ({ kind: 'static' }),
  clear: () => undefined,
};

/** Activates on the first Markdown document (or one of the commands or views). */
export async function activateWith(context: vscode.ExtensionContext, makeClient: ClientFactory): Promise<BoltzmarkApi> {
  // The run log's sources (other runs, spectrum files) for the preview's references, once it is registered.
  let previewSources: PreviewSources | null = null;
  const api: BoltzmarkApi = {
    extendMarkdownIt: (md) =>
      noteReader().levelsPreview(md, {
        infoStrings: (env) => previewInfoStrings(renderedNote(env)),
        display: (env) => displayOptions(renderedNote(env)),
        externals: (env) => previewSources?.externals(renderedNote(env)) ?? null,
      }),
  };
  const log = vscode.window.createOutputChannel('Boltzmark', { log: true });
  context.subscriptions.push(log, trackBlocksKey(log));
  try {
    client = await makeClient(clientOptions(log), context);
    client.registerFeature(LENS_COMMANDS);
    registerCommands(context, () => client, log);
    context.subscriptions.push(
      followCursor(),
      registerCurveSerializer({ extensionUri: context.extensionUri, client: () => client, log }),
      ...serveSpectrumFiles(client),
    );
    previewSources = registerRunLog(context, log, { extensionUri: context.extensionUri, client: () => client, log });
    // The rendered cells of notebooks take the results of blocks that refer out from the run log's sources.
    context.subscriptions.push(registerCellRendererMessaging(() => previewSources));
    await client.start();
    log.info('Boltzmark language server started');
  } catch (err) {
    const message = `Boltzmark could not start its language server: ${(err as Error).message}`;
    log.error(message);
    if (err instanceof Error && err.stack) log.debug(err.stack);
    background(
      log,
      'showing the start-up error',
      vscode.window.showErrorMessage(message, 'Show log').then((pick) => pick && log.show()),
    );
  }
  return api;
}

/** The note VS Code's preview is rendering: markdown-it's `env.currentDocument`, when it is there. */
function renderedNote(env: unknown): vscode.Uri | undefined {
  const doc = (env as { currentDocument?: unknown } | null | undefined)?.currentDocument;
  return doc instanceof vscode.Uri ? doc : undefined;
}

/** The extra info strings from the settings (of the note's folder, when one is given). */
function previewInfoStrings(scope?: vscode.Uri): readonly string[] {
  const value = vscode.workspace.getConfiguration('boltzmark', scope).get<unknown>('blocks.extraInfoStrings', []);
  return Array.isArray(value) ? value.filter((x): x is string => typeof x === 'string') : [];
}

/**
 * Keeps `boltzmark.noteHasBlocks` true exactly while the active editor shows
 * a note with a `levels` block: at once when the active editor or the
 * settings change, after a short pause when the active note is edited.
 */
function trackBlocksKey(log: vscode.LogOutputChannel): vscode.Disposable {
  const active = (): vscode.TextDocument | undefined => vscode.window.activeTextEditor?.document;
  const key = new BlocksKey(
    (value) =>
      background(
        log,
        `setting ${NOTE_HAS_BLOCKS}`,
        vscode.commands.executeCommand('setContext', NOTE_HAS_BLOCKS, value),
      ),
    () => previewInfoStrings(active()?.uri),
  );
  let timer: ReturnType<typeof setTimeout> | undefined;
  const now = (): void => {
    clearTimeout(timer);
    key.update(active());
  };
  now();
  const subscriptions = [
    vscode.window.onDidChangeActiveTextEditor(now),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('boltzmark.blocks') && now()),
    vscode.workspace.onDidChangeTextDocument((e) => {
      if (e.document !== active()) return;
      clearTimeout(timer);
      timer = setTimeout(now, BLOCKS_KEY_DELAY_MS);
    }),
  ];
  return {
    dispose: () => {
      clearTimeout(timer);
      for (const d of subscriptions) d.dispose();
    },
  };
}

/** Stops the language server. */
export async function deactivateClient(): Promise<void> {
  const stopping = client;
  client = undefined;
  // A server that already died cannot be stopped; VS Code is shutting the extension down either way.
  await stopping?.stop().catch(() => undefined);
}

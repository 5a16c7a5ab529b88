/**
 * Commands of the extension. "Show Curve View" opens the curve
 * view beside the note (from the code lens, the palette or the editor title
 * bar); "Copy Block Results" puts the block's results table on the clipboard.
 */
import * as vscode from 'vscode';
import type { BaseLanguageClient as LanguageClient } from 'vscode-languageclient';
import { ResultsMarkdownRequest } from '../shared/protocol';
import { background } from './background';
import { CurveView } from './curveView';

/** Resolves the note and line a command acts on: its arguments, or the active editor's cursor. */
function target(uri?: string, line?: number): { uri: string; line: number } | null {
  if (typeof uri === 'string' && typeof line === 'number') return { uri, line };
  const editor = vscode.window.activeTextEditor;
  if (!editor || editor.document.languageId !== 'markdown') return null;
  return { uri: editor.document.uri.toString(), line: editor.selection.active.line };
}

async function results(
  getClient: () => LanguageClient | undefined,
  uri?: string,
  line?: number,
): Promise<string | null> {
  const t = target(uri, line);
  const client = getClient();
  if (!t || !client) return null;
  return client.sendRequest(ResultsMarkdownRequest, t);
}

/** Registers every command. */
export function registerCommands(
  context: vscode.ExtensionContext,
  getClient: () => LanguageClient | undefined,
  log: vscode.LogOutputChannel,
): void {
  const noBlock = (): void =>
    background(
      log,
      'the no-block message',
      vscode.window.showInformationMessage('Place the cursor in a `levels` block first.'),
    );
  context.subscriptions.push(
    // One view for all three: the lens names what the block has (its S(E) curve, a series fit or a Boltzmann plot).
    ...['boltzmark.showCurve', 'boltzmark.showSeriesFit', 'boltzmark.showBoltzmannPlot'].map((id) =>
      vscode.commands.registerCommand(id, (uri?: string | vscode.Uri, line?: number) => {
        // From the editor title bar VS Code passes the note's Uri; the code lens passes (uri, line).
        const editor = vscode.window.activeTextEditor;
        const fromTitle = uri instanceof vscode.Uri && editor?.document.uri.toString() === uri.toString();
        const t = fromTitle ? target() : target(typeof uri === 'string' ? uri : undefined, line);
        if (!t) return noBlock();
        CurveView.show({ extensionUri: context.extensionUri, client: getClient, log }, t);
      }),
    ),
    vscode.commands.registerCommand('boltzmark.copyResults', async (uri?: string, line?: number) => {
      const md = await results(getClient, uri, line);
      if (md === null) return noBlock();
      await vscode.env.clipboard.writeText(md);
      void vscode.window.setStatusBarMessage('Boltzmark: results copied', 3000);
    }),
    vscode.commands.registerCommand('boltzmark.restartServer', async () => {
      log.info('restarting the language server');
      // Stop and start: the same on both kinds of client (the Node client's restart() is this too).
      const client = getClient();
      if (client) {
        await client.stop();
        await client.start();
      }
    }),
  );
}

/**
 * Commands of the extension. "Show energy–entropy curve" opens the block's
 * results as a Markdown preview until the curve view arrives; "Copy results"
 * puts the same table on the clipboard.
 */
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import { ResultsMarkdownRequest } from '../server/protocol';

/** Resolves the note and line a command acts on: its arguments, or the active editor's cursor. */
function target(uri?: string, line?: number): { uri: string; line: number } | null {
  if (typeof uri === 'string' && typeof line === 'number') return { uri, line };
  const editor = vscode.window.activeTextEditor;
  if (!editor || editor.document.languageId !== 'markdown') return null;
  return { uri: editor.document.uri.toString(), line: editor.selection.active.line };
}

async function results(getClient: () => LanguageClient | undefined, uri?: string, line?: number): Promise<string | null> {
  const t = target(uri, line);
  const client = getClient();
  if (!t || !client) return null;
  return client.sendRequest(ResultsMarkdownRequest, t);
}

/** Registers every command. */
export function registerCommands(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined, log: vscode.LogOutputChannel): void {
  const noBlock = (): void => void vscode.window.showInformationMessage('Place the cursor in a `levels` block first.');
  context.subscriptions.push(
    vscode.commands.registerCommand('boltzmark.showCurve', async (uri?: string, line?: number) => {
      const md = await results(getClient, uri, line);
      if (md === null) return noBlock();
      const doc = await vscode.workspace.openTextDocument({ language: 'markdown', content: md });
      await vscode.commands.executeCommand('markdown.showPreviewToSide', doc.uri);
    }),
    vscode.commands.registerCommand('boltzmark.copyResults', async (uri?: string, line?: number) => {
      const md = await results(getClient, uri, line);
      if (md === null) return noBlock();
      await vscode.env.clipboard.writeText(md);
      void vscode.window.setStatusBarMessage('Boltzmark: results copied', 3000);
    }),
    vscode.commands.registerCommand('boltzmark.restartServer', async () => {
      log.info('restarting the language server');
      await getClient()?.restart();
    }),
  );
}

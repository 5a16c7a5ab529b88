/**
 * Tells the notebook cell renderer (`cellRenderer.ts`, in the notebook's
 * webview) how numbers are shown: the `boltzmark.display.*` settings and the
 * extra fence info strings, whenever a renderer asks and whenever they change.
 */
import * as vscode from 'vscode';
import { displayOptions } from './display';

/** The renderer's id in package.json (`contributes.notebookRenderer`). */
export const CELL_RENDERER_ID = 'boltzmark.levelsCells';

/** Starts answering the renderers; the returned disposable stops it. */
export function registerCellRendererMessaging(): vscode.Disposable {
  const messaging = vscode.notebooks.createRendererMessaging(CELL_RENDERER_ID);
  const settings = (): object => ({
    ...displayOptions(),
    infoStrings: vscode.workspace.getConfiguration('boltzmark').get<string[]>('blocks.extraInfoStrings', []),
  });
  return vscode.Disposable.from(
    messaging.onDidReceiveMessage((e) => void messaging.postMessage(settings(), e.editor)),
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration('boltzmark')) void messaging.postMessage(settings());
    }),
  );
}

/**
 * Tells the notebook cell renderer (`cellRenderer.ts`, in the notebook's
 * webview) how numbers are shown: the `boltzmark.display.*` settings and the
 * extra fence info strings, whenever a renderer asks and whenever they change.
 * With them go the results of the blocks that take values from other runs or
 * spectrum files, which the webview cannot read: made here with the run log's
 * sources (the Markdown preview's), and sent again whenever the run log has
 * read something anew while such a notebook is shown.
 */
import * as vscode from 'vscode';
import { displayOptions } from './display';
import { noteReader } from './loadNoteReader';
import { refersOut } from './refersOut';
import type { PreviewSources } from './runLogView';

/** The renderer's id in package.json (`contributes.notebookRenderer`). */
export const CELL_RENDERER_ID = 'boltzmark.levelsCells';

/** Starts answering the renderers; the returned disposable stops it. `sources` gives the run log's, once it is up. */
export function registerCellRendererMessaging(sources: () => PreviewSources | null = () => null): vscode.Disposable {
  const messaging = vscode.notebooks.createRendererMessaging(CELL_RENDERER_ID);
  const infoStrings = (): string[] =>
    vscode.workspace.getConfiguration('boltzmark').get<string[]>('blocks.extraInfoStrings', []);
  const settings = (): object => ({ ...displayOptions(), infoStrings: infoStrings() });
  /** The Markdown cells' texts of a notebook, when one of them may refer out (else nothing to make). */
  const referring = (notebook: vscode.NotebookDocument): string[] | null => {
    const texts = notebook
      .getCells()
      .filter((c) => c.kind === vscode.NotebookCellKind.Markup)
      .map((c) => c.document.getText());
    return texts.some(refersOut) ? texts : null;
  };
  const message = (editor: vscode.NotebookEditor): object => {
    const texts = referring(editor.notebook);
    const made = texts
      ? noteReader().madeResults(
          texts,
          sources()?.externals(editor.notebook.uri) ?? null,
          displayOptions(editor.notebook.uri),
          infoStrings(),
        )
      : {};
    return { ...settings(), results: made };
  };
  const sendAll = (onlyReferring: boolean): void => {
    for (const editor of vscode.window.visibleNotebookEditors)
      if (!onlyReferring || referring(editor.notebook)) void messaging.postMessage(message(editor), editor);
  };
  const sourcesRead = sources()?.onDidRead(() => sendAll(true));
  return vscode.Disposable.from(
    messaging.onDidReceiveMessage((e) => void messaging.postMessage(message(e.editor), e.editor)),
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration('boltzmark')) {
        void messaging.postMessage(settings());
        sendAll(true);
      }
    }),
    ...(sourcesRead ? [sourcesRead] : []),
  );
}

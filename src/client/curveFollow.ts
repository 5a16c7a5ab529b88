/**
 * Keeps the curve view on the block under the cursor: selection changes in a
 * Markdown editor and edits of the shown note ask the view for the block at
 * the cursor, debounced so that typing and arrowing do not flood the server.
 */
import * as vscode from 'vscode';
import { Debouncer } from '../shared/debouncer';
import { CurveView } from './curveView';

/** Pause after the last cursor move or keystroke before the view asks again. */
export const FOLLOW_DELAY_MS = 150;

/** Registers the listeners; they do nothing while no view is open. */
export function followCursor(): vscode.Disposable {
  const follow = new Debouncer(FOLLOW_DELAY_MS);
  const later = (editor: vscode.TextEditor): void =>
    follow.schedule('cursor', () => {
      const view = CurveView.active;
      if (view && !editor.document.isClosed)
        view.follow({ uri: editor.document.uri.toString(), line: editor.selection.active.line });
    });
  const subscriptions = [
    vscode.window.onDidChangeTextEditorSelection((e) => {
      if (CurveView.active && e.textEditor.document.languageId === 'markdown') later(e.textEditor);
    }),
    vscode.workspace.onDidChangeTextDocument((e) => {
      const view = CurveView.active;
      const editor = vscode.window.activeTextEditor;
      if (view && editor && editor.document === e.document && view.shownUri === e.document.uri.toString())
        later(editor);
    }),
    // A spectrum file the shown block reads changed on disk: the server re-analysed the note without an edit,
    // and its new diagnostics are the sign; ask again so the panel shows the new integral.
    vscode.languages.onDidChangeDiagnostics((e) => {
      const view = CurveView.active;
      const editor = vscode.window.activeTextEditor;
      if (!view || !editor || view.shownUri !== editor.document.uri.toString()) return;
      if (e.uris.some((u) => u.toString() === view.shownUri)) later(editor);
    }),
  ];
  return {
    dispose: () => {
      follow.dispose();
      for (const s of subscriptions) s.dispose();
    },
  };
}

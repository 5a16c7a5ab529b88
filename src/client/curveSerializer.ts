/**
 * Restores the curve view after VS Code reloads its window: the page saved
 * its last render with `setState`; the restored panel shows the same block
 * and pins again, with fresh data from the server.
 */
import * as vscode from 'vscode';
import { CURVE_VIEW_TYPE, CurveView, type CurveViewHost } from './curveView';

/** Registers the serializer for the `boltzmark.curveView` panels. */
export function registerCurveSerializer(host: CurveViewHost): vscode.Disposable {
  return vscode.window.registerWebviewPanelSerializer(CURVE_VIEW_TYPE, {
    deserializeWebviewPanel(panel: vscode.WebviewPanel, state: unknown): Promise<void> {
      CurveView.revive(panel, host, state);
      return Promise.resolve();
    },
  });
}

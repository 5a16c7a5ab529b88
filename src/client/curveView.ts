/**
 * The curve view beside the editor: one webview panel that shows
 * the block under the cursor (or the one a command names), with pinned runs
 * overlaid. Curve data come from the language server (`boltzmark/curveData`,
 * computed by the core); the page only draws. Messages from the page are
 * validated before use, nothing is posted after dispose, and a payload for an
 * older version of the note than the editor's is asked for again.
 */
import * as vscode from 'vscode';
import type { BaseLanguageClient as LanguageClient } from 'vscode-languageclient';
import {
  isViewState,
  isViewToHost,
  pinsBesides,
  type CurvePayload,
  type PinnedRun,
  type ViewPayload,
  type ViewToHost,
} from '../core/packageFree';
import { CurveDataRequest } from '../shared/protocol';
import { background } from './background';
import { copyImageLink, saveCsv, savePng } from './curveExport';
import { newNonce, viewHtml } from './viewHtml';

/** The panel's view type (also in package.json's `onWebviewPanel:` activation event). */
export const CURVE_VIEW_TYPE = 'boltzmark.curveView';

/** At most this many pinned runs; pinning one more drops the oldest. */
const MAX_PINS = 12;

/** A block the view should show: the note and a line inside the block. */
export interface CurveTarget {
  readonly uri: string;
  readonly line: number;
}

/** What the view needs from the extension. */
export interface CurveViewHost {
  readonly extensionUri: vscode.Uri;
  readonly client: () => LanguageClient | undefined;
  readonly log: vscode.LogOutputChannel;
}

/** Webview options: scripts on, resources only from the bundle's media folders. */
export function webviewOptions(extensionUri: vscode.Uri): vscode.WebviewOptions {
  return {
    enableScripts: true,
    enableCommandUris: false,
    localResourceRoots: [
      vscode.Uri.joinPath(extensionUri, 'dist', 'media'),
      vscode.Uri.joinPath(extensionUri, 'media'),
    ],
  };
}

/** The one curve view panel. */
export class CurveView implements vscode.Disposable {
  private static instance: CurveView | undefined;
  private readonly disposables: vscode.Disposable[] = [];
  private disposed = false;
  private target: CurveTarget | null = null;
  private current: ViewPayload | null = null;
  private pins: PinnedRun[] = [];
  private seq = 0;
  private request = 0;
  private pinCount = 0;

  /** The open view, if any. */
  static get active(): CurveView | undefined {
    return CurveView.instance;
  }

  /** Opens the view beside the editor (or reveals it) and shows the block at `target`. */
  static show(host: CurveViewHost, target: CurveTarget): CurveView {
    let view = CurveView.instance;
    if (view) view.panel.reveal(vscode.ViewColumn.Beside, true);
    else {
      const panel = vscode.window.createWebviewPanel(
        CURVE_VIEW_TYPE,
        'Curve view',
        { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true },
        webviewOptions(host.extensionUri),
      );
      view = new CurveView(panel, host);
    }
    view.follow(target);
    return view;
  }

  /** Adopts a panel VS Code restored after a reload, with the state its page saved. */
  static revive(panel: vscode.WebviewPanel, host: CurveViewHost, state: unknown): CurveView {
    CurveView.instance?.dispose();
    const view = new CurveView(panel, host);
    if (isViewState(state) && state.last) {
      const shown = state.last.current;
      view.pins = [...state.last.pinned];
      view.pinCount = view.pins.length;
      if (shown) view.follow({ uri: shown.uri, line: shown.line });
    }
    return view;
  }

  private constructor(
    private readonly panel: vscode.WebviewPanel,
    private readonly host: CurveViewHost,
  ) {
    CurveView.instance = this;
    panel.webview.options = webviewOptions(host.extensionUri);
    panel.iconPath = vscode.Uri.joinPath(host.extensionUri, 'media', 'icon.png');
    panel.webview.html = this.html();
    this.disposables.push(
      panel.onDidDispose(() => this.dispose()),
      panel.webview.onDidReceiveMessage((m: unknown) => this.receive(m)),
    );
  }

  /** The note shown now, if any. */
  get shownUri(): string | null {
    return this.target?.uri ?? null;
  }

  /** Shows the block at `target` (if there is one; otherwise keeps the block shown). */
  follow(target: CurveTarget): void {
    this.target = target;
    background(this.host.log, 'curve view: refresh', this.refresh(3));
  }

  private html(): string {
    const w = this.panel.webview;
    const media = (...p: string[]) => w.asWebviewUri(vscode.Uri.joinPath(this.host.extensionUri, ...p)).toString();
    return viewHtml({
      cspSource: w.cspSource,
      scriptUri: media('dist', 'media', 'view.js'),
      styleUri: media('media', 'view.css'),
      nonce: newNonce(),
    });
  }

  /** Asks the server for the target's payload; retries (up to `tries`) while the server lags the editor. */
  private async refresh(tries: number): Promise<void> {
    const target = this.target;
    const client = this.host.client();
    if (!target || !client || this.disposed) return;
    const id = ++this.request;
    let payload: ViewPayload | null;
    try {
      payload = await client.sendRequest(CurveDataRequest, target);
    } catch (err) {
      this.host.log.warn(`curve view: ${(err as Error).message}`);
      return;
    }
    if (this.disposed || id !== this.request) return; // a newer request is on its way
    const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === target.uri);
    if (payload && doc && payload.version < doc.version && tries > 0) return this.refresh(tries - 1);
    if (!payload || same(payload, this.current)) return;
    this.current = payload;
    if (payload.kind === 'curve') this.panel.title = `Curve: ${payload.id}`;
    this.send();
  }

  private send(): void {
    if (this.disposed) return;
    background(
      this.host.log,
      'curve view: render',
      this.panel.webview.postMessage({ type: 'render', seq: ++this.seq, current: this.current, pinned: this.pins }),
    );
  }

  private receive(m: unknown): void {
    if (this.disposed) return;
    if (!isViewToHost(m)) {
      this.host.log.warn('curve view: dropped a malformed message from the page');
      return;
    }
    this.handle(m).catch((err: unknown) => {
      const message = err instanceof Error ? err.message : String(err);
      this.host.log.error(`curve view: ${message}`);
      background(this.host.log, 'curve view: error message', vscode.window.showErrorMessage(`Boltzmark: ${message}`));
    });
  }

  private async handle(m: ViewToHost): Promise<void> {
    const shown = this.current?.kind === 'curve' ? this.current : null;
    switch (m.type) {
      case 'ready':
        return this.send();
      case 'pin':
        if (shown) this.pin(shown);
        return;
      case 'unpin':
        this.pins = this.pins.filter((p) => p.key !== m.key);
        return this.send();
      case 'exportPng':
        if (shown) await savePng(shown, m.dataUrl);
        return;
      case 'exportCsv':
        if (shown)
          await saveCsv(
            shown,
            pinsBesides(shown, this.pins).map((p) => p.payload),
            m.unit,
          );
        return;
      case 'copyImageLink':
        if (shown && (await copyImageLink(shown, m.dataUrl)))
          void vscode.window.setStatusBarMessage('Boltzmark: image link copied', 3000);
        return;
    }
  }

  /** Pins a snapshot of the shown run (replacing an older pin of the same block). */
  private pin(p: CurvePayload): void {
    const rest = this.pins.filter((r) => !(r.payload.uri === p.uri && r.payload.line === p.line));
    this.pins = [...rest, { key: `pin-${++this.pinCount}`, payload: p }].slice(-MAX_PINS);
    this.send();
  }

  /** Closes the panel and stops listening. */
  dispose(): void {
    if (this.disposed) return;
    this.disposed = true;
    if (CurveView.instance === this) CurveView.instance = undefined;
    this.panel.dispose();
    for (const d of this.disposables.splice(0)) d.dispose();
  }
}

/** True when two payloads show the same version of the same block. */
function same(a: ViewPayload, b: ViewPayload | null): boolean {
  return b !== null && a.kind === b.kind && a.uri === b.uri && a.line === b.line && a.version === b.version;
}

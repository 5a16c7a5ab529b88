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
  payloadTitle,
  pinsBesides,
  type CurvePayload,
  type PinnedPlot,
  type PinnedRun,
  type RunChartPayload,
  type ViewPayload,
  type ViewToHost,
} from '../core/packageFree';
import { CurveDataRequest } from '../shared/protocol';
import type { RunEntry, RunLog } from '../core';
import { background } from './background';
import {
  copyImageLink,
  saveCsv,
  savePng,
  saveRunsCsv,
  saveRunsPng,
  saveSpectrumCsv,
  saveSpectrumPng,
} from './curveExport';
import { displayOptions } from './display';
import { noteReader } from './loadNoteReader';
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

/**
 * Which runs the comparison chart shows: the blocks of the note shown (the
 * default), or a list the run log handed over with its filter.
 */
export type RunsSource =
  | { readonly kind: 'note' }
  | { readonly kind: 'list'; readonly title: string; readonly entries: () => readonly RunEntry[] };

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
  private plotPins: PinnedPlot[] = [];
  private runs: RunChartPayload | null = null;
  private runsSource: RunsSource = { kind: 'note' };
  /** The note reader's run log, kept so that its analyzer's block cache serves every refresh. */
  private noteRuns: RunLog | null = null;
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
    // Asked for a block, the comparison shows that block's note again.
    view.runsSource = { kind: 'note' };
    view.follow(target);
    return view;
  }

  /** Opens the view (or reveals it) comparing the given runs, e.g. the run log's filtered list. */
  static compare(host: CurveViewHost, source: RunsSource, follow: CurveTarget | null): CurveView {
    const view = CurveView.show(host, follow ?? { uri: '', line: 0 });
    view.runsSource = source;
    view.updateRuns();
    view.send();
    return view;
  }

  /** Adopts a panel VS Code restored after a reload, with the state its page saved. */
  static revive(panel: vscode.WebviewPanel, host: CurveViewHost, state: unknown): CurveView {
    CurveView.instance?.dispose();
    const view = new CurveView(panel, host);
    if (isViewState(state) && state.last) {
      const shown = state.last.current;
      view.pins = [...state.last.pinned];
      view.plotPins = [...(state.last.pinnedPlots ?? [])];
      view.pinCount = view.pins.length + view.plotPins.length;
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
    if (target.uri === '') return;
    this.target = target;
    background(this.host.log, 'curve view: refresh', this.refresh(3));
  }

  /** Recomputes the run comparison (its source changed) and sends it when it changed. */
  refreshRuns(): void {
    if (!this.disposed && this.updateRuns()) this.send();
  }

  /**
   * Recomputes the run comparison from its source: the shown note's blocks,
   * read from the open document with the whole core (the note reader), or the
   * list the run log handed over. Returns true when it changed.
   */
  private updateRuns(): boolean {
    let next: RunChartPayload | null = null;
    const src = this.runsSource;
    if (src.kind === 'list') {
      next = noteReader().runChartData(src.title, src.entries(), displayOptions());
    } else if (this.target) {
      const uri = this.target.uri;
      const doc = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri);
      if (doc) {
        const reader = noteReader();
        this.noteRuns ??= new reader.RunLog();
        const name = vscode.workspace.asRelativePath(doc.uri);
        this.noteRuns.update(uri, name, doc.getText());
        const entries = this.noteRuns.entries().filter((e) => e.uri === uri);
        next = reader.runChartData(name, entries, displayOptions(doc.uri));
      }
    }
    if (JSON.stringify(next) === JSON.stringify(this.runs)) return false;
    this.runs = next;
    return true;
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
    const runsChanged = this.updateRuns();
    if (!payload || same(payload, this.current)) {
      if (runsChanged) this.send();
      return;
    }
    this.current = payload;
    // The title follows the block shown, whatever it draws.
    this.panel.title = payloadTitle(payload);
    this.send();
  }

  private send(): void {
    if (this.disposed) return;
    background(
      this.host.log,
      'curve view: render',
      this.panel.webview.postMessage({
        type: 'render',
        seq: ++this.seq,
        current: this.current,
        pinned: this.pins,
        pinnedPlots: this.plotPins,
        runs: this.runs,
      }),
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
        else if (this.current?.kind === 'problem' && this.current.plot) this.pinPlot(this.current);
        return;
      case 'unpin':
        this.pins = this.pins.filter((p) => p.key !== m.key);
        this.plotPins = this.plotPins.filter((p) => p.key !== m.key);
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
      case 'openRun': {
        // Only a run the chart shows can be opened: the page names it, the host checks it.
        const run = this.runs?.points.find((p) => p.uri === m.uri && p.line === m.line);
        if (!run) return;
        const editor = await vscode.window.showTextDocument(vscode.Uri.parse(run.uri), {
          viewColumn: vscode.ViewColumn.One,
          selection: new vscode.Range(run.line, 0, run.line, 0),
        });
        editor.revealRange(
          new vscode.Range(run.line, 0, run.line, 0),
          vscode.TextEditorRevealType.InCenterIfOutsideViewport,
        );
        return;
      }
      case 'exportRunsCsv':
        if (this.runs) await saveRunsCsv(this.runs, m.quantity, this.runsNote(), displayOptions());
        return;
      case 'exportRunsPng':
        if (this.runs) await saveRunsPng(this.runs, m.dataUrl, this.runsNote());
        return;
      case 'exportSpectrumPng':
      case 'exportSpectrumCsv': {
        // Only a trace the host sent: the page names it by key, the host looks it up in what it sent.
        const t = this.current?.spectra?.find((x) => x.key === m.key);
        if (!t || !this.current) return;
        const note = vscode.Uri.parse(this.current.uri);
        if (m.type === 'exportSpectrumPng') await saveSpectrumPng(note, t, m.dataUrl);
        else await saveSpectrumCsv(note, t);
        return;
      }
    }
  }

  /** Where the run comparison's exports are saved by default: beside the shown note, or the workspace's first folder. */
  private runsNote(): vscode.Uri | null {
    if (this.target) return vscode.Uri.parse(this.target.uri);
    const folder = vscode.workspace.workspaceFolders?.[0];
    return folder ? vscode.Uri.joinPath(folder.uri, 'runs.md') : null;
  }

  /** Pins the measurement plot of a block without a curve (a series fit, a Boltzmann plot), to compare runs. */
  private pinPlot(p: Extract<ViewPayload, { kind: 'problem' }>): void {
    if (!p.plot) return;
    const rest = this.plotPins.filter((r) => !(r.uri === p.uri && r.line === p.line));
    const id = p.id ?? `block at line ${p.line + 1}`;
    this.plotPins = [...rest, { key: `pin-${++this.pinCount}`, id, uri: p.uri, line: p.line, plot: p.plot }].slice(
      -MAX_PINS,
    );
    this.send();
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

/**
 * The "Levels Run Log" tree in the Explorer: every `levels` block of the
 * workspace's Markdown notes, grouped by note or by date, filterable by
 * status. Work is bounded: the first scan starts when the view is first shown
 * and reads at most MAX_FILES notes, changes on disk re-read only the changed
 * note (debounced), and unsaved edits of open notes are followed the same way.
 */
import * as vscode from 'vscode';
import type { RunEntry, RunGroup, RunLog } from '../core';
import { measuredTemperatureText, STATUSES, type Status } from '../core/packageFree';
import { displayOptions } from './display';
import { noteReader } from './loadNoteReader';
import { CurveView, type CurveViewHost } from './curveView';

const MAX_FILES = 2000;
const MAX_BYTES = 5 * 1024 * 1024;
const DEBOUNCE_MS = 300;

type Node = { kind: 'group'; group: RunGroup } | { kind: 'run'; entry: RunEntry };

/** Tree data for the run log. */
class RunLogTree implements vscode.TreeDataProvider<Node> {
  private model: RunLog | undefined;
  by: 'file' | 'date' = 'file';
  statuses: Status[] | null = null;
  private readonly changed = new vscode.EventEmitter<void>();
  readonly onDidChangeTreeData = this.changed.event;

  /** The run log's model, created (and the note reader loaded) when the view first needs it. */
  get log(): RunLog {
    this.model ??= new (noteReader().RunLog)();
    return this.model;
  }

  refresh(): void {
    this.changed.fire();
    // A run comparison of this list follows it.
    CurveView.active?.refreshRuns();
  }

  getChildren(node?: Node): Node[] {
    if (!node) return this.log.groups(this.by, this.statuses).map((group) => ({ kind: 'group', group }));
    return node.kind === 'group' ? node.group.entries.map((entry) => ({ kind: 'run', entry })) : [];
  }

  getTreeItem(node: Node): vscode.TreeItem {
    if (node.kind === 'group') {
      const item = new vscode.TreeItem(node.group.label, vscode.TreeItemCollapsibleState.Expanded);
      item.description = `${node.group.entries.length} run${node.group.entries.length === 1 ? '' : 's'}`;
      item.iconPath = new vscode.ThemeIcon(this.by === 'file' ? 'markdown' : 'calendar');
      return item;
    }
    const e = node.entry;
    const item = new vscode.TreeItem(e.id ?? `block at line ${e.line + 1}`, vscode.TreeItemCollapsibleState.None);
    const t = e.temperature ? measuredTemperatureText(e.temperature, displayOptions(vscode.Uri.parse(e.uri))) : '';
    item.description = [e.status, t, this.by === 'date' ? e.name : (e.date ?? '')].filter((x) => x !== '').join(' · ');
    item.tooltip = `${e.name}:${e.line + 1}\n${e.status}${t ? `\n${t}` : ''}`;
    item.iconPath = new vscode.ThemeIcon(STATUS_ICONS[e.status]);
    item.contextValue = 'boltzmark.run';
    item.command = {
      command: 'vscode.open',
      title: 'Open run',
      arguments: [vscode.Uri.parse(e.uri), { selection: new vscode.Range(e.line, 0, e.line, 0) }],
    };
    return item;
  }
}

// Codicons chosen by meaning (not colour): a plain circle for normal runs, warnings for the rest.
const STATUS_ICONS: Record<Status, string> = {
  normal: 'circle-outline',
  saturated: 'circle-large-outline',
  inverted: 'arrow-swap',
  'non-thermal': 'graph-scatter',
  invalid: 'error',
};

/** Registers the view, its commands and its watchers. */
export function registerRunLog(
  context: vscode.ExtensionContext,
  log: vscode.LogOutputChannel,
  curveHost: CurveViewHost,
): void {
  const tree = new RunLogTree();
  const view = vscode.window.createTreeView('boltzmark.runLog', { treeDataProvider: tree, showCollapseAll: true });
  const timers = new Map<string, ReturnType<typeof setTimeout>>();
  let started = false;

  // The folder's name leads the path only in a workspace of several folders (VS Code's default).
  const name = (uri: vscode.Uri): string => vscode.workspace.asRelativePath(uri);
  const readOne = async (uri: vscode.Uri): Promise<void> => {
    const open = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri.toString());
    try {
      let text: string;
      if (open) text = open.getText();
      else {
        const stat = await vscode.workspace.fs.stat(uri);
        if (stat.size > MAX_BYTES) return;
        text = new TextDecoder('utf-8').decode(await vscode.workspace.fs.readFile(uri));
      }
      if (tree.log.update(uri.toString(), name(uri), text)) tree.refresh();
    } catch (err) {
      if (tree.log.remove(uri.toString())) tree.refresh();
      log.debug(`run log: cannot read ${uri.toString()}: ${(err as Error).message}`);
    }
  };
  const schedule = (uri: vscode.Uri): void => {
    const key = uri.toString();
    clearTimeout(timers.get(key));
    timers.set(
      key,
      setTimeout(() => {
        timers.delete(key);
        void readOne(uri);
      }, DEBOUNCE_MS),
    );
  };
  const start = async (): Promise<void> => {
    if (started) return;
    started = true;
    const files = await vscode.workspace.findFiles('**/*.md', '**/node_modules/**', MAX_FILES);
    log.info(`run log: reading ${files.length} note(s)`);
    // A few at a time, so a large workspace does not flood the extension host.
    for (let i = 0; i < files.length; i += 16) await Promise.all(files.slice(i, i + 16).map(readOne));
    const watcher = vscode.workspace.createFileSystemWatcher('**/*.md');
    context.subscriptions.push(
      watcher,
      watcher.onDidCreate(schedule),
      watcher.onDidChange(schedule),
      watcher.onDidDelete((uri) => tree.log.remove(uri.toString()) && tree.refresh()),
      vscode.workspace.onDidChangeTextDocument(
        (e) => e.document.languageId === 'markdown' && e.document.uri.scheme !== 'output' && schedule(e.document.uri),
      ),
    );
  };

  if (view.visible) void start();
  context.subscriptions.push(
    view,
    view.onDidChangeVisibility((e) => e.visible && void start()),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('boltzmark.display') && tree.refresh()),
    vscode.commands.registerCommand('boltzmark.runLog.filter', async () => {
      const picks = await vscode.window.showQuickPick(
        STATUSES.map((s) => ({ label: s, picked: !tree.statuses || tree.statuses.includes(s) })),
        { canPickMany: true, title: 'Show runs with these statuses' },
      );
      if (!picks) return;
      tree.statuses =
        picks.length === STATUSES.length || picks.length === 0 ? null : picks.map((p) => p.label as Status);
      view.description = tree.statuses ? tree.statuses.join(', ') : undefined;
      tree.refresh();
    }),
    vscode.commands.registerCommand('boltzmark.runLog.compare', async () => {
      await start();
      const title = tree.statuses ? `run log (${tree.statuses.join(', ')})` : 'run log';
      // In date order when the runs have dates, as a lab reads its log; the list's own order otherwise.
      const key = (e: RunEntry): string => e.date ?? '\uffff';
      const entries = (): RunEntry[] =>
        [...tree.log.entries(tree.statuses)].sort((a, b) => (key(a) < key(b) ? -1 : key(a) > key(b) ? 1 : 0));
      CurveView.compare(curveHost, { kind: 'list', title, entries }, null);
    }),
    vscode.commands.registerCommand('boltzmark.runLog.groupBy', () => {
      tree.by = tree.by === 'file' ? 'date' : 'file';
      tree.refresh();
    }),
    vscode.commands.registerCommand('boltzmark.runLog.exportCsv', async () => {
      await start();
      const target = await vscode.window.showSaveDialog({
        filters: { CSV: ['csv'] },
        defaultUri: vscode.workspace.workspaceFolders?.[0]
          ? vscode.Uri.joinPath(vscode.workspace.workspaceFolders[0].uri, 'levels-runs.csv')
          : undefined,
      });
      if (!target) return;
      await vscode.workspace.fs.writeFile(
        target,
        new TextEncoder().encode(noteReader().runLogCsv(tree.log.entries(tree.statuses))),
      );
      void vscode.window.showInformationMessage(
        `Boltzmark: run log written to ${vscode.workspace.asRelativePath(target)}`,
      );
    }),
  );
}

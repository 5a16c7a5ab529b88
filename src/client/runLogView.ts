/**
 * The "Levels Run Log" tree in the Explorer: every `levels` block of the
 * workspace's Markdown notes, grouped by note or by date, filterable by
 * status. Work is bounded: the first scan starts when the view is first shown
 * and reads at most MAX_FILES notes, changes on disk re-read only the changed
 * note (debounced), and unsaved edits of open notes are followed the same way.
 */
import * as vscode from 'vscode';
import type { Externals, RunEntry, RunGroup, RunLog } from '../core';
import { measuredTemperatureText, STATUSES, temperatureWithInterval, type Status } from '../core/packageFree';
import { displayOptions } from './display';
import { background } from './background';
import { noteReader } from './loadNoteReader';
import { CurveView, type CurveViewHost } from './curveView';
import { Debouncer } from '../shared/debouncer';
import { RunLogSpectra } from './runLogSpectra';

/** Notes read at most: twice the 10,000-note workspace of the benchmarks (bench/workspace.ts). */
const MAX_FILES = 20_000;
/** Notes the run log reads: Markdown, and Jupyter notebooks (their Markdown cells). */
const NOTE_GLOB = '**/*.{md,ipynb}';
/** Opens a notebook at a run's cell and line (internal: the tree's items call it). */
const OPEN_CELL_RUN = 'boltzmark._openCellRun';
const MAX_BYTES = 5 * 1024 * 1024;
const DEBOUNCE_MS = 300;

type Node = { kind: 'group'; group: RunGroup } | { kind: 'run'; entry: RunEntry };

/** Tree data for the run log. */
class RunLogTree implements vscode.TreeDataProvider<Node> {
  private model: RunLog | undefined;
  by: 'file' | 'date' = 'file';
  statuses: Status[] | null = null;
  /** When set, the view lists only the runs that use this run (a thermal reference, a decay run). */
  usersOf: RunEntry | null = null;
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
    if (!node && this.usersOf) {
      const entries = this.log.users(this.usersOf.uri, this.usersOf.line, this.usersOf.cell);
      return [{ kind: 'group', group: { label: `runs using ${this.usersOf.id ?? this.usersOf.name}`, entries } }];
    }
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
    const where = e.cell === null ? `line ${e.line + 1}` : `cell ${e.cell + 1}, line ${e.line + 1}`;
    const item = new vscode.TreeItem(e.id ?? `block at ${where}`, vscode.TreeItemCollapsibleState.None);
    const t = e.temperature ? measuredTemperatureText(e.temperature, displayOptions(vscode.Uri.parse(e.uri))) : '';
    item.description = [e.status, t, this.by === 'date' ? e.name : (e.date ?? '')].filter((x) => x !== '').join(' · ');
    // The tooltip has room for what the k = 2 interval says (skewed T, or only a bound when saturated).
    const full = temperatureWithInterval(
      e.temperature,
      e.temperatureInterval,
      e.temperatureBound,
      e.status === 'saturated',
      displayOptions(vscode.Uri.parse(e.uri)),
    );
    const shown = full ?? t;
    item.tooltip = `${e.name}${e.cell === null ? '' : ` (cell ${e.cell + 1})`}:${e.line + 1}\n${e.status}${shown ? `\n${shown}` : ''}`;
    item.iconPath = new vscode.ThemeIcon(STATUS_ICONS[e.status]);
    item.contextValue = 'boltzmark.run';
    item.command =
      e.cell === null
        ? {
            command: 'vscode.open',
            title: 'Open run',
            arguments: [vscode.Uri.parse(e.uri), { selection: new vscode.Range(e.line, 0, e.line, 0) }],
          }
        : { command: OPEN_CELL_RUN, title: 'Open run', arguments: [e.uri, e.cell, e.line] };
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

/** What the run log lends the Markdown preview: the sources a note's references read from. */
export interface PreviewSources {
  /**
   * The runs of the workspace's notes and the note's spectrum files, for the preview of `uri`; the first call
   * starts the reading of the workspace, and the preview is refreshed when the log has more to give it.
   */
  externals(uri: vscode.Uri | undefined): Externals | null;
  /** Fired once a burst of readings is over while a note previewed refers out: what it reads may have changed. */
  readonly onDidRead: vscode.Event<void>;
}

/** The debouncer's key of a refresh of the Markdown preview. */
const PREVIEW_REFRESH = '\u0000preview';

/** Registers the view, its commands and its watchers. */
export function registerRunLog(
  context: vscode.ExtensionContext,
  log: vscode.LogOutputChannel,
  curveHost: CurveViewHost,
): PreviewSources {
  const tree = new RunLogTree();
  const view = vscode.window.createTreeView('boltzmark.runLog', { treeDataProvider: tree, showCollapseAll: true });
  const rereads = new Debouncer(DEBOUNCE_MS);
  let started = false;

  // The folder's name leads the path only in a workspace of several folders (VS Code's default).
  const name = (uri: vscode.Uri): string => vscode.workspace.asRelativePath(uri);
  const readOne = async (uri: vscode.Uri): Promise<void> => {
    const open = vscode.workspace.textDocuments.find((d) => d.uri.toString() === uri.toString());
    const notebook = vscode.workspace.notebookDocuments.find((d) => d.uri.toString() === uri.toString());
    try {
      let text: string;
      if (open) text = open.getText();
      else if (notebook) text = notebookJson(notebook);
      else {
        const stat = await vscode.workspace.fs.stat(uri);
        if (stat.size > MAX_BYTES) return;
        text = new TextDecoder('utf-8').decode(await vscode.workspace.fs.readFile(uri));
      }
      // Only a note that names a spectrum needs the files (most do not; their reading stays as it was).
      const externals = text.includes('spectrum') ? spectra.externals(uri.toString()) : null;
      if (!externals) spectra.forget(uri.toString());
      if (tree.log.update(uri.toString(), name(uri), text, externals)) {
        tree.refresh();
        // A preview of a note that reads other runs or files may now show more: the note itself, or a note
        // it may refer to, was read.
        if (previewed.size > 0 && (previewed.has(uri.toString()) || text.includes('id:'))) schedulePreview();
      }
    } catch (err) {
      if (tree.log.remove(uri.toString())) tree.refresh();
      log.debug(`run log: cannot read ${uri.toString()}: ${(err as Error).message}`);
    }
  };
  const schedule = (uri: vscode.Uri): void =>
    rereads.schedule(uri.toString(), () => background(log, `run log: reading ${uri.toString()}`, readOne(uri)));
  const spectra = new RunLogSpectra(schedule, log);
  // The notes whose preview asked the log for sources (only blocks that refer out ask): the preview is
  // refreshed, once per burst of readings, only while there are such notes.
  const previewed = new Set<string>();
  const read = new vscode.EventEmitter<void>();
  const schedulePreview = (): void =>
    rereads.schedule(PREVIEW_REFRESH, () => {
      background(log, 'refreshing the Markdown preview', vscode.commands.executeCommand('markdown.preview.refresh'));
      read.fire();
    });
  context.subscriptions.push(spectra, read);
  const start = async (): Promise<void> => {
    if (started) return;
    started = true;
    const files = await vscode.workspace.findFiles(NOTE_GLOB, '**/node_modules/**', MAX_FILES);
    log.info(`run log: reading ${files.length} note(s)`);
    // A few at a time, so a large workspace does not flood the extension host.
    for (let i = 0; i < files.length; i += 16) await Promise.all(files.slice(i, i + 16).map(readOne));
    const watcher = vscode.workspace.createFileSystemWatcher(NOTE_GLOB);
    context.subscriptions.push(
      watcher,
      watcher.onDidCreate(schedule),
      watcher.onDidChange(schedule),
      watcher.onDidDelete((uri) => {
        spectra.forget(uri.toString());
        if (tree.log.remove(uri.toString())) tree.refresh();
      }),
      // Unsaved edits of an open notebook: its cells, as the notebook's JSON would hold them.
      vscode.workspace.onDidChangeNotebookDocument((e) => schedule(e.notebook.uri)),
      vscode.workspace.onDidChangeTextDocument(
        // A notebook's cells are followed through their notebook, above.
        (e) =>
          e.document.languageId === 'markdown' &&
          e.document.uri.scheme !== 'output' &&
          e.document.uri.scheme !== 'vscode-notebook-cell' &&
          schedule(e.document.uri),
      ),
    );
  };

  // The first scan starts when the view is first shown; a failure (e.g. of the file search) is logged.
  const startNow = (): void => background(log, 'run log: the first scan', start());
  if (view.visible) startNow();
  context.subscriptions.push(
    view,
    rereads,
    view.onDidChangeVisibility((e) => e.visible && startNow()),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('boltzmark.display') && tree.refresh()),
    vscode.commands.registerCommand('boltzmark.runLog.filter', async () => {
      const picks = await vscode.window.showQuickPick(
        STATUSES.map((s) => ({ label: s, picked: !tree.statuses || tree.statuses.includes(s) })),
        { canPickMany: true, title: 'Show runs with these statuses' },
      );
      if (!picks) return;
      tree.statuses = picks.length === STATUSES.length || picks.length === 0 ? null : picks.map((p) => p.label);
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
    vscode.commands.registerCommand(OPEN_CELL_RUN, openCellRun),
    // From a run's context menu: only the runs that take values from it; the same command on nothing shows all.
    vscode.commands.registerCommand('boltzmark.runLog.showUsers', (node?: Node) => {
      tree.usersOf = node?.kind === 'run' ? node.entry : null;
      view.description = tree.usersOf ? `using ${tree.usersOf.id ?? tree.usersOf.name}` : undefined;
      void vscode.commands.executeCommand('setContext', 'boltzmark.runLog.showingUsers', tree.usersOf !== null);
      tree.refresh();
    }),
    vscode.commands.registerCommand('boltzmark.runLog.showAll', () => {
      tree.usersOf = null;
      view.description = tree.statuses ? tree.statuses.join(', ') : undefined;
      void vscode.commands.executeCommand('setContext', 'boltzmark.runLog.showingUsers', false);
      tree.refresh();
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
      background(
        log,
        'run log: the export message',
        vscode.window.showInformationMessage(
          `Boltzmark: run log written to ${vscode.workspace.asRelativePath(target)}`,
        ),
      );
    }),
  );
  return {
    externals(uri) {
      if (!uri) return null;
      previewed.add(uri.toString());
      if (!started) {
        startNow();
        // Read now, so that a note with references finds them once the rest is read (a refresh follows).
        schedule(uri);
      }
      return tree.log.externalsFor(uri.toString());
    },
    onDidRead: read.event,
  };
}

/** An open notebook's cells as nbformat 4 JSON (all the run log reads of it: the Markdown cells, by index). */
function notebookJson(notebook: vscode.NotebookDocument): string {
  const cells = notebook.getCells().map((c) => ({
    cell_type: c.kind === vscode.NotebookCellKind.Markup ? 'markdown' : 'code',
    source: c.document.getText(),
  }));
  return JSON.stringify({ cells, nbformat: 4 });
}

/** Shows a notebook with a run's cell selected and the cursor on the run's fence. */
async function openCellRun(uri: string, cell: number, line: number): Promise<void> {
  const notebook = await vscode.workspace.openNotebookDocument(vscode.Uri.parse(uri));
  if (cell >= notebook.cellCount) return;
  await vscode.window.showNotebookDocument(notebook, { selections: [new vscode.NotebookRange(cell, cell + 1)] });
  await vscode.window.showTextDocument(notebook.cellAt(cell).document, {
    selection: new vscode.Range(line, 0, line, 0),
  });
}

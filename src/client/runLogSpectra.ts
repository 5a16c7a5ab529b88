/**
 * Spectrum files for the run log: the log analyses notes that are not open
 * (read from the workspace), so it reads their spectrum references itself,
 * through `vscode.workspace.fs`, with the same host-neutral `SpectrumFiles`
 * as the language server (loaded with the note reader). A spectrum file that
 * changes, appears or is deleted makes every note whose blocks read it be
 * read again (`reread`), so the log follows the files without a reload.
 */
import * as vscode from 'vscode';
import type { Externals } from '../core';
import type { SpectrumFileAccess, SpectrumFiles } from '../shared/spectrumFiles';
import { SPECTRUM_MAX_BYTES } from '../core/packageFree';
import { noteReader } from './loadNoteReader';

/** `vscode.workspace.fs` as the spectrum files' access: regular files only, never above 64 MB. */
const workspaceAccess: SpectrumFileAccess = {
  async stat(uri) {
    try {
      const st = await vscode.workspace.fs.stat(vscode.Uri.parse(uri, true));
      return st.type & vscode.FileType.File ? { size: st.size, mtime: st.mtime } : null;
    } catch {
      return null;
    }
  },
  async read(uri) {
    try {
      const u = vscode.Uri.parse(uri, true);
      const st = await vscode.workspace.fs.stat(u);
      if (!(st.type & vscode.FileType.File) || st.size > SPECTRUM_MAX_BYTES) return null;
      return new TextDecoder('utf-8').decode(await vscode.workspace.fs.readFile(u));
    } catch {
      return null;
    }
  },
};

/** The run log's spectrum files and the watcher that follows them. */
export class RunLogSpectra implements vscode.Disposable {
  private files: SpectrumFiles | null = null;
  /** Notes whose latest reading depended on a spectrum file, by URI, with the keys they read. */
  private readonly users = new Map<string, Set<string>>();
  private readonly subscriptions: vscode.Disposable[] = [];

  constructor(
    private readonly reread: (uri: vscode.Uri) => void,
    private readonly log: vscode.LogOutputChannel,
  ) {}

  /**
   * The externals for one reading of a note (creating the files and the watcher on first use); the files its
   * blocks look up are recorded, so that a change of one of them reads the note again.
   */
  externals(uri: string): Externals {
    const files = this.start();
    const read = new Set<string>();
    this.users.set(uri, read);
    const source = files.sourceFor(uri);
    return {
      note: uri,
      stamp: (key) => files.stamp(key),
      spectra: {
        lookup: (path) => {
          const answer = source.lookup(path);
          if (answer.key) read.add(answer.key);
          return answer;
        },
      },
    };
  }

  /** Forgets a deleted note. */
  forget(uri: string): void {
    this.users.delete(uri);
  }

  private start(): SpectrumFiles {
    if (this.files) return this.files;
    const reader = noteReader();
    this.files = new reader.SpectrumFiles({
      access: workspaceAccess,
      parse: reader.deferredParser,
      folders: () => (vscode.workspace.workspaceFolders ?? []).map((f) => f.uri.toString()),
      log: (m) => this.log.warn(m),
      onChange: (keys) => {
        for (const [uri, read] of this.users)
          if (keys.some((k) => read.has(k))) this.reread(vscode.Uri.parse(uri, true));
      },
    });
    const ends = reader.SPECTRUM_EXTENSIONS.map((e) => e.slice(1)).join(',');
    const watcher = vscode.workspace.createFileSystemWatcher(`**/*.{${ends}}`);
    const changed = (u: vscode.Uri): void => this.files?.changed(u.toString());
    this.subscriptions.push(
      watcher,
      watcher.onDidCreate(changed),
      watcher.onDidChange(changed),
      watcher.onDidDelete(changed),
    );
    return this.files;
  }

  dispose(): void {
    for (const s of this.subscriptions) s.dispose();
  }
}

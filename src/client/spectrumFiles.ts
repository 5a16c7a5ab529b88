/**
 * The client's file system for the server's spectrum references
 * (`boltzmark/fileStat`, `boltzmark/fileText`): the server asks where it
 * cannot read a file itself, in a workspace that is not on disk or when it
 * runs in the browser. Only regular files, never above 64 MB; the server
 * has already checked that the file lies inside the workspace.
 */
import * as vscode from 'vscode';
import type { BaseLanguageClient } from 'vscode-languageclient';
import { SPECTRUM_MAX_BYTES } from '../core/packageFree';
import { FileStatRequest, FileTextRequest } from '../shared/protocol';

function uriOf(text: string): vscode.Uri | null {
  try {
    return vscode.Uri.parse(text, true);
  } catch {
    return null;
  }
}

/** Answers the server's file requests through `vscode.workspace.fs`. */
export function serveSpectrumFiles(client: BaseLanguageClient): vscode.Disposable[] {
  return [
    client.onRequest(FileStatRequest, async ({ uri }) => {
      const u = uriOf(uri);
      if (!u) return null;
      try {
        const st = await vscode.workspace.fs.stat(u);
        return st.type & vscode.FileType.File ? { size: st.size, mtime: st.mtime } : null;
      } catch {
        return null;
      }
    }),
    client.onRequest(FileTextRequest, async ({ uri }) => {
      const u = uriOf(uri);
      if (!u) return null;
      try {
        const st = await vscode.workspace.fs.stat(u);
        if (!(st.type & vscode.FileType.File) || st.size > SPECTRUM_MAX_BYTES) return null;
        const bytes = await vscode.workspace.fs.readFile(u);
        return bytes.byteLength > SPECTRUM_MAX_BYTES ? null : new TextDecoder('utf-8').decode(bytes);
      } catch {
        return null;
      }
    }),
  ];
}

/**
 * How the language client talks to the server: which documents it sends
 * and where it logs. Settings are not synchronised statically (the
 * `synchronize.configurationSection` option is deprecated): the server asks
 * for them per note with `workspace/configuration` and registers itself for
 * `workspace/didChangeConfiguration`. `boltzmark.trace.server` is read by
 * the client library itself (it looks up `<id>.trace.server`).
 */
import type { LogOutputChannel } from 'vscode';
import type { LanguageClientOptions } from 'vscode-languageclient';

/** The client's id: names the `boltzmark.trace.server` setting and the server's log. */
export const CLIENT_ID = 'boltzmark';

/** Options of the language client. */
export function clientOptions(log: LogOutputChannel): LanguageClientOptions {
  return {
    // Markdown of every scheme: notes on disk, untitled and virtual ones, and the Markdown cells of notebooks
    // (`vscode-notebook-cell:` documents), which the server reads like notes of their own.
    documentSelector: [{ language: 'markdown' }],
    outputChannel: log,
  };
}

/**
 * How the language client talks to the server: which documents it sends
 * and where it logs. Settings are not synchronised statically (the
 * `synchronize.configurationSection` option is deprecated): the server asks
 * for them per note with `workspace/configuration` and registers itself for
 * `workspace/didChangeConfiguration`. `boltzmark.trace.server` is read by
 * the client library itself (it looks up `<id>.trace.server`).
 */
import type { LogOutputChannel } from 'vscode';
import type { LanguageClientOptions } from 'vscode-languageclient/node';

/** The client's id: names the `boltzmark.trace.server` setting and the server's log. */
export const CLIENT_ID = 'boltzmark';

/** Options of the language client. */
export function clientOptions(log: LogOutputChannel): LanguageClientOptions {
  return {
    // Every scheme: the server reads only the text it is sent, so virtual and untitled notes work too.
    documentSelector: [{ language: 'markdown' }],
    outputChannel: log,
  };
}

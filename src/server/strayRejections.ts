/**
 * The last guard of the server process: a promise rejection that nothing
 * handled (which Node turns into exit 1 by default) is logged to the client
 * and the server keeps serving. Every known promise is awaited or caught; this
 * only keeps a future slip (ours or a library's) from taking the editor's
 * language features down with it.
 */
import type { Connection } from 'vscode-languageserver';

/** Installs the process-wide `unhandledRejection` handler that logs through the connection (stderr if that fails). */
export function logStrayRejections(connection: Connection): void {
  process.on('unhandledRejection', (reason: unknown) => {
    const what = reason instanceof Error ? (reason.stack ?? reason.message) : String(reason);
    const message = `boltzmark: a promise rejection nothing handled (logged; the server keeps running): ${what}`;
    try {
      connection.console.error(message);
    } catch {
      process.stderr.write(`${message}\n`);
    }
  });
}

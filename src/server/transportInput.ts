/**
 * Where the Node server hears bytes from the client as they arrive, before
 * the protocol's reader takes them as a message: the slices that read a
 * large note stand aside at once (notes.ts), not only once a request is
 * parsed and queued behind the next slice.
 */
import type { EventEmitter } from 'node:events';

/** The transports a client may start the server on, as `vscode-languageserver` reads them from the command line. */
export type Transport = 'stdio' | 'ipc' | 'other';

/**
 * Calls `heard` on every chunk of the standard input (`--stdio`) or every message of the parent process
 * (`--node-ipc`), ahead of the listeners already there; a socket or a pipe is left alone. Returns the transport
 * watched.
 */
export function watchInput(
  argv: readonly string[],
  sources: { readonly stdin: EventEmitter; readonly parent: EventEmitter },
  heard: () => void,
): Transport {
  if (argv.includes('--stdio')) {
    sources.stdin.prependListener('data', () => heard());
    return 'stdio';
  }
  if (argv.includes('--node-ipc')) {
    sources.parent.prependListener('message', () => heard());
    return 'ipc';
  }
  return 'other';
}

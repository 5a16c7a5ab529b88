/**
 * Promises nobody waits for (a message box, a post to the curve view, a
 * scan started by a view becoming visible) go through `background`, which
 * logs a failure instead of leaving the rejection unhandled.
 */

/** Where failures go: the extension's log channel, or anything with `error`. */
export interface ErrorLog {
  error(message: string): void;
}

/** Lets `work` run on its own; a rejection is logged as `<what>: <reason>`. */
export function background(log: ErrorLog, what: string, work: PromiseLike<unknown>): void {
  Promise.resolve(work).catch((err: unknown) =>
    log.error(`${what}: ${err instanceof Error ? err.message : String(err)}`),
  );
}

/**
 * The one debouncer of the extension and the server: pushed diagnostics wait
 * for a pause in typing, the run log re-reads a note after a burst of file
 * events, and the curve view follows the cursor once it rests. Timers only
 * (no Node or editor API), so it runs in every host.
 */

/** Runs `fn` once, `delayMs` after the last of a burst of calls for the same key. */
export class Debouncer {
  private readonly timers = new Map<string, ReturnType<typeof setTimeout>>();

  constructor(private readonly delayMs: number) {}

  /** Schedules (or re-schedules) the call for `key`. */
  schedule(key: string, fn: () => void): void {
    this.cancel(key);
    this.timers.set(
      key,
      setTimeout(() => {
        this.timers.delete(key);
        fn();
      }, this.delayMs),
    );
  }

  /** Drops a pending call. */
  cancel(key: string): void {
    const t = this.timers.get(key);
    if (t) clearTimeout(t);
    this.timers.delete(key);
  }

  /** Drops every pending call (when the owner is disposed). */
  dispose(): void {
    for (const t of this.timers.values()) clearTimeout(t);
    this.timers.clear();
  }
}

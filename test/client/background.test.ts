import { strict as assert } from 'node:assert';
import { background } from '../../src/client/background';

// Promises the extension does not wait for: a failure is logged, never left
// as an unhandled rejection (which VS Code reports against the extension).
describe('background work in the extension', () => {
  it('logs a rejection with what failed, and leaves none unhandled', async () => {
    const unhandled: unknown[] = [];
    const listener = (reason: unknown): void => void unhandled.push(reason);
    process.on('unhandledRejection', listener);
    try {
      const logged: string[] = [];
      const log = { error: (m: string) => void logged.push(m) };
      background(log, 'run log: the first scan', Promise.reject(new Error('no file search here')));
      // A thenable that is not a Promise, as VS Code's API returns.
      const thenable = { then: (_: unknown, reject: (e: unknown) => void) => reject('closed') };
      background(log, 'a message box', thenable as unknown as PromiseLike<unknown>);
      background(log, 'fine', Promise.resolve(1));
      // Unhandled rejections are reported after the microtasks of a macrotask; wait two of them.
      for (let i = 0; i < 2; i++) await new Promise((r) => setImmediate(r));
      assert.deepEqual(logged, ['run log: the first scan: no file search here', 'a message box: closed']);
      assert.deepEqual(unhandled, []);
    } finally {
      process.off('unhandledRejection', listener);
    }
  });
});

import assert from 'node:assert/strict';
import { Debouncer } from '../../src/shared/debouncer';

const settle = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

describe('the debouncer', () => {
  it('runs a burst of calls for one key once, with the last function given', async () => {
    const d = new Debouncer(5);
    const calls: number[] = [];
    for (let i = 0; i < 10; i++) d.schedule('note', () => calls.push(i));
    await settle(40);
    assert.deepEqual(calls, [9]);
  });

  it('keeps keys apart, and forgets a cancelled or disposed call', async () => {
    const d = new Debouncer(5);
    const calls: string[] = [];
    d.schedule('a', () => calls.push('a'));
    d.schedule('b', () => calls.push('b'));
    d.schedule('c', () => calls.push('c'));
    d.cancel('b');
    await settle(40);
    d.schedule('d', () => calls.push('d'));
    d.dispose();
    await settle(40);
    assert.deepEqual(calls.sort(), ['a', 'c']);
  });
});

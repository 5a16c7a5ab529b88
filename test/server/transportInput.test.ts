import { strict as assert } from 'node:assert';
import { EventEmitter } from 'node:events';
import { watchInput } from '../../src/server/transportInput';

// The Node server hears the client's bytes as they arrive, ahead of the protocol reader, on the transport the
// command line names (`vscode-languageserver` reads the same flags): the chunks of the standard input for
// `--stdio`, the parent's messages for `--node-ipc`, nothing for a socket or a pipe.

function sources(): { stdin: EventEmitter; parent: EventEmitter; order: string[] } {
  const order: string[] = [];
  const stdin = new EventEmitter();
  const parent = new EventEmitter();
  // The protocol reader's listeners, already there: the server's must run before them.
  stdin.on('data', () => order.push('reader'));
  parent.on('message', () => order.push('reader'));
  return { stdin, parent, order };
}

describe('watchInput: the client bytes heard as they arrive', () => {
  it('hears every chunk of the standard input before the reader with --stdio, and no parent message', () => {
    const s = sources();
    assert.equal(
      watchInput(['node', 'server.js', '--stdio'], s, () => s.order.push('heard')),
      'stdio',
    );
    s.stdin.emit('data', Buffer.from('Content-Length: 2\r\n\r\n'));
    s.stdin.emit('data', Buffer.from('{}'));
    s.parent.emit('message', {});
    assert.deepEqual(s.order, ['heard', 'reader', 'heard', 'reader', 'reader']);
  });

  it('hears every message of the parent process before the reader with --node-ipc, and no input chunk', () => {
    const s = sources();
    assert.equal(
      watchInput(['node', 'server.js', '--node-ipc', '--clientProcessId=7'], s, () => s.order.push('heard')),
      'ipc',
    );
    s.parent.emit('message', { jsonrpc: '2.0' });
    s.stdin.emit('data', Buffer.from('x'));
    assert.deepEqual(s.order, ['heard', 'reader', 'reader']);
  });

  it('leaves a socket transport alone', () => {
    const s = sources();
    assert.equal(
      watchInput(['node', 'server.js', '--socket=5007'], s, () => s.order.push('heard')),
      'other',
    );
    s.stdin.emit('data', Buffer.from('x'));
    s.parent.emit('message', {});
    assert.deepEqual(s.order, ['reader', 'reader']);
    assert.equal(s.stdin.listenerCount('data'), 1);
  });
});

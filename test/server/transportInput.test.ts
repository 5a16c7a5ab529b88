import { strict as assert } from 'node:assert';
import { EventEmitter } from 'node:events';
import { watchInput } from '../../src/server/transportInput';

// The Node server hears the client's bytes as they arrive, ahead of the protocol reader, on the transport the
// command line names (`vscode-languageserver` reads the same flags): the chunks of the standard input for
// `--stdio`, the parent's messages for `--node-ipc`, nothing for a socket or a pipe.

/**
 * The input sources of a server started with `flags`, watched: each listener records its turn, the protocol
 * reader's (already there, as the server's must run before it) and the server's.
 */
function watched(flags: readonly string[]): {
  transport: string;
  stdin: EventEmitter;
  parent: EventEmitter;
  order: string[];
} {
  const order: string[] = [];
  const stdin = new EventEmitter();
  const parent = new EventEmitter();
  stdin.on('data', () => order.push('reader'));
  parent.on('message', () => order.push('reader'));
  const transport = watchInput(['node', 'server.js', ...flags], { stdin, parent }, () => order.push('heard'));
  return { transport, stdin, parent, order };
}

describe('watchInput: the client bytes heard as they arrive', () => {
  it('hears every chunk of the standard input before the reader with --stdio, and no parent message', () => {
    const s = watched(['--stdio']);
    assert.equal(s.transport, 'stdio');
    s.stdin.emit('data', Buffer.from('Content-Length: 2\r\n\r\n'));
    s.stdin.emit('data', Buffer.from('{}'));
    s.parent.emit('message', {});
    assert.deepEqual(s.order, ['heard', 'reader', 'heard', 'reader', 'reader']);
  });

  it('hears every message of the parent process before the reader with --node-ipc, and no input chunk', () => {
    const s = watched(['--node-ipc', '--clientProcessId=7']);
    assert.equal(s.transport, 'ipc');
    s.parent.emit('message', { jsonrpc: '2.0' });
    s.stdin.emit('data', Buffer.from('x'));
    assert.deepEqual(s.order, ['heard', 'reader', 'reader']);
  });

  it('leaves a socket transport alone', () => {
    const s = watched(['--socket=5007']);
    assert.equal(s.transport, 'other');
    s.stdin.emit('data', Buffer.from('x'));
    s.parent.emit('message', {});
    assert.deepEqual(s.order, ['reader', 'reader']);
    assert.equal(s.stdin.listenerCount('data'), 1);
  });
});

import { strict as assert } from 'node:assert';
import { spawn, type ChildProcess } from 'node:child_process';
import { LAB_NOTE_LINES, LAB_NOTE_URI } from './labNote';

// The built server (dist/server.js --stdio) spoken to by a client of its own here: a few lines that frame JSON-RPC
// messages with their Content-Length header and nothing else, so that it can send what a library-made client never
// would (a request before initialize, parameters of the wrong shape, a request after shutdown). What must come
// back is LSP 3.17's: ServerNotInitialized (-32002) before initialize, InvalidParams (-32602) for parameters not
// of the protocol's shape, InvalidRequest (-32600) after shutdown, exit status 0 after shutdown and exit and 1
// after exit alone ("Lifecycle Messages").

interface Reply {
  readonly id?: number;
  readonly method?: string;
  readonly params?: unknown;
  readonly result?: unknown;
  readonly error?: { readonly code: number; readonly message: string };
}

/** A server and a bare client: `request` resolves with the reply of that id, `notify` sends and forgets. */
function bareClient() {
  const proc: ChildProcess = spawn(process.execPath, ['dist/server.js', '--stdio'], {
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  const seen: Reply[] = [];
  const waiting = new Map<number, (r: Reply) => void>();
  let buffer = Buffer.alloc(0);
  proc.stdout!.on('data', (chunk: Buffer) => {
    buffer = Buffer.concat([buffer, chunk]);
    for (;;) {
      const head = buffer.indexOf('\r\n\r\n');
      if (head < 0) return;
      const length = Number(/Content-Length: (\d+)/i.exec(buffer.subarray(0, head).toString('ascii'))?.[1]);
      if (buffer.length < head + 4 + length) return;
      const message = JSON.parse(buffer.subarray(head + 4, head + 4 + length).toString('utf8')) as Reply;
      buffer = buffer.subarray(head + 4 + length);
      seen.push(message);
      // A request of the server's (configuration, registration) is answered as a client without them would.
      if (message.method && message.id !== undefined)
        write({ jsonrpc: '2.0', id: message.id, error: { code: -32601, message: 'not here' } });
      else if (message.id !== undefined) waiting.get(message.id)?.(message);
    }
  });
  const exited = new Promise<number | null>((resolve) => proc.once('exit', (code) => resolve(code)));
  const write = (m: object): void => {
    const body = Buffer.from(JSON.stringify(m), 'utf8');
    proc.stdin!.write(Buffer.concat([Buffer.from(`Content-Length: ${body.length}\r\n\r\n`, 'ascii'), body]));
  };
  let next = 0;
  const request = (method: string, params?: unknown): Promise<Reply> => {
    const id = ++next;
    const reply = new Promise<Reply>((resolve) => waiting.set(id, resolve));
    write({ jsonrpc: '2.0', id, method, ...(params === undefined ? {} : { params }) });
    return Promise.race([
      reply,
      exited.then((code) => assert.fail(`the server exited (${code}) before answering ${method}`)),
    ]);
  };
  const notify = (method: string, params?: unknown): void =>
    write({ jsonrpc: '2.0', method, ...(params === undefined ? {} : { params }) });
  return { proc, seen, request, notify, exited };
}

const NOTE = LAB_NOTE_LINES.join('\n');
const OPEN = { textDocument: { uri: LAB_NOTE_URI, languageId: 'markdown', version: 1, text: NOTE } };
/** On `field: 7.05 T` of the first block: T = 5.61 ± 0.19 mK, as in test/protocol/server.test.ts. */
const HOVER = { textDocument: { uri: LAB_NOTE_URI }, position: { line: 5, character: 3 } };
const INIT = { processId: process.pid, rootUri: null, capabilities: {} };

function hoverText(r: Reply): string {
  return (r.result as { contents?: { value?: string } } | null)?.contents?.value ?? '';
}

/** Runs `f` with a bare client, initialized first unless `initialize` is false; the server is killed after. */
async function withClient(initialize: boolean, f: (c: ReturnType<typeof bareClient>) => Promise<void>): Promise<void> {
  const c = bareClient();
  try {
    if (initialize) {
      await c.request('initialize', INIT);
      c.notify('initialized', {});
    }
    await f(c);
  } finally {
    c.proc.kill();
  }
}

describe('the server’s lifecycle and parameters, to a bare client', function () {
  this.timeout(30_000);

  it('refuses requests before initialize with -32002 and drops notifications; serves once initialized', () =>
    withClient(false, async (c) => {
      const early = await c.request('textDocument/hover', HOVER);
      assert.equal(early.error?.code, -32002);
      assert.equal(early.result, undefined);
      // Dropped: the note is not open once the server is initialized.
      c.notify('textDocument/didOpen', OPEN);
      const init = await c.request('initialize', INIT);
      assert.ok((init.result as { capabilities?: { hoverProvider?: boolean } }).capabilities?.hoverProvider);
      c.notify('initialized', {});
      assert.equal((await c.request('textDocument/hover', HOVER)).result, null);
      c.notify('textDocument/didOpen', OPEN);
      assert.match(hoverText(await c.request('textDocument/hover', HOVER)), /5\.61 ± 0\.19 mK/);
      const again = await c.request('initialize', INIT);
      assert.equal(again.error?.code, -32600);
      c.notify('exit');
      // Exit without shutdown: status 1.
      assert.equal(await c.exited, 1);
    }));

  it('answers parameters of the wrong shape with -32602 naming the field, and drops such notifications', () =>
    withClient(true, async (c) => {
      c.notify('textDocument/didOpen', OPEN);
      const wrong: [string, unknown, RegExp][] = [
        ['textDocument/hover', null, /the parameters must be an object/],
        [
          'textDocument/hover',
          { textDocument: { uri: LAB_NOTE_URI }, position: { line: -1, character: 0 } },
          /position\.line/,
        ],
        [
          'textDocument/completion',
          { textDocument: { uri: 7 }, position: { line: 4, character: 8 } },
          /textDocument\.uri/,
        ],
        ['textDocument/references', HOVER, /context/],
        ['textDocument/inlayHint', { textDocument: { uri: LAB_NOTE_URI } }, /range/],
        ['textDocument/codeAction', { textDocument: { uri: LAB_NOTE_URI }, range: null, context: {} }, /range/],
        ['textDocument/diagnostic', {}, /textDocument/],
        ['workspace/symbol', { query: 3 }, /query/],
        ['boltzmark/curveData', { uri: LAB_NOTE_URI, line: 'two' }, /line/],
      ];
      for (const [method, params, field] of wrong) {
        const r = await c.request(method, params);
        assert.equal(r.error?.code, -32602, `${method} ${JSON.stringify(params)}: ${JSON.stringify(r)}`);
        assert.match(r.error.message, field);
      }
      // A change with a range outside every line is dropped: the note is as it was, and the log says why.
      c.notify('textDocument/didChange', {
        textDocument: { uri: LAB_NOTE_URI, version: 2 },
        contentChanges: [{ range: { start: { line: 99, character: 0 }, end: { line: -3, character: 5 } }, text: 'yy' }],
      });
      c.notify('textDocument/didOpen', {
        textDocument: { uri: 'file:///notes/b.md', languageId: 'markdown', version: 1, text: 42 },
      });
      assert.match(hoverText(await c.request('textDocument/hover', HOVER)), /5\.61 ± 0\.19 mK/);
      const logs = c.seen
        .filter((m) => m.method === 'window/logMessage')
        .map((m) => (m.params as { message: string }).message);
      assert.ok(
        logs.some((l) => /textDocument\/didChange dropped: contentChanges\[0\]\.range\.end\.line/.test(l)),
        logs.join('\n'),
      );
      assert.ok(
        logs.some((l) => /textDocument\/didOpen dropped: textDocument\.text must be a string/.test(l)),
        logs.join('\n'),
      );
      // Nothing failed inside a feature: no stack trace went to the log.
      assert.ok(!logs.some((l) => /TypeError|at .*\.js:\d+/.test(l)), logs.join('\n'));
    }));

  it('refuses requests after shutdown with -32600 and exits with status 0 on exit', () =>
    withClient(true, async (c) => {
      assert.equal((await c.request('shutdown')).result, null);
      const late = await c.request('textDocument/hover', HOVER);
      assert.equal(late.error?.code, -32600);
      c.notify('exit');
      assert.equal(await c.exited, 0);
    }));
});

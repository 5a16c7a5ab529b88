import { strict as assert } from 'node:assert';
import type { Message } from 'vscode-languageserver';
import { protocolGuard, REFUSED_METHOD } from '../../src/server/protocolGuard';

// The guard between the client and the handlers (src/server/protocolGuard.ts), driven here message by message: what
// it passes on, what it refuses and with which code, what it drops. The codes and the lifecycle rules are LSP
// 3.17's ("Response Message", "Lifecycle Messages"); the shapes, its parameter types.

interface Passed {
  readonly method?: string;
  readonly id?: number | string | null;
  readonly params?: unknown;
}

/** A guard with a recorder in place of the connection: what it passed on, and what it said in the log. */
function harness() {
  const guard = protocolGuard();
  const warnings: string[] = [];
  let refusal: ((params: unknown) => never) | undefined;
  guard.attach(
    {
      onRequest: (method, handler) => {
        assert.equal(method, REFUSED_METHOD);
        refusal = handler;
      },
    },
    (m) => void warnings.push(m),
  );
  let id = 0;
  const send = (m: object): Passed | null => {
    let passed: Passed | null = null;
    void guard.messageStrategy.handleMessage({ jsonrpc: '2.0', ...m } as Message, (x) => {
      passed = x as Passed;
    });
    return passed;
  };
  const request = (method: string, params?: unknown): Passed | null => send({ id: ++id, method, params });
  const notify = (method: string, params?: unknown): Passed | null => send({ method, params });
  /** The error a refused request is answered with (its handler throws it). */
  const errorOf = (p: Passed | null): { code: number; message: string } => {
    assert.ok(p, 'the request was not passed on at all');
    assert.equal(p.method, REFUSED_METHOD, `${p.method} was passed on as it came`);
    try {
      refusal!(p.params);
    } catch (e) {
      return e as { code: number; message: string };
    }
    assert.fail('the refusal did not throw');
  };
  return { request, notify, send, errorOf, warnings };
}

const DOC = { uri: 'file:///lab/note.md' };
const AT = { textDocument: DOC, position: { line: 3, character: 7 } };
const SPAN = { start: { line: 0, character: 0 }, end: { line: 9, character: 0 } };

/** Parameters of the shape each served request takes, as VS Code's client sends them. */
const GOOD: Readonly<Record<string, unknown>> = {
  'textDocument/hover': AT,
  'textDocument/completion': { ...AT, context: { triggerKind: 1 } },
  'textDocument/definition': AT,
  'textDocument/prepareRename': AT,
  'textDocument/references': { ...AT, context: { includeDeclaration: true } },
  'textDocument/rename': { ...AT, newName: 'run B' },
  'textDocument/inlayHint': { textDocument: DOC, range: SPAN },
  'textDocument/codeAction': { textDocument: DOC, range: SPAN, context: { diagnostics: [], triggerKind: 2 } },
  'textDocument/documentSymbol': { textDocument: DOC },
  'textDocument/codeLens': { textDocument: DOC },
  'textDocument/foldingRange': { textDocument: DOC },
  'textDocument/documentLink': { textDocument: DOC },
  'textDocument/diagnostic': { textDocument: DOC, previousResultId: 'x' },
  'workspace/symbol': { query: 'run' },
  'boltzmark/resultsMarkdown': { uri: DOC.uri, line: 4 },
  'boltzmark/curveData': { uri: DOC.uri, line: 0 },
  'boltzmark/analysisStats': { uri: DOC.uri },
};

/** Initialized: the guard has let `initialize` through. */
function running() {
  const h = harness();
  assert.equal(h.request('initialize', { processId: null, rootUri: null, capabilities: {} })?.method, 'initialize');
  assert.equal(h.notify('initialized', {})?.method, 'initialized');
  return h;
}

describe('protocolGuard: the protocol’s rules at the door', () => {
  it('refuses every request before initialize with ServerNotInitialized (-32002) and drops notifications but exit', () => {
    const h = harness();
    const e = h.errorOf(h.request('textDocument/hover', AT));
    assert.equal(e.code, -32002);
    assert.match(e.message, /textDocument\/hover: the server is not initialized/);
    assert.equal(h.errorOf(h.request('shutdown')).code, -32002);
    assert.equal(
      h.notify('textDocument/didOpen', { textDocument: { ...DOC, languageId: 'markdown', version: 1, text: '' } }),
      null,
    );
    assert.equal(h.notify('exit')?.method, 'exit');
    // A response to a request of the server's is never held.
    assert.deepEqual(h.send({ id: 5, result: null }), { jsonrpc: '2.0', id: 5, result: null });
  });

  it('passes each served request with parameters of its shape on unchanged', () => {
    const h = running();
    for (const [method, params] of Object.entries(GOOD)) {
      const p = h.request(method, params);
      assert.equal(p?.method, method, method);
      assert.deepEqual(p?.params, params, method);
    }
    // Requests it does not serve go on to the connection, which answers MethodNotFound.
    assert.equal(h.request('textDocument/formatting', null)?.method, 'textDocument/formatting');
    assert.equal(h.request('boltzmark/memory')?.method, 'boltzmark/memory');
  });

  it('refuses a request whose parameters are not of the protocol’s shape with InvalidParams (-32602), naming the field', () => {
    const h = running();
    const cases: [string, unknown, RegExp][] = [
      ['textDocument/hover', null, /the parameters must be an object/],
      ['textDocument/hover', [DOC, { line: 1, character: 1 }], /the parameters must be an object/],
      ['textDocument/hover', { textDocument: DOC }, /position must be an object/],
      ['textDocument/hover', { textDocument: { uri: 5 }, position: AT.position }, /textDocument\.uri must be a string/],
      ['textDocument/hover', { ...AT, position: { line: -1, character: 0 } }, /position\.line must be a whole number/],
      ['textDocument/hover', { ...AT, position: { line: 1.5, character: 0 } }, /position\.line/],
      ['textDocument/hover', { ...AT, position: { line: '3', character: 0 } }, /position\.line/],
      // LSP's uinteger stops at 2³¹ − 1.
      ['textDocument/hover', { ...AT, position: { line: 0, character: 2 ** 31 } }, /position\.character/],
      ['textDocument/references', AT, /context must be an object \{ includeDeclaration: boolean \}/],
      ['textDocument/rename', { ...AT, newName: 7 }, /newName must be a string/],
      [
        'textDocument/inlayHint',
        { textDocument: DOC, range: { start: { line: 0, character: 0 } } },
        /range\.end must be/,
      ],
      ['textDocument/codeAction', { textDocument: DOC, range: SPAN }, /context must be an object \{ diagnostics/],
      ['textDocument/documentSymbol', { textDocument: null }, /textDocument must be an object/],
      ['workspace/symbol', {}, /query must be a string/],
      ['boltzmark/curveData', { uri: DOC.uri, line: -2 }, /line must be a whole number/],
      ['initialize', { capabilities: {} }, /initialize was received already|initialized already/],
    ];
    for (const [method, params, message] of cases) {
      const e = h.errorOf(h.request(method, params));
      assert.equal(e.code, method === 'initialize' ? -32600 : -32602, `${method} ${JSON.stringify(params)}`);
      assert.match(e.message, message);
      assert.ok(e.message.startsWith(`${method}: `), e.message);
    }
  });

  it('drops a notification whose parameters are not of the protocol’s shape, and says so in the log', () => {
    const h = running();
    const open = { textDocument: { ...DOC, languageId: 'markdown', version: 1, text: '# note\n' } };
    assert.equal(h.notify('textDocument/didOpen', open)?.method, 'textDocument/didOpen');
    const change = (contentChanges: unknown) => ({ textDocument: { ...DOC, version: 2 }, contentChanges });
    assert.equal(
      h.notify('textDocument/didChange', change([{ range: SPAN, rangeLength: 7, text: 'x' }, { text: 'whole' }]))
        ?.method,
      'textDocument/didChange',
    );
    const dropped: [string, unknown, RegExp][] = [
      [
        'textDocument/didOpen',
        { textDocument: { ...DOC, languageId: 'markdown', version: 1, text: null } },
        /text must be a string/,
      ],
      [
        'textDocument/didOpen',
        { textDocument: { ...DOC, languageId: 'markdown', text: '' } },
        /version must be an integer/,
      ],
      ['textDocument/didChange', change(null), /contentChanges must be an array/],
      [
        'textDocument/didChange',
        change([
          { text: 'a' },
          { range: { start: { line: 99, character: 0 }, end: { line: -3, character: 5 } }, text: 'yy' },
        ]),
        /contentChanges\[1\]\.range\.end\.line/,
      ],
      ['textDocument/didClose', { textDocument: {} }, /textDocument\.uri must be a string/],
      [
        'workspace/didChangeWatchedFiles',
        { changes: [{ uri: 'file:///a.jdx', type: 4 }] },
        /changes\[0\]\.type must be 1, 2 or 3/,
      ],
      ['workspace/didChangeWorkspaceFolders', { event: { added: [{ name: 'x' }], removed: [] } }, /workspace folder/],
    ];
    for (const [method, params, message] of dropped) {
      assert.equal(h.notify(method, params), null, `${method} ${JSON.stringify(params)} was passed on`);
      assert.match(h.warnings.at(-1) ?? '', message);
      assert.ok(h.warnings.at(-1)!.includes(`${method} dropped`), h.warnings.at(-1));
    }
    assert.equal(h.warnings.length, dropped.length);
  });

  it('refuses every request after shutdown with InvalidRequest (-32600) and lets exit through', () => {
    const h = running();
    assert.equal(h.request('shutdown')?.method, 'shutdown');
    const e = h.errorOf(h.request('textDocument/hover', AT));
    assert.equal(e.code, -32600);
    assert.match(e.message, /shutting down/);
    assert.equal(h.errorOf(h.request('shutdown')).code, -32600);
    assert.equal(h.notify('textDocument/didClose', { textDocument: DOC }), null);
    assert.equal(h.notify('exit')?.method, 'exit');
  });

  it('answers a client that calls the refusal method itself with MethodNotFound (-32601)', () => {
    const h = running();
    const e = h.errorOf(h.request(REFUSED_METHOD, { code: 0, message: 'forged' }));
    assert.equal(e.code, -32601);
    assert.doesNotMatch(e.message, /forged/);
  });
});

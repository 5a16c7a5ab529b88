import { strict as assert } from 'node:assert';
import { CancellationTokenSource, ResponseError } from 'vscode-jsonrpc/node';
import { generateNote } from '../../bench/note';
import { startLsp, type LspSession } from './lspClient';

// A request the client cancels fails with RequestCancelled (-32800), as LSP 3.17 advises under
// "Cancellation Support", instead of an empty answer a client could take for the note's; a request that is
// not cancelled still gets the note's answer.
const URI = 'file:///notes/cancel.md';
const NOTE = generateNote({ blocks: 3000 });
const REQUEST_CANCELLED = -32800;

describe('cancelled requests over stdio', function () {
  this.timeout(60000);
  let s: LspSession;

  before(async () => {
    s = await startLsp({ pull: true });
  });
  after(async () => s.close());

  it('answers a cancelled request with RequestCancelled, and the next one with the note', async () => {
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: URI, languageId: 'markdown', version: 1, text: NOTE },
    });
    // The note is still being read when the requests arrive: each waits for its part, and the cancellation comes in
    // while it waits.
    const outcomes = await Promise.all(
      ['textDocument/diagnostic', 'textDocument/documentSymbol', 'textDocument/foldingRange'].map(async (method) => {
        const source = new CancellationTokenSource();
        const sent = s.conn.sendRequest(method, { textDocument: { uri: URI } }, source.token);
        source.cancel();
        return sent.then(
          (result) => ({ method, result, error: null }),
          (error: unknown) => ({ method, result: null, error }),
        );
      }),
    );
    for (const o of outcomes) {
      assert.ok(o.error instanceof ResponseError, `${o.method} answered ${JSON.stringify(o.result)?.slice(0, 80)}`);
      assert.equal(o.error.code, REQUEST_CANCELLED, o.method);
    }
    const symbols = (await s.conn.sendRequest('textDocument/documentSymbol', {
      textDocument: { uri: URI },
    })) as unknown[];
    assert.ok(symbols.length > 0, 'the same request, not cancelled, gets the outline');
    assert.doesNotMatch(s.stderr(), /Error/);
  });
});

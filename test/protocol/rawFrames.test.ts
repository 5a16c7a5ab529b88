import { strict as assert } from 'node:assert';
import { LAB_NOTE_LINES, LAB_NOTE_URI } from './labNote';
import { rawClient, type RawClient, type RawMessage } from './rawClient';

// The built server as editors other than VS Code meet it (Neovim, Helix, Emacs eglot, Sublime, Zed): a client that
// declares no optional capability, frames its messages itself and sends what LSP 3.17 allows or what a hurried
// client does. Every test also checks that the server's standard output held LSP frames and nothing else.

const NOTE = LAB_NOTE_LINES.join('\n');
const OPEN = { textDocument: { uri: LAB_NOTE_URI, languageId: 'markdown', version: 1, text: NOTE } };
/** On `field: 7.05 T` of the first block: T = 5.61 ± 0.19 mK, as in test/protocol/server.test.ts. */
const HOVER = { textDocument: { uri: LAB_NOTE_URI }, position: { line: 5, character: 3 } };

interface Item {
  readonly label: string;
  readonly textEdit?: { readonly range: { start: Pos; end: Pos }; readonly newText: string };
}
interface Pos {
  readonly line: number;
  readonly character: number;
}

const items = (r: RawMessage): Item[] => {
  const result = r.result as Item[] | { items: Item[] } | null;
  return Array.isArray(result) ? result : (result?.items ?? []);
};

const hoverText = (r: RawMessage): string =>
  (r.result as { contents?: { value?: string } } | null)?.contents?.value ?? '';

/** Asserts a position lies in the note: an existing line, at most at its end (UTF-16 code units). */
function inNote(p: Pos, what: string): void {
  assert.ok(p.line < LAB_NOTE_LINES.length, `${what}: line ${p.line} is past the note's last line`);
  const length = LAB_NOTE_LINES[p.line]!.length;
  assert.ok(p.character <= length, `${what}: character ${p.character} is past the end of line ${p.line} (${length})`);
}

describe('the server to a client that frames its own messages (other editors)', function () {
  this.timeout(30_000);
  let c: RawClient;
  beforeEach(async () => {
    c = rawClient();
    await c.initialize({});
    c.notify('textDocument/didOpen', OPEN);
  });
  afterEach(async function () {
    if (this.currentTest?.state === 'passed') {
      await c.close();
      assert.deepEqual(c.notFrames, [], 'the standard output held something that is not an LSP frame');
    } else c.proc.kill();
  });

  it('reads a position past the end of its line, or of the note, as that end: no edit outside the note', async () => {
    // LSP 3.17 "Position": a character past the line's length defaults back to the line's length. Line 1 is
    // blank (new-block templates there), line 4 is `system: 13C` (isotopes), line 99 is past the note.
    const cases: [Pos, Pos][] = [
      [
        { line: 1, character: 7 },
        { line: 1, character: 0 },
      ],
      [
        { line: 4, character: 40 },
        { line: 4, character: LAB_NOTE_LINES[4]!.length },
      ],
      [
        { line: 99, character: 3 },
        { line: LAB_NOTE_LINES.length - 1, character: LAB_NOTE_LINES.at(-1)!.length },
      ],
    ];
    for (const [past, end] of cases) {
      const at = items(await c.request('textDocument/completion', { ...HOVER, position: past }));
      const atEnd = items(await c.request('textDocument/completion', { ...HOVER, position: end }));
      assert.ok(atEnd.length > 0, `completions at ${JSON.stringify(end)}`);
      assert.deepEqual(at, atEnd, `${JSON.stringify(past)} is answered as ${JSON.stringify(end)}`);
      for (const item of at) {
        assert.ok(item.textEdit, item.label);
        inNote(item.textEdit.range.start, item.label);
        inNote(item.textEdit.range.end, item.label);
      }
    }
  });

  it('reads a change sent with the version the note already had, or an older one, as the text it makes', async () => {
    const codes = async (): Promise<string[]> =>
      (
        (await c.request('textDocument/diagnostic', { textDocument: { uri: LAB_NOTE_URI } })).result as {
          items: { code: string }[];
        }
      ).items.map((d) => d.code);
    // Line 13 is `field: 9.4 MT`: a wrong-case unit, and no lattice temperature in that block.
    assert.ok((await codes()).includes('unit-case'));
    // LSP 3.17 asks versions to increase; a client that repeats one (or goes back) has still changed the text.
    c.notify('textDocument/didChange', {
      textDocument: { uri: LAB_NOTE_URI, version: 1 },
      contentChanges: [{ range: { start: { line: 13, character: 11 }, end: { line: 13, character: 13 } }, text: 'mT' }],
    });
    assert.ok(!(await codes()).includes('unit-case'), 'the fixed unit, same version');
    c.notify('textDocument/didChange', {
      textDocument: { uri: LAB_NOTE_URI, version: 0 },
      contentChanges: [
        { range: { start: { line: 12, character: 0 }, end: { line: 12, character: 0 } }, text: 'sistem: 1H\n' },
      ],
    });
    assert.ok((await codes()).includes('key-unknown'), 'the misspelt key, older version');
    // Opened again (no close between) with the same version: the text it was opened with.
    c.notify('textDocument/didOpen', OPEN);
    const again = await codes();
    assert.ok(again.includes('unit-case') && !again.includes('key-unknown'), again.join(', '));
  });

  it('skips bytes that are no LSP frame, says so in the log, and answers the next message', async () => {
    // Each is sent with the next request in one write, as a pipe may deliver them.
    const garbage = [
      'Content-Length: abc\r\n\r\n{}', // a length that is no number
      'Content-Length: -5\r\n\r\n{}', // a negative length
      'Content-Length: 2\n\n{}', // header lines ended by \n alone
      'a line without a colon\r\n\r\n', // a header line that is no field
      'Content-Type: application/vscode-jsonrpc\r\n\r\n{}', // no length at all
      `X-Padding: ${'x'.repeat(10_000)}\r\n`, // a header longer than any real one
      'Content-Length: 99999999999999\r\n\r\n', // more than a message can be: never read to its end
    ];
    for (const g of garbage) {
      const r = await c.request('workspace/symbol', { query: 'hurried' }, Buffer.from(g, 'latin1'));
      assert.deepEqual(
        (r.result as { name: string }[]).map((s) => s.name),
        ['hurried'],
        `after ${JSON.stringify(g.slice(0, 40))}`,
      );
    }
    assert.match(hoverText(await c.request('textDocument/hover', HOVER)), /5\.61 ± 0\.19 mK/);
    const skipped = c.logs().filter((l) => /skipped \d+ bytes of input that are not an LSP message/.test(l));
    assert.equal(skipped.length, garbage.length, c.logs().join('\n'));
  });

  it('drops a $/setTrace of the wrong shape with a line in the log, and takes a right one', async () => {
    c.notify('$/setTrace', null);
    c.notify('$/setTrace', { value: 'loud' });
    c.notify('$/setTrace', { value: 'off' });
    assert.match(hoverText(await c.request('textDocument/hover', HOVER)), /5\.61 ± 0\.19 mK/);
    const logs = c.logs();
    assert.equal(logs.filter((l) => /\$\/setTrace dropped/.test(l)).length, 2, logs.join('\n'));
    assert.ok(!logs.some((l) => /handler '\$\/setTrace' failed/.test(l)), logs.join('\n'));
  });
});

describe('the server to a client whose initialize is not of the protocol’s shape', function () {
  this.timeout(30_000);

  it('refuses it with InvalidParams naming the field, and initializes on a right one after', async () => {
    const c = rawClient();
    try {
      // LSP 3.17 "Initialize Request": capabilities is required; rootUri is a DocumentUri or null;
      // workspaceFolders is null or an array of { uri, name }.
      const wrong: [unknown, RegExp][] = [
        [{ processId: null, rootUri: null }, /capabilities must be an object/],
        [{ processId: null, rootUri: 5, capabilities: {} }, /rootUri/],
        [{ processId: null, rootUri: null, capabilities: {}, workspaceFolders: 'notes' }, /workspaceFolders/],
        [{ processId: null, rootUri: null, capabilities: {}, workspaceFolders: [{ uri: 5 }] }, /workspaceFolders\[0\]/],
        [
          {
            processId: null,
            rootUri: null,
            capabilities: {},
            workspaceFolders: [{ uri: 'file:///n', name: 'n' }, null],
          },
          /workspaceFolders\[1\]/,
        ],
      ];
      for (const [params, field] of wrong) {
        const r = await c.request('initialize', params);
        assert.equal(r.error?.code, -32602, `${JSON.stringify(params)}: ${JSON.stringify(r)}`);
        assert.match(r.error.message, field);
        // Still not initialized: a request is refused as before initialize.
        assert.equal((await c.request('workspace/symbol', { query: '' })).error?.code, -32002);
      }
      const init = await c.initialize({});
      assert.ok((init.result as { capabilities?: { hoverProvider?: boolean } }).capabilities?.hoverProvider);
      c.notify('textDocument/didOpen', OPEN);
      assert.match(hoverText(await c.request('textDocument/hover', HOVER)), /5\.61 ± 0\.19 mK/);
      assert.deepEqual((await c.request('workspace/symbol', { query: 'hurried' })).error, undefined);
      await c.close();
      assert.equal(await c.exited, 0);
      assert.deepEqual(c.notFrames, []);
    } finally {
      c.proc.kill();
    }
  });
});

/**
 * The language server as VS Code in a browser runs it: `dist/web/server.js`
 * in a web worker of headless Chromium, spoken to over the worker's message
 * port with LSP messages, as `vscode-languageclient/browser` does. The page
 * is a bare one from 127.0.0.1 with nothing of the extension in it, so what
 * answers can only be the worker.
 */
import assert from 'node:assert/strict';
import { existsSync, readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Browser, Page } from 'playwright-core';
import { launch } from '../webview/harness';

// Page-side names (this module is typed without the DOM library).
declare const window: {
  lsp: (message: object) => void;
  received: { id?: number; method?: string; result?: unknown; params?: unknown }[];
};
declare class Worker {
  constructor(url: string);
  postMessage(m: unknown): void;
  onmessage: (e: { data: unknown }) => void;
}

const NOTE = [
  '# A run',
  '',
  '```levels',
  'id: worker run',
  'system: 1H',
  'field: 9.4 T',
  'lattice: 300 K',
  'polarization: 3.2e-5 ± 1e-6',
  '```',
  '',
  '```levels',
  'id: broken',
  'system: 1H',
  'field: 9.4 MT',
  'polarization: 0.1',
  '```',
  '',
].join('\n');
const URI = 'file:///worker/note.md';

describe('the language server in a web worker (headless Chromium)', function () {
  this.timeout(60000);
  let server: Server;
  let browser: Browser;
  let page: Page;

  before(async () => {
    if (!existsSync('dist/web/server.js')) throw new Error('dist/web/server.js is missing: run `npm run build` first');
    server = createServer((req, res) => {
      if (req.url === '/server.js')
        return void res.writeHead(200, { 'content-type': 'text/javascript' }).end(readFileSync('dist/web/server.js'));
      if (req.url === '/') return void res.writeHead(200, { 'content-type': 'text/html' }).end('<!doctype html><p>');
      res.writeHead(404).end();
    });
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    browser = await launch();
    page = await browser.newPage();
    await page.goto(`http://127.0.0.1:${(server.address() as AddressInfo).port}/`);
    await page.evaluate(() => {
      const worker = new Worker('/server.js');
      window.received = [];
      worker.onmessage = (e) => void window.received.push(e.data as { id?: number });
      window.lsp = (message) => worker.postMessage({ jsonrpc: '2.0', ...message });
    });
  });
  after(async () => {
    await browser?.close();
    server?.close();
  });

  /** Sends a request and waits for the response with its id. */
  const request = async (id: number, method: string, params: object): Promise<unknown> => {
    await page.evaluate(([i, m, p]) => window.lsp({ id: i, method: m, params: p }), [id, method, params] as const);
    await page.waitForFunction((i) => window.received.some((r) => r.id === i && r.method === undefined), id);
    return page.evaluate((i) => window.received.find((r) => r.id === i && r.method === undefined)!.result, id);
  };
  const notify = (method: string, params: object): Promise<void> =>
    page.evaluate(([m, p]) => window.lsp({ method: m, params: p }), [method, params] as const);

  it('initializes with hover, inlay hints and pull diagnostics', async () => {
    const init = (await request(1, 'initialize', {
      processId: null,
      rootUri: null,
      capabilities: { textDocument: { diagnostic: {}, hover: { contentFormat: ['markdown'] }, inlayHint: {} } },
    })) as { capabilities: Record<string, unknown>; serverInfo: { name: string } };
    assert.equal(init.serverInfo.name, 'boltzmark-lsp');
    assert.ok(init.capabilities.hoverProvider);
    assert.ok(init.capabilities.inlayHintProvider);
    assert.ok(init.capabilities.diagnosticProvider);
    await notify('initialized', {});
    await notify('textDocument/didOpen', {
      textDocument: { uri: URI, languageId: 'markdown', version: 1, text: NOTE },
    });
  });

  it('answers a hover on a block with its spin temperature and polarization', async () => {
    const hover = (await request(2, 'textDocument/hover', {
      textDocument: { uri: URI },
      position: { line: 3, character: 5 },
    })) as { contents: { value: string } } | null;
    assert.ok(hover, 'a hover');
    assert.match(hover.contents.value, /worker run/);
    assert.match(hover.contents.value, /\bT\b/);
    assert.match(hover.contents.value, /polarization|P\b/i);
  });

  it('answers inlay hints for the visible range', async () => {
    const hints = (await request(3, 'textDocument/inlayHint', {
      textDocument: { uri: URI },
      range: { start: { line: 0, character: 0 }, end: { line: 16, character: 0 } },
    })) as { position: { line: number }; label: string | { value: string }[] }[];
    assert.ok(hints.length > 0, 'some hints');
    const first = hints.find((h) => h.position.line === 2);
    assert.ok(first, 'a hint on the first block’s fence line');
    const label = typeof first.label === 'string' ? first.label : first.label.map((p) => p.value).join('');
    assert.match(label, /T = /);
  });

  it('pulls the diagnostics of the note: the wrong-case unit, on its own range', async () => {
    const report = (await request(4, 'textDocument/diagnostic', { textDocument: { uri: URI } })) as {
      items: { code: string; range: { start: { line: number; character: number } } }[];
    };
    const unit = report.items.find((d) => /unit/.test(d.code));
    assert.ok(unit, `a unit diagnostic among ${JSON.stringify(report.items.map((d) => d.code))}`);
    assert.equal(unit.range.start.line, 13);
    assert.equal(unit.range.start.character, NOTE.split('\n')[13]!.indexOf('MT'));
  });
});

import { strict as assert } from 'node:assert';
import { LAB_NOTE_LINES, LAB_NOTE_URI } from './labNote';
import { startLsp, type LspSession, type StartOptions } from './lspClient';

// Minimal language clients, each missing something an editor may lack, as
// other editors than VS Code are: the server must serve every one of them
// (hover, inlay hints, diagnostics, completion) and must never die of a
// request the client does not answer.
const NOTE = LAB_NOTE_LINES.join('\n');
const URI = LAB_NOTE_URI;

/** Everything optional that LSP 3.17 lets a client declare and that the server might use. */
const EVERY_CAPABILITY = {
  workspace: {
    configuration: true,
    workspaceFolders: true,
    didChangeConfiguration: { dynamicRegistration: true },
    inlayHint: { refreshSupport: true },
    codeLens: { refreshSupport: true },
    diagnostics: { refreshSupport: true },
  },
  textDocument: {
    hover: { contentFormat: ['markdown', 'plaintext'] },
    diagnostic: { dynamicRegistration: false },
    publishDiagnostics: { versionSupport: true },
    inlayHint: { dynamicRegistration: false },
  },
};

/** Sends a request, failing at once (instead of waiting out the test) if the server dies first. */
async function ask<T>(s: LspSession, method: string, params: unknown): Promise<T> {
  return Promise.race([s.conn.sendRequest(method, params) as Promise<T>, s.gone]);
}

/** Resolves once `pred` holds, checking after each of up to 100 round trips to the server (no timer). */
async function until(s: LspSession, pred: () => boolean, what: string): Promise<void> {
  for (let i = 0; i < 100 && !pred(); i++) await ask(s, 'boltzmark/memory', undefined);
  assert.ok(pred(), what);
}

/** Starts a server for the client, opens the note and lets every start-up request and its answer go through. */
async function session(opts: StartOptions): Promise<LspSession> {
  const s = await startLsp(opts);
  await s.conn.sendNotification('textDocument/didOpen', {
    textDocument: { uri: URI, languageId: 'markdown', version: 1, text: NOTE },
  });
  // Two round trips after the last start-up request: its answer has reached the server, and whatever
  // the server did with it (including failing) has happened before the second answer comes back.
  for (let i = 0; i < 2; i++) await ask(s, 'boltzmark/memory', undefined);
  return s;
}

/** The four features every client gets, and the server still alive after them. */
async function checkServes(s: LspSession, diagnostics: 'pull' | 'push'): Promise<void> {
  const hover = await ask<{ contents: { value: string } } | null>(s, 'textDocument/hover', {
    textDocument: { uri: URI },
    position: { line: 5, character: 3 },
  });
  // T = 5.61 ± 0.19 mK for 13C at 7.05 T and P = 0.312 ± 0.010: the same value as test/protocol/server.test.ts.
  assert.match(hover?.contents.value ?? '', /5\.61 ± 0\.19 mK/);
  const hints = await ask<{ label: string | { value: string }[] }[]>(s, 'textDocument/inlayHint', {
    textDocument: { uri: URI },
    range: { start: { line: 0, character: 0 }, end: { line: 17, character: 0 } },
  });
  const labels = hints.map((h) => (typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('')));
  assert.ok(
    labels.some((l) => l.includes('T = 5.61 mK')),
    labels.join(' | '),
  );
  let codes: (string | number | undefined)[];
  if (diagnostics === 'pull') {
    const r = await ask<{ items: { code?: string }[] }>(s, 'textDocument/diagnostic', { textDocument: { uri: URI } });
    codes = r.items.map((d) => d.code);
  } else {
    await Promise.race([s.waitForPush(URI), s.gone]);
    codes = s.pushed.get(URI)!.diagnostics.map((d) => d.code);
  }
  assert.ok(codes.includes('unit-case'), codes.join(','));
  const items = await ask<{ label: string }[] | { items: { label: string }[] }>(s, 'textDocument/completion', {
    textDocument: { uri: URI },
    position: { line: 12, character: 8 },
  });
  const completions = (Array.isArray(items) ? items : items.items).map((i) => i.label);
  assert.ok(completions.includes('13C'), completions.join(','));
  assert.equal(s.proc.exitCode, null, `the server died: ${s.stderr()}`);
}

describe('the server with minimal clients', function () {
  this.timeout(30000);
  let s: LspSession | undefined;
  afterEach(async () => {
    if (s && s.proc.exitCode === null) await s.close();
    s = undefined;
  });

  it('serves a client that declares no optional capability, pushing diagnostics and asking nothing of it', async () => {
    s = await session({ capabilities: {} });
    await checkServes(s, 'push');
    assert.deepEqual(
      s.requests.map((r) => r.method),
      [],
      'a client without capabilities gets no server-to-client request',
    );
    // No hierarchical symbols: a flat list with locations; no snippets: plain text templates.
    const symbols = await ask<{ name: string; location?: { uri: string }; children?: unknown }[]>(
      s,
      'textDocument/documentSymbol',
      { textDocument: { uri: URI } },
    );
    assert.deepEqual(
      symbols.map((x) => [x.name, x.location?.uri, x.children]),
      [
        ['cell-B run 7', URI, undefined],
        ['hurried', URI, undefined],
      ],
    );
    const templates = await ask<{ insertTextFormat?: number; textEdit?: { newText: string } }[]>(
      s,
      'textDocument/completion',
      { textDocument: { uri: URI }, position: { line: 16, character: 0 } },
    );
    assert.ok(templates.length > 0);
    for (const t of templates) assert.ok(t.insertTextFormat !== 2 && !/\$\{/.test(t.textEdit?.newText ?? ''));
    // No code lenses: their commands are the VS Code extension's, which this client cannot run.
    const offered = s.initialized.capabilities as Record<string, unknown>;
    assert.equal(offered.codeLensProvider, undefined);
    assert.deepEqual(await ask(s, 'textDocument/codeLens', { textDocument: { uri: URI } }), []);
    await s.close();
    assert.equal(s.proc.exitCode, 0);
  });

  it('survives a client that answers every server-to-client request with MethodNotFound', async () => {
    s = await session({ capabilities: EVERY_CAPABILITY, pull: true, refuse: 'all' });
    await checkServes(s, 'pull');
    // A settings change makes the server ask again (and be refused again); it keeps its defaults and keeps serving.
    await s.conn.sendNotification('workspace/didChangeConfiguration', { settings: null });
    await until(
      s,
      () => s!.requests.filter((r) => r.method === 'workspace/configuration').length >= 2,
      'the settings are asked for again',
    );
    await checkServes(s, 'pull');
    assert.ok(
      s.logs.some((l) => /configuration/.test(l)),
      `the refused settings request is logged: ${s.logs.join(' | ')}`,
    );
    await s.close();
    assert.equal(s.proc.exitCode, 0);
  });

  it('survives a client that reads settings but refuses the inlay hint refresh it never declared', async () => {
    // The crash of issue 15: configuration supported, `workspace/inlayHint/refresh` answered with an error.
    s = await session({ refuse: ['workspace/inlayHint/refresh'], pull: true });
    await checkServes(s, 'pull');
    await until(s, () => s!.requests.some((r) => r.method === 'workspace/configuration'), 'the settings are read');
    const refreshes = s.requests.filter((r) => r.method.endsWith('/refresh')).map((r) => r.method);
    assert.deepEqual(refreshes, [], 'no refresh is sent to a client that declares no refreshSupport');
    await s.close();
    assert.equal(s.proc.exitCode, 0);
  });

  it('serves a client without workspace/configuration from its initialization options and pushed settings', async () => {
    const { workspace, ...rest } = EVERY_CAPABILITY;
    s = await session({
      capabilities: { ...rest, workspace: { ...workspace, configuration: false } },
      pull: true,
      initializationOptions: { display: { temperature: 'auto' } },
    });
    await checkServes(s, 'pull');
    assert.ok(!s.requests.some((r) => r.method === 'workspace/configuration'), 'no configuration request');
    // Settings pushed with the notification (as Neovim and Helix do) replace the initialization options.
    await s.conn.sendNotification('workspace/didChangeConfiguration', {
      settings: { boltzmark: { display: { temperature: 'kelvin' } } },
    });
    const hover = await ask<{ contents: { value: string } }>(s, 'textDocument/hover', {
      textDocument: { uri: URI },
      position: { line: 5, character: 3 },
    });
    // 5.61 mK written in kelvin: 0.00561 K (the same temperature, unit fixed by the setting).
    assert.match(hover.contents.value, /0\.005\d+ ± 0\.000\d+ K/);
    assert.ok(
      s.requests.some((r) => r.method === 'workspace/inlayHint/refresh'),
      'hints refreshed',
    );
    await s.close();
    assert.equal(s.proc.exitCode, 0);
  });
});

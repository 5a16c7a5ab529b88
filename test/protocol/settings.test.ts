import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { startLsp, type LspSession } from './lspClient';
import { AnalysisStatsRequest } from '../../src/shared/protocol';

// Settings as the server reads them from a client: per note (`scopeUri`),
// kept per workspace folder, and a change recomputes and refreshes only what
// the changed value affects. Also the server's name and version, and its
// last guard against a promise rejection nothing handled.
const BLOCK = ['```levels', 'id: cell-B run 7', 'system: 13C', 'field: 7.05 T', 'lattice: 1.4 K'];
const NOTE = [
  '# Lab note', // 0
  '',
  ...BLOCK, // 2–6
  'polarization: 0.312 ± 0.010', // 7
  '```', // 8
  '',
  '```populations', // 10
  'id: second fence',
  'gap: 10 K',
  'ratio: 0.5',
  '```', // 14
  '',
].join('\n');

/** Everything the server may use, so that the tests see which requests it chooses to send. */
const CAPABILITIES = {
  workspace: {
    configuration: true,
    workspaceFolders: true,
    didChangeConfiguration: { dynamicRegistration: true },
    inlayHint: { refreshSupport: true },
    codeLens: { refreshSupport: true },
    diagnostics: { refreshSupport: true },
  },
  textDocument: { hover: { contentFormat: ['markdown'] }, diagnostic: { dynamicRegistration: false } },
};

async function open(s: LspSession, uri: string, text = NOTE): Promise<void> {
  await s.conn.sendNotification('textDocument/didOpen', {
    textDocument: { uri, languageId: 'markdown', version: 1, text },
  });
}

async function hover(s: LspSession, uri: string): Promise<string> {
  const h = (await Promise.race([
    s.conn.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 5, character: 3 } }),
    s.gone,
  ])) as { contents: { value: string } } | null;
  return h?.contents.value ?? '';
}

/** Round trips to the server until `pred` holds (at most 100; no timer). */
async function until(s: LspSession, pred: () => boolean, what: string): Promise<void> {
  for (let i = 0; i < 100 && !pred(); i++) await Promise.race([s.conn.sendRequest('boltzmark/memory'), s.gone]);
  assert.ok(pred(), what);
}

const methods = (s: LspSession, suffix: string): string[] =>
  s.requests.map((r) => r.method).filter((m) => m.endsWith(suffix));

describe('settings in the language server', function () {
  this.timeout(30000);
  let s: LspSession | undefined;
  afterEach(async () => {
    if (s && s.proc.exitCode === null) await s.close();
    s = undefined;
  });

  it('reads the settings of each note by its scopeUri, once per workspace folder', async () => {
    const bySection: Record<string, unknown> = {
      'file:///lab/a/': { display: { temperature: 'kelvin' } },
      'file:///lab/b/': { display: { temperature: 'beta-first' } },
    };
    s = await startLsp({
      capabilities: CAPABILITIES,
      workspaceFolders: [
        { uri: 'file:///lab/a', name: 'a' },
        { uri: 'file:///lab/b', name: 'b' },
      ],
      // The client answers for the folder the scopeUri lies in, as VS Code does for resource-scoped settings.
      settings: (scope?: string) => Object.entries(bySection).find(([f]) => scope?.startsWith(f))?.[1] ?? {},
    });
    for (const uri of ['file:///lab/a/1.md', 'file:///lab/a/deeper/2.md', 'file:///lab/b/3.md', 'file:///elsewhere.md'])
      await open(s, uri);
    // The same block, shown as each folder asks (values as in test/server/features/hover.test.ts).
    assert.match(await hover(s, 'file:///lab/a/1.md'), /\| T \| 0\.00561 ± 0\.00019 K \|/);
    assert.match(await hover(s, 'file:///lab/a/deeper/2.md'), /\| T \| 0\.00561 ± 0\.00019 K \|/);
    const b = await hover(s, 'file:///lab/b/3.md');
    assert.ok(b.indexOf('| β | 178.2 ± 6.1 K⁻¹ |') < b.indexOf('| T | 5.61 ± 0.19 mK |'), b);
    assert.match(await hover(s, 'file:///elsewhere.md'), /^\| T \| 5\.61 ± 0\.19 mK \|$/m);
    const asked = s.requests
      .filter((r) => r.method === 'workspace/configuration')
      .flatMap((r) => (r.params as { items: { scopeUri?: string; section?: string }[] }).items);
    assert.deepEqual(
      asked.map((i) => [i.section, i.scopeUri]),
      [
        ['boltzmark', 'file:///lab/a/1.md'],
        ['boltzmark', 'file:///lab/b/3.md'],
        ['boltzmark', 'file:///elsewhere.md'],
      ],
      'one request per folder (and one for the note outside every folder)',
    );
  });

  it('follows added workspace folders: a note in a new folder gets that folder’s settings', async () => {
    let folders = ['file:///lab/a/'];
    s = await startLsp({
      capabilities: CAPABILITIES,
      workspaceFolders: [{ uri: 'file:///lab/a', name: 'a' }],
      settings: (scope?: string) =>
        folders.includes('file:///lab/b/') && scope?.startsWith('file:///lab/b/')
          ? { display: { temperature: 'kelvin' } }
          : {},
    });
    const uri = 'file:///lab/b/3.md';
    await open(s, uri);
    assert.match(await hover(s, uri), /\| T \| 5\.61 ± 0\.19 mK \|/);
    folders = ['file:///lab/a/', 'file:///lab/b/'];
    await s.conn.sendNotification('workspace/didChangeWorkspaceFolders', {
      event: { added: [{ uri: 'file:///lab/b', name: 'b' }], removed: [] },
    });
    await until(s, () => methods(s!, '/refresh').includes('workspace/inlayHint/refresh'), 'hints refreshed');
    assert.match(await hover(s, uri), /\| T \| 0\.00561 ± 0\.00019 K \|/);
  });

  it('analyses a note opened at start-up once, and again only when a value that changes results changes', async () => {
    let section: Record<string, unknown> = {};
    s = await startLsp({ capabilities: CAPABILITIES, pull: true, settings: () => section });
    const uri = 'file:///lab/startup.md';
    await open(s, uri);
    const diagnostics = async (): Promise<number> =>
      ((await s!.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } })) as { items: unknown[] }).items
        .length;
    const symbols = async (): Promise<string[]> =>
      ((await s!.conn.sendRequest('textDocument/documentSymbol', { textDocument: { uri } })) as { name: string }[]).map(
        (x) => x.name,
      );
    assert.match(await hover(s, uri), /5\.61 ± 0\.19 mK/);
    await diagnostics();
    assert.deepEqual(await symbols(), ['cell-B run 7']);
    const runs = async (): Promise<number | undefined> =>
      (await s!.conn.sendRequest(AnalysisStatsRequest, { uri }))?.runs;
    assert.equal(await runs(), 1, 'one analysis for hover, diagnostics and outline at start-up');
    assert.ok(methods(s, 'registerCapability').length === 1, 'registers for configuration changes');
    const registration = s.requests.find((r) => r.method === 'client/registerCapability')!.params as {
      registrations: { method: string }[];
    };
    assert.equal(registration.registrations[0].method, 'workspace/didChangeConfiguration');

    // A display setting: new strings, no new analysis; only the inlay hints are refreshed.
    const asks = (): number => methods(s!, 'workspace/configuration').length;
    section = { display: { temperature: 'kelvin' } };
    let before = asks();
    await s.conn.sendNotification('workspace/didChangeConfiguration', { settings: null });
    await until(s, () => asks() > before && methods(s!, '/refresh').length > 0, 'asked again and refreshed');
    assert.match(await hover(s, uri), /0\.00561 ± 0\.00019 K/);
    assert.equal(await runs(), 1, 'a display setting does not analyse the note again');
    assert.deepEqual(methods(s, '/refresh'), ['workspace/inlayHint/refresh']);

    // The same values again: nothing is refreshed.
    before = asks();
    await s.conn.sendNotification('workspace/didChangeConfiguration', { settings: null });
    await until(s, () => asks() > before, 'asked again');
    for (let i = 0; i < 3; i++) await s.conn.sendRequest('boltzmark/memory');
    assert.deepEqual(methods(s, '/refresh'), ['workspace/inlayHint/refresh'], 'no refresh for an unchanged value');

    // A value that changes the results: the second fence becomes a block.
    section = { display: { temperature: 'kelvin' }, blocks: { extraInfoStrings: ['populations'] } };
    await s.conn.sendNotification('workspace/didChangeConfiguration', { settings: null });
    await until(s, () => methods(s!, '/refresh').length === 4, 'refreshed');
    assert.deepEqual(methods(s, '/refresh').slice(1).sort(), [
      'workspace/codeLens/refresh',
      'workspace/diagnostic/refresh',
      'workspace/inlayHint/refresh',
    ]);
    assert.deepEqual(await symbols(), ['cell-B run 7', 'second fence']);
    assert.equal(await runs(), 2);
  });

  it('names itself with the version in package.json', async () => {
    s = await startLsp();
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as { version: string };
    assert.deepEqual(s.initialized.serverInfo, { name: 'boltzmark-lsp', version: manifest.version });
  });

  it('logs a promise rejection nothing handled and keeps serving', async () => {
    s = await startLsp({ execArgv: ['--require', resolve('test/protocol/strayRejection.cjs')] });
    await open(s, 'file:///lab/n.md');
    assert.match(await hover(s, 'file:///lab/n.md'), /5\.61 ± 0\.19 mK/);
    assert.ok(
      s.logs.some((l) => l.includes('left by test/protocol/strayRejection.cjs')),
      `logged: ${s.logs.join(' | ')}`,
    );
    await s.close();
    assert.equal(s.proc.exitCode, 0);
  });
});

import { strict as assert } from 'node:assert';
import { LAB_NOTE_LINES, LAB_NOTE_URI } from './labNote';
import { startLsp, type LspSession } from './lspClient';
import { AnalysisStatsRequest, ResultsMarkdownRequest } from '../../src/shared/protocol';

// These tests spawn the bundled server (dist/server.js, built by `npm test`)
// over stdio and speak LSP to it with vscode-jsonrpc, as another editor would.
const NOTE = [
  ...LAB_NOTE_LINES,
  '```levels', // 17
  'id: flipped', // 18
  'gap: 10 K', // 19
  'ratio: 2.0 ± 0.04', // 20
  '```', // 21
  '',
].join('\n');
const URI = LAB_NOTE_URI;

type Diag = {
  range: { start: { line: number; character: number }; end: { line: number; character: number } };
  code: string;
  codeDescription?: { href: string };
  severity: number;
  message: string;
};
type Hover = { contents: { kind: string; value: string } };

function text(h: Hover | null): string {
  assert.ok(h, 'a hover was expected');
  return h.contents.value;
}

async function open(s: LspSession, text = NOTE, uri = URI): Promise<void> {
  await s.conn.sendNotification('textDocument/didOpen', {
    textDocument: { uri, languageId: 'markdown', version: 1, text },
  });
}

describe('language server over stdio', function () {
  this.timeout(30000);
  let s: LspSession;

  before(async () => {
    s = await startLsp({ pull: true });
    await open(s);
  });
  after(async () => s.close());

  it('serves pull diagnostics with exact ranges, stable codes and a link to the rule', async () => {
    const r = (await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } })) as {
      kind: string;
      items: Diag[];
    };
    assert.equal(r.kind, 'full');
    const d = r.items.find((x) => x.code === 'unit-case');
    assert.ok(d, JSON.stringify(r.items));
    assert.deepEqual(d.range, { start: { line: 13, character: 11 }, end: { line: 13, character: 13 } });
    assert.equal(d.severity, 1);
    assert.match(d.codeDescription!.href, /docs\/format\.md#unit-case$/);
    assert.equal(r.items.filter((x) => x.severity === 1).length, 1, 'only the wrong-case unit is an error');
  });

  it('answers a hover with the block results, and says inverted for an inverted block', async () => {
    const h = text(
      await s.conn.sendRequest('textDocument/hover', {
        textDocument: { uri: URI },
        position: { line: 5, character: 3 },
      }),
    );
    assert.match(h, /5\.61 ± 0\.19 mK/);
    assert.match(h, /178\.2 ± 6\.1/);
    assert.match(h, /normal/);
    const inv = text(
      await s.conn.sendRequest('textDocument/hover', {
        textDocument: { uri: URI },
        position: { line: 19, character: 1 },
      }),
    );
    assert.match(inv, /inverted/);
    assert.match(inv, /−14\.43 ± 0\.42 K/);
    const none = await s.conn.sendRequest('textDocument/hover', {
      textDocument: { uri: URI },
      position: { line: 0, character: 2 },
    });
    assert.equal(none, null);
  });

  it('gives inlay hints after the first line of a block', async () => {
    const hints = (await s.conn.sendRequest('textDocument/inlayHint', {
      textDocument: { uri: URI },
      range: { start: { line: 0, character: 0 }, end: { line: 22, character: 0 } },
    })) as { position: { line: number }; label: string | { value: string }[] }[];
    const label = (h: (typeof hints)[number]): string =>
      typeof h.label === 'string' ? h.label : h.label.map((p) => p.value).join('');
    const first = hints.find((h) => label(h).includes('T = 5.61 mK'));
    assert.ok(first, hints.map(label).join(' | '));
    assert.ok(first.position.line === 2 || first.position.line === 3, `hint on line ${first.position.line}`);
  });

  it('offers a quick fix that turns MT into mT, touching only that text', async () => {
    const range = { start: { line: 13, character: 11 }, end: { line: 13, character: 13 } };
    const actions = (await s.conn.sendRequest('textDocument/codeAction', {
      textDocument: { uri: URI },
      range,
      context: { diagnostics: [] },
    })) as {
      title: string;
      kind: string;
      edit: { changes: Record<string, { range: typeof range; newText: string }[]> };
    }[];
    const fix = actions.find((a) => a.edit?.changes?.[URI]?.[0]?.newText === 'mT');
    assert.ok(fix, JSON.stringify(actions));
    assert.equal(fix.kind, 'quickfix');
    assert.deepEqual(fix.edit.changes[URI], [{ range, newText: 'mT' }]);
  });

  it('completes isotopes after `system: `', async () => {
    const items = (await s.conn.sendRequest('textDocument/completion', {
      textDocument: { uri: URI },
      position: { line: 12, character: 8 },
    })) as { label: string }[] | { items: { label: string }[] };
    const labels = (Array.isArray(items) ? items : items.items).map((i) => i.label);
    assert.ok(labels.includes('13C') && labels.includes('129Xe') && labels.includes('electron'), labels.join(','));
  });

  it('lists the blocks by id in the outline', async () => {
    const symbols = (await s.conn.sendRequest('textDocument/documentSymbol', { textDocument: { uri: URI } })) as {
      name: string;
    }[];
    assert.deepEqual(
      symbols.map((x) => x.name),
      ['cell-B run 7', 'hurried', 'flipped'],
    );
  });

  it('folds each block and puts two code lenses above it', async () => {
    const folds = (await s.conn.sendRequest('textDocument/foldingRange', { textDocument: { uri: URI } })) as {
      startLine: number;
      endLine: number;
    }[];
    assert.deepEqual(
      folds.map((f) => [f.startLine, f.endLine]),
      [
        [2, 8],
        [10, 15],
        [17, 21],
      ],
    );
    const lenses = (await s.conn.sendRequest('textDocument/codeLens', { textDocument: { uri: URI } })) as {
      command: { command: string };
    }[];
    assert.equal(lenses.length, 6);
    assert.deepEqual([...new Set(lenses.map((l) => l.command.command))].sort(), [
      'boltzmark.copyResults',
      'boltzmark.showCurve',
    ]);
  });

  it('returns the results table of a block for "Copy Block Results"', async () => {
    const md = await s.conn.sendRequest(ResultsMarkdownRequest, { uri: URI, line: 4 });
    assert.ok(md && /5\.61 ± 0\.19 mK/.test(md), String(md));
    assert.equal(await s.conn.sendRequest(ResultsMarkdownRequest, { uri: URI, line: 0 }), null);
  });

  it('re-analyses after an edit and drops the fixed diagnostic', async () => {
    await s.conn.sendNotification('textDocument/didChange', {
      textDocument: { uri: URI, version: 2 },
      contentChanges: [{ range: { start: { line: 13, character: 11 }, end: { line: 13, character: 13 } }, text: 'mT' }],
    });
    const r = (await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } })) as {
      items: Diag[];
    };
    assert.equal(r.items.filter((x) => x.severity === 1).length, 0, JSON.stringify(r.items));
    const stats = await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI });
    assert.equal(stats?.version, 2);
    assert.equal(stats?.analysed, 1, 'only the edited block is read again');
    assert.equal(stats?.reused, 2);
  });

  it('re-analyses only the edited block of a 2,000-block note', async () => {
    const uri = 'file:///notes/big.md';
    const blocks = Array.from(
      { length: 2000 },
      (_, i) =>
        `## Run ${i}\n\n\`\`\`levels\nid: run ${i}\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: ${(0.1 + i / 10000).toFixed(4)} ± 0.010\n\`\`\`\n`,
    );
    await open(s, blocks.join('\n'), uri);
    // Diagnostics need the whole note (a hover on a note this large reads only its block until the whole is read).
    await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } });
    const before = await s.conn.sendRequest(AnalysisStatsRequest, { uri });
    assert.equal(before?.blocks, 2000);
    // Block 1000 starts at line 1000 * 10; its polarization line is 7 lines further: `polarization: 0.2000 ± 0.010`.
    const line = 1000 * 10 + 7;
    await s.conn.sendNotification('textDocument/didChange', {
      textDocument: { uri, version: 2 },
      contentChanges: [{ range: { start: { line, character: 16 }, end: { line, character: 17 } }, text: '3' }],
    });
    const h = text(
      await s.conn.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line, character: 2 } }),
    );
    assert.match(h, /run 1000/);
    const after = await s.conn.sendRequest(AnalysisStatsRequest, { uri });
    assert.deepEqual([after?.analysed, after?.reused], [1, 1999]);
  });
});

describe('language server with pushed diagnostics (clients without pull)', function () {
  this.timeout(30000);

  it('pushes diagnostics after opening and after edits, and clears them on close', async () => {
    const s = await startLsp({ pull: false });
    try {
      await open(s);
      await s.waitForPush(URI, (p) => p.diagnostics.some((d) => d.code === 'unit-case'));
      await s.conn.sendNotification('textDocument/didChange', {
        textDocument: { uri: URI, version: 2 },
        contentChanges: [
          { range: { start: { line: 13, character: 11 }, end: { line: 13, character: 13 } }, text: 'mT' },
        ],
      });
      await s.waitForPush(URI, (p) => p.version === 2 && !p.diagnostics.some((d) => d.code === 'unit-case'));
      await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri: URI } });
      await s.waitForPush(URI, (p) => p.diagnostics.length === 0);
    } finally {
      await s.close();
    }
  });

  it('exits cleanly after shutdown and exit', async () => {
    const s = await startLsp();
    await s.close();
    assert.equal(s.proc.exitCode, 0);
  });
});

import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { CurveDataRequest, ResultsMarkdownRequest } from '../../src/shared/protocol';
import { startLsp, type LspSession } from './lspClient';

// Nothing writes to a note without a user's chosen edit (docs/architecture.md,
// invariant 6): every feature of the bundled server runs over every note of
// the demo notebook, and the CLI reports and checks it in every format; the
// files' bytes (and the folder's listing) must be exactly as before, and the
// server must never ask the editor to apply an edit on its own.
const DEMO = 'demo';

function snapshot(): Map<string, string> {
  const out = new Map<string, string>();
  for (const name of readdirSync(DEMO).sort()) {
    const p = join(DEMO, name);
    if (statSync(p).isFile()) out.set(name, createHash('sha256').update(readFileSync(p)).digest('hex'));
  }
  return out;
}

type Pos = { line: number; character: number };

/** Positions spread over every line: the start, a few columns in, and the end. */
function positions(text: string): Pos[] {
  const out: Pos[] = [];
  text.split(/\r\n|\r|\n/).forEach((l, line) => {
    for (const c of new Set([0, 1, 3, 8, 15, 30, l.length])) if (c <= l.length) out.push({ line, character: c });
  });
  return out;
}

async function everyFeature(s: LspSession, uri: string, text: string): Promise<number> {
  const doc = { textDocument: { uri } };
  const lineCount = text.split(/\r\n|\r|\n/).length;
  let requests = 0;
  const ask = async (method: string, params: object): Promise<unknown> => {
    requests++;
    return s.conn.sendRequest(method, params);
  };
  const diags = (await ask('textDocument/diagnostic', doc)) as { items: { range: { start: Pos; end: Pos } }[] };
  await ask('textDocument/inlayHint', {
    ...doc,
    range: { start: { line: 0, character: 0 }, end: { line: lineCount, character: 0 } },
  });
  await ask('textDocument/documentSymbol', doc);
  await ask('textDocument/foldingRange', doc);
  await ask('textDocument/codeLens', doc);
  for (const d of diags.items)
    await ask('textDocument/codeAction', { ...doc, range: d.range, context: { diagnostics: [d] } });
  for (const p of positions(text)) {
    await ask('textDocument/hover', { ...doc, position: p });
    await ask('textDocument/completion', { ...doc, position: p });
    await ask('textDocument/codeAction', { ...doc, range: { start: p, end: p }, context: { diagnostics: [] } });
  }
  for (let line = 0; line < lineCount; line++) {
    requests += 2;
    await s.conn.sendRequest(ResultsMarkdownRequest, { uri, line });
    await s.conn.sendRequest(CurveDataRequest, { uri, line });
  }
  return requests;
}

describe('nothing writes to a note', function () {
  this.timeout(120000);

  it('leaves every demo note byte for byte as it was after every server feature and the CLI', async () => {
    const before = snapshot();
    assert.ok(before.size >= 3, `demo notes: ${[...before.keys()].join(', ')}`);
    const applyEdits: unknown[] = [];
    for (const pull of [true, false]) {
      const s = await startLsp({ pull });
      s.conn.onRequest('workspace/applyEdit', (p: unknown) => {
        applyEdits.push(p);
        return { applied: false };
      });
      try {
        let requests = 0;
        for (const name of before.keys()) {
          if (!name.endsWith('.md')) continue;
          const file = resolve(DEMO, name);
          const text = readFileSync(file, 'utf8');
          const uri = pathToFileURL(file).href;
          await s.conn.sendNotification('textDocument/didOpen', {
            textDocument: { uri, languageId: 'markdown', version: 1, text },
          });
          requests += await everyFeature(s, uri, text);
          if (!pull) await s.waitForPush(uri);
          await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri } });
        }
        assert.ok(requests > 1000, `${requests} requests were made`);
      } finally {
        await s.close();
      }
    }
    for (const args of [
      ['report', DEMO],
      ['report', DEMO, '--format', 'json'],
      ['report', DEMO, '--format', 'csv'],
      ['report', DEMO, '--format', 'markdown'],
      ['check', DEMO],
    ]) {
      const r = spawnSync(process.execPath, ['dist/cli.js', ...args], { encoding: 'utf8' });
      assert.ok(r.status === 0 || r.status === 1, `boltzmark ${args.join(' ')} exited with ${r.status}: ${r.stderr}`);
    }
    assert.deepEqual(applyEdits, [], 'the server asked the editor to apply an edit by itself');
    assert.deepEqual(snapshot(), before);
  });
});

import { strict as assert } from 'node:assert';
import { existsSync, mkdirSync, mkdtempSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { startLsp, type LspSession } from './lspClient';
import { flat } from '../server/spectraHelpers';
import { CurveDataRequest, SpectrumStatsRequest } from '../../src/shared/protocol';
import type { ViewPayload } from '../../src/core';

// Spectrum references through the bundled server: files read from disk and parsed in its worker thread,
// the watcher it registers, and a file renamed away and back on disk re-analysing the open note each time.
const NOTE_TEXT = [
  '# Day', // 0
  '',
  '```levels', // 2
  'system: 13C',
  'field: 9.4 T',
  'lattice: 298 K',
  'signal:', // 6
  '  hyperpolarized: { spectrum: spectra/hp.csv, region: [10 ppm, 20 ppm], baseline: none }', // 7
  '  thermal: { spectrum: spectra/th.csv, region: [10 ppm, 20 ppm], baseline: none }', // 8
  '```',
  '',
].join('\n');

type Diags = { code?: string | number; message: string; range: { start: { line: number } } }[];

describe('protocol: spectrum files', function () {
  this.timeout(60_000);
  let dir: string;
  let s: LspSession;
  let note: string;

  before(async () => {
    assert.ok(existsSync('dist/spectrumWorker.js'), 'the worker bundle is built beside the server');
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-spectra-'));
    mkdirSync(join(dir, 'spectra'));
    writeFileSync(join(dir, 'spectra', 'hp.csv'), flat(250));
    writeFileSync(join(dir, 'spectra', 'th.csv'), flat(1));
    writeFileSync(join(dir, 'note.md'), NOTE_TEXT);
    note = pathToFileURL(join(dir, 'note.md')).href;
    s = await startLsp({
      workspaceFolders: [{ uri: pathToFileURL(dir).href, name: 'lab' }],
      capabilities: {
        workspace: { didChangeWatchedFiles: { dynamicRegistration: true } },
        textDocument: {
          hover: { contentFormat: ['markdown'] },
          publishDiagnostics: { versionSupport: true },
          documentSymbol: { hierarchicalDocumentSymbolSupport: true },
        },
      },
    });
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: note, languageId: 'markdown', version: 1, text: NOTE_TEXT },
    });
  });

  after(async () => {
    await s?.close();
    rmSync(dir, { recursive: true, force: true });
  });

  const hoverAt = async (line: number, character: number): Promise<string> => {
    const h = (await Promise.race([
      s.conn.sendRequest('textDocument/hover', { textDocument: { uri: note }, position: { line, character } }),
      s.gone,
    ])) as { contents: { value: string } } | null;
    return h?.contents.value ?? '';
  };
  const codes = (): (string | number | undefined)[] =>
    ((s.pushed.get(note)?.diagnostics ?? []) as Diags).map((d) => d.code);

  it('answers the outline from the analysis with the files in, even when asked while they are being read', async () => {
    // The first request after opening: the files are not read yet. The outline has no refresh request, so
    // an answer from the pending analysis would stay "invalid" in the editor.
    const symbols = (await s.conn.sendRequest('textDocument/documentSymbol', { textDocument: { uri: note } })) as {
      detail?: string;
    }[];
    assert.equal(symbols.length, 1);
    assert.doesNotMatch(symbols[0]!.detail ?? '', /invalid/);
    assert.match(symbols[0]!.detail ?? '', /T = /);
  });

  it('asks the client to watch spectrum files', async () => {
    await s.waitForPush(note);
    const reg = s.requests.find((r) => r.method === 'client/registerCapability');
    assert.ok(reg, 'a registration');
    assert.match(
      JSON.stringify(reg.params),
      /workspace\/didChangeWatchedFiles.*\*\*\/\*\.\{jdx,dx,jcamp,jcm,csv,tsv,txt\}/,
    );
  });

  it('hovers a reference with its integral once the file is parsed, with no reload', async () => {
    // The first analysis waits on the parse; the server pushes again when the files are read.
    await s.waitForPush(note);
    const first = s.pushed.get(note);
    let v = await hoverAt(7, 30);
    if (!v.includes('| integral |')) {
      await s.waitForPush(note, (d) => d !== first);
      v = await hoverAt(7, 30);
    }
    // ∫ 250 dx over 10 … 20 ppm = 2500 (trapezoid rule, exact for a constant; common practice, no source).
    assert.match(v, /\| integral \| 2500 \(y × ppm\)/);
    assert.match(v, /11 points/);
    assert.deepEqual(codes(), []);
    // Two files, each parsed once; more hovers and the curve view's payload parse nothing again.
    assert.deepEqual(await s.conn.sendRequest(SpectrumStatsRequest), { files: 2, parses: 2 });
    await hoverAt(8, 20);
    const payload = (await s.conn.sendRequest(CurveDataRequest, { uri: note, line: 2 })) as ViewPayload;
    assert.deepEqual(
      payload.spectra!.map((t) => [t.key, t.points, t.region]),
      [
        ['signal.hyperpolarized', 101, [10, 20]],
        ['signal.thermal', 101, [10, 20]],
      ],
    );
    assert.deepEqual(await s.conn.sendRequest(SpectrumStatsRequest), { files: 2, parses: 2 });
  });

  it('a file renamed away on disk is an error on its path; renamed back, the note recovers', async () => {
    const th = join(dir, 'spectra', 'th.csv');
    const away = join(dir, 'spectra', 'th.csv.away');
    renameSync(th, away);
    await s.conn.sendNotification('workspace/didChangeWatchedFiles', {
      changes: [{ uri: pathToFileURL(th).href, type: 3 }],
    });
    await s.waitForPush(note, (d) => d.diagnostics.some((x) => x.code === 'spectrum-missing'));
    const missing = ((s.pushed.get(note)?.diagnostics ?? []) as Diags).find((d) => d.code === 'spectrum-missing')!;
    assert.equal(missing.range.start.line, 8);
    assert.match(missing.message, /spectra\/th\.csv/);
    renameSync(away, th);
    await s.conn.sendNotification('workspace/didChangeWatchedFiles', {
      changes: [{ uri: pathToFileURL(th).href, type: 1 }],
    });
    await s.waitForPush(note, (d) => d.diagnostics.length === 0);
    assert.match(await hoverAt(8, 20), /\| integral \| 10\.00 \(y × ppm\)/);
  });

  it('a malformed file is a diagnostic with its line; the server keeps serving', async () => {
    writeFileSync(join(dir, 'spectra', 'th.csv'), 'ppm,intensity\n1,2\nnot a number\n');
    await s.conn.sendNotification('workspace/didChangeWatchedFiles', {
      changes: [{ uri: pathToFileURL(join(dir, 'spectra', 'th.csv')).href, type: 2 }],
    });
    await s.waitForPush(note, (d) => d.diagnostics.some((x) => x.code === 'spectrum-malformed'));
    const bad = ((s.pushed.get(note)?.diagnostics ?? []) as Diags).find((d) => d.code === 'spectrum-malformed')!;
    assert.match(bad.message, /line 3/);
    assert.match(await hoverAt(7, 30), /2500/);
  });

  it('a path leaving the workspace is refused unread', async () => {
    const text = NOTE_TEXT.replace('spectra/hp.csv', '../../../etc/passwd');
    await s.conn.sendNotification('textDocument/didChange', {
      textDocument: { uri: note, version: 2 },
      contentChanges: [{ text }],
    });
    await s.waitForPush(note, (d) => d.version === 2);
    assert.ok(codes().includes('spectrum-outside'), JSON.stringify(codes()));
  });
});

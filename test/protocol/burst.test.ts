import { strict as assert } from 'node:assert';
import { generateNote } from '../../bench/note';
import { Analyzer, LineIndex, RunBook } from '../../src/core';
import { SERVER_LIMITS } from '../../src/server/notes';
import { AnalysisStatsRequest, MemoryRequest } from '../../src/shared/protocol';
import { startLsp, type LspSession } from './lspClient';

// A burst of 1,000 didChange notifications, as fast as the pipe takes them,
// on the 2,000-run notebook of the benchmarks (bench/note.ts), against the
// bundled server over stdio. Every 10th change is followed by a hover that
// is not awaited, as an editor asks while the user types, so many versions
// are analysed on the way.
const URI = 'file:///notes/burst.md';
const NOTE = generateNote({ blocks: 2000 });
const EDITS = 1000;

type Range = { start: { line: number; character: number }; end: { line: number; character: number } };
type Diag = { code?: string | number; range: Range; message: string };

/** The id line of each block: the burst rewrites its last character. */
const ID_LINES: number[] = new Analyzer().analyzeText(NOTE).blocks.map((b) => b.block.bodyLine);
const FINAL_FIELD = 'field: 7.05 MT';

/** Applies the burst to `text` locally, the way the server should see it; also returns the changes. */
function burst(text: string): { finalText: string; changes: { range: Range; text: string }[] } {
  const changes: { range: Range; text: string }[] = [];
  // Every change replaces one character within a line, so lines keep their places.
  const lines = text.split('\n');
  for (let i = 0; i < EDITS; i++) {
    const line = ID_LINES[(i * 37) % 100]!;
    const character = lines[line]!.length - 1;
    const change = {
      range: { start: { line, character }, end: { line, character: character + 1 } },
      text: String(Math.floor(i / 100) % 10),
    };
    changes.push(change);
    lines[line] = lines[line]!.slice(0, character) + change.text;
  }
  // The last change turns the field of the first block (a spin block) into a wrong-case unit.
  const fieldLine = ID_LINES[0]! + 2;
  assert.match(lines[fieldLine]!, /^field: /);
  changes.push({
    range: { start: { line: fieldLine, character: 0 }, end: { line: fieldLine, character: lines[fieldLine]!.length } },
    text: FINAL_FIELD,
  });
  lines[fieldLine] = FINAL_FIELD;
  return { finalText: lines.join('\n'), changes };
}

/**
 * The diagnostics the server must end with: those of the final text, analysed here with the server's bounds and,
 * as the server does, with the workspace's runs (this one note: its repeated ids are `id-duplicate`).
 */
function expectedDiagnostics(text: string): string[] {
  const lines = new LineIndex(text);
  const analyzer = new Analyzer({ limits: SERVER_LIMITS });
  const book = new RunBook({ analyzer });
  book.setNote(URI, text);
  const report = analyzer.analyzeText(text, book.externalsFor(URI));
  const out = report.problems.map((p) => `${p.code}@${lines.positionAt(p.span.start).line}`);
  for (const b of report.blocks)
    for (const p of b.problems)
      out.push(`${p.code}@${lines.positionAt(p.span.start).line}:${lines.positionAt(p.span.start).character}`);
  return out;
}

function summary(diags: readonly Diag[]): string[] {
  return diags.map((d) =>
    d.code === 'note-bounded'
      ? `${d.code}@${d.range.start.line}`
      : `${d.code}@${d.range.start.line}:${d.range.start.character}`,
  );
}

async function sendBurst(s: LspSession, changes: { range: Range; text: string }[], hovers: boolean): Promise<number> {
  let version = 1;
  const pending: Promise<unknown>[] = [];
  for (const [i, change] of changes.entries()) {
    version++;
    void s.conn.sendNotification('textDocument/didChange', {
      textDocument: { uri: URI, version },
      contentChanges: [change],
    });
    if (hovers && i % 10 === 9)
      pending.push(
        s.conn.sendRequest('textDocument/hover', {
          textDocument: { uri: URI },
          position: { line: change.range.start.line, character: 1 },
        }),
      );
  }
  await Promise.all(pending);
  return version;
}

describe('language server under a burst of edits', function () {
  this.timeout(180000);
  const { finalText, changes } = burst(NOTE);
  const expected = expectedDiagnostics(finalText);

  it('has a final text that differs from the note and carries the wrong-case unit', () => {
    assert.notEqual(finalText, NOTE);
    assert.ok(
      expected.some((e) => e.startsWith('unit-case@')),
      expected.join(', '),
    );
  });

  it('ends with pulled diagnostics for the final text only, and its memory back near its baseline', async () => {
    const s = await startLsp({ pull: true, execArgv: ['--expose-gc'] });
    try {
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri: URI, languageId: 'markdown', version: 1, text: NOTE },
      });
      await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } });
      const baseline = await s.conn.sendRequest(MemoryRequest);
      assert.ok(baseline.collected, 'the server was started with --expose-gc, so it collects before measuring');

      const version = await sendBurst(s, changes, true);
      const r = (await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } })) as {
        items: Diag[];
      };
      assert.deepEqual(summary(r.items), expected);
      const stats = await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI });
      assert.equal(stats?.version, version, 'the latest analysis is of the final version');

      // Generous tolerance: 1.5 × the baseline heap. A cached block body that kept its
      // version of the 1 MB note alive would add about 100 MB here (100 analysed versions).
      const after = await s.conn.sendRequest(MemoryRequest);
      const mb = (x: number): string => `${(x / 1e6).toFixed(1)} MB`;
      assert.ok(
        after.heapUsed <= 1.5 * baseline.heapUsed,
        `heap ${mb(after.heapUsed)} after the burst, baseline ${mb(baseline.heapUsed)}`,
      );
    } finally {
      await s.close();
    }
  });

  it('pushes diagnostics last for the final version, matching the final text', async () => {
    const s = await startLsp({ pull: false });
    try {
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri: URI, languageId: 'markdown', version: 1, text: NOTE },
      });
      await s.waitForPush(URI, (d) => d.version === 1);
      const version = await sendBurst(s, changes, false);
      await s.waitForPush(URI, (d) => d.version === version);
      // Nothing older may arrive after it: wait three push delays (the server's is 200 ms) and look again.
      await new Promise((resolve) => setTimeout(resolve, 600));
      const last = s.pushed.get(URI)!;
      assert.equal(last.version, version);
      assert.deepEqual(summary(last.diagnostics as Diag[]), expected);
    } finally {
      await s.close();
    }
  });
});

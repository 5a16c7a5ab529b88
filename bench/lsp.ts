/**
 * The language server over stdio (dist/server.js, spawned as any editor
 * would, with the protocol tests' client): start-up to the `initialize`
 * answer, and hover and inlay-hint latency on the benchmark note right
 * after an edit, beside a no-op request on the same connection.
 *
 * Each measured request follows its own `didChange` (one character of one
 * block, a different block each time), so its latency includes applying the
 * edit and re-analysing the note; the no-op (`boltzmark/analysisStats`,
 * which only reads a map) follows an edit too, so the ratio is what the
 * analysis and the feature add to the round trip.
 */
import { Analyzer, LineIndex } from '../src/core';
import { AnalysisStatsRequest } from '../src/shared/protocol';
import { startLsp, type LspSession } from '../test/protocol/lspClient';
import { benchNote } from './core';
import { median, now, quantile } from './stats';

/** Latency summary of one request kind, ms. */
export interface Latency {
  readonly p50: number;
  readonly p95: number;
}

/** What {@link measureLsp} reports. */
export interface LspFigures {
  readonly startMs: number;
  readonly openMs: number;
  readonly hover: Latency;
  readonly inlayHints: Latency;
  readonly noop: Latency;
  readonly samples: number;
}

const URI = 'file:///bench/notebook.md';

async function timed<T>(fn: () => Promise<T>): Promise<number> {
  const start = now();
  await fn();
  return now() - start;
}

/** Spawns the server `starts` times for the start-up figure, then runs `samples` edits per request kind. */
export async function measureLsp(starts: number, samples: number): Promise<LspFigures> {
  const startMs: number[] = [];
  for (let i = 0; i < starts; i++) {
    const t = now();
    const s = await startLsp({ pull: true });
    startMs.push(now() - t);
    await s.close();
  }

  const note = benchNote();
  const lines = new LineIndex(note);
  // Where each block's id line ends: the edit replaces its last digit, the hover points at its key.
  const blocks = new Analyzer().analyzeText(note).blocks;
  const s: LspSession = await startLsp({ pull: true });
  try {
    let version = 1;
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: URI, languageId: 'markdown', version, text: note },
    });
    const openMs = await timed(() =>
      s.conn.sendRequest('textDocument/hover', {
        textDocument: { uri: URI },
        position: { line: blocks[0]!.block.bodyLine, character: 1 },
      }),
    );

    let next = 0;
    /** Changes one character of a fresh block; returns the block's id line. */
    const edit = async (): Promise<number> => {
      const b = blocks[(next++ * 97 + 13) % blocks.length]!;
      const idLine = b.block.bodyLine;
      const end = lines.lineEnd(idLine);
      const character = end - lines.lineStart(idLine) - 1;
      version++;
      await s.conn.sendNotification('textDocument/didChange', {
        textDocument: { uri: URI, version },
        contentChanges: [
          {
            range: { start: { line: idLine, character }, end: { line: idLine, character: character + 1 } },
            text: String(version % 10),
          },
        ],
      });
      return idLine;
    };
    const hover: number[] = [];
    const hints: number[] = [];
    const noop: number[] = [];
    for (let i = 0; i < samples; i++) {
      let line = await edit();
      hover.push(
        await timed(() =>
          s.conn.sendRequest('textDocument/hover', { textDocument: { uri: URI }, position: { line, character: 1 } }),
        ),
      );
      line = await edit();
      // The visible part of the note around the edit: one screen of 60 lines.
      const range = { start: { line: Math.max(0, line - 30), character: 0 }, end: { line: line + 30, character: 0 } };
      hints.push(
        await timed(() => s.conn.sendRequest('textDocument/inlayHint', { textDocument: { uri: URI }, range })),
      );
      await edit();
      noop.push(await timed(() => s.conn.sendRequest(AnalysisStatsRequest, { uri: URI })));
    }
    const summary = (xs: number[]): Latency => ({ p50: quantile(xs, 0.5), p95: quantile(xs, 0.95) });
    return {
      startMs: median(startMs),
      openMs,
      hover: summary(hover),
      inlayHints: summary(hints),
      noop: summary(noop),
      samples,
    };
  } finally {
    await s.close();
  }
}

/**
 * The language server on notes of growing size (issue 18), each in a fresh
 * server process spawned over stdio as an editor would:
 *
 * - edit → fresh diagnostics: one character typed at the end of a block's
 *   id line (and, the next time, taken back: the note's length changes with
 *   every edit, as with typing), then the pulled diagnostics of that version;
 *   p50 / p95 per size, and the p95 on the largest note over the p95 on the
 *   smallest;
 * - open: from `didOpen` to the complete diagnostics of the note;
 * - first hover right after `didOpen` (on a block in the middle of the note,
 *   before its whole analysis), against a warm hover plus the reading of
 *   that one block (measured here, in this process, on a fresh Analyzer);
 *   (after another note was read in the same server, so its compiled code is warm);
 * - memory: the server's peak resident set (VmHWM of /proc, Linux) and its
 *   heap after a full collection, per size; bytes per block.
 */
import { readFileSync } from 'node:fs';
import { Analyzer, LineIndex } from '../src/core';
import { AnalysisStatsRequest, MemoryRequest } from '../src/shared/protocol';
import { startLsp } from '../test/protocol/lspClient';
import { generateNote } from './note';
import { median, now, quantile } from './stats';

/** Figures of one note size. */
export interface SizeFigures {
  readonly blocks: number;
  readonly megabytes: number;
  readonly edit: { readonly p50: number; readonly p95: number };
  /** Blocks in the server's whole analysis of the note (every one: no cap). */
  readonly servedBlocks: number;
  readonly openMs: number;
  /** From `didOpen` sent to a no-op answered after it: the note's transfer and the server taking it. */
  readonly takenMs: number;
  readonly firstHoverMs: number;
  readonly warmHoverMs: number;
  readonly oneBlockMs: number;
  readonly peakRssBytes: number | null;
  readonly heapBytes: number;
}

const URI = 'file:///bench/large.md';

/** Peak resident set of a process from /proc (null where there is none). */
function peakRss(pid: number | undefined): number | null {
  try {
    const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) * 1024 : null;
  } catch {
    return null;
  }
}

/** One note size in a fresh server: open, first hover, diagnostics, warm hovers, `samples` edits. */
export async function measureSize(blocks: number, samples: number): Promise<SizeFigures> {
  const note = generateNote({ blocks });
  const lines = new LineIndex(note);
  const report = new Analyzer().analyzeText(note);
  const middle = report.blocks[Math.floor(report.blocks.length / 2)]!;
  // One block read alone, in a fresh Analyzer: the least a first hover on it can cost.
  const oneBlock: number[] = [];
  for (let i = 0; i < 5; i++) {
    const a = new Analyzer();
    const t = now();
    a.analyseBody(middle.block.body);
    oneBlock.push(now() - t);
  }
  const s = await startLsp({ pull: true, execArgv: ['--expose-gc'] });
  try {
    const hover = (line: number): Promise<unknown> =>
      s.conn.sendRequest('textDocument/hover', { textDocument: { uri: URI }, position: { line, character: 1 } });
    const diagnostics = (): Promise<unknown> =>
      s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } });
    // Another note first, read whole, as an editor that has been open a while has: the engine's compiled code is
    // then warm, and the first hover below measures the server's work, not the first compilation of the readers.
    const warmUri = 'file:///bench/other.md';
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: warmUri, languageId: 'markdown', version: 1, text: generateNote({ blocks: 300 }) },
    });
    await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: warmUri } });
    await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri: warmUri } });
    // Three opens of the note under three names, each a note this server has not analysed: the first hover after
    // each (the median of three is reported), and for the first, from `didOpen` to its complete diagnostics. The
    // later two find the block bodies cached by the first, which saves the reading of one block, a twentieth of a
    // millisecond, for the hover; the open figure is the first's, read from nothing.
    const firstHovers: number[] = [];
    let openMs = NaN;
    let takenMs = NaN;
    for (const uri of ['file:///bench/copy1.md', 'file:///bench/copy2.md', URI]) {
      const t0 = now();
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri, languageId: 'markdown', version: 1, text: note },
      });
      // A no-op answered: the server has taken the note (its transfer, parse, line index and fence scan).
      await s.conn.sendRequest(AnalysisStatsRequest, { uri });
      if (uri !== URI) takenMs = now() - t0;
      const t = now();
      await s.conn.sendRequest('textDocument/hover', {
        textDocument: { uri },
        position: { line: middle.block.bodyLine, character: 1 },
      });
      firstHovers.push(now() - t);
      if (uri === URI) continue;
      if (Number.isNaN(openMs)) {
        await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } });
        openMs = now() - t0;
      }
      await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri } });
    }
    const firstHoverMs = median(firstHovers);
    await diagnostics();
    const servedBlocks = (await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI }))?.blocks ?? 0;
    const warm: number[] = [];
    for (let i = 0; i < 9; i++) {
      const t = now();
      await hover(report.blocks[(i * 131 + 7) % report.blocks.length]!.block.bodyLine);
      warm.push(now() - t);
    }
    let version = 1;
    const edits: number[] = [];
    for (let i = 0; i < samples; i++) {
      // Pairs of edits in one block: a character typed at the end of its id line, then taken back.
      const b = report.blocks[(Math.floor(i / 2) * 97 + 13) % report.blocks.length]!;
      const idLine = b.block.bodyLine;
      const character = lines.lineEnd(idLine) - lines.lineStart(idLine);
      const typed = i % 2 === 0;
      version++;
      const t = now();
      await s.conn.sendNotification('textDocument/didChange', {
        textDocument: { uri: URI, version },
        contentChanges: [
          {
            range: typed
              ? { start: { line: idLine, character }, end: { line: idLine, character } }
              : { start: { line: idLine, character }, end: { line: idLine, character: character + 1 } },
            text: typed ? String(version % 10) : '',
          },
        ],
      });
      await diagnostics();
      edits.push(now() - t);
    }
    const memory = await s.conn.sendRequest(MemoryRequest);
    return {
      blocks: report.blocks.length,
      megabytes: note.length / 1e6,
      edit: { p50: quantile(edits, 0.5), p95: quantile(edits, 0.95) },
      servedBlocks,
      openMs,
      takenMs,
      firstHoverMs,
      warmHoverMs: median(warm),
      oneBlockMs: median(oneBlock),
      peakRssBytes: peakRss(s.proc.pid),
      heapBytes: memory.heapUsed,
    };
  } finally {
    await s.close();
  }
}

/** The sizes of issue 18: 250, 4,000 and 16,000 blocks. */
export async function measureScale(samples: number): Promise<SizeFigures[]> {
  const out: SizeFigures[] = [];
  for (const blocks of [250, 4000, 16_000]) out.push(await measureSize(blocks, samples));
  return out;
}

// `node --import tsx bench/scale.ts` prints the figures alone.
if (process.argv[1]?.endsWith('scale.ts'))
  void measureScale(Number(process.argv[2] ?? 40)).then((x) => console.log(JSON.stringify(x, null, 2)));

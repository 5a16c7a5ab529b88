/**
 * The language server on notes of growing size (issue 18), in server
 * processes spawned over stdio as an editor would, each first warmed on
 * another note (read whole and hovered, so that the compiled code of the
 * readers and of the hover is warm as in an editor open a while):
 *
 * - in one server, the note opened once: from `didOpen` to a no-op answered
 *   (the note taken) and to its complete diagnostics; then edit → fresh
 *   diagnostics: one character typed at the end of a block's id line (and,
 *   the next time, taken back: the note's length changes with every edit, as
 *   with typing), then the pulled diagnostics of that version; p50 / p95 per
 *   size, and the p95 on the largest note over the p95 on the smallest; the
 *   server's peak resident set (VmHWM of /proc, Linux) and its heap after a
 *   full collection, per size; bytes per block;
 * - in another server, the hovers: the first hover right after `didOpen` (on
 *   a block in the middle of the note, before its whole analysis; the median
 *   of five opens under five names), against a warm hover (the median of 25,
 *   once the note is analysed) plus the reading of that one block as the
 *   server reads it (measured here, in this process, on a fresh Analyzer with
 *   a book of runs that has just indexed the note, so with the caches as
 *   taking the note left them); and a hover 300 ms after the open, while the
 *   note is still read in slices (reported).
 */
import { readFileSync } from 'node:fs';
import { Analyzer, LineIndex, RunBook, type BlockReport, type DocumentReport } from '../src/core';
import { AnalysisStatsRequest, MemoryRequest } from '../src/shared/protocol';
import { startLsp, type LspSession } from '../test/protocol/lspClient';
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
  /** A hover 300 ms after an open, on another block, while the note is read in slices (median). */
  readonly readingHoverMs: number;
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
  const other = report.blocks[Math.floor(report.blocks.length / 3)]!;
  // One block read alone as the server reads it right after an open: in a fresh Analyzer, with a book of runs that
  // has just indexed the note (its id is looked up among the runs, as for every block with an id), so with the
  // processor's caches as taking the note left them. The median of five; the same body read again at once costs
  // about a fifth of that, which is not what a first hover meets.
  const oneBlock: number[] = [];
  for (let i = 0; i < 5; i++) {
    const book = new RunBook();
    book.setNote(URI, note);
    const a = new Analyzer();
    const t = now();
    a.analyseBody(middle.block.body, book.externalsFor(URI));
    oneBlock.push(now() - t);
  }
  const hovers = await measureHovers(note, report, middle, other);
  const s = await startLsp({ pull: true, execArgv: ['--expose-gc'] });
  try {
    const diagnostics = (): Promise<unknown> =>
      s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } });
    await warmUp(s);
    // The note opened once in this server: from `didOpen` to a no-op answered (the note taken: its transfer,
    // parse, pieces, fence scan and the book of runs' index of it), and to its complete diagnostics.
    const t0 = now();
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: URI, languageId: 'markdown', version: 1, text: note },
    });
    await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI });
    const takenMs = now() - t0;
    await diagnostics();
    const openMs = now() - t0;
    const servedBlocks = (await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI }))?.blocks ?? 0;
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
      ...hovers,
      oneBlockMs: median(oneBlock),
      peakRssBytes: peakRss(s.proc.pid),
      heapBytes: memory.heapUsed,
    };
  } finally {
    await s.close();
  }
}

/**
 * Another note first, read whole and hovered on every one of its 300 blocks (of every form), as in an editor that
 * has been open a while: the engine's compiled code of the readers and of the hover is then warm, and what follows
 * measures the server's work, not its first compilation. (Hovered on 20 blocks only, the hover's code was still
 * being compiled when the hovers below came: the first hover after an open took about 2.6–3.1 ms against
 * 1.6–2.0 ms after 300, on the same build.) The note is closed again and the server left to settle.
 */
async function warmUp(s: LspSession): Promise<void> {
  const uri = 'file:///bench/other.md';
  const text = generateNote({ blocks: 300 });
  await s.conn.sendNotification('textDocument/didOpen', {
    textDocument: { uri, languageId: 'markdown', version: 1, text },
  });
  await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } });
  for (const b of new Analyzer().analyzeText(text).blocks)
    await s.conn.sendRequest('textDocument/hover', {
      textDocument: { uri },
      position: { line: b.block.bodyLine, character: 1 },
    });
  await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri } });
  await settle(s);
}

/**
 * What the server does after a note closes (its file read again, the notes that used its runs published again,
 * after PUSH_DELAY_MS) is over before the next open: the first hover after it measures that open alone.
 */
async function settle(s: LspSession): Promise<void> {
  await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI });
  await new Promise((resolve) => setTimeout(resolve, 400));
}

/**
 * The hovers, in a server of their own: five opens of the note under five names, each a note this server has not
 * analysed, and the first hover after each (the median of five). The later ones find the block bodies cached by
 * the earlier, but a block with an id is read again in each note (its id is looked up among the runs of that
 * note), so the hover reads its block as the first did. After all but the first, a second hover 300 ms after the
 * open, on another block, while the note is read in slices. The last stays open and is read whole: the warm
 * hovers (the median of 25) are on it.
 */
async function measureHovers(
  note: string,
  report: DocumentReport,
  middle: BlockReport,
  other: BlockReport,
): Promise<Pick<SizeFigures, 'firstHoverMs' | 'readingHoverMs' | 'warmHoverMs'>> {
  const s = await startLsp({ pull: true });
  try {
    const hover = (line: number, uri: string): Promise<unknown> =>
      s.conn.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line, character: 1 } });
    await warmUp(s);
    const firstHovers: number[] = [];
    const readingHovers: number[] = [];
    const copies = [1, 2, 3, 4, 5].map((k) => `file:///bench/copy${k}.md`);
    const last = copies[copies.length - 1]!;
    for (const uri of copies) {
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri, languageId: 'markdown', version: 1, text: note },
      });
      // A no-op answered: the server has taken the note.
      await s.conn.sendRequest(AnalysisStatsRequest, { uri });
      const t = now();
      await hover(middle.block.bodyLine, uri);
      firstHovers.push(now() - t);
      if (uri !== copies[0]) {
        await new Promise((resolve) => setTimeout(resolve, 300));
        const t2 = now();
        await hover(other.block.bodyLine, uri);
        readingHovers.push(now() - t2);
      }
      if (uri === last) break;
      await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri } });
      await settle(s);
    }
    await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: last } });
    const warm: number[] = [];
    for (let i = 0; i < 25; i++) {
      const t = now();
      await hover(report.blocks[(i * 131 + 7) % report.blocks.length]!.block.bodyLine, last);
      warm.push(now() - t);
    }
    return { firstHoverMs: median(firstHovers), readingHoverMs: median(readingHovers), warmHoverMs: median(warm) };
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

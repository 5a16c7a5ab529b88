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
 *   before its whole analysis; the median of five opens), against a warm
 *   hover (the median of 25, once the note is analysed) plus the reading of
 *   that one block as the server reads it (measured here, in this process, on
 *   a fresh Analyzer with a book of runs that has just indexed the note, so
 *   with the caches as taking the note left them); all after another
 *   note was read and hovered in the same server, so that the compiled code
 *   of the readers and of the hover is warm as in an editor open a while;
 * - a hover 300 ms after the open, while the note is still read in slices
 *   (reported);
 * - memory: the server's peak resident set (VmHWM of /proc, Linux) and its
 *   heap after a full collection, per size; bytes per block.
 */
import { readFileSync } from 'node:fs';
import { Analyzer, LineIndex, RunBook } from '../src/core';
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
  const s = await startLsp({
    pull: true,
    execArgv: ['--expose-gc'],
  });
  try {
    const hover = (line: number, uri = URI): Promise<unknown> =>
      s.conn.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line, character: 1 } });
    // What the server does after a note closes (its file read again, the notes that used its runs published
    // again, after PUSH_DELAY_MS) is over before the next open: the first hover below measures the open alone.
    const settle = async (): Promise<void> => {
      await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI });
      await new Promise((resolve) => setTimeout(resolve, 400));
    };
    const diagnostics = (): Promise<unknown> =>
      s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: URI } });
    // Another note first, read whole, as an editor that has been open a while has: the engine's compiled code is
    // then warm, and the first hover below measures the server's work, not the first compilation of the readers.
    const warmUri = 'file:///bench/other.md';
    const warmNote = generateNote({ blocks: 300 });
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: warmUri, languageId: 'markdown', version: 1, text: warmNote },
    });
    await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: warmUri } });
    // and hovered on blocks of every form, so that the hover's own code is compiled too
    for (const b of new Analyzer().analyzeText(warmNote).blocks.slice(0, 20)) await hover(b.block.bodyLine, warmUri);
    await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri: warmUri } });
    await settle();
    // Five opens of the note under five names, each a note this server has not analysed: the first hover after
    // each (the median of five is reported), and for the first, from `didOpen` to its complete diagnostics. The
    // later ones find the block bodies cached by the first, but a block with an id is read again in each note (its
    // id is looked up among the runs of that note), so the hover reads its block as the first did. After the later
    // ones, a second hover 300 ms after the open, on another block, while the note is being read in slices.
    const firstHovers: number[] = [];
    const readingHovers: number[] = [];
    let openMs = NaN;
    let takenMs = NaN;
    const copies = [1, 2, 3, 4].map((k) => `file:///bench/copy${k}.md`);
    for (const uri of [...copies, URI]) {
      const t0 = now();
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri, languageId: 'markdown', version: 1, text: note },
      });
      // A no-op answered: the server has taken the note (its transfer, parse, line index and fence scan).
      await s.conn.sendRequest(AnalysisStatsRequest, { uri });
      if (uri === copies[0]) takenMs = now() - t0;
      const t = now();
      await hover(middle.block.bodyLine, uri);
      firstHovers.push(now() - t);
      if (Number.isNaN(openMs)) {
        await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } });
        openMs = now() - t0;
      } else {
        await new Promise((resolve) => setTimeout(resolve, 300));
        const t2 = now();
        await hover(other.block.bodyLine, uri);
        readingHovers.push(now() - t2);
      }
      if (uri === URI) break;
      await s.conn.sendNotification('textDocument/didClose', { textDocument: { uri } });
      await settle();
    }
    const firstHoverMs = median(firstHovers);
    await diagnostics();
    const servedBlocks = (await s.conn.sendRequest(AnalysisStatsRequest, { uri: URI }))?.blocks ?? 0;
    const warm: number[] = [];
    for (let i = 0; i < 25; i++) {
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
      readingHoverMs: median(readingHovers),
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

/**
 * Edit → hover latency on a block whose values come from a 1 M-point
 * spectrum file, through the bundled server over stdio: the file is parsed
 * once (in the server's worker thread) when the note is opened; every edit
 * after that re-reads the block from the parsed spectrum held in memory,
 * and the server's own count (`boltzmark/spectrumStats`) shows it was not
 * parsed again. Beside it, a no-op request after the same kind of edit.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { AnalysisStatsRequest, SpectrumStatsRequest } from '../src/shared/protocol';
import { startLsp } from '../test/protocol/lspClient';
import { now, quantile } from './stats';

/** What {@link measureSpectrumHover} reports. */
export interface SpectrumHoverFigures {
  readonly points: number;
  /** Open → the first hover that shows the integral (the one parse), ms. */
  readonly firstMs: number;
  readonly hover: { readonly p50: number; readonly p95: number };
  readonly noop: { readonly p50: number; readonly p95: number };
  /** Parses the server ran in all: 1 when the file was never parsed again. */
  readonly parses: number;
}

/** An invented spectrum: a Gaussian line at 171 ppm on a flat baseline, `n` points over 0 … 250 ppm. */
function spectrumText(n: number): string {
  const rows = new Array<string>(n + 1);
  rows[0] = 'ppm,intensity';
  for (let i = 0; i < n; i++) {
    const x = (250 * i) / (n - 1);
    rows[i + 1] = `${x.toFixed(6)},${(1000 * Math.exp(-((x - 171) ** 2) / 2) + ((i * 7919) % 13) / 13).toFixed(4)}`;
  }
  return rows.join('\n');
}

export async function measureSpectrumHover(points: number, samples: number): Promise<SpectrumHoverFigures> {
  const dir = mkdtempSync(join(tmpdir(), 'boltzmark-bench-spectrum-'));
  try {
    writeFileSync(join(dir, 'big.csv'), spectrumText(points));
    const lines = [
      '# Bench',
      '',
      '```levels',
      'id: big spectrum',
      'system: 13C',
      'field: 9.4 T',
      'lattice: 298.0 K',
      'signal:',
      '  hyperpolarized: { spectrum: big.csv, region: [168 ppm, 174 ppm], noise: [200 ppm, 230 ppm] }',
      '  thermal: { spectrum: big.csv, region: [168 ppm, 174 ppm], noise: [200 ppm, 230 ppm] }',
      '  scans: { hyperpolarized: 1, thermal: 64 }',
      '```',
      '',
    ];
    const uri = pathToFileURL(join(dir, 'note.md')).href;
    const s = await startLsp({ pull: true, workspaceFolders: [{ uri: pathToFileURL(dir).href, name: 'bench' }] });
    try {
      let version = 1;
      const t0 = now();
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri, languageId: 'markdown', version, text: lines.join('\n') },
      });
      const hoverText = async (): Promise<string> => {
        const h = (await s.conn.sendRequest('textDocument/hover', {
          textDocument: { uri },
          position: { line: 8, character: 30 },
        })) as { contents: { value: string } } | null;
        return h?.contents.value ?? '';
      };
      // Until the parse is done the reference is pending; round trips, no timer.
      while (!(await hoverText()).includes('| integral |')) {
        if (now() - t0 > 120_000) throw new Error('the spectrum was not read within two minutes');
        await s.conn.sendRequest(AnalysisStatsRequest, { uri });
      }
      const firstMs = now() - t0;
      const edit = async (): Promise<void> => {
        version++;
        // The lattice's last digit: the block is read again, from the spectrum already parsed.
        await s.conn.sendNotification('textDocument/didChange', {
          textDocument: { uri, version },
          contentChanges: [
            {
              range: { start: { line: 6, character: 14 }, end: { line: 6, character: 15 } },
              text: String(version % 10),
            },
          ],
        });
      };
      const hover: number[] = [];
      const noop: number[] = [];
      for (let i = 0; i < samples; i++) {
        await edit();
        let t = now();
        const v = await hoverText();
        hover.push(now() - t);
        if (!v.includes('| integral |')) throw new Error('the hover lost the integral after an edit');
        await edit();
        t = now();
        await s.conn.sendRequest(AnalysisStatsRequest, { uri });
        noop.push(now() - t);
      }
      const stats = await s.conn.sendRequest(SpectrumStatsRequest);
      const sum = (xs: number[]) => ({ p50: quantile(xs, 0.5), p95: quantile(xs, 0.95) });
      return { points, firstMs, hover: sum(hover), noop: sum(noop), parses: stats.parses };
    } finally {
      await s.close();
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

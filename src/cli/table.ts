/** The table for people of `boltzmark report`: the columns that fit the terminal, then each block's notes and problems. */
import { terminalText, spectraLines } from '../core';
import { TABLE_HEAD, tableCells, where, type Row } from './rows';
import { clip, textWidth, wrap } from './textWidth';

/**
 * How a narrow table makes room, step by step: move what follows T's value (its 95 % interval, kT) to an
 * indented line under the row, leave out β (T says the same), then P_th (a reference
 * value), then move ε and the measurement results to an indented line under their row, then shorten
 * long places and ids. Nothing but β and P_th is ever left out.
 */
const NARROWING = ['interval', 'beta', 'thermal', 'below', 'shorten'] as const;
/** Default width of the table when there is no terminal to ask: an ordinary terminal's 100 columns. */
export const DEFAULT_TABLE_WIDTH = 100;

/** How the human table is laid out. */
export interface TableOptions {
  /** Widest line allowed, in characters (the terminal's width, or {@link DEFAULT_TABLE_WIDTH}). */
  readonly width: number;
  /** Every column, whatever the width. */
  readonly wide: boolean;
}

/**
 * Human table: file:line, id, status, T, β, P, P_th, ε, and the measurement results with their
 * uncertainties; then each problem on its own line. Unless `wide`, columns are left out (β first, then
 * P_th, the measurement results, ε) and long places and ids shortened until a line fits `width`.
 */
export function formatTable(
  rows: readonly Row[],
  o: TableOptions = { width: DEFAULT_TABLE_WIDTH, wide: false },
): string {
  if (rows.length === 0) return 'No levels blocks found.\n';
  // Note text (file names, ids, messages quoting the note) without control characters: no escape sequences.
  const body = tableCells(rows, true).map((r) => r.map(terminalText));
  // P, P_th, ε and the measurement results are not printed when no row has a value there (emission
  // lines and radio transitions have no polarization): a column of dashes says nothing.
  let keep = TABLE_HEAD.map((_, i) => i).filter((i) => i < 5 || body.some((r) => r[i] !== '—' && r[i] !== ''));
  // A loop, not Math.max(...cells): a report of a few hundred thousand blocks would overflow the stack.
  const widthsOf = (cells: string[][], cols: number[]): number[] =>
    cols.map((i) => cells.reduce((w, r) => Math.max(w, textWidth(r[i])), textWidth(TABLE_HEAD[i])));
  const total = (cells: string[][], cols: number[]): number =>
    widthsOf(cells, cols).reduce((a, b) => a + b, 0) + 2 * (cols.length - 1);
  let cells = body;
  const dropped: string[] = [];
  let below = false;
  // T's interval and kT, when moved under the row (the `interval` step).
  let tailsOfT: string[] = cells.map(() => '');
  if (!o.wide) {
    for (const step of NARROWING) {
      const excess = total(cells, keep) - o.width;
      if (excess <= 0) break;
      if (step === 'interval') {
        tailsOfT = cells.map((r) => {
          const at = r[3].indexOf(' (');
          return at < 0 ? '' : r[3].slice(at + 1);
        });
        cells = cells.map((r) => r.map((c, i) => (i === 3 && c.includes(' (') ? c.slice(0, c.indexOf(' (')) : c)));
      } else if (step === 'beta' || step === 'thermal') {
        const col = step === 'beta' ? 4 : 6;
        if (!keep.includes(col)) continue;
        keep = keep.filter((k) => k !== col);
        dropped.push(TABLE_HEAD[col]);
      } else if (step === 'below') {
        keep = keep.filter((k) => k !== 7 && k !== 8);
        below = true;
      } else {
        // The place keeps its end (file name and line), the id its beginning.
        // Half the excess from each, as far as each can give (16 and 10 columns stay); what one cannot give, the
        // other gives.
        const [wWhere, wId] = widthsOf(cells, [0, 1]);
        const canWhere = Math.max(0, wWhere - 16);
        const canId = Math.max(0, wId - 10);
        const cutWhere = Math.min(canWhere, Math.max(Math.floor(excess / 2), excess - canId));
        const cutId = Math.min(canId, excess - cutWhere);
        const idMax = wId - cutId;
        const whereMax = wWhere - cutWhere;
        cells = cells.map((r) => r.map((c, i) => (i === 0 ? clip(c, whereMax, true) : i === 1 ? clip(c, idMax) : c)));
      }
    }
  }
  const widths = widthsOf(cells, keep);
  const line = (row: string[]): string =>
    keep
      .map((i, k) => row[i] + ' '.repeat(widths[k] - textWidth(row[i])))
      .join('  ')
      .trimEnd();
  const out = [line(TABLE_HEAD), line(TABLE_HEAD.map((_, i) => '-'.repeat(widths[keep.indexOf(i)] ?? 0)))];
  rows.forEach(({ entry, block }, i) => {
    out.push(line(cells[i]));
    const extra = [
      tailsOfT[i] !== '' ? `T ${tailsOfT[i]}` : '',
      ...(below ? [cells[i][7] !== '—' ? `ε = ${cells[i][7]}` : '', cells[i][8]] : []),
    ].filter((x) => x !== '');
    if (extra.length) out.push(`    ${extra.join(' · ')}`);
    // Values taken from spectrum files, each marked and named with its file and region.
    if (block)
      for (const s of spectraLines(block.meta)) {
        const text = terminalText(`    ${s}`);
        out.push(...(o.wide ? [text] : wrap(text, o.width, '        ')));
      }
    for (const d of entry.diagnostics) {
      const text = terminalText(`    ${where(entry, d.line)}:${d.column}: ${d.severity} ${d.code}: ${d.message}`);
      out.push(...(o.wide ? [text] : wrap(text, o.width, '        ')));
    }
  });
  if (dropped.length) out.push(`(${dropped.join(', ')} left out to fit ${o.width} columns; --wide shows every column)`);
  return out.join('\n') + '\n';
}

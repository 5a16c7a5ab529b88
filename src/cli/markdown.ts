/** The Markdown format of `boltzmark report`: a results table to paste into a summary note. */
import { markdownCode, markdownText } from '../core';
import { TABLE_HEAD, tableCells, where, type Row } from './rows';

/**
 * A Markdown results table, to paste into a summary note. The cells that come
 * from the note (the file name and the block id) are literal text: the file
 * and line in a code span that no backtick in the name can close, the id with
 * every Markdown character escaped. The other cells are Boltzmark's own
 * numbers and words.
 */
export function formatMarkdown(rows: readonly Row[]): string {
  if (rows.length === 0) return '_No levels blocks found._\n';
  const [head, cells] = withoutEmptyColumns(TABLE_HEAD, tableCells(rows, true));
  const out = [`| ${head.join(' | ')} |`, `| ${head.map(() => '---').join(' | ')} |`];
  cells.forEach((c, i) => {
    const e = rows[i]!.entry;
    const id = e.id === null ? c[1]! : markdownText(e.id);
    // The numbers are Boltzmark's own, but `|T| ≥ …` holds the table's cell separator.
    const rest = c.slice(2).map((x) => x.replace(/\|/g, '\\|'));
    out.push(`| ${markdownCode(where(e, e.line))} | ${id} | ${rest.join(' | ')} |`);
  });
  return out.join('\n') + '\n';
}

/**
 * Leaves out the P, P_th, ε and "also" columns when no row has a value there
 * (emission lines and radio transitions have no polarization): a column of
 * dashes says nothing.
 */
function withoutEmptyColumns(head: readonly string[], body: readonly string[][]): [string[], string[][]] {
  const optional = new Set(['P', 'P_th', 'ε', 'also']);
  const keep = head.map((h, i) => !optional.has(h) || body.some((r) => r[i] !== '—' && r[i] !== ''));
  return [head.filter((_, i) => keep[i]), body.map((r) => r.filter((_, i) => keep[i]))];
}

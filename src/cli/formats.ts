/** The output formats of `boltzmark report`: a table for people, JSON (the contract), CSV and Markdown. */
import {
  csvText,
  markdownCode,
  markdownText,
  terminalText,
  measurementShort,
  betaText,
  enhancementText,
  fractionText,
  linesCsv,
  withoutSymbol,
  polarizationText,
  temperatureIntervalText,
  type ReportEntry,
  type BlockReport,
  DEFAULT_DISPLAY,
} from '../core';

/** A block with its report entry, for the formatters. */
export interface Row {
  readonly entry: ReportEntry;
  /** Null for a file that could not be read (its entry says why). */
  readonly block: BlockReport | null;
}

/** Human table: file:line, id, status, T, β, P, P_th, ε; then each problem on its own line. */
export function formatTable(rows: readonly Row[]): string {
  if (rows.length === 0) return 'No levels blocks found.\n';
  const [head, cells] = withoutEmptyColumns(TABLE_HEAD, tableCells(rows));
  // Note text (file names, ids, messages quoting the note) without control characters: no escape sequences.
  const body = cells.map((r) => r.map(terminalText));
  const width = (s: string): number => [...s].length;
  // A loop, not Math.max(...cells): a report of a few hundred thousand blocks would overflow the stack.
  const widths = head.map((h, i) => body.reduce((w, r) => Math.max(w, width(r[i]!)), width(h)));
  const line = (cells: string[]): string =>
    cells
      .map((c, i) => c + ' '.repeat(widths[i] - width(c)))
      .join('  ')
      .trimEnd();
  const out = [line(head), line(widths.map((w) => '-'.repeat(w)))];
  rows.forEach(({ entry }, i) => {
    out.push(line(body[i]));
    for (const d of entry.diagnostics)
      out.push(terminalText(`    ${where(entry, d.line)}:${d.column}: ${d.severity} ${d.code}: ${d.message}`));
  });
  return out.join('\n') + '\n';
}

/** The JSON array of the contract, two-space indented. */
export function formatJson(rows: readonly Row[]): string {
  return (
    JSON.stringify(
      rows.map((r) => r.entry),
      null,
      2,
    ) + '\n'
  );
}

const CSV_HEAD = [
  'file',
  'line',
  'id',
  'status',
  'beta',
  'beta_uncertainty',
  'temperature',
  'temperature_uncertainty',
  'polarization',
  'polarization_uncertainty',
  'thermal_polarization',
  'enhancement',
  'entropy',
  'errors',
  'warnings',
  'beta_low_95',
  'beta_high_95',
  'temperature_low_95',
  'temperature_high_95',
  'polarization_low_95',
  'polarization_high_95',
];

/** CSV through the core's writer (RFC 4180, formula-guarded), full-precision numbers, empty cells for unknowns. */
export function formatCsv(rows: readonly Row[]): string {
  return csvText([
    CSV_HEAD,
    ...rows.map(({ entry: e }) => [
      e.file,
      e.line,
      e.id,
      e.status,
      e.beta?.value ?? null,
      e.beta?.uncertainty ?? null,
      e.temperature?.value ?? null,
      e.temperature?.uncertainty ?? null,
      e.polarization?.value ?? null,
      e.polarization?.uncertainty ?? null,
      e.thermalPolarization,
      e.enhancement,
      e.entropy,
      e.diagnostics.filter((d) => d.severity === 'error').length,
      e.diagnostics.filter((d) => d.severity === 'warning').length,
      e.beta?.interval?.[0] ?? null,
      e.beta?.interval?.[1] ?? null,
      e.temperature?.interval?.[0] ?? null,
      e.temperature?.interval?.[1] ?? null,
      e.polarization?.interval?.[0] ?? null,
      e.polarization?.interval?.[1] ?? null,
    ]),
  ]);
}

/**
 * A Markdown results table, to paste into a summary note. The cells that come
 * from the note (the file name and the block id) are literal text: the file
 * and line in a code span that no backtick in the name can close, the id with
 * every Markdown character escaped. The other cells are Boltzmark's own
 * numbers and words.
 */
export function formatMarkdown(rows: readonly Row[]): string {
  if (rows.length === 0) return '_No levels blocks found._\n';
  const [head, cells] = withoutEmptyColumns(TABLE_HEAD, tableCells(rows));
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

const TABLE_HEAD = ['where', 'id', 'status', 'T', 'β (K⁻¹)', 'P', 'P_th', 'ε', 'also'];

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

/** The per-line plot data of every block of lines as CSV (one row per line; formula-like text guarded). */
export function formatLinePoints(rows: readonly Row[]): string {
  return linesCsv(
    rows.flatMap(({ entry, block }) =>
      block ? [{ file: entry.file, line: entry.line, id: entry.id, results: block.results }] : [],
    ),
  );
}

/** The cells of one row per block: where, id, status, T, β, P, P_th, ε, and the other results. */
function tableCells(rows: readonly Row[]): string[][] {
  return rows.map(({ entry: e, block: b }) => {
    const r = b?.results ?? null;
    return [
      where(e, e.line),
      e.id ?? '—',
      e.status,
      r && (r.beta || r.limit) ? withoutSymbol(temperatureIntervalText(r)) : '—',
      r && (r.beta || r.limit) ? betaText(r).replace(/^β = /, '').replace(/ K⁻¹$/, '') : '—',
      r?.polarization ? polarizationText(r) : '—',
      r?.thermalPolarization != null
        ? fractionText(
            { value: r.thermalPolarization, uncertainty: r.uThermalPolarization },
            { ...DEFAULT_DISPLAY, digits: 3 },
          )
        : '—',
      r ? enhancementText(r.enhancement) : '—',
      r ? (measurementShort(r) ?? '') : '',
    ];
  });
}

/**
 * Where a line of a note is, as people and CI annotations read it: `file:line`, and for a notebook cell
 * `file, cell N:line` (the line counted in the cell, as the editor shows it there).
 */
export function where(e: Pick<ReportEntry, 'file' | 'cell'>, line: number): string {
  return e.cell === null ? `${e.file}:${line}` : `${e.file}, cell ${e.cell}:${line}`;
}

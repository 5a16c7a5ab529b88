/** The output formats of `boltzmark report`: a table for people, JSON (the contract), CSV and Markdown. */
import {
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
  readonly block: BlockReport;
}

/** Human table: file:line, id, status, T, β, P, P_th, ε; then each problem on its own line. */
export function formatTable(rows: readonly Row[]): string {
  if (rows.length === 0) return 'No levels blocks found.\n';
  const [head, body] = withoutEmptyColumns(TABLE_HEAD, tableCells(rows));
  const width = (s: string): number => [...s].length;
  const widths = head.map((h, i) => Math.max(width(h), ...body.map((r) => width(r[i]))));
  const line = (cells: string[]): string =>
    cells
      .map((c, i) => c + ' '.repeat(widths[i] - width(c)))
      .join('  ')
      .trimEnd();
  const out = [line(head), line(widths.map((w) => '-'.repeat(w)))];
  rows.forEach(({ entry }, i) => {
    out.push(line(body[i]));
    for (const d of entry.diagnostics)
      out.push(`    ${entry.file}:${d.line}:${d.column}: ${d.severity} ${d.code}: ${d.message}`);
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

function csvCell(v: string | number | null): string {
  if (v === null) return '';
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** CSV (RFC 4180) with full-precision numbers and empty cells for unknowns. */
export function formatCsv(rows: readonly Row[]): string {
  const lines = [CSV_HEAD.join(',')];
  for (const { entry: e } of rows) {
    lines.push(
      [
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
      ]
        .map(csvCell)
        .join(','),
    );
  }
  return lines.join('\r\n') + '\r\n';
}

/** Escapes text for a Markdown table cell (pipes, backslashes, HTML, line breaks). */
function mdCell(s: string): string {
  return s
    .replace(/\\/g, '\\\\')
    .replace(/\|/g, '\\|')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/[\r\n]+/g, ' ');
}

/** A Markdown results table, to paste into a summary note. */
export function formatMarkdown(rows: readonly Row[]): string {
  if (rows.length === 0) return '_No levels blocks found._\n';
  const [head, cells] = withoutEmptyColumns(TABLE_HEAD, tableCells(rows));
  const out = [`| ${head.join(' | ')} |`, `| ${head.map(() => '---').join(' | ')} |`];
  for (const c of cells) out.push(`| \`${mdCell(c[0])}\` | ${c.slice(1).map(mdCell).join(' | ')} |`);
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
    rows.map(({ entry, block }) => ({ file: entry.file, line: entry.line, id: entry.id, results: block.results })),
  );
}

/** The cells of one row per block: where, id, status, T, β, P, P_th, ε, and the other results. */
function tableCells(rows: readonly Row[]): string[][] {
  return rows.map(({ entry: e, block: b }) => {
    const r = b.results;
    return [
      `${e.file}:${e.line}`,
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

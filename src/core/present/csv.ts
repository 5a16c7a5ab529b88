/**
 * The one CSV writer of Boltzmark: the command line's `report --format csv`,
 * the run log's export and the curve view's export all write through it.
 *
 * Fields and records follow RFC 4180 §2: records end with CRLF (the last one
 * too), a field holding a double quote, a comma, a CR or an LF is enclosed in
 * double quotes, and a double quote inside is written twice. Numbers are plain
 * ASCII at full precision (`String(x)`, the shortest text that reads back as
 * the same double); an unknown or non-finite number is an empty field.
 *
 * Text may come from a note (a block's `id`, a file name), so it is guarded
 * against spreadsheet formula injection: a field that starts with `=`, `+`,
 * `-`, `@`, a tab or a carriage return gets a leading `'`, which spreadsheets
 * take as "this is text", unless the whole field is a plain decimal number
 * (`-3.5`, `+2e-7`), which a spreadsheet reads as that number and never as a
 * formula. The list of characters and the `'` are OWASP's advice ("CSV
 * Injection", owasp.org/www-community/attacks/CSV_Injection). Control
 * characters other than tab, CR and LF (RFC 4180's TEXTDATA has none; ESC
 * would drive a terminal the CSV is printed on) and the invisible characters
 * that reorder text are removed first.
 */
import { withoutControls } from './literal';
import { formatPlainNumber } from './numbers';

/** One field: text, a number, or null for an empty field. */
export type CsvField = string | number | null;

/** A decimal number as a spreadsheet reads it: sign, digits with an optional point, optional exponent. */
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/** What a spreadsheet may take as the start of a formula (OWASP, "CSV Injection"). */
const FORMULA_START = /^[=+\-@\t\r]/;

/** What makes RFC 4180 enclose a field in double quotes. */
const NEEDS_QUOTES = /[",\r\n]/;

/**
 * Text that a spreadsheet shows as it is: a leading `'` before a possible
 * formula, nothing added to a plain number or to other text.
 */
export function guardFormula(text: string): string {
  return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/** One field as CSV text: guarded, then quoted when RFC 4180 requires it. */
export function csvField(value: CsvField): string {
  if (value === null) return '';
  const text = typeof value === 'number' ? formatPlainNumber(value) : guardFormula(withoutControls(value));
  return NEEDS_QUOTES.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** The CSV text of the records (the first usually the header), CRLF after each. */
export function csvText(records: Iterable<readonly CsvField[]>): string {
  let out = '';
  for (const record of records) out += record.map(csvField).join(',') + '\r\n';
  return out;
}

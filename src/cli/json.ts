/** The JSON format of `boltzmark report` (the contract): the entries, with nothing a terminal would act on left raw. */
import type { Row } from './rows';

/**
 * Characters that JSON.stringify writes as they are but a terminal would act on or a display reorder: DEL and the
 * C1 controls U+007F–U+009F (U+009B is CSI, U+009D OSC on terminals that take 8-bit controls), the bidirectional
 * embeddings, overrides, isolates and marks of UAX #9 (U+061C, U+200E, U+200F, U+202A–U+202E, U+2066–U+2069), and
 * the line and paragraph separators U+2028, U+2029. JSON.stringify already escapes C0 (RFC 8259 §7).
 */
const JSON_UNSAFE = /[\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/**
 * JSON text with {@link JSON_UNSAFE} characters written as `\uXXXX` escapes (RFC 8259 §7): the same JSON value,
 * every string of the note kept whole, but nothing in the bytes for a terminal to run when the report is printed
 * on one. Such characters only ever stand inside strings, so escaping them everywhere is exact.
 */
export function jsonSafe(json: string): string {
  return json.replace(JSON_UNSAFE, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** One entry as it stands inside the JSON array of {@link formatJson} (two-space indented, no comma). */
export function jsonElement(entry: Row['entry']): string {
  const inArray = jsonSafe(JSON.stringify([entry], null, 2));
  return inArray.slice(2, -2); // drops "[\n" and "\n]"
}

/** The JSON array of the contract, two-space indented. */
export function formatJson(rows: readonly Row[]): string {
  return (
    jsonSafe(
      JSON.stringify(
        rows.map((r) => r.entry),
        null,
        2,
      ),
    ) + '\n'
  );
}

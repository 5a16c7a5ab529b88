/**
 * Structural checks for data that crosses the webview boundary. Messages
 * arrive as untyped JSON from the other side, so every field is checked
 * before the typed code sees it; a check never throws.
 */

/** A plain object (not null, not an array). */
export function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

/** A finite number. */
export function isFiniteNumber(x: unknown): x is number {
  return typeof x === 'number' && Number.isFinite(x);
}

/** A finite number or null. */
export function isNumberOrNull(x: unknown): x is number | null {
  return x === null || isFiniteNumber(x);
}

/** A non-negative safe integer. */
export function isCount(x: unknown): x is number {
  return typeof x === 'number' && Number.isSafeInteger(x) && x >= 0;
}

/** A string of at most `max` UTF-16 units (default 10 000). */
export function isText(x: unknown, max = 10_000): x is string {
  return typeof x === 'string' && x.length <= max;
}

/** An array of finite numbers, at most `max` long. */
export function isNumberArray(x: unknown, max = 1_000_000): x is number[] {
  return Array.isArray(x) && x.length <= max && x.every(isFiniteNumber);
}

/** An array whose items all pass `item`, at most `max` long. */
export function isArrayOf<T>(x: unknown, item: (y: unknown) => y is T, max = 10_000): x is T[] {
  return Array.isArray(x) && x.length <= max && x.every((y) => item(y));
}

/** One of the given string literals. */
export function isOneOf<T extends string>(x: unknown, values: readonly T[]): x is T {
  return typeof x === 'string' && (values as readonly string[]).includes(x);
}

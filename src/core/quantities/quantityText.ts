/**
 * The syntax of quantity strings: `"<number> [± <number>] [<unit>]"` read
 * into a value, an uncertainty and the unit as written, with the span of
 * each ({@link parseQuantity}); units are checked and converted in
 * units.ts. Numbers are JS-style decimals; `NaN`, `Infinity`, overflow and
 * decimal commas are refused with a problem, never an exception.
 */
import type { Replacement, Span } from '../types';

/** A problem in a quantity string; spans are offsets `[start, end)` within that string. */
export interface QuantityProblem {
  /** `number-invalid`, `uncertainty-negative`, `unit-missing`, `unit-case`, `unit-unknown` or `unit-dimension`. */
  readonly code: string;
  readonly message: string;
  readonly span: Span;
  /** A fix the user may choose, e.g. the intended unit. */
  readonly replacement?: Replacement;
}

/** A quantity as written (value and uncertainty not converted). */
export interface Quantity {
  readonly value: number;
  /** Standard uncertainty (1 σ) in the same unit, ≥ 0, or null. */
  readonly uncertainty: number | null;
  readonly unit: string | null;
  readonly valueSpan: Span;
  readonly uncertaintySpan: Span | null;
  readonly unitSpan: Span | null;
}

const NOT_A_NUMBER = /[+\-\u2212]?(?:nan|inf(?:inity)?)\b/iy;
const PLUS_MINUS = /±|\+\/-|\+-/y;

type Scanned = { value: number; span: Span; negative: boolean } | { problem: QuantityProblem };

/** A problem of a quantity string, as the readers of quantities return it. */
export function problem(
  code: string,
  message: string,
  span: Span,
  replacement?: Replacement,
): { problem: QuantityProblem } {
  return { problem: replacement ? { code, message, span, replacement } : { code, message, span } };
}

const SPACE = /\s/;

/** True for a character `\s` matches; ASCII is decided by its code, the rest by the pattern. */
function isSpace(c: number, ch: string): boolean {
  return c < 128 ? c === 32 || (c >= 9 && c <= 13) : SPACE.test(ch);
}

function skipSpace(text: string, i: number): number {
  while (i < text.length && isSpace(text.charCodeAt(i), text[i]!)) i++;
  return i;
}

/** Characters a `nan` or `inf` spelling can start with (an optional sign, then n or i in any case). */
function mayStartNotANumber(c: number): boolean {
  return c === 43 || c === 45 || c === 0x2212 || c === 78 || c === 110 || c === 73 || c === 105;
}

function isDigit(c: number): boolean {
  return c >= 48 && c <= 57;
}

/**
 * The UTF-16 code at `i`, or -1 past the end. Reading past the end with `charCodeAt` gives NaN, which compares the
 * same, but the engine's optimized code is thrown away the first time it happens at each place, and compiled again.
 */
function codeAt(text: string, i: number): number {
  return i < text.length ? text.charCodeAt(i) : -1;
}

/**
 * End of the decimal written at `start`, or -1 when there is none: what the
 * sticky pattern `[+−-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+−-]?\d+)?` would match
 * there (minus signs ASCII or U+2212), found by stepping over the characters,
 * which costs less than a regular expression on every number of every block.
 */
function endOfDecimal(text: string, start: number): number {
  let i = start;
  const sign = codeAt(text, i);
  if (sign === 43 || sign === 45 || sign === 0x2212) i++;
  const whole = i;
  while (isDigit(codeAt(text, i))) i++;
  if (codeAt(text, i) === 46 /* . */) {
    let j = i + 1;
    while (isDigit(codeAt(text, j))) j++;
    // `1.` and `.5` are numbers, a point alone is not.
    if (i === whole && j === i + 1) return -1;
    i = j;
  } else if (i === whole) {
    return -1;
  }
  const e = codeAt(text, i);
  if (e === 101 || e === 69) {
    let k = i + 1;
    const s = codeAt(text, k);
    if (s === 43 || s === 45 || s === 0x2212) k++;
    const digits = k;
    while (isDigit(codeAt(text, k))) k++;
    // An `e` not followed by digits is not part of the number (it starts the unit, as in `1 eV`… or `1eV`).
    if (k > digits) i = k;
  }
  return i;
}

/** Reads a JS-style decimal at `start`; rejects NaN, Infinity, overflow and decimal commas. */
function scanNumber(text: string, start: number): Scanned {
  NOT_A_NUMBER.lastIndex = start;
  const bad = mayStartNotANumber(codeAt(text, start)) ? NOT_A_NUMBER.exec(text) : null;
  if (bad)
    return problem('number-invalid', `\`${bad[0]}\` is not a finite number.`, { start, end: start + bad[0].length });
  const decimalEnd = endOfDecimal(text, start);
  if (decimalEnd < 0) {
    const end = Math.max(start + 1, text.slice(start).search(/\s|$/) + start);
    return problem('number-invalid', 'Expected a number such as `7.05` or `2.0e16`.', {
      start,
      end: Math.min(end, text.length),
    });
  }
  const written = text.slice(start, decimalEnd);
  const span = { start, end: decimalEnd };
  const unusual = otherNotation(text, start, decimalEnd, written);
  if (unusual) return unusual;
  const comma = codeAt(text, span.end) === 44 /* , */ ? /^,\d+/.exec(text.slice(span.end)) : null;
  if (comma && !written.includes('.')) {
    const whole = { start, end: span.end + comma[0].length };
    return problem('number-invalid', 'Use a decimal point, not a comma.', whole, {
      title: 'Use a decimal point',
      span: whole,
      newText: text.slice(whole.start, whole.end).replace(',', '.'),
    });
  }
  // The Unicode minus is rare; only then is the text rewritten for Number().
  const value = Number(
    written.includes('\u2212') ? written.replace('\u2212', '-').replace(/([eE])\u2212/, '$1-') : written,
  );
  if (!Number.isFinite(value))
    return problem('number-invalid', `\`${written}\` is out of the range of double precision.`, span);
  // A nonzero number below the smallest double (about 5e-324) reads as 0, which would turn `ratio: 1e-400` into an
  // empty level (T → 0) that nobody wrote: refused like an overflow.
  if (value === 0 && /[1-9]/.test(written.split(/[eE]/)[0]!))
    return problem(
      'number-invalid',
      `\`${written}\` is below the range of double precision (about 5e-324) and would read as 0.`,
      span,
    );
  const sign = written.charCodeAt(0);
  return { value, span, negative: sign === 45 /* - */ || sign === 0x2212 };
}

/** Digits of the YAML 1.2 integer forms `0x…` and `0o…` (and YAML 1.1's `0b…`), by the letter after the 0. */
const RADIX: Readonly<Record<string, { readonly base: number; readonly digits: RegExp; readonly name: string }>> = {
  x: { base: 16, digits: /^[0-9a-fA-F]+(?:\.[0-9a-fA-F]*)?(?:[pP][+-]?\d+)?/, name: 'a hexadecimal' },
  o: { base: 8, digits: /^[0-7]+/, name: 'an octal' },
  b: { base: 2, digits: /^[01]+/, name: 'a binary' },
};

/**
 * Numbers YAML or a programming language writes but a lab note does not: `0x10`, `0o17`, `0b11`, `0x1p3` (a
 * base other than ten) and `1_000` (digits grouped with `_`). Read as a decimal they would be a 0 or a 1 followed
 * by a "unit" `x10` or `_000`, and the problem would say so; here they are `number-invalid` on the whole number,
 * with a fix writing the same integer in decimal where there is one. Null for anything else.
 */
function otherNotation(text: string, start: number, decimalEnd: number, written: string): Scanned | null {
  const next = codeAt(text, decimalEnd);
  if (next === 95 /* _ */ && isDigit(codeAt(text, decimalEnd + 1))) {
    const m = /^[+\-\u2212]?[\d_]+(?:\.[\d_]*)?(?:[eE][+\-\u2212]?[\d_]+)?/.exec(text.slice(start))!;
    const whole = { start, end: start + m[0].length };
    const newText = m[0].replace(/_/g, '');
    return problem('number-invalid', `Write \`${m[0]}\` without the \`_\` between its digits: \`${newText}\`.`, whole, {
      title: `Write ${newText}`,
      span: whole,
      newText,
    });
  }
  const radix = /^[+\-\u2212]?0$/.test(written) ? RADIX[String.fromCharCode(next).toLowerCase()] : undefined;
  const digits = radix ? radix.digits.exec(text.slice(decimalEnd + 1)) : null;
  if (!radix || !digits) return null;
  const whole = { start, end: decimalEnd + 1 + digits[0].length };
  const token = text.slice(whole.start, whole.end);
  const n = /^[0-9a-fA-F]+$/.test(digits[0]) ? parseInt(digits[0], radix.base) : NaN;
  const newText = Number.isSafeInteger(n) ? `${/^[-\u2212]/.test(written) ? '-' : ''}${n}` : null;
  return problem(
    'number-invalid',
    `\`${token}\` is ${radix.name} number; numbers here are decimal${newText === null ? '' : ` (\`${newText}\`)`}.`,
    whole,
    newText === null ? undefined : { title: `Write ${newText}`, span: whole, newText },
  );
}

/**
 * Parses `"7.05 T"`, `"0.312 ± 0.010"`, `"0.312 +- 0.010"`, `"7.05 ± 0.01 T"`
 * or a bare number (syntax only: the unit is not checked). Numbers are JS-style
 * decimals (`2.0e16`, `-3.5E-4`, `.5`; the minus sign U+2212 is also read);
 * `NaN`, `Infinity` and values overflowing double precision are `number-invalid`,
 * a negative uncertainty is `uncertainty-negative`. Spans are offsets in `text`.
 */
export function parseQuantity(text: string): { quantity: Quantity } | { problem: QuantityProblem } {
  const start = skipSpace(text, 0);
  // A result and its uncertainty in brackets before the unit, as the GUM writes it (JCGM 100:2008 §7.2.2):
  // `(7.05 ± 0.01) T` is `7.05 ± 0.01 T`.
  const bracket = codeAt(text, start) === 40; /* ( */
  const value = scanNumber(text, bracket ? skipSpace(text, start + 1) : start);
  if ('problem' in value) return value;
  let i = skipSpace(text, value.span.end);
  let uncertainty: number | null = null;
  let uncertaintySpan: Span | null = null;
  PLUS_MINUS.lastIndex = i;
  const c = codeAt(text, i);
  const pm = c === 0xb1 || c === 43 ? PLUS_MINUS.exec(text) : null;
  if (pm) {
    const u = scanNumber(text, skipSpace(text, i + pm[0].length));
    if ('problem' in u) return u;
    if (u.negative && u.value !== 0) {
      const fixed = text.slice(u.span.start + 1, u.span.end);
      return problem('uncertainty-negative', 'A standard uncertainty cannot be negative.', u.span, {
        title: `Change uncertainty to ${fixed}`,
        span: u.span,
        newText: fixed,
      });
    }
    [uncertainty, uncertaintySpan] = [Math.abs(u.value), u.span];
    i = skipSpace(text, u.span.end);
  }
  if (bracket) {
    if (codeAt(text, i) !== 41 /* ) */) {
      const upTo = text.indexOf(')', i);
      return problem(
        'number-invalid',
        'A bracket holds the number and its uncertainty, then closes before the unit: `(7.05 ± 0.01) T`.',
        { start, end: upTo === -1 ? text.trimEnd().length : upTo + 1 },
      );
    }
    i = skipSpace(text, i + 1);
  }
  const end = text.trimEnd().length;
  if (i >= end)
    return {
      quantity: { value: value.value, uncertainty, unit: null, valueSpan: value.span, uncertaintySpan, unitSpan: null },
    };
  const rest = text.slice(i, end);
  const power = powerOfTen(text, value, uncertaintySpan, i, end, bracket ? start : null);
  if (power) return power;
  if (looksNumeric(rest)) {
    return problem('number-invalid', `Unexpected \`${rest}\` after the number.`, { start: i, end });
  }
  return {
    quantity: {
      value: value.value,
      uncertainty,
      unit: rest,
      valueSpan: value.span,
      uncertaintySpan,
      unitSpan: { start: i, end },
    },
  };
}

/** `× 10^3`, `x 10^-3`, `·10⁻³`, `* 10^3`, `×10³` after a number; `^3` after a bare `10`. Group 1 or 2: the power. */
const TIMES_TEN = /^(?:[×xX*·⋅]\s*10\s*(?:\^\s*([+\-\u2212]?\d+)|([⁺⁻]?[⁰¹²³⁴⁵⁶⁷⁸⁹]+)))/;
const BARE_TEN = /^(?:\^\s*([+\-\u2212]?\d+)|([⁺⁻]?[⁰¹²³⁴⁵⁶⁷⁸⁹]+))/;
const SUPERSCRIPTS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

/**
 * A power of ten written as in print (`1.2 × 10^3 cm-1`, `(2.0 ± 0.1) × 10⁻³`, `10^16`): a `number-invalid`
 * with a fix that writes it in e-notation (`1.2e3 cm-1`, `2.0e-3 ± 0.1e-3`, `1e16`). After `±` without brackets
 * the power is taken as the bracketed form means it, for both numbers, unless the first already has its own
 * exponent (`1.2e3 ± 0.1 × 10^3`: the uncertainty's alone). Null when what follows is not such a power.
 */
function powerOfTen(
  text: string,
  value: { readonly span: Span },
  uncertaintySpan: Span | null,
  at: number,
  end: number,
  bracketAt: number | null,
): { problem: QuantityProblem } | null {
  const rest = text.slice(at, end);
  const written = text.slice(value.span.start, value.span.end);
  const times = TIMES_TEN.exec(rest);
  const bare =
    !times && uncertaintySpan === null && bracketAt === null && /^[+\-\u2212]?10$/.test(written)
      ? BARE_TEN.exec(rest)
      : null;
  const m = times ?? bare;
  if (!m) return null;
  const power = m[1] !== undefined ? Number(m[1].replace('\u2212', '-')) : Number(fromSuperscript(m[2]!));
  const upTo = at + m[0].length;
  let from = bracketAt ?? value.span.start;
  let newText: string;
  if (bare) newText = `${/^[-\u2212]/.test(written) ? '-' : ''}1e${power}`;
  else if (uncertaintySpan && bracketAt === null && /[eE]/.test(written)) {
    from = uncertaintySpan.start;
    newText = withPower(text.slice(uncertaintySpan.start, uncertaintySpan.end), power);
  } else {
    newText = withPower(written, power);
    if (uncertaintySpan) newText += ` ± ${withPower(text.slice(uncertaintySpan.start, uncertaintySpan.end), power)}`;
  }
  const whole = { start: from, end: upTo };
  return problem(
    'number-invalid',
    `Write the power of ten in e-notation: \`${text.slice(whole.start, whole.end)}\` is \`${newText}\` here.`,
    whole,
    { title: `Write ${newText}`, span: whole, newText },
  );
}

/** A decimal as written, times 10^power, in e-notation: `1.2` → `1.2e3`, `1.2e2` → `1.2e5`, `−3` → `-3e3`. */
function withPower(written: string, power: number): string {
  const plain = written.replace(/\u2212/g, '-');
  const m = /^([^eE]*)(?:[eE]([+-]?\d+))?$/.exec(plain)!;
  return `${m[1]}e${Number(m[2] ?? 0) + power}`;
}

/** Superscript digits and signs as plain ones: `⁻³` → `-3`, `¹²⁹Xe` → `129Xe` (other characters kept). */
export function fromSuperscript(s: string): string {
  let out = '';
  for (const ch of s) {
    const digit = SUPERSCRIPTS.indexOf(ch);
    out += digit >= 0 ? String(digit) : ch === '⁻' ? '-' : ch === '⁺' ? '' : ch;
  }
  return out;
}

/**
 * True when what follows the number starts like another number or a second
 * `±` (not a unit): a sign, a digit or a point, except `1/…` (as in `1/cm`).
 * The first character decides in all but that one case, which the pattern checks.
 */
function looksNumeric(rest: string): boolean {
  const c = rest.charCodeAt(0);
  if (c === 0xb1 || (c === 43 && (rest.startsWith('+-') || rest.startsWith('+/-')))) return true;
  const numeric = c === 43 || c === 45 || c === 0x2212 || c === 46 || (c >= 48 && c <= 57);
  return numeric && !(c === 49 && /^1\s*\//.test(rest));
}

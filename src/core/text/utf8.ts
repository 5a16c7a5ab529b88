/**
 * Decodes a note's bytes as UTF-8 and says where they are not UTF-8, instead
 * of replacing bad bytes in silence. The decoding is the WHATWG Encoding
 * Standard's UTF-8 decoder (encoding.spec.whatwg.org, §4.1 and §9.1.1): each
 * maximal ill-formed subsequence becomes one U+FFFD, exactly as
 * `TextDecoder('utf-8')` and Node's `toString('utf8')` do, so the text is the
 * one every other reader gets, and the ranges of the Unicode Standard's
 * Table 3-7 (well-formed byte sequences) decide what is ill-formed.
 */

/** One ill-formed sequence: its byte offset in the input and where its U+FFFD is in the text. */
export interface InvalidUtf8 {
  /** 0-based byte offset in the input. */
  readonly byte: number;
  /** UTF-16 offset of its U+FFFD in the decoded text. */
  readonly offset: number;
}

/** The decoded text and every ill-formed sequence, in order. */
export interface DecodedText {
  readonly text: string;
  readonly invalid: readonly InvalidUtf8[];
}

/** What the core needs of the platform's TextDecoder (the core is typed without the DOM's or Node's types). */
type StrictDecoder = { decode(bytes: Uint8Array): string };
type DecoderClass = new (label: string, options: { fatal: boolean; ignoreBOM: boolean }) => StrictDecoder;

/** The platform's strict decoder (Node.js and browsers), when there is one: it throws on the first bad byte. */
const Decoder = (globalThis as { TextDecoder?: DecoderClass }).TextDecoder;
const strict: StrictDecoder | null = Decoder ? new Decoder('utf-8', { fatal: true, ignoreBOM: true }) : null;

/** Decodes the bytes (a leading byte-order mark is kept as U+FEFF; the caller decides). */
export function decodeUtf8(bytes: Uint8Array): DecodedText {
  // Well-formed bytes (nearly every note) are decoded natively; only others are walked here, to find the bad ones.
  if (strict) {
    try {
      return { text: strict.decode(bytes), invalid: [] };
    } catch {
      // ill-formed: read below
    }
  }
  return decodeWalking(bytes);
}

/** The decoding byte by byte, naming each ill-formed sequence. */
export function decodeWalking(bytes: Uint8Array): DecodedText {
  const invalid: InvalidUtf8[] = [];
  const parts: string[] = [];
  let units: number[] = [];
  let length = 0;
  const flush = (): void => {
    if (units.length) parts.push(String.fromCharCode.apply(null, units));
    units = [];
  };
  const emit = (cp: number): void => {
    if (cp > 0xffff) {
      const v = cp - 0x10000;
      units.push(0xd800 + (v >> 10), 0xdc00 + (v & 0x3ff));
      length += 2;
    } else {
      units.push(cp);
      length += 1;
    }
    // Short chunks: fromCharCode.apply takes its arguments on the stack.
    if (units.length >= 4096) flush();
  };
  const bad = (at: number): void => {
    invalid.push({ byte: at, offset: length });
    emit(0xfffd);
  };
  let i = 0;
  while (i < bytes.length) {
    const b = bytes[i]!;
    if (b < 0x80) {
      emit(b);
      i++;
      continue;
    }
    let need: number;
    let lower = 0x80;
    let upper = 0xbf;
    let cp: number;
    if (b >= 0xc2 && b <= 0xdf) {
      need = 1;
      cp = b & 0x1f;
    } else if (b >= 0xe0 && b <= 0xef) {
      need = 2;
      cp = b & 0x0f;
      if (b === 0xe0) lower = 0xa0;
      if (b === 0xed) upper = 0x9f;
    } else if (b >= 0xf0 && b <= 0xf4) {
      need = 3;
      cp = b & 0x07;
      if (b === 0xf0) lower = 0x90;
      if (b === 0xf4) upper = 0x8f;
    } else {
      bad(i);
      i++;
      continue;
    }
    const start = i;
    i++;
    let ok = true;
    for (let k = 0; k < need; k++) {
      const c = bytes[i];
      if (c === undefined || c < lower || c > upper) {
        ok = false;
        break;
      }
      cp = (cp << 6) | (c & 0x3f);
      lower = 0x80;
      upper = 0xbf;
      i++;
    }
    // The bytes read so far are one maximal ill-formed subsequence; the byte that broke it is read afresh.
    if (ok) emit(cp);
    else bad(start);
  }
  flush();
  return { text: parts.join(''), invalid };
}

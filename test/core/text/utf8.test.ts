import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { decodeUtf8 } from '../../../src/core';
import { decodeWalking } from '../../../src/core/text/utf8';
import { runs } from '../../robustness/seed';

// The reference is the platform's TextDecoder, an implementation of the WHATWG Encoding
// Standard's UTF-8 decoder (encoding.spec.whatwg.org §9.1.1) independent of this code.
const reference = new TextDecoder('utf-8', { ignoreBOM: true });

/** Bytes near UTF-8's edges: lead bytes, the narrowed second-byte ranges of Unicode Table 3-7, and never-valid bytes. */
const edgy = fc.constantFrom(
  0x41,
  0x0a,
  0x7f,
  0x80,
  0x8f,
  0x90,
  0x9f,
  0xa0,
  0xbf,
  0xc0,
  0xc1,
  0xc2,
  0xdf,
  0xe0,
  0xed,
  0xef,
  0xf0,
  0xf4,
  0xf5,
  0xff,
);

describe('decoding a note’s bytes as UTF-8', () => {
  it('gives the same text as the WHATWG decoder for any bytes, one U+FFFD per ill-formed sequence', () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(edgy, fc.integer({ min: 0, max: 255 })), { maxLength: 24 }), (xs) => {
        const bytes = Uint8Array.from(xs);
        const { text, invalid } = decodeUtf8(bytes);
        assert.equal(text, reference.decode(bytes));
        for (const v of invalid) assert.equal(text[v.offset], '\uFFFD');
        // Well-formed bytes take the platform's decoder; the walk that finds the bad bytes agrees with it on all.
        const walked = decodeWalking(bytes);
        assert.equal(walked.text, text);
        assert.deepEqual(walked.invalid, invalid);
      }),
      runs(3000),
    );
  });

  it('names the byte offset of each ill-formed sequence (the Unicode Standard’s example of U+FFFD substitution)', () => {
    // The Unicode Standard §3.9, Table 3-8 ("U+FFFD for Non-Shortest Form Sequences" and its neighbours), from memory;
    // the expected text is also what the WHATWG decoder gives: 61 F1 80 80 E1 80 C2 62 80 63 80 BF 64 →
    // a, FFFD, FFFD, FFFD, b, FFFD, c, FFFD, FFFD, d.
    const bytes = Uint8Array.from([0x61, 0xf1, 0x80, 0x80, 0xe1, 0x80, 0xc2, 0x62, 0x80, 0x63, 0x80, 0xbf, 0x64]);
    const { text, invalid } = decodeUtf8(bytes);
    assert.equal(text, 'a\uFFFD\uFFFD\uFFFDb\uFFFDc\uFFFD\uFFFDd');
    assert.deepEqual(
      invalid.map((v) => v.byte),
      [1, 4, 6, 8, 10, 11],
    );
    // Surrogates encoded in UTF-8 (ED A0 80) and overlong forms (C0 AF) are ill-formed byte by byte.
    assert.equal(decodeUtf8(Uint8Array.from([0xed, 0xa0, 0x80])).invalid.length, 3);
    assert.equal(decodeUtf8(Uint8Array.from([0xc0, 0xaf])).invalid.length, 2);
    // A four-byte character is two UTF-16 units: offsets after it count both.
    const after = decodeUtf8(Uint8Array.from([0xf0, 0x9f, 0x99, 0x82, 0xff]));
    assert.deepEqual(after.invalid, [{ byte: 4, offset: 2 }]);
  });

  it('decodes a large note in pieces, without passing it whole as call arguments', () => {
    const bytes = new Uint8Array(3_000_000).fill(0x61);
    bytes[2_999_999] = 0xff;
    const { text, invalid } = decodeUtf8(bytes);
    assert.equal(text.length, 3_000_000);
    assert.deepEqual(invalid, [{ byte: 2_999_999, offset: 2_999_999 }]);
  });
});

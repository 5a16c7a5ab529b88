import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { LineIndex } from '../../../src/core/text/lineIndex';

// Line breaks as the Language Server Protocol 3.17 counts them (§ "Position": \n, \r\n and \r end a line),
// the same rules CommonMark 0.31.2 §2.1 gives for a line ending.

/** Line starts of a text by the definition, one character at a time: the reference the chunked index must agree with. */
function naiveStarts(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '\n' || (c === '\r' && text[i + 1] !== '\n')) starts.push(i + 1);
  }
  return starts;
}

function assertAgrees(idx: LineIndex, text: string): void {
  const starts = naiveStarts(text);
  assert.equal(idx.lineCount, starts.length);
  for (let l = 0; l < starts.length; l++) assert.equal(idx.lineStart(l), starts[l], `line ${l}`);
  for (let o = 0; o <= text.length; o += Math.max(1, Math.floor(text.length / 200))) {
    const p = idx.positionAt(o);
    // Every offset maps back to itself, except one between the \r and the \n of a break (the end of its line).
    if (!(text[o - 1] === '\r' && text[o] === '\n')) assert.equal(idx.offsetAt(p), o);
    assert.ok(starts[p.line]! <= o && (p.line + 1 >= starts.length || o < starts[p.line + 1]!), `offset ${o}`);
  }
}

const piece = fc.constantFrom('a', 'bc', '\n', '\r', '\r\n', 'x\n', '```\n', '');

describe('LineIndex: chunks and edits', () => {
  it('counts lines of a text larger than one chunk exactly (10,000 lines, mixed breaks)', () => {
    const text = Array.from({ length: 10_000 }, (_, i) => `line ${i}${['\n', '\r\n', '\r'][i % 3]}`).join('');
    assertAgrees(new LineIndex(text), text);
  });

  it('an edit gives the same index as building one for the new text (random edits, random texts)', () => {
    fc.assert(
      fc.property(
        fc.array(piece, { maxLength: 300 }),
        fc.array(fc.tuple(fc.nat(), fc.nat(8), fc.array(piece, { maxLength: 4 })), { minLength: 1, maxLength: 6 }),
        (parts, edits) => {
          let text = parts.join('');
          let idx = new LineIndex(text);
          for (const [at, len, ins] of edits) {
            const start = text.length === 0 ? 0 : at % (text.length + 1);
            const end = Math.min(text.length, start + len);
            const inserted = ins.join('');
            text = text.slice(0, start) + inserted + text.slice(end);
            idx = idx.edit(start, end, inserted.length, text);
            assertAgrees(idx, text);
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it('edits across chunk boundaries of a long text, joining and splitting \\r\\n', () => {
    let text = 'ab\r\n'.repeat(5000);
    let idx = new LineIndex(text);
    const cases: [number, number, string][] = [
      [4 * 2048 - 2, 4 * 2048 - 1, ''], // removes a \r: \r\n becomes \n
      [4 * 2048 - 3, 4 * 2048 - 3, '\r'], // a lone \r before a \n
      [100, 3 * 4 * 2048, 'x'], // three chunks into one line
      [0, 0, '\n'.repeat(5000)], // many new lines at the top
      [text.length, text.length, '\r'],
    ];
    for (const [s, e, ins] of cases) {
      const start = Math.min(s, text.length);
      const end = Math.min(e, text.length);
      text = text.slice(0, start) + ins + text.slice(end);
      idx = idx.edit(start, end, ins.length, text);
      assertAgrees(idx, text);
    }
  });

  it('keeps the index of the old text unchanged after an edit', () => {
    const before = 'a\nb\nc';
    const idx = new LineIndex(before);
    idx.edit(1, 2, 0, 'ab\nc');
    assert.equal(idx.lineCount, 3);
    assert.equal(idx.lineStart(2), 4);
  });
});

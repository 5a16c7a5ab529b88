import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { LineIndex, NoteText } from '../../../src/core';

// A text in pieces must answer every question as the whole string and its line index do (LineIndex, itself
// checked against the protocol library's document in test/core/text/lineIndex.test.ts), after any edits: the
// pieces are cut and joined again around each edit, and a line break may be split or joined there (\r + \n).

const chunks = fc.constantFrom('a', 'bc', '\n', '\r', '\r\n', '```levels\n', ' ', 'β', 'x'.repeat(300));
const text = (max: number): fc.Arbitrary<string> => fc.array(chunks, { maxLength: max }).map((parts) => parts.join(''));

/** Every answer of the pieces against the string's. */
function same(t: NoteText, s: string): void {
  const li = new LineIndex(s);
  assert.equal(t.length, s.length);
  assert.equal(t.lineCount, li.lineCount);
  // Every line near the ends and the pieces' seams would be enough; a stride keeps long texts quick.
  const stride = Math.max(1, Math.floor(li.lineCount / 400));
  for (let line = -1; line <= li.lineCount + 1; line += line < 3 || line > li.lineCount - 3 ? 1 : stride) {
    assert.equal(t.lineStart(line), li.lineStart(line), `lineStart(${line})`);
    if (line >= 0) assert.equal(t.lineEnd(line), li.lineEnd(line), `lineEnd(${line})`);
    assert.equal(t.offsetAt({ line, character: 3 }), li.offsetAt({ line, character: 3 }));
  }
  const step = Math.max(1, Math.floor(s.length / 2000));
  for (let o = -1; o <= s.length + 1; o += 1 + ((o * 7919) % step)) {
    assert.deepEqual(t.positionAt(o), li.positionAt(o), `positionAt(${o})`);
    assert.ok(Object.is(t.charCodeAt(o), s.charCodeAt(o)), `charCodeAt(${o})`);
    assert.equal(t.slice(o, o + 40), s.slice(Math.max(0, o), o + 40));
  }
  assert.equal(t.slice(), s);
  assert.equal(t.toString(), s);
}

describe('NoteText: a note in pieces', () => {
  it('answers as the whole string after any edits (pieces of 16 k characters, texts up to ~300 k)', () => {
    fc.assert(
      fc.property(text(600), fc.array(fc.tuple(fc.nat(), fc.nat(), text(40)), { maxLength: 6 }), (start, edits) => {
        let t = NoteText.of(start);
        let s = start;
        same(t, s);
        for (const [at, len, inserted] of edits) {
          const a = at % (s.length + 1);
          const b = Math.min(s.length, a + (len % 70_000));
          t = t.edit(a, b, inserted);
          s = s.slice(0, a) + inserted + s.slice(b);
          same(t, s);
        }
      }),
      {
        numRuns: Number(process.env.FC_RUNS_SCALE ?? 1) * 40,
        ...(process.env.FC_SEED ? { seed: Number(process.env.FC_SEED) } : {}),
      },
    );
  });

  it('never changes a version: an edit makes a new one and the old answers as before', () => {
    const s = 'line one\r\nline two\n'.repeat(5000);
    const a = NoteText.of(s);
    const b = a.edit(50_000, 50_010, '\n\n');
    assert.equal(a.toString(), s);
    assert.equal(b.toString(), s.slice(0, 50_000) + '\n\n' + s.slice(50_010));
    assert.equal(b.lineCount, a.lineCount + 2 - (s.slice(50_000, 50_010).match(/\r\n|\r|\n/g)?.length ?? 0));
  });

  it('joins a \\r at the end of a piece with a \\n typed at the start of the next into one line break', () => {
    const s = 'x'.repeat(40_000) + '\r' + 'y'.repeat(40_000);
    const t = NoteText.of(s).edit(40_001, 40_001, '\n');
    assert.equal(t.lineCount, 2);
    assert.equal(t.lineStart(1), 40_002);
    assert.deepEqual(t.positionAt(40_001), { line: 0, character: 40_000 }, 'between \\r and \\n: end of the line');
  });
});

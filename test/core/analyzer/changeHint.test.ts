import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { Analyzer, type DocumentReport } from '../../../src/core';
import { generateNote } from '../../../bench/note';

// The analyzer's result must not depend on how it got there: with the change a host recorded, without it, or
// fresh. The notes are the invented benchmark notebook (bench/note.ts); no physics is checked here.

/** What a report says, as plain data to compare. */
function summary(r: DocumentReport): unknown[] {
  return r.blocks.map((b) => [
    b.block.openStart,
    b.block.openLine,
    b.block.blockEnd,
    b.block.body,
    b.status,
    b.problems.map((p) => [p.code, p.span.start, p.span.end]),
    b.results?.beta?.value ?? null,
  ]);
}

const pieces = fc.constantFrom('x', '\n', '```', '```levels\n', 'polarization: 0.2\n', '', ' ', '\r\n');

describe('Analyzer: the change a host passes', () => {
  it('gives the same report as a fresh analysis, edit after edit (random edits of a 12-block note)', () => {
    const base = generateNote({ blocks: 12 });
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.nat(), fc.nat(20), fc.array(pieces, { maxLength: 3 })), { minLength: 1, maxLength: 5 }),
        (edits) => {
          const a = new Analyzer();
          let text = base;
          a.analyzeText(text);
          let previous = text;
          for (const [at, len, ins] of edits) {
            const start = at % (text.length + 1);
            const end = Math.min(text.length, start + len);
            const inserted = ins.join('');
            const oldLength = text.length;
            text = text.slice(0, start) + inserted + text.slice(end);
            const hinted = a.analyzeText(text, null, { previous, prefix: start, suffix: oldLength - end });
            previous = text;
            assert.deepEqual(summary(hinted), summary(new Analyzer().analyzeText(text)));
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it('ignores a change whose previous text it does not remember, and compares the texts instead', () => {
    const a = new Analyzer();
    const text = generateNote({ blocks: 3 });
    a.analyzeText(text);
    const edited = text.replace('id: run 2', 'id: run 9');
    // A wrong claim about a text never analysed: the analyzer must not trust it.
    const r = a.analyzeText(edited, null, { previous: 'something else', prefix: edited.length, suffix: 0 });
    assert.deepEqual(summary(r), summary(new Analyzer().analyzeText(edited)));
  });

  it('reads a few blocks alone (reportsOf) as the whole analysis reads them, and warm() fills the cache', () => {
    const text = generateNote({ blocks: 10 });
    const whole = new Analyzer().analyzeText(text);
    const a = new Analyzer();
    const some = a.reportsOf([whole.blocks[3]!.block, whole.blocks[7]!.block]);
    assert.deepEqual(
      summary({ ...whole, blocks: some }),
      summary({ ...whole, blocks: [whole.blocks[3]!, whole.blocks[7]!] }),
    );
    const b = new Analyzer();
    for (const r of whole.blocks) assert.equal(b.warm(r.block.body), true);
    assert.equal(b.warm(whole.blocks[0]!.block.body), false, 'already cached');
    assert.deepEqual(b.analyzeText(text).stats, { analysed: 0, reused: 10 });
  });
});

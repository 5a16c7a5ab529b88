import { strict as assert } from 'node:assert';
import { foldingRanges } from '../../../src/server/features/folding';
import { CONTRACT, note, noteState } from '../helpers';

/** Compares the folding ranges of a note as [start line, end line] pairs, all of kind region. */
function check(text: string, expected: readonly (readonly [number, number])[]): void {
  const ranges = foldingRanges(noteState(text));
  assert.deepEqual(
    ranges.map((r) => [r.startLine, r.endLine]),
    expected,
  );
  for (const r of ranges) assert.equal(r.kind, 'region');
}

describe('folding ranges', () => {
  it('fold each block from its opening to its closing fence', () => {
    check(`${note(...CONTRACT)}\n${note('gap: 10 K', 'ratio: 2')}`, [
      [2, 8],
      [12, 15],
    ]);
  });

  it('fold an unclosed block to the last line of the note', () => {
    check('# Lab\n\n```levels\ngap: 10 K\nratio: 2\n\nmore text', [[2, 6]]);
  });

  it('leave other code blocks to the Markdown extension', () => {
    check('```python\nprint(1)\n```\n', []);
  });
});

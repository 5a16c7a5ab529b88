import { strict as assert } from 'node:assert';
import { clampPosition } from '../../src/server/state';
import { noteState } from './helpers';

// LSP 3.17 "Position": a character past the line's length defaults back to the line's length. The server reads a
// line past the note's end as the note's end, and a position between the two halves of a surrogate pair as the
// place before the pair, so that no feature answers with a range outside the note or inside a character.

describe('clampPosition: the position a client meant, inside the note', () => {
  // Lines: 0 'a😀b' (the emoji is two UTF-16 code units, at characters 1 and 2), 1 '' (CRLF before), 2 'end'.
  const state = noteState('a😀b\r\n\r\nend');

  it('leaves a position inside the note as it is (the same object)', () => {
    for (const p of [
      { line: 0, character: 0 },
      { line: 0, character: 1 },
      { line: 0, character: 3 },
      { line: 0, character: 4 },
      { line: 1, character: 0 },
      { line: 2, character: 3 },
    ])
      assert.equal(clampPosition(state, p), p);
  });

  it('reads a character past its line as the line’s end, never the line break or the next line', () => {
    assert.deepEqual(clampPosition(state, { line: 0, character: 5 }), { line: 0, character: 4 });
    assert.deepEqual(clampPosition(state, { line: 1, character: 9 }), { line: 1, character: 0 });
    assert.deepEqual(clampPosition(state, { line: 2, character: 2 ** 31 - 1 }), { line: 2, character: 3 });
  });

  it('reads a line past the note as the note’s end', () => {
    assert.deepEqual(clampPosition(state, { line: 3, character: 0 }), { line: 2, character: 3 });
    assert.deepEqual(clampPosition(state, { line: 2 ** 31 - 1, character: 7 }), { line: 2, character: 3 });
  });

  it('moves a position between the halves of a surrogate pair to before the pair', () => {
    assert.deepEqual(clampPosition(state, { line: 0, character: 2 }), { line: 0, character: 1 });
  });
});

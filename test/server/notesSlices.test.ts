import { strict as assert } from 'node:assert';
import { generateNote } from '../../bench/note';
import { Analyzer } from '../../src/core';
import { NoteDocument } from '../../src/server/noteDocument';
import { Notes } from '../../src/server/notes';
import { DEFAULT_SETTINGS } from '../../src/shared/settings';

// A large note (400 blocks or more) is read in slices after it opens; until then a request about a few blocks
// reads just those. An edit while the slices go on must not start them again, and the blocks the request reads
// must be at their places in the edited version. The note is the invented benchmark notebook (bench/note.ts).

/** Where each block of a text is and what it says, as a fresh analysis finds them. */
function fresh(text: string): { openStart: number; openLine: number; status: string; body: string }[] {
  return new Analyzer().analyzeText(text).blocks.map((b) => ({
    openStart: b.block.openStart,
    openLine: b.block.openLine,
    status: b.status,
    body: b.block.body,
  }));
}

describe('Notes: a large note read in slices', () => {
  it('answers about a few blocks at their places while the slices go on, before and after an edit', async () => {
    const text = generateNote({ blocks: 600 });
    const doc = new NoteDocument('file:///lab/large.md', 'markdown', 1, text);
    const notes = new Notes();
    const done = notes.prepare(doc, DEFAULT_SETTINGS);
    const whole = fresh(text);
    const b = whole[300]!;
    const near = notes.around(doc, DEFAULT_SETTINGS, b.openStart, b.openStart + 1);
    assert.deepEqual(
      near.report.blocks.map((r) => [r.block.openStart, r.block.openLine, r.status]),
      [[b.openStart, b.openLine, b.status]],
    );
    // Two lines typed in block 100: the blocks after it move by them; block 300 is found at its new place.
    const at = whole[100]!.openStart + '```levels\n'.length;
    doc.update([{ range: { start: doc.positionAt(at), end: doc.positionAt(at) }, text: '# a\n# b\n' }], 2);
    const after = fresh(doc.getText());
    const moved = notes.around(doc, DEFAULT_SETTINGS, after[300]!.openStart, after[300]!.openStart + 1);
    assert.deepEqual(
      moved.report.blocks.map((r) => [r.block.openStart, r.block.openLine, r.block.body]),
      [[after[300]!.openStart, after[300]!.openLine, after[300]!.body]],
    );
    assert.equal(after[300]!.openLine, b.openLine + 2);
    // A block before the edit is where it was.
    const early = notes.around(doc, DEFAULT_SETTINGS, whole[10]!.openStart, whole[10]!.openStart);
    assert.deepEqual(
      early.report.blocks.map((r) => r.block.openStart),
      [whole[10]!.openStart],
    );
    await done;
    // Once read, the whole note's analysis is that of the edited text.
    const state = notes.get(doc, DEFAULT_SETTINGS);
    assert.deepEqual(
      state.report.blocks.map((r) => [r.block.openStart, r.block.openLine, r.status]),
      after.map((x) => [x.openStart, x.openLine, x.status]),
    );
    assert.equal(notes.statsOf(doc.uri)?.blocks, 600);
  });
});

import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { Analyzer, NoteText, RunBook, type DocumentReport } from '../../../src/core';
import { fence, hpBlock, refBlock } from '../../support/runNotes';

// What a host that edits a large note keystroke by keystroke relies on (src/server/notes.ts): the analysis of
// a text in pieces, read again only around each change and with the book of runs indexed again only there too,
// is exactly the analysis of the whole new text by a fresh analyzer and a fresh book. The notes mix blocks
// that refer to a run, ids shared by two blocks, other languages, indented and unclosed fences; the edits are
// random. No physics is checked here (test/core/runs/physics.test.ts does).

const NOTE = 'file:///lab/note.md';

/** A note of a few blocks of every kind the scan and the book tell apart. */
const base = [
  '# Day 12\n\nPrepared the sample.\n\n',
  refBlock('ref A'),
  '\nSome prose between blocks.\n\n',
  hpBlock('run 1', 'ref A'),
  '\n```python\nprint("not ours")\n```\n\n',
  hpBlock('run 2', 'ref A'),
  '\n   ```levels\n   id: indented\n   polarization: 0.1\n   ```\n\n',
  fence('id: run 1\npolarization: 0.3'),
  '\n~~~levels\nid: tilde\npopulations: [0.6, 0.4]\n~~~\n\n',
  hpBlock('run 3', 'ref B'),
  '\nThe end.\n',
].join('');

/** What a report says, as plain data to compare (positions, status, problems and the values of β). */
function summary(r: DocumentReport): unknown {
  return {
    blocks: r.blocks.map((b) => [
      b.block.openStart,
      b.block.openEnd,
      b.block.openLine,
      b.block.closeLine,
      b.block.blockEnd,
      b.block.bodyStart,
      b.block.bodyLine,
      b.block.body,
      b.block.lines.map((l) => [l.docStart, l.bodyStart, l.stripped]),
      b.status,
      b.problems.map((p) => [p.code, p.span.start, p.span.end, p.message]),
      b.results?.beta?.value ?? null,
    ]),
    withProblems: r.withProblems ?? r.blocks.flatMap((b, i) => (b.problems.length > 0 ? [i] : [])),
    problems: r.problems.map((p) => p.code),
  };
}

/** What the book holds of the note: its blocks and the lists by id. */
function bookSummary(book: RunBook): unknown {
  const blocks = book.blocksOf(NOTE);
  const ids = [...new Set(blocks.flatMap((b) => (b.id === null ? [] : [b.id])))].sort();
  return {
    blocks: blocks.map((b) => [b.index, b.block.openStart, b.block.openLine, b.id, b.place, b.hash, b.refs.length]),
    byId: ids.map((id) => [id, book.blocksWithId(id).map((b) => b.index)]),
  };
}

const pieces = fc.constantFrom(
  'x',
  '\n',
  '\r\n',
  '```',
  '```levels\n',
  '~~~',
  '   ',
  'id: run 2\n',
  'ref B',
  'A',
  '{ run: run 1 }',
  'polarization: 0.2\n',
  '',
);

/**
 * Applies the edits (offset, length removed, pieces inserted) one by one to a note read by one analyzer and one book,
 * each told the change, and checks after each that both give what a fresh analyzer and a fresh book give for the
 * whole new text. A note in pieces is edited as such; a string is replaced by the new string.
 */
function replayEdits(
  initial: NoteText | string,
  edits: readonly (readonly [number, number, readonly string[]])[],
): void {
  const analyzer = new Analyzer();
  const book = new RunBook();
  let text = initial;
  let flat = initial.toString();
  book.setNote(NOTE, text);
  analyzer.analyzeText(text, book.externalsFor(NOTE));
  for (const [at, len, ins] of edits) {
    const start = at % (flat.length + 1);
    const end = Math.min(flat.length, start + len);
    const inserted = ins.join('');
    const change = { previous: text, prefix: start, suffix: flat.length - end };
    flat = flat.slice(0, start) + inserted + flat.slice(end);
    text = typeof text === 'string' ? flat : text.edit(start, end, inserted);
    assert.equal(text.toString(), flat);
    book.setNote(NOTE, text, change);
    const got = analyzer.analyzeText(text, book.externalsFor(NOTE), change);
    const freshBook = new RunBook();
    freshBook.setNote(NOTE, flat);
    const want = new Analyzer().analyzeText(flat, freshBook.externalsFor(NOTE));
    assert.deepEqual(bookSummary(book), bookSummary(freshBook));
    assert.deepEqual(summary(got), summary(want));
  }
}

describe('Analyzer and book of runs: a note edited in pieces, read again only around each change', () => {
  it('give what a fresh analyzer and a fresh book give for the whole new text, edit after edit', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.nat(), fc.nat(40), fc.array(pieces, { maxLength: 3 })), { minLength: 1, maxLength: 8 }),
        (edits) => {
          replayEdits(NoteText.of(base), edits);
        },
      ),
      {
        numRuns: Number(process.env.FC_RUNS_SCALE ?? 1) * 120,
        ...(process.env.FC_SEED ? { seed: Number(process.env.FC_SEED) } : {}),
      },
    );
  });

  it('names a broken run’s new line after the run was read again and then moved down', () => {
    // Found by the property above: the run `ref A` is broken, an edit in its opening fence has the book read it
    // again (as a new block, not yet evaluated), and a line added at the top then moves it one line down. The
    // blocks that refer to it must name its new line, as a fresh analysis does.
    const analyzer = new Analyzer();
    const book = new RunBook();
    let text = NoteText.of(base);
    book.setNote(NOTE, text);
    analyzer.analyzeText(text, book.externalsFor(NOTE));
    const edit = (start: number, end: number, inserted: string): DocumentReport => {
      const change = { previous: text, prefix: start, suffix: text.length - end };
      text = text.edit(start, end, inserted);
      book.setNote(NOTE, text, change);
      return analyzer.analyzeText(text, book.externalsFor(NOTE), change);
    };
    const fenceA = base.indexOf('```levels\nid: ref A');
    const dateLine = base.indexOf('date:', fenceA);
    edit(dateLine + 3, dateLine + 6, '{ run: run 1 }   \r\n'); // `ref A` loses its form: it is broken
    edit(fenceA + 1, fenceA + 1, ''); // an empty edit in its opening fence: read again where it is
    const got = edit(0, 0, 'polarization: 0.2\n'); // and moved one line down
    const lineOfA = text.toString().slice(0, text.toString().indexOf('id: ref A')).split('\n').length; // 1-based
    const messages = got.blocks.flatMap((b) => b.problems.filter((p) => p.code === 'reference-invalid'));
    assert.ok(messages.length >= 2, 'both runs that refer to `ref A` say it cannot be used');
    for (const m of messages) assert.match(m.message, new RegExp(`\\(line ${lineOfA} of this note\\)\\.$`));
    const fresh = new RunBook();
    fresh.setNote(NOTE, text.toString());
    assert.deepEqual(summary(got), summary(new Analyzer().analyzeText(text.toString(), fresh.externalsFor(NOTE))));
  });

  it('reads only the changed block again, and the book names the blocks whose stamps changed', () => {
    // No references here: an id edit then changes the sets of blocks of two ids, nothing else.
    const plain =
      fence('id: a\npolarization: 0.3') +
      '\ntext\n\n' +
      fence('id: a\npolarization: 0.5') +
      fence('id: b\npolarization: 0.1');
    const analyzer = new Analyzer();
    const book = new RunBook();
    let text = NoteText.of(plain);
    book.setNote(NOTE, text);
    const first = analyzer.analyzeText(text, book.externalsFor(NOTE));
    const since = book.changes();
    // A value of the second "a" changes: no id changes, so no stamp.
    const at = plain.indexOf('0.5') + 2;
    const change = { previous: text, prefix: at, suffix: plain.length - at - 1 };
    text = text.edit(at, at + 1, '4');
    book.setNote(NOTE, text, change);
    assert.equal(book.changedSince(since)!.none, true, 'a value changed: no id, so no stamp');
    const second = analyzer.analyzeText(text, book.externalsFor(NOTE), change);
    assert.deepEqual(second.stats, { analysed: 1, reused: first.blocks.length - 1 });
    // Its id changes to a fresh one: the sets of blocks of "a" and "c" change, and the book names both blocks
    // that carried "a" (the other one loses its duplicate warning).
    const idAt = text.toString().indexOf('id: a\npolarization: 0.4') + 'id: '.length;
    const change2 = { previous: text, prefix: idAt, suffix: text.length - idAt - 1 };
    text = text.edit(idAt, idAt + 1, 'c');
    book.setNote(NOTE, text, change2);
    const ids = book.changedSince(since + 1)!;
    assert.equal(ids.none, false);
    const offsets = ids.offsetsIn!(NOTE)!;
    const carriers = [...book.blocksWithId('a'), ...book.blocksWithId('c')].map((b) => b.block.openStart);
    assert.deepEqual(
      [...offsets].sort((x, y) => x - y),
      carriers.sort((x, y) => x - y),
    );
    const third = analyzer.analyzeText(text, book.externalsFor(NOTE), change2);
    const duplicated = (r: DocumentReport): number =>
      r.blocks.filter((b) => b.problems.some((p) => p.code === 'id-duplicate')).length;
    assert.equal(duplicated(second), 2, '"a" was carried twice');
    assert.equal(duplicated(third), 0, 'no longer');
    assert.equal(third.stats.analysed, 2, 'the edited block, and the other "a" whose stamp changed');
  });
});

describe('Analyzer and book of runs: a note with HTML blocks edited in pieces', () => {
  // HTML blocks (CommonMark 0.31.2, §4.6, https://spec.commonmark.org/0.31.2/#html-blocks) hide the fences among
  // their lines (Examples 161, 179), so an edit may hide or show every block below it: the edits here type and
  // delete the openers and ends of comments, kind 6 tags, blank lines and fences.
  const htmlBase = [
    '# Day 14\n\n<!-- run 0 was bad\n',
    fence('id: run 0\npolarization: 0.9'),
    '-->\n\n',
    refBlock('ref A'),
    '\n<div>\n',
    hpBlock('hidden', 'ref A'),
    '\n',
    hpBlock('run 1', 'ref A'),
    '\n<?php\n```levels\nid: php\n```\n?>\n',
    fence('id: run 2\npolarization: 0.3'),
    '<![CDATA[\n',
    fence('id: cdata\npolarization: 0.1'),
    ']]>\n\n<details>\n\n',
    fence('id: run 3\npolarization: 0.2'),
    '\nThe end.\n',
  ].join('');

  const htmlPieces = fc.constantFrom(
    '<!--',
    '-->',
    '<!-- x -->',
    '<div>',
    '</div>',
    '<?',
    '?>',
    '<pre>',
    '</pre>',
    '\n',
    '\n\n',
    '\r\n',
    '```',
    '```levels\n',
    'id: run 2\n',
    'x',
    '   ',
    '',
  );

  it('give what a fresh analyzer and a fresh book give for the whole new text, edit after edit', () => {
    // The base note's commented, kind 6, kind 3 and CDATA blocks are hidden.
    const ids = new Analyzer().analyzeText(htmlBase).blocks.map((b) => b.block.body.split('\n', 1)[0]);
    assert.deepEqual(ids, ['id: ref A', 'id: run 1', 'id: run 2', 'id: run 3']);
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.nat(), fc.nat(40), fc.array(htmlPieces, { maxLength: 3 })), {
          minLength: 1,
          maxLength: 8,
        }),
        fc.boolean(),
        fc.boolean(),
        (edits, pieced, long) => {
          // Long: prose between the sections, so that HTML blocks and fences run past the windows a text in pieces
          // is read in (a few kilobytes past the change, then twice as long, and so on).
          const initial = long
            ? htmlBase.replace(/\n\n/g, '\n' + 'Prose, 40 characters long, no markup.\n'.repeat(150))
            : htmlBase;
          // The text in pieces (read in windows around each change) or as one string (read from a resume point).
          replayEdits(pieced ? NoteText.of(initial) : initial, edits);
        },
      ),
      {
        numRuns: Number(process.env.FC_RUNS_SCALE ?? 1) * 150,
        ...(process.env.FC_SEED ? { seed: Number(process.env.FC_SEED) } : {}),
      },
    );
  });
});

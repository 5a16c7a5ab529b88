import { strict as assert } from 'node:assert';
import { Analyzer, NoteText, RunBook, type DocumentReport } from '../../../src/core';
import { fence } from '../../support/runNotes';

// An edit that opens an HTML block above `levels` blocks hides them, and one that closes or removes it brings them
// back (CommonMark 0.31.2, §4.6: the lines of an HTML block are raw HTML, a fence among them is no fence;
// https://spec.commonmark.org/0.31.2/#html-blocks, Examples 161 and 179). The analysis of a note read again only
// around each change must say so, as a fresh analysis of the whole text does, and the work an edit costs must not
// grow with the note more than a whole scan does. No physics is checked here.

const NOTE = 'file:///lab/comments.md';

/** Where the blocks of a report open (their 0-based lines) and what they hold. */
const shown = (r: DocumentReport): [number, string][] => r.blocks.map((b) => [b.block.openLine, b.block.body]);

/** An analyzer and a book of runs fed a note edit by edit (as the server feeds them), checked against fresh ones. */
class Editing {
  readonly analyzer = new Analyzer();
  readonly book = new RunBook();
  text: NoteText;
  last: DocumentReport;

  constructor(initial: string) {
    this.text = NoteText.of(initial);
    this.book.setNote(NOTE, this.text);
    this.last = this.analyzer.analyzeText(this.text, this.book.externalsFor(NOTE));
  }

  /** Replaces [start, end) by `inserted`; the report, checked against a fresh analysis when `check`. */
  edit(start: number, end: number, inserted: string, check = true): DocumentReport {
    const change = { previous: this.text, prefix: start, suffix: this.text.length - end };
    this.text = this.text.edit(start, end, inserted);
    this.book.setNote(NOTE, this.text, change);
    this.last = this.analyzer.analyzeText(this.text, this.book.externalsFor(NOTE), change);
    if (check) {
      const flat = this.text.toString();
      const fresh = new RunBook();
      fresh.setNote(NOTE, flat);
      const want = new Analyzer().analyzeText(flat, fresh.externalsFor(NOTE));
      assert.deepEqual(shown(this.last), shown(want));
      assert.deepEqual(
        this.book.blocksOf(NOTE).map((b) => [b.block.openLine, b.id]),
        fresh.blocksOf(NOTE).map((b) => [b.block.openLine, b.id]),
      );
    }
    return this.last;
  }

  /** Types `s` at `at`, one character per edit. */
  type(at: number, s: string, check = true): DocumentReport {
    for (let i = 0; i < s.length; i++) this.edit(at + i, at + i, s[i]!, check);
    return this.last;
  }
}

/** Characters the analysis read of a text in pieces (NoteText.slice), and whole copies made (toString), during `f`. */
function reading<T>(f: () => T): { result: T; sliced: number; whole: number } {
  const proto = NoteText.prototype;
  // The methods as they are, taken through their descriptors (they are called with the text as `this`).
  const slice = Object.getOwnPropertyDescriptor(proto, 'slice')!.value as (
    this: NoteText,
    start?: number,
    end?: number,
  ) => string;
  const toString = Object.getOwnPropertyDescriptor(proto, 'toString')!.value as (this: NoteText) => string;
  let sliced = 0;
  let whole = 0;
  proto.slice = function (this: NoteText, start?: number, end?: number): string {
    const s = slice.call(this, start, end);
    sliced += s.length;
    return s;
  };
  proto.toString = function (this: NoteText): string {
    whole++;
    return toString.call(this);
  };
  try {
    return { result: f(), sliced, whole };
  } finally {
    proto.slice = slice;
    proto.toString = toString;
  }
}

describe('Analyzer and book of runs: HTML blocks typed and removed above blocks', () => {
  const note =
    '# Day 3\n\n' + fence('id: run 6\npolarization: 0.2') + '\nprose\n\n' + fence('id: run 7\npolarization: 0.3');

  it('hides the blocks under a <!-- typed above them, and shows them again when it is closed or removed', () => {
    const e = new Editing(note);
    assert.equal(e.last.blocks.length, 2);
    const top = note.indexOf('```levels');
    e.type(top, '<!--\n');
    assert.equal(e.last.blocks.length, 0, 'an unclosed comment runs to the end of the note');
    // Closed between the two blocks: the second shows again.
    const between = e.text.toString().indexOf('prose');
    e.type(between, '-->');
    assert.deepEqual(
      e.last.blocks.map((b) => b.block.body),
      ['id: run 7\npolarization: 0.3\n'],
    );
    // The closing marker deleted character by character, then the opening one: all back.
    for (let i = 0; i < 3; i++) e.edit(between, between + 1, '');
    assert.equal(e.last.blocks.length, 0);
    for (let i = 0; i < 5; i++) e.edit(top, top + 1, '');
    assert.equal(e.text.toString(), note);
    assert.equal(e.last.blocks.length, 2);
  });

  it('hides a block under a <div> typed above it, up to the blank line, and shows it when a blank line is typed', () => {
    const e = new Editing(note);
    const second = note.lastIndexOf('```levels');
    // `prose` and the blank line before the second block: a <div> on the line before that block hides it.
    e.type(second, '<div>\n');
    assert.deepEqual(
      e.last.blocks.map((b) => b.block.body),
      ['id: run 6\npolarization: 0.2\n'],
    );
    e.type(second + '<div>\n'.length, '\n');
    assert.equal(e.last.blocks.length, 2);
    // A comment closed on its own line hides nothing; the first fence's line made an unclosed `<?` hides all.
    const top = note.indexOf('```levels');
    e.type(top, '<!-- -->\n');
    assert.equal(e.last.blocks.length, 2);
    const fenceLine = top + '<!-- -->\n'.length;
    e.type(fenceLine, '<?');
    assert.equal(e.last.blocks.length, 0);
    e.edit(fenceLine, fenceLine + 2, '');
    assert.equal(e.last.blocks.length, 2);
    // Written on the fence's own line, the comment takes the line: that fence is gone, and its closing fence opens
    // one (with no info string) that the second block's opening fence cannot close, so no `levels` block is left.
    e.type(fenceLine, '<!-- -->');
    assert.equal(e.last.blocks.length, 0);
  });

  it('reads only around an edit below a closed comment, and the note a few times for one that opens or closes it', () => {
    // About 100,000 lines: a comment holding a block at the top, then 1,000 blocks among prose.
    const unit = fence('polarization: 0.3') + 'Some prose between runs.\n'.repeat(97);
    const text = '<!-- run 5 was bad\n' + fence('polarization: 0.9') + '-->\n' + unit.repeat(1000);
    const e = new Editing(text);
    assert.equal(e.last.blocks.length, 1000);
    const lines = e.text.lineCount;
    assert.ok(lines > 100_000);
    // Typing in the middle of the note, below the comment: each keystroke reads a window, not the note.
    const middle = text.length >> 1;
    const typed = reading(() => e.type(middle, 'ab\n', false));
    assert.equal(typed.whole, 0);
    assert.ok(typed.sliced < 3 * 50_000, `${typed.sliced} characters read for 3 keystrokes`);
    assert.equal(e.last.blocks.length, 1000);
    // The comment's end removed: every block below is hidden, which the analyzer and the book each find by reading
    // the rest of the note in windows that double, together about twice the note; not once per line, nor per window.
    // (Before the windows doubled from where the scan starts, each window read the stretch up to the change again.)
    const close = e.text.toString().indexOf('-->\n');
    const opened = reading(() => e.edit(close, close + 3, '', false));
    assert.equal(opened.result.blocks.length, 0);
    assert.ok(opened.sliced < 8 * e.text.length, `${opened.sliced} characters read to hide ${text.length}`);
    // And put back: every block shows again, for about as much.
    const closed = reading(() => e.edit(close, close, '-->', false));
    assert.equal(closed.result.blocks.length, 1000);
    assert.ok(closed.sliced < 8 * e.text.length, `${closed.sliced} characters read to show ${text.length}`);
    assert.deepEqual(shown(e.last), shown(new Analyzer().analyzeText(e.text.toString())));
  });

  it('takes a note of 100,000 unclosed or alternating openers edit after edit in linear work per edit', () => {
    // Every fence of `body` is inside an HTML block; the last block of the note is visible after the second body only.
    const bodies: [string, number][] = [
      ['<!--\n', 0],
      ['<!--\n```levels\n-->\n<?\n```\n?>\n<div>\n```levels\n\n', 1],
    ];
    for (const [body, visible] of bodies) {
      const text = body.repeat(Math.ceil(100_000 / body.split('\n').length)) + fence('polarization: 0.3');
      const e = new Editing(text);
      assert.equal(e.last.blocks.length, visible);
      let most = 0;
      for (const part of [1, 3, 5, 6]) {
        const at = Math.floor((text.length * part) / 7);
        most = Math.max(most, reading(() => e.edit(at, at, 'x', false)).sliced);
      }
      // No edit reads the note more than a few times (the analyzer and the book, each in doubling windows), even
      // one far below where the scan starts again; never once per line. (Windows that doubled only past the change
      // each read the stretch before it again: some 11 times the note for the edit at 6/7 of it.)
      assert.ok(most < 6 * e.text.length, `${most} characters read for one edit of ${e.text.length}`);
      const flat = e.text.toString();
      assert.deepEqual(shown(e.last), shown(new Analyzer().analyzeText(flat)));
    }
  });
});

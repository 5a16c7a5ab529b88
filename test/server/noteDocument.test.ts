import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { NoteText } from '../../src/core';
import { NoteDocument } from '../../src/server/noteDocument';

// The reference is the document of `vscode-languageserver-textdocument` (the library the server used before):
// after the same incremental changes both must hold the same text and answer the same positions.

const pieces = fc.constantFrom('a', 'bc', '\n', '\r\n', '\r', '```levels\n', '');

describe('NoteDocument: incremental changes', () => {
  it('holds the same text and positions as the protocol library’s document after random changes', () => {
    fc.assert(
      fc.property(
        fc.array(pieces, { maxLength: 60 }),
        fc.array(fc.tuple(fc.nat(), fc.nat(), fc.nat(6), fc.array(pieces, { maxLength: 3 })), {
          minLength: 1,
          maxLength: 4,
        }),
        (parts, changes) => {
          const text = parts.join('');
          const ref = TextDocument.create('file:///n.md', 'markdown', 1, text);
          const doc = new NoteDocument('file:///n.md', 'markdown', 1, text);
          // Each change made against the text as the previous one left it, at a line that exists (the library
          // mis-counts lines after a change that starts past the last line, which no editor sends).
          for (const [line, character, len, ins] of changes) {
            const start = { line: line % ref.lineCount, character: character % 5 };
            const s = ref.offsetAt(start);
            const e = { range: { start: ref.positionAt(s), end: ref.positionAt(s + len) }, text: ins.join('') };
            TextDocument.update(ref, [e], 2);
            doc.update([e], 2);
            assert.equal(doc.getText(), ref.getText());
          }
          assert.equal(doc.lineCount, ref.lineCount);
          for (let o = 0; o <= ref.getText().length; o++) {
            const t = ref.getText();
            if (t[o - 1] === '\r' && t[o] === '\n') continue; // inside a CRLF: the libraries differ on purpose
            assert.deepEqual(doc.positionAt(o), ref.positionAt(o), `offset ${o}`);
          }
        },
      ),
      { numRuns: 200 },
    );
  });

  it('tells what changed since an earlier version: the shared prefix and suffix', () => {
    const doc = new NoteDocument('u', 'markdown', 1, 'abcdef\nghij');
    const first = doc.pieces;
    assert.deepEqual(doc.changeSince(first), { previous: first, prefix: 11, suffix: 11 }, 'nothing changed yet');
    doc.update([{ range: { start: { line: 0, character: 2 }, end: { line: 0, character: 3 } }, text: 'XY' }], 2);
    const second = doc.pieces;
    doc.update([{ range: { start: { line: 1, character: 1 }, end: { line: 1, character: 1 } }, text: 'Z' }], 3);
    const c = doc.changeSince(first)!;
    assert.equal(c.previous, first);
    assert.equal(c.prefix, 2);
    assert.equal(c.suffix, 3); // "hij" is the end both texts share
    const d = doc.changeSince(second)!;
    assert.equal(d.prefix, 9, 'since the second version only the "Z" changed');
    assert.equal(d.suffix, 3);
    assert.equal(doc.getText(), 'abXYdef\ngZhij');
    assert.equal(doc.changeSince(NoteText.of('abcdef\nghij')), undefined, 'a text it never held is unknown');
    doc.update([{ text: 'new' }], 4);
    assert.equal(doc.changeSince(first), undefined, 'a whole-text change is compared afresh');
  });
});

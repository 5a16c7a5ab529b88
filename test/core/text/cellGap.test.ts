// A notebook's Markdown cells read as one note (the index of runs): VS Code renders each cell on its own, so a fence
// or an HTML block a cell leaves open (CommonMark 0.31.2 §4.5: an unclosed fence runs to the end of its document;
// §4.6: an HTML block of kinds 1–5 to the line with its end marker) must end with that cell.
import { strict as assert } from 'node:assert';
import { scanFencedBlocks } from '../../../src/core/text/fences';
import { cellGap, joinCells, NOTEBOOK_CELL_GAP } from '../../../src/core/text/jupyter';

const BLOCK = '```levels\nid: later\ngap: 1 K\nratio: 0.5\n```';

function ids(text: string): string[] {
  return [...scanFencedBlocks(text)].map((b) => /id: (.*)/.exec(b.body)?.[1] ?? '?');
}

describe('notebook cells read as one note', () => {
  const openers: [string, string][] = [
    ['an unclosed backtick fence', '```levels\nid: first\ngap: 1 K'],
    ['an unclosed tilde fence, longer than three', '~~~~~ levels\nid: first\n~~~\n'],
    ['a fence indented by two spaces', '  ````levels\nid: first'],
    ['an unclosed comment', 'Set aside:\n\n<!--\n```levels\nid: first\n```'],
    ['an unclosed processing instruction', '<?php\n'],
    ['an unclosed CDATA section', '<![CDATA[\nx'],
    ['an unclosed declaration', '<!DOCTYPE html'],
    ['an unclosed <script>', '<script>\nlet a = 1;'],
    ['an unclosed <pre>', '<pre>\n'],
    ['a <div> without a blank line after it', '<div>\nx'],
  ];
  for (const [what, first] of openers)
    it(`reads the next cell's block after ${what}`, () => {
      const joined = joinCells([{ text: first }, { text: BLOCK }]);
      assert.deepEqual(ids(joined).slice(-1), ['later'], JSON.stringify(joined));
      // Each cell alone reads as before: the gap only ends what the first cell left open.
      assert.equal(joined.slice(0, first.length), first);
      assert.ok(joined.endsWith(BLOCK));
    });

  it('keeps the plain blank line between cells without HTML or open fences', () => {
    const a = '# Day\n\n```levels\nid: a\ngap: 1 K\nratio: 0.5\n```';
    assert.equal(cellGap(a), NOTEBOOK_CELL_GAP);
    assert.equal(joinCells([{ text: a }, { text: BLOCK }]), `${a}${NOTEBOOK_CELL_GAP}${BLOCK}`);
    assert.deepEqual(ids(joinCells([{ text: a }, { text: BLOCK }])), ['a', 'later']);
  });

  it('adds nothing that opens a block when a cell with HTML closes all it opens', () => {
    const a = '<!-- a note -->\n<div>\nx\n</div>\n\n```levels\nid: a\ngap: 1 K\nratio: 0.5\n```';
    assert.deepEqual(ids(joinCells([{ text: a }, { text: BLOCK }, { text: BLOCK.replace('later', 'last') }])), [
      'a',
      'later',
      'last',
    ]);
  });
});

import { strict as assert } from 'node:assert';
import { bodyToDocument, findFencedBlocks } from '../../../src/core/text/fences';
import { LineIndex } from '../../../src/core/text/lineIndex';

// The fence rules checked here are those of the CommonMark spec 0.31.2, §4.5
// "Fenced code blocks" (https://spec.commonmark.org/0.31.2/#fenced-code-blocks).
describe('fenced block finder', () => {
  it('finds a backtick block with its info string, lines and body', () => {
    const text = '# t\n\n```levels\na: 1\nb: 2\n```\nafter\n';
    const [b] = findFencedBlocks(text);
    assert.equal(b.language, 'levels');
    assert.equal(b.openLine, 2);
    assert.equal(b.closeLine, 5);
    assert.equal(b.body, 'a: 1\nb: 2\n');
    assert.equal(text.slice(bodyToDocument(b, 0), bodyToDocument(b, 4)), 'a: 1');
  });

  it('finds tilde fences and longer fences, and closes only on a fence at least as long', () => {
    const text = '~~~~levels\nx: 1\n~~~\ny: 2\n~~~~~\n````levels\nz: 3\n```\n````\n';
    const blocks = findFencedBlocks(text);
    assert.equal(blocks.length, 2);
    assert.equal(blocks[0].body, 'x: 1\n~~~\ny: 2\n');
    assert.equal(blocks[1].body, 'z: 3\n```\n');
  });

  it('does not close a backtick fence with tildes, nor a fence followed by text', () => {
    const text = '```levels\na: 1\n~~~\n``` not closed\n```\n';
    const [b] = findFencedBlocks(text);
    assert.equal(b.body, 'a: 1\n~~~\n``` not closed\n');
  });

  it('accepts up to three spaces of indentation and strips that much from the content', () => {
    const text = '   ```levels\n   a: 1\n  b: 2\n     c: 3\n   ```\n';
    const [b] = findFencedBlocks(text);
    assert.equal(b.body, 'a: 1\nb: 2\n  c: 3\n');
    // Offsets in the stripped body map back to the exact place in the note.
    const c = b.body.indexOf('c');
    assert.equal(text[bodyToDocument(b, c)], 'c');
    assert.equal(
      text.slice(bodyToDocument(b, b.body.indexOf('b')), bodyToDocument(b, b.body.indexOf('b')) + 4),
      'b: 2',
    );
  });

  it('ignores four-space indented fences (indented code) and backtick info strings containing a backtick', () => {
    assert.equal(findFencedBlocks('    ```levels\na: 1\n    ```\n').length, 0);
    // (its last line then opens a fence of its own, with no info string).
    assert.deepEqual(
      findFencedBlocks('```levels `x`\na: 1\n```\n').map((b) => b.language),
      [''],
    );
    // A tilde fence's info string may contain backticks.
    assert.equal(findFencedBlocks('~~~levels `x`\na: 1\n~~~\n').length, 1);
  });

  it('runs an unclosed fence to the end of the note', () => {
    const text = 'x\n```levels\na: 1\nb: 2';
    const [b] = findFencedBlocks(text);
    assert.equal(b.closeLine, null);
    assert.equal(b.body, 'a: 1\nb: 2');
    assert.equal(b.blockEnd, text.length);
  });

  it('does not see a levels fence nested inside another fenced block', () => {
    const text = '````markdown\n```levels\na: 1\n```\n````\n';
    const blocks = findFencedBlocks(text);
    assert.equal(blocks.length, 1);
    assert.equal(blocks[0].language, 'markdown');
  });

  it('handles CRLF, lone CR and an empty body', () => {
    const crlf = '```levels\r\na: 1\r\n```\r\n```levels\r\n```\r\n';
    const blocks = findFencedBlocks(crlf);
    assert.equal(blocks.length, 2);
    assert.equal(blocks[0].body, 'a: 1\r\n');
    assert.equal(blocks[1].body, '');
    const cr = '```levels\ra: 1\r```\r';
    assert.equal(findFencedBlocks(cr)[0].body, 'a: 1\r');
  });

  it('maps offsets to lines and columns, counting CRLF as one break', () => {
    const idx = new LineIndex('ab\r\ncd\nef\rg');
    assert.deepEqual(idx.positionAt(0), { line: 0, character: 0 });
    assert.deepEqual(idx.positionAt(4), { line: 1, character: 0 });
    assert.deepEqual(idx.positionAt(8), { line: 2, character: 1 });
    assert.deepEqual(idx.positionAt(10), { line: 3, character: 0 });
    assert.equal(idx.offsetAt({ line: 1, character: 99 }), 6);
    assert.equal(idx.lineCount, 4);
  });

  it('scans a 20 MB note in one linear pass', () => {
    const block = '```levels\ngap: 1 K\npopulations: [0.7, 0.3]\n```\n\nSome prose between runs.\n\n';
    const text = block.repeat(Math.ceil(20e6 / block.length));
    const blocks = findFencedBlocks(text);
    assert.equal(blocks.length, Math.ceil(20e6 / block.length));
    assert.equal(blocks[blocks.length - 1].body, 'gap: 1 K\npopulations: [0.7, 0.3]\n');
  });
});

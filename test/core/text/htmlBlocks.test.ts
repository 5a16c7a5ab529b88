import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import MarkdownIt from 'markdown-it';
import { findFencedBlocks, scanFencedBlocks, type ScanWork } from '../../../src/core/text/fences';

// A fence inside an HTML block is no fence: the HTML block rules are those of the CommonMark spec 0.31.2, §4.6
// "HTML blocks" (https://spec.commonmark.org/0.31.2/#html-blocks); "Example N" below is that spec's example
// number N (https://spec.commonmark.org/0.31.2/#example-N). The fence rules are §4.5 of the same spec.

/** The opening lines of the fences found. */
const opens = (text: string): number[] => findFencedBlocks(text).map((b) => b.openLine);

describe('fenced block finder: HTML blocks (CommonMark 0.31.2, §4.6)', () => {
  it('takes a fence after a kind 6 tag for HTML, up to the blank line that ends it (Examples 161, 148)', () => {
    // Example 161: `<div></div>` then a fenced block: the fence lines are part of the HTML block.
    assert.deepEqual(opens('<div></div>\n``` c\nint x = 33;\n```\n'), []);
    // Example 148: a kind 6 block ends at the first blank line, whatever HTML it holds (a `<pre>` inside changes nothing).
    assert.deepEqual(opens('<table><tr><td>\n<pre>\n```levels\n\n```levels\na: 1\n```\n'), [4]);
    // Example 149: the blank line may hold spaces or tabs; the line after it is read as usual.
    assert.deepEqual(opens('<table>\n  <tr>\n \t\n```levels\na: 1\n```\n'), [3]);
  });

  it('knows the tag names of kind 6 in any case, opening or closing, with its end of name (Examples 150–152, 158)', () => {
    // Example 150: up to three spaces before the tag.
    assert.deepEqual(opens(' <div>\n```levels\n```\n'), []);
    assert.deepEqual(opens('   <div>\n```levels\n```\n'), []);
    // Example 151: a closing tag starts the block too.
    assert.deepEqual(opens('</div>\n```levels\n```\n'), []);
    // Example 152: the tag name in any case, with attributes.
    assert.deepEqual(opens('<DIV CLASS="foo">\n```levels\n```\n'), []);
    // Example 158: anything may follow the name's end (a space here).
    assert.deepEqual(opens('<div *???-&&&-<---\n```levels\n```\n'), []);
    // The name followed by `/>`, `>`, a tab or the line's end; `<details>`, `<h1>`, `<search>` are on the list.
    for (const start of ['<hr/>', '<details>', '<h1>', '<search>', '<td\tclass="x">', '<table']) {
      assert.deepEqual(opens(`${start}\n\`\`\`levels\n\`\`\`\n`), [], start);
    }
    // Not a listed name: `<divx>`, `<div-a>`, `<span>` (kind 7, not followed: see below), `<source>` (not on the 0.31 list).
    for (const start of ['<divx>', '<div-a>', '<span>', '<source>', '< div>']) {
      assert.deepEqual(opens(`${start}\n\`\`\`levels\n\`\`\`\n`), [1], start);
    }
  });

  it('starts an HTML block indented by up to three spaces, not by four or a tab (Examples 183, 184)', () => {
    // Example 183: `  <!-- foo -->` is an HTML block, `    <!-- foo -->` indented code.
    assert.deepEqual(opens('  <!-- foo\n```levels\n```\n'), []);
    assert.deepEqual(opens('    <!-- foo\n```levels\n```\n'), [1]);
    // Example 184: likewise `  <div>` and `    <div>`.
    assert.deepEqual(opens('  <div>\n```levels\n```\n'), []);
    assert.deepEqual(opens('    <div>\n```levels\n```\n'), [1]);
    // A tab indents to the fourth column (§2.2 Tabs).
    assert.deepEqual(opens('\t<!--\n```levels\n```\n'), [1]);
  });

  it('interrupts a paragraph with an HTML block of kinds 1 to 6 (Example 185)', () => {
    assert.deepEqual(opens('Foo\n<div>\n```levels\n```\n'), []);
    assert.deepEqual(opens('Some prose about run 7,\n<!-- bad run\n```levels\na: 1\n```\n-->\n'), []);
  });

  it('comments a block out with <!-- … -->, to the line holding --> (kind 2, Examples 179, 177)', () => {
    const text = '# Day 3\n\n<!-- run 7 was bad\n```levels\nid: run 7\n```\n-->\n\n```levels\nid: run 8\n```\n';
    const blocks = findFencedBlocks(text);
    assert.deepEqual(
      blocks.map((b) => b.body),
      ['id: run 8\n'],
    );
    // Example 179: the end marker may follow text on its line, and a blank line inside does not end the comment.
    assert.deepEqual(opens('<!-- Foo\n\n```levels\n   baz -->\n```levels\n```\n'), [4]);
    // Example 177: a comment that ends on its first line hides nothing after it.
    assert.deepEqual(opens('<!-- foo -->*bar*\n```levels\n```\n'), [1]);
    // `<!-->` holds `-->`: the block is that one line; an unclosed comment runs to the end of the note.
    assert.deepEqual(opens('<!-->\n```levels\n```\n'), [1]);
    assert.deepEqual(opens('<!--\n```levels\na: 1\n```\n\nmore\n'), []);
  });

  it('follows kind 1 (<pre, <script, <style, <textarea) to any of its end tags (Examples 169–173, 176, 178)', () => {
    // Example 170: `<script type=...>` to `</script>`; the fence after it is read.
    assert.deepEqual(opens('<script type="text/javascript">\n```levels\n</script>\n```levels\n```\n'), [3]);
    // Example 171: `<textarea>` with nothing after the name but `>`.
    assert.deepEqual(opens('<textarea>\n```levels\n</textarea>\n```levels\n```\n'), [3]);
    // Example 172: `<style` at the end of its line.
    assert.deepEqual(opens('<style\n  type="text/css">\n```levels\n</style>\n```levels\n```\n'), [4]);
    // Example 173: unclosed, it runs to the end of the note.
    assert.deepEqual(opens('<style\n  type="text/css">\n```levels\n```\n'), []);
    // Example 176: start and end tag on one line.
    assert.deepEqual(opens('<style>p{color:red;}</style>\n```levels\n```\n'), [1]);
    // Example 178: the end tag need not end the line, nor match the start tag (and is found in any case).
    assert.deepEqual(opens('<script>\n```levels\n</PRE>1. *bar*\n```levels\n```\n'), [3]);
    // Example 169: `<pre` followed by a space; `<pre/>` or `<prefix>` is no kind 1 start.
    assert.deepEqual(opens('<pre language="haskell"><code>\n```levels\n</code></pre>\n```levels\n```\n'), [3]);
    assert.deepEqual(opens('<prefix>\n```levels\n```\n'), [1]);
    // A closing tag `</pre>` alone starts no kind 1 block.
    assert.deepEqual(opens('</pre>\n```levels\n```\n'), [1]);
  });

  it('follows kinds 3, 4 and 5 to ?>, > and ]]> (Examples 180–182)', () => {
    // Example 180: `<?php` to the line holding `?>`.
    assert.deepEqual(opens("<?php\n```levels\n  echo '>';\n?>\n```levels\n```\n"), [4]);
    // Example 181: `<!DOCTYPE html>` ends on its own line.
    assert.deepEqual(opens('<!DOCTYPE html>\n```levels\n```\n'), [1]);
    assert.deepEqual(opens('<!DOCTYPE\n```levels\n>\n```levels\n```\n'), [3]);
    // `<!` not followed by a letter, `--` or `[CDATA[` starts nothing.
    assert.deepEqual(opens('<!1\n```levels\n```\n'), [1]);
    // Example 182: `<![CDATA[` to `]]>`; a `>` alone does not end it.
    assert.deepEqual(opens('<![CDATA[\n```levels\n a > b\n]]>\n```levels\n```\n'), [4]);
  });

  it('reads HTML inside a fence as the fence’s content (§4.5: the content is literal text)', () => {
    // The first fence's `<!--` is its content, and its closing fence is a fence; the `<!--` after it hides the third.
    const text = '```levels\n<!--\na: 1\n```\n```levels\nb: 2\n```\n<!--\n```levels\nc: 3\n```\n';
    const blocks = findFencedBlocks(text);
    assert.deepEqual(
      blocks.map((b) => b.body),
      ['<!--\na: 1\n', 'b: 2\n'],
    );
  });

  it('handles CRLF and lone CR line endings, a byte-order mark, and an HTML block at the note’s end', () => {
    assert.deepEqual(opens('<!--\r\n```levels\r\n-->\r\n```levels\r\n```\r\n'), [3]);
    assert.deepEqual(opens('<div>\r\r```levels\r```\r'), [2]);
    assert.deepEqual(opens('\ufeff<!--\n```levels\n```\n'), []);
    assert.deepEqual(opens('```levels\n```\n<!--'), [0]);
  });

  it('starts again after an HTML block where a scan from a fence opening would (the resume points of an edit)', () => {
    const text = '<!--\n```levels\n-->\n```levels\na: 1\n```\n<div>\n```levels\n\n```levels\nb\n```\n';
    const all = findFencedBlocks(text);
    assert.deepEqual(
      all.map((b) => b.openLine),
      [3, 9],
    );
    const from = [...scanFencedBlocks(text, all[0].openStart, all[0].openLine)];
    assert.deepEqual(from, all);
  });

  it('agrees with markdown-it (html enabled, as in the editor’s Markdown preview) on random notes of fences and HTML', () => {
    // The lines avoid what this scan does not parse (lists, block quotes, kind 7 tags, tables, link definitions,
    // tabs in an indented fence's content), so every other difference would be a fault.
    const md = new MarkdownIt({ html: true });
    const lines = fc.constantFrom(
      '',
      '  ',
      'Some prose.',
      '# Heading',
      'a: 1',
      '```levels',
      '```',
      '~~~',
      '````',
      '```python',
      '   ```levels',
      '    ```levels',
      '<!--',
      '<!-- a comment -->',
      '<!-->',
      'text -->',
      '-->',
      '  <!--',
      '    <!--',
      '<div>',
      '</div>',
      '<DIV class="a">',
      '<details>',
      '<hr/>',
      '<pre>',
      '<script>x = 1</script>',
      'x </script>',
      '<style',
      'x </STYLE> y',
      '<?php',
      '?>',
      '<!DOCTYPE html>',
      '<!DOCTYPE',
      'a > b',
      '<![CDATA[',
      ']]>',
    );
    fc.assert(
      fc.property(fc.array(lines, { maxLength: 40 }), fc.constantFrom('\n', '\r\n'), (ls, nl) => {
        const text = ls.join(nl);
        const want = md
          .parse(text, {})
          .filter((t) => t.type === 'fence')
          .map((t) => [t.map![0], t.info, t.content.trimEnd()]);
        // (markdown-it drops spaces on an unclosed fence's last line, at the note's end: only the ends are trimmed.)
        const got = findFencedBlocks(text).map((b) => [b.openLine, b.info, b.body.replace(/\r\n/g, '\n').trimEnd()]);
        assert.deepEqual(got, want);
      }),
      {
        numRuns: Number(process.env.FC_RUNS_SCALE ?? 1) * 1500,
        ...(process.env.FC_SEED ? { seed: Number(process.env.FC_SEED) } : {}),
      },
    );
  });

  it('scans hostile notes in one linear pass: 100,000 unclosed openers, or openers of every kind in turn', () => {
    const lines = 100_000;
    const cases = {
      'unclosed comments': '<!--\n'.repeat(lines),
      'unclosed kind 1': '<script\n'.repeat(lines),
      'openers in turn': ['<!--', '<?', '<![CDATA[', '<!A', '<pre', '<div>', '```levels', '']
        .join('\n')
        .concat('\n')
        .repeat(lines / 8),
      // Lines close other kinds than the one open: every search runs to its next marker, no further.
      'ends of other kinds': [
        '<!--',
        '?>',
        ']]>',
        '```levels',
        '-->',
        '<?',
        '-->',
        '>',
        '```levels',
        '?>',
        '<![CDATA[',
        '?>',
        '```levels',
        ']]>',
      ]
        .join('\n')
        .concat('\n')
        .repeat(lines / 14),
    };
    for (const [name, text] of Object.entries(cases)) {
      const work: ScanWork = { lines: 0, searched: 0 };
      const blocks = [...scanFencedBlocks(text, 0, 0, work)];
      // Each line once (and the empty one after the last line break).
      assert.equal(work.lines, text.split('\n').length, `${name}: lines visited`);
      // Every kind's end marker is searched for at most once over each stretch of the note.
      assert.ok(work.searched <= 6 * text.length, `${name}: ${work.searched} characters searched`);
      // Every fence is inside an HTML block.
      assert.equal(blocks.length, 0, name);
    }
  });
});

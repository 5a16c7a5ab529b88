import { strict as assert } from 'node:assert';
import MarkdownIt from 'markdown-it';
import { Analyzer } from '../../../src/core';
import { clipQuotes, clipText, QUOTE_CHARS } from '../../../src/core/text/common';

/** A CommonMark renderer, independent of the code under test. */
const md = new MarkdownIt();

/** The texts a CommonMark renderer shows as code spans in `markdown`, and the text it shows outside them. */
function spans(markdown: string): { code: string[]; prose: string } {
  const tokens = md.parseInline(markdown, {})[0]!.children!;
  return {
    code: tokens.filter((t) => t.type === 'code_inline').map((t) => t.content),
    prose: tokens
      .filter((t) => t.type === 'text')
      .map((t) => t.content)
      .join(''),
  };
}

describe('clipping what a message quotes of a note', () => {
  it('keeps text up to the limit and cuts longer text to the limit, ending in …, never inside a surrogate pair', () => {
    assert.equal(clipText('a'.repeat(QUOTE_CHARS)), 'a'.repeat(QUOTE_CHARS));
    assert.equal(clipText('a'.repeat(QUOTE_CHARS + 1)), `${'a'.repeat(QUOTE_CHARS - 1)}…`);
    for (let shift = 0; shift < 3; shift++) {
      const s = 'x'.repeat(shift) + '😀'.repeat(100);
      const c = clipText(s);
      assert.ok(c.length <= QUOTE_CHARS, `${c.length}`);
      assert.ok(c.endsWith('…'));
      // Every pair whole: the clipped text is its characters, each of the original.
      assert.equal(c.slice(0, -1), s.slice(0, c.length - 1));
      assert.doesNotMatch(c, /[\uD800-\uDBFF](?![\uDC00-\uDFFF])/);
    }
  });

  it('clips only the long quotations of a message, and a message past 2,000 characters as a whole', () => {
    const short = 'gap: Unknown unit `Kx`; did you mean `K`?';
    assert.equal(clipQuotes(short), short);
    const long = `gap: Unknown unit \`${'K'.repeat(5000)}\`: an energy (\`J\`, \`eV\`) is needed here.`;
    assert.equal(
      clipQuotes(long),
      `gap: Unknown unit \`${'K'.repeat(QUOTE_CHARS - 1)}…\`: an energy (\`J\`, \`eV\`) is needed here.`,
    );
    const unquoted = 'x'.repeat(5000);
    assert.equal(clipQuotes(unquoted).length, 2000);
  });

  it('keeps quoted note text that holds backticks inside its quotation, for a CommonMark renderer', () => {
    const cases: { quoted: string; expect: string }[] = [
      { quoted: 'a`b', expect: 'a`b' },
      { quoted: 'x` y', expect: 'x` y' },
      { quoted: 'a `b` c', expect: 'a `b` c' },
      { quoted: '`lead', expect: '`lead' },
      { quoted: 'trail`', expect: 'trail`' },
      { quoted: 'two``ticks', expect: 'two``ticks' },
      // Long: clipped to the limit, the backtick it keeps still inside.
      {
        quoted: `${'k'.repeat(10)}\`${'m'.repeat(100)}`,
        expect: `${'k'.repeat(10)}\`${'m'.repeat(QUOTE_CHARS - 12)}…`,
      },
    ];
    for (const { quoted, expect } of cases) {
      const message = `Unknown key \`${quoted}\`; it is ignored. Did you mean \`polarization\`?`;
      const out = spans(clipQuotes(message));
      assert.deepEqual(out.code, [expect, 'polarization'], message);
      assert.equal(out.prose, 'Unknown key ; it is ignored. Did you mean ?', message);
    }
  });

  it('never clips the message’s own words, even when quoted text with a backtick shifts the backticks', () => {
    // Paired in turn, the backticks would make `; it is ignored … such as ` a quotation, and clip it.
    const own = '; it is ignored, and these words of the message itself run well past sixty characters, such as ';
    const message = `Unknown key \`ab\`c\`${own}\`K\`.`;
    const out = clipQuotes(message);
    assert.ok(out.includes(own), out);
    assert.deepEqual(spans(out).code, ['ab`c', 'K']);
  });

  it('cuts a message past 2,000 characters before a quotation, never inside it', () => {
    const message = `${'w'.repeat(1990)} \`${'q'.repeat(30)}\` end`;
    const out = clipQuotes(message);
    assert.ok(out.length <= 2000, `${out.length}`);
    assert.equal(out, `${'w'.repeat(1990)} …`);
  });

  it('passes the analyzer’s messages through: a key with a backtick stays quoted in the diagnostic', () => {
    const key = `weird\`key${'x'.repeat(80)}`;
    const [block] = new Analyzer().analyzeText(`\`\`\`levels\ngap: 10 K\nratio: 0.5\n"${key}": 1\n\`\`\`\n`).blocks;
    const problem = block!.problems.find((p) => p.code === 'key-unknown')!;
    const out = spans(problem.message);
    assert.equal(out.code.length, 1, problem.message);
    assert.ok(out.code[0]!.startsWith('weird`key'), problem.message);
    assert.match(out.prose, /^Unknown key ; it is ignored\.$/);
  });
});

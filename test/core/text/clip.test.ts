import { strict as assert } from 'node:assert';
import { clipQuotes, clipText, QUOTE_CHARS } from '../../../src/core/text/common';

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
});

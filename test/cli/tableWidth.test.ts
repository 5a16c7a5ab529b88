import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { textWidth } from '../../src/cli/formats';
import { main } from '../../src/cli/main';

// The human table measures text in terminal columns (Unicode Standard Annex #11, East Asian Width): a wide or
// fullwidth character takes two, a combining mark or a zero-width character none, so the columns after an id in
// Japanese, Korean or Chinese, or with accents written as combining marks, still line up.

describe('boltzmark report: the table in terminal columns', () => {
  it('measures wide, fullwidth, combining and zero-width characters and emoji as a terminal shows them', () => {
    const cases: [string, number][] = [
      ['T1 run', 6],
      ['測定', 4], // CJK unified ideographs: W
      ['한국어', 6], // Hangul syllables: W
      ['\u1100\u1161\u11a8', 2], // one syllable from conjoining Jamo
      ['ｶﾀｶﾅ', 4], // halfwidth katakana: H, one column each
      ['ＡＢ', 4], // fullwidth Latin: F
      ['e\u0301te\u0301', 3], // été with combining acute accents
      ['a\u200bb\u200d', 2], // zero width space and joiner
      ['😀', 2], // Emoji_Presentation
      ['👩‍🔬', 2], // a ZWJ sequence
      ['❤️', 2], // text pictograph + U+FE0F
      ['🇯🇵', 2], // a flag
      ['(5.11 ± 0.19) × 10⁷', 19],
      ['—', 1],
    ];
    for (const [text, width] of cases) assert.equal(textWidth(text), width, JSON.stringify(text));
  });

  it('lines up the columns after ids of wide characters and of combining marks', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-width-'));
    try {
      const block = (id: string): string => `\`\`\`levels\nid: "${id}"\ngap: 10 K\nratio: 0.5\n\`\`\`\n\n`;
      writeFileSync(join(dir, 'w.md'), ['abcdef', '測定値', 'cafe\u0301s!', '🔬 run'].map(block).join(''));
      let out = '';
      main(['report', 'w.md', '--wide'], { out: (s) => (out += s), err: () => undefined, cwd: dir });
      const rows = out.split('\n').filter((l) => l.startsWith('w.md:'));
      assert.equal(rows.length, 4, out);
      // Every id is six columns wide: the status starts in the same terminal column on every row.
      const statusColumn = rows.map((r) => textWidth(r.slice(0, r.indexOf('normal'))));
      assert.deepEqual(new Set(statusColumn).size, 1, out);
      // And each id is followed by exactly the two spaces between columns.
      for (const r of rows) assert.match(r, /^w\.md:\d+ +\S.*\S {2}normal/u, r);
      const ids = rows.map((r) => /^w\.md:\d+ +(.+?) {2}normal/u.exec(r)![1]);
      assert.deepEqual(ids, ['abcdef', '測定値', 'cafe\u0301s!', '🔬 run']);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('shortens a long id of wide characters to the columns it may take, never inside a character', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-width-'));
    try {
      const id = '測'.repeat(60);
      writeFileSync(join(dir, 'w.md'), `\`\`\`levels\nid: ${id}\ngap: 10 K\nratio: 0.5\n\`\`\`\n`);
      let out = '';
      main(['report', 'w.md'], { out: (s) => (out += s), err: () => undefined, cwd: dir, columns: 80 });
      for (const line of out.split('\n')) assert.ok(textWidth(line) <= 80, `${textWidth(line)}: ${line}`);
      const row = out.split('\n').find((l) => l.startsWith('w.md:'))!;
      assert.match(row, /^w\.md:1 +測+… +normal/u);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

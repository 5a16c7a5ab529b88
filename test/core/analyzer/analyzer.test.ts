import { strict as assert } from 'node:assert';
import { Analyzer, type DocumentReport } from '../../../src/core';

// The Analyzer's per-block cache and its bounds (docs/format.md#note-bounded).
const block = (i: number): string => `\`\`\`levels\nid: run ${i}\ngap: 1 K\npopulations: [0.7, 0.3]\n\`\`\`\n`;
const note = (ids: readonly number[]): string => ids.map(block).join('\n');

describe('the analyzer of a whole note', () => {
  it('reads an edited block again and reuses every other one', () => {
    const a = new Analyzer();
    assert.deepEqual(a.analyzeText(note([1, 2, 3])).stats, { analysed: 3, reused: 0 });
    assert.deepEqual(a.analyzeText(note([1, 22, 3])).stats, { analysed: 1, reused: 2 });
  });

  it('evicts the least recently used blocks first when the cache is full', () => {
    const a = new Analyzer({ cacheSize: 10 });
    a.analyzeText(note([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]));
    // Block 0 is used again, then eleven new ones overflow the cache: the blocks least recently used go.
    a.analyzeText(note([0]));
    a.analyzeText(note([10, 11, 12, 13, 14, 15, 16, 17, 18, 19, 20]));
    assert.deepEqual(
      a.analyzeText(note([0])).stats,
      { analysed: 1, reused: 0 },
      'all older blocks were evicted to make room',
    );
    const b = new Analyzer({ cacheSize: 10 });
    b.analyzeText(note([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]));
    b.analyzeText(note([0]));
    b.analyzeText(note([10]));
    assert.deepEqual(b.analyzeText(note([0])).stats, { analysed: 0, reused: 1 }, 'the recently used block survives');
    assert.deepEqual(b.analyzeText(note([1])).stats, { analysed: 1, reused: 0 }, 'the least recently used one went');
  });

  it('bounds the characters of bodies it keeps, beside those of the note analysed last', () => {
    // A body of 10,000 characters edited again and again leaves a new body each time; 30,000 characters are kept.
    const long = (i: number): string =>
      `\`\`\`levels\nid: run ${i}\ngap: 1 K\npopulations: [0.7, 0.3]\nnote: ${'y'.repeat(10_000)}\n\`\`\`\n`;
    const a = new Analyzer({ cacheChars: 30_000 });
    for (let i = 0; i < 50; i++) a.analyzeText(long(i));
    assert.deepEqual(a.analyzeText(long(49)).stats, { analysed: 0, reused: 1 }, 'the last one is kept');
    assert.deepEqual(a.analyzeText(long(0)).stats, { analysed: 1, reused: 0 }, 'an old body was let go');
    const unbounded = new Analyzer();
    for (let i = 0; i < 50; i++) unbounded.analyzeText(long(i));
    assert.deepEqual(unbounded.analyzeText(long(0)).stats, { analysed: 0, reused: 1 }, 'without the bound all stay');
    // A note larger than the bound is kept whole: analysed again, nothing is read afresh.
    const big = [0, 1, 2, 3, 4, 5].map(long).join('\n');
    const b = new Analyzer({ cacheChars: 30_000 });
    b.analyzeText(big);
    assert.deepEqual(b.analyzeText(big).stats, { analysed: 0, reused: 6 });
  });

  it('stops before the first block past a bound and says where, on the first line', () => {
    const text = `# Notebook\n${note([1, 2, 3])}`;
    const r = new Analyzer({ limits: { maxBlocks: 2, maxBodyChars: Infinity } }).analyzeText(text);
    assert.equal(r.blocks.length, 2);
    assert.equal(r.bounded?.reason, 'blocks');
    assert.equal(r.bounded?.line, 13);
    assert.deepEqual(
      r.problems.map((p) => [p.code, p.severity, p.span]),
      [['note-bounded', 'warning', { start: 0, end: 10 }]],
    );
    assert.match(r.problems[0]!.message, /line 14/);
    const bySize = new Analyzer({ limits: { maxBlocks: Infinity, maxBodyChars: 100 } }).analyzeText(text);
    assert.equal(bySize.blocks.length, 2);
    assert.equal(bySize.bounded?.reason, 'size');
    assert.deepEqual(new Analyzer().analyzeText(text).problems, [], 'the default has no bound');
  });

  describe('after an edit (the note is scanned again only where it changed)', () => {
    /** Where each block is, what it says, and where its problems point: what a host reads. */
    const view = (r: DocumentReport): unknown =>
      r.blocks.map((b) => ({
        block: b.block,
        status: b.status,
        problems: b.problems,
        id: b.meta.id,
        idAt: b.meta.idSpan && b.toNote(b.meta.idSpan),
      }));
    /** The warm analyzer's report of `after`, checked against a fresh analyzer's. */
    const edited = (before: string, after: string): DocumentReport => {
      const a = new Analyzer();
      a.analyzeText(before);
      const r = a.analyzeText(after);
      assert.deepStrictEqual(view(r), view(new Analyzer().analyzeText(after)));
      return r;
    };

    it('moves the blocks after a longer or shorter block to their new offsets and lines', () => {
      const before = `# Notebook\n\n${note([1, 2, 3])}`;
      const r = edited(before, before.replace('run 2', 'run 2\nsample: the second, longer'));
      assert.deepEqual(r.stats, { analysed: 1, reused: 2 });
      assert.equal(r.blocks[2]!.block.openLine, 15, 'the third block moved down a line');
      assert.equal(r.blocks[2]!.meta.id, 'run 3');
      edited(before, before.replace('ratio', 'r').replace('\n\n```levels\nid: run 3', '```levels\nid: run 3'));
    });

    it('follows a fence typed into the prose, which swallows the block after it, and its removal', () => {
      const before = `Intro\n\n${note([1, 2, 3])}`;
      const opened = before.replace('Intro', '```\nIntro');
      // The new fence runs to the first block's closing fence, so that block is code now; the other two stay.
      assert.deepEqual(
        edited(before, opened).blocks.map((b) => b.meta.id),
        ['run 2', 'run 3'],
      );
      edited(opened, before);
      edited(before, before.replace('id: run 2', '```\nid: run 2'));
    });

    it('counts a line break typed between a CR and the fence after it as part of one CRLF break', () => {
      // "\r" then "\n" is a single line break: the fence stays on the line after the CR.
      const before = 'Intro\r```levels\rgap: 1 K\rratio: 0.5\r```\r';
      const r = edited(before, before.replace('\r```levels', '\r\n```levels'));
      assert.equal(r.blocks[0]!.block.openLine, 1);
      edited(before, before.replace('ratio: 0.5\r```', 'ratio: 0.5\r\n```'));
    });

    it('stops at the same bound as a fresh analysis, and goes past it once the note is shorter', () => {
      const limits = { maxBlocks: 2, maxBodyChars: Infinity };
      const before = note([1, 2, 3, 4]);
      const a = new Analyzer({ limits });
      assert.equal(a.analyzeText(before).bounded?.line, 12);
      const after = before.replace('id: run 1\ngap: 1 K\npopulations: [0.7, 0.3]\n```\n\n```levels\n', '');
      const r = a.analyzeText(after);
      assert.deepStrictEqual(view(r), view(new Analyzer({ limits }).analyzeText(after)));
      assert.equal(r.bounded?.line, 12, 'run 4 is now the third block');
    });
  });
});

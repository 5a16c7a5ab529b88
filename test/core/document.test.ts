import { strict as assert } from 'node:assert';
import { Analyzer } from '../../src/core';

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
    assert.deepEqual(a.analyzeText(note([0])).stats, { analysed: 1, reused: 0 }, 'all older blocks were evicted to make room');
    const b = new Analyzer({ cacheSize: 10 });
    b.analyzeText(note([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]));
    b.analyzeText(note([0]));
    b.analyzeText(note([10]));
    assert.deepEqual(b.analyzeText(note([0])).stats, { analysed: 0, reused: 1 }, 'the recently used block survives');
    assert.deepEqual(b.analyzeText(note([1])).stats, { analysed: 1, reused: 0 }, 'the least recently used one went');
  });

  it('stops before the first block past a bound and says where, on the first line', () => {
    const text = `# Notebook\n${note([1, 2, 3])}`;
    const r = new Analyzer({ limits: { maxBlocks: 2, maxBodyChars: Infinity } }).analyzeText(text);
    assert.equal(r.blocks.length, 2);
    assert.equal(r.bounded?.reason, 'blocks');
    assert.equal(r.bounded?.line, 13);
    assert.deepEqual(r.problems.map((p) => [p.code, p.severity, p.span]), [['note-bounded', 'warning', { start: 0, end: 10 }]]);
    assert.match(r.problems[0]!.message, /line 14/);
    const bySize = new Analyzer({ limits: { maxBlocks: Infinity, maxBodyChars: 100 } }).analyzeText(text);
    assert.equal(bySize.blocks.length, 2);
    assert.equal(bySize.bounded?.reason, 'size');
    assert.deepEqual(new Analyzer().analyzeText(text).problems, [], 'the default has no bound');
  });
});

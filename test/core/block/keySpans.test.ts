import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Analyzer } from '../../../src/core';
import { KeySpans } from '../../../src/core/block/keySpans';

// KeySpans must behave as the Map it replaces (common practice, no source: the ReadonlyMap contract).
describe('KeySpans, the compact key → spans map of a block', () => {
  // Spans counted by hand in the body below (offsets from its first character).
  const body = 'id: a\nsystem: 1H\nfield: 7 T\n';
  const map = new Map([
    ['id', { key: { start: 0, end: 2 }, value: { start: 4, end: 5 } }],
    ['system', { key: { start: 6, end: 12 }, value: { start: 14, end: 16 } }],
    ['field', { key: { start: 17, end: 22 }, value: { start: 24, end: 27 } }],
  ]);

  it('answers size, has, get and iteration as a Map of the spans would', () => {
    const keys = new KeySpans(body);
    assert.equal(keys.size, map.size);
    assert.deepEqual([...keys.keys()], [...map.keys()]);
    assert.deepEqual([...keys], [...map]);
    assert.deepEqual([...keys.values()], [...map.values()]);
    for (const k of ['id', 'system', 'field', 'gap']) {
      assert.equal(keys.has(k), map.has(k), k);
      assert.deepEqual(keys.get(k), map.get(k), k);
    }
    const seen: string[] = [];
    keys.forEach((v, k, m) => {
      assert.equal(m, keys);
      assert.deepEqual(v, map.get(k));
      seen.push(k);
    });
    assert.deepEqual(seen, ['id', 'system', 'field']);
  });

  it('keeps the string the caller chooses for each name, and has no keys for a body that is no mapping', () => {
    const own = 'system';
    const keys = new KeySpans(body, (name) => (name === 'system' ? own : name));
    assert.ok([...keys.keys()].includes(own));
    assert.equal(new KeySpans('- a\n- b\n').size, 0);
    assert.equal(new KeySpans('a: [\n').has('b'), false);
  });

  it('finds the same spans as the block reader for every demo block', () => {
    const note = readFileSync(join(__dirname, '../../../demo/measurements.md'), 'utf8');
    for (const b of new Analyzer().analyzeText(note).blocks) {
      for (const [name, at] of b.meta.keys) {
        assert.equal(b.block.body.slice(at.key.start, at.key.end), name, 'the key span holds the key');
        assert.ok(at.value.start >= at.key.end && at.value.end <= b.block.body.length, name);
      }
    }
  });
});

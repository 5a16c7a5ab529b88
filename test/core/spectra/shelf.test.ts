/** The shelf of parsed spectra: one parse per file identity, a memory bound, least recently used dropped first. */
import { strict as assert } from 'node:assert';
import { shelfSource, SpectrumShelf, SPECTRUM_MAX_BYTES, type FileStat } from '../../../src/core';

/** n points of a two-column text file: 16 bytes per point once parsed. */
function text(n: number): string {
  return Array.from({ length: n }, (_, i) => `${i},${i % 7}`).join('\n');
}

describe('the spectrum shelf', () => {
  it('parses a file once per identity and again when its size or time changes', () => {
    const shelf = new SpectrumShelf();
    const stat: FileStat = { size: 10, mtime: 1 };
    assert.equal(shelf.get('/a.csv', stat), undefined);
    shelf.readInto('/a.csv', stat, text(10));
    assert.ok(shelf.get('/a.csv', stat)?.ok);
    assert.equal(shelf.get('/a.csv', { size: 10, mtime: 2 }), undefined);
    assert.equal(shelf.get('/a.csv', { size: 11, mtime: 1 }), undefined);
    assert.equal(shelf.parses, 1);
  });

  it('stays within its memory bound, dropping the least recently used first', () => {
    // Each 1000-point file holds 16,000 bytes of arrays plus bookkeeping; the bound fits two.
    const shelf = new SpectrumShelf(40_000);
    const s = (m: number): FileStat => ({ size: 1, mtime: m });
    shelf.readInto('/a', s(1), text(1000));
    shelf.readInto('/b', s(1), text(1000));
    assert.ok(shelf.get('/a', s(1)), 'a used again: b is now the older');
    shelf.readInto('/c', s(1), text(1000));
    assert.equal(shelf.size, 2);
    assert.ok(shelf.bytes <= 40_000);
    assert.ok(shelf.get('/a', s(1)));
    assert.equal(shelf.get('/b', s(1)), undefined);
    assert.ok(shelf.get('/c', s(1)));
    shelf.forget('/a');
    assert.equal(shelf.size, 1);
  });

  it('answers large files by their size without reading them', () => {
    let reads = 0;
    const source = shelfSource(
      new SpectrumShelf(),
      {
        stat: () => ({ size: SPECTRUM_MAX_BYTES + 1, mtime: 5 }),
        readText: () => {
          reads++;
          return '';
        },
      },
      (w) => ({ path: `/lab/${w}` }),
    );
    const a = source.lookup('big.jdx');
    assert.equal(a.state, 'large');
    assert.equal(reads, 0);
  });
});

import { strict as assert } from 'node:assert';
import { closest, editDistance, nearest } from '../../../src/core/text/suggest';

describe('editDistance', () => {
  it('is zero for equal strings and the length of the other string when one is empty', () => {
    assert.equal(editDistance('', ''), 0);
    assert.equal(editDistance('mT', 'mT'), 0);
    assert.equal(editDistance('', 'GHz'), 3);
    assert.equal(editDistance('GHz', ''), 3);
  });

  it('gives 3 for kitten and sitting, the classic Levenshtein example', () => {
    // Textbook example of the Levenshtein distance (from memory).
    assert.equal(editDistance('kitten', 'sitting'), 3);
  });

  it('counts a swap of two adjacent characters as one edit', () => {
    // Damerau's transposition; common practice, no source.
    assert.equal(editDistance('ab', 'ba'), 1);
    assert.equal(editDistance('13C', '31C'), 1);
    assert.equal(editDistance('MHz', 'MzH'), 1);
  });

  it('never edits a substring twice, so ca to abc costs 3 and not 2', () => {
    // Known difference between the optimal-string-alignment and the unrestricted
    // Damerau-Levenshtein distance (from memory).
    assert.equal(editDistance('ca', 'abc'), 3);
  });

  it('counts code points, so the micro sign is one character', () => {
    assert.equal(editDistance('µK', 'uK'), 1);
    assert.equal(editDistance('°C', 'C'), 1);
  });

  it('is case-sensitive', () => {
    assert.equal(editDistance('MT', 'mT'), 1);
  });

  it('stops at the bound and then returns bound plus one', () => {
    assert.equal(editDistance('kitten', 'sitting', 1), 2);
    assert.equal(editDistance('kitten', 'sitting', 3), 3);
    assert.equal(editDistance('a', 'abcdef', 2), 3);
    assert.equal(editDistance('abc', 'abd', 0), 1);
  });

  it('with a bound, answers as the unbounded distance capped at bound + 1, astral characters and long words too', () => {
    // The bound is checked on lengths first, in UTF-16 units: a pair of units may be one character (😀, 𝔘), so
    // that check must not refuse a pair whose characters are near. Words made of such characters and of plain
    // ones, and a megabyte of text against a unit (which the check answers without splitting the text).
    let seed = 7;
    const next = (n: number): number => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) >> 8) % n;
    const alphabet = ['a', 'b', 'K', 'µ', '😀', '𝔘', '°'];
    const word = (): string => Array.from({ length: next(7) }, () => alphabet[next(alphabet.length)]).join('');
    for (let i = 0; i < 3000; i++) {
      const a = word();
      const b = word();
      const full = editDistance(a, b);
      for (const bound of [0, 1, 2, 3, 5])
        assert.equal(editDistance(a, b, bound), Math.min(full, bound + 1), `${a} / ${b} / ${bound}`);
    }
    assert.equal(editDistance('😀😀😀', 'abc', 2), 3);
    assert.equal(editDistance('😀😀😀', 'abc', 3), 3);
    assert.equal(editDistance('K'.repeat(1_000_000), 'kHz', 2), 3);
    assert.equal(editDistance('mT', 'K'.repeat(1_000_000), 2), 3);
  });

  it('is symmetric', () => {
    const words = ['electron', 'elektron', 'C13', '13C', 'cm^-1', 'cm-1', ''];
    for (const a of words) for (const b of words) assert.equal(editDistance(a, b), editDistance(b, a), `${a} / ${b}`);
  });
});

describe('closest', () => {
  it('returns the nearest candidate within the limit', () => {
    assert.equal(closest('elektron', ['1H', 'electron', '13C'], 2), 'electron');
    assert.equal(closest('lattise', ['lattice', 'count', 'note'], 2), 'lattice');
  });

  it('returns null when no candidate is within the limit', () => {
    assert.equal(closest('furlongs', ['m', 'cm', 'mm'], 2), null);
    assert.equal(closest('abc', [], 5), null);
  });

  it('prefers the candidate listed first when two are equally near', () => {
    assert.equal(closest('xT', ['mT', 'nT'], 1), 'mT');
    assert.equal(closest('xT', ['nT', 'mT'], 1), 'nT');
  });

  it('prefers a nearer candidate listed later over a farther one listed first', () => {
    assert.equal(closest('popluation', ['polarization', 'population'], 3), 'population');
  });

  it('can compare without case and still returns the candidate as written', () => {
    assert.equal(closest('mhz', ['kHz', 'MHz'], 0, { ignoreCase: true }), 'MHz');
    assert.equal(closest('mhz', ['kHz', 'MHz'], 0), null);
  });
});

describe('nearest', () => {
  it('lists the candidates within the distance, nearest first, ties in code-unit order', () => {
    // kitten→sitting is 3 edits, kitten→mitten 1 (a substitution each; from memory, the Levenshtein textbook case).
    assert.deepEqual(nearest('kitten', ['sitting', 'mitten', 'bitten', 'kitchen', 'dog'], 3, 5), [
      'bitten',
      'mitten',
      'kitchen',
      'sitting',
    ]);
  });

  it('keeps at most `count`, and none beyond the distance', () => {
    assert.deepEqual(nearest('run 1', ['run 2', 'run 3', 'run 4'], 1, 2), ['run 2', 'run 3']);
    assert.deepEqual(nearest('run 1', ['cell-B'], 2, 5), []);
  });

  it('can compare without case and returns the candidates as written', () => {
    assert.deepEqual(nearest('CELL-B', ['cell-b', 'Cell-C'], 1, 5, { ignoreCase: true }), ['cell-b', 'Cell-C']);
    assert.deepEqual(nearest('CELL-B', ['cell-b'], 1, 5), []);
  });
});

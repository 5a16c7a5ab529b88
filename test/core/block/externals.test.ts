import { strict as assert } from 'node:assert';
import { dependenciesHold, type Externals } from '../../../src/core/block/externals';
import { depend, type ReadContext } from '../../../src/core/block/values';
import { interpretBody } from '../../../src/core/block/interpret';

/** A host's sources as a table of stamps, for one note. */
function host(note: string, stamps: Record<string, string | null>): Externals {
  return { note, stamp: (key) => (key in stamps ? stamps[key]! : null) };
}

describe('block externals: what a block read from outside, and when that still holds', () => {
  it('holds while every stamp is unchanged, for the same note only', () => {
    const deps = [
      { key: '/lab/spectra/a.jdx', stamp: '120:1700000000' },
      { key: 'run:ref-13C', stamp: null },
    ];
    const same = host('/lab/day.md', { '/lab/spectra/a.jdx': '120:1700000000' });
    assert.equal(dependenciesHold(deps, '/lab/day.md', same), true);
    // The file changed on disk.
    assert.equal(
      dependenciesHold(deps, '/lab/day.md', host('/lab/day.md', { '/lab/spectra/a.jdx': '121:1700000005' })),
      false,
    );
    // The referenced run appeared (it was looked for and not found before).
    assert.equal(
      dependenciesHold(
        deps,
        '/lab/day.md',
        host('/lab/day.md', { '/lab/spectra/a.jdx': '120:1700000000', 'run:ref-13C': 'v1' }),
      ),
      false,
    );
    // Another note: references are relative to their note, so the reading does not carry over.
    assert.equal(
      dependenciesHold(deps, '/lab/day.md', host('/lab/other.md', { '/lab/spectra/a.jdx': '120:1700000000' })),
      false,
    );
    // No host at all.
    assert.equal(dependenciesHold(deps, '/lab/day.md', null), false);
  });

  it('a block that read nothing from outside always holds, with or without a host', () => {
    assert.equal(dependenciesHold([], null, null), true);
    assert.equal(dependenciesHold([], null, host('/x.md', {})), true);
  });

  it('records each key once, with the stamp first read', () => {
    const ctx: ReadContext = { body: '', problems: [], deps: [] };
    depend(ctx, 'a', '1');
    depend(ctx, 'a', '2');
    depend(ctx, 'b', null);
    assert.deepEqual(ctx.deps, [
      { key: 'a', stamp: '1' },
      { key: 'b', stamp: null },
    ]);
  });

  it('an ordinary block reads nothing from outside', () => {
    const r = interpretBody('system: 13C\nfield: 9.4 T\nlattice: 1.2 K\npolarization: 30 %\n', host('/n.md', {}));
    assert.equal(r.problems.filter((p) => p.severity === 'error').length, 0);
    assert.deepEqual(r.deps, []);
  });
});

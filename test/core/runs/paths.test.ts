import { strict as assert } from 'node:assert';
import {
  isInside,
  resolveNotePath,
  splitReference,
  RunBook,
  parseRunKey,
  runRefKey,
  runCopiesKey,
} from '../../../src/core';

describe('runs by reference: note paths, keys and the book’s look-ups', () => {
  it('splits a reference into its note and id only when the part before # names a note', () => {
    assert.deepEqual(splitReference('other.md#run 4'), { note: 'other.md', id: 'run 4', idOffset: 9 });
    assert.deepEqual(splitReference('../day 2/nb.ipynb# ref'), { note: '../day 2/nb.ipynb', id: 'ref', idOffset: 19 });
    assert.deepEqual(splitReference('run #4'), { note: null, id: 'run #4', idOffset: 0 });
    assert.deepEqual(splitReference('  ref-13C'), { note: null, id: 'ref-13C', idOffset: 2 });
  });

  it('resolves a relative note path against a path or a URI, encoding spaces in URIs', () => {
    assert.equal(resolveNotePath('/lab/runs/r1.md', '../refs/mon.md'), '/lab/refs/mon.md');
    assert.equal(resolveNotePath('/lab/r1.md', './a/./b.md'), '/lab/a/b.md');
    assert.equal(resolveNotePath('/lab/r1.md', '../../../../x.md'), '/x.md');
    assert.equal(resolveNotePath('C:\\lab\\runs\\r1.md', '..\\refs\\mon.md'), 'C:/lab/refs/mon.md');
    assert.equal(resolveNotePath('file:///lab/runs/r1.md', '../my refs/mon.md'), 'file:///lab/my%20refs/mon.md');
    assert.equal(resolveNotePath('file:///lab/a%20b/r1.md', 'mon.md'), 'file:///lab/a%20b/mon.md');
    assert.equal(
      resolveNotePath('vscode-notebook-cell:/lab/nb.ipynb#W1sZmlsZQ%3D%3D', 'ref.md'),
      'vscode-notebook-cell:/lab/ref.md',
    );
    assert.ok(isInside('/lab/refs/mon.md', '/lab'));
    assert.ok(!isInside('/laboratory/x.md', '/lab'));
  });

  it('round-trips its dependency keys, whatever characters a note or id holds', () => {
    const k = runRefKey('file:///a "b"/c.md', null, 'id # with "quotes"');
    assert.deepEqual(parseRunKey(k), { kind: 'ref', from: 'file:///a "b"/c.md', note: null, id: 'id # with "quotes"' });
    assert.deepEqual(parseRunKey(runCopiesKey('x')), { kind: 'copies', id: 'x' });
    assert.equal(parseRunKey('file:/x'), null);
    assert.equal(parseRunKey('run:{not json'), null);
  });

  it('finds the reference and the id under a cursor, with note offsets', () => {
    const text =
      '# day\n\n```levels\nid: r1\nsystem: 13C\nfield: 3 T\nsignal:\n  hyperpolarized: 5\n  thermal: { run: ref.md#R }\n```\n';
    const book = new RunBook();
    book.setNote('/w/run.md', text);
    book.setNote(
      '/w/ref.md',
      '```levels\nid: R\nsystem: 13C\nfield: 3 T\nlattice: 298 K\nsignal: { thermal: 1 }\n```\n',
    );
    const at = text.indexOf('#R') + 1;
    const r = book.referenceAt('/w/run.md', at)!;
    assert.equal(text.slice(r.idSpan.start, r.idSpan.end), 'R');
    assert.equal(text.slice(r.span.start, r.span.end), 'ref.md#R');
    assert.equal(book.referenceAt('/w/run.md', 3), null);
    const id = book.idAt('/w/run.md', text.indexOf('r1') + 1)!;
    assert.equal(id.id, 'r1');
    assert.equal(book.target('/w/run.md', r.ref)?.id, 'R');
    assert.deepEqual(
      book.runs().map((b) => b.id),
      ['r1', 'R'],
    );
  });
});

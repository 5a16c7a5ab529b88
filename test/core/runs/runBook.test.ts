import { strict as assert } from 'node:assert';
import { Analyzer, RunBook, type BlockReport } from '../../../src/core';
import { fence, hpBlock, refBlock } from '../../support/runNotes';

// Invented notes: the numbers only exercise the reading of references (physics checks are in physics.test.ts).

const REF = refBlock();

const hp = (id: string, ref: string): string => hpBlock(id, ref);

/** Sets the notes, then analyses one of them as a host does. */
function analyse(book: RunBook, note: string, analyzer = new Analyzer()): readonly BlockReport[] {
  const text = noteText.get(note)!;
  return analyzer.analyzeText(text, book.externalsFor(note)).blocks;
}
const noteText = new Map<string, string>();
function set(book: RunBook, note: string, text: string): void {
  noteText.set(note, text);
  book.setNote(note, text);
}
const codes = (r: BlockReport): string[] => r.problems.map((p) => p.code);

describe('runs by reference: the book', () => {
  it('follows a bare id within a note and records the reference with its spans', () => {
    const book = new RunBook();
    const text = '# Monday\n\n' + REF + '\n' + hp('run 1', 'ref-13C Monday');
    set(book, '/lab/mon.md', text);
    const [ref, run] = analyse(book, '/lab/mon.md');
    assert.deepEqual(codes(ref!), []);
    assert.equal(ref!.status, 'normal');
    assert.deepEqual(codes(run!), []);
    assert.equal(run!.status, 'normal');
    const refs = run!.meta.refs!;
    assert.equal(refs.length, 1);
    assert.equal(refs[0]!.id, 'ref-13C Monday');
    assert.equal(refs[0]!.note, null);
    const idSpan = run!.toNote(refs[0]!.idSpan);
    assert.equal(text.slice(idSpan.start, idSpan.end), 'ref-13C Monday');
    assert.equal(run!.results!.signal!.thermalRun!.id, 'ref-13C Monday');
    assert.ok(run!.deps.length > 0);
  });

  it('follows `note.md#id` relative to the referring note, and finds the id line', () => {
    const book = new RunBook();
    set(book, '/lab/refs/mon.md', REF);
    set(book, '/lab/runs/r1.md', hp('run 1', '../refs/mon.md#ref-13C Monday'));
    const [run] = analyse(book, '/lab/runs/r1.md');
    assert.deepEqual(codes(run!), []);
    const refs = run!.meta.refs!;
    assert.equal(refs[0]!.note, '../refs/mon.md');
    const target = book.target('/lab/runs/r1.md', refs[0]!);
    assert.equal(target?.note, '/lab/refs/mon.md');
    assert.equal(target?.place?.line, 1);
    assert.equal(REF.slice(target!.place!.span.start, target!.place!.span.end), 'ref-13C Monday');
    assert.deepEqual(
      book.referrers(target!).map((r) => r.from.note),
      ['/lab/runs/r1.md'],
    );
    assert.deepEqual(book.dependents('/lab/refs/mon.md'), ['/lab/runs/r1.md']);
  });

  it("reads a note set in parts from its parts: paths from the whole note's folder, `whole#id` finds a part's block", () => {
    // A host that sets a note in parts (the cells of a notebook open in an editor) names each part `whole|k`.
    const book = new RunBook({ partOf: (n) => (n.includes('|') ? n.slice(0, n.indexOf('|')) : null) });
    set(book, '/lab/refs/mon.md', REF);
    set(book, '/lab/day/nb.ipynb|1', '# Tuesday\n');
    set(book, '/lab/day/nb.ipynb|2', hp('run 1', '../refs/mon.md#ref-13C Monday'));
    // Resolved from the notebook's folder, not from a folder named after the part.
    const [run] = analyse(book, '/lab/day/nb.ipynb|2');
    assert.deepEqual(codes(run!), []);
    assert.equal(book.notePath('/lab/day/nb.ipynb|2', '../refs/mon.md'), '/lab/refs/mon.md');
    // Another note names the whole: the run is found in the part that holds it.
    set(book, '/lab/day/next.md', hp('run 2', 'nb.ipynb#run 1'));
    const [next] = analyse(book, '/lab/day/next.md');
    assert.deepEqual(codes(next!), []);
    assert.equal(book.target('/lab/day/next.md', next!.meta.refs![0]!)?.note, '/lab/day/nb.ipynb|2');
    assert.deepEqual(
      book.blocksNamed('/lab/day/nb.ipynb').map((b) => b.id),
      ['run 1'],
    );
    // A bare id carried twice is looked for in the asking part's own whole note first.
    const copy = new RunBook({ partOf: (n) => (n.includes('|') ? n.slice(0, n.indexOf('|')) : null) });
    set(copy, '/lab/day/aaa.md', hp('run 1', 'x'));
    set(copy, '/lab/day/nb.ipynb|2', hp('run 1', 'x'));
    set(copy, '/lab/day/nb.ipynb|3', hp('run 3', 'run 1'));
    const [bare] = analyse(copy, '/lab/day/nb.ipynb|3');
    assert.equal(copy.target('/lab/day/nb.ipynb|3', bare!.meta.refs![0]!)?.note, '/lab/day/nb.ipynb|2');
    // An id the parts do not hold is unknown among theirs, and never read through a loader.
    set(book, '/lab/day/next.md', hp('run 2', 'nb.ipynb#run 9'));
    const [unknown] = analyse(book, '/lab/day/next.md');
    assert.deepEqual(codes(unknown!), ['reference-unknown']);
    assert.doesNotMatch(unknown!.problems[0]!.message, /not found/);
    // With its parts gone, the whole note is missing again.
    book.deleteNote('/lab/day/nb.ipynb|1');
    book.deleteNote('/lab/day/nb.ipynb|2');
    const [gone] = analyse(book, '/lab/day/next.md');
    assert.match(gone!.problems[0]!.message, /the note `nb\.ipynb` was not found/);
    assert.deepEqual(book.blocksNamed('/lab/day/nb.ipynb'), []);
  });

  it('reports an unknown id with the closest ids as fixes', () => {
    const book = new RunBook();
    const text = REF + hp('run 1', 'ref-13C Mondya');
    set(book, '/lab/mon.md', text);
    const [, run] = analyse(book, '/lab/mon.md');
    const p = run!.problems.find((x) => x.code === 'reference-unknown')!;
    assert.ok(p, codes(run!).join());
    assert.equal(text.slice(p.span.start, p.span.end), 'ref-13C Mondya');
    assert.match(p.message, /Did you mean `ref-13C Monday`\?/);
    assert.equal(p.fixes?.[0]?.newText, 'ref-13C Monday');
    assert.equal(run!.status, 'invalid');
  });

  it('reports a missing note', () => {
    const book = new RunBook();
    const text = hp('run 1', 'gone.md#ref');
    set(book, '/lab/mon.md', text);
    const [run] = analyse(book, '/lab/mon.md');
    const p = run!.problems.find((x) => x.code === 'reference-unknown')!;
    assert.ok(p, codes(run!).join());
    assert.equal(text.slice(p.span.start, p.span.end), 'gone.md');
    assert.match(p.message, /gone\.md/);
  });

  it('finds a cycle of three blocks, in three notes, and reports it on each', () => {
    const book = new RunBook();
    const link = (id: string, to: string): string =>
      fence(`id: ${id}
system: 13C
field: 9.4 T
signal:
  hyperpolarized: 100
  thermal: { run: ${to} }`);
    set(book, '/w/a.md', link('a', 'b.md#b'));
    set(book, '/w/b.md', link('b', 'c.md#c'));
    set(book, '/w/c.md', link('c', 'a.md#a'));
    for (const n of ['/w/a.md', '/w/b.md', '/w/c.md']) {
      const [r] = analyse(book, n);
      const p = r!.problems.find((x) => x.code === 'reference-cycle');
      assert.ok(p, `${n}: ${codes(r!).join()}`);
    }
    const [a] = analyse(book, '/w/a.md');
    assert.match(a!.problems.find((x) => x.code === 'reference-cycle')!.message, /`a` → `b` → `c` → `a`/);
  });

  it('names the referenced block’s first error and where it is', () => {
    const book = new RunBook();
    set(book, '/w/ref.md', '# ref\n\n' + fence('id: R\nsystem: 13C\nfield: 9.4 T\nsignal:\n  thermal: 0'));
    set(book, '/w/run.md', hp('run', 'ref.md#R'));
    const [r] = analyse(book, '/w/run.md');
    const p = r!.problems.find((x) => x.code === 'reference-invalid');
    assert.ok(p, codes(r!).join());
    assert.match(p.message, /signal-thermal-zero/);
    assert.match(p.message, /ref\.md, line 8\)\.$/);
  });

  it('says when the referenced block lacks a thermal signal, and when the isotope differs', () => {
    const book = new RunBook();
    const proton = REF.replace('system: 13C', 'system: 1H').replace('ref-13C Monday', 'H ref');
    set(book, '/w/ref.md', fence('id: P\nsystem: 13C\nfield: 9.4 T\npolarization: 0.1') + proton);
    set(book, '/w/run.md', hp('run', 'ref.md#P') + hp('run2', 'ref.md#H ref'));
    const [r, r2] = analyse(book, '/w/run.md');
    assert.ok(codes(r!).includes('reference-kind'), codes(r!).join());
    assert.ok(codes(r2!).includes('reference-mismatch'), codes(r2!).join());
  });

  it('warns about an id used twice in the workspace, on each copy', () => {
    const book = new RunBook();
    set(book, '/w/a.md', REF);
    set(book, '/w/b.md', REF);
    for (const n of ['/w/a.md', '/w/b.md']) {
      const [r] = analyse(book, n);
      const p = r!.problems.find((x) => x.code === 'id-duplicate');
      assert.ok(p, codes(r!).join());
      assert.equal(p.severity, 'warning');
      assert.match(p.message, n === '/w/a.md' ? /`b\.md`/ : /`a\.md`/);
    }
  });

  it('reads a referring block again when the referenced block changes, and only then', () => {
    const book = new RunBook();
    const analyzer = new Analyzer();
    set(book, '/w/ref.md', REF);
    set(book, '/w/run.md', hp('run', 'ref.md#ref-13C Monday'));
    const first = analyzer.analyzeText(noteText.get('/w/run.md')!, book.externalsFor('/w/run.md'));
    const again = analyzer.analyzeText(noteText.get('/w/run.md')!, book.externalsFor('/w/run.md'));
    assert.equal(again.stats.analysed, 0);
    set(book, '/w/ref.md', REF.replace('1.08e3', '2.16e3'));
    const after = analyzer.analyzeText(noteText.get('/w/run.md')!, book.externalsFor('/w/run.md'));
    assert.equal(after.stats.analysed, 1);
    const p0 = first.blocks[0]!.results!.polarization!.value;
    const p1 = after.blocks[0]!.results!.polarization!.value;
    assert.ok(Math.abs(p1 / p0 - 0.5) < 1e-12, `${p0} → ${p1}`);
    // A change elsewhere in the referenced note leaves the referring block cached.
    set(book, '/w/ref.md', '# new heading\n\n' + REF.replace('1.08e3', '2.16e3'));
    const later = analyzer.analyzeText(noteText.get('/w/run.md')!, book.externalsFor('/w/run.md'));
    assert.equal(later.stats.analysed, 0);
  });

  it('reports a referenced note deleted, and reads it again when it is back', () => {
    const book = new RunBook();
    set(book, '/w/ref.md', REF);
    set(book, '/w/run.md', hp('run', 'ref.md#ref-13C Monday'));
    const analyzer = new Analyzer();
    assert.deepEqual(codes(analyse(book, '/w/run.md', analyzer)[0]!), []);
    book.deleteNote('/w/ref.md');
    assert.deepEqual(codes(analyse(book, '/w/run.md', analyzer)[0]!), ['reference-unknown']);
    set(book, '/w/ref.md', REF);
    assert.deepEqual(codes(analyse(book, '/w/run.md', analyzer)[0]!), []);
  });

  it('loads a named note that was not set, through the host’s loader, once', () => {
    const asked: string[] = [];
    const book = new RunBook({
      load: (n) => {
        asked.push(n);
        return n === '/w/ref.md' ? REF : null;
      },
    });
    set(book, '/w/run.md', hp('run', 'ref.md#ref-13C Monday') + hp('run2', 'none.md#x'));
    const [r, r2] = analyse(book, '/w/run.md');
    assert.deepEqual(codes(r!), []);
    assert.deepEqual(codes(r2!), ['reference-unknown']);
    assert.deepEqual([...new Set(asked)].sort(), ['/w/none.md', '/w/ref.md']);
  });

  it('without a book, a reference is reported as one that cannot be followed here', () => {
    const [r] = new Analyzer().analyzeText(hp('run', 'ref')).blocks;
    assert.deepEqual(codes(r!), ['reference-unavailable']);
  });
});

describe('runs by reference: long chains and lattices of references', () => {
  const link = (id: string, thermal: string, decay?: string): string =>
    fence(`id: ${id}
system: 13C
field: 9.4 T
signal:
  hyperpolarized: 100
  thermal: { run: ${thermal} }${decay ? `\nextrapolate: { from: 1 s, to: 0 s, decay: { run: ${decay} } }` : ''}`);

  it('refuses to follow a chain more than 32 runs deep, and follows one of 32', () => {
    const n = 40;
    let text = REF.replace('ref-13C Monday', `b${n - 1}`);
    for (let i = n - 2; i >= 0; i--) text = link(`b${i}`, `b${i + 1}`) + text;
    const book = new RunBook();
    set(book, '/w/chain.md', text);
    const blocks = analyse(book, '/w/chain.md');
    assert.equal(blocks.length, n);
    // b_i stands at the start of a chain of n − i runs; it can be used when that is at most 32.
    blocks.forEach((b, i) => {
      const refused = n - (i + 1) > 32;
      if (i === n - 1) return assert.equal(b.status, 'normal');
      if (refused) {
        assert.deepEqual(codes(b), ['reference-invalid'], `b${i}`);
        assert.match(b.problems[0]!.message, /reference-chain/);
      } else assert.deepEqual(codes(b), [], `b${i}`);
    });
  });

  it('walks a lattice of references (two per run, forty layers) once per run, not once per path', () => {
    const layers = 40;
    let text = REF.replace('ref-13C Monday', `L${layers}a`) + REF.replace('ref-13C Monday', `L${layers}b`);
    for (let i = layers - 1; i >= 0; i--)
      text = link(`L${i}a`, `L${i + 1}a`, `L${i + 1}b`) + link(`L${i}b`, `L${i + 1}b`, `L${i + 1}a`) + text;
    const book = new RunBook();
    set(book, '/w/lattice.md', text);
    // 2⁴⁰ paths: this returns only because every run is walked a bounded number of times.
    const blocks = analyse(book, '/w/lattice.md');
    assert.equal(blocks.length, 2 * layers + 2);
    assert.ok(codes(blocks[0]!).includes('reference-invalid'));
    assert.deepEqual(book.dependents('/w/lattice.md'), []);
  });
});

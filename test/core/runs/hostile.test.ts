import { strict as assert } from 'node:assert';
import { Analyzer, RunBook, type BlockReport } from '../../../src/core';

// Bad references: each gets a clear diagnostic on the reference, nothing throws, and the other blocks of
// the note still work. Invented numbers.
const fence = (body: string): string => '```levels\n' + body + '\n```\n';
const GOOD = fence('id: good\ngap: 10 K\nratio: 0.5');
const withThermal = (value: string, id = 'run'): string =>
  fence(`id: ${id}\nsystem: 13C\nfield: 9.4 T\nsignal:\n  hyperpolarized: 5\n  thermal: ${value}`);

function analyse(text: string, note = '/w/n.md', others: Record<string, string> = {}): readonly BlockReport[] {
  const book = new RunBook();
  for (const [n, t] of Object.entries(others)) book.setNote(n, t);
  book.setNote(note, text);
  return new Analyzer().analyzeText(text, book.externalsFor(note)).blocks;
}
const codes = (r: BlockReport): string[] => r.problems.map((p) => p.code);

describe('runs by reference: hostile input', () => {
  const cases: [string, string, string][] = [
    ['a list', '{ run: [a, b] }', 'reference-syntax'],
    ['a mapping', '{ run: { id: a } }', 'reference-syntax'],
    ['nothing', '{ run: }', 'reference-syntax'],
    ['an empty string', "{ run: '' }", 'reference-syntax'],
    ['another key', '{ run: a, note: b }', 'reference-syntax'],
    ['only a note', '{ run: other.md# }', 'reference-syntax'],
    ['a number', '{ run: 42 }', 'reference-unknown'],
    ['itself', '{ run: run }', 'reference-cycle'],
    ['itself through its own note', '{ run: n.md#run }', 'reference-cycle'],
    ['a note above the root', '{ run: ../../../../../etc/passwd.md#x }', 'reference-unknown'],
    ['a very long id', `{ run: ${'x'.repeat(100_000)} }`, 'reference-unknown'],
    ['an id of control and bidi characters', '{ run: "\\u202e\\u0000evil" }', 'reference-unknown'],
  ];
  for (const [what, value, code] of cases)
    it(`${what}: ${code}, and the note's other block still works`, () => {
      const text = withThermal(value) + GOOD;
      const [bad, good] = analyse(text);
      assert.ok(codes(bad!).includes(code), `${what}: ${codes(bad!).join()}`);
      assert.equal(bad!.status, 'invalid');
      for (const p of bad!.problems) {
        assert.ok(p.span.start >= bad!.block.bodyStart && p.span.end <= bad!.block.blockEnd, 'inside the block');
      }
      assert.equal(good!.status, 'normal');
    });

  it('a quoted reference with escapes still points inside its value', () => {
    const text = withThermal('{ run: "ref\\tname" }');
    const [r] = analyse(text);
    const p = r!.problems.find((x) => x.code === 'reference-unknown')!;
    assert.ok(p, codes(r!).join());
    assert.ok(text.slice(p.span.start, p.span.end).includes('ref'));
  });

  it('a note that is not a notebook or Markdown is not looked up', () => {
    const [r] = analyse(withThermal('{ run: secrets.txt#x }'));
    assert.deepEqual(codes(r!), ['reference-unknown']);
  });

  it('a block whose reference is bad keeps its id for others, who get reference-invalid', () => {
    const text = withThermal('{ run: nowhere }', 'middle') + withThermal('{ run: middle }', 'user');
    const [, user] = analyse(text);
    assert.deepEqual(codes(user!), ['reference-invalid']);
    assert.match(user!.problems[0]!.message, /reference-unknown.*line 7 of this note/);
  });
});

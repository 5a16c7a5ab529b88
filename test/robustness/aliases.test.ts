/**
 * Many aliases in one block. The `yaml` package's `Alias.resolve(doc)` walks
 * the whole document on every call, so resolving each alias that way costs
 * O(aliases × nodes): a block of 10,000 aliases of one scalar (inside the
 * documented bound of 10,000 added nodes) took 13 s to read, 40,000 over a
 * minute. The reader now finds every alias's anchor in one pass. The checks
 * count calls rather than time (no timed assertions), and pin the YAML 1.2
 * rule the one pass must keep: an alias refers to the most recent node with
 * that anchor before it (YAML 1.2.2 §3.2.2.2, "Anchors and Aliases").
 */
import { strict as assert } from 'node:assert';
import { Alias } from 'yaml';
import { Analyzer } from '../../src/core';

const fenced = (body: string): string => '```levels\n' + body + '\n```\n';

/** Runs `f` with `Alias.prototype.resolve` counted, and returns the count. */
function resolveCalls(f: () => void): number {
  const proto = Alias.prototype;
  const original = Object.getOwnPropertyDescriptor(proto, 'resolve')!;
  const resolve = original.value as (
    this: Alias,
    ...args: Parameters<Alias['resolve']>
  ) => ReturnType<Alias['resolve']>;
  let calls = 0;
  Object.defineProperty(proto, 'resolve', {
    ...original,
    value: function (this: Alias, ...args: Parameters<Alias['resolve']>) {
      calls++;
      return resolve.apply(this, args);
    },
  });
  try {
    f();
  } finally {
    Object.defineProperty(proto, 'resolve', original);
  }
  return calls;
}

describe('robustness: many aliases', function () {
  this.timeout(120000);

  it('reads 9,000 aliases of one anchor without walking the document once per alias', () => {
    const body = 'x: &n 0.5\nl: [' + Array(9000).fill('*n').join(', ') + ']\ngap: 10 K\nratio: *n';
    let status = '';
    let beta: number | undefined;
    const calls = resolveCalls(() => {
      const b = new Analyzer().analyzeText(fenced(body)).blocks[0];
      status = b.status;
      beta = b.results?.beta?.value;
    });
    assert.equal(calls, 0, 'Alias.resolve walks the whole document on every call');
    assert.equal(status, 'normal');
    // β = ln(n_l/n_u)/ΔE with the ratio n_u/n_l = 0.5 (docs/format.md, Conventions).
    assert.equal(beta, Math.log(2) / 10);
  });

  it('still refuses aliases past the bound, on the first alias', () => {
    const body = 'x: &n 1\nl: [' + Array(10001).fill('*n').join(', ') + ']\ngap: 10 K\nratio: 0.5';
    const text = fenced(body);
    const b = new Analyzer().analyzeText(text).blocks[0];
    assert.equal(b.status, 'invalid');
    const p = b.problems.find((q) => q.code === 'alias-expansion');
    assert.ok(p, b.problems.map((q) => q.code).join(', '));
    assert.equal(text.slice(p.span.start, p.span.end), '*n');
  });

  it('takes the most recent anchor of a name before the alias, as YAML 1.2 says', () => {
    const body = 'a: &r 0.9\nb: &r 0.5\nratio: *r\nc: &r 0.1\ngap: 10 K';
    const b = new Analyzer().analyzeText(fenced(body)).blocks[0];
    assert.equal(b.results?.beta?.value, Math.log(2) / 10);
  });

  it('reports an alias whose anchor comes only after it', () => {
    const b = new Analyzer().analyzeText(fenced('ratio: *r\nb: &r 0.5\ngap: 10 K')).blocks[0];
    assert.equal(b.status, 'invalid');
    assert.ok(b.problems.length > 0);
  });
});

import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { parseDocument } from 'yaml';
import { plainTree } from '../../src/core/block/plainBody';
import { interpretBody } from '../../src/core/block/interpret';
import { COMPOSE_OPTIONS, parseBody, YAML_OPTIONS } from '../../src/core/block/yamlTree';
import { fitBuildup, fitDecay } from '../../src/core/physics/relaxation';
import { sparklineSvg } from '../../src/core/present/preview/sparkline';
import { runs } from './seed';

// Notes that attack the machine through size: a stage that does quadratic work
// or passes a whole list as call arguments turns a large block into seconds of
// blocked typing, or into a stack overflow. These tests count work or use
// sizes past the engine's argument limit; none of them measures time (the
// benchmark row "10× the keys" in bench/run.ts does that, as a ratio).

/** A body of n distinct plain keys. */
const manyKeys = (n: number): string => Array.from({ length: n }, (_, i) => `k${i}: ${i}\n`).join('');

/**
 * Past V8's limit on call arguments: a spread call such as `Math.max(...xs)`
 * overflows the stack at somewhat over 100,000 elements on Node 20 with its
 * default stack (measured here; the exact figure depends on the frame, so
 * twice that is used). From memory, and checked on the Node of this repository.
 */
const PAST_SPREAD_LIMIT = 250_000;

describe('robustness: notes that attack the machine through size', function () {
  this.timeout(120000);

  it('checks each key of a plain mapping for a repeat once, not against every earlier key', () => {
    // The plain-body reader's keys are typed once and read through one getter: count the reads.
    const sample = plainTree('a: 1\n')!;
    const proto = Object.getPrototypeOf(sample.items[0]!.key) as object;
    const getter = Object.getOwnPropertyDescriptor(proto, 'value');
    // The descriptor's getter is called below with the key as `this`, as the engine would.
    // eslint-disable-next-line @typescript-eslint/unbound-method
    const read = getter?.get as ((this: unknown) => unknown) | undefined;
    assert.ok(getter && read, 'plain keys are read through a getter');
    let reads = 0;
    Object.defineProperty(proto, 'value', {
      ...getter,
      get(this: unknown): unknown {
        reads++;
        return read.call(this);
      },
    });
    try {
      const n = 3000;
      for (const body of [manyKeys(n), `x: {${Array.from({ length: n }, (_, i) => `k${i}: ${i}`).join(', ')}}\n`]) {
        reads = 0;
        const tree = plainTree(body);
        assert.ok(tree, 'read as a plain body');
        // One read per key added (a pairwise check would read n²/2 = 4.5 million times).
        assert.ok(reads <= 2 * n, `${reads} key reads for ${n} keys`);
      }
    } finally {
      Object.defineProperty(proto, 'value', getter);
    }
  });

  it('runs the composer without its own pairwise key check, and checks keys itself', () => {
    // The package's check compares each key with every earlier one (its util-map-includes); ours is a set.
    assert.equal(COMPOSE_OPTIONS.uniqueKeys, false);
    assert.equal(YAML_OPTIONS.uniqueKeys, true);
    const { problems } = parseBody('a:\t1\nb: 2\na: 3\n');
    assert.deepEqual(
      problems.map((p) => [p.code, p.span.start]),
      [['yaml-duplicate-key', 10]],
    );
  });

  /** The DUPLICATE_KEY errors the package's composer gives itself, as [start, end] pairs. */
  const composerRepeats = (body: string): [number, number][] =>
    parseDocument(body, YAML_OPTIONS)
      .errors.filter((e) => e.code === 'DUPLICATE_KEY')
      .map((e) => [e.pos[0], e.pos[1]]);
  const ourRepeats = (body: string): [number, number][] =>
    parseBody(body)
      .problems.filter((p) => p.code === 'yaml-duplicate-key')
      .map((p) => [p.span.start, p.span.end]);

  it('finds exactly the repeated keys the composer’s own check finds, at the same places', () => {
    // The reference is the `yaml` package run with uniqueKeys: true (YAML 1.2.2 §3.2.1.1: keys are unique).
    for (const body of [
      'a: 1\na: 2\n',
      'a:\t1\na: 2\na: 3\n',
      '1: a\n1.0: b\n0x1: c\n',
      '.nan: a\n.nan: b\n',
      '&k a: 1\n!!str a: 2\n',
      '"a": 1\n\'a\': 2\na: 3\n',
      'x: {a: 1, b: 2, a: 3}\ny: [{a: 1}, {a: 2}]\n',
      'x:\n  a: 1\n  a: 2\n\ty: 1\n',
      'true: 1\nTrue: 2\n~: 3\nnull: 4\n',
      '[a]: 1\n[a]: 2\n',
      'a: &x 1\n*x : 2\n',
    ])
      assert.deepEqual(ourRepeats(body), composerRepeats(body), JSON.stringify(body));
    // An empty key has no text to point at: the composer points after its `?` line, this check at the
    // (empty) key itself, one character earlier; the repeats found are the same.
    const empty = '? \n: a\n? \n: b\n';
    assert.deepEqual(ourRepeats(empty), [[9, 10]]);
    assert.equal(composerRepeats(empty).length, 1);
    const key = fc.constantFrom('a', 'b', '1', '1.0', '"a"', "'b'", '~', '.nan', '&x a', '!!str 1', '0o1');
    const line = fc.tuple(fc.constantFrom('', '  ', '\t'), key, fc.constantFrom(': 1', ':\t2', ': {a: 1, a: 2}'));
    fc.assert(
      fc.property(fc.array(line, { maxLength: 8 }), (lines) => {
        const body = lines.map(([indent, k, v]) => `${indent}${k}${v}\n`).join('');
        assert.deepEqual(ourRepeats(body), composerRepeats(body), JSON.stringify(body));
      }),
      runs(1500),
    );
  });

  it(`reports ${PAST_SPREAD_LIMIT.toLocaleString('en-US')} repeated keys each on its key, without overflowing the stack`, () => {
    // A tab after the first colon sends the body to the composer.
    const body = 'k:\t0\n' + Array.from({ length: PAST_SPREAD_LIMIT }, (_, i) => `k: ${i + 1}\n`).join('');
    const { problems } = interpretBody(body);
    const repeats = problems.filter((p) => p.code === 'yaml-duplicate-key');
    assert.equal(repeats.length, PAST_SPREAD_LIMIT, problems[0]?.message);
    assert.equal(repeats[0]!.span.start, body.indexOf('\n') + 1);
    assert.ok(!problems.some((p) => p.code === 'internal-error' || p.code === 'yaml-syntax'));
  });

  it(`fits decays and build-ups of ${PAST_SPREAD_LIMIT.toLocaleString('en-US')} points`, () => {
    const n = PAST_SPREAD_LIMIT;
    const t = Array.from({ length: n }, (_, i) => i / 1000);
    const tau = 60;
    // Exact model values, so the fit must return the time constant they were made with.
    const decay = fitDecay(
      t,
      t.map((x) => 2 * Math.exp(-x / tau)),
      null,
      t.map(() => 0.01),
    );
    assert.ok(decay, 'the decay was fitted');
    assert.ok(Math.abs(decay.timeConstant.value - tau) < 1e-6 * tau, String(decay.timeConstant.value));
    const buildup = fitBuildup(
      t,
      t.map((x) => 3 * (1 - Math.exp(-x / tau)) + 0.5),
      null,
    );
    assert.ok(buildup, 'the build-up was fitted');
    assert.ok(Math.abs(buildup.timeConstant.value - tau) < 1e-6 * tau, String(buildup.timeConstant.value));
  });

  it(`draws the preview’s curve of a scheme of ${PAST_SPREAD_LIMIT.toLocaleString('en-US')} levels`, () => {
    const e = Array.from({ length: PAST_SPREAD_LIMIT }, (_, i) => i);
    const svg = sparklineSvg(
      e,
      e.map(() => 1),
      null,
      'many levels',
    );
    assert.ok(svg?.startsWith('<svg'), String(svg).slice(0, 80));
  });
});

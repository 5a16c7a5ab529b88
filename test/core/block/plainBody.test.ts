import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { parseDocument } from 'yaml';
import { findFencedBlocks } from '../../../src/core';
import { plainTree } from '../../../src/core/block/plainBody';
import type { TreeNode } from '../../../src/core/block/tree';
import { parseBody, treeOfDocument, YAML_OPTIONS } from '../../../src/core/block/yamlTree';
import { generateNote } from '../../../bench/note';
import { formBody, yamlBody } from '../../robustness/arbitraries';
import { runs } from '../../robustness/seed';

// The reference here is the `yaml` package's own composer (parseDocument): the plain-body
// shortcut must answer only where the composer reports nothing, and then with the same tree.

/** Everything the block readers can see of a tree, as plain data. */
function shape(n: TreeNode | null): unknown {
  if (n === null) return null;
  switch (n.kind) {
    case 'scalar':
      return { scalar: n.value, source: n.source, type: n.type, range: n.range, isNull: n.isNull };
    case 'map':
      return { map: n.items.map((p) => [shape(p.key), shape(p.value)]), range: n.range, flow: n.flow };
    case 'seq':
      return { seq: n.items.map(shape), range: n.range, flow: n.flow };
    default:
      return { alias: n.range };
  }
}

/** Fails when the shortcut answers a body the composer finds fault with, or answers differently. */
function agrees(body: string): boolean {
  const quick = plainTree(body);
  if (!quick) return false;
  const doc = parseDocument(body, YAML_OPTIONS);
  assert.deepEqual(
    doc.errors.map((e) => e.message),
    [],
    `the composer reports errors for ${JSON.stringify(body)}`,
  );
  assert.deepEqual(
    doc.warnings.map((e) => e.message),
    [],
    `the composer warns for ${JSON.stringify(body)}`,
  );
  assert.deepEqual(shape(quick), shape(treeOfDocument(doc)), `trees differ for ${JSON.stringify(body)}`);
  return true;
}

/** Bodies of every `levels` block in the Markdown files under a folder. */
function bodiesUnder(dir: string): { body: string; language: string }[] {
  const out: { body: string; language: string }[] = [];
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) {
      if (name !== 'node_modules' && !name.startsWith('.')) out.push(...bodiesUnder(path));
    } else if (name.endsWith('.md')) {
      out.push(...findFencedBlocks(readFileSync(path, 'utf8')));
    }
  }
  return out;
}

/**
 * Bodies near the shortcut's edge: mostly well-formed entries (scalars, flow lists and maps,
 * nested maps, lists of levels) with varied spacing and indentation, and now and then a line
 * of the kind the composer has rules about (tabs, comments, stray indicators).
 */
const word = fc.constantFrom(
  'a',
  'b',
  'id',
  'field',
  'x y',
  'é',
  '🙂',
  '1',
  '1.0',
  '01',
  '-0',
  '1e3',
  '.inf',
  '0x1F',
  '0o7',
  'true',
  'True',
  'null',
  '~',
  '"q"',
  "'q'",
  "'it''s'",
  '"a\\tb"',
  'a:b',
  'a-b',
  'a.b',
);
const oddWord = fc.constantFrom(
  'a #b',
  'a,b',
  '@a',
  '`a',
  '%a',
  '-',
  '- a',
  '?',
  ':',
  '"x',
  '&a',
  '*a',
  '!t',
  'a: b',
  '[a',
  '{a',
  '|',
  '>',
);
const anyWord = fc.oneof({ weight: 30, arbitrary: word }, { weight: 1, arbitrary: oddWord });
const gap = fc.oneof(
  { weight: 30, arbitrary: fc.constantFrom(' ', '  ') },
  { weight: 1, arbitrary: fc.constantFrom('', '\t', ' \t') },
);
const flowSeq = fc
  .tuple(fc.array(anyWord, { maxLength: 4 }), fc.constantFrom(', ', ',', ' , ', ',\n    ', ', '))
  .map(([xs, sep]) => `[${xs.join(sep)}]`);
const flowMap = fc
  .array(fc.tuple(anyWord, gap, anyWord), { maxLength: 3 })
  .map((kv) => `{ ${kv.map(([k, g, v]) => `${k}:${g}${v}`).join(', ')} }`);
const comment = fc.oneof(
  { weight: 6, arbitrary: fc.constant('') },
  { weight: 1, arbitrary: fc.constantFrom(' # c', '  #c', '\t# c', '#c', ' # a: b') },
);
const inline = fc
  .tuple(
    fc.oneof({ weight: 4, arbitrary: anyWord }, { weight: 2, arbitrary: flowSeq }, { weight: 2, arbitrary: flowMap }),
    comment,
  )
  .map(([v, c]) => v + c);
const indent = fc.oneof(
  { weight: 30, arbitrary: fc.constantFrom('  ', ' ', '    ') },
  { weight: 1, arbitrary: fc.constant('\t') },
);
const nested: fc.Arbitrary<string> = fc.oneof(
  fc
    .tuple(indent, fc.array(fc.tuple(anyWord, gap, inline, comment), { minLength: 1, maxLength: 3 }))
    .map(([ind, kv]) => kv.map(([k, g, v, c]) => `${c ? `\n${ind}${c.trim()}` : ''}\n${ind}${k}:${g}${v}`).join('')),
  fc
    .tuple(
      fc.constantFrom('  ', '', '    '),
      fc.array(
        fc.oneof(
          inline,
          fc.tuple(anyWord, anyWord).map(([k, v]) => `${k}: ${v}`),
        ),
        { minLength: 1, maxLength: 3 },
      ),
    )
    .map(([ind, xs]) => xs.map((x) => `\n${ind}- ${x}`).join('')),
);
const entry: fc.Arbitrary<string> = fc.oneof(
  { weight: 10, arbitrary: fc.tuple(anyWord, gap, inline).map(([k, g, v]) => `${k}:${g}${v}`) },
  { weight: 4, arbitrary: fc.tuple(anyWord, comment, nested).map(([k, c, v]) => `${k}:${c}${v}`) },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      '',
      ' ',
      '# note',
      'a: 1 # note',
      '\tb: 1',
      ' c: 1',
      'd:',
      'e :  f',
      '? g',
      '- h',
      '...',
      '---',
    ),
  },
);
const spacedBody: fc.Arbitrary<string> = fc
  .tuple(fc.array(entry, { minLength: 1, maxLength: 8 }), fc.constantFrom('\n', '\r\n', '\n\n'), fc.boolean())
  .map(([lines, eol, final]) => lines.join(eol).replace(/\n/g, eol) + (final ? eol : ''));

/** A body with a few random edits of YAML's significant characters. */
function damaged(base: fc.Arbitrary<string>): fc.Arbitrary<string> {
  return fc
    .tuple(
      base,
      fc.array(
        fc.tuple(
          fc.nat(),
          fc.nat(2),
          fc.constantFrom(
            ' ',
            '\t',
            '\n',
            ':',
            '-',
            ',',
            '[',
            ']',
            '{',
            '}',
            '#',
            '"',
            "'",
            '&',
            '*',
            '!',
            '|',
            '>',
            '?',
            '%',
            '@',
            '\r',
          ),
        ),
        { maxLength: 3 },
      ),
    )
    .map(([body, edits]) => {
      let s = body;
      for (const [at, op, ch] of edits) {
        const i = s.length === 0 ? 0 : at % (s.length + 1);
        s =
          op === 0
            ? s.slice(0, i) + ch + s.slice(i)
            : op === 1
              ? s.slice(0, i) + s.slice(i + 1)
              : s.slice(0, i) + ch + s.slice(i + 1);
      }
      return s;
    });
}

describe('the plain-body shortcut of the YAML reader', () => {
  it('reads every block of the benchmark note, and gives the composer’s tree for each', () => {
    const bodies = findFencedBlocks(generateNote({ blocks: 200 }))
      .filter((b) => b.language === 'levels')
      .map((b) => b.body);
    assert.equal(bodies.length, 200);
    for (const body of bodies) assert.ok(agrees(body), `not read as plain: ${JSON.stringify(body)}`);
  });

  it('gives the composer’s tree for every block it reads in the demo, the docs and the test notes', () => {
    // Other languages' blocks (YAML and JSON examples in the docs) are compared too: the same rules hold.
    const blocks = [...bodiesUnder('demo'), ...bodiesUnder('docs'), ...bodiesUnder('test')];
    const levels = blocks.filter((b) => b.language === 'levels');
    assert.ok(levels.length >= 10, `${levels.length} levels blocks found`);
    let plain = 0;
    for (const b of blocks) if (agrees(b.body) && b.language === 'levels') plain++;
    // Nearly every block of a real note is plain; the others take the composer, just more slowly.
    assert.ok(plain >= 0.8 * levels.length, `${plain} of ${levels.length} levels blocks plain`);
  });

  // The last number is the least share of cases the shortcut must read itself, so that the
  // comparison is not vacuous (shares seen with the suite's seed: about twice these).
  for (const [name, arb, n, least] of [
    ['random block bodies', yamlBody, 1500, 0.03],
    ['random bodies of every form', formBody, 1500, 0.35],
    ['bodies with random spacing, indentation and line ends', spacedBody, 3000, 0.06],
    ['damaged block bodies', damaged(fc.oneof(formBody, spacedBody)), 3000, 0.12],
  ] as const) {
    it(`answers only where the composer reports nothing, with the composer’s tree: ${name}`, () => {
      let cases = 0;
      let plain = 0;
      fc.assert(
        fc.property(arb as fc.Arbitrary<string>, (body) => {
          cases++;
          if (agrees(body)) plain++;
        }),
        runs(n),
      );
      assert.ok(plain >= least * cases, `${plain} of ${cases} read as plain`);
    });
  }

  it('accepts the shapes a notebook mostly holds', () => {
    for (const body of [
      'id: run 1\nsystem: 1H\nfield: 9.4 T\npolarization: 0.12 ± 0.01\n',
      'levels:\n  - { label: a, energy: 0 cm-1, g: 1, population: 0.5 }\n  - {label: b, energy: 10 cm-1, g: 3, population: 0.2}\n',
      'levels:\n- energy: 0 K\n  population: 1\n- energy: 5 K\n  population: 0.3\n',
      'series:\n  model: decay\n  time: [0 s, 10 s,\n    20 s]\n  signal: [1, 0.5, 0.25]\n',
      'gap: 1420.405751768 MHz\r\ng: [1, 3]\r\nratio: 2.95\r\n',
      `a: ${'['.repeat(60)}${']'.repeat(60)}\n`,
      'id: "quoted, with: colons"\nnote: \'single\'\n\n\ndate: 2026-01-01',
      '# run of the day\nid: a # the first\nfield: 7 T   # nominal\n# between keys\nseries: # below\n  # first key\n  model: decay\nlevels:\n  # lower\n  - { energy: 0 K }\n# at the end\n',
    ])
      assert.ok(agrees(body), JSON.stringify(body));
  });

  it('leaves to the composer what it does not read itself', () => {
    for (const body of [
      '[a, # c\n b]: 1\n',
      'a: [1, # c\n 2]\n',
      'a # c: 1\n',
      'a: &x 1\nb: *x\n',
      'a: !!str 1\n',
      'a: 1\na: 2\n',
      '1: a\n1.0: b\n',
      'a:\n',
      'a: \n',
      '"a": 1\n',
      'a: b\n  c\n',
      'a: b: c\n',
      'a:\n\tb: 1\n',
      'a:\t1\n',
      'a: |\n  x\n',
      '---\na: 1\n',
      'a: 1\n...\n',
      '- a\n- b\n',
      'a: [1, 2\n',
      'a: [1,, 2]\n',
      'a: [1, 2, ]\n',
      'a: {b: 1, b: 2}\n',
      'a: {b}\n',
      'a: [b: 1]\n',
      '? a\n: 1\n',
      '%YAML 1.2\n---\na: 1\n',
      '\uFEFFa: 1\n',
      '  a: 1\n',
      `a: ${'['.repeat(100)}${']'.repeat(100)}\n`,
      'a: 1\n b: 2\n',
      'a: `x`\n',
      'a: @x\n',
      `${'k'.repeat(1030)}: 1\n`,
    ])
      assert.equal(plainTree(body), null, JSON.stringify(body));
  });

  it('keeps the composer’s problems for what it leaves: the block reader reports them as before', () => {
    // Checked against the package itself: duplicate keys are its DUPLICATE_KEY error.
    const { doc, problems } = parseBody('a: 1\na: 2\n');
    assert.ok(doc);
    assert.deepEqual(
      problems.map((p) => p.code),
      ['yaml-duplicate-key'],
    );
    assert.equal(parseBody('a: &x [1, 2]\nb: *x\n').problems.length, 0);
  });

  it('types plain scalars as the core schema does, on request', () => {
    const t = plainTree('a: 0x1F\nb: .inf\nc: ~\nd: 1.50\ne: True\nf: 007\ng: 1e3\nh: text\n')!;
    const values = t.items.map((p) => (p.value as { value: unknown }).value);
    // YAML 1.2 core schema (yaml.org/spec/1.2.2, §10.3.2): hex and decimal ints, .inf, ~ as null, True as bool.
    assert.deepEqual(values, [31, Infinity, null, 1.5, true, 7, 1000, 'text']);
    assert.deepEqual(
      t.items.map((p) => (p.value as { isNull: boolean }).isNull),
      [false, false, true, false, false, false, false, false],
    );
  });
});

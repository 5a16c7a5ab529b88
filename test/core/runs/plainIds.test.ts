import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { needRunBook, plainFacts, RunBook } from '../../../src/core';
import { interpretBody } from '../../../src/core/block/interpret';
import { hpBlock, refBlock } from '../../support/runNotes';

// The command line skips the book of runs when the text alone shows that no block can refer to a run and that
// every id is carried once (src/cli/main.ts). That is only right if the text never claims more than a reading of
// the block finds: a body called plain must refer to no run, and its id must be the one said (or none, where
// the reading finds none). Checked against the block reader itself, over generated bodies, nasty ones included.

/** The reading's id and references, with a book present (so that references are read, not refused). */
function read(body: string): { id: string | null; idSpan: unknown; refs: number } {
  const book = new RunBook();
  const m = interpretBody(body, book.externalsFor('/w/a.md')).meta;
  return { id: m.id, idSpan: m.idSpan, refs: m.refs?.length ?? 0 };
}

const bodyOf = (block: string): string => block.replace(/^```levels\n/, '').replace(/\n```\n$/, '');

const lines = fc.constantFrom(
  'id: run 1',
  'id: run 2',
  'id:  spaced  out ',
  'id: "quoted"',
  "id: 'single'",
  'id: 12',
  'id: true',
  'id: null',
  'id: a # comment',
  'id:',
  '  id: nested',
  'ID: upper',
  'system: 13C',
  'field: 9.4 T',
  'lattice: 298 K',
  'signal:',
  '  thermal: { run: ref A }',
  '  thermal: {run: ref A}',
  "  'run': x",
  '  "run" : x',
  '  hyperpolarized: 2.9e4',
  '  continued text',
  '',
  '{ id: flow, polarization: 0.2 }',
  '- a list item',
  'extrapolate: { from: 42 s, to: 0 s, decay: { run: t1 } }',
  'polarization: 0.4613 ± 0.010',
  'note: "an \\x69d: escaped"',
  'anchor: &a { run: x }',
  'alias: *a',
  '? id',
  ': explicit',
  '---',
  'populations: [0.8677, 0.1323',
  '\tid: tabbed',
  'id: run 1\r',
);

describe('plain ids: what the text of a block alone tells about runs by reference', () => {
  it('never calls a body plain that refers to a run, nor gives an id its reading does not find', () => {
    fc.assert(
      fc.property(fc.array(lines, { minLength: 1, maxLength: 8 }), (ls) => {
        const body = ls.join('\n');
        const f = plainFacts(body);
        if (f.kind === 'unsure') return;
        const r = read(body);
        assert.equal(r.refs, 0, `called plain but refers to a run: ${JSON.stringify(body)}`);
        assert.ok(r.id === null || r.id === f.id, `id ${JSON.stringify(r.id)} read, ${JSON.stringify(f.id)} said`);
        if (f.id === null) assert.equal(r.id, null, `an id read where none was said: ${JSON.stringify(body)}`);
        else if (r.id !== null) assert.deepEqual(f.idSpan, r.idSpan, `the id's place: ${JSON.stringify(body)}`);
      }),
      {
        numRuns: Number(process.env.FC_RUNS_SCALE ?? 1) * 400,
        ...(process.env.FC_SEED ? { seed: Number(process.env.FC_SEED) } : {}),
      },
    );
  });

  it('calls the usual blocks plain, with their ids, and a referring block unsure', () => {
    assert.deepEqual(plainFacts(bodyOf(refBlock('ref A'))), {
      kind: 'plain',
      id: 'ref A',
      idSpan: { start: 4, end: 9 },
    });
    assert.deepEqual(plainFacts('system: 13C\nfield: 9.4 T\nlattice: 298 K'), {
      kind: 'plain',
      id: null,
      idSpan: null,
    });
    assert.deepEqual(plainFacts('- a list\nid: x'), { kind: 'unsure' }, 'not a mapping');
    assert.deepEqual(plainFacts(bodyOf(hpBlock('run 1', 'ref A'))), { kind: 'unsure' });
    assert.deepEqual(plainFacts('id: "quoted"\nsystem: 13C'), { kind: 'unsure' });
  });

  it('asks for the book when a block refers to a run, an id is not plain, or two blocks carry one id', () => {
    const a = bodyOf(refBlock('ref A'));
    const b = bodyOf(refBlock('ref B'));
    assert.equal(needRunBook([a, b, 'polarization: 0.2']), false);
    assert.equal(needRunBook([a, bodyOf(hpBlock('run 1', 'ref A'))]), true, 'a reference');
    assert.equal(needRunBook([a, a]), true, 'one id twice');
    assert.equal(needRunBook([a, "id: 'x'\npolarization: 0.2"]), true, 'an id not written plainly');
  });
});

import { strict as assert } from 'node:assert';
import { RunLog } from '../../../src/core';
import { fence, hpBlock, refBlock } from '../../support/runNotes';

// Invented notes: the numbers only exercise the run log's following of references.
const REF = refBlock();
const hp = (id: string, ref: string): string => hpBlock(id, ref);

const byId = (log: RunLog, id: string) => log.entries().find((e) => e.id === id)!;

describe('run log: runs by reference', () => {
  it('follows references among its notes, whichever note it read first', () => {
    const log = new RunLog();
    // The referring note first: its run cannot be followed yet.
    log.update('/lab/runs/r1.md', 'runs/r1.md', hp('run 1', '../refs/mon.md#ref-13C Monday'));
    assert.equal(byId(log, 'run 1').status, 'invalid');
    // The reference arrives: the referring note is read again.
    assert.equal(log.update('/lab/refs/mon.md', 'refs/mon.md', REF), true);
    assert.equal(byId(log, 'run 1').status, 'normal');
    assert.deepEqual(byId(log, 'run 1').uses, [{ uri: '/lab/refs/mon.md', line: 0 }]);
  });

  it('lists the runs that use a given reference', () => {
    const log = new RunLog();
    log.update('/lab/refs/mon.md', 'refs/mon.md', REF);
    log.update('/lab/runs/r1.md', 'runs/r1.md', hp('run 1', '../refs/mon.md#ref-13C Monday'));
    log.update(
      '/lab/runs/r2.md',
      'runs/r2.md',
      hp('run 2', 'ref-13C Monday') + '\n' + fence('id: alone\nsystem: 1H\nfield: 9.4 T\npolarization: 0.01'),
    );
    assert.deepEqual(
      log.users('/lab/refs/mon.md', 0).map((e) => e.id),
      ['run 1', 'run 2'],
    );
    assert.deepEqual(log.users('/lab/runs/r2.md', 10), []);
  });

  it('updates the runs that use a reference when it changes or goes', () => {
    const log = new RunLog();
    log.update('/lab/refs/mon.md', 'refs/mon.md', REF);
    log.update('/lab/runs/r1.md', 'runs/r1.md', hp('run 1', '../refs/mon.md#ref-13C Monday'));
    const p1 = byId(log, 'run 1').polarization!.value;
    // Twice the thermal signal: half the enhancement, half the polarization (P = ε · P_th).
    assert.equal(log.update('/lab/refs/mon.md', 'refs/mon.md', REF.replace('1.08e3', '2.16e3')), true);
    const p2 = byId(log, 'run 1').polarization!.value;
    assert.ok(Math.abs(p2 / p1 - 0.5) < 1e-12, `${p2} / ${p1}`);
    // The reference renamed away: run 1 can no longer follow it.
    log.update('/lab/refs/mon.md', 'refs/mon.md', REF.replace('ref-13C Monday', 'ref Tuesday'));
    assert.equal(byId(log, 'run 1').status, 'invalid');
    log.update('/lab/refs/mon.md', 'refs/mon.md', REF);
    assert.equal(byId(log, 'run 1').status, 'normal');
    assert.equal(log.remove('/lab/refs/mon.md'), true);
    assert.equal(byId(log, 'run 1').status, 'invalid');
  });
});

describe('run log: runs by reference in Jupyter notebooks', () => {
  const notebook = (...cells: string[]): string =>
    JSON.stringify({
      cells: [
        { cell_type: 'code', metadata: {}, source: ['x = 1\n'], outputs: [] },
        ...cells.map((c) => ({ cell_type: 'markdown', metadata: {}, source: c.split(/(?<=\n)/) })),
      ],
      metadata: {},
      nbformat: 4,
      nbformat_minor: 5,
    });

  it('follows a reference from one cell to another, and from a note into a notebook, with places in the cells', () => {
    const log = new RunLog();
    // Cell 2 (index 1): the reference, after a heading; cell 3: a run that takes its thermal signal from it.
    log.update('/lab/day.ipynb', 'day.ipynb', notebook('# Monday\n\n' + REF, hp('run 1', 'ref-13C Monday')));
    const run = byId(log, 'run 1');
    assert.equal(run.status, 'normal');
    assert.equal(run.cell, 2);
    // The reference's fence is line 2 of its cell (index 1), as its own entry says.
    const ref = byId(log, 'ref-13C Monday');
    assert.deepEqual([ref.cell, ref.line], [1, 2]);
    assert.deepEqual(run.uses, [{ uri: '/lab/day.ipynb', line: 2, cell: 1 }]);
    assert.deepEqual(
      log.users('/lab/day.ipynb', 2, 1).map((e) => e.id),
      ['run 1'],
    );
    // A note names the notebook: it is followed, and the notebook's reference being edited reaches the note.
    log.update('/lab/week.md', 'week.md', hp('run 2', 'day.ipynb#ref-13C Monday'));
    assert.equal(byId(log, 'run 2').status, 'normal');
    const p1 = byId(log, 'run 2').polarization!.value;
    assert.equal(
      log.update('/lab/day.ipynb', 'day.ipynb', notebook('# Monday\n\n' + REF.replace('1.08e3', '2.16e3'), 'x')),
      true,
    );
    // Twice the thermal signal: half the polarization (P = ε · P_th).
    assert.ok(Math.abs(byId(log, 'run 2').polarization!.value / p1 - 0.5) < 1e-12);
    // A sources-only view of the notebook (the Markdown preview's, the rendered cells') finds the runs too.
    assert.equal(
      log.externalsFor('/lab/day.ipynb').runs!.resolve('/lab/day.ipynb', { note: null, id: 'ref-13C Monday' }, '').kind,
      'found',
    );
  });
});

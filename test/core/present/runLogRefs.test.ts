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

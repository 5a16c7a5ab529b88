import { strict as assert } from 'node:assert';
import { isViewPayload, type CurvePayload, type ProblemPayload } from '../../src/core';
import { CurveDataRequest } from '../../src/shared/protocol';
import { startLsp, type LspSession } from './lspClient';

// The curve view's request against the bundled server over stdio.
const NOTE = [
  '# Runs', // 0
  '',
  '```levels', // 2
  'id: cell-B run 7', // 3
  'system: 13C', // 4
  'field: 7.05 T', // 5
  'lattice: 1.4 K', // 6
  'polarization: 0.312 ± 0.010', // 7
  '```', // 8
  '',
  '  ```levels', // 10: an indented fence
  '  id: hurried', // 11
  '  system: 13C', // 12
  '  field: 7.05 MT', // 13
  '  polarization: 0.3', // 14
  '  ```', // 15
  '',
].join('\n');
const URI = 'file:///notes/runs.md';

describe('boltzmark/curveData over stdio', function () {
  this.timeout(30000);
  let s: LspSession;

  before(async () => {
    s = await startLsp();
    await s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: URI, languageId: 'markdown', version: 5, text: NOTE },
    });
  });
  after(async () => s.close());

  it('answers a line inside a block with its curve, measured point and lattice marker, typed and valid', async () => {
    const p = await s.conn.sendRequest(CurveDataRequest, { uri: URI, line: 7 });
    assert.ok(isViewPayload(p), 'the payload passes the view’s own validator');
    const c = p as CurvePayload;
    assert.equal(c.kind, 'curve');
    assert.deepEqual([c.uri, c.version, c.line, c.id, c.status], [URI, 5, 2, 'cell-B run 7', 'normal']);
    assert.equal(c.unit.name, 'MHz');
    assert.ok(c.curve.energy.length > 100);
    assert.ok(c.measured && c.thermal, 'measured point and lattice marker');
    assert.ok(c.measured.beta! > c.thermal.beta, 'the hyperpolarized run is colder than the lattice');
  });

  it('gives the first error of a block with errors, also from its indented fence lines', async () => {
    for (const line of [10, 13, 15]) {
      const p = (await s.conn.sendRequest(CurveDataRequest, { uri: URI, line })) as ProblemPayload;
      assert.equal(p.kind, 'problem', `line ${line}`);
      assert.equal(p.code, 'unit-case');
      assert.equal(p.id, 'hurried');
      assert.match(p.message, /case-sensitive/);
    }
  });

  it('answers null outside every block and for an unknown note', async () => {
    assert.equal(await s.conn.sendRequest(CurveDataRequest, { uri: URI, line: 0 }), null);
    assert.equal(await s.conn.sendRequest(CurveDataRequest, { uri: URI, line: 9 }), null);
    assert.equal(await s.conn.sendRequest(CurveDataRequest, { uri: 'file:///notes/other.md', line: 3 }), null);
  });
});

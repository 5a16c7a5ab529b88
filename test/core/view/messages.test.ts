import { strict as assert } from 'node:assert';
import {
  curveData,
  isHostToView,
  isViewPayload,
  isViewState,
  isViewToHost,
  pinsBesides,
  type CurvePayload,
  type RenderMessage,
} from '../../../src/core';
import { block } from '../helpers';

const payload = curveData(
  block('id: run 1\ngap: 10 K\npopulations: [0.7 ± 0.01, 0.3 ± 0.01]\nlattice: 10 K\ncount: 20').report,
  { uri: 'file:///n.md', version: 1 },
) as CurvePayload;
const render: RenderMessage = { type: 'render', seq: 1, current: payload, pinned: [{ key: 'p1', payload }] };

/** A deep copy through JSON, as postMessage would deliver it, with one change applied. */
function altered(change: (m: any) => void): unknown {
  const m = JSON.parse(JSON.stringify(render));
  change(m);
  return m;
}

describe('curve view messages', () => {
  it('accept a render message after a trip through JSON', () => {
    assert.ok(isHostToView(JSON.parse(JSON.stringify(render))));
    assert.ok(isHostToView({ type: 'render', seq: 0, current: null, pinned: [] }));
  });

  it('reject render messages with a wrong or missing field anywhere in the payload', () => {
    const broken: [string, (m: any) => void][] = [
      ['unknown type', (m) => (m.type = 'draw')],
      ['negative seq', (m) => (m.seq = -1)],
      ['NaN turned null by JSON', (m) => (m.current.curve.entropy[3] = null)],
      ['columns of unequal length', (m) => m.current.curve.beta.pop()],
      ['unknown status', (m) => (m.current.status = 'invalid')],
      ['id not a string', (m) => (m.current.id = { toString: 1 })],
      ['zero unit factor', (m) => (m.current.unit.kelvinPerUnit = 0)],
      ['measured point without energy', (m) => delete m.current.measured.energy],
      ['finite-N m not integers', (m) => (m.current.finiteN.m[1] = 0.5)],
      ['pinned run without key', (m) => delete m.pinned[0].key],
      ['pinned problem payload', (m) => (m.pinned[0].payload = { kind: 'problem' })],
      ['fact that is not text', (m) => (m.current.facts[0].text = 3)],
    ];
    for (const [what, change] of broken) assert.equal(isHostToView(altered(change)), false, what);
    assert.equal(isHostToView(null), false);
    assert.equal(isHostToView('render'), false);
  });

  it('accept a problem payload and reject one without a message', () => {
    const problem = {
      kind: 'problem',
      uri: 'file:///n.md',
      version: 2,
      line: 4,
      id: null,
      code: 'unit-case',
      message: 'Units are case-sensitive.',
    };
    assert.ok(isViewPayload(problem));
    assert.equal(isViewPayload({ ...problem, message: undefined }), false);
  });

  it('accept the view’s messages and reject unknown or malformed ones', () => {
    const png = 'data:image/png;base64,iVBORw0KGgo=';
    for (const m of [
      { type: 'ready' },
      { type: 'pin' },
      { type: 'unpin', key: 'p1' },
      { type: 'exportPng', dataUrl: png },
      { type: 'copyImageLink', dataUrl: png },
      { type: 'exportCsv', unit: 'K' },
    ]) {
      assert.ok(isViewToHost(m), JSON.stringify(m));
    }
    const bad = [
      { type: 'exportPng', dataUrl: 'javascript:alert(1)' },
      { type: 'exportPng', dataUrl: 'data:text/html;base64,PGI+' },
      { type: 'exportPng', dataUrl: 'data:image/png;base64,<svg onload=x>' },
      { type: 'exportCsv', unit: 'eV' },
      { type: 'unpin' },
      { type: 'openFile', path: '/etc/passwd' },
      [],
      undefined,
    ];
    for (const m of bad) assert.equal(isViewToHost(m), false, JSON.stringify(m));
  });

  it('accept saved view state and reject state from elsewhere', () => {
    assert.ok(isViewState({ unit: 'block', last: render }));
    assert.ok(isViewState({ unit: 'K', last: null }));
    assert.equal(isViewState({ unit: 'kelvin', last: null }), false);
    assert.equal(isViewState({ unit: 'K', last: { type: 'render' } }), false);
  });

  it('count a pin of the shown block at the same version as the shown run, and keep every other pin', () => {
    const same = { key: 'same', payload };
    const edited = { key: 'edited', payload: { ...payload, version: 2 } };
    const otherBlock = { key: 'other', payload: { ...payload, line: payload.line + 20 } };
    const otherNote = { key: 'note', payload: { ...payload, uri: 'file:///m.md' } };
    const pins = [same, edited, otherBlock, otherNote];
    assert.deepEqual(
      pinsBesides(payload, pins).map((r) => r.key),
      ['edited', 'other', 'note'],
    );
    assert.deepEqual(
      pinsBesides(null, pins).map((r) => r.key),
      ['same', 'edited', 'other', 'note'],
    );
  });
});

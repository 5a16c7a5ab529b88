import { strict as assert } from 'node:assert';
import { RunLog, shelfSource, SpectrumShelf, type Externals } from '../../../src/core';

/** y = 2 on x = 0 … 100 ppm: ∫₁₀²⁰ 2 dx = 20 with `baseline: none` (trapezoid rule, exact for a constant; common practice, no source). */
const FLAT = ['ppm,y', ...Array.from({ length: 101 }, (_, x) => `${x},2`)].join('\n');

const NOTE = [
  '```levels',
  'id: from files',
  'system: 13C',
  'field: 9.4 T',
  'lattice: 298 K',
  'signal:',
  '  hyperpolarized: { spectrum: hp.csv, region: [10 ppm, 20 ppm], baseline: none }',
  '  thermal: 0.2',
  '```',
].join('\n');

describe('run log with spectrum references', () => {
  it('reads a note’s references through the host’s externals, and without them reports the block invalid', () => {
    const files = new Map([['/lab/hp.csv', FLAT]]);
    const externals: Externals = {
      note: 'file:///lab/n.md',
      stamp: () => '1:1',
      spectra: shelfSource(
        new SpectrumShelf(),
        { stat: (p) => (files.has(p) ? { size: 1, mtime: 1 } : null), readText: (p) => files.get(p) ?? null },
        (w) => ({ path: `/lab/${w}` }),
      ),
    };
    const log = new RunLog();
    assert.equal(log.update('file:///lab/n.md', 'n.md', NOTE, externals), true);
    const [withFiles] = log.entries();
    assert.notEqual(withFiles!.status, 'invalid');
    // P = P_th · S_hp/S_th = P_th · 20/0.2: ε = 100.
    assert.ok(Math.abs(withFiles!.enhancement!.value - 100) < 1e-9, JSON.stringify(withFiles!.enhancement));
    assert.equal(log.update('file:///lab/n.md', 'n.md', NOTE), true);
    assert.equal(log.entries()[0]!.status, 'invalid');
  });
});

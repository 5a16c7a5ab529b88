import { strict as assert } from 'node:assert';
import {
  Analyzer,
  curveData,
  decimateMinMax,
  isCurvePayload,
  isSpectrumTrace,
  readSpectrum,
  spectrumCsv,
  spectrumTraces,
  type SpectrumTrace,
  type SpectrumUse,
} from '../../../src/core';

function trace(over: Partial<SpectrumTrace> = {}): SpectrumTrace {
  return {
    key: 'signal.thermal',
    file: 'spectra/t.csv',
    unit: 'ppm',
    reversed: true,
    x: [1, 2, 3, 4],
    y: [0, 1, 1, 0],
    points: 4,
    region: [1.5, 3.5],
    baseline: [2, 0, 3, 0],
    baselineKind: 'linear',
    noise: null,
    integral: { value: 1, uncertainty: null },
    integralText: '1.000',
    ...over,
  };
}

describe('curve view spectrum panel data', () => {
  it('decimates to at most the display bound, keeping each column’s extremes in x order', () => {
    const n = 1_000_000;
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = i;
      y[i] = i === 777_777 ? 50 : i === 123_456 ? -20 : Math.sin(i / 1000);
    }
    const d = decimateMinMax(x, y, 4000);
    assert.ok(d.x.length <= 4000 && d.x.length >= 2000, String(d.x.length));
    assert.ok(d.y.includes(50) && d.y.includes(-20), 'a one-point spike survives');
    for (let i = 1; i < d.x.length; i++) assert.ok(d.x[i]! > d.x[i - 1]!, 'x increasing');
    // Short series pass through unchanged.
    assert.deepEqual(decimateMinMax([1, 2, 3], [4, 5, 6], 4000), { x: [1, 2, 3], y: [4, 5, 6] });
    assert.deepEqual(decimateMinMax([], [], 10), { x: [], y: [] });
  });

  it('builds a trace only for a reference that was followed and whose spectrum the host holds', () => {
    const read = readSpectrum('ppm,y\n1,0\n2,1\n3,1\n4,0\n', 't.csv');
    assert.ok(read.ok);
    const followed: SpectrumUse = {
      key: 'signal.thermal',
      file: 'spectra/t.csv',
      span: { start: 0, end: 1 },
      fileSpan: { start: 0, end: 1 },
      source: 'file:/lab/spectra/t.csv',
      result: {
        value: 2,
        uncertainty: 0.1,
        uncertaintyWithBaseline: null,
        points: 4,
        unit: 'ppm',
        region: [1, 4],
        baseline: 'none',
        baselineLine: [1, 0, 4, 0],
        noise: null,
        sigma: null,
        noisePoints: 0,
      },
    };
    const notRead: SpectrumUse = { ...followed, key: 'signal.hyperpolarized', result: null };
    const traces = spectrumTraces([notRead, followed], (s) => (s === followed.source ? read.spectrum : null));
    assert.equal(traces.length, 1);
    assert.deepEqual(
      [traces[0]!.key, traces[0]!.reversed, traces[0]!.x, traces[0]!.integralText],
      ['signal.thermal', true, [1, 2, 3, 4], '2.00 ± 0.10'],
    );
    assert.ok(isSpectrumTrace(traces[0]));
    assert.deepEqual(
      spectrumTraces([followed], () => null),
      [],
    );
  });

  it('validates a trace as it arrives in the page', () => {
    assert.ok(isSpectrumTrace(trace()));
    assert.ok(!isSpectrumTrace(trace({ x: [1, 2] })), 'columns of different lengths');
    assert.ok(!isSpectrumTrace(trace({ x: new Array(8001).fill(1), y: new Array(8001).fill(1) })), 'too many points');
    assert.ok(!isSpectrumTrace(trace({ region: [1, Number.NaN] })));
    assert.ok(!isSpectrumTrace(trace({ baselineKind: 'cubic' as never })));
    assert.ok(!isSpectrumTrace({ ...trace(), file: 42 }));
  });

  it('a curve payload without spectra still validates (saved before them), and a bad trace fails it', () => {
    const [block] = new Analyzer().analyzeText('```levels\ngap: 10 K\nratio: 0.5\nlattice: 10 K\n```\n').blocks;
    const base = curveData(block!, { uri: 'file:///lab/n.md', version: 1 });
    assert.equal(base.kind, 'curve');
    assert.equal(isCurvePayload(base), true);
    assert.equal(isCurvePayload({ ...base, spectra: [trace()] }), true);
    assert.equal(isCurvePayload({ ...base, spectra: [trace({ reversed: 'yes' as never })] }), false);
  });

  it('CSV of a trace: the points drawn, the baseline and y less it inside the region, the file name guarded', () => {
    const csv = spectrumCsv(trace({ file: '=HYPERLINK("x")', baseline: [0, 0, 4, 0.5] }));
    const lines = csv.split('\r\n');
    assert.equal(lines[0], `file,"'=HYPERLINK(""x"")"`);
    assert.equal(lines[8], 'x_ppm,y,baseline,y_less_baseline');
    assert.equal(lines[9], '1,0,,');
    assert.equal(lines[10], '2,1,0.25,0.75');
    assert.equal(lines[11], '3,1,0.375,0.625');
    assert.equal(lines[12], '4,0,,');
  });
});

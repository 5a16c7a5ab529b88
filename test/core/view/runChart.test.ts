import { strict as assert } from 'node:assert';
import {
  Analyzer,
  DEFAULT_DISPLAY,
  dayNumber,
  dayText,
  isHostToView,
  isRunChartPayload,
  isViewToHost,
  payloadTitle,
  curveData,
  RunLog,
  runChartCsv,
  runChartData,
  type RunChartPayload,
} from '../../../src/core';
import { RUN_LOG_NOTE } from './runLogNote';

function chartOf(text: string, o = DEFAULT_DISPLAY): RunChartPayload {
  const log = new RunLog();
  log.update('file:///lab/runs.md', 'runs.md', text);
  return runChartData('runs.md', log.entries(), o);
}

describe('run comparison data', () => {
  it('puts runs on a date axis, spreads runs of one day apart, and carries each value with its uncertainty', () => {
    const c = chartOf(RUN_LOG_NOTE);
    assert.equal(c.xAxis, 'date');
    assert.deepEqual(
      c.points.map((p) => p.label),
      ['run 1', 'run 2', 'run 3', 'run 4'],
    );
    // Days since 1970-01-01: 2026-03-09 is day 20521 (proleptic Gregorian count, as JavaScript's Date.UTC
    // and ISO 8601 define it; checked against `date -d 2026-03-09 +%s` / 86400 = 20521).
    assert.equal(c.points[0]!.x, 20521);
    const [a, b] = [c.points[1]!.x, c.points[2]!.x];
    assert.ok(a < b && a > 20521 && b < 20523 && Math.abs((a + b) / 2 - 20522) < 1e-9, `${a}, ${b}`);
    const p1 = c.points[0]!.values.polarization!;
    // In percent by the default display: 31.2 ± 1.0 %.
    assert.equal(p1.y, 31.2);
    assert.ok(Math.abs(p1.u! - 1.0) < 1e-12);
    assert.equal(p1.text, '31.2 ± 1.0 %');
    assert.equal(c.points[3]!.status, 'inverted');
    // β, T and ε exist for these runs; T₁ and g₀ do not, so they get no axis.
    assert.deepEqual(
      c.axes.map((x) => x.quantity),
      ['polarization', 'beta', 'temperature', 'enhancement'],
    );
    assert.equal(c.points[0]!.values.timeConstant, null);
    // ε of run 1 with u(ε) = u(P)/P_th (JCGM 100:2008 §5.1.2): 241.1 ± 7.7.
    assert.equal(c.points[0]!.values.enhancement!.text, '241.1 ± 7.7');
  });

  it('writes P as a fraction when the display asks for fractions', () => {
    const c = chartOf(RUN_LOG_NOTE, { ...DEFAULT_DISPLAY, percent: false });
    assert.equal(c.points[0]!.values.polarization!.y, 0.312);
    assert.equal(c.axes[0]!.title, 'polarization P');
  });

  it('falls back to run order when a run has no date or an impossible one', () => {
    const c = chartOf(RUN_LOG_NOTE.replace('date: 2026-03-12', 'date: 2026-02-30'));
    assert.equal(c.xAxis, 'order');
    assert.deepEqual(
      c.points.map((p) => p.x),
      [1, 2, 3, 4],
    );
    assert.equal(dayNumber('2026-02-30'), null);
    assert.equal(dayText(dayNumber('2026-03-12')!), '2026-03-12');
  });

  it('carries T₁ of a series and g₀ of a gain block with their uncertainties', () => {
    const text = [
      '```levels',
      'id: decay',
      'series:',
      '  model: decay',
      '  time: [0 s, 10 s, 20 s, 30 s, 40 s]',
      '  signal: [1.0, 0.74, 0.55, 0.40, 0.31]',
      '```',
      '```levels',
      'id: rod',
      'gap: 1064 nm',
      'g: [12, 4]',
      'populations: [2.0e16 ± 0.1e16 cm-3, 8.0e16 ± 0.2e16 cm-3]',
      'cross-section: 2.8e-19 cm2',
      '```',
    ].join('\n');
    const c = chartOf(text);
    const t1 = c.points[0]!.values.timeConstant!;
    assert.ok(t1.y > 0 && t1.u! > 0, JSON.stringify(t1));
    const g0 = c.points[1]!.values.gain!;
    // g₀ = σ(N_u − (g_u/g_l) N_l) = 2.8e-19 × (8e16 − 2e16/3) = 0.020533 cm⁻¹ (Siegman, Lasers, 1986 — from memory);
    // u(g₀) = σ √(u(N_u)² + (g_u/g_l)² u(N_l)²) (JCGM 100:2008 §5.1.2).
    assert.ok(Math.abs(g0.y - 2.8e-19 * (8e16 - 2e16 / 3)) < 1e-12);
    assert.ok(Math.abs(g0.u! - 2.8e-19 * Math.hypot(0.2e16, 0.1e16 / 3)) < 1e-12);
    assert.ok(c.axes.some((x) => x.quantity === 'gain') && c.axes.some((x) => x.quantity === 'timeConstant'));
  });

  it('survives a trip through JSON in a render message, and the validator refuses a damaged one', () => {
    const c = JSON.parse(JSON.stringify(chartOf(RUN_LOG_NOTE))) as RunChartPayload;
    assert.ok(isRunChartPayload(c));
    assert.ok(isHostToView({ type: 'render', seq: 1, current: null, pinned: [], runs: c }));
    const bad = JSON.parse(JSON.stringify(c));
    bad.points[0].values.polarization.y = 'NaN';
    assert.equal(isRunChartPayload(bad), false);
    assert.equal(isHostToView({ type: 'render', seq: 1, current: null, pinned: [], runs: bad }), false);
    const badStatus = JSON.parse(JSON.stringify(c));
    badStatus.points[0].status = 'hot';
    assert.equal(isRunChartPayload(badStatus), false);
  });

  it('accepts the page’s run messages and refuses malformed ones', () => {
    assert.ok(isViewToHost({ type: 'openRun', uri: 'file:///lab/runs.md', line: 2 }));
    assert.equal(isViewToHost({ type: 'openRun', uri: 'file:///lab/runs.md', line: -1 }), false);
    assert.ok(isViewToHost({ type: 'exportRunsCsv', quantity: 'enhancement' }));
    assert.equal(isViewToHost({ type: 'exportRunsCsv', quantity: 'colour' }), false);
    assert.equal(isViewToHost({ type: 'exportRunsPng', dataUrl: 'javascript:alert(1)' }), false);
  });

  it('exports CSV with the value and uncertainty per run, guarding a run name a spreadsheet would evaluate', () => {
    const c = chartOf(RUN_LOG_NOTE.replace('id: run 1', 'id: "=HYPERLINK(1)"'));
    const lines = runChartCsv(c, 'polarization', DEFAULT_DISPLAY).trimEnd().split('\r\n');
    assert.equal(lines[0], 'run,line,date,status,polarization_percent,polarization_percent_uncertainty');
    assert.equal(lines.length, 5);
    assert.ok(lines[1]!.startsWith("'=HYPERLINK(1),"), lines[1]);
    assert.match(lines[1]!, /,2026-03-09,normal,31\.2,1(\.0+\d*)?$/);
  });
});

describe('curve view panel title', () => {
  it('names what the block shows: its curve, a series fit, or a Boltzmann plot', () => {
    const of = (body: string) => {
      const [b] = [new Analyzer().analyzeText(`\`\`\`levels\n${body}\n\`\`\`\n`).blocks[0]!];
      return payloadTitle(curveData(b!, { uri: 'file:///n.md', version: 1 }));
    };
    assert.equal(of('id: r1\ngap: 10 K\nratio: 0.5'), 'Curve: r1');
    assert.equal(
      of('id: d\nseries:\n  model: decay\n  time: [0 s, 10 s, 20 s, 30 s]\n  signal: [1.0, 0.74, 0.55, 0.40]'),
      'Series fit: d',
    );
    assert.equal(of('gap: 10 K'), 'No curve: block at line 1');
  });
});

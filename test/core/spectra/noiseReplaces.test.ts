/**
 * A spectrum reference's `noise` region replaces a typed `noise` for the same value (notebook format v1.2,
 * "A spectrum in place of a number", row `noise`): the region's σ·|Δx|·√n is that value's uncertainty, the
 * typed entry is ignored with the warning `noise-replaced` on it, and the block still gives its results. A
 * typed `±` next to a typed `noise` stays `uncertainty-twice`.
 *
 * The spectra are generated here (demo data, not measurements): a Lorentzian line
 * L(x) = h γ² / ((x − x₀)² + γ²), the Cauchy (Lorentz) density scaled to height h (NIST/SEMATECH
 * e-Handbook of Statistical Methods, §1.3.6.6.3 "Cauchy Distribution"; section number from memory), on a
 * ppm axis 0 … 250 ppm in 0.05 ppm steps written from high to low ppm, plus a deterministic pseudo-noise.
 */
import { strict as assert } from 'node:assert';
import { spectraEntries, type BlockReport } from '../../../src/core';
import { close } from '../helpers';
import { csv, MemoryFolder } from './helpers';

const STEP = 0.05;

/** A deterministic pseudo-noise in [−1, 1) (a linear congruential sequence, Numerical Recipes' constants). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 31 - 1;
  };
}

/** The generated points: a Lorentzian of height h and half width γ at x₀ plus `amp` times the pseudo-noise. */
function lorentzian(h: number, seed: number, amp = 2, x0 = 171, gamma = 0.5): { x: number[]; y: number[] } {
  const noise = lcg(seed);
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i <= 5000; i++) {
    const v = Number((250 - i * STEP).toFixed(2));
    x.push(v);
    y.push((h * gamma ** 2) / ((v - x0) ** 2 + gamma ** 2) + amp * noise());
  }
  return { x, y };
}

/**
 * The contract's uncertainty, computed here from the points themselves: σ is the residual standard deviation
 * of the least-squares straight line through the noise region's points (divisor n − 2), and
 * u = σ·|Δx|·√n with n the integration region's points and Δx their spacing.
 */
function contractU(
  s: { x: number[]; y: number[] },
  region: readonly [number, number],
  noise: readonly [number, number],
): number {
  const inside = (lo: number, hi: number): number[] => s.x.flatMap((v, i) => (v >= lo && v <= hi ? [i] : []));
  const nz = inside(noise[0], noise[1]);
  const m = nz.length;
  const mx = nz.reduce((a, i) => a + s.x[i]!, 0) / m;
  const my = nz.reduce((a, i) => a + s.y[i]!, 0) / m;
  let sxx = 0;
  let sxy = 0;
  for (const i of nz) {
    sxx += (s.x[i]! - mx) ** 2;
    sxy += (s.x[i]! - mx) * (s.y[i]! - my);
  }
  const slope = sxy / sxx;
  let rss = 0;
  for (const i of nz) rss += (s.y[i]! - (my + slope * (s.x[i]! - mx))) ** 2;
  const sigma = Math.sqrt(rss / (m - 2));
  const n = inside(region[0], region[1]).length;
  return sigma * STEP * Math.sqrt(n);
}

// Bounds between grid points, so which points are inside is not a matter of rounding.
const REGION = [160.025, 181.975] as const;
const NOISE = [200.025, 229.975] as const;
const REF = (file: string): string =>
  `{ spectrum: ${file}, region: [${REGION[0]} ppm, ${REGION[1]} ppm], noise: [${NOISE[0]} ppm, ${NOISE[1]} ppm] }`;
const HEAD = 'system: 13C\nfield: 9.4 T\nlattice: 298 K\n';

function at(text: string, span: { start: number; end: number }): string {
  return text.slice(span.start, span.end);
}

function codes(r: BlockReport): string[] {
  return r.problems.map((p) => p.code);
}

describe('a spectrum noise region replaces a typed noise', () => {
  const hp = lorentzian(2.0e4, 12345);
  const folder = new MemoryFolder().set('spectra/hp.csv', csv(hp.x, hp.y));
  const u = contractU(hp, REGION, NOISE);

  it('signal.hyperpolarized: keeps the region’s u, ignores noise.hyperpolarized with a warning on it', () => {
    const body = `${HEAD}signal:\n  hyperpolarized: ${REF('spectra/hp.csv')}\n  thermal: 800\n  scans: { hyperpolarized: 1, thermal: 64 }\n  noise: { hyperpolarized: 5, thermal: 1 }`;
    const { report, text } = folder.block(body);
    assert.notEqual(report.status, 'invalid', codes(report).join(', '));
    assert.deepEqual(codes(report), ['noise-replaced']);
    const p = report.problems[0]!;
    assert.equal(p.severity, 'warning');
    assert.equal(at(text, p.span), 'hyperpolarized: 5');
    assert.match(p.message, /signal\.noise\.hyperpolarized/);
    assert.match(p.message, /noise region/);

    close(report.input!.signal!.uHyperpolarized, u, 1e-9, 'u(S_hp) = σ·|Δx|·√n');
    assert.equal(report.input!.signal!.uThermal, 1, 'the typed noise of the other side still applies');
    const json = spectraEntries(report.meta);
    assert.equal(json.length, 1);
    close(json[0]!.integral!.uncertainty, u, 1e-9, 'JSON spectra integral.uncertainty');

    // The results are those of the same block with the integral and its u typed as `value ± u`.
    const S = json[0]!.integral!.value;
    const typed = folder.block(
      `${HEAD}signal:\n  hyperpolarized: ${S} ± ${u}\n  thermal: 800\n  scans: { hyperpolarized: 1, thermal: 64 }\n  noise: { thermal: 1 }`,
    ).report;
    assert.deepEqual(codes(typed), []);
    assert.equal(report.status, typed.status);
    const P = report.results!.polarization!;
    close(P.value, typed.results!.polarization!.value, 1e-12, 'P');
    close(P.uncertainty, typed.results!.polarization!.uncertainty!, 1e-9, 'u(P)');
  });

  it('series.signal: a point from a spectrum keeps its u, series.noise serves the typed points, with a warning', () => {
    // Typed points fall by 0.7 per 10 s from the spectrum's integral (demo data).
    const first = folder.block(`${HEAD}signal:\n  hyperpolarized: ${REF('spectra/hp.csv')}\n  thermal: 800`).report;
    const S0 = spectraEntries(first.meta)[0]!.integral!.value;
    const rest = [1, 2, 3].map((k) => S0 * 0.7 ** k);
    const body = `series:\n  model: decay\n  time: [0 s, 10 s, 20 s, 30 s]\n  signal:\n    - ${REF('spectra/hp.csv')}\n${rest.map((v) => `    - ${v}`).join('\n')}\n  noise: 40`;
    const { report, text } = folder.block(body);
    assert.notEqual(report.status, 'invalid', codes(report).join(', '));
    const p = report.problems.find((x) => x.code === 'noise-replaced');
    assert.ok(p, `noise-replaced expected, got ${codes(report).join(', ') || 'none'}`);
    assert.equal(p.severity, 'warning');
    assert.equal(at(text, p.span), 'noise: 40');
    assert.match(p.message, /series\.signal\[0\]/);
    assert.deepEqual(
      report.problems.filter((x) => x.severity === 'error'),
      [],
    );

    const uS = report.input!.series!.uSignals!;
    close(uS[0], u, 1e-9, 'u(series.signal[0]) = σ·|Δx|·√n');
    assert.deepEqual(uS.slice(1), [40, 40, 40]);
    close(spectraEntries(report.meta)[0]!.integral!.uncertainty, u, 1e-9, 'JSON spectra integral.uncertainty');

    // The fit is the one of the same series typed with each point's u as `±`.
    const typed = folder.block(
      `series:\n  model: decay\n  time: [0 s, 10 s, 20 s, 30 s]\n  signal: [${S0} ± ${u}, ${rest.map((v) => `${v} ± 40`).join(', ')}]`,
    ).report;
    const T1 = report.results!.series!.timeConstant;
    close(T1.value, typed.results!.series!.timeConstant.value, 1e-9, 'T1');
    close(T1.uncertainty, typed.results!.series!.timeConstant.uncertainty!, 1e-9, 'u(T1)');
  });

  it('series.noise next to spectra with noise regions at every point is ignored whole', () => {
    const f = new MemoryFolder();
    const spectra = [2.0e4, 1.4e4, 0.98e4].map((h, i) => lorentzian(h, 100 + i));
    spectra.forEach((s, i) => f.set(`s${i}.csv`, csv(s.x, s.y)));
    const body = `series:\n  model: decay\n  time: [0 s, 10 s, 20 s]\n  signal:\n${[0, 1, 2].map((i) => `    - ${REF(`s${i}.csv`)}`).join('\n')}\n  noise: 40`;
    const { report, text } = f.block(body);
    assert.notEqual(report.status, 'invalid', codes(report).join(', '));
    const p = report.problems.find((x) => x.code === 'noise-replaced')!;
    assert.equal(at(text, p.span), 'noise: 40');
    const uS = report.input!.series!.uSignals!;
    spectra.forEach((s, i) => close(uS[i], contractU(s, REGION, NOISE), 1e-9, `u(series.signal[${i}])`));
  });

  it('a typed ± next to a typed noise stays uncertainty-twice, where the noise region gives noise-replaced', () => {
    const byRegion = folder.block(
      `${HEAD}signal:\n  hyperpolarized: ${REF('spectra/hp.csv')}\n  thermal: 800\n  noise: { hyperpolarized: 5 }`,
    ).report;
    assert.deepEqual(codes(byRegion), ['noise-replaced']);

    const { report, text } = folder.block(
      `${HEAD}signal:\n  hyperpolarized: 2.0e4 ± 50\n  thermal: 800\n  noise: { hyperpolarized: 5 }`,
    );
    assert.equal(report.status, 'invalid');
    const p = report.problems.find((x) => x.code === 'uncertainty-twice')!;
    assert.equal(p.severity, 'error');
    assert.equal(at(text, p.span), '2.0e4 ± 50');
    assert.ok(!codes(report).includes('noise-replaced'));

    // In a series: a typed ± on one point and a common noise are two answers, whatever the other points are.
    const series = folder.block(
      `series:\n  model: decay\n  time: [0 s, 10 s, 20 s]\n  signal:\n    - ${REF('spectra/hp.csv')}\n    - 700 ± 5\n    - 490\n  noise: 40`,
    );
    const q = series.report.problems.find((x) => x.code === 'uncertainty-twice')!;
    assert.equal(series.report.status, 'invalid');
    assert.equal(at(series.text, q.span), '40');
    assert.ok(!codes(series.report).includes('noise-replaced'));
  });
});

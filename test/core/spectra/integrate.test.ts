/**
 * Integration of a region against spectra of known area made by an independent
 * generator (npm `spectrum-generator`, peak shapes from `ml-peak-shape-generator`),
 * and the noise uncertainty against a Monte Carlo over the same generator's noise.
 */
import { strict as assert } from 'node:assert';
// @ts-expect-error -- TS1479: the package ships only as an ES module; tsx loads it from CommonJS.
import { SpectrumGenerator } from 'spectrum-generator';
// @ts-expect-error -- TS1479: the package ships only as an ES module; tsx loads it from CommonJS.
import { fromJSON } from 'convert-to-jcamp';
import { integralUncertainty, integrateRegion, noiseSigma, readSpectrum, type Spectrum } from '../../../src/core';
import { close } from '../helpers';
import { csv, MemoryFolder } from './helpers';

/** ∫ of a Gaussian of height h and full width at half maximum w: h·w·√(π/(4 ln 2)) (a standard integral). */
const gaussArea = (h: number, w: number): number => h * w * Math.sqrt(Math.PI / (4 * Math.LN2));
/** ∫ of a Lorentzian of height h and full width at half maximum w: π·h·w/2. */
const lorentzArea = (h: number, w: number): number => (Math.PI * h * w) / 2;
/**
 * ml-peak-shape-generator draws each shape only over the window holding 0.9999 of its area (its getFactor()
 * default, documented in the package), cut off on the grid: the generated area lies within 1e-4 of the
 * analytic one (TRUNCATION), far above the trapezoid's own error on these grids.
 */
const COVERED = 1;
const TRUNCATION = 1.5e-4;

interface Generated {
  readonly x: Float64Array;
  readonly y: Float64Array;
}

function generate(
  peaks: { x: number; y: number; width: number; kind: 'gaussian' | 'lorentzian' }[],
  o: { from: number; to: number; nbPoints: number; baseline?: (x: number) => number; noise?: number; seed?: number },
): Generated {
  const g = new SpectrumGenerator({ from: o.from, to: o.to, nbPoints: o.nbPoints });
  // The array form [x, height, FWHM] (the object form's `width` is the shape's inflection width, not its FWHM).
  for (const p of peaks) g.addPeak([p.x, p.y, p.width], { shape: { kind: p.kind } });
  if (o.baseline) g.addBaseline(o.baseline);
  if (o.noise) g.addNoise({ percent: o.noise, seed: o.seed ?? 1, distribution: 'normal' });
  const s = g.getSpectrum() as { x: Float64Array; y: Float64Array };
  return { x: Float64Array.from(s.x), y: Float64Array.from(s.y) };
}

function asSpectrum(g: Generated): Spectrum {
  const r = readSpectrum(csv(g.x, g.y), 'g.csv');
  assert.ok(r.ok);
  return r.spectrum;
}

function value(r: ReturnType<typeof integrateRegion>): number {
  assert.ok('value' in r, JSON.stringify(r));
  return r.value;
}

describe('integrating a region', () => {
  it('gives the area of a generated Gaussian and of a Lorentzian, each in its own region', () => {
    const s = asSpectrum(
      generate(
        [
          { x: 40, y: 1000, width: 1.2, kind: 'gaussian' },
          { x: 160, y: 400, width: 0.8, kind: 'lorentzian' },
        ],
        { from: 0, to: 200, nbPoints: 20001 },
      ),
    );
    close(value(integrateRegion(s, 30, 50, 'none')), COVERED * gaussArea(1000, 1.2), TRUNCATION, 'Gaussian');
    // A Lorentzian's tails reach beyond any region: ∫_a^b h/(1 + ((x − x₀)/(w/2))²) dx
    // = h·(w/2)·[atan((b − x₀)/(w/2)) − atan((a − x₀)/(w/2))] (a standard integral).
    const hw = 0.4;
    const inRegion = 400 * hw * (Math.atan((200 - 160) / hw) - Math.atan((120 - 160) / hw));
    assert.ok(inRegion < lorentzArea(400, 2 * hw));
    close(value(integrateRegion(s, 120, 200, 'none')), inRegion, TRUNCATION, 'Lorentzian');
  });

  it('removes a sloped baseline with the linear baseline (and not with none)', () => {
    const slope = (x: number): number => 50 + 0.8 * x;
    const s = asSpectrum(
      generate([{ x: 100, y: 500, width: 2, kind: 'gaussian' }], { from: 0, to: 200, nbPoints: 4001, baseline: slope }),
    );
    const expected = COVERED * gaussArea(500, 2);
    close(value(integrateRegion(s, 85, 115, 'linear')), expected, TRUNCATION, 'linear baseline');
    // Under a straight line the baseline's area is exact: (x1 − x0)·(b(x0) + b(x1))/2.
    close(
      value(integrateRegion(s, 85, 115, 'none')),
      expected + 30 * ((slope(85) + slope(115)) / 2),
      TRUNCATION,
      'none',
    );
  });

  it('integrates toward increasing x whatever the order the file stores its points in', () => {
    const g = generate([{ x: 100, y: 500, width: 2, kind: 'gaussian' }], { from: 0, to: 200, nbPoints: 2001 });
    const reversed = readSpectrum(csv([...g.x].reverse(), [...g.y].reverse()), 'r.csv');
    assert.ok(reversed.ok);
    assert.equal(reversed.spectrum.descending, true);
    close(value(integrateRegion(reversed.spectrum, 90, 110, 'none')), COVERED * gaussArea(500, 2), TRUNCATION);
  });

  it('refuses a region beyond the file or with fewer than 3 points', () => {
    const s = asSpectrum(generate([{ x: 10, y: 1, width: 1, kind: 'gaussian' }], { from: 0, to: 20, nbPoints: 21 }));
    assert.deepEqual(integrateRegion(s, 15, 25, 'none'), { kind: 'outside', min: 0, max: 20 });
    assert.deepEqual(integrateRegion(s, 3.5, 4.5, 'none'), { kind: 'few', points: 1 });
    assert.ok('value' in integrateRegion(s, 3, 5, 'none'), 'bounds are included: 3, 4, 5');
  });
});

describe('the noise and the integral uncertainty', () => {
  const base = { from: 0, to: 400, nbPoints: 4001 } as const;
  const peak = [{ x: 100, y: 1000, width: 3, kind: 'gaussian' as const }];

  it('estimates σ of the generator noise from a signal-free region', () => {
    const clean = generate(peak, base);
    const noisy = generate(peak, { ...base, noise: 1, seed: 7 });
    // The noise the generator added, measured directly on its 1501 points in 250…400.
    let ss = 0;
    let m = 0;
    const idx = [...clean.x.keys()].filter((i) => clean.x[i]! >= 250);
    for (const i of idx) m += noisy.y[i]! - clean.y[i]!;
    m /= idx.length;
    for (const i of idx) ss += (noisy.y[i]! - clean.y[i]! - m) ** 2;
    const sd = Math.sqrt(ss / (idx.length - 1));
    const r = noiseSigma(asSpectrum(noisy), 250, 400);
    assert.ok('sigma' in r);
    assert.equal(r.points, idx.length);
    // A straight-line fit removes two degrees of freedom; with 1501 points the two estimates agree closely.
    close(r.sigma, sd, 0.01, 'σ');
  });

  it('matches the spread of the integral over independent noise (Monte Carlo, 300 draws)', () => {
    const integrals: number[] = [];
    let predicted = 0;
    for (let seed = 1; seed <= 300; seed++) {
      const s = asSpectrum(generate(peak, { ...base, noise: 1, seed }));
      const i = integrateRegion(s, 80, 120, 'none');
      assert.ok('value' in i);
      integrals.push(i.value);
      const n = noiseSigma(s, 250, 400);
      assert.ok('sigma' in n);
      predicted += integralUncertainty(n.sigma, i.spacing, i.points) / 300;
    }
    const mean = integrals.reduce((a, b) => a + b, 0) / integrals.length;
    const sd = Math.sqrt(integrals.reduce((a, b) => a + (b - mean) ** 2, 0) / (integrals.length - 1));
    // The trapezoid's end halves make the true spread slightly below σ·Δx·√n; 300 draws know a
    // standard deviation to about 4 % (1/√(2·300)), so 15 % allows both.
    close(sd, predicted, 0.15, 'spread of the integral');
    close(mean, COVERED * gaussArea(1000, 3), 0.002, 'mean integral');
  });

  it('gives the spread of the integral with a linear baseline, the noise of the baseline included (Monte Carlo, 400 draws)', () => {
    // With a linear baseline the integral is Σ c_k·y_k, its centroids read from noisy points of the region, so its
    // spread is σ·√(Σ c_k²) (GUM JCGM 100:2008 eq. (10)); a Monte Carlo of the same noise is the check (JCGM 101 §7).
    const integrals: number[] = [];
    let full = 0;
    let format = 0;
    for (let seed = 1; seed <= 400; seed++) {
      const s = asSpectrum(generate(peak, { ...base, noise: 1, seed }));
      const i = integrateRegion(s, 80, 120, 'linear');
      assert.ok('value' in i);
      integrals.push(i.value);
      const n = noiseSigma(s, 250, 400);
      assert.ok('sigma' in n);
      full += (n.sigma * i.fullFactor) / 400;
      format += integralUncertainty(n.sigma, i.spacing, i.points) / 400;
    }
    const mean = integrals.reduce((a, b) => a + b, 0) / integrals.length;
    const sd = Math.sqrt(integrals.reduce((a, b) => a + (b - mean) ** 2, 0) / (integrals.length - 1));
    // 400 draws know a standard deviation to about 3.5 % (1/√(2·400)): 12 % is over three of those.
    close(sd, full, 0.12, 'spread with the baseline');
    assert.ok(sd > 1.5 * format, `the format's σ·Δx·√n (${format}) leaves out most of the spread (${sd})`);
  });
});

describe('a signal block over generated files, end to end', () => {
  it('gives P = P_th · (A_hp/A_th) · NS_th, from a DIFDUP JCAMP-DX file and a text file of known areas', () => {
    // Hyperpolarized: a Gaussian line written by convert-to-jcamp in DIFDUP; thermal: the same
    // line 2000 times smaller as two-column text. Both from spectrum-generator, areas h·w·√(π/(4 ln 2)).
    const hp = generate([{ x: 171, y: 4.0e5, width: 0.4, kind: 'gaussian' }], { from: 150, to: 190, nbPoints: 8001 });
    const th = generate([{ x: 171, y: 200, width: 0.4, kind: 'gaussian' }], { from: 150, to: 190, nbPoints: 8001 });
    const folder = new MemoryFolder()
      .set(
        'hp.jdx',
        fromJSON(
          { x: hp.x, y: hp.y },
          { info: { xUnits: 'PPM', yUnits: 'ARBITRARY UNITS', title: 'hp' }, xyEncoding: 'DIFDUP' },
        ),
      )
      .set('th.csv', csv(th.x, th.y));
    const { report } = folder.block(
      'system: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  hyperpolarized: { spectrum: hp.jdx, region: [165 ppm, 177 ppm] }\n  thermal: { spectrum: th.csv, region: [165 ppm, 177 ppm] }\n  scans: { hyperpolarized: 1, thermal: 16 }',
    );
    assert.deepEqual(report.problems, []);
    // P_th = tanh(ħγB/(2kT)) for a spin ½; γ(¹³C) = 6.728284e7 rad s⁻¹ T⁻¹ (Harris et al., Pure Appl. Chem. 73,
    // 1795 (2001)), ħ and k from CODATA 2018 (k exact in the SI since 2019).
    const hbar = 1.054571817e-34;
    const k = 1.380649e-23;
    const pth = Math.tanh((hbar * 6.728284e7 * 9.4) / (2 * k * 298));
    // The common-practice reference formula (docs/format.md, no source): P = P_th · (S_hp/S_th) · NS_th/NS_hp.
    close(report.results!.polarization!.value, pth * (gaussArea(4.0e5, 0.4) / gaussArea(200, 0.4)) * 16, 2e-4, 'P');
  });
});

/**
 * Outlier flags of a Boltzmann plot against lines that lie on a perfect
 * Boltzmann line except for the rounding of their written intensities: none
 * may be flagged, however small the median residual of such lines is, while a
 * line that really is 30 % low still is. The floor on σ is the rounding
 * uncertainty of a written number, a rectangular distribution half a unit of
 * the last digit wide on either side, u = δ/(2√3) (GUM, JCGM 100:2008
 * §F.2.2.1).
 */
import { strict as assert } from 'node:assert';
import {
  clipLine,
  columnDigits,
  roundingFloor,
  roundingUncertainty,
  writtenDigits,
} from '../../src/core/analysis/lineClipping';
import { block, close } from './helpers';
import { ARGON, BALMER, C2 } from './nistLines';

type Line = readonly [number, number, number, number];

/**
 * Energy-calibrated intensities of optically thin lines in LTE,
 * I ∝ (g A/λ) e^(−E/kT) (J. A. Aguilera, C. Aragón, Spectrochim. Acta B 63, 893 (2008)),
 * scaled so the strongest is `top`.
 */
function intensities(lines: readonly Line[], T: number, top: number): number[] {
  const I = lines.map(([nm, E, g, A]) => ((g * A) / nm) * Math.exp((-E * C2) / T));
  const max = Math.max(...I);
  return I.map((v) => (top * v) / max);
}

function body(lines: readonly Line[], I: readonly number[]): string {
  const items = lines.map(
    ([nm, E, g, A], i) => `  - { wavelength: ${nm} nm, upper: ${E} cm-1, g: ${g}, A: ${A}, intensity: ${I[i]} }`,
  );
  return `wavelengths: vacuum\ndetector: energy\nlines:\n${items.join('\n')}`;
}

const round = (v: number, digits: number): number => Number(v.toPrecision(digits));

describe('outlier flags and the rounding of written intensities', () => {
  it('generates the Ar I intensities of the reference sheet at 10 000 K (relative to 811.75 nm)', () => {
    // Derived values, 30-digit arithmetic on the NIST ASD data above (domain reference, §8c).
    const expected = [
      1, 0.50419777, 0.2972004, 0.19934234, 0.19398811, 0.14872981, 0.15546566, 0.072272388, 0.13180352,
    ];
    intensities(ARGON, 10000, 1).forEach((v, i) => close(v, expected[i]!, 2e-7, `line ${i}`));
  });

  for (const digits of [3, 4])
    it(`flags no line of a perfect Boltzmann plot whose intensities are rounded to ${digits} significant digits`, () => {
      let blocks = 0;
      for (const lines of [ARGON, BALMER])
        for (const T of [4000, 6000, 10000, 15000, 25000])
          for (const top of [1, 7.3, 1000, 25000]) {
            const I = intensities(lines, T, top).map((v) => round(v, digits));
            const r = block(body(lines, I)).report;
            const flagged = r.problems.filter((p) => p.code === 'line-outlier');
            assert.equal(flagged.length, 0, `T = ${T} K, top ${top}: ${flagged.map((p) => p.message).join('; ')}`);
            assert.equal(r.results!.trade.refit, null);
            blocks++;
          }
      assert.equal(blocks, 40);
    });

  it('would flag such lines on the median residual alone: the case the floor is for', () => {
    // Ar I at 10 000 K to 3 digits, clipped without the floor (σ = 1.4826 × MAD only).
    const I = intensities(ARGON, 10000, 1000).map((v) => round(v, 3));
    const x = ARGON.map(([, E]) => E * C2);
    const y = ARGON.map(([nm, , g, A], i) => Math.log((I[i]! * nm) / A) - Math.log(g));
    assert.ok(clipLine(x, y, null).flagged.length > 0, 'rounding alone trips the bare MAD');
    const u = ARGON.map(([, , , A], i) => Math.hypot(roundingUncertainty(I[i]!, 3), roundingUncertainty(A, 3)));
    assert.deepEqual(clipLine(x, y, null, roundingFloor(x, u)).flagged, []);
  });

  for (const digits of [3, 4])
    it(`still flags a line 30 % low, below the line, among lines rounded to ${digits} digits`, () => {
      for (const T of [6000, 10000, 15000])
        for (let k = 0; k < ARGON.length; k++) {
          const I = intensities(ARGON, T, 1000).map((v, i) => round(i === k ? 0.7 * v : v, digits));
          const r = block(body(ARGON, I)).report.results!;
          const flagged = r.trade.plot!.points.filter((p) => p.flag !== null);
          assert.equal(flagged.length, 1, `T = ${T} K, line ${k}: ${flagged.map((p) => p.index).join(', ')}`);
          assert.equal(flagged[0]!.flag, 'below');
          assert.ok(
            Math.abs(flagged[0]!.energy - ARGON[k]![1] * C2) < 1e-6 * flagged[0]!.energy,
            `the 30 % low line is the flagged one (T = ${T} K, line ${k})`,
          );
          // Without it the refit finds the temperature again, to the rounding of the rest.
          close(r.trade.refit!.temperature!.value, T, 0.01, `refit T (T = ${T} K, line ${k})`);
        }
    });

  it('still flags a line 30 % low among Balmer lines rounded to 3 digits', () => {
    const I = intensities(BALMER, 10000, 1000).map((v, i) => round(i === 1 ? 0.7 * v : v, 3));
    const r = block(body(BALMER, I)).report.results!;
    assert.deepEqual(
      r.trade.plot!.points.map((p) => p.flag),
      [null, 'below', null, null],
    );
  });
});

describe('the rounding uncertainty of a written number', () => {
  it('is δ/(2√3) = 0.2887 δ of the last written digit (GUM §F.2.2.1), relative to the value', () => {
    close(roundingUncertainty(1520, 3), 10 / (2 * Math.sqrt(3)) / 1520, 1e-12, '1.52e3: δ = 10');
    close(roundingUncertainty(0.0123, 3), 1e-4 / (2 * Math.sqrt(3)) / 0.0123, 1e-12, 'δ = 1e-4');
    close(roundingUncertainty(9.99, 3), 0.01 / (2 * Math.sqrt(3)) / 9.99, 1e-12, 'δ = 0.01');
    close(roundingUncertainty(2.45e7, 2), 1e5 / (2 * Math.sqrt(3)) / 2.45e7, 1e-12, 'its own three digits');
    close(roundingUncertainty(1.5e-7, 2), 1e-8 / (2 * Math.sqrt(3)) / 1.5e-7, 1e-12, 'δ = 1e-8');
  });

  it('reads a number that lost its trailing zeros to the precision of its column', () => {
    // 1.00 reads back as 1: among numbers written with three digits it is 1.00, δ = 0.01.
    assert.equal(writtenDigits(1), 1);
    assert.equal(writtenDigits(1.0), 1);
    assert.equal(columnDigits([1520, 872, 1]), 3);
    close(roundingUncertainty(1, columnDigits([1520, 872, 1])), 0.01 / (2 * Math.sqrt(3)), 1e-12, '1 as 1.00');
    // Round numbers alone are read with two digits at least: 1000 as 1.0e3.
    assert.equal(columnDigits([1000, 300, 50]), 2);
    close(roundingUncertainty(1000, 2), 100 / (2 * Math.sqrt(3)) / 1000, 1e-12, '1000 as 1.0e3');
  });

  it('gives 0 for 0, NaN and ±∞, and counts no digits there', () => {
    for (const v of [0, -0, Number.NaN, Infinity, -Infinity]) {
      assert.equal(roundingUncertainty(v, 3), 0);
      assert.equal(writtenDigits(v), 0);
    }
    assert.equal(roundingUncertainty(-1520, 3), roundingUncertainty(1520, 3));
  });
});

describe('the floor on σ of each line', () => {
  it('equals √(u_i² + Σ_j h_ij² u_j²) from the hat matrix built point by point', () => {
    const x = [0, 1, 3, 4, 9];
    const u = [0.01, 0.002, 0.03, 0.005, 0.02];
    const n = x.length;
    const xm = x.reduce((s, v) => s + v, 0) / n;
    const sxx = x.reduce((s, v) => s + (v - xm) ** 2, 0);
    // h_ij of the unweighted straight line (linear-model algebra, from memory), summed term by term.
    const h = (i: number, j: number): number => 1 / n + ((x[i]! - xm) * (x[j]! - xm)) / sxx;
    const floor = roundingFloor(x, u);
    for (let i = 0; i < n; i++) {
      let line = 0;
      for (let j = 0; j < n; j++) line += h(i, j) ** 2 * u[j]! ** 2;
      close(floor[i], Math.sqrt(u[i]! ** 2 + line), 1e-12, `floor ${i}`);
    }
  });

  it('is each point’s own u where every x is equal', () => {
    assert.deepEqual(roundingFloor([2, 2, 2], [0.1, 0.2, 0.3]), [0.1, 0.2, 0.3]);
  });
});

import assert from 'node:assert/strict';
import { MAX_FINITE_N_POINTS, finiteNCurve, lnBinomial } from '../../../src/core/physics/finiteN';
import { close } from '../helpers';

/** Exact C(n, k) with BigInt (independent of log-gamma): multiply and divide step by step, each division exact. */
function exactBinomial(n: number, k: number): bigint {
  let c = 1n;
  const kk = Math.min(k, n - k);
  for (let i = 1; i <= kk; i++) c = (c * BigInt(n - kk + i)) / BigInt(i);
  return c;
}

/** Natural logarithm of a positive BigInt, from its leading 17 digits and its length. */
function lnBig(b: bigint): number {
  const s = b.toString();
  if (s.length <= 300) return Math.log(Number(b));
  return Math.log(Number(s.slice(0, 17))) + (s.length - 17) * Math.LN10;
}

describe('ln C(N, m)', () => {
  it('matches the tabulated values for N = 100 and N = 10', () => {
    // domain.md §7, derived (D) from the two-state multiplicity Ω = C(N, m) (Schroeder, An Introduction to
    // Thermal Physics, 2000, §2.1): ln C(100, 30) = ln C(100, 70) = 58.642 095 64, ln C(100, 50) = 66.783 841 65,
    // ln C(10, 3) = 4.787 491 743.
    close(lnBinomial(100, 30), 58.64209564, 1e-10, 'ln C(100, 30)');
    close(lnBinomial(100, 70), 58.64209564, 1e-10, 'ln C(100, 70)');
    close(lnBinomial(100, 50), 66.78384165, 1e-10, 'ln C(100, 50)');
    close(lnBinomial(10, 3), 4.787491743, 1e-10, 'ln C(10, 3)');
  });

  it('matches exact BigInt binomials for every m and N ≤ 60', () => {
    for (let n = 0; n <= 60; n++) {
      for (let m = 0; m <= n; m++) {
        const exact = lnBig(exactBinomial(n, m));
        const got = lnBinomial(n, m)!;
        assert.ok(
          Math.abs(got - exact) <= 1e-13 * Math.max(1, exact),
          `ln C(${n}, ${m}) = ${got}, exact ${exact}, Δ = ${Math.abs(got - exact)}`,
        );
      }
    }
  });

  it('matches exact BigInt binomials for N from 1000 to 5000, across the series switch at 15', () => {
    for (const n of [1000, 1024, 1025, 1100, 3001, 5000]) {
      for (const m of [1, 2, 7, 15, 16, 17, 100, Math.floor(n / 3), Math.floor(n / 2), n - 5, n - 1]) {
        close(lnBinomial(n, m), lnBig(exactBinomial(n, m)), 2e-14, `ln C(${n}, ${m})`);
      }
    }
  });

  it('stays accurate up to N = 1e9', () => {
    close(lnBinomial(1e9, 1), Math.log(1e9), 1e-15, 'ln C(1e9, 1) = ln N');
    close(lnBinomial(1e9, 2), Math.log(1e9) + Math.log(1e9 - 1) - Math.LN2, 1e-15, 'ln C(1e9, 2)');
    close(
      lnBinomial(1e9, 1e9 - 3),
      Math.log(1e9) + Math.log(1e9 - 1) + Math.log(1e9 - 2) - Math.log(6),
      1e-15,
      'ln C(1e9, N − 3)',
    );
    // Central binomial coefficient, asymptotic series: ln C(N, N/2) = N ln 2 − ½ ln(πN/2) − 1/(4N) + O(N⁻³) (derived).
    const n = 1e9;
    close(lnBinomial(n, n / 2), n * Math.LN2 - 0.5 * Math.log((Math.PI * n) / 2) - 1 / (4 * n), 1e-15, 'ln C(N, N/2)');
  });

  it('differs from N·H(m/N) by the Stirling correction', () => {
    // domain.md §7 (D): N·H(0.3) = 61.086 430 21 for N = 100; the gap to ln C is ≈ ½ ln(2πN p(1 − p)) = 2.44.
    const nh = -100 * (0.3 * Math.log(0.3) + 0.7 * Math.log(0.7));
    close(nh, 61.08643021, 1e-10, 'N·H');
    close(nh - lnBinomial(100, 30)!, 0.5 * Math.log(2 * Math.PI * 100 * 0.3 * 0.7), 2e-3, 'Stirling correction');
  });

  it('returns null outside 0 ≤ m ≤ N or for non-integers and non-finite numbers', () => {
    assert.equal(lnBinomial(0, 0), 0);
    assert.equal(lnBinomial(5, -0), 0);
    for (const [n, m] of [
      [5, 6],
      [5, -1],
      [5.5, 2],
      [5, 2.5],
      [NaN, 1],
      [10, NaN],
      [Infinity, 1],
      [-1, 0],
      [2 ** 53, 1],
    ] as const) {
      assert.equal(lnBinomial(n, m), null, `ln C(${n}, ${m})`);
    }
  });
});

describe('finite-N entropy and inverse temperature', () => {
  it('gives the tabulated central-difference β for N = 100 at m = 30, 50, 70', () => {
    // domain.md §7 (D): [ln C(N, m+1) − ln C(N, m−1)]/2 = 0.837 995 267 (m = 30), 0 (m = 50), −0.837 995 267 (m = 70).
    const gap = 2.5;
    const curve = finiteNCurve(100, gap)!;
    assert.equal(curve.length, 101);
    const at = (m: number) => curve.find((p) => p.m === m)!;
    close(at(30).beta * gap, 0.837995267, 1e-9, 'βε at m = 30');
    close(at(70).beta * gap, -0.837995267, 1e-9, 'βε at m = 70');
    assert.equal(at(50).beta, 0);
    close(at(30).entropy, 0.5864209564, 1e-10, 'S/(Nk) at m = 30');
    close(at(30).energy, 0.75, 1e-15, 'U/N at m = 30');
  });

  it('gives the tabulated central-difference β for N = 10 at m = 3', () => {
    // domain.md §7 (D): N = 10, m = 3: central difference 0.770 222 521.
    const point = finiteNCurve(10, 1)!.find((p) => p.m === 3)!;
    close(point.beta, 0.770222521, 1e-9, 'βε');
    close(point.entropy * 10, 4.787491743, 1e-10, 'ln C(10, 3)');
  });

  it('computes the central difference the same way as an explicit difference of ln C', () => {
    for (const n of [7, 64, 999]) {
      for (const point of finiteNCurve(n, 0.8)!) {
        if (point.m === 0 || point.m === n) continue;
        const explicit = (lnBinomial(n, point.m + 1)! - lnBinomial(n, point.m - 1)!) / (2 * 0.8);
        close(point.beta, explicit, 1e-9, `N = ${n}, m = ${point.m}`);
      }
    }
  });

  it('uses the one-sided difference ± ln N/ε at m = 0 and m = N', () => {
    const curve = finiteNCurve(100, 2)!;
    close(curve[0]!.beta, Math.log(100) / 2, 1e-15, 'forward difference at m = 0');
    close(curve[100]!.beta, -Math.log(100) / 2, 1e-15, 'backward difference at m = N');
  });

  it('approaches the Stirling form ln((N − m)/m)/ε for large N', () => {
    // domain.md §7: with Stirling, 1/T = (k/ε) ln((N − m)/m).
    const point = finiteNCurve(1e6, 1, { maxPoints: 11 })!.find((p) => p.m === 300000)!;
    close(point.beta, Math.log(7 / 3), 1e-5, 'β at m/N = 0.3');
  });

  it('strides evenly for N = 1e9, keeping m = 0, N/2 and N, antisymmetric β and symmetric S', () => {
    const n = 1e9;
    const curve = finiteNCurve(n, 1)!;
    assert.ok(curve.length <= 2001 && curve.length >= 1999, `${curve.length} points`);
    const ms = curve.map((p) => p.m);
    assert.ok(ms.includes(0) && ms.includes(n / 2) && ms.includes(n));
    for (let i = 0; i < curve.length; i++) {
      const a = curve[i]!;
      const b = curve[curve.length - 1 - i]!;
      assert.equal(a.m + b.m, n, 'grid symmetric under m → N − m');
      close(a.entropy, b.entropy, 1e-12, `S at m = ${a.m}`);
      assert.ok(a.beta === -b.beta, `β at m = ${a.m}: ${a.beta} vs ${b.beta}`);
      if (i > 0) assert.ok(a.energy > curve[i - 1]!.energy && a.beta < curve[i - 1]!.beta, `ordering at m = ${a.m}`);
    }
    // Midpoint: ln C(N, N/2)/N = ln 2 − ½ ln(πN/2)/N + O(N⁻²) (central binomial asymptotics, derived).
    close(
      curve.find((p) => p.m === n / 2)!.entropy,
      Math.LN2 - (0.5 * Math.log((Math.PI * n) / 2)) / n,
      1e-15,
      'S/(Nk) at the midpoint',
    );
  });

  it('keeps both central counts for odd N and honours small maxPoints', () => {
    const ms = finiteNCurve(1001, 1, { maxPoints: 50 })!.map((p) => p.m);
    assert.ok(ms.length <= 50, `${ms.length} points`);
    assert.ok(ms.includes(500) && ms.includes(501) && ms.includes(0) && ms.includes(1001));
    assert.deepEqual(
      finiteNCurve(1001, 1, { maxPoints: 2 })!.map((p) => p.m),
      [0, 500, 501, 1001],
    );
    assert.equal(finiteNCurve(1000, 1, { maxPoints: NaN })!.length, 1001);
    assert.ok(finiteNCurve(1e9, 1, { maxPoints: 1e12 })!.length <= MAX_FINITE_N_POINTS, 'maxPoints is capped');
  });

  it('returns null for N < 1, non-integer or non-finite N and a gap that is not positive and finite', () => {
    for (const [n, gap] of [
      [0, 1],
      [-5, 1],
      [2.5, 1],
      [NaN, 1],
      [Infinity, 1],
      [10, 0],
      [10, -1],
      [10, NaN],
      [10, Infinity],
    ] as const) {
      assert.equal(finiteNCurve(n, gap), null, `N = ${n}, ε = ${gap}`);
    }
  });
});

import assert from 'node:assert/strict';
import {
  betaFromSpinPolarization,
  brillouin,
  spinPolarization,
  spinPolarizationFromPopulations,
  thermalSpinPolarization,
} from '../../../src/core/physics/brillouin';
import { close } from '../helpers';
import { lookupSpecies, zeemanSpacingKelvin } from '../../../src/core/quantities/isotopes';

/**
 * Independent computation: ⟨m⟩/I over m = −I … I with weights e^(m y), by direct
 * summation. For small |I y| the numerator uses Σ m·expm1(m y) (Σ m = 0) to avoid
 * cancellation; otherwise weights are shifted by the largest exponent.
 */
function boltzmannSum(spin: number, y: number): number {
  const ms: number[] = [];
  for (let k = 0; k <= 2 * spin; k++) ms.push(spin - k);
  if (Math.abs(spin * y) < 1) {
    let num = 0;
    let den = 0;
    for (const m of ms) {
      num += m * Math.expm1(m * y);
      den += Math.exp(m * y);
    }
    return num / (spin * den);
  }
  const top = spin * Math.abs(y);
  let num = 0;
  let den = 0;
  for (const m of ms) {
    const w = Math.exp(m * y - top);
    num += m * w;
    den += w;
  }
  return num / (spin * den);
}

// Exact SI 2019 constants (domain.md §1a; CODATA/SI Brochure): h and k.
const H = 6.62607015e-34;
const K = 1.380649e-23;
/** Zeeman spacing |γ|ħB/k in K for γ in rad s⁻¹ T⁻¹ and B in T. */
const spacing = (gamma: number, field: number): number => (Math.abs(gamma) * (H / (2 * Math.PI)) * field) / K;

describe('Brillouin function', () => {
  it('matches the tabulated values B_J(1) for J = 1/2, 1, 3/2, 5/2', () => {
    // domain.md §5, derived (D, 30-digit arithmetic) from the formula in Kittel, Introduction to Solid State Physics, ch. 11.
    close(brillouin(0.5, 1), 0.761594155955765, 1e-14, 'B_1/2(1)');
    close(brillouin(1, 1), 0.575210382604441, 1e-14, 'B_1(1)');
    close(brillouin(1.5, 1), 0.495692876075818, 1e-14, 'B_3/2(1)');
    close(brillouin(2.5, 1), 0.426147140342926, 1e-14, 'B_5/2(1)');
  });

  it('equals tanh x for J = 1/2 from tiny to large arguments', () => {
    // domain.md §5: B_1/2(x) = tanh x (V2, encyclopedia mirror of the standard formula).
    for (const x of [1e-300, 1e-12, 1e-5, 0.01, 0.3, 0.99, 1.5, 1.999, 2.001, 3, 10, 19, 40]) {
      close(brillouin(0.5, x), Math.tanh(x), 1e-15, `x = ${x}`);
      close(brillouin(0.5, -x), -Math.tanh(x), 1e-15, `x = −${x}`);
    }
  });

  it('agrees with a direct Boltzmann sum over the Zeeman levels for several spins', () => {
    // domain.md §5: ⟨I_z⟩/I = B_I(I·y) is exact for the Boltzmann distribution; independent check by summation.
    for (const spin of [0.5, 1, 1.5, 2.5, 3.5, 4.5, 7]) {
      for (const y of [1e-9, 3e-6, 1e-3, 0.05, 0.4, 1, 2.2, 7, 30]) {
        close(spinPolarization(spin, y), boltzmannSum(spin, y), 2e-13, `I = ${spin}, y = ${y}`);
        close(spinPolarization(spin, -y), boltzmannSum(spin, -y), 2e-13, `I = ${spin}, y = −${y}`);
      }
    }
  });

  it('has the small-argument slope (J + 1)/3J and saturates at ±1', () => {
    // domain.md §5 (V2, encyclopedia mirror): small-x slope (J+1)/(3J); B_J → 1 as x → ∞.
    for (const j of [0.5, 1, 2.5, 10, 1000]) {
      close(brillouin(j, 1e-9)! / 1e-9, (j + 1) / (3 * j), 1e-12, `slope for J = ${j}`);
      assert.equal(brillouin(j, 1e6), 1);
      assert.equal(brillouin(j, -1e6), -1);
      assert.equal(brillouin(j, Infinity), 1);
      assert.equal(brillouin(j, -Infinity), -1);
    }
  });

  it('is odd and strictly increasing, with B_J(±0) = 0', () => {
    let previous = -1;
    for (let x = -20; x <= 20; x += 0.01) {
      const b = brillouin(1.5, x)!;
      assert.ok(b > previous || Math.abs(x) > 15, `not increasing at x = ${x}`);
      assert.equal(brillouin(1.5, -x), -b);
      previous = b;
    }
    assert.ok(Object.is(brillouin(1, 0), 0));
    assert.ok(Object.is(brillouin(1, -0), 0));
  });

  it('returns null for NaN arguments and non-positive or non-finite J', () => {
    for (const [j, x] of [
      [1, NaN],
      [0, 1],
      [-1, 1],
      [NaN, 1],
      [Infinity, 1],
    ] as const) {
      assert.equal(brillouin(j, x), null, `J = ${j}, x = ${x}`);
    }
  });
});

describe('thermal spin polarization', () => {
  it('reproduces the 9.4 T, 298.15 K polarizations of 2H, 7Li, 17O, 23Na, 19F, 13C and 129Xe', () => {
    // γ in rad s⁻¹ T⁻¹ from the IUPAC 2001 table (Harris et al., Pure Appl. Chem. 73, 1795 (2001)),
    // as transcribed in domain.md §3; expected P = ⟨I_z⟩/I from domain.md §5 and §4 (derived, D).
    // The table gives signed ⟨I_z⟩ (17O, 129Xe negative); our convention makes P > 0 at T > 0 (domain.md Part 1).
    const cases: Array<[string, number, number, number]> = [
      ['2H', 1, 4.10662791e7, 6.5929535e-6],
      ['7Li', 1.5, 10.3977013e7, 2.0866135e-5],
      ['17O', 2.5, -3.62808e7, 1.0193177e-5],
      ['23Na', 1.5, 7.0808493e7, 1.4209867e-5],
      ['19F', 0.5, 25.18148e7, 3.0320557e-5],
      ['13C', 0.5, 6.728284e7, 8.101403e-6],
      ['129Xe', 0.5, -7.452103e7, 8.9729402e-6],
    ];
    for (const [name, spin, gamma, expected] of cases) {
      const d = spacing(gamma, 9.4);
      close(thermalSpinPolarization(spin, d, 298.15), expected, 1e-7, name);
      // domain.md §5: equals the high-temperature form (I + 1)y/3 to 8 digits here.
      close(thermalSpinPolarization(spin, d, 298.15), ((spin + 1) * d) / (3 * 298.15), 1e-8, `${name}, linear form`);
    }
  });

  it('gives tanh(ΔE/2T) for spin 1/2 far from the linear regime', () => {
    // domain.md §4 (D from CODATA 2018 γ_e): electron at 3.35 T, 1.2 K, x = 3.754 7513 → P = 0.954 2581.
    close(thermalSpinPolarization(0.5, 3.7547513 * 1.2, 1.2), 0.9542581, 1e-7, 'electron');
  });

  it('returns 0 at infinite temperature and null for T ≤ 0, bad spacing or a non-spin I', () => {
    assert.equal(thermalSpinPolarization(1, 1, Infinity), 0);
    for (const [i, d, t] of [
      [1, 1, 0],
      [1, 1, -5],
      [1, 1, NaN],
      [1, 0, 1],
      [1, -1, 1],
      [1, Infinity, 1],
      [0.7, 1, 1],
      [0, 1, 1],
    ] as const) {
      assert.equal(thermalSpinPolarization(i, d, t), null, `I = ${i}, ΔE = ${d}, T = ${t}`);
    }
  });
});

describe('spin polarization from populations', () => {
  it('equals B_I(I·y) for Boltzmann populations listed in increasing energy', () => {
    for (const spin of [0.5, 1, 1.5, 2.5]) {
      const y = 0.37;
      const pops: number[] = [];
      for (let k = 0; k <= 2 * spin; k++) pops.push(Math.exp((spin - k) * y)); // level k has m = I − k, E = −m ΔE
      close(spinPolarizationFromPopulations(pops)!.value, spinPolarization(spin, y)!, 1e-14, `I = ${spin}`);
    }
  });

  it('reproduces the sign and size of the 7Li probabilities of Schroeder Problem 6.11 at ±300 K', () => {
    // domain.md §7, derived (D) from Schroeder, An Introduction to Thermal Physics, Problem 6.11:
    // x = μB/kT = 2.510 057 × 10⁻⁶, probabilities for m = −3/2 … 3/2 below; at −300 K reversed.
    const byM = [0.249999058729, 0.249999686242, 0.250000313756, 0.250000941272];
    const increasingEnergy = [...byM].reverse(); // E = −mμB: m = +3/2 is lowest
    const expected = spinPolarization(1.5, 2.510057e-6)!;
    close(spinPolarizationFromPopulations(increasingEnergy)!.value, expected, 1e-5, '+300 K');
    close(spinPolarizationFromPopulations(byM)!.value, -expected, 1e-5, '−300 K');
  });

  it('is (n_l − n_u)/(n_l + n_u) for two levels and propagates uncertainties', () => {
    const p = spinPolarizationFromPopulations([0.7, 0.3], [0.02, 0.01])!;
    close(p.value, 0.4, 1e-14, 'P');
    // Same sensitivities as the two-level form: 2n_u/S², 2n_l/S² (GUM §5.1.2).
    close(p.uncertainty, Math.hypot(2 * 0.3 * 0.02, 2 * 0.7 * 0.01), 1e-12, 'u(P)');
    assert.equal(spinPolarizationFromPopulations([0.7, 0.3])!.uncertainty, null);
    // Three levels, checked against numerical differentiation.
    const pops = [0.5, 0.3, 0.2];
    const u = [0.01, 0.02, 0.005];
    const h = 1e-7;
    const parts = pops.map((_, k) => {
      const up = pops.map((v, i) => (i === k ? v + h : v));
      const dn = pops.map((v, i) => (i === k ? v - h : v));
      return (
        ((spinPolarizationFromPopulations(up)!.value - spinPolarizationFromPopulations(dn)!.value) / (2 * h)) * u[k]!
      );
    });
    close(spinPolarizationFromPopulations(pops, u)!.uncertainty, Math.hypot(...parts), 1e-7, 'u(P), spin 1');
  });

  it('returns null for fewer than two levels or invalid populations', () => {
    for (const pops of [[], [1], [0, 0], [1, -1], [1, NaN], [Infinity, 1]]) {
      assert.equal(spinPolarizationFromPopulations(pops), null, `populations ${pops.join(', ')}`);
    }
    assert.equal(spinPolarizationFromPopulations([0, 0, 5])!.value, -1);
  });
});

describe('inverse temperature from spin polarization', () => {
  it('gives the 13C spin temperature of P = 0.30 at 9.4 T for spin 1/2', () => {
    // domain.md §4 (D from the IUPAC 2001 γ and exact h, k): hν/k = 4.830 8666 mK, P = 0.30 → T_s = 7.803 8136 mK.
    close(1 / betaFromSpinPolarization(0.5, 0.3, 4.8308666e-3)!.value, 7.8038136e-3, 1e-7, 'T_s');
    close(1 / betaFromSpinPolarization(0.5, -0.3, 4.8308666e-3)!.value, -7.8038136e-3, 1e-7, 'negative T_s');
  });

  it('inverts the Brillouin function from the linear regime to near saturation', () => {
    for (const spin of [0.5, 1, 1.5, 2.5, 4.5, 10]) {
      for (const y of [1e-9, 1e-4, 0.02, 0.7, 2, 5]) {
        for (const sign of [1, -1]) {
          const p = spinPolarization(spin, sign * y)!;
          close(
            betaFromSpinPolarization(spin, p, 0.25)!.value,
            (sign * y) / 0.25,
            1e-9,
            `I = ${spin}, y = ${sign * y}`,
          );
        }
      }
    }
    // Near saturation the answer is only as good as the distance 1 − P allows.
    close(betaFromSpinPolarization(1.5, spinPolarization(1.5, 12)!, 1)!.value, 12, 1e-6, 'I = 3/2, y = 12');
    assert.ok(Number.isFinite(betaFromSpinPolarization(2.5, 1 - 2 ** -52, 1)!.value), 'P one ulp below 1');
  });

  it('has u(β) = u(P)/|dP/dβ|, checked against a numerical derivative', () => {
    for (const [spin, beta] of [
      [1, 0.4],
      [2.5, -1.3],
      [0.5, 2],
    ] as const) {
      const d = 0.5;
      const p = spinPolarization(spin, beta * d)!;
      const h = 1e-6;
      const slope = (spinPolarization(spin, (beta + h) * d)! - spinPolarization(spin, (beta - h) * d)!) / (2 * h);
      close(betaFromSpinPolarization(spin, p, d, 0.003)!.uncertainty, 0.003 / Math.abs(slope), 1e-7, `I = ${spin}`);
    }
    assert.equal(betaFromSpinPolarization(1, 0.2, 1)!.uncertainty, null);
    assert.equal(betaFromSpinPolarization(1, 0.2, 1, 0)!.uncertainty, 0);
  });

  it('returns exactly zero at P = 0 and null at |P| ≥ 1 or invalid inputs', () => {
    assert.ok(Object.is(betaFromSpinPolarization(1.5, 0, 1)!.value, 0));
    assert.ok(Object.is(betaFromSpinPolarization(1.5, -0, 1)!.value, 0));
    for (const [i, p, d] of [
      [1, 1, 1],
      [1, -1, 1],
      [1, 1.5, 1],
      [1, NaN, 1],
      [1, 0.5, 0],
      [1, 0.5, -2],
      [1, 0.5, NaN],
      [0.3, 0.5, 1],
      [-1, 0.5, 1],
      [1, Infinity, 1],
    ] as const) {
      assert.equal(betaFromSpinPolarization(i, p, d), null, `I = ${i}, P = ${p}, ΔE = ${d}`);
    }
  });
});

describe('thermal polarization of spins 9/2 and 7/2 from the isotope table', () => {
  // The direct sum over the 2I + 1 Zeeman levels is boltzmannSum above (y = ΔE/T), not the Brillouin closed form.
  const directSum = (spin: number, spacingK: number, temperatureK: number): number =>
    boltzmannSum(spin, spacingK / temperatureK);

  // Isotopes and fields: 93Nb and 209Bi (I = 9/2), 133Cs and 59Co (I = 7/2), γ from Harris et al. 2001.
  const cases: ReadonlyArray<readonly [string, number, number]> = [
    ['93Nb', 9.4, 298.15],
    ['93Nb', 14.1, 1.2],
    ['209Bi', 9.4, 0.01],
    ['73Ge', 7.05, 4.2],
    ['133Cs', 9.4, 298.15],
    ['59Co', 20, 0.005],
  ];
  for (const [symbol, field, t] of cases) {
    it(`matches the direct sum over the Zeeman levels for ${symbol} at ${field} T and ${t} K`, () => {
      const found = lookupSpecies(symbol);
      assert.ok('species' in found);
      const s = found.species;
      assert.ok(s.spin === 4.5 || s.spin === 3.5, `${symbol} spin`);
      const spacing = zeemanSpacingKelvin(s, field);
      const expected = directSum(s.spin, spacing, t);
      const got = thermalSpinPolarization(s.spin, spacing, t);
      assert.ok(got !== null);
      const rel = Math.abs(got - expected) / expected;
      assert.ok(rel < 1e-11, `${symbol}: Brillouin ${got}, direct sum ${expected}, relative Δ ${rel.toExponential(2)}`);
    });
  }
});

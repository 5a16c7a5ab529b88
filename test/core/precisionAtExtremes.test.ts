/**
 * Results at the ends of the physical range, where a formula written as a
 * difference of nearly equal numbers loses its digits: a gap far below kT
 * (T → ∞), a spin system all but fully polarized (T → 0), and populations
 * exactly equal per degeneracy (β = 0). Each expected value comes from the
 * published formula evaluated here, not from the code under test; the
 * constants are the exact SI values (h/k = 4.799 243 073 366 221 × 10⁻¹¹ K/Hz,
 * CODATA "hertz-kelvin relationship", exact since the 2019 SI).
 */
import { strict as assert } from 'node:assert';
import { block, close } from './helpers';

/** h/k in K per Hz: the 2019 SI fixes h = 6.626 070 15 × 10⁻³⁴ J s and k = 1.380 649 × 10⁻²³ J/K exactly. */
const H_OVER_K = 6.62607015e-34 / 1.380649e-23;

describe('precision at extreme temperatures and populations', () => {
  it('gives the thermal polarization of a transition far below kT as tanh(ΔE/2kT) to full precision', () => {
    // Per degeneracy, P_th = tanh(hν/2kT) (docs/format.md, Conventions; the Boltzmann ratio
    // n_u g_l/(n_l g_u) = e^(−hν/kT)). For ν = 1 kHz at 10⁶ K, x = hν/2kT = 2.4e-14 and tanh x = x to 1e-28.
    const expected = Math.tanh((H_OVER_K * 1e3) / (2 * 1e6));
    for (const g of ['[1, 1]', '[1, 3]', '[12, 4]']) {
      const r = block(`gap: 1 kHz\ng: ${g}\nratio: 0.5\nlattice: 1e6 K`).report.results!;
      close(r.thermalPolarization, expected, 1e-12, `P_th for g = ${g}`);
      close(r.enhancement, r.polarization!.value / expected, 1e-12, `ε for g = ${g}`);
    }
    // A 1 Hz gap at 10⁶ K: the thermal populations are equal in double precision, P_th is not 0.
    const tiny = block('gap: 1 Hz\nratio: 0.5\nlattice: 1e6 K').report.results!;
    close(tiny.thermalPolarization, (H_OVER_K * 1) / (2 * 1e6), 1e-12, 'P_th of a 1 Hz gap');
  });

  it('propagates a lattice uncertainty into P_th of a transition far below kT', () => {
    // u(P_th) = |dP_th/dT|·u(T) = sech²(x)·x/T·u(T), x = hν/2kT (GUM JCGM 100:2008 §5.1.2, first order).
    const T = 1e6;
    const x = (H_OVER_K * 1e3) / (2 * T);
    const r = block('gap: 1 kHz\nratio: 0.5\nlattice: 1e6 ± 1e4 K').report.results!;
    close(r.uThermalPolarization, (x / T) * 1e4, 1e-5, 'u(P_th)');
  });

  it('finds β exactly 0 (T undefined, saturated) for equal populations per degeneracy over many levels', () => {
    // A Boltzmann distribution n_i/g_i ∝ e^(−βE_i) has equal n_i/g_i only at β = 0 (T = ±∞).
    const spin = block('system: 93Nb\nfield: 9.4 T\npopulations: [0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1, 0.1]')
      .report.results!;
    assert.equal(spin.beta?.value, 0);
    assert.equal(spin.temperature, null);
    assert.equal(spin.status, 'saturated');
    const levels = block(
      'levels:\n  - { energy: 0 K, g: 2, population: 0.2 }\n  - { energy: 1 K, g: 4, population: 0.4 }\n' +
        '  - { energy: 3 K, g: 1, population: 0.1 }\n  - { energy: 7 cm-1, g: 5, population: 0.5 }',
    ).report.results!;
    assert.equal(levels.beta?.value, 0);
    assert.equal(levels.temperature, null);
    assert.equal(levels.status, 'saturated');
  });

  it('keeps u(P) of a spin-1/2 pair whose upper level is all but empty', () => {
    // P = (n_l − n_u)/(n_l + n_u): ∂P/∂n_l = 2n_u/(n_l + n_u)², ∂P/∂n_u = −2n_l/(n_l + n_u)² (GUM §5.1.2).
    const [nl, ul, nu, uu] = [1, 0.01, 4.2e-18, 4.2e-20];
    const s = nl + nu;
    const expected = Math.hypot((2 * nu * ul) / (s * s), (2 * nl * uu) / (s * s));
    const up = block(`system: 1H\nfield: 9.4 T\npopulations: [${nl} ± ${ul}, ${nu} ± ${uu}]`).report.results!;
    close(up.polarization?.uncertainty, expected, 1e-12, 'u(P), T → 0⁺');
    const down = block(`system: 1H\nfield: 9.4 T\npopulations: [${nu} ± ${uu}, ${nl} ± ${ul}]`).report.results!;
    close(down.polarization?.uncertainty, expected, 1e-12, 'u(P), T → 0⁻');
  });

  it('keeps u(P) of a spin-3/2 ladder with everything in the lowest level but a trace', () => {
    // P = Σ (I − k) n_k / (I Σn), ∂P/∂n_k = [(I − k) − I·P]/(I Σn) (GUM §5.1.2), evaluated exactly here:
    // (I − k) − I·P = Σ_j (j − k) n_j / Σn.
    const n = [1, 3e-18, 1e-36, 1e-54];
    const u = n.map((v) => v * 0.01);
    const sum = n.reduce((a, b) => a + b, 0);
    const parts = n.map((_, k) => (n.reduce((acc, nj, j) => acc + (j - k) * nj, 0) / sum / (1.5 * sum)) * u[k]);
    const r = block(`system: 7Li\nfield: 9.4 T\npopulations: [${n.map((v, i) => `${v} ± ${u[i]}`).join(', ')}]`).report
      .results!;
    close(r.polarization?.uncertainty, Math.hypot(...parts), 1e-10, 'u(P) of ⁷Li');
  });

  it('counts the ground level in the entropy of an all but fully polarized pair', () => {
    // Gibbs entropy S/(Nk) = −Σ p_i ln p_i (Schroeder, An Introduction to Thermal Physics, 2000, ch. 6), for
    // n = [1, 4.248 354 255 291 589e-18]: −p₀ ln p₀ ≈ p₁ is 2.4 % of S. Value from mpmath at 40 digits.
    const r = block('system: 1H\nfield: 9.4 T\npopulations: [1, 4.248354255291589e-18]').report.results!;
    close(r.entropy, 1.7418252446695514826e-16, 1e-12, 'S/(Nk)');
  });
});

import { strict as assert } from 'node:assert';
import { block, close } from './helpers';

// End-to-end physics of whole blocks: note text in, results out, compared with
// published or independently derived values. Sources are named beside each value.
describe('analysis of whole blocks against published values', () => {
  it('reproduces the worked example of the notebook-format contract (13C, 7.05 T, P = 0.312 ± 0.010, lattice 1.4 K)', () => {
    // The example of the JSON report in docs/format.md ("The JSON report"), derived from IUPAC 2001 γ(13C)
    // (Harris et al., Pure Appl. Chem. 73, 1795 (2001)) and the exact h, k of the SI (BIPM SI Brochure, 9th ed., 2019):
    // beta 178.17 ± 6.12 K⁻¹, T 0.005613 ± 0.000193 K, P_th 0.001294, enhancement 241.1, entropy 0.6437,
    // with the IUPAC 2001 γ of 13C (10.7084 MHz/T).
    const r = block('id: cell-B run 7\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: 0.312 ± 0.010').report;
    assert.equal(r.status, 'normal');
    assert.equal(r.meta.id, 'cell-B run 7');
    close(r.results!.beta!.value, 178.17, 1e-4, 'β');
    close(r.results!.beta!.uncertainty!, 6.12, 1e-3, 'u(β)');
    close(r.results!.temperature!.value, 0.005613, 1e-4, 'T');
    close(r.results!.temperature!.uncertainty!, 0.000193, 3e-3, 'u(T)');
    close(r.results!.thermalPolarization!, 0.001294, 5e-4, 'P_th');
    close(r.results!.enhancement!, 241.1, 5e-4, 'ε');
    close(r.results!.entropy!, 0.6437, 1e-4, 'S/Nk');
  });

  it('gives the thermal polarization of 1H at 9.4 T and 298.15 K', () => {
    // Derived from the IUPAC 2001 γ(1H) = 26.7522128e7 rad s⁻¹ T⁻¹
    // (Harris et al., Pure Appl. Chem. 73, 1795 (2001)) and exact h, k: P = tanh(hν/2kT) = 3.2211847e-5.
    // The literature's round "about 3 × 10⁻⁵" is consistent (statement from memory).
    const r = block('system: 1H\nfield: 9.4 T\nlattice: 298.15 K\npolarization: 0.01').report;
    close(r.results!.thermalPolarization!, 3.2211847e-5, 1e-7, 'P_th(1H)');
  });

  it('gives the thermal polarization of the free electron at 3.35 T and 1.2 K (dissolution-DNP conditions)', () => {
    // γ_e/2π = 28 024.95 MHz/T (CODATA 2018, Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021); 2022 differs in the
    // 8th digit) and the exact h, k of the SI; derived:
    // ν = 93.88 GHz, P = tanh(hν/2kT) = 0.9542581. The literature's "above 95 %" is from memory.
    const r = block('system: electron\nfield: 3.35 T\nlattice: 1.2 K\npolarization: 0.5').report;
    close(r.results!.thermalPolarization!, 0.9542581, 2e-7, 'P_th(e)');
  });

  it('gives the 13C spin temperature and enhancement for P = ±0.30 at 9.4 T', () => {
    // Derived from IUPAC 2001 γ(13C) (Harris et al. 2001) and the exact h, k of the SI: hν/k = 4.8308666e-3 K,
    // T_s = hν/(2k artanh P) = 7.8038136 mK; enhancement over 298.15 K = 37 030.62.
    const r = block('system: 13C\nfield: 9.4 T\nlattice: 298.15 K\npolarization: 0.30').report;
    close(r.results!.temperature!.value, 7.8038136e-3, 1e-7, 'T_s');
    close(r.results!.enhancement!, 37030.62, 1e-6, 'ε');
    const inv = block('system: 13C\nfield: 9.4 T\npolarization: -0.30').report;
    assert.equal(inv.status, 'inverted');
    close(inv.results!.temperature!.value, -7.8038136e-3, 1e-7, 'T_s (inverted)');
  });

  it('gives the H I 21-cm spin temperature from the hyperfine populations with g = 3 : 1', () => {
    // ν₁₀ = 1 420 405 751.768 Hz (Hellwig et al., IEEE Trans. Instrum. Meas. IM-19, 200 (1970)),
    // T* = hν/k = 0.068168725 K; n₁/n₀ = 3 exp(−T*/T_s) (Wilson & Hüttemeister, Tools of Radio
    // Astronomy — Problems and Solutions, Springer 2000). Derived from these: n₁/n₀ = 2.99 → T_s =
    // 20.416514 K; 2.925882788 → 2.725 K (the CMB temperature, chosen as a check point).
    for (const [ratio, ts] of [
      [2.99, 20.416514],
      [2.925882788, 2.725],
      [2.997955635, 100],
    ] as const) {
      const r = block(`gap: 1420.405751768 MHz\ng: [1, 3]\nratio: ${ratio}`).report;
      close(r.results!.temperature!.value, ts, 2e-7, `T_s for n1/n0 = ${ratio}`);
    }
    // T* itself: the level gap in kelvin, as the block reads it.
    const r = block('gap: 1420.405751768 MHz\ng: [1, 3]\npopulations: [1, 3]').report;
    close(r.input!.levels[1].energy, 0.068168725, 1e-8, 'T*');
    assert.equal(r.status, 'saturated');
  });

  it('propagates the uncertainty of a ratio to β and T to first order (GUM §5.1.2)', () => {
    // Derived by the law of propagation (JCGM 100:2008 §5.1.2, eq. 10): ΔE/k = 10 K, r = 0.50 ± 0.01 →
    // T = 14.426950 K, u = |T|·u(r)/(r·|ln r|) = 0.416274 K;
    // β = 0.069314718 K⁻¹, u(β) = 0.002 K⁻¹; r = 2.00 ± 0.04 → T = −14.43 K.
    const r = block('gap: 10 K\nratio: 0.50 ± 0.01').report;
    close(r.results!.temperature!.value, 14.42695, 1e-6, 'T');
    close(r.results!.temperature!.uncertainty!, 0.416274, 1e-5, 'u(T)');
    close(r.results!.beta!.value, 0.069314718, 1e-8, 'β');
    close(r.results!.beta!.uncertainty!, 0.002, 1e-9, 'u(β)');
    const inv = block('gap: 10 K\nratio: 2.00\nuncertainty: 0.04').report;
    close(inv.results!.temperature!.value, -14.42695, 1e-6, 'T inverted');
    close(inv.results!.temperature!.uncertainty!, 0.416274, 1e-5, 'u(T) inverted');
  });

  it('gives a negative excitation temperature for an inverted 1064 nm transition', () => {
    // Derived from the exact h, c, k of the SI (SI Brochure 2019): hc/(λk) = 13 522.339 K at 1064 nm; with
    // T_ex = −(ΔE/k)/ln[(N₂/g₂)/(N₁/g₁)] (A. E. Siegman, Lasers, 1986; from memory), N₂/N₁ = 2, g₂ = g₁ → −19 508.61 K.
    // The check value takes λ as the vacuum wavelength in E = hc/λ, so the block says so.
    const r = block('gap: 1064 nm\nwavelengths: vacuum\npopulations: [1.0e16 cm-3, 2.0e16 cm-3]').report;
    assert.equal(r.status, 'inverted');
    close(r.results!.temperature!.value, -19508.61, 1e-6, 'T_ex');
  });

  it('recovers 10 000 K from H I Balmer upper-level populations generated at that temperature', () => {
    // Upper levels n = 3…6 of H I with g and E from the NIST Atomic Spectra Database (Kramida, Ralchenko,
    // Reader & NIST ASD Team, NIST Atomic Spectra Database; export retrieved 2026-06-15):
    // E = 97 492.304, 102 823.904, 105 291.657, 106 632.1681 cm⁻¹; g = 18, 32, 50, 72.
    const E = [97492.304, 102823.904, 105291.657, 106632.1681];
    const g = [18, 32, 50, 72];
    const c2 = 1.438776877503934; // K per cm⁻¹ (second radiation constant; exact since the 2019 SI)
    const items = E.map(
      (e, i) => `  - { energy: ${e} cm-1, g: ${g[i]}, population: ${g[i] * Math.exp((-(e - E[0]) * c2) / 10000)} }`,
    );
    const r = block(`levels:\n${items.join('\n')}`).report;
    assert.equal(r.status, 'normal');
    close(r.results!.temperature!.value, 10000, 1e-9, 'T_exc');
    assert.equal(r.results!.fit!.consistent, true);
  });

  it('calls a three-level set that fits no single temperature non-thermal, and lists its inverted pair', () => {
    // Populations chosen so the middle level holds more per degeneracy than the top but less than
    // the ground (a χ² far above the 1 % critical value with the stated uncertainties).
    const body =
      'levels:\n  - { energy: 0 K, population: 0.50, uncertainty: 0.01 }\n  - { energy: 10 K, population: 0.10, uncertainty: 0.01 }\n  - { energy: 20 K, population: 0.40, uncertainty: 0.01 }';
    const r = block(body).report;
    assert.equal(r.status, 'non-thermal');
    assert.equal(r.results!.fit!.weighted, true);
    assert.ok(r.results!.fit!.chi2 > r.results!.fit!.critical!);
    assert.deepEqual(r.results!.invertedPairs, [{ lower: 1, upper: 2 }]);
  });

  it('reads a thermal three-level set as consistent and normal', () => {
    const pops = [0, 10, 20].map((e) => Math.exp(-e / 15));
    const body = `levels:\n${pops.map((p, i) => `  - { energy: ${i * 10} K, population: ${p}, uncertainty: ${p * 0.01} }`).join('\n')}`;
    const r = block(body).report;
    assert.equal(r.status, 'normal');
    close(r.results!.temperature!.value, 15, 1e-9, 'T');
  });

  it('calls β within two standard uncertainties of zero saturated', () => {
    // Status rule of the contract: saturated when |β| ≤ 2 u(β).
    assert.equal(block('gap: 1 K\nratio: 0.99 ± 0.01').report.status, 'saturated');
    assert.equal(block('gap: 1 K\nratio: 0.95 ± 0.01').report.status, 'normal');
    assert.equal(block('gap: 1 K\nratio: 1.05 ± 0.01').report.status, 'inverted');
    const exact = block('gap: 1 K\npopulations: [0.5, 0.5]').report;
    assert.equal(exact.status, 'saturated');
    assert.equal(exact.results!.temperature, null);
    assert.equal(exact.results!.beta!.value, 0);
  });

  it('reads Zeeman populations of a spin 3/2 as a Boltzmann fit with the vector polarization', () => {
    // Brillouin function check (B_J of C. Kittel, Introduction to Solid State Physics; from memory):
    // populations ∝ exp(+m·y) for m = 3/2 … −3/2
    // (lowest level first for γ > 0) at y = βΔE = 0.4 give ⟨I_z⟩/I = B_{3/2}(1.5·0.4).
    const y = 0.4;
    const pops = [1.5, 0.5, -0.5, -1.5].map((m) => Math.exp(m * y));
    const r = block(`system: 7Li\nfrequency: 100 MHz\npopulations: [${pops.join(', ')}]`).report;
    const x = 1.5 * y;
    const b =
      (2 * 1.5 + 1) / (2 * 1.5) / Math.tanh(((2 * 1.5 + 1) * x) / (2 * 1.5)) - 1 / (2 * 1.5) / Math.tanh(x / (2 * 1.5));
    close(r.results!.polarization!.value, b, 1e-12, 'P');
    close(r.results!.beta!.value * r.input!.spin!.spacing, y, 1e-12, 'βΔE');
    assert.equal(r.status, 'normal');
  });
});

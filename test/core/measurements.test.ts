import { strict as assert } from 'node:assert';
import { Analyzer, curveData } from '../../src/core';
import { fitDecay } from '../../src/core/physics/relaxation';
import { block, close, problem } from './helpers';

const C2 = 1.438776877503934; // K per cm⁻¹: second radiation constant hc/k (exact since the 2019 SI; CODATA 2022)

// H I Balmer lines from the NIST Atomic Spectra Database (A. Kramida, Yu. Ralchenko, J. Reader and
// NIST ASD Team; lines export retrieved 2026-06-15, ASD accuracy AAA; vacuum Ritz wavelengths):
// λ/nm, upper-level energy E_k/cm⁻¹, g_k, A_ki/s⁻¹.
const BALMER = [
  { name: 'Hα', nm: 656.4632, E: 97492.304, g: 18, A: 4.4101e7 },
  { name: 'Hβ', nm: 486.2691, E: 102823.904, g: 32, A: 8.4193e6 },
  { name: 'Hγ', nm: 434.1691, E: 105291.657, g: 50, A: 2.5304e6 },
  { name: 'Hδ', nm: 410.28991, E: 106632.1681, g: 72, A: 9.732e5 },
];
// Ar I 4p → 4s lines, same database and retrieval (transition-probability reference T5223).
const ARGON = [
  { nm: 811.7542, E: 105462.7596, g: 7, A: 3.3e7 },
  { nm: 763.7208, E: 106237.5518, g: 5, A: 2.45e7 },
  { nm: 810.5921, E: 106087.2598, g: 3, A: 2.5e7 },
  { nm: 801.699, E: 105617.27, g: 5, A: 9.3e6 },
  { nm: 795.0362, E: 107131.7086, g: 3, A: 1.86e7 },
  { nm: 751.6721, E: 107054.272, g: 1, A: 4.0e7 },
  { nm: 738.6014, E: 107289.7001, g: 5, A: 8.5e6 },
  { nm: 696.7352, E: 107496.4166, g: 3, A: 6.4e6 },
  { nm: 750.5935, E: 108722.6194, g: 1, A: 4.5e7 },
];

function linesBlock(
  lines: { nm: number; E: number; g: number; A: number }[],
  intensities: number[],
  extra = '',
): string {
  const items = lines.map(
    (l, i) =>
      `  - { wavelength: ${l.nm} nm, upper: ${l.E} cm-1, g: ${l.g}, A: ${l.A}, intensity: ${intensities[i]}${extra} }`,
  );
  // The ASD wavelengths above are vacuum wavelengths: say so, or the IAU convention would read them as air.
  return `wavelengths: vacuum\nlines:\n${items.join('\n')}`;
}

describe('emission lines: the Boltzmann plot', () => {
  it('recovers 10 000 K and 5 000 K from the published relative Balmer intensities', () => {
    // Relative intensities (energy units, Hα = 1) derived from the NIST ASD data above (Kramida et al.) with the
    // Boltzmann-plot relation (J. A. Aguilera, C. Aragón, Spectrochim. Acta B 63, 893 (2008)):
    // I ∝ g A/λ · exp(−E_k/kT).
    for (const [T, rel] of [
      [10000, [1, 0.21276108, 0.078459387, 0.03791632]],
      [5000, [1, 0.098797427, 0.025544659, 0.010179329]],
    ] as const) {
      const r = block(linesBlock(BALMER, [...rel])).report;
      assert.equal(r.status, 'normal', r.problems.map((p) => p.message).join('; '));
      close(r.results!.temperature!.value, T, 2e-6, `T_exc at ${T} K`);
    }
  });

  it('recovers 10 000 K from nine Ar I lines (NIST ASD data, intensities derived at 10 000 K)', () => {
    // Intensities derived from the ASD rows of ARGON by I ∝ g A/λ · exp(−E_k/kT) at T = 10 000 K.
    const rel = [1, 0.50419777, 0.2972004, 0.19934234, 0.19398811, 0.14872981, 0.15546566, 0.072272388, 0.13180352];
    const r = block(linesBlock(ARGON, rel)).report;
    close(r.results!.temperature!.value, 10000, 1e-5, 'T_exc (Ar I)');
  });

  it('gives the same temperature from photon counts without wavelengths, and propagates intensity uncertainties', () => {
    const T = 8000;
    const counts = BALMER.map((l) => ((l.g * l.A) / l.nm) * Math.exp((-l.E * C2) / T) * l.nm); // photons ∝ energy × λ
    const items = BALMER.map(
      (l, i) => `  - { upper: ${l.E} cm-1, g: ${l.g}, A: ${l.A}, intensity: ${counts[i]} ± ${counts[i] * 0.02} }`,
    );
    const r = block(`detector: photon\nlines:\n${items.join('\n')}`).report;
    close(r.results!.temperature!.value, T, 1e-9, 'T from photon counts');
    assert.ok(r.results!.beta!.uncertainty! > 0);
    assert.equal(r.results!.fit!.weighted, true);
  });

  it('flags a line more than 3 σ off the fit with a warning on that line, and calls the set non-thermal', () => {
    const T = 10000;
    const I = BALMER.map((l) => ((l.g * l.A) / l.nm) * Math.exp((-l.E * C2) / T));
    I[2] *= 1.5; // Hγ 50 % too bright, with 1 % uncertainties
    const body = BALMER.map(
      (l, i) =>
        `  - { wavelength: ${l.nm} nm, upper: ${l.E} cm-1, g: ${l.g}, A: ${l.A}, intensity: ${I[i]} ± ${I[i] * 0.01} }`,
    );
    const { report, text } = block(`lines:\n${body.join('\n')}`);
    const flagged = report.problems.filter((p) => p.code === 'line-outlier');
    assert.ok(flagged.length >= 1);
    assert.ok(
      flagged.some((p) => text.slice(p.span.start, p.span.end).includes('434.1691')),
      'the Hγ item is flagged',
    );
    assert.equal(report.status, 'non-thermal');
  });
});

describe('signal against a thermal reference', () => {
  const ref = (hpFlip: string) =>
    `system: 13C\nfield: 9.4 T\nlattice: 298.15 K\nsignal:\n  hyperpolarized: 50\n  thermal: 1\n  scans: { hyperpolarized: 1, thermal: 16 }\n  flip: { hyperpolarized: ${hpFlip}, thermal: 90 deg }`;

  it('reproduces the worked example: ratio 50, 16 reference scans, equal gains → ε = 800', () => {
    // The reference-signal formula is common practice, no source; values derived with IUPAC 2001 γ(13C)
    // (Harris et al., Pure Appl. Chem. 73, 1795 (2001)) and the exact h, k of the SI:
    // P_th(13C, 9.4 T, 298.15 K) = 8.101403e-6; ε = 50 × 16 = 800; P_hp = 6.4811224e-3.
    const r = block(ref('90 deg')).report;
    close(r.results!.polarization!.value, 6.4811224e-3, 1e-6, 'P_hp');
    close(r.results!.enhancement!, 800, 1e-9, 'ε');
    assert.equal(r.results!.signal!.factor, 16);
  });

  it('corrects for a 10 deg hyperpolarized readout: factor 50 × 16 / sin 10° = 4607.01639', () => {
    // Derived: P_hp = P_th × 4607.01639 = 8.101403e-6 × 4607.01639 = 0.037323296.
    const r = block(ref('10 deg')).report;
    close(r.results!.polarization!.value, 0.037323296, 1e-6, 'P_hp at 10°');
    close(r.results!.enhancement!, 4607.01639, 1e-8, 'ε at 10°');
  });

  it('propagates the noise of both spectra to P and then to β', () => {
    const r = block(`${ref('90 deg')}\n  noise: { hyperpolarized: 1, thermal: 0.02 }`).report;
    // Relative uncertainties in quadrature (first order): √((1/50)² + (0.02/1)²) = 0.028284.
    close(
      r.results!.polarization!.uncertainty! / r.results!.polarization!.value,
      Math.hypot(1 / 50, 0.02),
      1e-9,
      'u(P)/P',
    );
    assert.ok(r.results!.beta!.uncertainty! > 0);
  });

  it('rejects a zero thermal signal on that value, and needs the reference temperature', () => {
    assert.equal(
      problem(
        'system: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal: { hyperpolarized: 5, thermal: 0 }',
        'signal-thermal-zero',
      ).at,
      '0',
    );
    assert.equal(
      problem('system: 13C\nfield: 9.4 T\nsignal: { hyperpolarized: 5, thermal: 1 }', 'signal-lattice-missing').at,
      'signal',
    );
  });
});

describe('time series', () => {
  const T1 = 30; // s, the known relaxation time the data are made with
  const times = [0, 4, 8, 12, 16, 20, 24, 28, 32, 36];

  it('recovers T₁ from 5 deg readouts with the cos^(n−1) θ correction (von Witte, Ernst, Kozerke, Magn. Reson. 4, 175 (2023))', () => {
    const theta = (5 * Math.PI) / 180;
    const s = times.map((t, i) => 2.0 * Math.exp(-t / T1) * Math.cos(theta) ** i);
    const body = `series:\n  model: decay\n  time: [${times.map((t) => `${t} s`).join(', ')}]\n  signal: [${s.join(', ')}]\n  flip: 5 deg`;
    const r = block(body).report;
    close(r.results!.series!.timeConstant.value, T1, 1e-8, 'T₁');
    // The readout factor of the 10th point: cos⁹ 5° = 0.966268972 (arithmetic; the correction is von Witte et al.'s).
    const fit = fitDecay(times, s, theta, null)!;
    close(fit.fitted[9] / (2.0 * Math.exp(-times[9] / T1)), 0.966268972, 1e-9, 'cos^(n−1) θ at n = 10');
    // Without the correction the readout losses pass for faster relaxation: an apparent rate
    // 1/T₁ + ln(1/cos θ)/Δt with Δt = 4 s (the same model, solved by hand).
    const uncorrected = block(body.replace('\n  flip: 5 deg', '')).report.results!.series!.timeConstant.value;
    close(uncorrected, 1 / (1 / T1 - Math.log(Math.cos(theta)) / 4), 1e-8, 'apparent T₁ without the correction');
  });

  it('reads a noisy series to the least-squares minimum found independently (variable projection, 60 digits)', () => {
    // Deterministic "noise" so the test is repeatable; the minimum is the "decay, unweighted" case of
    // physics/reference/series_minima.json, computed by physics/reference/series_minima.py.
    const s = times.map((t, i) => 1.5 * Math.exp(-t / T1) * (1 + 0.02 * Math.sin(3.7 * i + 1)));
    const body = `series:\n  model: decay\n  time: [${times.map((t) => `${t} s`).join(', ')}]\n  signal: [${s.join(', ')}]`;
    const fit = block(body).report.results!.series!;
    close(fit.timeConstant.value, 29.760260688183855, 1e-6, 'T₁');
    close(fit.amplitude.value, 1.50711555722134, 1e-6, 'S₀');
    assert.ok(fit.timeConstant.uncertainty! > 0 && fit.timeConstant.uncertainty! < 0.1 * T1);
  });

  it('fits a build-up S∞(1 − e^(−t/τ)) + S₀', () => {
    const t = [0, 30, 60, 120, 240, 480, 960, 1920];
    const s = t.map((v) => 0.9 * (1 - Math.exp(-v / 400)) + 0.02);
    const r = block(
      `series:\n  model: buildup\n  time: [${t.map((v) => `${v} s`).join(', ')}]\n  signal: [${s.join(', ')}]`,
    ).report;
    close(r.results!.series!.timeConstant.value, 400, 1e-6, 'τ');
    close(r.results!.series!.amplitude.value, 0.9, 1e-6, 'S∞');
  });

  it('takes the hyperpolarized signal from a fitted decay when the reference gives only the thermal spectrum', () => {
    const s = times.map((t) => 50 * Math.exp(-t / T1));
    const body = `system: 13C\nfield: 9.4 T\nlattice: 298.15 K\nsignal: { thermal: 1, scans: { thermal: 16 } }\nseries:\n  model: decay\n  time: [${times.map((t) => `${t} s`).join(', ')}]\n  signal: [${s.join(', ')}]`;
    const r = block(body).report;
    close(r.results!.polarization!.value, 6.4811224e-3, 1e-6, 'P_hp from S₀');
    assert.equal(r.results!.signal!.fromSeries, true);
  });
});

describe('uncertainty of the enhancement', () => {
  it('carries u(P) and u(lattice) into ε', () => {
    // 13C at 9.4 T and 298 K: hν/kT ≈ 1.6e-5, deep in the high-temperature limit where P_th = tanh(hν/2kT)
    // ∝ 1/T (A. Abragam, The Principles of Nuclear Magnetism, 1961, ch. I — from memory) to 1e-10, so
    // dP_th/dT = −P_th/T and, by JCGM 100:2008 §5.1.2, u(ε)² = (u(P)/P_th)² + (ε u(T)/T)².
    const only = block('system: 13C\nfield: 9.4 T\nlattice: 298 ± 3 K\npolarization: 0.1').report.results!;
    close(only.enhancementUncertainty, only.enhancement! * (3 / 298), 1e-6, 'u(ε) from the lattice');
    const both = block('system: 13C\nfield: 9.4 T\nlattice: 298 ± 3 K\npolarization: 0.1 ± 0.005').report.results!;
    const expected = Math.hypot(0.005 / both.thermalPolarization!, both.enhancement! * (3 / 298));
    close(both.enhancementUncertainty, expected, 1e-6, 'u(ε) from both');
    const none = block('system: 13C\nfield: 9.4 T\nlattice: 298 K\npolarization: 0.1').report.results!;
    assert.equal(none.enhancementUncertainty, null);
  });

  it('gives a thermal reference ε = 1 with u(ε) = 0 whatever u(lattice): P and P_th are the same quantity', () => {
    // ε = P_th(T)/P_th(T) ≡ 1 for every T, so its sensitivity to T is zero (JCGM 100:2008 §5.1.3); treating the
    // two as independent would give √2·u(P_th)/P_th (0.47 % here).
    const ref = block('system: 13C\nfield: 3 T\nlattice: 298 ± 1 K\nsignal:\n  thermal: 1.08e3 ± 10').report.results!;
    close(ref.enhancement, 1, 1e-12, 'ε of a reference');
    assert.equal(ref.enhancementUncertainty, 0);
    assert.ok(ref.polarization!.uncertainty! > 0, 'u(P) of the reference still carries u(lattice)');
  });
});

describe('gain of an optical transition', () => {
  it('gives g₀, single-pass gain and the threshold for Nd:YAG-like numbers', () => {
    // σ = 2.8e-19 cm² (Nd:YAG 1064 nm effective cross-section, W. Koechner, Solid-State Laser Engineering,
    // 6th ed. — value from memory); ΔN = 1e17 cm⁻³ → g₀ = 0.028 cm⁻¹; L = 10 cm, R = 1 and 0.9, α = 0 →
    // g_th = α + ln(1/(R₁R₂))/(2L) = 5.2680258e-3 cm⁻¹ (derived; threshold relation from B. E. A. Saleh,
    // M. C. Teich, Fundamentals of Photonics, 2nd ed., Wiley 2007).
    const r = block(
      'gap: 1064 nm\npopulations: [0 cm-3, 1e17 cm-3]\ncross-section: 2.8e-19 cm2\nlength: 10 cm\nmirrors: [1, 0.9]',
    ).report;
    close(r.results!.gain!.coefficient, 0.028, 1e-12, 'g₀');
    close(r.results!.gain!.threshold!, 5.2680258e-3, 1e-7, 'g_th');
    close(r.results!.gain!.singlePass!, Math.exp(0.28), 1e-12, 'G');
    assert.equal(r.results!.gain!.aboveThreshold, true);
  });

  it('weights the lower level by g_u/g_l and reports a transition below threshold', () => {
    const r = block(
      'gap: 1064 nm\ng: [12, 4]\npopulations: [2.0e16 cm-3, 8.0e16 cm-3]\ncross-section: 2.8e-19 cm2\nlength: 10 cm\nmirrors: [0.5, 0.5]\nloss: 0.01 cm-1',
    ).report;
    close(r.results!.gain!.coefficient, 2.8e-19 * (8e16 - (4 / 12) * 2e16), 1e-12, 'g₀');
    assert.equal(r.results!.gain!.aboveThreshold, false);
  });

  it('propagates the densities’ uncertainties into g₀ and the single-pass gain', () => {
    // Linear in N, so first-order propagation (JCGM 100:2008 §5.1.2) is exact:
    // u(g₀) = σ √(u(N_u)² + (g_u/g_l)² u(N_l)²); u(G) = G L u(g₀) since G = exp(g₀ L).
    const r = block(
      'gap: 1064 nm\ng: [12, 4]\npopulations: [2.0e16 ± 0.1e16 cm-3, 8.0e16 ± 0.2e16 cm-3]\ncross-section: 2.8e-19 cm2\nlength: 10 cm',
    ).report;
    const g = r.results!.gain!;
    const u = 2.8e-19 * Math.hypot(0.2e16, (4 / 12) * 0.1e16);
    close(g.uCoefficient, u, 1e-9, 'u(g₀)');
    close(g.uSinglePass, g.singlePass! * 10 * u, 1e-9, 'u(G)');
  });

  it('needs densities, not relative populations', () => {
    assert.equal(
      problem('gap: 1064 nm\npopulations: [1, 2]\ncross-section: 2.8e-19 cm2', 'gain-needs-densities').at,
      'populations',
    );
  });
});

describe('bad measurement input', () => {
  const series = (time: string, signal: string, extra = '') =>
    `series:\n  model: decay\n  time: ${time}\n  signal: ${signal}${extra}`;

  it('points at each offending item and never throws', () => {
    assert.equal(problem(series('[0 s, 1 s, 2 s]', '[1, 0.9]'), 'series-length-mismatch').at, '[1, 0.9]');
    assert.equal(problem(series('[0 s, 2 s, 1 s]', '[1, 0.9, 0.8]'), 'series-times-order').at, '1 s');
    assert.equal(problem(series('[0 s]', '[1]'), 'series-too-short').severity, 'error');
    assert.equal(problem(series('[0 s, 1 s, 2 s]', '[1, -0.9, 0.8]'), 'series-sign-change').at, '-0.9');
    assert.equal(
      problem(series('[0 s, 1 s, 2 s]', '[1, 0.9, 0.8]', '\n  flip: 90 deg'), 'flip-too-large').at,
      '90 deg',
    );
    const mixed =
      'lines:\n  - { wavelength: 656 nm, upper: 12.09 eV, g: 18, A: 4.4e7, intensity: 1, species: H I }\n  - { wavelength: 811 nm, upper: 13.08 eV, g: 7, A: 3.3e7, intensity: 1, species: Ar I }';
    assert.equal(problem(mixed, 'lines-mixed-species').at, 'Ar I');
    const noA =
      'lines:\n  - { wavelength: 656 nm, upper: 12.09 eV, g: 18, intensity: 1 }\n  - { wavelength: 486 nm, upper: 12.75 eV, g: 32, A: 8.4e6, intensity: 0.2 }';
    assert.match(problem(noA, 'line-a-missing').at, /^\{ wavelength: 656 nm/);
  });

  it('keeps the rest of the note analysed when a measurement block is broken', () => {
    const text =
      '```levels\nseries:\n  model: decay\n  time: [0 s, 1 s]\n  signal: [1]\n```\n```levels\ngap: 1 K\nratio: 0.5\n```\n';
    assert.deepEqual(
      new Analyzer().analyzeText(text).blocks.map((b) => b.status),
      ['invalid', 'normal'],
    );
  });

  it('warns when a series only just fixes its parameters', () => {
    assert.equal(problem(series('[0 s, 10 s]', '[1, 0.5]'), 'series-too-short').severity, 'warning');
  });
});

describe('the measurement plot of the curve view', () => {
  it('draws the Balmer Boltzmann plot with slope −1/(kT) per eV: −1.1604518 eV⁻¹ at 10 000 K', () => {
    // 1 eV = 11 604.518 K (e/k, exact since the 2019 SI; CODATA 2022), so −β in eV⁻¹ is −11604.518/T.
    const rel = [1, 0.21276108, 0.078459387, 0.03791632];
    const { report } = block(linesBlock(BALMER, rel));
    const p = curveData(report, { uri: 'file:///x.md', version: 1 });
    assert.equal(p.kind, 'problem');
    const plot = p.plot!;
    assert.equal(plot.kind, 'boltzmann');
    assert.equal(plot.points.length, 4);
    const slope = (plot.fit.y[1] - plot.fit.y[0]) / (plot.fit.x[1] - plot.fit.x[0]);
    close(slope, -1.1604518, 1e-6, 'slope per eV');
    // The published intensities carry 8 digits, so the points sit on the line to about 1e-8.
    for (const r of plot.residuals) assert.ok(Math.abs(r.y) < 1e-6, `residual ${r.y}`);
  });

  it('gives a series its data, fit and residuals, which add back up to the data', () => {
    const { report } = block(
      'series:\n  model: buildup\n  time: [0 s, 10 s, 20 s, 40 s, 80 s, 160 s]\n  signal: [0.01, 0.2, 0.36, 0.58, 0.8, 0.93]',
    );
    const p = curveData(report, { uri: 'file:///x.md', version: 1 });
    const plot = p.plot!;
    assert.equal(plot.kind, 'series');
    const fitted = report.results!.series!.fitted;
    plot.points.forEach((q, i) => close(fitted[i] + plot.residuals[i].y, q.y, 1e-12, `point ${i}`));
  });
});

/**
 * The emission and radio trades: their words, wavelengths in air and vacuum,
 * radio units and modes, the line temperature from T_B, τ and T_bg, column
 * densities, robust outlier flags and the unit fixes judged by magnitude.
 */
import { strict as assert } from 'node:assert';
import {
  airToVacuum,
  BOLTZMANN,
  linearRotorPartition,
  PLANCK,
  reportEntry,
  LineIndex,
  shortSummary,
  SPEED_OF_LIGHT,
  statusText,
  temperatureText,
  vacuumToAir,
} from '../../src/core';
import { linesCsv } from '../../src/core/present/tradeSummary';
import { applyFirstFix, block, close, problem } from './helpers';

const KELVIN_PER_EV = 11604.51812155008; // e/k (exact since the 2019 SI; CODATA 2022 "electron volt-kelvin relationship")
// hν₁₀/k of the 21-cm line: 0.068 168 725 K (derived from ν₁₀ = 1 420 405 751.768 Hz,
// Hellwig et al., IEEE Trans. Instrum. Meas. IM-19, 200 (1970), and the exact h/k).
const T_STAR = 0.068168725;

// Ar I 4p → 4s lines from the NIST Atomic Spectra Database (Kramida, Ralchenko, Reader & NIST ASD Team,
// export retrieved 2026-06-15): vacuum wavelengths, with the air wavelengths of a spectrometer-calibration list
// that quotes NIST ASD.
const ARGON_AIR_VACUUM: [number, number][] = [
  [811.7542, 811.5311],
  [763.7208, 763.5106],
  [810.5921, 810.3693],
  [801.699, 801.4786],
  [795.0362, 794.8176],
  [751.6721, 751.4652],
  [738.6014, 738.398],
  [696.7352, 696.5431],
  [750.5935, 750.3869],
];

describe('air and vacuum wavelengths (IAU convention)', () => {
  it('turns the vacuum wavelengths of nine Ar I lines into the air wavelengths NIST ASD quotes, and back', () => {
    // Morton (2000) refractive index of standard air; the ASD lists agree to their last digit (10⁻⁴ nm).
    for (const [vac, air] of ARGON_AIR_VACUUM) {
      close(vacuumToAir(vac), air, 1.5e-4 / air, `air wavelength of ${vac} nm`);
      close(airToVacuum(air), vac, 1.5e-4 / vac, `vacuum wavelength of ${air} nm`);
      close(airToVacuum(vacuumToAir(vac)), vac, 1e-12, 'round trip');
    }
  });

  it('reads a gap above 200 nm as an air wavelength unless the block says vacuum, and says which it assumed', () => {
    const air = block('gap: 811.5311 nm\nratio: 0.5').report;
    const vac = block('gap: 811.7542 nm\nwavelengths: vacuum\nratio: 0.5').report;
    // Both name the same photon, so the same E = hc/λ_vac: T agrees to the 10⁻⁴ nm of the ASD lists.
    close(air.results!.temperature!.value, vac.results!.temperature!.value, 2e-7, 'T from air and vacuum');
    assert.deepEqual(air.results!.trade.medium, { kind: 'air', stated: false });
    assert.deepEqual(vac.results!.trade.medium, { kind: 'vacuum', stated: true });
    // Below 200 nm the convention is vacuum (Lyman α, 121.567 nm, from memory).
    assert.deepEqual(block('gap: 121.567 nm\nratio: 0.5').report.results!.trade.medium, {
      kind: 'vacuum',
      stated: false,
    });
    assert.equal(problem('gap: 500 nm\nwavelengths: glass\nratio: 0.5', 'wavelengths-unknown').severity, 'error');
  });

  it('reads Å and converts an air wavelength of a line before using it', () => {
    const nm = block('gap: 696.5431 nm\nratio: 0.5').report.results!.temperature!.value;
    const aa = block('gap: 6965.431 Å\nratio: 0.5').report.results!.temperature!.value;
    close(aa, nm, 1e-12, 'Å against nm');
  });
});

describe('radio units and the 21-cm pair', () => {
  it('takes the 21-cm gap as a wavelength in cm or mm: hc/(λk) = 0.068 168 725 K', () => {
    // λ = c/ν₁₀ = 21.106 114 054 cm (derived from ν₁₀ above and the exact c of the SI).
    for (const gap of ['21.106114054 cm', '211.06114054 mm', '1420.405751768 MHz']) {
      const r = block(`gap: ${gap}\ng: [1, 3]\nratio: 2.99`).report;
      // n₁/n₀ = 2.99 → T_s = T*/ln(3/2.99) = 20.416 514 K (the Boltzmann ratio with g₁/g₀ = 3; Rybicki & Lightman,
      // Radiative Processes in Astrophysics, 1979, §1.5).
      close(r.results!.temperature!.value, 20.416514, 1e-6, `T from gap ${gap}`);
      // A radio wavelength says the trade; a frequency alone does not (94 GHz is also an electron-spin gap), so a
      // pair given by frequency is a plain pair unless a radio key says otherwise.
      assert.equal(r.results!.trade.trade, gap.endsWith('MHz') ? 'levels' : 'radio');
      assert.equal(r.results!.trade.medium, null, 'a radio wavelength is c/ν, no air correction');
    }
  });

  it('speaks of the excitation temperature, shows no polarization or enhancement, and says "per degeneracy"', () => {
    const r = block('gap: 21.106114054 cm\ng: [1, 3]\nratio: 2.99\nlattice: 100 K').report.results!;
    assert.equal(r.polarization, null);
    assert.equal(r.thermalPolarization, null);
    assert.equal(r.enhancement, null);
    assert.equal(r.trade.temperatureName, 'excitation temperature');
    assert.match(shortSummary(r), /^T_ex = 20\.4 K$/);
    // With g = [1, 3] the upper level holds more population (2.99 : 1) yet less per degeneracy: normal.
    assert.equal(
      statusText('normal', r),
      'normal: positive excitation temperature, more population per degeneracy below',
    );
  });

  it('quotes a saturated radio line as a limit at 95 %: |T| ≥ 1/(|β| + 2u(β))', () => {
    // ratio 3.000 ± 0.0015: β = ln(3/3)/T* = 0, u(β) = u(r)/(r T*) = 0.0015/(3 × 0.068168725) = 0.0073347 K⁻¹
    // (first-order propagation, GUM JCGM 100:2008 §5.1.2); the bound 1/(2u) = 68.17 K, with the contract's rule
    // for saturated blocks (the k = 2 interval of β mapped through T = 1/β, JCGM 101:2008 §5.3).
    const { report, text } = block('gap: 21.106114054 cm\ng: [1, 3]\nratio: 3.000 ± 0.0015');
    const r = report.results!;
    assert.equal(r.status, 'saturated');
    close(r.trade.temperatureLimit, 1 / (2 * (0.0015 / (3 * T_STAR))), 1e-6, 'limit');
    assert.equal(temperatureText(r), 'T_ex > 68 K at 95 %');
    const entry = reportEntry('x.md', report, new LineIndex(text));
    close(entry.temperatureAbove, 68.17, 1e-3, 'JSON temperatureAbove');
    assert.equal(entry.polarization, null);
  });

  it('warns when an excitation temperature falls below the background (a ratio typed upside down)', () => {
    // 1/2.99 instead of 2.99: (n₀/g₀)/(n₁/g₁) = 3 × 2.99 → T = T*/ln(8.97) = 31 mK, far below the 2.725 K
    // cosmic background (D. J. Fixsen, ApJ 707, 916 (2009): 2.72548 K; from memory).
    const p = problem(
      'gap: 1420.405751768 MHz\ng: [1, 3]\nratio: 0.33445\nbackground: 2.725 K',
      'temperature-below-background',
    );
    assert.equal(p.severity, 'warning');
    assert.equal(p.at, '2.725 K');
    assert.match(p.message, /upside down/);
    const fine = block('gap: 1420.405751768 MHz\ng: [1, 3]\nratio: 2.99\nbackground: 2.725 K').report;
    assert.ok(!fine.problems.some((x) => x.code === 'temperature-below-background'));
  });
});

describe('the temperature of a line from T_B, τ and T_bg', () => {
  // The uniform-slab solution of radiative transfer with brightness temperatures on the Rayleigh–Jeans scale,
  // T_B = (J(T_ex) − J(T_bg))(1 − e^(−τ)), J(T) = (hν/k)/(e^(hν/kT) − 1) (G. B. Rybicki, A. P. Lightman,
  // "Radiative Processes in Astrophysics", Wiley 1979, ch. 1; T. L. Wilson, K. Rohlfs, S. Hüttemeister, "Tools of
  // Radio Astronomy", Springer; both from memory. J is the "Rayleigh-Jeans corrected brightness temperature" of
  // the Starlink SCUBA library, SCULIB_JNU, starlink.eao.hawaii.edu/docs/ssn72.htx/ssn72ss140.html). The test
  // writes T_B forward from T_ex and inverts it by bisection, a route of its own; h and k are the exact SI values.
  const H = 6.62607015e-34;
  const K = 1.380649e-23;
  const J = (t: number, t0: number): number => (t > 0 ? t0 / (Math.exp(t0 / t) - 1) : 0);
  const forward = (tex: number, tau: number, bg: number, t0: number): number =>
    (J(tex, t0) - J(bg, t0)) * (1 - Math.exp(-tau));
  const inverse = (tb: number, tau: number, bg: number, t0: number): number => {
    let lo = 1e-6;
    let hi = 1e7;
    for (let i = 0; i < 200; i++) {
      const mid = Math.sqrt(lo * hi);
      if (forward(mid, tau, bg, t0) < tb) lo = mid;
      else hi = mid;
    }
    return Math.sqrt(lo * hi);
  };
  const HI = 'gap: 1420.405751768 MHz\ng: [1, 3]';
  const CO = 'gap: 115.2712018 GHz\ng: [1, 3]'; // CO J = 1 → 0 (CDMS; from memory)
  const T0_CO = (H * 115.2712018e9) / K;

  it('inverts the slab solution and propagates u(T_B), u(τ) and u(T_bg) as numerical sensitivities do', () => {
    const r = block(`${HI}\nbrightness: 35 ± 1 K\noptical-depth: 0.8 ± 0.1\nbackground: 2.725 ± 0.001 K`).report;
    const t = r.results!.temperature!;
    const model = (tb: number, tau: number, bg: number): number => inverse(tb, tau, bg, T_STAR);
    close(t.value, model(35, 0.8, 2.725), 1e-10, 'T');
    // GUM §5.1.2 with sensitivity coefficients by central differences (an independent route to the same law).
    const h = 1e-5;
    const d = (f: (x: number) => number, x: number): number => (f(x + h) - f(x - h)) / (2 * h);
    const uT = Math.hypot(
      d((x) => model(x, 0.8, 2.725), 35) * 1,
      d((x) => model(35, x, 2.725), 0.8) * 0.1,
      d((x) => model(35, 0.8, x), 2.725) * 0.001,
    );
    close(t.uncertainty, uT, 1e-5, 'u(T)');
    assert.equal(r.results!.trade.fromBrightness, true);
    assert.equal(r.status, 'normal');
  });

  it('solves CO 1–0 exactly where the Rayleigh–Jeans shortcut is off by more than half a kelvin, and agrees with it on the 21-cm line', () => {
    for (const tex of [10, 30, 80]) {
      const tb = forward(tex, 1, 2.725, T0_CO);
      const got = block(`${CO}\nbrightness: ${tb} K\noptical-depth: 1\nbackground: 2.725 K`).report;
      close(got.results!.temperature!.value, tex, 1e-9, `CO at ${tex} K`);
      // The shortcut T_B/(1 − e^(−τ)) + T_bg, for contrast: 9.38 K for a line at 10 K.
      const shortcut = tb / (1 - Math.exp(-1)) + 2.725;
      assert.ok(Math.abs(shortcut - tex) > 0.5, `shortcut ${shortcut} at ${tex} K`);
    }
    for (const tex of [3, 20, 100, 8000]) {
      const tb = forward(tex, 0.5, 2.725, T_STAR);
      const got = block(`${HI}\nbrightness: ${tb} K\noptical-depth: 0.5\nbackground: 2.725 K`).report;
      close(got.results!.temperature!.value, tex, 1e-9, `21 cm at ${tex} K`);
      const shortcut = tb / (1 - Math.exp(-0.5)) + 2.725;
      assert.ok(Math.abs(shortcut - tex) < 2e-4, `shortcut ${shortcut} at ${tex} K`);
    }
  });

  it('reads an absorption line against the background, and refuses one deeper than the background allows', () => {
    // A cold cloud against the cosmic background: T_ex = 1.5 K below T_bg = 2.725 K gives T_B < 0.
    const tb = forward(1.5, 2, 2.725, T0_CO);
    assert.ok(tb < 0);
    const cold = block(`${CO}\nbrightness: ${tb} K\noptical-depth: 2\nbackground: 2.725 K`).report;
    close(cold.results!.temperature!.value, 1.5, 1e-9, 'T_ex');
    assert.equal(cold.status, 'normal');
    // At most −J(T_bg)(1 − e^(−τ)) = −0.7231 K here (J(2.725 K) = 5.5321 K/(e^2.0301 − 1) = 0.8363 K at 115 GHz,
    // by hand); −0.8 K is deeper.
    const floor = -J(2.725, T0_CO) * (1 - Math.exp(-2));
    close(floor, -0.7231, 1e-3, 'the deepest absorption');
    const p = problem(`${CO}\nbrightness: -0.8 K\noptical-depth: 2\nbackground: 2.725 K`, 'absorption-too-deep');
    assert.equal(p.severity, 'error');
    assert.equal(p.at, '-0.8 K');
    assert.match(p.message, /-0\.7231 K/);
    const deep = block(`${CO}\nbrightness: -0.8 K\noptical-depth: 2\nbackground: 2.725 K`).report;
    assert.equal(deep.status, 'invalid');
    assert.equal(deep.results?.temperature ?? null, null);
    // Without a background nothing can absorb.
    assert.match(
      problem(`${CO}\nbrightness: -0.1 K\noptical-depth: 2`, 'absorption-too-deep').message,
      /without a background a line is seen only in emission/,
    );
  });

  it('needs both keys and refuses them beside populations', () => {
    problem('gap: 1420.405751768 MHz\nbrightness: 35 K', 'line-temperature-incomplete');
    problem(
      'gap: 1420.405751768 MHz\nratio: 2.99\nbrightness: 35 K\noptical-depth: 1',
      'populations-and-line-temperature',
    );
    problem('gap: 1420.405751768 MHz\nbrightness: 35 K\noptical-depth: 0', 'optical-depth-invalid');
  });
});

// CO J → J−1 rotational lines, J = 1…4: frequencies (GHz), E_u/k (K), A (s⁻¹) as the CDMS/LAMDA catalogues list
// them (from memory); g_u = 2J + 1. B = 57.635968 GHz (from memory).
const CO = [
  { nu: 115.2712018, E: 5.53, g: 3, A: 7.203e-8 },
  { nu: 230.538, E: 16.6, g: 5, A: 6.91e-7 },
  { nu: 345.7959899, E: 33.19, g: 7, A: 2.497e-6 },
  { nu: 461.0407682, E: 55.32, g: 9, A: 6.126e-6 },
];
const B_CO_K = (PLANCK * 57.635968e9) / BOLTZMANN;

/** N_u = 8πkν²W/(hc³A) in cm⁻² for W in K km/s (Goldsmith & Langer, ApJ 517, 209 (1999)), here inverted for W. */
function integrated(Nu: number, nuGHz: number, A: number): number {
  const perW = (8 * Math.PI * BOLTZMANN * (nuGHz * 1e9) ** 2 * 1e3 * 1e-4) / (PLANCK * SPEED_OF_LIGHT ** 3 * A);
  return Nu / perW;
}

describe('the rotation diagram (detector: radiometer)', () => {
  it('uses N_u = 1.94 × 10³ ν²W/A cm⁻² (ν in GHz, W in K km/s), the number Goldsmith & Langer quote', () => {
    // 8πk/(hc³) × 10¹⁸ × 10³ × 10⁻⁴ = 1943.6 (exact SI constants); Goldsmith & Langer (1999) round it to 1.94 × 10³.
    close(1 / integrated(1, 1, 1), 1.94e3, 2e-3, 'the constant');
  });

  it('recovers T and the total column density of a CO ladder, with the optical-depth correction', () => {
    const T = 20;
    const N = 1e16;
    const Q = linearRotorPartition(T, B_CO_K)!;
    // The rigid-rotor expansion Q ≈ T/B + 1/3 + B/(15T) (from memory) agrees to its neglected terms.
    close(Q, T / B_CO_K + 1 / 3 + B_CO_K / (15 * T), 1e-4, 'Q(20 K)');
    const taus = [2, 0.5, null, null];
    const items = CO.map((l, i) => {
      const Nu = (N / Q) * l.g * Math.exp(-l.E / T);
      const tau = taus[i];
      // An optically thick line shows only (1 − e^(−τ))/τ of its thin-line intensity.
      const W = integrated(Nu, l.nu, l.A) * (tau ? (1 - Math.exp(-tau)) / tau : 1);
      return `  - { frequency: ${l.nu} GHz, upper: ${l.E} K, g: ${l.g}, A: ${l.A}, intensity: ${W} K km/s${tau ? `, optical-depth: ${tau}` : ''} }`;
    });
    const r = block(`detector: radiometer\nrotational-constant: 57.635968 GHz\nlines:\n${items.join('\n')}`).report;
    const res = r.results!;
    close(res.temperature!.value, T, 1e-9, 'T_ex');
    assert.equal(res.trade.trade, 'radio');
    assert.equal(res.polarization, null);
    close(res.trade.column!.total!.value, N, 1e-9, 'N total');
    close(res.trade.column!.partition, Q, 1e-12, 'Q');
    assert.equal(res.trade.plot!.ordinate, 'ln(N_u/g_u), N_u in cm⁻²');
  });

  it('needs a frequency per line and refuses an intensity unit other than K km/s', () => {
    problem(
      'detector: radiometer\nlines:\n  - { upper: 5.53 K, g: 3, A: 7.2e-8, intensity: 1 }\n  - { frequency: 230.5 GHz, upper: 16.6 K, g: 5, A: 6.9e-7, intensity: 1 }',
      'line-frequency-missing',
    );
    problem(
      'detector: radiometer\nlines:\n  - { frequency: 115.27 GHz, upper: 5.53 K, g: 3, A: 7.2e-8, intensity: 1 Jy }\n  - { frequency: 230.5 GHz, upper: 16.6 K, g: 5, A: 6.9e-7, intensity: 1 }',
      'intensity-unit',
    );
  });
});

describe('column densities', () => {
  it('reads cm-2 populations as column densities, sums them, and totals them with a rotor', () => {
    const r = block(
      'gap: 115.2712018 GHz\ng: [1, 3]\npopulations: [1.0e15 cm-2, 1.2e15 cm-2]\nrotational-constant: 57.635968 GHz',
    ).report;
    assert.ok(!r.problems.some((p) => p.severity === 'error'), r.problems.map((p) => p.message).join('; '));
    const c = r.results!.trade.column!;
    close(c.sum, 2.2e15, 1e-12, 'Σ N');
    // Lower level J = 0 at E = 0: N = Q(T) · N₀/g₀.
    close(c.total!.value, linearRotorPartition(r.results!.temperature!.value, B_CO_K)! * 1.0e15, 1e-9, 'N total');
  });

  it('reads populations written in percent as fractions on another scale, not as a unit mixed with others', () => {
    // β = ln[(n_l/g_l)/(n_u/g_u)]/ΔE = ln(0.7/0.3)/(1 K) = 0.847 298 K⁻¹ (by hand), whichever scale.
    for (const populations of ['[70 %, 30 %]', '[70 ± 1 %, 0.3]', '[0.7, 0.3]']) {
      const r = block(`gap: 1 K\npopulations: ${populations}`).report;
      assert.equal(r.status, 'normal', `${populations}: ${r.problems.map((p) => p.code).join(', ')}`);
      close(r.results!.beta!.value, Math.log(0.7 / 0.3), 1e-12, populations);
    }
    problem('gap: 1064 nm\npopulations: [1e17 cm-3, 30 %]', 'populations-mixed-units');
  });

  it('no longer offers cm-3 for cm-2, and refuses mixed units or column densities for a gain', () => {
    const p = problem('gap: 115.27 GHz\npopulations: [1e15 cm-2, 1e15 cm-3]', 'populations-mixed-units');
    assert.equal(p.fixes.length, 0);
    problem('gap: 1064 nm\npopulations: [1e15 cm-2, 2e15 cm-2]\ncross-section: 2.8e-19 cm2', 'gain-needs-densities');
  });
});

/** Fifteen invented lines of one invented neutral species: upper energies in eV, g and A chosen freely. */
const INVENTED = Array.from({ length: 15 }, (_, i) => ({
  E: 12 + 0.27 * i,
  g: 1 + (i % 5) * 2,
  A: 1e7 * (1 + ((i * 7) % 11) / 3),
}));

describe('outliers of a Boltzmann plot', () => {
  const T = 9000;
  // Photon counts of optically thin lines: N ∝ g A e^(−E/kT) (Griem 1997, ch. 6), scaled to 10⁶ for the strongest.
  const thin = INVENTED.map((l) => l.g * l.A * Math.exp((-l.E * KELVIN_PER_EV) / T));
  const scale = 1e6 / Math.max(...thin);
  const counts = thin.map((c) => c * scale);
  // The four strongest lines are self-absorbed: they lose 40 % of their counts.
  const strongest = counts
    .map((c, i) => [c, i] as const)
    .sort((a, b) => b[0] - a[0])
    .slice(0, 4)
    .map(([, i]) => i);
  const seen = counts.map((c, i) => (strongest.includes(i) ? c * 0.6 : c));
  const body = `detector: photon\nlines:\n${INVENTED.map((l, i) => `  - { label: L${i}, upper: ${l.E} eV, g: ${l.g}, A: ${l.A}, intensity: ${seen[i]} }`).join('\n')}`;

  it('flags exactly the four self-absorbed lines, below the line, and refits the true temperature without them', () => {
    const r = block(body).report;
    const res = r.results!;
    const flagged = res.trade.plot!.points.filter((p) => p.flag !== null);
    assert.deepEqual(flagged.map((p) => p.label).sort(), strongest.map((i) => `L${i}`).sort());
    assert.ok(
      flagged.every((p) => p.flag === 'below'),
      'self-absorption pulls lines below',
    );
    close(res.trade.refit!.temperature!.value, T, 1e-9, 'refit T');
    assert.ok(Math.abs(res.temperature!.value - T) > 10, 'the full fit is dragged');
    // Judged against the dragged fit, as before, most lines would be more than 3 σ off:
    const dragged = res.trade.plot!.points.filter((p) => Math.abs(p.residual) > 3 * p.uY!).length;
    assert.ok(dragged >= 8, `${dragged} lines more than 3 σ off the full fit`);
    assert.equal(r.problems.filter((p) => p.code === 'line-outlier').length, 4);
  });

  it('gives photon counts written without ± √N uncertainties, and says so', () => {
    const res = block(body).report.results!;
    for (const [k, p] of res.trade.plot!.points.entries()) {
      assert.equal(p.poisson, true);
      const n = seen[Number(p.label!.slice(1))]!;
      close(p.uY, Math.sqrt(n) / n, 1e-12, `u(y) of point ${k}`);
    }
  });

  it('writes the per-line plot data as CSV, guarding labels that a spreadsheet would run', () => {
    const r = block(body.replace('label: L0,', 'label: "=HYPERLINK(1)",')).report;
    const csv = linesCsv([{ file: 'n.md', line: 3, id: null, results: r.results }]);
    const rows = csv.trim().split('\r\n');
    assert.equal(rows.length, 16);
    assert.ok(
      rows.some((x) => x.includes(",'=HYPERLINK(1),")),
      'guarded',
    );
    assert.ok(!rows.some((x) => x.includes(',=HYPERLINK')), 'never a bare formula');
  });
});

describe('checks on a block of lines', () => {
  it('says which detector it assumed, with a fix that states it and changes nothing else', () => {
    const body =
      'lines:\n  - { wavelength: 656.28 nm, upper: 12.09 eV, g: 18, A: 4.41e7, intensity: 100 }\n  - { wavelength: 486.13 nm, upper: 12.75 eV, g: 32, A: 8.42e6, intensity: 20 }';
    const p = problem(body, 'detector-assumed');
    assert.equal(p.severity, 'info');
    assert.equal(p.fixes[0].newText, 'detector: energy\n');
    const fixed = applyFirstFix(body, 'detector-assumed');
    const before = block(body).report.results!.temperature!.value;
    const after = block(fixed).report;
    assert.ok(!after.problems.some((x) => x.code === 'detector-assumed'));
    assert.equal(after.results!.temperature!.value, before);
  });

  it('warns when the upper levels span less than kT (Ar I 4p at 10 000 K spans 0.4 eV < 0.86 eV)', () => {
    // Upper-level energies and line data from NIST ASD (export retrieved 2026-06-15); intensities at 10 000 K from
    // I ∝ gA/λ · e^(−E/kT) (Griem 1997, ch. 6).
    const lines = [
      [811.7542, 105462.7596, 7, 3.3e7, 1],
      [763.7208, 106237.5518, 5, 2.45e7, 0.50419777],
      [696.7352, 107496.4166, 3, 6.4e6, 0.072272388],
    ];
    const body = `wavelengths: vacuum\ndetector: energy\nlines:\n${lines.map(([nm, E, g, A, I]) => `  - { wavelength: ${nm} nm, upper: ${E} cm-1, g: ${g}, A: ${A}, intensity: ${I} }`).join('\n')}`;
    const p = problem(body, 'energy-span-small');
    assert.match(p.message, /less than kT = 0\.86/);
    close(block(body).report.results!.trade.temperatureEv!.value, 10000 / KELVIN_PER_EV, 1e-4, 'kT in eV');
  });

  it('offers only the sibling unit that keeps an atomic level atomic: cm-1, never eV, for 105617.27', () => {
    // Ar I 2p8 at 105 617.27 cm⁻¹ (NIST ASD); as eV it would be 105 keV.
    const body =
      'detector: photon\nlines:\n  - { upper: 105462.7596 cm-1, g: 7, A: 3.3e7, intensity: 100 }\n  - { upper: 105617.27, g: 5, A: 9.3e6, intensity: 20 }\n  - { upper: 13.328 eV, g: 3, A: 6.4e6, intensity: 10 }';
    const p = problem(body, 'unit-missing');
    assert.deepEqual(
      p.fixes.map((f) => f.newText),
      [' cm-1'],
    );
    assert.match(p.message, /105617\.27 eV/);
    // With a unit written, an implausible magnitude is flagged.
    const w = problem(body.replace('105617.27,', '105617.27 eV,'), 'energy-implausible');
    assert.equal(w.severity, 'warning');
  });
});

describe('unit fixes in explicit levels', () => {
  it('offers the units of the other levels that keep a bare energy near theirs, and names those ruled out', () => {
    // 410 cm⁻¹ = 590 K sits among 0…580 K levels; 410 eV = 4.8 × 10⁶ K would not (1 cm⁻¹ = 1.4388 K, 1 eV =
    // 11 604.5 K: exact SI conversions, CODATA 2022).
    const body =
      'levels:\n  - { energy: 0 cm-1, population: 0.7 }\n  - { energy: 0.05 eV, population: 0.2 }\n  - { energy: 410, population: 0.1 }';
    const p = problem(body, 'unit-missing');
    assert.deepEqual(
      p.fixes.map((f) => f.newText),
      [' cm-1'],
    );
    assert.match(p.message, /410 eV/);
  });
});

describe('extreme values in the trade keys', () => {
  it('never throws and never reports a non-finite number', () => {
    const bodies = [
      'gap: 1420.405751768 MHz\nbrightness: 35 K\noptical-depth: 1e-320',
      'gap: 1420.405751768 MHz\nbrightness: 1e308 K\noptical-depth: 1e-300\nbackground: 1e308 K',
      'detector: radiometer\nrotational-constant: 1e-300 Hz\nlines:\n  - { frequency: 1e300 GHz, upper: 1 K, g: 3, A: 1e-300, intensity: 1e300 }\n  - { frequency: 1 Hz, upper: 2e6 K, g: 5, A: 1, intensity: 1e-300, optical-depth: 1e300 }',
      'gap: 1e300 Å\nratio: 0.5',
      'gap: 0.0001 nm\nwavelengths: air\nratio: 0.5',
      `detector: photon\nlines:\n${Array.from({ length: 300 }, (_, i) => `  - { upper: ${10 + i * 0.01} eV, g: 1, A: 1e7, intensity: ${1 + (i % 7)} }`).join('\n')}`,
    ];
    for (const b of bodies) {
      const { report, text } = block(b);
      const json = JSON.stringify(reportEntry('x.md', report, new LineIndex(text)));
      assert.doesNotMatch(json, /NaN|Infinity/, b.slice(0, 40));
    }
    // T_B over a vanishing τ: T → ∞, β = 0, saturated (not unknown).
    assert.equal(block(bodies[0]).report.status, 'saturated');
  });
});

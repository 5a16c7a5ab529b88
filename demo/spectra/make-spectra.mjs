// Writes the demo's spectrum files. Everything they hold is INVENTED: line
// positions, widths, heights and noise are made up for the demo (the argon
// wavelengths are the catalogue values the lamp note already uses).
// Run from the repository root: `node demo/spectra/make-spectra.mjs`.
// Deterministic (a fixed linear congruential noise), so the files do not
// change from run to run. The JCAMP-DX file is written by the devDependency
// convert-to-jcamp, which Boltzmark itself does not use for reading.
import { writeFileSync } from 'node:fs';
import { fromJSON } from 'convert-to-jcamp';

let state = 12345;
/** Uniform on (−1, 1), Numerical Recipes' LCG constants; the sum of four is near-Gaussian with σ = √(4/3). */
function noise() {
  let s = 0;
  for (let k = 0; k < 4; k++) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    s += state / 2 ** 31 - 1;
  }
  return s / Math.sqrt(4 / 3);
}
const lorentz = (x, x0, fwhm, h) => h / (1 + ((x - x0) / (fwhm / 2)) ** 2);
const gauss = (x, x0, fwhm, h) => h * Math.exp((-4 * Math.LN2 * (x - x0) ** 2) / fwhm ** 2);

// 13C, hyperpolarized (run 12): 2048 points from 230 to −10 ppm, a carbonyl-like line at 171.2 ppm and a
// weaker one at 182.9 ppm; at 100.6 MHz (9.4 T). Stored in DIFDUP on a ppm axis.
{
  const n = 2048;
  const x = [];
  const y = [];
  for (let i = 0; i < n; i++) {
    const v = 230 - (240 * i) / (n - 1);
    x.push(v);
    y.push(lorentz(v, 171.2, 0.35, 1.2e4) + lorentz(v, 182.9, 0.35, 1.5e3) + 5 + 0.05 * v + 25 * noise());
  }
  const text = fromJSON(
    { x: x.reverse(), y: y.reverse() },
    {
      info: { title: 'run 12, hyperpolarized 13C (invented)', dataType: 'NMR SPECTRUM', xUnits: 'PPM', yUnits: 'ARBITRARY UNITS' },
      meta: {},
      xyEncoding: 'DIFDUP',
    },
  ).replace('##XUNITS=', '##.OBSERVE FREQUENCY=100.6\n##.OBSERVE NUCLEUS=^13C\n##XUNITS=');
  writeFileSync('demo/spectra/run12-hp.jdx', text);
}

// 13C, thermal reference: same axis in ppm as two-column text, 512 scans summed (so its noise is larger
// relative to the tiny line), 1024 points.
{
  const n = 1024;
  const lines = ['# thermal reference, 512 scans, 298 K (invented)', 'shift (ppm),intensity'];
  for (let i = 0; i < n; i++) {
    const v = 230 - (240 * i) / (n - 1);
    const y = lorentz(v, 171.2, 0.5, 2.6e3) + lorentz(v, 182.9, 0.5, 3.2e2) + 40 * noise();
    lines.push(`${v.toFixed(4)},${y.toFixed(2)}`);
  }
  writeFileSync('demo/spectra/thermal-0412.csv', lines.join('\n') + '\n');
}

// Argon lamp, 690–815 nm in 0.02 nm steps (6251 points), as XYDATA in SQZ form. The lamp note's lines
// (wavelength nm, upper level cm-1, g, A s-1: the NIST ASD values that note quotes) with invented areas
// following a Boltzmann distribution at an invented 9000 K, each off by an invented scatter of a few per mille.
{
  const catalogue = [
    [763.5106, 106237.5518, 5, 2.45e7, 0.004],
    [810.3693, 106087.2598, 3, 2.5e7, -0.003],
    [801.4786, 105617.27, 5, 9.3e6, 0.002],
    [794.8176, 107131.7086, 3, 1.86e7, -0.004],
    [751.4652, 107054.272, 1, 4.0e7, 0.003],
    [738.398, 107289.7001, 5, 8.5e6, -0.002],
    [696.5431, 107496.4166, 3, 6.4e6, 0.001],
    [750.3869, 108722.6194, 1, 4.5e7, -0.003],
  ];
  const kT = 9000 / 1.4387768775; // in cm-1: T / (hc/k), hc/k = 1.4387768775 cm K (CODATA 2018)
  const fwhm = 0.09;
  // Energy-calibrated intensity of a line: I ∝ g A exp(−E/kT) / λ; scaled so the strongest has an area near 1500.
  const raw = catalogue.map(([l, e, g, a, off]) => ((g * a * Math.exp(-(e - 105000) / kT)) / l) * (1 + off));
  const scale = 1500 / Math.max(...raw);
  const peaks = catalogue.map(([l], i) => [l, (raw[i] * scale) / (fwhm * Math.sqrt(Math.PI / (4 * Math.LN2)))]);
  const x = [];
  const y = [];
  for (let i = 0; i <= 6250; i++) {
    const v = 690 + i * 0.02;
    let s = 35 + 20 * noise();
    for (const [c, h] of peaks) s += gauss(v, c, fwhm, h);
    x.push(Number(v.toFixed(2)));
    y.push(Math.round(s * 10) / 10);
  }
  writeFileSync(
    'demo/spectra/argon-lamp.jdx',
    fromJSON({ x, y }, { info: { title: 'Ar lamp, 2026-03-19 (invented)', dataType: 'EMISSION SPECTRUM', xUnits: 'NANOMETERS', yUnits: 'COUNTS' }, xyEncoding: 'SQZ' }),
  );
}

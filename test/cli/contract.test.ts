/**
 * An independent check of the command line against the notebook format contract (v1.2,
 * /work/shared/notebook-format.md), field by field: the bundled command (dist/cli.js, run as a user runs it) on
 * notes written to a temporary folder. Every expected value is taken from the contract's own text or computed here
 * from the published formulas, never from the tool's output.
 *
 * Constants: h = 6.626 070 15e-34 J s and k = 1.380 649e-23 J/K, exact since the 2019 SI redefinition (BIPM, SI
 * Brochure, 9th ed., 2019; CODATA 2018 lists them unchanged). Gyromagnetic ratios of the bare nuclei: Harris et
 * al., "NMR nomenclature. Nuclear spin properties and conventions for chemical shifts", Pure Appl. Chem. 73, 1795
 * (2001), Table 1 (γ in 10⁷ rad s⁻¹ T⁻¹). The electron: CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010
 * (2021)), μ_B and g_e.
 */
import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { chmodSync, mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { CONTRACT_FIELDS } from '../support/contractFields';

const CLI = resolve('dist', 'cli.js');

/** Exact SI (2019): Planck constant, J s. */
const H = 6.62607015e-34;
/** Exact SI (2019): Boltzmann constant, J/K. */
const K = 1.380649e-23;
/** CODATA 2018: Bohr magneton, J/T. */
const MU_B = 9.2740100783e-24;
/** CODATA 2018: electron g-factor (its magnitude enters the level spacing). */
const G_E = 2.00231930436256;
/** Harris et al. 2001, Table 1: γ(¹³C) = 6.728284e7 rad s⁻¹ T⁻¹ (10.7084 MHz/T, as the contract's example says). */
const GAMMA_13C = 6.728284e7;
/** Harris et al. 2001, Table 1: γ(¹H) = 26.7522128e7 rad s⁻¹ T⁻¹. */
const GAMMA_1H = 26.7522128e7;
/** Harris et al. 2001, Table 1: γ(²H) = 4.10662791e7 rad s⁻¹ T⁻¹ (I = 1). */
const GAMMA_2H = 4.10662791e7;

/** Zeeman spacing per Δm = 1 as a temperature, K: |γ|ħB/k = (|γ|/2π)·h·B/k. */
const zeemanK = (gamma: number, tesla: number): number => ((Math.abs(gamma) / (2 * Math.PI)) * H * tesla) / K;
/** A frequency as a temperature, K: hν/k. */
const hzK = (hz: number): number => (H * hz) / K;
/** Two-level β from P = (n_l − n_u)/(n_l + n_u): ln[(1 + P)/(1 − P)]/ΔE. */
const betaOfP = (p: number, dE: number): number => Math.log((1 + p) / (1 - p)) / dE;
/** Thermal polarization of a spin ½: tanh(ΔE/2kT). */
const tanhP = (dE: number, t: number): number => Math.tanh(dE / (2 * t));
/**
 * ⟨I_z⟩/I for spin I at spacing x = ΔE/kT per Δm = 1 (the Brillouin function B_I(I·x)), summed over the 2I + 1
 * Boltzmann-weighted levels directly.
 */
function brillouinP(spin: number, x: number): number {
  let z = 0;
  let m1 = 0;
  for (let m = -spin; m <= spin + 1e-9; m++) {
    const w = Math.exp(m * x);
    z += w;
    m1 += m * w;
  }
  return m1 / z / spin;
}
/** Gibbs entropy S/(Nk) = −Σ p ln p of normalised populations. */
const gibbs = (ps: number[]): number => {
  const sum = ps.reduce((a, b) => a + b, 0);
  return -ps.reduce((s, p) => (p > 0 ? s + (p / sum) * Math.log(p / sum) : s), 0);
};

const close = (actual: number | null | undefined, expected: number, rel: number, what: string): void => {
  assert.ok(typeof actual === 'number', `${what}: a number, got ${String(actual)}`);
  const tol = rel * Math.max(Math.abs(expected), 1e-300);
  assert.ok(Math.abs(actual - expected) <= tol, `${what}: ${actual} vs ${expected} (rel ${rel})`);
};

interface M {
  value: number;
  uncertainty: number | null;
  interval?: [number, number] | null;
}
interface Diagnostic {
  severity: string;
  code: string;
  message: string;
  line: number;
  column: number;
}
interface SpectrumEntry {
  key: string;
  file: string;
  region: [number, number] | null;
  unit: string | null;
  integral: { value: number; uncertainty: number | null } | null;
  points: number | null;
}
interface Entry {
  file: string;
  line: number;
  cell: number | null;
  id: string | null;
  status: string;
  beta: M | null;
  temperature: M | null;
  polarization: M | null;
  thermalPolarization: number | null;
  enhancement: number | null;
  entropy: number | null;
  diagnostics: Diagnostic[];
  timeConstant: M | null;
  gainCoefficient: number | null;
  singlePassGain: number | null;
  aboveThreshold: boolean | null;
  invertedPairs: [number, number][];
  spectra: SpectrumEntry[];
  polarizationAt: { time: number; value: number; uncertainty: number | null } | null;
}

interface Run {
  code: number | null;
  out: string;
  err: string;
}

/** The bundled command, in `cwd`, as a user runs it. */
function cli(args: string[], cwd: string, input?: string): Run {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd, encoding: 'utf8', input, timeout: 60000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/** `report … --format json`: the exit status and the parsed entries, each checked against the contract's shape. */
function report(args: string[], cwd: string): { code: number | null; entries: Entry[]; err: string } {
  const r = cli(['report', ...args, '--format', 'json'], cwd);
  const entries = JSON.parse(r.out) as Entry[];
  assert.ok(Array.isArray(entries), 'one JSON array on stdout');
  for (const e of entries) assertShape(e);
  return { code: r.code, entries, err: r.err };
}

const STATUSES = ['normal', 'saturated', 'inverted', 'non-thermal', 'invalid'];
/** Fields the contract names (v1, v1.1, v1.2): each present, `null` when unknown, never missing. */
const FIELDS = [
  ...CONTRACT_FIELDS,
  'timeConstant',
  'gainCoefficient',
  'singlePassGain',
  'aboveThreshold',
  'spectra',
  'polarizationAt',
];

const isNumberOrNull = (x: unknown): boolean => x === null || (typeof x === 'number' && Number.isFinite(x));

/** The contract's types, nullability and conventions for one entry. */
function assertShape(e: Entry): void {
  const rec = e as unknown as Record<string, unknown>;
  for (const f of FIELDS) assert.ok(f in rec && rec[f] !== undefined, `field ${f} present`);
  assert.equal(typeof e.file, 'string');
  assert.ok(Number.isInteger(e.line) && e.line >= 1, 'line is 1-based');
  assert.ok(e.id === null || typeof e.id === 'string');
  assert.ok(STATUSES.includes(e.status), e.status);
  for (const f of ['beta', 'temperature', 'polarization'] as const) {
    const m = e[f];
    if (m === null) continue;
    assert.equal(typeof m.value, 'number', `${f}.value`);
    assert.ok(isNumberOrNull(m.uncertainty), `${f}.uncertainty`);
    // v1.2: `interval` is carried, and null where the result has no uncertainty.
    assert.ok('interval' in m, `${f}.interval present`);
    if (m.uncertainty === null) assert.equal(m.interval, null, `${f}.interval without an uncertainty`);
    if (m.interval) assert.ok(m.interval[0] <= m.interval[1], `${f}.interval low to high`);
  }
  for (const f of ['thermalPolarization', 'enhancement', 'entropy', 'gainCoefficient', 'singlePassGain'] as const)
    assert.ok(isNumberOrNull(e[f]), f);
  assert.ok(e.aboveThreshold === null || typeof e.aboveThreshold === 'boolean');
  if (e.timeConstant) assert.ok(typeof e.timeConstant.value === 'number' && isNumberOrNull(e.timeConstant.uncertainty));
  if (e.polarizationAt)
    for (const f of ['time', 'value'] as const) assert.equal(typeof e.polarizationAt[f], 'number', f);
  assert.ok(Array.isArray(e.spectra));
  for (const s of e.spectra) {
    assert.equal(typeof s.key, 'string');
    assert.equal(typeof s.file, 'string');
    for (const f of ['region', 'unit', 'integral', 'points'] as const) assert.ok(f in s, `spectra[].${f}`);
  }
  for (const d of e.diagnostics) {
    assert.ok(['error', 'warning', 'info'].includes(d.severity), d.severity);
    assert.match(d.code, /^[a-z0-9]+(-[a-z0-9]+)*$/, 'stable kebab-case code');
    assert.equal(typeof d.message, 'string');
    assert.ok(Number.isInteger(d.line) && d.line >= 1, 'diagnostic line is 1-based');
  }
  // Status rule 1: `invalid` exactly when the block has an error, and then nothing is computed.
  const hasError = e.diagnostics.some((d) => d.severity === 'error');
  assert.equal(e.status === 'invalid', hasError, `invalid ⇔ an error (${e.file}:${e.line})`);
  if (hasError) for (const f of ['beta', 'temperature', 'polarization'] as const) assert.equal(e[f], null);
  // T = 1/β, absent when β = 0.
  if (e.beta && e.beta.value === 0) assert.equal(e.temperature, null, 'no temperature at β = 0');
  if (e.beta && e.temperature) close(e.temperature.value, 1 / e.beta.value, 1e-12, 'T = 1/β');
}

const fence = (body: string): string => '```levels\n' + body + '\n```\n';
const codes = (e: Entry): string[] => e.diagnostics.map((d) => d.code);
const byId = (entries: Entry[], id: string): Entry => {
  const e = entries.find((x) => x.id === id);
  assert.ok(e, `a block with id ${id}`);
  return e;
};

/** nbformat 4 notebook with the given cells (`source` as Jupyter writes it: a list of lines). */
const notebook = (cells: { cell_type: string; source: string | string[] }[]): string =>
  JSON.stringify(
    {
      cells: cells.map((c) => ({
        metadata: {},
        ...c,
        ...(c.cell_type === 'code' ? { outputs: [], execution_count: null } : {}),
      })),
      metadata: {},
      nbformat: 4,
      nbformat_minor: 5,
    },
    null,
    1,
  );
const lines = (text: string): string[] => text.split(/(?<=\n)/);

describe('boltzmark command line against the notebook format contract (v1.2)', function () {
  this.timeout(120000);
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'bm-contract-'));
  });
  afterEach(() => {
    try {
      chmodSync(join(dir, 'locked.md'), 0o644);
    } catch {
      // Only some tests make it.
    }
    rmSync(dir, { recursive: true, force: true });
  });

  describe('results per block', () => {
    it('computes the contract’s first example (¹³C, 7.05 T, 1.4 K, P = 0.312 ± 0.010) from the formulas', () => {
      writeFileSync(
        join(dir, 'run7.md'),
        '# Cell B\n\n' +
          fence('id: cell-B run 7\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: 0.312 ± 0.010'),
      );
      const { code, entries } = report(['run7.md'], dir);
      assert.equal(code, 0);
      assert.equal(entries.length, 1);
      const e = entries[0]!;
      assert.equal(e.file, 'run7.md');
      assert.equal(e.line, 3, 'the opening fence, 1-based');
      assert.equal(e.id, 'cell-B run 7');
      assert.equal(e.status, 'normal');
      const dE = zeemanK(GAMMA_13C, 7.05);
      const beta = betaOfP(0.312, dE);
      // u(β) = |dβ/dP|·u(P) = 2/((1 − P²)ΔE)·u(P) (GUM eq. (10), one input).
      const uBeta = (2 / ((1 - 0.312 ** 2) * dE)) * 0.01;
      close(e.beta!.value, beta, 1e-6, 'β');
      close(e.beta!.uncertainty, uBeta, 1e-6, 'u(β)');
      // The contract's printed values, to the digits it prints.
      assert.equal(e.beta!.value.toFixed(2), '178.17');
      assert.equal(e.beta!.uncertainty!.toFixed(2), '6.12');
      assert.equal(e.temperature!.value.toFixed(6), '0.005613');
      assert.equal(e.temperature!.uncertainty!.toFixed(6), '0.000193');
      assert.deepEqual([e.polarization!.value, e.polarization!.uncertainty], [0.312, 0.01]);
      close(e.thermalPolarization, tanhP(dE, 1.4), 1e-6, 'P_th = tanh(ΔE/2kT)');
      assert.equal(e.thermalPolarization!.toFixed(6), '0.001294');
      close(e.enhancement, 0.312 / tanhP(dE, 1.4), 1e-6, 'ε = P/P_th');
      assert.equal(e.enhancement!.toFixed(1), '241.1');
      close(e.entropy, gibbs([(1 + 0.312) / 2, (1 - 0.312) / 2]), 1e-9, 'S/(Nk)');
      assert.equal(e.entropy!.toFixed(4), '0.6437');
      assert.deepEqual(e.diagnostics, []);
      // v1.1 fields that do not apply: null, never missing; v1.2 lists empty.
      for (const f of [
        'timeConstant',
        'gainCoefficient',
        'singlePassGain',
        'aboveThreshold',
        'polarizationAt',
      ] as const)
        assert.equal(e[f], null, f);
      assert.deepEqual(e.spectra, []);
      // Honest intervals: β ± 2u(β); T the image of β's interval; P ± 2u(P).
      close(e.beta!.interval![0], beta - 2 * uBeta, 1e-6, 'β low');
      close(e.beta!.interval![1], beta + 2 * uBeta, 1e-6, 'β high');
      close(e.temperature!.interval![0], 1 / (beta + 2 * uBeta), 1e-6, 'T low');
      close(e.temperature!.interval![1], 1 / (beta - 2 * uBeta), 1e-6, 'T high');
      close(e.polarization!.interval![0], 0.292, 1e-12, 'P low');
      close(e.polarization!.interval![1], 0.332, 1e-12, 'P high');
    });

    it('gives each status by the contract’s rules, for the inputs each rule names', () => {
      const u1 = (d: number): string =>
        `levels:\n  - { energy: 0 K, population: 1, uncertainty: 0.01 }\n  - { energy: 10 K, population: ${Math.exp(-1 + d)}, uncertainty: ${0.01 * Math.exp(-1 + d)} }\n  - { energy: 20 K, population: ${Math.exp(-2)}, uncertainty: ${0.01 * Math.exp(-2)} }`;
      const u0 = (d: number): string =>
        `levels:\n  - { energy: 0 K, population: 1 }\n  - { energy: 10 K, population: ${Math.exp(-1 + d)} }\n  - { energy: 20 K, population: ${Math.exp(-2)} }`;
      writeFileSync(
        join(dir, 'status.md'),
        [
          fence('id: normal\ngap: 10 K\nratio: 0.5'),
          fence('id: inverted\ngap: 10 K\nratio: 2'),
          fence('id: beta zero\ngap: 10 K\nratio: 1'),
          fence('id: within 2u\ngap: 10 K\nratio: 0.99 ± 0.02'),
          fence('id: beyond 2u\ngap: 10 K\nratio: 0.9 ± 0.02'),
          fence('id: chi2 pass\n' + u1(0.025)),
          fence('id: chi2 fail\n' + u1(0.04)),
          fence('id: residual pass\n' + u0(0.04)),
          fence('id: residual fail\n' + u0(0.09)),
          fence(
            'id: inverted pair\nlevels:\n  - { energy: 0 K, population: 1 }\n  - { energy: 10 K, population: 0.1 }\n  - { energy: 20 K, population: 0.5 }',
          ),
          fence('id: error\nsystem: C13\nfield: 1 T\npolarization: 0.1'),
        ].join('\n'),
      );
      const { code, entries } = report(['status.md'], dir);
      assert.equal(code, 1, 'a block has an error');
      // β = ln[(n_l/g_l)/(n_u/g_u)]/ΔE for two levels.
      const normal = byId(entries, 'normal');
      assert.equal(normal.status, 'normal');
      close(normal.beta!.value, Math.LN2 / 10, 1e-12, 'β');
      close(normal.temperature!.value, 10 / Math.LN2, 1e-12, 'T');
      close(normal.polarization!.value, (1 - 0.5) / 1.5, 1e-12, 'P');
      const inv = byId(entries, 'inverted');
      assert.equal(inv.status, 'inverted');
      close(inv.beta!.value, -Math.LN2 / 10, 1e-12, 'β < 0');
      close(inv.temperature!.value, -10 / Math.LN2, 1e-12, 'T negative when inverted');
      close(inv.polarization!.value, -1 / 3, 1e-12, 'P < 0');
      const zero = byId(entries, 'beta zero');
      assert.equal(zero.status, 'saturated', 'β exactly zero');
      assert.equal(zero.beta!.value, 0);
      assert.equal(zero.temperature, null, 'T absent when β = 0');
      // |β| = ln(1/0.99)/10 K = 1.005e-3, u(β) = (0.02/0.99)/10 = 2.02e-3: within two standard uncertainties.
      const sat = byId(entries, 'within 2u');
      assert.equal(sat.status, 'saturated');
      close(sat.beta!.value, Math.log(1 / 0.99) / 10, 1e-12, 'β');
      close(sat.beta!.uncertainty, 0.02 / 0.99 / 10, 1e-9, 'u(β) = u(r)/(r ΔE)');
      assert.equal(sat.temperature!.interval, null, 'β’s interval holds 0: no T interval');
      // 4.7 standard uncertainties from zero.
      assert.equal(byId(entries, 'beyond 2u').status, 'normal');
      // χ² of three equally weighted points (relative u 1 %) with the middle one off by d in ln n:
      // residuals (−d/3, 2d/3, −d/3)/0.01, χ² = (2/3)(d/0.01)²; the 99th percentile of χ² with 1 degree of
      // freedom is 6.635 (NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.4, critical values of χ²).
      const chi2 = (d: number): number => (2 / 3) * (d / 0.01) ** 2;
      assert.ok(chi2(0.025) < 6.635 && chi2(0.04) > 6.635);
      assert.equal(byId(entries, 'chi2 pass').status, 'normal');
      assert.equal(byId(entries, 'chi2 fail').status, 'non-thermal');
      // Without uncertainties, the documented residual rule (docs/format.md, Status): a level more than ln 1.05 off
      // the fitted line. The largest residual is 2d/3: 0.027 for d = 0.04, 0.06 for d = 0.09 (ln 1.05 = 0.0488).
      assert.equal(byId(entries, 'residual pass').status, 'normal');
      assert.equal(byId(entries, 'residual fail').status, 'non-thermal');
      // Non-thermal: the inverted pairs are still listed (levels 1 and 2, lowest level 0).
      const pair = byId(entries, 'inverted pair');
      assert.equal(pair.status, 'non-thermal');
      assert.deepEqual(pair.invertedPairs, [[1, 2]]);
      const err = byId(entries, 'error');
      assert.equal(err.status, 'invalid');
      for (const f of ['thermalPolarization', 'enhancement', 'entropy'] as const) assert.equal(err[f], null, f);
    });

    it('takes P of a degenerate transition per degeneracy (v1.2), positive at positive T', () => {
      // The hydrogen 21 cm line: ν = 1420.405 751 768 MHz (the contract's example), g = [1, 3].
      writeFileSync(
        join(dir, 'hi.md'),
        fence('id: HI\ngap: 1420.405751768 MHz\ng: [1, 3]\npopulations: [1.0, 2.9979]'),
      );
      const e = report(['hi.md'], dir).entries[0]!;
      const ratio = 2.9979 / 3;
      close(e.beta!.value, Math.log(1 / ratio) / hzK(1420.405751768e6), 1e-9, 'β');
      close(e.polarization!.value, (1 - ratio) / (1 + ratio), 1e-9, 'P per degeneracy');
      assert.ok(e.polarization!.value > 0 && e.status === 'normal');
      // S/(Nk) with degeneracies: −Σ p_i ln(p_i/g_i).
      const p = [1 / 3.9979, 2.9979 / 3.9979];
      close(e.entropy, -p[0]! * Math.log(p[0]!) - p[1]! * Math.log(p[1]! / 3), 1e-9, 'S/(Nk)');
    });

    it('fits β to ln(n_i/g_i) against E_i for three or more levels, in any order', () => {
      // n_i = g_i·exp(−E_i/T) at T = 250 K, energies in cm⁻¹ (ΔE/k = 1.438 776 877 K per cm⁻¹, hc/k exact), listed
      // out of order.
      const c2 = (H * 299792458 * 100) / K;
      const lv = [
        [410, 5],
        [0, 1],
        [120, 3],
      ].map(([cm, g]) => `  - { energy: ${cm} cm-1, g: ${g}, population: ${g! * Math.exp((-cm! * c2) / 250)} }`);
      writeFileSync(join(dir, 'three.md'), fence('id: three\nlevels:\n' + lv.join('\n')));
      const e = report(['three.md'], dir).entries[0]!;
      assert.equal(e.status, 'normal');
      close(e.beta!.value, 1 / 250, 1e-9, 'β');
      close(e.temperature!.value, 250, 1e-9, 'T');
      assert.deepEqual(e.invertedPairs, []);
    });

    it('spaces spin levels by |γ|ħB, or by the frequency given, with the Brillouin function for I > 1/2', () => {
      writeFileSync(
        join(dir, 'spins.md'),
        [
          fence('id: 1H\nsystem: 1H\nfield: 9.4 T\nlattice: 298 K\npolarization: 1e-4'),
          fence('id: 2H\nsystem: 2H\nfield: 9.4 T\nlattice: 4 K\npolarization: 0.01'),
          fence('id: e\nsystem: electron\nfield: 3.35 T\nlattice: 1 K\npolarization: 0.5'),
          fence('id: Xe\nsystem: 129Xe\nfrequency: 110.7 MHz\nlattice: 300 K\npolarization: 0.3'),
          fence('id: Xe both\nsystem: 129Xe\nfrequency: 110.7 MHz\nfield: 9.0 T\nlattice: 300 K\npolarization: 0.3'),
          fence('id: Xe near\nsystem: 129Xe\nfrequency: 110.7 MHz\nfield: 9.3 T\nlattice: 300 K\npolarization: 0.3'),
          fence('id: 2H populations\nsystem: 2H\nfield: 9.4 T\npopulations: [0.5, 0.3, 0.2]'),
          fence('id: Xe populations\nsystem: 129Xe\nfield: 9.4 T\npopulations: [0.6, 0.4]'),
        ].join('\n'),
      );
      const { entries } = report(['spins.md'], dir);
      const p1 = byId(entries, '1H');
      close(p1.thermalPolarization, tanhP(zeemanK(GAMMA_1H, 9.4), 298), 1e-7, '¹H P_th');
      close(p1.beta!.value, betaOfP(1e-4, zeemanK(GAMMA_1H, 9.4)), 1e-7, '¹H β');
      const d = byId(entries, '2H');
      close(d.thermalPolarization, brillouinP(1, zeemanK(GAMMA_2H, 9.4) / 4), 1e-7, '²H P_th (I = 1)');
      // I = 1 under a spin temperature: P = B_1(β·ΔE) solved for β; check by putting β back.
      close(brillouinP(1, d.beta!.value * zeemanK(GAMMA_2H, 9.4)), 0.01, 1e-9, '²H β reproduces P');
      const el = byId(entries, 'e');
      const dEe = (G_E * MU_B * 3.35) / K;
      close(el.thermalPolarization, tanhP(dEe, 1), 1e-8, 'electron P_th, free-electron g');
      close(el.beta!.value, betaOfP(0.5, dEe), 1e-8, 'electron β');
      const xe = byId(entries, 'Xe');
      close(xe.thermalPolarization, tanhP(hzK(110.7e6), 300), 1e-12, 'the frequency given sets the spacing');
      assert.deepEqual(codes(xe), []);
      // 110.7 MHz is 9.334 T for ¹²⁹Xe (|γ|/2π = 11.860 MHz/T): 3.6 % off 9.0 T, past the contract's 1 %.
      const both = byId(entries, 'Xe both');
      assert.ok(
        both.diagnostics.some((x) => x.severity === 'warning'),
        'field and frequency disagree: a warning',
      );
      assert.notEqual(both.status, 'invalid');
      // 9.3 T is 0.4 % off 9.334 T (the sample's shielding is of that order): no warning.
      assert.deepEqual(codes(byId(entries, 'Xe near')), []);
      // Populations in order of increasing energy; P = ⟨I_z⟩/I, positive at positive T whatever the sign of γ:
      // (0.5·1 + 0.3·0 − 0.2·1)/1 for I = 1, and (0.6 − 0.4)/1 for ¹²⁹Xe (γ < 0).
      close(byId(entries, '2H populations').polarization!.value, 0.3, 1e-12, '²H P');
      const xp = byId(entries, 'Xe populations');
      close(xp.polarization!.value, 0.2, 1e-12, '¹²⁹Xe P');
      close(
        xp.beta!.value,
        Math.log(0.6 / 0.4) / zeemanK(-7.452103e7, 9.4),
        1e-7,
        '¹²⁹Xe β > 0 (Harris et al. 2001: γ = −7.452103e7)',
      );
    });
  });

  describe('quantities and the YAML body', () => {
    it('converts every energy and temperature unit of the contract with the exact SI constants', () => {
      /** Exact SI (2019): speed of light, m/s; elementary charge, C. */
      const C = 299792458;
      const E = 1.602176634e-19;
      const gaps: [string, number][] = [
        ['1 cm-1', (H * C * 100) / K],
        ['1 cm^-1', (H * C * 100) / K],
        ['1 /cm', (H * C * 100) / K],
        ['1 eV', E / K],
        ['1 meV', (E * 1e-3) / K],
        ['1 µeV', (E * 1e-6) / K],
        ['1 ueV', (E * 1e-6) / K],
        ['1e-22 J', 1e-22 / K],
        ['1 kHz', hzK(1e3)],
        ['1 GHz', hzK(1e9)],
        ['1 THz', hzK(1e12)],
        ['2 K', 2],
        // A photon wavelength, E = hc/λ; stated as a vacuum wavelength (docs/format.md: from 200 nm up a bare
        // wavelength is an air wavelength, by the IAU convention).
        ['500 nm', (H * C) / 500e-9 / K],
        ['1 µm', (H * C) / 1e-6 / K],
        ['1 um', (H * C) / 1e-6 / K],
      ];
      writeFileSync(
        join(dir, 'u.md'),
        gaps.map(([g]) => fence(`id: ${JSON.stringify(g)}\ngap: ${g}\nratio: 0.5\nwavelengths: vacuum`)).join('\n') +
          '\n' +
          [
            fence('id: degC\ngap: 1 K\nratio: 0.5\nlattice: 25 °C'),
            fence('id: degC ascii\ngap: 1 K\nratio: 0.5\nlattice: 25 degC'),
            fence('id: mK\nsystem: 1H\nfield: 9.4 T\nlattice: 300 mK\npolarization: 0.1'),
            fence('id: gauss\nsystem: 1H\nfield: 94000 G\nlattice: 300 mK\npolarization: 0.1'),
          ].join('\n'),
      );
      const { entries } = report(['u.md'], dir);
      for (const [g, dE] of gaps) close(byId(entries, g).beta!.value, Math.LN2 / dE, 1e-12, `β for gap ${g}`);
      // 25 °C = 298.15 K (SI Brochure, 9th ed., §2.3.1: t/°C = T/K − 273.15).
      for (const id of ['degC', 'degC ascii'])
        close(byId(entries, id).thermalPolarization, tanhP(1, 298.15), 1e-12, `${id}: P_th`);
      const pth = tanhP(zeemanK(GAMMA_1H, 9.4), 0.3);
      close(byId(entries, 'mK').thermalPolarization, pth, 1e-7, 'mK');
      close(byId(entries, 'gauss').thermalPolarization, pth, 1e-7, '1 G = 10⁻⁴ T');
    });

    it('reads `±`, `+-` and a sibling `uncertainty` alike, and bounds alias expansion with an error', () => {
      const laughs = ['a0: &a0 [lol, lol, lol, lol, lol, lol, lol, lol, lol]'];
      for (let i = 1; i < 12; i++)
        laughs.push(
          `a${i}: &a${i} [${Array(9)
            .fill(`*a${i - 1}`)
            .join(', ')}]`,
        );
      writeFileSync(
        join(dir, 'q.md'),
        [
          fence('id: pm\ngap: 10 K\nratio: 0.5 ± 0.01'),
          fence('id: ascii\ngap: 10 K\nratio: 0.5 +- 0.01'),
          fence(
            'id: levels\nlevels:\n  - { energy: 0 K, population: 1 }\n  - { energy: 10 K, population: 0.5, uncertainty: 0.01 }',
          ),
          fence(
            'id: negative energies\nlevels:\n  - { energy: -10 K, population: 1 }\n  - { energy: 0 K, population: 0.5 }',
          ),
          fence(laughs.join('\n')),
        ].join('\n'),
      );
      const started = Date.now();
      const { code, entries } = report(['q.md'], dir);
      assert.ok(Date.now() - started < 30000, 'never a hang');
      assert.equal(code, 1);
      for (const id of ['pm', 'ascii', 'levels']) {
        const e = byId(entries, id);
        close(e.beta!.value, Math.LN2 / 10, 1e-12, `${id}: β`);
        // u(β) = u(r)/(r·ΔE) = 0.01/(0.5 · 10 K).
        close(e.beta!.uncertainty, 0.002, 1e-9, `${id}: u(β)`);
      }
      // Only differences of level energies matter.
      close(byId(entries, 'negative energies').beta!.value, Math.LN2 / 10, 1e-12, 'β');
      const last = entries[entries.length - 1]!;
      assert.equal(last.status, 'invalid');
      assert.ok(last.diagnostics.some((d) => d.severity === 'error'));
    });
  });

  describe('where a block lives', () => {
    it('reads backtick and tilde fences of any length indented up to 3 spaces, and no other info string', () => {
      writeFileSync(
        join(dir, 'f.md'),
        [
          '~~~levels\nid: tilde\ngap: 1 K\nratio: 0.5\n~~~\n',
          '   ````levels\nid: three spaces, four backticks\ngap: 1 K\nratio: 0.5\n   ````\n',
          '    ```levels\n    id: four spaces\n    gap: 1 K\n    ratio: 0.5\n    ```\n',
          '```yaml\nid: yaml\ngap: 1 K\nratio: 0.5\n```\n',
          '```Levels\nid: case\ngap: 1 K\nratio: 0.5\n```\n',
          '```levels-old\nid: other word\ngap: 1 K\nratio: 0.5\n```\n',
          // The first word is the language (CommonMark 0.31.2 §4.5); docs/format.md, Where a block lives.
          '```levels run 7\nid: more words\ngap: 1 K\nratio: 0.5\n```\n',
        ].join('\n'),
      );
      const { entries } = report(['f.md'], dir);
      assert.deepEqual(
        entries.map((e) => [e.line, e.id]),
        [
          [1, 'tilde'],
          [7, 'three spaces, four backticks'],
          [37, 'more words'],
        ],
      );
    });
  });

  describe('diagnostics', () => {
    const BODY =
      'id: mistakes\nsystem: C13\nfield: 1 MT\npolarisation: 0.3\n```\n\n```levels\nid: bare\ngap: 10\nratio: 0.5';

    it('places each diagnostic on its 1-based line and column, with the contract’s severities', () => {
      writeFileSync(join(dir, 'd.md'), 'intro\n\n' + fence(BODY));
      const { code, entries } = report(['d.md'], dir);
      assert.equal(code, 1);
      const [a, b] = entries;
      // Unknown isotope: an error with "did you mean" (C13 → 13C); a wrong-case unit: an error; an unknown key: a
      // warning with a suggestion. Lines: the fence is line 3, `system` line 5, `field` 6, `polarisation` 7.
      const iso = a!.diagnostics.find((x) => x.message.includes('C13'))!;
      assert.deepEqual([iso.severity, iso.line, iso.column], ['error', 5, 9]);
      assert.match(iso.message, /13C/);
      const unit = a!.diagnostics.find((x) => x.message.includes('MT'))!;
      assert.deepEqual([unit.severity, unit.line, unit.column], ['error', 6, 10]);
      const key = a!.diagnostics.find((x) => x.message.includes('polarisation'))!;
      assert.deepEqual([key.severity, key.line, key.column], ['warning', 7, 1]);
      assert.match(key.message, /polarization/);
      // A bare number for a gap: an error (no default unit).
      assert.equal(b!.line, 10);
      const bare = b!.diagnostics.find((x) => x.severity === 'error')!;
      assert.deepEqual([bare.line, bare.column], [12, 6]);
      assert.equal(b!.status, 'invalid');
    });

    it('gives the same lines and columns for CRLF line ends and a byte-order mark', () => {
      const lf = 'intro\n\n' + fence(BODY);
      writeFileSync(join(dir, 'lf.md'), lf);
      writeFileSync(join(dir, 'crlf.md'), lf.replace(/\n/g, '\r\n'));
      writeFileSync(join(dir, 'bom.md'), '\ufeff' + lf.replace(/\n/g, '\r\n'));
      // A BOM before a fence on line 1: the fence is still line 1, column 1.
      writeFileSync(join(dir, 'bom1.md'), '\ufeff```levels\r\nid: first\r\ngap: 1 K\r\nratio: 0.5\r\n');
      const { entries } = report(['lf.md', 'crlf.md', 'bom.md', 'bom1.md'], dir);
      const place = (f: string): unknown =>
        entries
          .filter((e) => e.file === f)
          .map((e) => [e.line, e.status, e.diagnostics.map((d) => [d.code, d.line, d.column])]);
      assert.deepEqual(place('crlf.md'), place('lf.md'));
      assert.deepEqual(place('bom.md'), place('lf.md'));
      const first = entries.find((e) => e.file === 'bom1.md')!;
      assert.equal(first.line, 1);
      assert.equal(first.id, 'first');
      close(first.beta!.value, Math.LN2, 1e-12, 'β of the BOM note');
      const unclosed = first.diagnostics[0]!;
      assert.deepEqual([unclosed.severity, unclosed.line, unclosed.column], ['warning', 1, 1]);
    });
  });

  describe('files, folders and notebooks', () => {
    it('reports notebooks’ Markdown cells (CRLF too) by cell and line, and ignores code cells', () => {
      const cell1 = lines('# Day\n\n```levels\nid: nb one\ngap: 10 K\nratio: 0.5\nbogus: 1\n```\n');
      writeFileSync(
        join(dir, 'day.ipynb'),
        notebook([
          { cell_type: 'markdown', source: cell1 },
          { cell_type: 'code', source: lines('```levels\nid: in code\ngap: 1 K\nratio: 0.5\n```\n') },
          { cell_type: 'markdown', source: '```levels\r\nid: nb two\r\ngap: 10 K\r\nratio: 2\r\n```\r\n' },
        ]),
      );
      const { code, entries } = report(['day.ipynb'], dir);
      assert.equal(code, 0, 'a warning only');
      assert.deepEqual(
        entries.map((e) => [e.file, e.cell, e.line, e.id, e.status]),
        [
          ['day.ipynb', 1, 3, 'nb one', 'normal'],
          ['day.ipynb', 3, 1, 'nb two', 'inverted'],
        ],
      );
      assert.deepEqual(
        entries[0]!.diagnostics.map((d) => [d.severity, d.line, d.column]),
        [['warning', 7, 1]],
      );
      close(entries[1]!.beta!.value, -Math.LN2 / 10, 1e-12, 'β in a CRLF cell');
      // The CSV names the cell too (a line alone does not place a block in a notebook).
      writeFileSync(join(dir, 'plain.md'), fence('id: plain\ngap: 10 K\nratio: 0.5'));
      const rows = cli(['report', 'day.ipynb', 'plain.md', '-f', 'csv'], dir).out.trimEnd().split('\r\n');
      const head = rows[0]!.split(',');
      const at = (row: string, name: string): string => row.split(',')[head.indexOf(name)]!;
      assert.deepEqual(
        rows.slice(1).map((r) => [at(r, 'file'), at(r, 'cell'), at(r, 'line'), at(r, 'id')]),
        [
          ['day.ipynb', '1', '3', 'nb one'],
          ['day.ipynb', '3', '1', 'nb two'],
          ['plain.md', '', '1', 'plain'],
        ],
      );
    });

    it('reads a notebook’s spectrum files relative to its folder, and skips raw cells', () => {
      mkdirSync(join(dir, 'nb', 's'), { recursive: true });
      writeFileSync(join(dir, 'nb', 's', 'ok.csv'), 'ppm,y\n0,0\n1,1\n2,3\n3,1\n4,0\n');
      const src = fence(
        'id: nb spectrum\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  hyperpolarized: { spectrum: s/ok.csv, region: [0, 4], baseline: none }\n  thermal: 1',
      );
      writeFileSync(
        join(dir, 'nb', 'x.ipynb'),
        notebook([
          { cell_type: 'raw', source: lines(src) },
          { cell_type: 'markdown', source: lines(src) },
        ]),
      );
      const { code, entries } = report(['nb'], dir);
      assert.equal(code, 0);
      assert.deepEqual(
        entries.map((e) => [e.file, e.cell, e.line, e.spectra.map((x) => [x.file, x.integral?.value])]),
        [['nb/x.ipynb', 2, 1, [['s/ok.csv', 5]]]],
      );
    });

    it('takes non-ASCII names, spaces and links as given, each file once, in file then line order', () => {
      mkdirSync(join(dir, 'données été'));
      mkdirSync(join(dir, 'b'));
      mkdirSync(join(dir, 'empty'));
      writeFileSync(
        join(dir, 'données été', 'mesure n°1.md'),
        fence('id: é\ngap: 10 K\nratio: 0.5') + '\n' + fence('id: ü\ngap: 20 K\nratio: 0.5'),
      );
      writeFileSync(join(dir, 'données été', '日本 語.md'), fence('id: 日本\ngap: 10 K\nratio: 0.25'));
      writeFileSync(join(dir, 'b', 'a b.md'), fence('id: space\ngap: 10 K\nratio: 0.5'));
      symlinkSync(join('..', 'données été', 'mesure n°1.md'), join(dir, 'b', 'z link.md'));
      symlinkSync(join('..', 'b'), join(dir, 'données été', 'folder link'));
      const { code, entries } = report(['données été', 'b', 'données été', 'empty'], dir);
      assert.equal(code, 0);
      const ids = entries.map((e) => [e.file, e.line, e.id]);
      assert.deepEqual(ids, [
        // Inside a folder, names in order, links followed; the folder given twice, `b` (reached through
        // `folder link` already) and the note reached through `z link.md` first: each real file once, under the
        // name it was first reached by (docs/format.md, The JSON report).
        ['données été/folder link/a b.md', 1, 'space'],
        ['données été/folder link/z link.md', 1, 'é'],
        ['données été/folder link/z link.md', 7, 'ü'],
        ['données été/日本 語.md', 1, '日本'],
      ]);
      close(entries[3]!.beta!.value, Math.log(4) / 10, 1e-12, 'β');
      // An empty folder alone: an empty array, exit 0.
      const empty = cli(['report', 'empty', '-f', 'json'], dir);
      assert.equal(empty.code, 0);
      assert.deepEqual(JSON.parse(empty.out), []);
    });

    it('orders files as the paths are given, a folder’s notes by name in code-unit order, blocks by line', () => {
      mkdirSync(join(dir, 'd', 'sub'), { recursive: true });
      for (const n of ['b.md', 'B.md', 'a.md', 'sub/c.md', 'é.md', 'top.md'])
        writeFileSync(
          join(dir, n === 'top.md' ? '' : 'd', n),
          fence(`id: ${n}\ngap: 1 K\nratio: 0.5`) + '\n' + fence(`id: ${n} 2\ngap: 1 K\nratio: 0.5`),
        );
      const files = (args: string[]): [string, number][] => report(args, dir).entries.map((e) => [e.file, e.line]);
      const folder: [string, number][] = ['d/B.md', 'd/a.md', 'd/b.md', 'd/sub/c.md', 'd/é.md'].flatMap((f) => [
        [f, 1],
        [f, 7],
      ]);
      assert.deepEqual(files(['top.md', 'd', 'top.md']), [['top.md', 1], ['top.md', 7], ...folder]);
      assert.deepEqual(files(['d', 'top.md']), [...folder, ['top.md', 1], ['top.md', 7]]);
    });

    it('keeps every other file’s results next to files that cannot be read, and exits 2', () => {
      writeFileSync(join(dir, 'a good.md'), fence('id: good a\ngap: 10 K\nratio: 0.5'));
      writeFileSync(join(dir, 'z good.md'), fence('id: good z\ngap: 10 K\nratio: 0.5'));
      symlinkSync('nowhere.md', join(dir, 'm dangling.md'));
      spawnSync('mkfifo', [join(dir, 'p pipe.md')]);
      // A permission that root does not obey: checked only for another user.
      const asRoot = process.getuid?.() === 0;
      writeFileSync(join(dir, 'locked.md'), fence('id: locked\ngap: 1 K\nratio: 0.5'));
      chmodSync(join(dir, 'locked.md'), 0);
      const { code, entries } = report(['.', 'missing.md'], dir);
      assert.equal(code, 2, 'a path that could not be read is a usage error');
      const good = entries.filter((e) => e.id?.startsWith('good'));
      assert.deepEqual(
        good.map((e) => [e.file, e.status]),
        [
          ['a good.md', 'normal'],
          ['z good.md', 'normal'],
        ],
      );
      const unreadable = entries.filter((e) => codes(e).includes('file-unreadable'));
      const names = unreadable.map((e) => e.file);
      for (const n of ['m dangling.md', 'p pipe.md', 'missing.md', ...(asRoot ? [] : ['locked.md'])])
        assert.ok(names.includes(n), `${n} is reported`);
      for (const e of unreadable) {
        assert.deepEqual(
          [e.line, e.id, e.status, e.beta, e.temperature, e.polarization],
          [1, null, 'invalid', null, null, null],
        );
        assert.ok(e.diagnostics[0]!.message.includes(e.file), 'the message names the file');
      }
      // The same in the table and in check.
      assert.equal(cli(['report', '.', '--wide'], dir).code, 2);
      assert.equal(cli(['check', '.'], dir).code, 2);
    });

    it('exits 0 with warnings only, 1 with an error, 2 for a usage error', () => {
      writeFileSync(join(dir, 'w.md'), fence('id: w\ngap: 10 K\nratio: 0.5\nfoo: 1'));
      writeFileSync(join(dir, 'e.md'), fence('id: e\ngap: 10\nratio: 0.5'));
      assert.equal(cli(['report', 'w.md', '-f', 'json'], dir).code, 0);
      assert.equal(cli(['report', 'w.md', 'e.md', '-f', 'json'], dir).code, 1);
      assert.equal(cli(['check', 'w.md', 'e.md'], dir).code, 1);
      for (const args of [
        ['report', 'w.md', '--no-such-option'],
        ['report', 'w.md', '-f', 'yaml'],
        ['report', '-', '-'],
      ]) {
        const r = cli(args, dir);
        assert.equal(r.code, 2, args.join(' '));
        assert.equal(r.out, '');
      }
      // `-` reads standard input, reported as `-`.
      const stdin = cli(['report', '-', '-f', 'json'], dir, fence('gap: 10 K\nratio: 0.5'));
      assert.equal(stdin.code, 0);
      assert.deepEqual(
        (JSON.parse(stdin.out) as Entry[]).map((e) => [e.file, e.line, e.id]),
        [['-', 1, null]],
      );
    });
  });

  describe('spectra by file (v1.2)', () => {
    /** A Gaussian line at 171 ppm on a sloping baseline with a deterministic ripple, 150…250 ppm every 0.5 ppm. */
    const xs = Array.from({ length: 201 }, (_, i) => 150 + 0.5 * i);
    const yOf = (x: number, i: number): number =>
      1000 * Math.exp(-(((x - 171) / 1) ** 2) / 2) + 2 * x + 5 * Math.sin(i * 1.7);
    /** Y as written to the JCAMP file with YFACTOR 0.01: whole numbers of 0.01. */
    const ys = xs.map((x, i) => Math.round(yOf(x, i) / 0.01) * 0.01);

    /** The contract's integral: trapezoids of y less the `linear` baseline through the end centroids. */
    function integral(from: number, to: number, baseline: boolean): { value: number; n: number } {
      const pts = xs.map((x, i) => [x, ys[i]!] as const).filter(([x]) => x >= from - 1e-9 && x <= to + 1e-9);
      const n = pts.length;
      const m = Math.max(3, Math.ceil(0.02 * n));
      const mean = (a: readonly (readonly [number, number])[], k: 0 | 1): number =>
        a.reduce((s, p) => s + p[k], 0) / a.length;
      const [x1, y1, x2, y2] = [
        mean(pts.slice(0, m), 0),
        mean(pts.slice(0, m), 1),
        mean(pts.slice(-m), 0),
        mean(pts.slice(-m), 1),
      ];
      const base = (x: number): number => (baseline ? y1 + ((y2 - y1) * (x - x1)) / (x2 - x1) : 0);
      let v = 0;
      for (let k = 0; k + 1 < n; k++)
        v +=
          ((pts[k + 1]![0] - pts[k]![0]) * (pts[k]![1] - base(pts[k]![0]) + pts[k + 1]![1] - base(pts[k + 1]![0]))) / 2;
      return { value: v, n };
    }
    /** σ of the noise region: residual standard deviation of a least-squares line, divisor n − 2. */
    function noiseSigma(from: number, to: number): number {
      const pts = xs.map((x, i) => [x, ys[i]!] as const).filter(([x]) => x >= from && x <= to);
      const n = pts.length;
      const mx = pts.reduce((s, p) => s + p[0], 0) / n;
      const my = pts.reduce((s, p) => s + p[1], 0) / n;
      const sxx = pts.reduce((s, p) => s + (p[0] - mx) ** 2, 0);
      const slope = pts.reduce((s, p) => s + (p[0] - mx) * (p[1] - my), 0) / sxx;
      return Math.sqrt(pts.reduce((s, p) => s + (p[1] - my - slope * (p[0] - mx)) ** 2, 0) / (n - 2));
    }

    /** JCAMP-DX 4.24 `##XYPOINTS=(XY..XY)`, points stored high x first, XFACTOR 0.5, YFACTOR 0.01, CR LF lines. */
    const jcamp = (): string =>
      [
        '##TITLE= contract check, invented demo data',
        '##JCAMP-DX= 4.24',
        '##DATA TYPE= NMR SPECTRUM',
        '##XUNITS= PPM',
        '##YUNITS= ARBITRARY UNITS',
        '##.OBSERVE FREQUENCY= 100.6',
        '##XFACTOR= 0.5',
        '##YFACTOR= 0.01',
        '##FIRSTX= 250',
        '##LASTX= 150',
        '##NPOINTS= 201',
        '##XYPOINTS= (XY..XY)',
        ...xs.map((x, i) => `${Math.round(x / 0.5)}, ${Math.round(ys[i]! / 0.01)}`).reverse(),
        '##END=',
      ].join('\r\n') + '\r\n';

    it('integrates JCAMP-DX (CR LF, stored high to low, factors) and text files by the contract’s rules', () => {
      mkdirSync(join(dir, 'lab', 'spectres é'), { recursive: true });
      // As a Windows instrument may write it: CR LF line ends and a byte-order mark.
      writeFileSync(join(dir, 'lab', 'spectres é', 'run 12.jdx'), '\ufeff' + jcamp());
      writeFileSync(join(dir, 'lab', 'spectres é', 'run 12 lf.jdx'), jcamp().replace(/\r\n/g, '\n'));
      // Two-column text: BOM, a header naming the x unit, a comment, tabs, CR LF.
      writeFileSync(
        join(dir, 'lab', 'spectres é', 'thermal.tsv'),
        '\ufeffshift (ppm)\tintensity\r\n# invented demo data\r\n' + xs.map((x, i) => `${x}\t${ys[i]}\r\n`).join(''),
      );
      // No header, spaces, reversed: x is read in the region's unit.
      writeFileSync(
        join(dir, 'lab', 'spectres é', 'bare.txt'),
        xs
          .map((x, i) => `${x}   ${ys[i]}\n`)
          .reverse()
          .join(''),
      );
      // SQZ form of (X++(Y..Y)): @ = 0, A…I = 1…9 (JCAMP-DX, McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988)).
      writeFileSync(
        join(dir, 'lab', 'spectres é', 'sqz.dx'),
        '##TITLE= sqz\n##JCAMP-DX= 4.24\n##XUNITS= PPM\n##YUNITS= ARBITRARY UNITS\n##FIRSTX= 0\n##LASTX= 6\n##NPOINTS= 7\n##XFACTOR= 1\n##YFACTOR= 1\n##XYDATA= (X++(Y..Y))\n0 @ACEC\n5 A@\n##END=\n',
      );
      const block = (id: string, hp: string, th: string): string =>
        fence(
          `id: ${id}\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  hyperpolarized: ${hp}\n  thermal: ${th}\n  scans: { hyperpolarized: 1, thermal: 512 }`,
        );
      const dirName = 'spectres é';
      writeFileSync(
        join(dir, 'lab', 'note.md'),
        [
          block(
            'jdx',
            `{ spectrum: ${dirName}/run 12.jdx, region: [165 ppm, 177 ppm], noise: [200 ppm, 230 ppm] }`,
            `{ spectrum: ${dirName}/thermal.tsv, region: [177, 165], baseline: none }`,
          ),
          block(
            'hz and bare',
            // 165…177 ppm at 100.6 MHz: 16599…17806.2 Hz, converted to the file's ppm.
            `{ spectrum: ${dirName}/run 12 lf.jdx, region: [16599 Hz, 17806.2 Hz] }`,
            `{ spectrum: ${dirName}/bare.txt, region: [165 ppm, 177 ppm] }`,
          ),
          block('typed', String(integral(165, 177, true).value), String(integral(165, 177, false).value)),
          // Thermal written first; regions of 161 and 201 points: m = ⌈0.02 n⌉ = 4 and 5 points per centroid.
          fence(
            `id: wide\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  thermal: { spectrum: ${dirName}/thermal.tsv, region: [150, 250] }\n  hyperpolarized: { spectrum: ${dirName}/run 12.jdx, region: [160, 240] }`,
          ),
          fence(
            `id: default file\nspectrum: ${dirName}/sqz.dx\nseries:\n  model: decay\n  time: [0 s, 1 s, 2 s]\n  signal: [{ region: [0, 6], baseline: none }, { region: [0, 6], baseline: none }, 12]`,
          ),
        ].join('\n'),
      );
      const { code, entries } = report(['lab'], dir);
      assert.equal(code, 0, JSON.stringify(entries.map((e) => e.diagnostics)));
      const jdx = byId(entries, 'jdx');
      const hp = integral(165, 177, true);
      assert.deepEqual(
        jdx.spectra.map((s) => [s.key, s.file, s.region, s.unit, s.points]),
        [
          ['signal.hyperpolarized', `${dirName}/run 12.jdx`, [165, 177], 'ppm', hp.n],
          ['signal.thermal', `${dirName}/thermal.tsv`, [165, 177], 'ppm', hp.n],
        ],
      );
      close(jdx.spectra[0]!.integral!.value, hp.value, 1e-9, 'JCAMP integral less the linear baseline');
      close(jdx.spectra[0]!.integral!.uncertainty, noiseSigma(200, 230) * 0.5 * Math.sqrt(hp.n), 1e-9, 'σ·|Δx|·√n');
      close(jdx.spectra[1]!.integral!.value, integral(165, 177, false).value, 1e-9, 'text integral, no baseline');
      assert.equal(jdx.spectra[1]!.integral!.uncertainty, null);
      // The integral enters as the typed number would.
      const typed = byId(entries, 'typed');
      close(jdx.polarization!.value, typed.polarization!.value, 1e-9, 'P from the files = P from typed integrals');
      const hz = byId(entries, 'hz and bare');
      close(hz.spectra[0]!.region![0], 16599 / 100.6, 1e-12, 'region in the file’s unit');
      close(hz.spectra[0]!.region![1], 17806.2 / 100.6, 1e-12, 'region in the file’s unit');
      assert.equal(hz.spectra[0]!.unit, 'ppm');
      close(hz.spectra[0]!.integral!.value, hp.value, 1e-9, 'the CR LF and LF files read alike');
      close(hz.spectra[1]!.integral!.value, hp.value, 1e-9, 'a headerless file stored high to low');
      const wide = byId(entries, 'wide');
      assert.deepEqual(
        wide.spectra.map((x) => [x.key, x.points]),
        [
          ['signal.thermal', 201],
          ['signal.hyperpolarized', 161],
        ],
        'in the order of the block’s text',
      );
      close(wide.spectra[0]!.integral!.value, integral(150, 250, true).value, 1e-9, 'm = 5');
      close(wide.spectra[1]!.integral!.value, integral(160, 240, true).value, 1e-9, 'm = 4');
      const sqz = byId(entries, 'default file');
      // y = 0 1 3 5 3 1 0 at x = 0…6: trapezoids 0.5 + 2 + 4 + 4 + 2 + 0.5 = 13 (hand computed).
      assert.deepEqual(
        sqz.spectra.map((s) => [s.key, s.file, s.integral?.value, s.points]),
        [
          ['series.signal[0]', `${dirName}/sqz.dx`, 13, 7],
          ['series.signal[1]', `${dirName}/sqz.dx`, 13, 7],
        ],
      );
    });

    it('reports each spectrum error on its reference, with the file’s line, and the rest of the note still works', () => {
      mkdirSync(join(dir, 'n', 's'), { recursive: true });
      writeFileSync(join(dir, 'outside.csv'), 'ppm,y\n0,0\n1,1\n2,0\n');
      writeFileSync(join(dir, 'n', 's', 'hz.csv'), 'Hz,y\n0,0\n1,1\n2,3\n3,1\n4,0\n');
      writeFileSync(join(dir, 'n', 's', 'bad.csv'), 'ppm,y\n0,0\n1,1\nzz,3\n3,1\n');
      writeFileSync(join(dir, 'n', 's', 'ok.csv'), 'ppm,y\n0,0\n1,1\n2,3\n3,1\n4,0\n');
      // Lines ended by CR alone, as classic Mac OS wrote them.
      writeFileSync(join(dir, 'n', 's', 'old mac.csv'), '# invented demo data\rppm,y\r0,0\r1,1\r2,3\r3,1\r4,0\r');
      const one = (id: string, ref: string): string =>
        fence(`id: ${id}\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  hyperpolarized: ${ref}\n  thermal: 1`);
      writeFileSync(
        join(dir, 'n', 'errors.md'),
        [
          one('missing', '{ spectrum: s/none.csv, region: [0, 3] }'),
          one('malformed', '{ spectrum: s/bad.csv, region: [0, 3] }'),
          one('region', '{ spectrum: s/ok.csv, region: [0.5, 2.5] }'),
          one('beyond', '{ spectrum: s/ok.csv, region: [0, 9] }'),
          one('unit', '{ spectrum: s/hz.csv, region: [0 ppm, 4 ppm] }'),
          one('outside', '{ spectrum: ../outside.csv, region: [0, 2] }'),
          one('fine', '{ spectrum: s/ok.csv, region: [0, 4], baseline: none }'),
          one('cr only', '{ spectrum: s/old mac.csv, region: [0, 4], baseline: none }'),
        ].join('\n'),
      );
      const { code, entries } = report(['n'], dir);
      assert.equal(code, 1);
      const expect: [string, string][] = [
        ['missing', 'spectrum-missing'],
        ['malformed', 'spectrum-malformed'],
        ['region', 'spectrum-region'],
        ['beyond', 'spectrum-region'],
        ['unit', 'spectrum-unit'],
        ['outside', 'spectrum-outside'],
      ];
      for (const [id, c] of expect) {
        const e = byId(entries, id);
        assert.deepEqual(codes(e), [c], id);
        const d = e.diagnostics[0]!;
        // On the reference's range: line 7 of the block (`  hyperpolarized: {`), from column 21 on.
        assert.equal(d.line, e.line + 6, `${id}: the reference's line`);
        assert.ok(d.column >= 21, `${id}: inside the reference`);
        assert.deepEqual(e.spectra[0]!.integral, null);
      }
      assert.match(byId(entries, 'missing').diagnostics[0]!.message, /s\/none\.csv/);
      assert.match(byId(entries, 'malformed').diagnostics[0]!.message, /line 4/, 'the file’s own line');
      const fine = byId(entries, 'fine');
      assert.equal(fine.status, 'normal');
      // 0 1 3 1 0 at x = 0…4: trapezoids 0.5 + 2 + 2 + 0.5 = 5.
      assert.equal(fine.spectra[0]!.integral!.value, 5);
      assert.deepEqual(
        byId(entries, 'cr only').spectra.map((x) => [x.unit, x.integral?.value, x.points]),
        [['ppm', 5, 5]],
      );
    });
  });

  describe('runs by reference (v1.2)', () => {
    const REF = fence(
      'id: ref Monday\ndate: 2026-04-12\nsystem: 13C\nfield: 9.4 T\nlattice: 298 ± 3 K\nsignal:\n  thermal: 1000\n  scans: { thermal: 16 }\n  flip: { thermal: 30 deg }\n  noise: { thermal: 12 }',
    );
    const hpRun = (id: string, ref: string, more = ''): string =>
      fence(
        `id: ${id}\nsystem: 13C\nfield: 9.4 T\nsignal:\n  hyperpolarized: 50000 ± 500\n  thermal: { run: ${ref} }\n  flip: { hyperpolarized: 5 deg }${more}`,
      );

    it('takes a thermal reference across notes and notebooks, with every input uncertainty, and extrapolates', () => {
      mkdirSync(join(dir, 'refs'));
      mkdirSync(join(dir, 'runs'));
      writeFileSync(join(dir, 'refs', 'thermal day.ipynb'), notebook([{ cell_type: 'markdown', source: lines(REF) }]));
      writeFileSync(
        join(dir, 'runs', 'run.md'),
        hpRun(
          'run 1',
          '../refs/thermal day.ipynb#ref Monday',
          '\nextrapolate: { from: 42 s, to: 0 s, decay: 47.9 ± 1.2 s }',
        ),
      );
      writeFileSync(
        join(dir, 'runs', 'nb.ipynb'),
        notebook([{ cell_type: 'markdown', source: lines(hpRun('run 2', 'run.md#run 1')) }]),
      );
      // The referenced notebook is not named: it is read from disk, inside the folder tree given.
      const { code, entries } = report(['runs'], dir);
      const run1 = byId(entries, 'run 1');
      // `runs` alone: the reference leaves the folder tree given, so it is not followed.
      assert.equal(code, 1);
      assert.equal(run1.status, 'invalid');
      const all = report(['.'], dir);
      assert.equal(all.code, 0, JSON.stringify(all.entries.map((x) => x.diagnostics)));
      const ref = byId(all.entries, 'ref Monday');
      const dE = zeemanK(GAMMA_13C, 9.4);
      const pth = tanhP(dE, 298);
      // A reference block reports P = P_th, status normal; u(lattice) enters through P_th (GUM §5.1.2):
      // dP_th/dT = −sech²(ΔE/2kT)·ΔE/(2kT²).
      const dPdT = (-(1 / Math.cosh(dE / 596) ** 2) * dE) / (2 * 298 ** 2);
      assert.equal(ref.status, 'normal');
      close(ref.polarization!.value, pth, 1e-7, 'P = P_th');
      close(ref.polarization!.uncertainty, Math.abs(dPdT) * 3, 1e-6, 'u(P_th) from u(lattice)');
      const r1 = byId(all.entries, 'run 1');
      // P = P_th · (S_hp/S_th) · (NS_th sin θ_th)/(NS_hp sin θ_hp): the reference's scans, flip and lattice.
      const p = (pth * (50000 / 1000) * 16 * Math.sin(Math.PI / 6)) / Math.sin((5 * Math.PI) / 180);
      close(r1.polarization!.value, p, 1e-7, 'P by reference');
      // u(P)/P: the signal's ±, the reference's noise.thermal and u(P_th) from its lattice, added in quadrature.
      const uRel = Math.hypot(500 / 50000, 12 / 1000, (Math.abs(dPdT) * 3) / pth);
      close(r1.polarization!.uncertainty, p * uRel, 1e-5, 'u(P)');
      // P(to) = P(from)·exp((from − to)/T₁), u from u(P) and u(T₁).
      const e = Math.exp(42 / 47.9);
      assert.equal(r1.polarizationAt!.time, 0);
      close(r1.polarizationAt!.value, p * e, 1e-7, 'P(0 s)');
      close(
        r1.polarizationAt!.uncertainty,
        Math.hypot(e * p * uRel, ((p * e * 42) / 47.9 ** 2) * 1.2),
        1e-5,
        'u(P(0 s))',
      );
      // A run whose thermal side is itself taken by reference passes it on (the same signal, lattice and P_th).
      const r2 = byId(all.entries, 'run 2');
      assert.deepEqual(codes(r2), []);
      assert.equal(r2.cell, 1);
      close(r2.polarization!.value, p, 1e-12, 'P through two references');
    });

    it('carries P back along a T₁ fitted in another run, both uncertainties propagated', () => {
      const t = [0, 10, 20, 30, 40];
      const y = [1.0, 0.81, 0.66, 0.535, 0.435];
      writeFileSync(
        join(dir, 'decay.md'),
        [
          fence(
            `id: run 4 decay\nseries:\n  model: decay\n  time: [${t.map((x) => `${x} s`).join(', ')}]\n  signal: [${y.join(', ')}]`,
          ),
          fence(
            'id: run 4\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\npolarization: 0.2 ± 0.01\nextrapolate: { from: 42 s, to: 0 s, decay: { run: run 4 decay } }',
          ),
          fence(
            'id: not a decay\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\npolarization: 0.2\nextrapolate: { from: 42 s, to: 0 s, decay: { run: run 4 } }',
          ),
        ].join('\n'),
      );
      const { entries } = report(['decay.md'], dir);
      // Unweighted least squares of S = S₀ exp(−t/T₁) by Gauss–Newton from the log-linear fit; u(T₁) from the
      // covariance (JᵀJ)⁻¹ scaled by the residual variance SSR/(n − 2) (no uncertainties given).
      const n = t.length;
      const lt = t.reduce((a, b) => a + b, 0) / n;
      const ly = y.reduce((a, b) => a + Math.log(b), 0) / n;
      const sl =
        t.reduce((a, ti, i) => a + (ti - lt) * (Math.log(y[i]!) - ly), 0) / t.reduce((a, ti) => a + (ti - lt) ** 2, 0);
      let s0 = Math.exp(ly - sl * lt);
      let t1 = -1 / sl;
      let jtj = [0, 0, 0];
      for (let it = 0; it < 50; it++) {
        const [a, b, c, g0, g1] = t.reduce(
          (acc, ti, i) => {
            const e = Math.exp(-ti / t1);
            const d0 = e;
            const d1 = (s0 * e * ti) / t1 ** 2;
            const r = y[i]! - s0 * e;
            return [acc[0]! + d0 * d0, acc[1]! + d0 * d1, acc[2]! + d1 * d1, acc[3]! + d0 * r, acc[4]! + d1 * r];
          },
          [0, 0, 0, 0, 0],
        );
        const det = a! * c! - b! * b!;
        s0 += (c! * g0! - b! * g1!) / det;
        t1 += (a! * g1! - b! * g0!) / det;
        jtj = [a!, b!, c!];
      }
      const ssr = t.reduce((acc, ti, i) => acc + (y[i]! - s0 * Math.exp(-ti / t1)) ** 2, 0);
      const uT1 = Math.sqrt(((ssr / (n - 2)) * jtj[0]!) / (jtj[0]! * jtj[2]! - jtj[1]! ** 2));
      const decay = byId(entries, 'run 4 decay');
      close(decay.timeConstant!.value, t1, 1e-6, 'T₁');
      close(decay.timeConstant!.uncertainty, uT1, 1e-3, 'u(T₁)');
      const at = byId(entries, 'run 4').polarizationAt!;
      const f = Math.exp(42 / t1);
      close(at.value, 0.2 * f, 1e-6, 'P(0 s) = P(42 s)·exp(42 s/T₁)');
      close(at.uncertainty, Math.hypot(0.01 * f, ((0.2 * f * 42) / t1 ** 2) * uT1), 1e-3, 'u(P(0 s))');
      assert.deepEqual(codes(byId(entries, 'not a decay')), ['reference-kind']);
    });

    it('names each reference error with the contract’s code', () => {
      writeFileSync(
        join(dir, 'refs.md'),
        [
          REF,
          hpRun('unknown', 'ref Mondai'),
          fence(
            'id: other isotope\nsystem: 1H\nfield: 9.4 T\nsignal:\n  hyperpolarized: 5\n  thermal: { run: ref Monday }',
          ),
          fence(
            'id: other field\nsystem: 13C\nfield: 9.0 T\nsignal:\n  hyperpolarized: 5\n  thermal: { run: ref Monday }',
          ),
          hpRun('cycle a', 'cycle b'),
          hpRun('cycle b', 'cycle a'),
          fence('id: broken\nsystem: 13C\nfield: 9.4 X\nlattice: 298 K\nsignal:\n  thermal: 5'),
          hpRun('uses broken', 'broken'),
          fence('id: dup\ngap: 1 K\nratio: 0.5'),
          fence('id: typed P\nsystem: 13C\nfield: 9.4 T\npolarization: 0.1'),
          hpRun('uses typed P', 'typed P'),
        ].join('\n'),
      );
      writeFileSync(join(dir, 'dup.md'), fence('id: dup\ngap: 1 K\nratio: 0.5'));
      const { entries } = report(['refs.md', 'dup.md'], dir);
      const unknown = byId(entries, 'unknown');
      assert.deepEqual(codes(unknown), ['reference-unknown']);
      assert.match(unknown.diagnostics[0]!.message, /ref Monday/, 'did you mean');
      assert.deepEqual(codes(byId(entries, 'other isotope')), ['reference-mismatch']);
      const field = byId(entries, 'other field');
      assert.deepEqual(
        field.diagnostics.map((d) => [d.severity, d.code]),
        [['warning', 'reference-field']],
      );
      assert.notEqual(field.status, 'invalid');
      assert.deepEqual(codes(byId(entries, 'cycle a')), ['reference-cycle']);
      assert.deepEqual(codes(byId(entries, 'cycle b')), ['reference-cycle']);
      const uses = byId(entries, 'uses broken');
      assert.deepEqual(codes(uses), ['reference-invalid']);
      assert.match(uses.diagnostics[0]!.message, /broken/);
      // The referenced block lacks a thermal signal.
      assert.deepEqual(codes(byId(entries, 'uses typed P')), ['reference-kind']);
      // A repeated id: a warning on each copy, in either note.
      const dups = entries.filter((e) => e.id === 'dup');
      assert.equal(dups.length, 2);
      for (const d of dups)
        assert.deepEqual(
          d.diagnostics.map((x) => [x.severity, x.code]),
          [['warning', 'id-duplicate']],
        );
    });
  });

  describe('honest intervals (v1.2)', () => {
    it('clips P’s interval to [−1, 1], gives T the image of β’s, and none where β’s holds 0', () => {
      writeFileSync(
        join(dir, 'i.md'),
        [
          fence('id: clipped\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: 0.99 ± 0.01'),
          fence('id: skewed\ngap: 10 K\nratio: 0.8 ± 0.08'),
          fence('id: saturated\ngap: 10 K\nratio: 0.99 ± 0.02'),
          fence('id: plain\ngap: 10 K\nratio: 0.5'),
          fence('id: inverted\ngap: 10 K\nratio: 2 ± 0.1'),
        ].join('\n'),
      );
      const { entries } = report(['i.md'], dir);
      const c = byId(entries, 'clipped');
      close(c.polarization!.interval![0], 0.97, 1e-12, 'P − 2u');
      assert.equal(c.polarization!.interval![1], 1, 'clipped to 1');
      const s = byId(entries, 'skewed');
      // β = ln(1/0.8)/10 = 0.022314, u(β) = (0.08/0.8)/10 = 0.01: 2.2 u from 0.
      const beta = Math.log(1 / 0.8) / 10;
      const u = 0.1 / 10;
      close(s.beta!.uncertainty, u, 1e-9, 'u(β)');
      close(s.beta!.interval![0], beta - 2 * u, 1e-9, 'β low');
      close(s.temperature!.interval![0], 1 / (beta + 2 * u), 1e-9, 'T low = 1/(β + 2u)');
      close(s.temperature!.interval![1], 1 / (beta - 2 * u), 1e-9, 'T high = 1/(β − 2u)');
      assert.ok(
        s.temperature!.interval![1] - s.temperature!.value > 5 * (s.temperature!.value - s.temperature!.interval![0]),
        'skewed',
      );
      assert.equal(byId(entries, 'saturated').temperature!.interval, null);
      // Inverted: β = −ln 2/10 K, u(β) = (0.1/2)/10 K; T's interval is still the image of β's, low to high.
      const inv = byId(entries, 'inverted');
      const bi = -Math.LN2 / 10;
      const ui = 0.005;
      assert.equal(inv.status, 'inverted');
      close(inv.temperature!.interval![0], 1 / (bi + 2 * ui), 1e-9, 'T low');
      close(inv.temperature!.interval![1], 1 / (bi - 2 * ui), 1e-9, 'T high');
      const p = byId(entries, 'plain');
      for (const f of ['beta', 'temperature', 'polarization'] as const) {
        assert.equal(p[f]!.uncertainty, null);
        assert.equal(p[f]!.interval, null);
      }
    });
  });

  describe('text from the note at the edges of every output', () => {
    /** Formula starters, Markdown table syntax and HTML, and terminal controls, as a note could hold them. */
    const NASTY = [
      '=HYPERLINK("http://x")',
      '+1+1',
      '-2+3',
      '@SUM(A1)',
      '\tTAB',
      '\rCR',
      'pipe | `tick` <img src=x onerror=alert(1)>',
      'esc \u001b[2J\u001b[31mred',
      'osc \u001b]8;;http://evil\u001b\\link\u001b]8;;\u001b\\',
      'c1 \u009b31m \u0085 \u009d8;;x',
      'bidi \u202etxt.exe',
    ];
    /** Characters that must reach no output raw: C0 but the line ends, DEL, C1, and UAX #9's reordering ones. */
    // eslint-disable-next-line no-control-regex
    const RAW = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/;

    function write(): void {
      const q = (s: string): string => JSON.stringify(s);
      NASTY.forEach((s, i) => {
        const name = ['=f', '+f', '-f', '@f', '\tf', 'pipe|`f`<b>', 'esc\u001b[31mf', 'c1\u009bf', 'bidi\u202ef', 'f'][
          i % 10
        ]!;
        const body =
          fence(`id: ${q(s)}\nsample: ${q(s)}\ndate: ${q(s)}\ngap: 10 K\nratio: 0.5`) +
          '\n' +
          fence(
            `id: ${q('lines ' + s)}\ndetector: energy\nlines:\n` +
              [0, 1, 2]
                .map(
                  (k) =>
                    `  - { label: ${q(s + k)}, wavelength: ${500 + 10 * k} nm, upper: ${10 + k} eV, g: 3, A: 1e6, intensity: ${1000 * Math.exp(-k)} }`,
                )
                .join('\n'),
          );
        writeFileSync(join(dir, `${name} ${i}.md`), body);
      });
    }

    it('guards CSV fields against formulas and keeps controls out of it', () => {
      write();
      for (const format of ['csv', 'line-points']) {
        const r = cli(['report', '.', '-f', format], dir);
        assert.ok(!RAW.test(r.out.replace(/\r\n/g, '\n').replace(/\t/g, ' ')), `${format}: no control characters`);
        // Read the CSV (RFC 4180) and look at the first character of every field.
        const fields: string[] = [];
        let f = '';
        let quoted = false;
        for (let i = 0; i < r.out.length; i++) {
          const ch = r.out[i]!;
          if (quoted) {
            if (ch === '"' && r.out[i + 1] === '"') {
              f += '"';
              i++;
            } else if (ch === '"') quoted = false;
            else f += ch;
          } else if (ch === '"') quoted = true;
          else if (ch === ',' || ch === '\n') {
            fields.push(f.replace(/\r$/, ''));
            f = '';
          } else f += ch;
        }
        assert.ok(fields.length > 20);
        for (const x of fields)
          if (/^[=+\-@\t\r]/.test(x))
            assert.ok(
              /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(x),
              `${format}: unguarded field ${JSON.stringify(x)}`,
            );
        for (const s of ['=HYPERLINK', '+1+1', '@SUM(A1)'])
          assert.ok(
            fields.some((x) => x.startsWith(`'${s}`)),
            `${format}: ${s} kept, as text`,
          );
      }
    });

    it('escapes Markdown and HTML in the Markdown table, and controls everywhere a terminal may show', () => {
      write();
      const md = cli(['report', '.', '-f', 'markdown'], dir).out;
      assert.ok(!RAW.test(md), 'markdown: no control characters');
      for (const row of md.trim().split('\n').slice(2)) {
        // Cells split on unescaped pipes only: every row has as many as the header.
        const cells = row.split(/(?<!\\)\|/);
        assert.equal(cells.length, md.split('\n')[0]!.split('|').length, row);
        // The place is a code span (literal inside); the id has every Markdown character escaped.
        assert.match(cells[1]!.trim(), /^(`+).*\1$/, `place: ${row}`);
        assert.ok(!/(?<!\\)[<`[*_]/.test(cells[2]!), `id: ${row}`);
      }
      for (const args of [
        ['report', '.', '--wide'],
        ['report', '.'],
        ['check', '.'],
        ['report', '.', '-f', 'json'],
      ]) {
        const r = cli(args, dir);
        assert.ok(!RAW.test(r.out.replace(/\t/g, ' ')), `${args.join(' ')}: stdout`);
        assert.ok(!RAW.test(r.err), `${args.join(' ')}: stderr`);
      }
      // The JSON keeps every string whole (escaped, not dropped).
      const entries = report(['.'], dir).entries;
      for (const s of NASTY)
        assert.ok(
          entries.some((e) => e.id === s),
          `id ${JSON.stringify(s)} whole in JSON`,
        );
      assert.ok(entries.some((e) => e.file.includes('\u009b')) && entries.some((e) => e.file.includes('\u202e')));
    });

    it('keeps escape sequences from the command line out of its error messages', () => {
      writeFileSync(join(dir, 'ok.md'), fence('gap: 10 K\nratio: 0.5'));
      for (const args of [
        ['report', 'ok.md', '-f', 'x\u001b]8;;http://evil\u001b\\y'],
        ['report', 'ok.md', '-s', 'x\u009b2J\u202ey'],
        ['report', 'ok.md', '--\u001b[2J'],
        ['re\u001b[2Jport', 'ok.md'],
      ]) {
        const r = cli(args, dir);
        assert.equal(r.code, 2);
        assert.match(r.err, /^boltzmark: /);
        assert.ok(!RAW.test(r.err), `stderr of ${JSON.stringify(args)}: ${JSON.stringify(r.err)}`);
      }
      // A path that cannot be read is named in the report itself, neutralised too.
      const missing = cli(['report', 'ok.md', 'missing\u001b[2J.md'], dir);
      assert.equal(missing.code, 2);
      assert.match(missing.out, /missing\[2J\.md/);
      assert.ok(!RAW.test(missing.out + missing.err));
    });
  });
});

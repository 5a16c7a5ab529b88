import { strict as assert } from 'node:assert';
import { Analyzer, RunBook, type BlockReport } from '../../../src/core';
import { polarizationAtTime } from '../../../src/core/physics/decay';
import { close } from '../helpers';

const fence = (body: string): string => '```levels\n' + body + '\n```\n';

/** Analyses every note of a book as a host does and returns the blocks of one note. */
function blocksOf(notes: Record<string, string>, note: string): readonly BlockReport[] {
  const book = new RunBook();
  for (const [n, t] of Object.entries(notes)) book.setNote(n, t);
  return new Analyzer().analyzeText(notes[note]!, book.externalsFor(note)).blocks;
}

describe('runs by reference: physics', () => {
  describe('extrapolation along the exponential decay law', () => {
    // Check values: test/core/runs/reference/extrapolation.py, by hand in 40-digit decimals from the
    // exponential decay law (Bloch, Phys. Rev. 70, 460 (1946)) and GUM (JCGM 100:2008) eq. (10).
    it('P(0) from P(42 s) = 0.200 ± 0.004 and T₁ = 47.9 ± 1.2 s', () => {
      const at = polarizationAtTime(
        { value: 0.2, uncertainty: 0.004 },
        { value: 42, uncertainty: null },
        { value: 0, uncertainty: null },
        { value: 47.9, uncertainty: 1.2 },
      )!;
      close(at.value, 4.806522755824498e-1, 1e-13, 'P(0)');
      close(at.uncertainty, 1.42788848871487e-2, 1e-12, 'u(P(0))');
    });

    it('P(10 s) from P(40 s) = 0.150 ± 0.003 and T₁ = 30.0 ± 0.9 s, typed in a block', () => {
      const [r] = new Analyzer().analyzeText(
        fence(
          'system: 13C\nfield: 9.4 T\npolarization: 0.150 ± 0.003\nextrapolate: { from: 40 s, to: 10 s, decay: 30.0 ± 0.9 s }',
        ),
      ).blocks;
      assert.deepEqual(
        r!.problems.map((p) => p.code),
        [],
      );
      const at = r!.results!.polarizationAt!;
      assert.equal(at.time, 10);
      assert.equal(at.from, 40);
      assert.deepEqual(at.decay, { value: 30, uncertainty: 0.9, run: null });
      close(at.value, 4.077422742688568e-1, 1e-13, 'P(10 s)');
      close(at.uncertainty, 1.470135677050664e-2, 1e-12, 'u(P(10 s))');
    });

    it('is the identity for from = to, and decays forward in time', () => {
      const p = { value: 0.3, uncertainty: 0.01 };
      const t1 = { value: 20, uncertainty: 2 };
      const same = polarizationAtTime(p, { value: 5, uncertainty: null }, { value: 5, uncertainty: null }, t1)!;
      assert.equal(same.value, 0.3);
      close(same.uncertainty, 0.01, 1e-15, 'u unchanged: T₁ has no lever at zero distance');
      const later = polarizationAtTime(p, { value: 0, uncertainty: null }, { value: 20, uncertainty: null }, t1)!;
      close(later.value, 0.3 / Math.E, 1e-15, 'one T₁ later: P/e');
    });

    it('refuses T₁ ≤ 0 or not finite, and an overflow', () => {
      const p = { value: 0.3, uncertainty: null };
      const t = { value: 0, uncertainty: null };
      assert.equal(polarizationAtTime(p, t, t, { value: 0, uncertainty: null }), null);
      assert.equal(polarizationAtTime(p, t, t, { value: -1, uncertainty: null }), null);
      assert.equal(polarizationAtTime(p, t, t, { value: Infinity, uncertainty: null }), null);
      assert.equal(polarizationAtTime(p, { value: 1e6, uncertainty: null }, t, { value: 1, uncertainty: null }), null);
    });

    it('takes T₁ and its uncertainty from a decay run, as if typed', () => {
      // Invented decay data (about T₁ = 47.9 s, with a little deterministic scatter).
      const times = [0, 15, 30, 60, 90, 120, 180];
      const signal = times.map((t, i) => (1000 * Math.exp(-t / 47.9) * (1 + 0.01 * Math.sin(2.3 * i))).toFixed(2));
      const decay = fence(
        `id: run 4 decay\nseries:\n  model: decay\n  time: [${times.map((t) => `${t} s`).join(', ')}]\n  signal: [${signal.join(', ')}]`,
      );
      const run = (t1: string): string =>
        fence(
          `id: run 4\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2 ± 0.004\nextrapolate: { from: 42 s, to: 0 s, decay: ${t1} }`,
        );
      const [fitted] = blocksOf({ '/d/decay.md': decay }, '/d/decay.md');
      const t1 = fitted!.results!.series!.timeConstant;
      assert.ok(t1.uncertainty !== null && t1.uncertainty > 0);
      const [byRun] = blocksOf(
        { '/d/decay.md': decay, '/d/run.md': run('{ run: decay.md#run 4 decay }') },
        '/d/run.md',
      );
      const [typed] = blocksOf({ '/d/t.md': run(`${t1.value} ± ${t1.uncertainty} s`) }, '/d/t.md');
      assert.deepEqual(
        byRun!.problems.map((p) => p.code),
        [],
      );
      const a = byRun!.results!.polarizationAt!;
      const b = typed!.results!.polarizationAt!;
      assert.equal(a.decay.run, 'run 4 decay');
      assert.equal(a.value, b.value);
      assert.equal(a.uncertainty, b.uncertainty);
      const expected = polarizationAtTime(
        { value: 0.2, uncertainty: 0.004 },
        { value: 42, uncertainty: null },
        { value: 0, uncertainty: null },
        t1,
      )!;
      assert.equal(a.value, expected.value);
    });

    it('says when the decay run has no fitted decay', () => {
      const [r] = blocksOf(
        {
          '/d/x.md':
            fence('id: flat\nsystem: 13C\nfield: 9.4 T\npolarization: 0.1') +
            fence(
              'id: r\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2\nextrapolate: { from: 42 s, to: 0 s, decay: { run: flat } }',
            ),
        },
        '/d/x.md',
      ).slice(1);
      assert.deepEqual(
        r!.problems.map((p) => p.code),
        ['reference-kind'],
      );
    });
  });

  describe("the reference's field uncertainty", () => {
    // GUM (JCGM 100:2008) eq. (10): P = P_th(B_ref, T)·(S_hp/S_th)·factor, and at 298 K P_th is linear in B
    // to better than 1e-9 (tanh x ≈ x for x ≈ 4e-6; high-temperature limit, common practice, no source), so
    // B_ref's share of u(P) is P·u(B)/B and it adds in quadrature to the signals' share.
    it('enters u(P) of a block that takes its thermal reference by run, as a budget line of its own', () => {
      const ref = (field: string): string =>
        fence(`id: ref field\nsystem: 13C\nfield: ${field}\nlattice: 298 K\nsignal:\n  thermal: 1.08e3 ± 12`);
      const run = fence(
        'id: run field\nsystem: 13C\nfield: 9.4 T\nsignal:\n  hyperpolarized: 2.985e4 ± 30\n  thermal: { run: ref field }',
      );
      const exact = blocksOf({ 'a.md': ref('9.4 T') + run }, 'a.md')[1]!;
      const stated = blocksOf({ 'a.md': ref('9.4 ± 0.047 T') + run }, 'a.md')[1]!;
      assert.deepEqual(
        stated.problems.map((p) => p.code),
        [],
      );
      const p = stated.results!.polarization!;
      close(p.value, exact.results!.polarization!.value, 1e-12, 'the same P');
      const line = stated.results!.budget.find((l) => l.source === 'reference-spacing');
      assert.ok(line, 'a budget line for the reference field');
      close(line.polarization!, p.value * (0.047 / 9.4), 1e-6, "u(P) share of the reference's field");
      const uExact = exact.results!.polarization!.uncertainty!;
      close(p.uncertainty!, Math.hypot(uExact, p.value * (0.047 / 9.4)), 1e-6, 'added in quadrature');
    });
  });

  describe('a thermal reference by run gives exactly what the same numbers typed in place give', () => {
    // Invented numbers; the equality is the check.
    const reference = fence(`id: ref-13C Monday
date: 2026-04-12
system: 13C
field: 9.4 T
lattice: 298.15 ± 0.5 K
signal:
  thermal: 1.08e3
  scans: { thermal: 16 }
  flip: { thermal: 90 deg }
  gain: { thermal: 2 }
  amount: { thermal: 1.1 }
  noise: { thermal: 12 }`);
    const byRun = fence(`id: run 7
system: 13C
field: 9.4 T
signal:
  hyperpolarized: 2.985e4
  thermal: { run: ref.md#ref-13C Monday }
  flip: { hyperpolarized: 5 deg }
  noise: { hyperpolarized: 60 }`);
    const typed = fence(`id: run 7
system: 13C
field: 9.4 T
lattice: 298.15 ± 0.5 K
signal:
  hyperpolarized: 2.985e4
  thermal: 1.08e3
  scans: { thermal: 16 }
  flip: { hyperpolarized: 5 deg, thermal: 90 deg }
  gain: { thermal: 2 }
  amount: { thermal: 1.1 }
  noise: { hyperpolarized: 60, thermal: 12 }`);

    it('for P, β, T, P_th, ε, their uncertainties, intervals and budget', () => {
      const [a] = blocksOf({ '/lab/ref.md': reference, '/lab/run7.md': byRun }, '/lab/run7.md');
      const [b] = new Analyzer().analyzeText(typed).blocks;
      assert.deepEqual(
        a!.problems.map((p) => p.code),
        [],
      );
      const ra = a!.results!;
      const rb = b!.results!;
      for (const k of ['beta', 'temperature', 'polarization', 'intervals'] as const) assert.deepEqual(ra[k], rb[k], k);
      for (const k of [
        'thermalPolarization',
        'uThermalPolarization',
        'enhancement',
        'uEnhancement',
        'entropy',
      ] as const)
        assert.equal(ra[k], rb[k], k);
      assert.deepEqual(
        ra.budget.map((l) => [l.source, l.polarization]),
        rb.budget.map((l) => [l.source, l.polarization]),
      );
      // Both blocks' uncertainties are in: the signals' noise (measurement) and the reference's u(lattice).
      assert.deepEqual(
        ra.budget.map((l) => l.source),
        ['measurement', 'lattice'],
      );
      assert.equal(ra.signal!.factor, rb.signal!.factor);
      assert.equal(ra.signal!.thermalRun!.id, 'ref-13C Monday');
      assert.equal(ra.signal!.thermalRun!.date, '2026-04-12');
    });

    it('the reference block reports P = P_th, status normal', () => {
      const [r] = blocksOf({ '/lab/ref.md': reference }, '/lab/ref.md');
      assert.deepEqual(
        r!.problems.map((p) => p.code),
        [],
      );
      assert.equal(r!.status, 'normal');
      assert.equal(r!.results!.polarization!.value, r!.results!.thermalPolarization);
      // P_th(13C, 9.4 T, 298.15 K) = 8.101403e-6: Brillouin (tanh) form with IUPAC 2001 γ(13C) (Harris et al.,
      // Pure Appl. Chem. 73, 1795 (2001)) and the exact h, k of the SI, as in test/core/measurements.test.ts.
      close(r!.results!.polarization!.value, 8.101403e-6, 1e-6, 'P = P_th');
      close(r!.results!.temperature!.value, 298.15, 1e-9, 'T = lattice');
      assert.equal(r!.results!.signal!.thermalOnly, true);
    });

    it('warns about thermal sides written next to a reference by run, and uses the run’s', () => {
      const [r] = blocksOf(
        {
          '/lab/ref.md': reference,
          '/lab/run7.md': byRun.replace(
            'noise: { hyperpolarized: 60 }',
            'noise: { hyperpolarized: 60, thermal: 1 }\nlattice: 77 K',
          ),
        },
        '/lab/run7.md',
      );
      const [b] = new Analyzer().analyzeText(typed).blocks;
      assert.deepEqual(
        r!.problems.map((p) => p.code),
        ['reference-shadowed', 'reference-shadowed'],
      );
      assert.deepEqual(r!.results!.polarization, b!.results!.polarization);
    });

    it('warns when the reference’s field differs by more than 1 %', () => {
      const [r] = blocksOf(
        { '/lab/ref.md': reference, '/lab/run7.md': byRun.replace('field: 9.4 T', 'field: 9.6 T') },
        '/lab/run7.md',
      );
      const p = r!.problems.find((x) => x.code === 'reference-field');
      assert.ok(p, r!.problems.map((x) => x.code).join());
      assert.match(p.message, /9\.4 T.*9\.6 T/);
      // P_th is the reference's own (its field and lattice): the same P as with the field matched.
      const [same] = blocksOf({ '/lab/ref.md': reference, '/lab/run7.md': byRun }, '/lab/run7.md');
      assert.equal(r!.results!.signal!.pThermal, same!.results!.signal!.pThermal);
    });
  });
});

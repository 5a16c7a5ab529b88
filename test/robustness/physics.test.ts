import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import {
  Analyzer,
  betaAtEnergy,
  finiteNCurve,
  schemeCurve,
  thermalStateAtEnergy,
  zeemanSpacingKelvin,
  lookupSpecies,
  type BlockReport,
} from '../../src/core';
import { runs } from './seed';

// Physics invariants as properties. The populations are generated here,
// independently of the core: n_i = g_i exp(−β (E_i − E_ref)), with E_ref the
// level that keeps every exponent ≤ 0 (the Boltzmann distribution, e.g.
// Kittel & Kroemer, Thermal Physics, 2nd ed., 1980, ch. 3; negative β as in
// their Appendix E), and written with String(), which round-trips doubles.

function analyse(body: string): BlockReport {
  const blocks = new Analyzer().analyzeText(`\`\`\`levels\n${body}\n\`\`\`\n`).blocks;
  assert.equal(blocks.length, 1);
  return blocks[0]!;
}

/** |a − b| within `rel` of the scale (a value of β, plus 1/span so that β near 0 is judged on the scheme's own scale). */
function close(a: number, b: number, rel: number, scale: number, what: string): void {
  assert.ok(Math.abs(a - b) <= rel * scale, `${what}: ${a} vs ${b} (Δ = ${Math.abs(a - b)}, allowed ${rel * scale})`);
}

/** Boltzmann populations at β (either sign) of levels E (K) with degeneracies g. */
function populations(energies: readonly number[], g: readonly number[], beta: number): number[] {
  const ref = beta >= 0 ? Math.min(...energies) : Math.max(...energies);
  return energies.map((e, i) => g[i]! * Math.exp(-beta * (e - ref)));
}

/** Distinct level energies: k_i · span/1000 for distinct integers k_i in [0, 1000], so gaps are at least span/1000. */
const scheme = fc
  .tuple(
    fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
    fc.uniqueArray(fc.integer({ min: 0, max: 1000 }), { minLength: 2, maxLength: 8 }),
    fc.array(fc.integer({ min: 1, max: 5 }), { minLength: 8, maxLength: 8 }),
  )
  .filter(([, ks]) => Math.max(...ks) > Math.min(...ks))
  .map(([span, ks, gs]) => ({ energies: ks.map((k) => (k * span) / 1000), g: gs.slice(0, ks.length) }));

/** β·span in [−600, 600] (both signs, and ±0): every population stays a normal double. */
const reducedBeta = fc.oneof(
  fc.constantFrom(0, -0, 1e-12, -1e-12, 600, -600),
  fc.double({ min: -600, max: 600, noNaN: true }),
);

describe('robustness: physics invariants as properties', function () {
  this.timeout(120000);

  it('analyses populations generated at any β, positive or negative, back to that β', () => {
    fc.assert(
      fc.property(scheme, reducedBeta, ({ energies, g }, x) => {
        const span = Math.max(...energies) - Math.min(...energies);
        const beta = x / span;
        const n = populations(energies, g, beta);
        const body =
          energies.length === 2 && g[0] === g[1] && energies[0]! < energies[1]!
            ? `gap: ${energies[1]! - energies[0]!} K\npopulations: [${n[0]}, ${n[1]}]`
            : ['levels:', ...energies.map((e, i) => `  - { energy: ${e} K, g: ${g[i]}, population: ${n[i]} }`)].join(
                '\n',
              );
        const b = analyse(body);
        assert.ok(b.results?.beta, `${b.status}: ${b.problems.map((p) => p.code).join(', ')}`);
        close(b.results.beta.value, beta, 1e-9, Math.abs(beta) + 1 / span, 'β');
        const expected = beta > 0 ? 'normal' : beta < 0 ? 'inverted' : 'saturated';
        if (Math.abs(x) > 1e-9) assert.equal(b.status, expected);
      }),
      runs(500),
    );
  });

  it('analyses a spin-1/2 polarization generated at any β back to that β', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-3, max: 30, noNaN: true }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        (field, x) => {
          const species = lookupSpecies('1H');
          assert.ok('species' in species);
          const gap = zeemanSpacingKelvin(species.species, field);
          const beta = (2 * x) / gap;
          const p = Math.tanh((beta * gap) / 2);
          const b = analyse(`system: 1H\nfield: ${field} T\npolarization: ${p}`);
          assert.ok(b.results?.beta, b.problems.map((q) => q.code).join(', '));
          close(b.results.beta.value, beta, 1e-9, Math.abs(beta) + 1 / gap, 'β');
        },
      ),
      runs(300),
    );
  });

  it('negates β when the two populations are swapped', () => {
    const population = fc.oneof(
      fc.constantFrom(5e-324, 1e-300, 1, 1e300, 1.7976931348623157e308),
      fc.double({ min: 1e-300, max: 1e300, noNaN: true }),
    );
    fc.assert(
      fc.property(
        fc.double({ min: 1e-9, max: 1e9, noNaN: true }),
        population,
        population,
        fc.option(population, { nil: undefined }),
        (gap, a, c, u) => {
          const body = (x: number, y: number): string =>
            `gap: ${gap} K\npopulations: [${x}${u ? ` ± ${u}` : ''}, ${y}${u ? ` ± ${u}` : ''}]`;
          const one = analyse(body(a, c)).results?.beta;
          const other = analyse(body(c, a)).results?.beta;
          assert.ok(one && other, 'both read');
          assert.equal(other.value, -one.value + 0);
          assert.equal(other.uncertainty, one.uncertainty);
        },
      ),
      runs(300),
    );
  });

  it('has S(E) symmetric and β(E) antisymmetric about the midpoint for two levels of equal degeneracy', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 1e6, noNaN: true }),
        fc.integer({ min: 1, max: 7 }),
        fc.double({ min: 1e-9, max: 1 - 1e-9, noNaN: true }),
        (gap, g, f) => {
          // E and gap − E are exact mirrors about gap/2 (gap − E is exact for gap/2 ≤ E ≤ gap, Sterbenz's lemma).
          const e = gap / 2 + (f * gap) / 2;
          const up = thermalStateAtEnergy([0, gap], [g, g], e);
          const down = thermalStateAtEnergy([0, gap], [g, g], gap - e);
          assert.ok(up && down);
          close(up.entropy, down.entropy, 1e-9, 1, 'S');
          // Near the top level ⟨E⟩ is held to one ulp of the gap, not of the distance d to the top; β = ln((gap − E)/E)/gap
          // then moves by |dβ/dE| = (1/d + 1/(gap − d))/gap per unit of E, which bounds what symmetry can mean there.
          const d = gap - e;
          const conditioning = (4 * Number.EPSILON * gap * (1 / d + 1 / (gap - d))) / gap;
          assert.ok(
            Math.abs(up.beta + down.beta) <= 1e-9 * (Math.abs(down.beta) + 1 / gap) + conditioning,
            `β: ${up.beta} vs ${-down.beta}`,
          );
          for (const p of schemeCurve([0, gap], [g, g], { points: 60 }) ?? []) {
            const mirror = thermalStateAtEnergy([0, gap], [g, g], gap - p.energy);
            if (mirror) close(mirror.entropy, p.entropy, 1e-9, 1, `S at E = ${p.energy}`);
          }
        },
      ),
      runs(200),
    );
  });

  it('has the exact finite-N entropy symmetric under m → N − m', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e12 }), (n) => {
        const curve = finiteNCurve(n, 1);
        assert.ok(curve);
        const byM = new Map(curve.map((p) => [p.m, p]));
        for (const p of curve) {
          const q = byM.get(n - p.m);
          if (q) close(q.entropy, p.entropy, 1e-12, 1, `S(${p.m}) vs S(${n - p.m})`);
          if (q) assert.equal(q.beta, -p.beta + 0);
        }
      }),
      runs(100),
    );
  });

  it('has β(E) decreasing with the energy, for any level scheme', () => {
    fc.assert(
      fc.property(
        scheme,
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        ({ energies, g }, u, v) => {
          const lo = Math.min(...energies);
          const span = Math.max(...energies) - lo;
          const curve = schemeCurve(energies, g, { points: 120 });
          assert.ok(curve);
          for (let i = 1; i < curve.length; i++) {
            assert.ok(curve[i]!.energy >= curve[i - 1]!.energy, 'the curve runs up in energy');
            assert.ok(curve[i]!.beta < curve[i - 1]!.beta, `β falls along the curve (point ${i})`);
          }
          const [e1, e2] = [lo + Math.min(u, v) * span, lo + Math.max(u, v) * span];
          const b1 = betaAtEnergy(energies, g, e1);
          const b2 = betaAtEnergy(energies, g, e2);
          if (b1 === null || b2 === null) return; // an end of the spectrum: β = ±∞
          assert.ok(b1 >= b2, `β(${e1}) = ${b1} < β(${e2}) = ${b2}`);
          if (e2 - e1 > 1e-6 * span) assert.ok(b1 > b2, `β(${e1}) = ${b1} is not above β(${e2}) = ${b2}`);
        },
      ),
      runs(300),
    );
  });
});

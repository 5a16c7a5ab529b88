import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

// The `line-outlier` warning reads as whole sentences in both directions: below the line (self-absorption, or a
// wrong A or g) and above it (a blend, or a wrong A or g), each with its closing mark.

/** E/k per eV (CODATA 2018: e / k_B = 11 604.518 12 K/eV, exact). */
const KELVIN_PER_EV = 11604.51812;

/** Twelve invented lines of one invented species: upper energies in eV, g and A chosen freely. */
const LINES = Array.from({ length: 12 }, (_, i) => ({ E: 12 + 0.3 * i, g: 1 + (i % 4) * 2, A: 1e7 * (1 + (i % 5)) }));

/**
 * Photon counts of optically thin lines at 9000 K, N ∝ g A e^(−E/kT) (Griem 1997, ch. 6), scaled to 10⁶ for the
 * strongest; line 3 loses 40 % (self-absorption) and line 8 gains 60 % (a blend).
 */
function note(): string {
  const thin = LINES.map((l) => l.g * l.A * Math.exp((-l.E * KELVIN_PER_EV) / 9000));
  const scale = 1e6 / Math.max(...thin);
  const counts = thin.map((c, i) => c * scale * (i === 3 ? 0.6 : i === 8 ? 1.6 : 1));
  const rows = LINES.map(
    (l, i) => `  - { label: L${i}, upper: ${l.E} eV, g: ${l.g}, A: ${l.A}, intensity: ${counts[i]!.toFixed(1)} }`,
  );
  return `\`\`\`levels\ndetector: photon\nlines:\n${rows.join('\n')}\n\`\`\`\n`;
}

describe('boltzmark report: the line-outlier message', () => {
  it('says in full, with its closing mark, why a line lies below or above the refitted line', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-outlier-'));
    try {
      writeFileSync(join(dir, 'lines.md'), note());
      let out = '';
      main(['report', 'lines.md', '-f', 'json'], { out: (s) => (out += s), err: () => undefined, cwd: dir });
      const [entry] = JSON.parse(out) as { diagnostics: { code: string; message: string; line: number }[] }[];
      const outliers = entry!.diagnostics.filter((d) => d.code === 'line-outlier');
      // L3 is on line 7 of the note (after the fence, `detector:` and `lines:`), L8 on line 12.
      assert.deepEqual(
        outliers.map((d) => d.line),
        [7, 12],
      );
      const sentence =
        /^This line lies \d+\.\d σ (below|above) the line refitted without the flagged lines \(more than 3 σ\): (.*)$/;
      const [below, above] = outliers.map((d) => sentence.exec(d.message));
      assert.equal(below?.[1], 'below', outliers[0]!.message);
      assert.equal(below?.[2], 'self-absorption pulls a line below, and so can a wrong A or g.');
      assert.equal(above?.[1], 'above', outliers[1]!.message);
      assert.equal(above?.[2], 'a blend, or a wrong A or g?');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

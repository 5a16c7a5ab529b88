// The format writes a spectrum's path with `/` between folders (notebook-format.md, "A spectrum in place of a
// number": "path of the file, relative to the note's folder, `/` as separator"). A `\` is a folder on one system
// and part of a file's name on another, so every host gives the same answer: an error on the path, with the
// path written with `/` as a fix, before any file is looked for.
import { strict as assert } from 'node:assert';
import { applyFirstFix } from '../helpers';
import { csv, MemoryFolder } from '../spectra/helpers';

const HEAD = 'system: 13C\nfield: 9.4 T\nlattice: 298 K\n';

function at(text: string, span: { start: number; end: number }): string {
  return text.slice(span.start, span.end);
}

describe('spectrum paths written with a backslash', () => {
  // A triangle line on 160…180 ppm in 0.5 ppm steps (generated for the test).
  const x = Array.from({ length: 41 }, (_, i) => 160 + i * 0.5);
  const folder = new MemoryFolder().set(
    'spectra/hp.csv',
    csv(
      x,
      x.map((v) => Math.max(0, 5 - Math.abs(v - 171))),
    ),
  );

  it('is an error on the path, whatever the host would find there, with the path in `/` as the fix', () => {
    const { report, text } = folder.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: spectra\\hp.csv, region: [165 ppm, 177 ppm] }\n  thermal: 800`,
    );
    const p = report.problems.filter((x) => x.code === 'spectrum-reference');
    assert.equal(p.length, 1, JSON.stringify(report.problems));
    assert.equal(p[0]!.severity, 'error');
    assert.equal(at(text, p[0]!.span), 'spectra\\hp.csv');
    assert.match(p[0]!.message, /`\/` between folders/);
    assert.equal(p[0]!.fixes?.[0]?.newText, 'spectra/hp.csv');
    assert.ok(!report.problems.some((x) => x.code === 'spectrum-missing' || x.code === 'spectrum-outside'));
    assert.equal(report.status, 'invalid');
  });

  it('reads the file once the fix is taken', () => {
    const body = `${HEAD}signal:\n  hyperpolarized: { spectrum: spectra\\hp.csv, region: [165 ppm, 177 ppm] }\n  thermal: 800`;
    const fixed = applyFirstFix(body, 'spectrum-reference');
    assert.ok(fixed.includes('spectrum: spectra/hp.csv'), fixed);
    const { report } = folder.block(fixed);
    assert.deepEqual(
      report.problems.filter((x) => x.severity === 'error'),
      [],
    );
    assert.equal(report.meta.spectra![0]!.result!.points, 25);
  });

  it('offers no fix for a quoted path, where the written text is not the path', () => {
    const { report } = folder.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: "spectra\\\\hp.csv", region: [165 ppm, 177 ppm] }\n  thermal: 800`,
    );
    const p = report.problems.find((x) => x.code === 'spectrum-reference')!;
    assert.deepEqual(p.fixes ?? [], []);
  });
});

/**
 * Spectrum references in blocks: the integral enters as the typed number
 * would, every error of the contract on its range, the block default, the
 * dependency stamps that make a changed file read again, and a file parsed once.
 */
import { strict as assert } from 'node:assert';
import { Analyzer, spectraEntries, spectrumUseLines, type Externals } from '../../../src/core';
import { block, close } from '../helpers';
import { csv, MemoryFolder } from '../spectra/helpers';

/** A Gaussian line on a ppm axis, 0…250 ppm in 0.05 ppm steps, written from high to low ppm as NMR files are. */
function line(height: number, centre = 171, sigma = 0.4, noise: (i: number) => number = () => 0): string {
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i <= 5000; i++) {
    const v = 250 - i * 0.05;
    x.push(Number(v.toFixed(2)));
    y.push(height * Math.exp(-((v - centre) ** 2) / (2 * sigma ** 2)) + noise(i));
  }
  return csv(x, y);
}
/** ∫ h exp(−x²/2σ²) dx = h σ √(2π) (a standard integral). */
const area = (h: number, sigma = 0.4): number => h * sigma * Math.sqrt(2 * Math.PI);

/** A deterministic ±1 pseudo-noise (a linear congruential sequence, Numerical Recipes' constants). */
function lcg(seed: number): (i: number) => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 31 - 1;
  };
}

const HEAD = 'system: 13C\nfield: 9.4 T\nlattice: 298 K\n';

function at(text: string, span: { start: number; end: number }): string {
  return text.slice(span.start, span.end);
}

describe('spectrum references in a signal block', () => {
  const folder = new MemoryFolder().set('spectra/hp.csv', line(2.0e5)).set('spectra/th.csv', line(800));

  it('gives the same P as the typed integrals, and the ratio of the generated areas', () => {
    const body = `${HEAD}signal:\n  hyperpolarized: { spectrum: spectra/hp.csv, region: [165 ppm, 177 ppm] }\n  thermal: { spectrum: spectra/th.csv, region: [165 ppm, 177 ppm] }\n  scans: { hyperpolarized: 1, thermal: 64 }`;
    const { report } = folder.block(body);
    assert.deepEqual(report.problems, []);
    const uses = report.meta.spectra!;
    assert.deepEqual(
      uses.map((u) => [u.key, u.file, u.result?.points, u.result?.unit]),
      [
        ['signal.hyperpolarized', 'spectra/hp.csv', 241, 'ppm'],
        ['signal.thermal', 'spectra/th.csv', 241, 'ppm'],
      ],
    );
    // ±6 ppm is ±15σ: the Gaussian is whole inside, and its tails leave the linear baseline at zero.
    close(uses[0]!.result!.value, area(2.0e5), 1e-9, 'S_hp');
    close(uses[1]!.result!.value, area(800), 1e-9, 'S_th');
    const typed = block(
      `${HEAD}signal:\n  hyperpolarized: ${uses[0]!.result!.value}\n  thermal: ${uses[1]!.result!.value}\n  scans: { hyperpolarized: 1, thermal: 64 }`,
    ).report;
    assert.equal(report.results!.polarization!.value, typed.results!.polarization!.value);
    // P = P_th · (S_hp/S_th) · (NS_th/NS_hp) (docs/format.md, common practice, no source).
    close(report.results!.polarization!.value, typed.results!.thermalPolarization! * (2.0e5 / 800) * 64, 1e-9, 'P');
  });

  it('takes the uncertainty from a noise region, σ·Δx·√n', () => {
    const f = new MemoryFolder().set('n.csv', line(1000, 171, 0.4, lcg(3)));
    const body = `${HEAD}signal:\n  hyperpolarized: { spectrum: n.csv, region: [165 ppm, 177 ppm], noise: [200 ppm, 240 ppm] }\n  thermal: 10`;
    const { report } = f.block(body);
    const r = report.meta.spectra![0]!.result!;
    assert.equal(r.noisePoints, 801);
    // Uniform on (−1, 1) has σ = 1/√3 (common knowledge of the uniform distribution); 801 draws know it to ~3 %.
    close(r.sigma, 1 / Math.sqrt(3), 0.1, 'σ');
    close(r.uncertainty, r.sigma! * 0.05 * Math.sqrt(241), 1e-9, 'u');
    assert.ok(report.results!.polarization!.uncertainty! > 0);
    // With the baseline's own noise: the integral is Σ c_k y_k; 241 points at Δx = 0.05 ppm, L = 12 ppm, m = 5 at
    // each end and t = 1/2, so the 5 points of each centroid lose L/(2·5) = 1.2 from their trapezoid weight
    // (Δx/2 at the two ends, Δx elsewhere) and u = σ·√(Σ c_k²) (GUM JCGM 100:2008 eq. (10)).
    const dx = 0.05;
    const sum = 231 * dx ** 2 + 2 * ((dx / 2 - 1.2) ** 2 + 4 * (dx - 1.2) ** 2);
    close(r.uncertaintyWithBaseline, r.sigma! * Math.sqrt(sum), 1e-9, 'u with the baseline');
    const shown = spectrumUseLines(report.meta.spectra![0]!);
    assert.equal(shown.length, 5);
    assert.match(shown[0]!, /^signal\.hyperpolarized = [\d.]+ ± [\d.]+ \(y × ppm\)$/);
    assert.equal(shown[1], '241 points in 165 … 177 ppm, linear baseline');
    assert.match(shown[2]!, /^noise σ = 0\.5\d+ from 801 points in 200 … 240 ppm$/);
    assert.match(shown[3]!, /^with the linear baseline's own noise, u = [\d.]+; the u above, the format's, counts/);
    assert.equal(shown[4], 'file: n.csv');
  });

  it('converts a region in Hz to a ppm file through the JCAMP-DX observe frequency, and refuses it without one', () => {
    const jdx = [
      '##TITLE= hz',
      '##JCAMP-DX= 4.24',
      '##DATA TYPE= NMR SPECTRUM',
      '##XUNITS= PPM',
      '##YUNITS= ARBITRARY UNITS',
      '##.OBSERVE FREQUENCY= 100.0',
      '##FIRSTX= 10',
      '##LASTX= 0',
      '##NPOINTS= 11',
      '##XFACTOR= 1',
      '##YFACTOR= 1',
      '##XYDATA=(X++(Y..Y))',
      '10 0 0 0 1 2 3 2 1 0 0 0',
      '##END=',
    ].join('\n');
    const f = new MemoryFolder().set('a.jdx', jdx).set('b.csv', 'ppm,y\n1,1\n2,2\n3,3\n4,4\n');
    const ok = f.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: a.jdx, region: [300 Hz, 900 Hz], baseline: none }\n  thermal: 1`,
    );
    assert.deepEqual(ok.report.problems, []);
    // 300…900 Hz at 100 MHz is 3…9 ppm, where y = 1 2 3 2 1 0 0 (x = 3…9, 1 ppm steps): the trapezoids
    // give 1.5 + 2.5 + 2.5 + 1.5 + 0.5 + 0 = 8.5 (hand computed).
    assert.deepEqual(ok.report.meta.spectra![0]!.result!.region, [3, 9]);
    assert.equal(ok.report.meta.spectra![0]!.result!.value, 8.5);
    const bad = f.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: b.csv, region: [100 Hz, 300 Hz] }\n  thermal: 1`,
    );
    const p = bad.report.problems.find((x) => x.code === 'spectrum-unit')!;
    assert.equal(at(bad.text, p.span), '100 Hz');
    assert.match(p.message, /ppm only through an observe frequency/);
  });

  it('uses the block-level default file', () => {
    const { report } = folder.block(
      `${HEAD}spectrum: spectra/hp.csv\nsignal:\n  hyperpolarized: { region: [165 ppm, 177 ppm] }\n  thermal: { spectrum: spectra/th.csv, region: [165, 177] }`,
    );
    assert.deepEqual(report.problems, []);
    assert.deepEqual(
      report.meta.spectra!.map((u) => u.file),
      ['spectra/hp.csv', 'spectra/th.csv'],
    );
  });

  it('warns where the two sides are integrals over different x units', () => {
    const jdx = [
      '##TITLE= hz',
      '##JCAMP-DX= 4.24',
      '##XUNITS= HZ',
      '##YUNITS= A',
      '##.OBSERVE FREQUENCY= 100',
      '##FIRSTX= 0',
      '##LASTX= 1000',
      '##NPOINTS= 11',
      '##XFACTOR= 1',
      '##YFACTOR= 1',
      '##XYDATA=(X++(Y..Y))',
      '0 0 0 0 1 2 3 2 1 0 0 0',
      '##END=',
    ].join('\n');
    const f = new MemoryFolder().set('hz.jdx', jdx).set('ppm.csv', 'ppm,y\n0,0\n2,1\n4,3\n6,1\n8,0\n10,0\n');
    const { report, text } = f.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: hz.jdx, region: [1 ppm, 9 ppm] }\n  thermal: { spectrum: ppm.csv, region: [1 ppm, 9 ppm] }`,
    );
    const p = report.problems.find((x) => x.code === 'spectrum-units-differ')!;
    assert.equal(p.severity, 'warning');
    assert.ok(at(text, p.span).startsWith('{ spectrum: ppm.csv'));
    assert.match(p.message, /y × ppm \(ppm\.csv\).*y × Hz \(hz\.jdx\)/);
  });

  it("takes a noise region's uncertainty over a typed noise, with a warning on the typed one", () => {
    // notebook-format.md v1.2, "A spectrum in place of a number": the noise region's σ "replaces a typed `noise`".
    const { report, text } = folder.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: spectra/hp.csv, region: [165 ppm, 177 ppm], noise: [200 ppm, 240 ppm] }\n  thermal: 800\n  noise: { hyperpolarized: 5, thermal: 1 }`,
    );
    assert.ok(!report.problems.some((x) => x.code === 'uncertainty-twice'));
    const p = report.problems.filter((x) => x.code === 'noise-replaced');
    assert.equal(p.length, 1);
    assert.equal(p[0]!.severity, 'warning');
    assert.equal(at(text, p[0]!.span), 'hyperpolarized: 5');
    assert.notEqual(report.status, 'invalid');
  });
});

describe('spectrum references in series and lines', () => {
  it('reads each point of a series and each line intensity, keyed by its dotted path', () => {
    const f = new MemoryFolder();
    [1000, 700, 490, 343].forEach((h, i) => f.set(`s${i}.csv`, line(h)));
    const series = f.block(
      `series:\n  model: decay\n  time: [0 s, 10 s, 20 s, 30 s]\n  signal:\n${[0, 1, 2, 3].map((i) => `    - { spectrum: s${i}.csv, region: [165 ppm, 177 ppm] }`).join('\n')}`,
    ).report;
    assert.deepEqual(
      series.problems.filter((p) => p.severity === 'error'),
      [],
    );
    assert.deepEqual(
      series.meta.spectra!.map((u) => u.key),
      ['series.signal[0]', 'series.signal[1]', 'series.signal[2]', 'series.signal[3]'],
    );
    // Heights fall by 0.7 per 10 s: T₁ = −10 s / ln 0.7 (the series model, exact data).
    close(series.results!.series!.timeConstant.value, -10 / Math.log(0.7), 1e-6, 'T1');

    const g = new MemoryFolder().set('lamp.csv', 'nm,counts\n' + lampLines());
    const lines = g.block(
      `lines:\n  - { wavelength: 696.54 nm, upper: 13.328 eV, g: 3, A: 6.39e6, intensity: { spectrum: lamp.csv, region: [696 nm, 697 nm] } }\n  - { wavelength: 706.72 nm, upper: 13.302 eV, g: 5, A: 3.80e6, intensity: { spectrum: lamp.csv, region: [706 nm, 707.4 nm] } }`,
    ).report;
    assert.deepEqual(
      lines.problems.filter((p) => p.severity === 'error'),
      [],
    );
    assert.deepEqual(
      lines.meta.spectra!.map((u) => u.key),
      ['lines[0].intensity', 'lines[1].intensity'],
    );
    assert.ok(lines.results !== null);
  });
});

/** Two Gaussian lamp lines at 696.54 and 706.72 nm on 690…710 nm (0.01 nm steps), invented for the test. */
function lampLines(): string {
  const out: string[] = [];
  for (let i = 0; i <= 2000; i++) {
    const x = 690 + i * 0.01;
    const y =
      5000 * Math.exp(-((x - 696.54) ** 2) / (2 * 0.05 ** 2)) + 3000 * Math.exp(-((x - 706.72) ** 2) / (2 * 0.05 ** 2));
    out.push(`${x.toFixed(2)},${y}`);
  }
  return out.join('\n') + '\n';
}

describe('spectrum reference errors, each on its range', () => {
  const f = new MemoryFolder()
    .set('ok.csv', line(100))
    .set('bad.csv', 'ppm,y\n1,2\n3,oops\n')
    .set('tiny.csv', 'ppm,y\n1,1\n2,2\n3,3\n');
  function one(
    sig: string,
    code: string,
    externals: Externals | null = f.externals(),
  ): { at: string; message: string } {
    const text = `# run\n\n\`\`\`levels\n${HEAD}signal:\n  hyperpolarized: ${sig}\n  thermal: 1\n\`\`\`\n`;
    const b = new Analyzer().analyzeText(text, externals).blocks[0]!;
    const found = b.problems.filter((p) => p.code === code);
    assert.equal(found.length, 1, `${code}: ${b.problems.map((p) => `${p.code} ${p.message}`).join('; ')}`);
    assert.equal(b.input, null);
    return { at: at(text, found[0]!.span), message: found[0]!.message };
  }

  it('spectrum-missing: on the path, naming it', () => {
    const p = one('{ spectrum: gone.csv, region: [1, 2] }', 'spectrum-missing');
    assert.equal(p.at, 'gone.csv');
    assert.match(p.message, /no file gone\.csv/);
  });

  it('spectrum-missing: on each reference when the block default names the missing file', () => {
    const text = `# run\n\n\`\`\`levels\n${HEAD}spectrum: gone.jdx\nsignal:\n  hyperpolarized: { region: [1, 2] }\n  thermal: { region: [1, 2] }\n\`\`\`\n`;
    const b = new Analyzer().analyzeText(text, f.externals()).blocks[0]!;
    assert.deepEqual(
      b.problems.filter((p) => p.code === 'spectrum-missing').map((p) => at(text, p.span)),
      ['{ region: [1, 2] }', '{ region: [1, 2] }'],
    );
  });

  it('spectrum-reference: a reference whose spectrum is not a path', () => {
    assert.equal(one('{ spectrum: [a, b], region: [1, 2] }', 'spectrum-reference').at, '[a, b]');
  });

  it('spectrum-missing: where the host reads no files', () => {
    const p = one('{ spectrum: ok.csv, region: [165, 177] }', 'spectrum-missing', null);
    assert.match(p.message, /cannot be read here/);
  });

  it('spectrum-malformed: on the path, with the file line', () => {
    const p = one('{ spectrum: bad.csv, region: [1, 2] }', 'spectrum-malformed');
    assert.equal(p.at, 'bad.csv');
    assert.match(p.message, /line 3/);
  });

  it('spectrum-region: beyond the x range (which the message gives), or too few points', () => {
    const p = one('{ spectrum: ok.csv, region: [240 ppm, 260 ppm] }', 'spectrum-region');
    assert.equal(p.at, '[240 ppm, 260 ppm]');
    assert.match(p.message, /0 … 250 ppm/);
    const few = one('{ spectrum: tiny.csv, region: [1.5, 2.5] }', 'spectrum-region');
    assert.match(few.message, /holds 1 point of tiny\.csv; at least 3/);
    const noise = one('{ spectrum: ok.csv, region: [165, 177], noise: [300, 400] }', 'spectrum-region');
    assert.equal(noise.at, '[300, 400]');
  });

  it('spectrum-unit: a unit of another axis, or no x unit at all', () => {
    assert.equal(one('{ spectrum: ok.csv, region: [600 nm, 700 nm] }', 'spectrum-unit').at, '600 nm');
    assert.equal(one('{ spectrum: ok.csv, region: [1 T, 2 T] }', 'spectrum-unit').at, '1 T');
  });

  it('spectrum-outside: on the path, never looked up', () => {
    assert.equal(one('{ spectrum: ../secret.csv, region: [1, 2] }', 'spectrum-outside').at, '../secret.csv');
    assert.equal(one('{ spectrum: /etc/passwd, region: [1, 2] }', 'spectrum-outside').at, '/etc/passwd');
  });

  it('spectrum-large: on the path, from the host answer', () => {
    const big: Externals = {
      note: '/lab/note.md',
      stamp: () => '1',
      spectra: { lookup: () => ({ state: 'large', key: 'file:/lab/big.jdx', stamp: '1', size: 70 * 1048576 }) },
    };
    const p = one('{ spectrum: big.jdx, region: [1, 2] }', 'spectrum-large', big);
    assert.equal(p.at, 'big.jdx');
    assert.match(p.message, /70\.0 MB/);
  });

  it('spectrum-reference: no region, no file, a bad baseline, a region that is no pair', () => {
    assert.ok(one('{ spectrum: ok.csv }', 'spectrum-reference').message.includes('region'));
    assert.ok(one('{ region: [1, 2] }', 'spectrum-reference').message.includes('name the file'));
    const b = one('{ spectrum: ok.csv, region: [165, 177], baseline: cubic }', 'spectrum-reference');
    assert.equal(b.at, 'cubic');
    assert.equal(one('{ spectrum: ok.csv, region: 165 }', 'spectrum-reference').at, '165');
  });

  it('keeps the rest of the note working', () => {
    const text = `\`\`\`levels\n${HEAD}signal:\n  hyperpolarized: { spectrum: gone.csv, region: [1, 2] }\n  thermal: 1\n\`\`\`\n\n\`\`\`levels\ngap: 1 K\nratio: 0.5\n\`\`\`\n`;
    const blocks = new Analyzer().analyzeText(text, f.externals()).blocks;
    assert.equal(blocks[0]!.input, null);
    assert.ok(blocks[1]!.results !== null);
  });
});

describe('files, stamps and the cache', () => {
  const body = `${HEAD}signal:\n  hyperpolarized: { spectrum: hp.csv, region: [165 ppm, 177 ppm] }\n  thermal: { spectrum: hp.csv, region: [165 ppm, 177 ppm] }`;

  it('parses a file once however many references use it, and records it as a dependency', () => {
    const f = new MemoryFolder().set('hp.csv', line(100));
    const a = new Analyzer();
    const r = f.block(body, a).report;
    assert.equal(f.shelf.parses, 1);
    assert.deepEqual(r.deps, [{ key: 'file:/lab/hp.csv', stamp: `${f.files.get('/lab/hp.csv')!.length}:1` }]);
    f.block(body + '\n', a);
    assert.equal(f.shelf.parses, 1, 'another block over the same file');
  });

  it('reads the block again when the file changes, is deleted, or appears', () => {
    const f = new MemoryFolder().set('hp.csv', line(100));
    const a = new Analyzer();
    const text = `\`\`\`levels\n${body}\n\`\`\`\n`;
    const first = a.analyzeText(text, f.externals());
    assert.equal(first.stats.analysed, 1);
    assert.equal(a.analyzeText(text, f.externals()).stats.reused, 1, 'unchanged file: reused');
    f.set('hp.csv', line(300));
    const changed = a.analyzeText(text, f.externals());
    assert.equal(changed.stats.analysed, 1);
    close(changed.blocks[0]!.meta.spectra![0]!.result!.value, area(300), 1e-9);
    f.delete('hp.csv');
    const gone = a.analyzeText(text, f.externals());
    assert.ok(gone.blocks[0]!.problems.some((p) => p.code === 'spectrum-missing'));
    f.set('hp.csv', line(100));
    assert.deepEqual(a.analyzeText(text, f.externals()).blocks[0]!.problems, []);
  });

  it('waits without an error while the host is still reading a file', () => {
    const pending: Externals = {
      note: '/lab/note.md',
      stamp: () => 'reading',
      spectra: { lookup: () => ({ state: 'pending', key: 'file:/lab/hp.csv', stamp: 'reading' }) },
    };
    const r = new Analyzer().analyzeText(`\`\`\`levels\n${body}\n\`\`\`\n`, pending).blocks[0]!;
    assert.deepEqual(r.problems, []);
    assert.equal(r.input, null);
    assert.deepEqual(r.deps, [{ key: 'file:/lab/hp.csv', stamp: 'reading' }]);
  });

  it('lists an integral past the double range as null, not as a number JSON cannot write', () => {
    // Intensities near the largest double (1.7977e308, IEEE 754 binary64): their trapezoidal sum over 12 ppm overflows.
    const x: number[] = [];
    const y: number[] = [];
    for (let i = 0; i <= 400; i++) {
      x.push(Number((180 - i * 0.05).toFixed(2)));
      y.push(1.5e308);
    }
    const f = new MemoryFolder().set('big.csv', csv(x, y));
    const r = f.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: big.csv, region: [165 ppm, 177 ppm], baseline: none }\n  thermal: 1`,
    ).report;
    const e = spectraEntries(r.meta);
    assert.equal(e.length, 1);
    assert.equal(e[0]!.integral, null, JSON.stringify(e[0]));
    assert.ok(!JSON.stringify(e).includes('"value":null'));
  });

  it('lists the references for the JSON report, a failed one with null numbers', () => {
    const f = new MemoryFolder().set('hp.csv', line(100));
    const r = f.block(
      `${HEAD}signal:\n  hyperpolarized: { spectrum: hp.csv, region: [165 ppm, 177 ppm] }\n  thermal: { spectrum: nope.csv, region: [1, 2] }`,
    ).report;
    const e = spectraEntries(r.meta);
    assert.equal(e.length, 2);
    assert.deepEqual(e[0]!.region, [165, 177]);
    assert.equal(e[0]!.unit, 'ppm');
    assert.equal(e[0]!.points, 241);
    assert.deepEqual(e[1], {
      key: 'signal.thermal',
      file: 'nope.csv',
      region: null,
      unit: null,
      integral: null,
      points: null,
    });
  });
});

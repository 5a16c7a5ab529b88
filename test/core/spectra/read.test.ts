/**
 * The spectrum readers against the outside: the ASDF compression forms as the
 * JCAMP-DX publications define them, files written by an independent JCAMP-DX
 * writer (npm `convert-to-jcamp`) in every encoding it offers, and two-column text.
 */
import { strict as assert } from 'node:assert';
// @ts-expect-error -- TS1479: the package ships only as an ES module; tsx loads it from CommonJS.
import { fromJSON, from1DNMRVariables } from 'convert-to-jcamp';
import { integrateRegion, readSpectrum, type Spectrum } from '../../../src/core';
import { close } from '../helpers';

function spectrum(text: string, name: string): Spectrum {
  const r = readSpectrum(text, name);
  assert.ok(r.ok, r.ok ? '' : `not read: line ${r.line}: ${r.message}`);
  return r.spectrum;
}

function jdx(data: string, npoints = 7, extra = ''): string {
  return [
    '##TITLE= compression example',
    '##JCAMP-DX= 4.24',
    '##DATA TYPE= INFRARED SPECTRUM',
    '##XUNITS= 1/CM',
    '##YUNITS= ABSORBANCE',
    '##XFACTOR= 1',
    '##YFACTOR= 1',
    '##FIRSTX= 1',
    '##LASTX= 7',
    `##NPOINTS= ${npoints}`,
    '##FIRSTY= 2000',
    extra,
    '##XYDATA=(X++(Y..Y))',
    data,
    '##END=',
  ]
    .filter((l) => l !== '')
    .join('\n');
}

describe('JCAMP-DX: the ASDF compression forms', () => {
  // The same seven ordinates in each form of McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988), Table III
  // (the digits are from memory; the forms follow the paper's rules: SQZ puts the first digit and sign in a
  // letter, @ A–I / a–i; DIF writes differences with % J–R / j–r; DUP repeats the previous token, S–Z / s).
  const Y = [2000, 2000, 2001, 2002, 2003, 2003, 2003];
  const forms: [string, string][] = [
    ['AFFN (FIX)', '1 2000 2000 2001 2002 2003 2003 2003'],
    ['PAC', '1+2000+2000+2001+2002+2003+2003+2003'],
    ['SQZ', '1B000B000B001B002B003B003B003'],
    ['DIF', '1B000%JJJ%%'],
    ['DIFDUP', '1B000%JU%T'],
  ];
  for (const [name, line] of forms)
    it(`decodes ${name} to the same ordinates`, () => {
      const s = spectrum(jdx(line), 'ex.jdx');
      assert.deepEqual([...s.y], Y);
      assert.deepEqual([...s.x], [1, 2, 3, 4, 5, 6, 7]);
      assert.equal(s.xUnit, 'cm-1');
    });

  it('applies XFACTOR and YFACTOR', () => {
    const s = spectrum(jdx('1B000%JU%T').replace('##YFACTOR= 1', '##YFACTOR= 0.001'), 'ex.jdx');
    close(s.y[2], 2.001, 1e-12);
  });

  it('reports a character that is no JCAMP-DX data on its line, and never expands a runaway DUP count', () => {
    const bad = readSpectrum(jdx('1B000%J{U%T'), 'ex.jdx');
    assert.ok(!bad.ok);
    assert.equal(bad.line, 13);
    assert.match(bad.message, /`\{` is not a character of JCAMP-DX data/);
    const dup = readSpectrum(jdx('1B000%JZ99999999999'), 'ex.jdx');
    assert.ok(!dup.ok);
    assert.match(dup.message, /DUP count/);
  });

  it('reports a table that decodes to a different number of points than ##NPOINTS says', () => {
    const r = readSpectrum(jdx('1B000%JU%T', 9), 'ex.jdx');
    assert.ok(!r.ok);
    assert.match(r.message, /7 points where ##NPOINTS says 9/);
    assert.equal(r.line, 12);
  });

  it('reports a file with no data table, and an x unit that is no spectrum axis', () => {
    const none = readSpectrum('##TITLE= x\n##JCAMP-DX= 4.24\n##END=\n', 'a.jdx');
    assert.ok(!none.ok && /no data table/.test(none.message));
    const fid = readSpectrum(jdx('1B000%JU%T').replace('1/CM', 'SECONDS'), 'a.jdx');
    assert.ok(!fid.ok);
    assert.match(fid.message, /`SECONDS` is not a spectrum axis/);
    assert.equal(fid.line, 4);
  });

  it('reads ##XYPOINTS pairs', () => {
    const s = spectrum(
      '##TITLE= p\n##JCAMP-DX= 4.24\n##XUNITS= NANOMETERS\n##YUNITS= COUNTS\n##NPOINTS= 3\n##XYPOINTS=(XY..XY)\n402, 3; 400, 1; 401, 2\n##END=\n',
      'p.jdx',
    );
    assert.deepEqual([...s.x], [400, 401, 402]);
    assert.deepEqual([...s.y], [1, 2, 3]);
    assert.equal(s.xUnit, 'nm');
  });
});

describe('JCAMP-DX: NTUPLES (NMR)', () => {
  // The layout of Davies & Lampen, Appl. Spectrosc. 47, 1093 (1993), Fig. 1 (from memory): a real and an
  // imaginary page over one Hz axis; the reader must take the real page.
  const ntuples = [
    '##TITLE= ntuples example',
    '##JCAMP-DX= 5.00',
    '##DATA TYPE= NMR SPECTRUM',
    '##DATA CLASS= NTUPLES',
    '##.OBSERVE FREQUENCY= 100.6',
    '##.OBSERVE NUCLEUS= ^13C',
    '##NTUPLES= NMR SPECTRUM',
    '##VAR_NAME= FREQUENCY, SPECTRUM/REAL, SPECTRUM/IMAG, PAGE NUMBER',
    '##SYMBOL= X, R, I, N',
    '##VAR_TYPE= INDEPENDENT, DEPENDENT, DEPENDENT, PAGE',
    '##VAR_FORM= AFFN, ASDF, ASDF, AFFN',
    '##VAR_DIM= 5, 5, 5, 2',
    '##UNITS= HZ, ARBITRARY UNITS, ARBITRARY UNITS,',
    '##FACTOR= 1, 1, 1, 1',
    '##FIRST= 400, 10, 0, 1',
    '##LAST= 0, 10, 0, 2',
    '##PAGE= N=1',
    '##NPOINTS= 5',
    '##DATA TABLE= (X++(R..R)), XYDATA',
    '400 10 20 50 20 10',
    '##PAGE= N=2',
    '##NPOINTS= 5',
    '##DATA TABLE= (X++(I..I)), XYDATA',
    '400 -70 -70 -70 -70 -70',
    '##END NTUPLES= NMR SPECTRUM',
    '##END=',
  ].join('\n');

  it('takes the real page, keeps the Hz axis and reads the observe frequency', () => {
    const s = spectrum(ntuples, 'n.jdx');
    assert.equal(s.xUnit, 'Hz');
    assert.equal(s.observeMHz, 100.6);
    assert.deepEqual([...s.x], [0, 100, 200, 300, 400]);
    assert.deepEqual([...s.y], [10, 20, 50, 20, 10]);
    assert.equal(s.descending, true);
  });

  it('takes the real page of a file written by convert-to-jcamp, an independent writer', () => {
    // A Gaussian line in the real part and a larger, negative one in the imaginary part.
    const N = 2001;
    const x = Array.from({ length: N }, (_, k) => 2000 - k);
    const g = (v: number): number => Math.exp(-((v - 500) ** 2) / (2 * 20 ** 2));
    const text = from1DNMRVariables(
      {
        x: { data: x, units: 'Hz', label: 'x', isDependent: false },
        r: { data: x.map((v) => 1000 * g(v)), units: 'arbitrary', label: 'r', isDependent: true },
        i: { data: x.map((v) => -7000 * g(v)), units: 'arbitrary', label: 'i', isDependent: true },
      },
      { nmrInfo: { isFid: false, originFrequency: 100.6 }, xyEncoding: 'DIFDUP' },
    );
    const s = spectrum(text, 'w.jdx');
    assert.equal(s.xUnit, 'Hz');
    // The writer stores the axis scaled by the origin frequency (its ##FACTOR for X is 100.6).
    const scale = 100.6;
    const r = integrateRegion(s, 300 * scale, 700 * scale, 'none');
    assert.ok('value' in r);
    // ∫ A exp(−x²/2σ²) dx = A σ √(2π) (a standard integral), times the writer's axis scale.
    close(r.value, scale * 1000 * 20 * Math.sqrt(2 * Math.PI), 1e-6, 'real part area');
  });
});

describe('JCAMP-DX written by convert-to-jcamp in every encoding', () => {
  // An independent writer: the reader must give back the writer's points in each of its encodings.
  const N = 1001;
  const xs = Float64Array.from({ length: N }, (_, k) => 500 + k * 0.1);
  const ys = Float64Array.from(xs, (v) => 3000 * Math.exp(-((v - 550) ** 2) / (2 * 1.5 ** 2)) + 12);
  for (const enc of ['', 'FIX', 'SQZ', 'DIF', 'DIFDUP', 'PAC', 'CSV'] as const)
    it(`reads the ${enc || 'default'} encoding back point for point`, () => {
      const text = fromJSON(
        { x: xs, y: ys },
        { info: { xUnits: 'NANOMETERS', yUnits: 'COUNTS', title: 't' }, xyEncoding: enc },
      );
      const s = spectrum(text, 'e.jdx');
      assert.equal(s.x.length, N);
      assert.equal(s.xUnit, 'nm');
      for (let i = 0; i < N; i += 50) {
        close(s.x[i], xs[i], 1e-9, `x[${i}]`);
        // The writer rounds y to its integer scale (YFACTOR); 1e-6 of the largest value covers it.
        assert.ok(Math.abs(s.y[i] - ys[i]) <= 3e-3, `y[${i}]: ${s.y[i]} vs ${ys[i]}`);
      }
    });
});

describe('two-column text', () => {
  it('reads comma, tab, semicolon and space separated pairs, comments and a header naming the x unit', () => {
    const s = spectrum('# exported\nshift (ppm)\tintensity\n3\t4\n1, 2\n2 3\n# end\n4;5\n', 's.tsv');
    assert.deepEqual([...s.x], [1, 2, 3, 4]);
    assert.deepEqual([...s.y], [2, 3, 4, 5]);
    assert.equal(s.xUnit, 'ppm');
    assert.equal(s.yUnit, 'intensity');
    assert.equal(spectrum('wavelength [nm],counts\n1,2\n', 'a.csv').xUnit, 'nm');
    assert.equal(spectrum('wavenumber/cm-1,A\n1,2\n', 'a.csv').xUnit, 'cm-1');
    assert.equal(spectrum('1,2\n2,3\n', 'a.csv').xUnit, null);
  });

  it('reports the first line that is not a pair of numbers, with its number', () => {
    const three = readSpectrum('x,y\n1,2\n2,3,4\n', 'a.csv');
    assert.ok(!three.ok);
    assert.equal(three.line, 3);
    assert.match(three.message, /3 columns/);
    const word = readSpectrum('1,2\n2,abc\n', 'a.csv');
    assert.ok(!word.ok);
    assert.equal(word.line, 2);
    const nan = readSpectrum('1,2\n2,NaN\n', 'a.txt');
    assert.ok(!nan.ok && nan.line === 2);
    const empty = readSpectrum('# nothing\n\n', 'a.txt');
    assert.ok(!empty.ok && /no x, y pairs/.test(empty.message));
  });

  it('tells JCAMP-DX by its first label when the name does not', () => {
    assert.equal(spectrum(jdx('1B000%JU%T'), 'spectrum.data').format, 'jcamp');
    assert.equal(spectrum('1 2\n2 3\n', 'spectrum.data').format, 'text');
  });
});

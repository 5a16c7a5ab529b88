/**
 * What a JCAMP-DX `(X++(Y..Y))` table writes to guard itself, held to the standard: the x that
 * starts each line against the header's spacing, and the Y check value that repeats a DIF
 * line's last ordinate (McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988), JCAMP-DX 4.24; the
 * ASDF letters of its compression tables: SQZ @ A–I a–i, DIF % J–R j–r, DUP S–Z s); and AFFN
 * numbers with an exponent, which the 5.x revision allows (Lampen et al., Pure Appl. Chem. 71,
 * 1549 (1999)) and whose E is also the SQZ digit +5. A damaged or ambiguous table must be
 * `ok: false` with the file's line, never a spectrum with wrong numbers.
 */
import { strict as assert } from 'node:assert';
// @ts-expect-error -- TS1479: the package ships only as an ES module; tsx loads it from CommonJS.
import { fromJSON } from 'convert-to-jcamp';
import { integrateRegion, readSpectrum, type Spectrum } from '../../../src/core';
import { close } from '../helpers';

interface Head {
  first?: number | string;
  last?: number | string;
  npoints?: number;
  yfactor?: number;
  extra?: string[];
}

/** A JCAMP-DX 5.01 file around `data`, the lines after `##XYDATA=(X++(Y..Y))`. */
function jdx(data: string[], head: Head = {}): string {
  return [
    '##TITLE= checks',
    '##JCAMP-DX= 5.01',
    '##DATA TYPE= INFRARED SPECTRUM',
    '##XUNITS= 1/CM',
    '##YUNITS= ABSORBANCE',
    '##XFACTOR= 1',
    `##YFACTOR= ${head.yfactor ?? 1}`,
    ...(head.first === undefined ? [] : [`##FIRSTX= ${head.first}`]),
    ...(head.last === undefined ? [] : [`##LASTX= ${head.last}`]),
    ...(head.npoints === undefined ? [] : [`##NPOINTS= ${head.npoints}`]),
    ...(head.extra ?? []),
    '##XYDATA=(X++(Y..Y))',
    ...data,
    '##END=',
  ].join('\n');
}

/** The file's 1-based line of the `i`-th (1-based) line after the `##XYDATA=` label. */
function dataLine(text: string, i: number): number {
  return text.split('\n').findIndex((l) => /^##XYDATA=/.test(l)) + 1 + i;
}

function spectrum(text: string): Spectrum {
  const r = readSpectrum(text, 'c.jdx');
  assert.ok(r.ok, r.ok ? '' : `not read: line ${r.line}: ${r.message}`);
  return r.spectrum;
}

function malformed(text: string, line: number, message: RegExp): void {
  const r = readSpectrum(text, 'c.jdx');
  assert.ok(!r.ok, `read as a spectrum: y = ${r.ok ? [...r.spectrum.y].join(' ') : ''}`);
  assert.equal(r.line, line, r.message);
  assert.match(r.message, message);
  assert.ok(r.message.startsWith(`line ${line}: `), r.message);
}

// The ASDF letters of McDonald & Wilks (1988): the first digit and the sign of a value in one letter.
const SQZ = ['@ABCDEFGHI', '@abcdefghi'] as const;
const DIF = ['%JKLMNOPQR', '%jklmnopqr'] as const;
function letter(v: number, [pos, neg]: readonly [string, string]): string {
  const digits = String(Math.abs(v));
  return (v < 0 ? neg : pos)[Number(digits[0])]! + digits.slice(1);
}
const sqz = (v: number): string => letter(v, SQZ);
const dif = (d: number): string => letter(d, DIF);

/** SQZ lines of `perLine` values, each led by the x of its first value. */
function sqzLines(raw: number[], perLine: number, x: (k: number) => string): string[] {
  const lines: string[] = [];
  for (let k = 0; k < raw.length; k += perLine)
    lines.push(
      x(k) +
        raw
          .slice(k, k + perLine)
          .map(sqz)
          .join(''),
    );
  return lines;
}

/**
 * DIF lines as the standard writes them: each line starts with an absolute (SQZ) value and goes
 * on in differences; the next line starts by repeating the last value in SQZ form (the Y check),
 * led by that value's x, and a last line holds only the check of the final value.
 */
function difLines(raw: number[], perLine: number, x: (k: number) => string): string[] {
  const lines: string[] = [];
  let k = 0;
  while (k < raw.length - 1) {
    const end = Math.min(k + perLine, raw.length - 1);
    let s = x(k) + sqz(raw[k]!);
    for (let i = k + 1; i <= end; i++) s += dif(raw[i]! - raw[i - 1]!);
    lines.push(s);
    k = end;
  }
  lines.push(x(raw.length - 1) + sqz(raw[raw.length - 1]!));
  return lines;
}

describe('JCAMP-DX: the Y check of DIF lines', () => {
  // The ordinates of the compression example in read.test.ts, in DIF lines with their checks.
  const good = ['1B000%JJJ', '5B003%%', '7B003'];

  it('reads DIF lines whose check values repeat the ordinate before', () => {
    const s = spectrum(jdx(good, { first: 1, last: 7, npoints: 7 }));
    assert.deepEqual([...s.y], [2000, 2000, 2001, 2002, 2003, 2003, 2003]);
    assert.deepEqual([...s.x], [1, 2, 3, 4, 5, 6, 7]);
  });

  it('reports a check value that differs from the ordinate it repeats, on the check’s line', () => {
    const text = jdx(['1B000%JJJ', '5B013%%', '7B013'], { first: 1, last: 7, npoints: 7 });
    malformed(text, dataLine(text, 2), /Y check value 2013 does not repeat the last ordinate .*\(2003\)/);
  });

  it('catches a damaged difference by the check of the next line', () => {
    // K is the difference +2 where J (+1) was written: the line's last ordinate becomes 2004, the check says 2003.
    const text = jdx(['1B000%JJK', '5B003%%', '7B003'], { first: 1, last: 7, npoints: 7 });
    malformed(text, dataLine(text, 2), /Y check value 2003 .*\(2004\)/);
  });

  it('checks the last line, which holds only the check of the final ordinate', () => {
    const text = jdx(['1B000%JJJ', '5B003%%', '7B002'], { first: 1, last: 7, npoints: 7 });
    malformed(text, dataLine(text, 3), /Y check value 2002 .*\(2003\)/);
  });

  it('reports a line after a DIF line that starts without a check value, and a DUP of the check value', () => {
    const noCheck = jdx(['1B000%JJJ', '6%%'], { first: 1, last: 7, npoints: 7 });
    malformed(noCheck, dataLine(noCheck, 2), /must start with the Y check value/);
    // T repeats the previous token; after a check value the decoder would repeat a stale one.
    const dupCheck = jdx(['1B000%JJJ', '5B003T'], { first: 1, last: 6, npoints: 6 });
    malformed(dupCheck, dataLine(dupCheck, 2), /DUP count with no value/);
  });

  it('catches one changed digit in a DIF file of an independent writer (npm convert-to-jcamp)', () => {
    const xs = Array.from({ length: 40 }, (_, k) => 500 + k * 0.1);
    const ys = xs.map((v) => 3000 * Math.exp(-((v - 502) ** 2) / 2) + 12);
    const text: string = fromJSON({ x: xs, y: ys }, { info: { xUnits: 'NANOMETERS', title: 'w' }, xyEncoding: 'DIF' });
    assert.equal(spectrum(text).x.length, 40);
    const lines = text.split('\n');
    const third = dataLine(text, 3) - 1;
    const last = lines[third]!.at(-1)!;
    assert.match(last, /\d/, 'the line ends in a digit of its last difference');
    lines[third] = lines[third]!.slice(0, -1) + String((Number(last) + 1) % 10);
    malformed(lines.join('\n'), dataLine(text, 4), /Y check value .* does not repeat/);
  });
});

describe('JCAMP-DX: AFFN numbers with an exponent', () => {
  it('reads E and e exponents as powers of ten, not as the SQZ digit 5', () => {
    const s = spectrum(jdx(['1.0E+02 1.5e-3 -2.0E+01 3.0E+00 1.0E+02'], { first: 100, last: 400, npoints: 4 }));
    assert.deepEqual([...s.x], [100, 200, 300, 400]);
    assert.deepEqual([...s.y], [0.0015, -20, 3, 100]);
  });

  // y = (x² − 20)/1000 at x = 0, 0.5, …, 10. The trapezoidal rule with step h is exact for a
  // quadratic up to its error term (b − a)·h²·f''/12 (Euler–Maclaurin), so over [0, 10]:
  // (10³/3 − 20·10 + 10·0.5²·2/12)/1000 = (133.3333… + 0.4166…)/1000 = 0.13375.
  const K = 21;
  const x = (k: number): number => k / 2;
  const raw = Array.from({ length: K }, (_, k) => k * k - 80); // y/0.00025, integers for the ASDF forms
  const expected = 0.13375;
  const head = { first: 0, last: 10, npoints: K };
  const integral = (s: Spectrum): number => {
    const r = integrateRegion(s, 0, 10, 'none');
    assert.ok('value' in r, JSON.stringify(r));
    assert.equal(r.points, K);
    return r.value;
  };

  it('gives the trapezoidal integral of a quadratic written in AFFN with exponents', () => {
    const lines: string[] = [];
    for (let k = 0; k < K; k += 5) {
      const fields = [x(k), ...raw.slice(k, k + 5).map((r) => r / 4000)].map((v) => v.toExponential(4));
      // Upper-case E with a signed exponent on some lines, lower-case on others.
      lines.push((k / 5) % 2 === 0 ? fields.join(' ').toUpperCase() : fields.join(', '));
    }
    assert.match(lines.join('\n'), /E-2/);
    assert.match(lines.join('\n'), /e\+0/);
    const s = spectrum(jdx(lines, head));
    close(s.y[3], (1.5 ** 2 - 20) / 1000, 1e-15, 'y at x = 1.5');
    close(integral(s), expected, 1e-12, 'AFFN with exponents');
  });

  it('gives the same integral from the same ordinates in SQZ, in DIF, and from an independent writer', () => {
    const xText = (k: number): string => String(x(k));
    close(integral(spectrum(jdx(sqzLines(raw, 6, xText), { ...head, yfactor: 0.00025 }))), expected, 1e-12, 'SQZ');
    close(integral(spectrum(jdx(difLines(raw, 6, xText), { ...head, yfactor: 0.00025 }))), expected, 1e-12, 'DIF');
    const xs = raw.map((_, k) => x(k));
    const ys = raw.map((r) => r / 4000);
    for (const enc of ['FIX', 'SQZ', 'DIFDUP'] as const) {
      const text: string = fromJSON({ x: xs, y: ys }, { info: { xUnits: '1/CM', title: 'q' }, xyEncoding: enc });
      // The writer rounds y to integers of its YFACTOR (about 1e-9 of the largest |y|).
      close(integral(spectrum(text)), expected, 1e-6, `convert-to-jcamp ${enc}`);
    }
  });

  it('reads E as the SQZ digit 5 in an ASDF table, even on a line that would pass for AFFN', () => {
    // 5000, 5001, 5002 in SQZ; the last line, `3E002`, alone would read as 3×10² in AFFN.
    const s = spectrum(jdx(['1E000E001', '3E002'], { first: 1, last: 3, npoints: 3 }));
    assert.deepEqual([...s.y], [5000, 5001, 5002]);
  });

  it('reports a table that mixes AFFN exponents with ASDF values, naming both lines', () => {
    const text = jdx(['1B000B001', '3.0E+00 2.0E+03'], { first: 1, last: 3, npoints: 3 });
    const at = dataLine(text, 2);
    malformed(text, at, new RegExp(`exponent \\(line ${at}\\) and ASDF values \\(line ${at - 1}\\)`));
    const other = jdx(['1.0E+00 2.0E+03', '2.0E+00 2.0E+03', '3B000'], { first: 1, last: 3, npoints: 3 });
    malformed(other, dataLine(other, 3), /cannot be read unambiguously/);
  });

  it('reports an exponent beyond any number on its line', () => {
    const text = jdx(['1 2.0E+999'], { first: 1, last: 1, npoints: 1 });
    malformed(text, dataLine(text, 1), /exponent beyond/);
  });
});

describe('JCAMP-DX: the x at each line start', () => {
  const head = { first: 1, last: 6, npoints: 6 };

  it('reads lines whose x agrees with ##FIRSTX, ##LASTX and ##NPOINTS up to the digits written', () => {
    // Spacing 1/3: the lines write x to two decimals (0.67 for 2/3, 1.33 for 4/3).
    const s = spectrum(jdx(['0 1 2', '0.67 3 4', '1.33 5 6', '2 7'], { first: 0, last: 2, npoints: 7 }));
    close(s.x[4], 4 / 3, 1e-12, 'x of point 5');
    assert.deepEqual([...s.y], [1, 2, 3, 4, 5, 6, 7]);
  });

  it('reports a line whose x disagrees with the header', () => {
    const text = jdx(['1A0A1A2', '9A3A4A5'], head);
    malformed(text, dataLine(text, 2), /starts at x = 9 .* point 4, at x = 4/);
  });

  it('reports lines out of order, which hold the right number of points', () => {
    const text = jdx(['1 10 20', '5 50 60', '3 30 40'], head);
    malformed(text, dataLine(text, 2), /starts at x = 5 .* point 3, at x = 3/);
  });

  it('reports a ##LASTX that does not fit the lines, which would stretch the x axis', () => {
    const text = jdx(['1 10 20 30', '4 40 50 60'], { ...head, last: 12 });
    malformed(text, dataLine(text, 2), /point 4, at x = 7\.6/);
  });

  it('reports a table with nothing to place its points, which would otherwise start at x = 0', () => {
    const text = jdx(['500 1 2 3'], { npoints: 3 });
    malformed(text, dataLine(text, 0), /no ##FIRSTX, ##LASTX and ##NPOINTS/);
    const s = spectrum(jdx(['500 1 2 3'], { first: 500, extra: ['##DELTAX= 2'] }));
    assert.deepEqual([...s.x], [500, 502, 504]);
  });

  it('checks the real page of an NTUPLES file against ##FIRST, ##LAST and ##VAR_DIM', () => {
    const ntuples = (second: string): string =>
      [
        '##TITLE= ntuples',
        '##JCAMP-DX= 5.00',
        '##DATA TYPE= NMR SPECTRUM',
        '##DATA CLASS= NTUPLES',
        '##.OBSERVE FREQUENCY= 100.6',
        '##NTUPLES= NMR SPECTRUM',
        '##VAR_NAME= FREQUENCY, SPECTRUM/REAL, SPECTRUM/IMAG, PAGE NUMBER',
        '##SYMBOL= X, R, I, N',
        '##VAR_TYPE= INDEPENDENT, DEPENDENT, DEPENDENT, PAGE',
        '##VAR_FORM= AFFN, ASDF, ASDF, AFFN',
        '##VAR_DIM= 6, 6, 6, 2',
        '##UNITS= HZ, ARBITRARY UNITS, ARBITRARY UNITS,',
        '##FACTOR= 1, 1, 1, 1',
        '##FIRST= 500, 10, 0, 1',
        '##LAST= 0, 10, 0, 2',
        '##PAGE= N=1',
        '##NPOINTS= 6',
        '##DATA TABLE= (X++(R..R)), XYDATA',
        '500 10 20 50',
        `${second} 20 10 5`,
        '##PAGE= N=2',
        '##NPOINTS= 6',
        '##DATA TABLE= (X++(I..I)), XYDATA',
        '500 -70 -70 -70 -70 -70 -70',
        '##END NTUPLES= NMR SPECTRUM',
        '##END=',
      ].join('\n');
    assert.deepEqual([...spectrum(ntuples('200')).y], [5, 10, 20, 50, 20, 10]);
    malformed(ntuples('300'), 20, /starts at x = 300 .* ##FIRST, ##LAST and ##VAR_DIM .* at x = 200/);
  });
});

describe('JCAMP-DX: lines that cannot be read one way only', () => {
  const head = { first: 1, last: 3, npoints: 3 };

  it('reports a missing value `?`, which would move every later point', () => {
    const text = jdx(['1 10 ? 30'], head);
    malformed(text, dataLine(text, 1), /missing value `\?`/);
  });

  it('reports a line that starts with an ASDF value instead of its x', () => {
    const text = jdx(['1A0A1', 'A2'], head);
    malformed(text, dataLine(text, 2), /does not start with its x value/);
  });

  it('reports an unsigned AFFN value among DIF values, which the decoder would add as a difference', () => {
    const text = jdx(['1B000%J 2003'], head);
    malformed(text, dataLine(text, 1), /AFFN value 2003 follows DIF values/);
  });

  it('reports a table whose first ordinate is a difference, with nothing to take it from', () => {
    const text = jdx(['1%JJ'], head);
    malformed(text, dataLine(text, 1), /first ordinate of the table must be in SQZ or AFFN form/);
  });
});

describe('JCAMP-DX: (XY..XY) tables', () => {
  const points = (table: string, data: string): string =>
    [
      '##TITLE= p',
      '##JCAMP-DX= 4.24',
      '##XUNITS= NANOMETERS',
      '##YUNITS= COUNTS',
      '##NPOINTS= 3',
      table,
      data,
      '##END=',
    ].join('\n');

  it('reports a group that is not x, y pairs, which the decoder would drop while later points still fit ##NPOINTS', () => {
    malformed(
      points('##XYPOINTS=(XY..XY)', '400, 1; 401, 2, 7; 402, 3\n403 4'),
      7,
      /`401, 2, 7` is not x, y pairs \(3 numbers\)/,
    );
  });

  it('reports a table of triples, which the decoder would read as pairs', () => {
    malformed(
      points('##PEAK TABLE=(XYW..XYW)', '400 1 0.5 401 2 0.5'),
      6,
      /`\(XYW\.\.XYW\)` table; only `\(XY\.\.XY\)` pairs/,
    );
  });
});

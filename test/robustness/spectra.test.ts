/**
 * Damaged spectrum files: whatever the bytes, reading gives a spectrum or a
 * reason with a line, never an exception, never a runaway expansion. Random
 * edits of valid JCAMP-DX files (every ASDF form) and random text.
 */
import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { readSpectrum } from '../../src/core';
import { runs } from './seed';

const JCAMP = [
  '##TITLE= t',
  '##JCAMP-DX= 4.24',
  '##XUNITS= 1/CM',
  '##YUNITS= ABSORBANCE',
  '##XFACTOR= 1',
  '##YFACTOR= 1',
  '##FIRSTX= 1',
  '##LASTX= 10',
  '##NPOINTS= 10',
  '##FIRSTY= 2000',
  '##XYDATA=(X++(Y..Y))',
  '1B000%JU%T',
  '7B003j%K',
  '##END=',
].join('\n');

const ASDF = '0123456789@ABCDEFGHIabcdefghi%JKLMNOPQRjklmnopqrSTUVWXYZs +-.,?$#=\n()xyz';

function checkRead(text: string, name: string): void {
  const r = readSpectrum(text, name);
  if (r.ok) {
    assert.equal(r.spectrum.x.length, r.spectrum.y.length);
    for (let i = 1; i < r.spectrum.x.length; i++) assert.ok(r.spectrum.x[i]! >= r.spectrum.x[i - 1]!, 'x sorted');
    for (const v of r.spectrum.y) assert.ok(Number.isFinite(v), 'finite y');
  } else {
    assert.equal(typeof r.message, 'string');
    assert.ok(r.line === null || (Number.isInteger(r.line) && r.line >= 1 && r.line <= text.split('\n').length + 1));
  }
}

describe('robustness: damaged spectrum files', () => {
  it('starts from a file that reads (DIFDUP over two lines with the Y check value)', () => {
    const r = readSpectrum(JCAMP, 'x.jdx');
    assert.ok(r.ok);
    assert.deepEqual([...r.spectrum.y], [2000, 2000, 2001, 2002, 2003, 2003, 2003, 2002, 2002, 2004]);
  });

  it('reads a JCAMP-DX file with random characters inserted, deleted or replaced', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.nat(), fc.constantFrom('insert', 'delete', 'replace'), fc.constantFrom(...ASDF)), {
          maxLength: 6,
        }),
        (edits) => {
          let t = JCAMP;
          for (const [at, kind, ch] of edits) {
            const i = at % (t.length + 1);
            t =
              kind === 'insert'
                ? t.slice(0, i) + ch + t.slice(i)
                : kind === 'delete'
                  ? t.slice(0, i) + t.slice(i + 1)
                  : t.slice(0, i) + ch + t.slice(i + 1);
          }
          checkRead(t, 'x.jdx');
        },
      ),
      runs(400),
    );
  });

  it('reads random text as a spectrum or says why, under every name', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 400 }), fc.constantFrom('a.jdx', 'a.csv', 'a.txt', 'a.dat'), (t, name) =>
        checkRead(t, name),
      ),
      runs(400),
    );
  });

  it('refuses a DUP count that would expand without bound, before decoding', () => {
    const r = readSpectrum(JCAMP.replace('7B003j%K', '7B003Z999999999'), 'x.jdx');
    assert.ok(!r.ok);
    assert.equal(r.line, 13);
  });
});

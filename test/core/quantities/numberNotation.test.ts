/**
 * Numbers a YAML file or a program may hold but a lab note's quantities do
 * not: other bases (`0x10`, `0o17` are integers in the YAML 1.2.2 core schema,
 * §10.3.2; `0b11` and `1_000` are YAML 1.1 forms), and decimals below the
 * smallest IEEE 754 binary64 number (about 4.9e-324), which `Number()` reads
 * as 0. Before, the first were read as a 0 or 1 with a "unit" `x10`, `_000`
 * (a diagnostic on the wrong range that named a unit nobody wrote), and
 * `ratio: 1e-400` became an empty upper level (T → 0⁺) with only a note.
 */
import { strict as assert } from 'node:assert';
import { problem, applyFirstFix, block } from '../helpers';

describe('numbers in other notations', () => {
  for (const [written, decimal, name] of [
    ['0x10', '16', 'hexadecimal'],
    ['0o17', '15', 'octal'],
    ['0b11', '3', 'binary'],
  ] as const) {
    it(`refuses the ${name} ${written} on the whole number, with a fix writing ${decimal}`, () => {
      const p = problem(`gap: 10 K\ncount: ${written}\nratio: 0.5`, 'number-invalid');
      assert.equal(p.severity, 'error');
      assert.equal(p.at, written);
      assert.match(p.message, new RegExp(name));
      assert.deepEqual(
        p.fixes.map((f) => [f.at, f.newText]),
        [[written, decimal]],
      );
    });
  }

  it('refuses a hexadecimal float without a fix, and a sign stays with the number', () => {
    const p = problem('gap: 0x1p3 K\nratio: 0.5', 'number-invalid');
    assert.equal(p.at, '0x1p3');
    assert.deepEqual(p.fixes, []);
    const n = problem(
      'levels:\n  - { energy: -0x10 K, population: 1 }\n  - { energy: 0 K, population: 0.5 }',
      'number-invalid',
    );
    assert.equal(n.at, '-0x10');
    assert.equal(n.fixes[0]?.newText, '-16');
  });

  it('refuses digits grouped with _ and offers them without it', () => {
    const p = problem('gap: 10 K\npopulations: [1_000, 500]', 'number-invalid');
    assert.equal(p.at, '1_000');
    assert.equal(
      applyFirstFix('gap: 10 K\npopulations: [1_000, 500]', 'number-invalid'),
      'gap: 10 K\npopulations: [1000, 500]',
    );
  });

  it('refuses a nonzero number below the double range instead of reading it as 0', () => {
    for (const body of ['gap: 10 K\nratio: 1e-400', 'gap: 1e-400 K\nratio: 0.5', 'gap: 10 K\nratio: 0.5 ± 1e-400']) {
      const p = problem(body, 'number-invalid');
      assert.equal(p.at, '1e-400');
      assert.match(p.message, /below the range of double precision/);
    }
  });

  it('still reads zeros, the smallest doubles and plain decimals', () => {
    // β = ln(n_l/n_u)/ΔE (docs/format.md, Conventions); 0 is an empty level, T → 0⁺.
    assert.equal(block('gap: 10 K\nratio: 0.5 ± 0e-400').report.results?.beta?.value, Math.log(2) / 10);
    assert.equal(block('gap: 10 K\nratio: 0.0').report.results?.limit, 'zero-positive');
    assert.equal(block('gap: 10 K\npopulations: [1, 5e-324]').report.status, 'normal');
    assert.equal(block('gap: 10 K\nratio: +.5').report.results?.beta?.value, Math.log(2) / 10);
  });
});

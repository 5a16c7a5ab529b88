import { strict as assert } from 'node:assert';
import { Analyzer } from '../../../src/core';
import { applyFirstFix, block, problem } from '../helpers';

// Every bad input named by the contract gets a clear diagnostic on the text
// that caused it, and never an exception. Expected codes are those documented
// in docs/format.md.
describe('bad input in a block', () => {
  it('rejects a negative population on the value itself', () => {
    const p = problem('gap: 1 K\npopulations: [0.7, -0.3]', 'population-negative');
    assert.equal(p.severity, 'error');
    assert.equal(p.at, '-0.3');
  });

  it('warns on a list or a mapping written as the id or the date, and keeps the block working without them', () => {
    const id = problem('id: [run, 7]\ngap: 1 K\nratio: 0.5', 'text-expected');
    assert.equal(id.severity, 'warning');
    assert.equal(id.at, '[run, 7]');
    assert.match(id.message, /`id` is a label/);
    const date = problem('date: { day: 17 }\ngap: 1 K\nratio: 0.5', 'text-expected');
    assert.equal(date.at, '{ day: 17 }');
    const { report } = block('id: [run, 7]\ngap: 1 K\nratio: 0.5');
    assert.equal(report.meta.id, null);
    assert.equal(report.status, 'normal');
  });

  it('never suggests for an unknown key one that its mapping has already (the fix would repeat the key)', () => {
    // `fiedl` is one swap from `field`, which the block has: no suggestion of it; alone, it is offered.
    const { report } = block('system: 13C\nfield: 9.4 T\nfiedl: 9.4 T\npolarization: 0.2');
    const p = report.problems.find((x) => x.code === 'key-unknown')!;
    assert.ok(!(p.fixes ?? []).some((f) => f.newText === 'field'), JSON.stringify(p.fixes));
    assert.doesNotMatch(p.message, /Did you mean `field`/);
    const alone = problem('system: 13C\nfiedl: 9.4 T\npolarization: 0.2', 'key-unknown');
    assert.deepEqual(
      alone.fixes.map((f) => f.newText),
      ['field'],
    );
    // The same in a level's mapping.
    const level = block(
      'levels:\n  - { energy: 0 K, population: 1, populaton: 2 }\n  - { energy: 1 K, population: 0.5 }',
    );
    const q = level.report.problems.find((x) => x.code === 'key-unknown')!;
    assert.ok(!(q.fixes ?? []).some((f) => f.newText === 'population'), JSON.stringify(q.fixes));
  });

  it('rejects a non-numeric population', () => {
    const p = problem('gap: 1 K\npopulations: [0.7, lots]', 'number-invalid');
    assert.equal(p.at, 'lots');
  });

  it('treats an empty upper level as T → 0⁺ with a note, not an error', () => {
    const { report } = block('gap: 1 K\npopulations: [1, 0]');
    assert.equal(report.status, 'normal');
    assert.equal(report.results?.limit, 'zero-positive');
    assert.equal(report.results?.temperature?.value, 0);
    assert.equal(report.results?.beta, null);
    assert.ok(report.problems.some((p) => p.code === 'temperature-zero' && p.severity === 'info'));
  });

  it('treats an empty lower level as a complete inversion (T → 0⁻)', () => {
    const { report } = block('gap: 1 K\npopulations: [0, 1]');
    assert.equal(report.status, 'inverted');
    assert.equal(report.results?.limit, 'zero-negative');
  });

  it('rejects all-zero populations', () => {
    assert.equal(problem('gap: 1 K\npopulations: [0, 0]', 'populations-zero').severity, 'error');
  });

  it('rejects levels that all share one energy', () => {
    const body = 'levels:\n  - { energy: 5 K, population: 0.5 }\n  - { energy: 5 K, population: 0.5 }';
    assert.equal(problem(body, 'energy-equal').severity, 'error');
  });

  it('rejects a zero or negative gap', () => {
    assert.equal(problem('gap: 0 K\npopulations: [0.7, 0.3]', 'gap-not-positive').at, '0 K');
  });

  it('reports a missing unit on a level energy and offers the unit the other levels use', () => {
    const body = 'levels:\n  - { energy: 0 cm-1, population: 0.7 }\n  - { energy: 120, population: 0.3 }';
    const p = problem(body, 'unit-missing');
    assert.equal(p.at, '120');
    assert.equal(p.fixes[0].newText, ' cm-1');
    assert.match(applyFirstFix(body, 'unit-missing'), /energy: 120 cm-1,/);
  });

  it('reports a wrong-case unit with a fix to the intended one', () => {
    const body = 'system: 1H\nfield: 9.4 MT\npolarization: 0.001';
    const p = problem(body, 'unit-case');
    assert.equal(p.at, 'MT');
    assert.equal(p.fixes[0].newText, 'mT');
    assert.equal(applyFirstFix(body, 'unit-case'), 'system: 1H\nfield: 9.4 mT\npolarization: 0.001');
  });

  it('reports an unknown isotope with a "did you mean" fix', () => {
    const p = problem('system: C13\nfield: 9.4 T\npolarization: 0.01', 'isotope-unknown');
    assert.equal(p.at, 'C13');
    assert.equal(p.fixes[0].newText, '13C');
    const q = problem('system: Unobtainium\nfield: 9.4 T\npolarization: 0.01', 'isotope-unknown');
    assert.equal(q.fixes.length, 0);
  });

  it('rejects populations and polarization together', () => {
    const p = problem(
      'system: 1H\nfield: 1 T\npopulations: [0.6, 0.4]\npolarization: 0.2',
      'populations-and-polarization',
    );
    assert.equal(p.at, 'polarization');
  });

  it('rejects a populations list of the wrong length for the spin, naming the spin', () => {
    const p = problem('system: 7Li\nfield: 1 T\npopulations: [0.6, 0.4]', 'populations-length');
    assert.match(p.message, /spin 3\/2/);
    assert.match(p.message, /needs 4 values/);
  });

  it('rejects |polarization| > 1 and suggests a fraction', () => {
    const p = problem('system: 13C\nfield: 7 T\npolarization: 31', 'polarization-range');
    assert.equal(p.at, '31');
    assert.match(p.message, /fraction/);
  });

  for (const bad of ['NaN', '.nan', 'Infinity', '.inf', '1e999', '-1e400']) {
    it(`rejects the number ${bad}`, () => {
      const p = problem(`gap: 1 K\nratio: ${bad}`, 'number-invalid');
      assert.equal(p.at, bad);
    });
  }

  it('reports malformed YAML at the place of the mistake', () => {
    const { report, text } = block('gap: 1 K\npopulations: [0.7, 0.3\nlattice: 4 K');
    const p = report.problems.find((x) => x.code === 'yaml-syntax');
    assert.ok(p, 'yaml-syntax expected');
    assert.equal(report.status, 'invalid');
    assert.ok(p.span.start >= text.indexOf('```levels') && p.span.end <= text.lastIndexOf('```'));
  });

  it('reports duplicate keys', () => {
    const p = problem('gap: 1 K\ngap: 2 K\nratio: 0.5', 'yaml-duplicate-key');
    assert.equal(p.severity, 'error');
  });

  it('reports a body that is not a mapping', () => {
    assert.equal(problem('- 1\n- 2', 'body-not-mapping').severity, 'error');
    assert.equal(problem('just words', 'body-not-mapping').severity, 'error');
  });

  it('reports an empty block', () => {
    const { report } = new Analyzer().analyzeText('```levels\n```\n').blocks.map((r) => ({ report: r }))[0];
    assert.equal(report.status, 'invalid');
    assert.equal(report.problems[0].code, 'block-empty');
  });

  it('warns about an unclosed fence on the opening line and still analyses the block', () => {
    const text = 'x\n```levels\ngap: 1 K\nratio: 0.5\n';
    const [r] = new Analyzer().analyzeText(text).blocks;
    const p = r.problems.find((x) => x.code === 'fence-unclosed');
    assert.ok(p);
    assert.equal(text.slice(p.span.start, p.span.end), '```levels');
    assert.equal(r.status, 'normal');
  });

  it('stops an alias bomb in milliseconds with an error instead of expanding it', () => {
    const lines = ['a0: &a0 [x, x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < 12; i++)
      lines.push(
        `a${i}: &a${i} [${Array(10)
          .fill(`*a${i - 1}`)
          .join(', ')}]`,
      );
    const body = `gap: 1 K\nratio: 0.5\nnote:\n  ${lines.join('\n  ')}`;
    const started = process.hrtime.bigint();
    const p = problem(body, 'alias-expansion');
    // Not a timing assertion on speed, only a guard that it did not hang (10^12 nodes would).
    assert.ok(Number(process.hrtime.bigint() - started) / 1e9 < 30);
    assert.equal(p.severity, 'error');
  });

  it('allows modest anchors and aliases', () => {
    const { report } = block('gap: &g 1 K\npopulations: &p [0.7, 0.3]\nnote: *p');
    assert.equal(report.status, 'normal');
  });

  it('warns about an unknown key with a suggestion, and still analyses', () => {
    const p = problem('gap: 1 K\nratio: 0.5\nlatice: 4 K', 'key-unknown');
    assert.equal(p.severity, 'warning');
    assert.equal(p.fixes[0].newText, 'lattice');
    assert.equal(block('gap: 1 K\nratio: 0.5\nlatice: 4 K').report.status, 'normal');
  });

  it('asks for one of the three forms when none is given, and for one only when two are', () => {
    assert.equal(problem('id: x\nlattice: 4 K', 'form-missing').severity, 'error');
    assert.equal(problem('gap: 1 K\nsystem: 1H\nratio: 0.5', 'form-conflict').at, 'system');
  });

  it('says on `populations`, `polarization` or `ratio` which form is missing when they come without one', () => {
    // notebook-format.md: populations fill a spin's Zeeman levels (`system` + `field`) or a transition (`gap`);
    // a polarization is a spin's, a ratio a transition's.
    const p = problem('id: x\npopulations: [0.5, 0.3]', 'form-missing');
    assert.equal(p.at, 'populations');
    assert.match(p.message, /^populations: .*`system:` with `field:`.*`gap:`/);
    assert.match(problem('polarization: 0.2', 'form-missing').message, /^polarization: .*`system:` with `field:`/);
    assert.doesNotMatch(problem('polarization: 0.2', 'form-missing').message, /gap/);
    assert.match(problem('ratio: 0.2\nnote: n', 'form-missing').message, /^ratio: .*`gap:`/);
    assert.equal(problem('id: x\nlattice: 4 K', 'form-missing').at, 'id: x');
  });

  it('keeps every other block of the note working when one block is broken', () => {
    const text =
      '```levels\ngap: 1 K\nratio: 0.5\n```\n```levels\ngap: [\n```\n```levels\nsystem: 1H\nfield: 1 T\npolarization: 0.5\n```\n';
    const statuses = new Analyzer().analyzeText(text).blocks.map((b) => b.status);
    assert.deepEqual(statuses, ['normal', 'invalid', 'normal']);
  });

  it('analyses the blocks of a 20 MB note', () => {
    const unit = '```levels\ngap: 1 K\npopulations: [0.7, 0.3]\n```\nprose\n';
    const n = Math.ceil(20e6 / unit.length);
    const report = new Analyzer().analyzeText(unit.repeat(n));
    assert.equal(report.blocks.length, n);
    // Identical bodies are analysed once and reused.
    assert.equal(report.stats.analysed, 1);
    assert.ok(report.blocks.every((b) => b.status === 'normal'));
  });
});

describe('tidy-ups offered as fixes', () => {
  it('offers to list levels written from the top down lowest first, keeping each item as written', () => {
    const body =
      'levels:\n  - { label: B, energy: 410 cm-1, g: 5, population: 0.05 }  # top\n  - { label: A, energy: 120 cm-1, g: 3, population: 0.25 }\n  - { label: ground, energy: 0 cm-1, population: 0.70 }';
    const p = problem(body, 'levels-descending');
    assert.equal(p.severity, 'info');
    assert.equal(p.at, 'levels');
    assert.equal(
      applyFirstFix(body, 'levels-descending'),
      'levels:\n  - { label: ground, energy: 0 cm-1, population: 0.70 }  # top\n  - { label: A, energy: 120 cm-1, g: 3, population: 0.25 }\n  - { label: B, energy: 410 cm-1, g: 5, population: 0.05 }',
    );
    // Reading is unaffected: the same results either way.
    const fixed = block(applyFirstFix(body, 'levels-descending')).report.results!;
    assert.equal(block(body).report.results!.beta!.value, fixed.beta!.value);
  });
});

import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { Analyzer, csvText, curveCsv, curveData, RunLog, runLogCsv, type CurvePayload } from '../../../src/core';
import { main } from '../../../src/cli/main';
import { runs } from '../../robustness/seed';

// The reader of every check here is csv-parse, a general-purpose CSV parser
// independent of this code; the rules are RFC 4180 §2 and OWASP's "CSV
// Injection" page (owasp.org/www-community/attacks/CSV_Injection).

const read = (text: string): string[][] => parse(text, { relax_column_count: true }) as string[][];

/** What a spreadsheet could take as a formula: text starting with =, +, -, @, tab or CR that is not a number. */
function formulaLike(field: string): boolean {
  return /^[=+\-@\t\r]/.test(field) && !Number.isFinite(Number(field));
}

/** Ids a note may give that a spreadsheet would run, and the one that must stay a number. */
const HOSTILE_IDS = ['=1+1', '+1+1', '-1+2', '@SUM(A1)', '\t=1+1', '\r=1+1', '=HYPERLINK("http://x","y")'];

describe('the CSV writer', () => {
  it('follows RFC 4180 §2: CRLF after every record, quotes around quotes, commas and line breaks', () => {
    assert.equal(
      csvText([
        ['a', 'b,c', 'say "hi"'],
        ['line\nbreak', 'cr\rhere', null],
      ]),
      'a,"b,c","say ""hi"""\r\n"line\nbreak","cr\rhere",\r\n',
    );
  });

  it('writes numbers in full precision that read back as the same double, and unknowns as empty fields', () => {
    const values = [Math.PI, -1e-300, 6.02214076e23, -2.5e-7, 0.1 + 0.2];
    const [row] = read(csvText([[...values, NaN, Infinity, null]]));
    assert.deepEqual(row!.slice(0, 5).map(Number), values);
    assert.deepEqual(row!.slice(5), ['', '', '']);
  });

  it('puts a quote before text a spreadsheet would run as a formula, never before a plain number', () => {
    const [row] = read(csvText([[...HOSTILE_IDS, '-5', '+2.5e-3', '-.5', -7, 'a=1', ' =1']]));
    assert.deepEqual(row, [...HOSTILE_IDS.map((s) => `'${s}`), '-5', '+2.5e-3', '-.5', '-7', 'a=1', ' =1']);
  });

  it('reads back every field as written (with the guard), and leaves nothing formula-like', () => {
    const text = fc.string({
      unit: fc.constantFrom('a', '=', '+', '-', '@', '\t', '\r', '\n', ',', '"', '1', '.', 'e', ' ', "'"),
    });
    const field = fc.oneof(text, fc.double(), fc.constant(null));
    fc.assert(
      fc.property(fc.array(fc.array(field, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 5 }), (rows) => {
        const back = read(csvText(rows));
        assert.equal(back.length, rows.length);
        rows.forEach((row, i) =>
          row.forEach((v, j) => {
            const got = back[i]![j]!;
            assert.ok(!formulaLike(got), JSON.stringify(got));
            if (v === null || (typeof v === 'number' && !Number.isFinite(v))) assert.equal(got, '');
            else if (typeof v === 'number') assert.ok(Object.is(Number(got), v) || (v === 0 && Number(got) === 0));
            else assert.ok(got === v || got === `'${v}`, `${JSON.stringify(v)} came back as ${JSON.stringify(got)}`);
          }),
        );
      }),
      runs(500),
    );
  });
});

describe('every CSV export writes note text through the writer', () => {
  const note = (id: string): string =>
    `\`\`\`levels\nid: ${JSON.stringify(id)}\ngap: 10 K\npopulations: [0.7, 0.3]\n\`\`\`\n`;

  it('the run log guards ids that start with a tab or a carriage return, as well as =, +, - and @', () => {
    for (const id of HOSTILE_IDS) {
      const log = new RunLog(new Analyzer());
      log.update('file:///n.md', 'n.md', note(id));
      const [, row] = read(runLogCsv(log.entries()));
      assert.equal(row![2], `'${id}`, JSON.stringify(id));
    }
  });

  it('the curve export guards the same ids in the same way', () => {
    for (const id of HOSTILE_IDS) {
      const b = new Analyzer().analyzeText(note(id)).blocks[0]!;
      const p = curveData(b, { uri: 'file:///n.md', version: 1 }) as CurvePayload;
      const rows = read(curveCsv([p]));
      assert.ok(
        rows.slice(1).every((r) => r[0] === `'${id}`),
        JSON.stringify(id),
      );
    }
  });

  it('`report --format csv` guards the ids and the file names', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-csv-'));
    try {
      const file = join(dir, '=cmd.md');
      writeFileSync(file, HOSTILE_IDS.map(note).join('\n'));
      let out = '';
      const code = main(['report', '-f', 'csv', file], { out: (s) => (out += s), err: () => {}, cwd: dir });
      assert.equal(code, 0);
      const rows = read(out).slice(1);
      assert.deepEqual(
        rows.map((r) => r[2]),
        HOSTILE_IDS.map((id) => `'${id}`),
      );
      for (const r of rows) for (const field of r) assert.ok(!formulaLike(field), JSON.stringify(field));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

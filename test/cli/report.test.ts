import { strict as assert } from 'node:assert';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { main } from '../../src/cli/main';
import { CONTRACT_FIELDS } from '../support/contractFields';

function run(args: string[], cwd = process.cwd(), columns?: number): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(args, { out: (s) => (out += s), err: (s) => (err += s), cwd, ...(columns ? { columns } : {}) });
  return { code, out, err };
}

describe('boltzmark report', () => {
  it('prints the JSON array of the contract for the demo notebook, field by field', () => {
    const { code, out } = run(['report', 'demo', '--format', 'json']);
    assert.equal(code, 1, 'the demo has one block with deliberate errors');
    const entries = JSON.parse(out) as Record<string, unknown>[];
    assert.ok(entries.length >= 9);
    for (const e of entries) {
      for (const f of CONTRACT_FIELDS) assert.ok(f in e, `field ${f} present`);
      assert.ok(['normal', 'saturated', 'inverted', 'non-thermal', 'invalid'].includes(e.status as string));
      for (const f of ['beta', 'temperature', 'polarization']) {
        const m = e[f] as { value: number; uncertainty: number | null } | null;
        if (m !== null) {
          assert.equal(typeof m.value, 'number');
          assert.ok(m.uncertainty === null || typeof m.uncertainty === 'number');
        }
      }
      for (const d of e.diagnostics as Record<string, unknown>[]) {
        assert.ok(['error', 'warning', 'info'].includes(d.severity as string));
        assert.match(d.code as string, /^[a-z]+(-[a-z]+)*$/);
        assert.equal(typeof d.line, 'number');
      }
    }
    // Files in name order, blocks in line order.
    const keys = entries.map((e) => `${String(e.file)}:${String(e.line).padStart(5, '0')}`);
    assert.deepEqual(keys, [...keys].sort());
    const run1 = entries.find((e) => e.id === 'cell-B run 1')!;
    assert.equal(run1.file, 'demo/polarizer-log.md');
    assert.equal(run1.status, 'normal');
    assert.equal(Math.round((run1.beta as { value: number }).value * 100) / 100, 178.17);
    const statuses = new Set(entries.map((e) => e.status));
    for (const s of ['normal', 'saturated', 'inverted', 'non-thermal', 'invalid'])
      assert.ok(statuses.has(s), `demo covers ${s}`);
  });

  it('prints a table with the block locations and the problems of the broken block', () => {
    const { out } = run(['report', 'demo/polarizer-log.md', '--wide']);
    assert.match(out, /^where\s+id\s+status\s+T\s+β/m);
    assert.match(out, /demo\/polarizer-log\.md:26\s+cell-B run 1\s+normal\s+5\.61 ± 0\.19 mK/);
    assert.match(out, /demo\/polarizer-log\.md:86:13: error unit-case/);
  });

  it('prints CSV with a header and one row per block', () => {
    const { out } = run(['report', 'demo', '-f', 'csv']);
    const rows = out.trim().split('\r\n');
    assert.equal(rows[0].split(',')[0], 'file');
    assert.equal(rows.length - 1, (JSON.parse(run(['report', 'demo', '-f', 'json']).out) as unknown[]).length);
    assert.ok(rows.some((r) => r.startsWith('demo/pumped-cell.md,') && r.includes('"cell P-4, pump on"')));
  });

  it('exits 0 when no block has an error, and reports a broken block next to good ones', () => {
    const dir = mkdtempSync(join(tmpdir(), 'bm-'));
    writeFileSync(join(dir, 'ok.md'), '```levels\ngap: 1 K\nratio: 0.5\n```\n');
    assert.equal(run(['report', dir]).code, 0);
    writeFileSync(join(dir, 'z.md'), '```levels\ngap: [\n```\n```levels\ngap: 2 K\nratio: 0.5\n```\n');
    const r = run(['report', dir, '-f', 'json']);
    assert.equal(r.code, 1);
    const entries = JSON.parse(r.out) as { status: string }[];
    assert.deepEqual(
      entries.map((e) => e.status),
      ['normal', 'invalid', 'normal'],
    );
  });

  it('exits 2 with one line on stderr for an unknown option or an unknown format', () => {
    for (const args of [
      ['report', 'demo', '--bogus'],
      ['report', 'demo', '-f', 'xml'],
      ['report', '-', '-'],
    ]) {
      const r = run(args);
      assert.equal(r.code, 2, args.join(' '));
      assert.equal(r.out, '');
      assert.equal(r.err.trim().split('\n').length, 1, r.err);
      assert.match(r.err, /^boltzmark: /);
    }
  });

  it('runs as the bundled command with the exit status of the contract', () => {
    const r = spawnSync(process.execPath, ['dist/cli.js', 'report', 'demo', '--format', 'json'], { encoding: 'utf8' });
    assert.equal(r.status, 1);
    assert.ok(Array.isArray(JSON.parse(r.stdout)));
    const bad = spawnSync(process.execPath, ['dist/cli.js', 'report', '--nope'], { encoding: 'utf8' });
    assert.equal(bad.status, 2);
  });
});

/** Widest line of a text, in characters (code points), as a terminal counts them for these scripts. */
const widest = (text: string): number => Math.max(...text.split('\n').map((l) => [...l].length));

describe('boltzmark report: a table that fits the terminal', () => {
  it('keeps every line of the demo report within 100 columns by default and says what it left out', () => {
    // 100 columns: the width this project takes for an ordinary terminal (common practice, no source).
    const { out } = run(['report', 'demo']);
    assert.ok(widest(out) <= 100, `widest line ${widest(out)}`);
    assert.match(out, /left out to fit 100 columns; --wide shows every column/);
    // ε and the measurement results move under their row rather than vanish: T₁ with its uncertainty.
    assert.match(out, /^ {4}T₁ = \d+(\.\d+)? ± \d+(\.\d+)? s$/m);
    assert.match(out, /^ {4}ε = 241\.1 ± 7\.7$/m);
    // A skewed T keeps its value in the column; its k = 2 interval moves under the row rather than vanish,
    // its ends rounded outward (the computed interval is about 8111 … 10441 K).
    assert.match(out, /^ {4}T \(8100 … 10500 K, 95 %\)/m);
  });

  it('fits a note whose id and unit are each a pasted 100,000 characters, and keeps the id whole in JSON', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-huge-'));
    const id = 'I'.repeat(100_000);
    const unit = 'K'.repeat(100_000);
    writeFileSync(
      join(dir, 'pasted.md'),
      `\`\`\`levels\nid: ${id}\ngap: 1 K\nratio: 0.5\n\`\`\`\n\n\`\`\`levels\nid: short\ngap: 1 ${unit}\nratio: 0.5\n\`\`\`\n`,
    );
    const { out } = run(['report', 'pasted.md'], dir);
    assert.ok(widest(out) <= 100, `widest line ${widest(out)}`);
    assert.match(out, /^pasted\.md:1 +I{10,}… +normal/m);
    // The message quotes the unit's beginning, clipped to 60 characters, and still names the units it wants.
    assert.match(out, /Unknown unit\s+`K{59}…`/);
    assert.match(out, /cm-1/);
    const json = JSON.parse(run(['report', 'pasted.md', '--format', 'json'], dir).out) as {
      id: string;
      diagnostics: { message: string }[];
    }[];
    assert.equal(json[0]!.id, id);
    const message = json[1]!.diagnostics[0]!.message;
    assert.ok(message.length < 400, `${message.length} characters`);
    assert.ok(message.includes(`\`${'K'.repeat(59)}…\``), message);
  });

  it('follows the terminal width it is given, and --wide prints every column at any width', () => {
    const narrow = run(['report', 'demo'], process.cwd(), 90).out;
    assert.ok(widest(narrow) <= 90, `widest line ${widest(narrow)}`);
    const broad = run(['report', 'demo'], process.cwd(), 250).out;
    assert.match(broad, /^where\s+id\s+status\s+T\s+β \(K⁻¹\)\s+P\s+P_th\s+ε\s+also$/m);
    const wide = run(['report', 'demo', '--wide'], process.cwd(), 80).out;
    assert.match(wide, /^where\s+id\s+status\s+T\s+β \(K⁻¹\)\s+P\s+P_th\s+ε\s+also$/m);
    assert.ok(widest(wide) > 100);
  });

  it('writes P and P_th in one unit per column, small values with a power of ten in %', () => {
    const { out } = run(['report', 'demo/polarizer-log.md', '--wide']);
    const rows = out.split('\n').filter((l) => /^demo\/polarizer-log\.md:\d+ /.test(l));
    const cells = rows.map((l) => l.split(/ {2,}/));
    const head = out.split('\n')[0].split(/ {2,}/);
    for (const column of ['P', 'P_th']) {
      const i = head.indexOf(column);
      for (const c of cells.map((r) => r[i]).filter((c) => c !== undefined && c !== '—'))
        assert.match(c, / %$/, `${column} cell ${c}`);
    }
    // 13C at 7.05 T and 298 K (the demo's reference run): P_th ≈ 8.1 × 10⁻⁶, i.e. 8.1 × 10⁻⁴ % — the
    // thermal value from the Brillouin (tanh) form, hand-computed from γ/2π = 10.7084 MHz/T (CODATA-based
    // value in src/core/quantities/isotopes.ts) and the exact SI h and k.
    assert.match(out, /ref-13C Monday.*\(8\.10 ± 0\.30\) × 10⁻⁴ %/);
  });

  it('gives ε, T₁/τ, g₀, the single-pass gain and the threshold with their uncertainties in JSON and CSV', () => {
    const entries = JSON.parse(run(['report', 'demo', '--format', 'json']).out) as Record<string, unknown>[];
    const run7 = entries.find((e) => e.id === 'cell-B run 1')!;
    // u(ε) = u(P)/P_th by first-order propagation (JCGM 100:2008 §5.1.2, lattice exact):
    // 0.010 / 0.0012940 = 7.73 (P = 0.312 ± 0.010 as the demo gives it; P_th from the analysis test's source).
    assert.ok(Math.abs((run7.enhancementUncertainty as number) - 0.01 / (run7.thermalPolarization as number)) < 1e-9);
    assert.equal(typeof run7.enhancement, 'number');
    const csv = run(['report', 'demo', '--format', 'csv']).out.trim().split('\r\n');
    const head = csv[0].split(',');
    for (const column of [
      'enhancement_uncertainty',
      'time_constant_s',
      'time_constant_uncertainty_s',
      'gain_coefficient_per_cm',
      'gain_coefficient_uncertainty_per_cm',
      'single_pass_gain',
      'single_pass_gain_uncertainty',
      'threshold_gain_per_cm',
    ])
      assert.ok(head.includes(column), column);
    const decay = csv.find((l) => l.includes('run 4 decay'))!.split(',');
    assert.ok(Number(decay[head.indexOf('time_constant_s')]) > 0);
    assert.ok(Number(decay[head.indexOf('time_constant_uncertainty_s')]) > 0);
    const gain = csv.find((l) => l.includes('rod 2 gain'))!.split(',');
    assert.ok(Number(gain[head.indexOf('gain_coefficient_per_cm')]) > 0);
    assert.ok(Number(gain[head.indexOf('threshold_gain_per_cm')]) > 0);
  });

  it('accepts status words in any case', () => {
    const r = run(['report', 'demo', '--status', 'Inverted,NON-THERMAL', '--format', 'json']);
    const statuses = new Set((JSON.parse(r.out) as { status: string }[]).map((e) => e.status));
    assert.deepEqual([...statuses].sort(), ['inverted', 'non-thermal']);
  });
});

describe('README', () => {
  it('shows the report row that the CLI really prints for its example block', () => {
    const readme = readFileSync('README.md', 'utf8');
    const body = /```levels\n([\s\S]*?)```/.exec(readme)![1];
    const dir = mkdtempSync(join(tmpdir(), 'bm-'));
    writeFileSync(join(dir, 'run7.md'), `# Run 7\n\n\`\`\`levels\n${body}\`\`\`\n`);
    // --wide: the temporary folder's long path would otherwise leave β out to fit 100 columns.
    const { out } = run(['report', join(dir, 'run7.md'), '--wide']);
    const printed = out.split('\n')[2].replace(/^\S+/, '').trim().replace(/\s+/g, ' ');
    const shown = /^run7\.md:3\s+(.*)$/m.exec(readme)![1].trim().replace(/\s+/g, ' ');
    assert.equal(shown, printed);
  });
});

describe('boltzmark report: Markdown output and status filter', () => {
  it('prints a Markdown table whose cells escape note text', () => {
    const dir = mkdtempSync(join(tmpdir(), 'bm-'));
    writeFileSync(
      join(dir, 'x.md'),
      '```levels\nid: "a|b <img src=x onerror=alert(1)>"\ngap: 10 K\nratio: 0.50 ± 0.01\n```\n',
    );
    const { out, code } = run(['report', dir, '--format', 'markdown']);
    assert.equal(code, 0);
    const lines = out.trim().split('\n');
    assert.match(lines[0], /^\| where \| id \| status \| T \|/);
    assert.match(lines[1], /^\| --- \|/);
    // Every Markdown character of the id escaped (CommonMark 0.31.2 §2.4); test/cli/literal.test.ts renders it.
    assert.ok(lines[2].includes('a\\|b \\<img src\\=x onerror\\=alert\\(1\\)\\>'), lines[2]);
    // T = (ΔE/k)/ln(1/r) = 14.426950 K with ΔE/k = 10 K, r = 0.50; u(T) = |T|·u(r)/(r·|ln r|) = 0.416274 K by the
    // law of propagation (JCGM 100:2008 §5.1.2, eq. 10), rounded to two significant digits of u (§7.2.6): 14.43 ± 0.42 K.
    assert.ok(lines[2].includes('14.43 ± 0.42 K'));
    // No block has P_th, ε or anything else to add, so those columns are left out: six cells remain.
    assert.equal(lines[2].split(/(?<!\\)\|/).length, 8, 'six cells');
    assert.doesNotMatch(lines[0], /P_th|ε|also/);
  });

  it('keeps only the blocks with the requested statuses, while the exit status still covers all', () => {
    const { out, code } = run(['report', 'demo', '-f', 'json', '--status', 'inverted,non-thermal']);
    const entries = JSON.parse(out) as { status: string }[];
    assert.ok(entries.length >= 2);
    assert.ok(entries.every((e) => e.status === 'inverted' || e.status === 'non-thermal'));
    assert.equal(code, 1, 'the demo still has a block with errors');
  });

  it('refuses an unknown status word with exit 2', () => {
    const r = run(['report', 'demo', '--status', 'hot']);
    assert.equal(r.code, 2);
    assert.match(r.err, /unknown status 'hot'/);
  });
});

describe('boltzmark check', () => {
  it('prints compiler-style lines for the demo and exits 1 on its errors', () => {
    const r = run(['check', 'demo']);
    assert.equal(r.code, 1);
    const lines = r.out.trim().split('\n');
    for (const l of lines) assert.match(l, /^[^:]+:\d+:\d+: (error|warning|info) [a-z-]+ .+$/);
    assert.ok(
      lines.includes('demo/polarizer-log.md:86:13: error unit-case field: Units are case-sensitive: `MT` is not `mT`.'),
      lines.join('\n'),
    );
    assert.match(r.err, /error\(s\)/);
  });

  it('exits 0 with no output lines on a clean notebook', () => {
    const dir = mkdtempSync(join(tmpdir(), 'bm-'));
    writeFileSync(join(dir, 'ok.md'), '```levels\ngap: 1 K\nratio: 0.5\n```\n');
    const r = run(['check', dir]);
    assert.equal(r.code, 0);
    assert.equal(r.out, '');
  });

  it('reports a missing path as an error line and exits 2, a usage error', () => {
    const r = run(['check', 'no/such']);
    assert.equal(r.code, 2);
    assert.equal(r.out, "no/such:1:1: error file-unreadable Cannot read 'no/such': no such file or folder.\n");
  });
});

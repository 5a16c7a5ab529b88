import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateNote } from '../../bench/note';
import {
  Analyzer,
  LineIndex,
  MAX_BLOCK_PROBLEMS,
  SERVER_BLOCK_CHARS,
  type BlockReport,
  type DocumentReport,
} from '../../src/core';
import { SERVER_LIMITS } from '../../src/server/notes';
import { AnalysisStatsRequest } from '../../src/shared/protocol';
import { startLsp } from '../protocol/lspClient';

// Hostile input, one test each: nothing may throw, hang or take the editor
// down, whatever a note contains. "Returns" means within the mocha timeout;
// no test measures speed (that is for `npm run bench`).

function analyse(text: string, analyzer = new Analyzer()): DocumentReport {
  return analyzer.analyzeText(text);
}

function only(text: string): BlockReport {
  const r = analyse(text);
  assert.equal(r.blocks.length, 1, `${r.blocks.length} blocks`);
  return r.blocks[0]!;
}

const codes = (b: BlockReport): string[] => b.problems.map((p) => p.code);
const fenced = (body: string): string => `# note\n\n\`\`\`levels\n${body}\n\`\`\`\n`;
const GOOD = ['id: cell-B run 7', 'system: 13C', 'field: 7.05 T', 'lattice: 1.4 K', 'polarization: 0.312 ± 0.010'];

describe('robustness: hostile input', function () {
  this.timeout(120000);

  it('refuses a YAML alias bomb without expanding it', () => {
    const letters = 'abcdefghijklmnopqrstu';
    const lines = ['a: &a [x, x, x, x, x, x, x, x, x]'];
    for (let i = 1; i < letters.length; i++)
      lines.push(
        `${letters[i]}: &${letters[i]} [${Array(9)
          .fill(`*${letters[i - 1]}`)
          .join(', ')}]`,
      );
    // Expanded, the last list would hold 9^21 ≈ 10^20 nodes.
    const b = only(fenced(lines.join('\n')));
    assert.equal(b.status, 'invalid');
    assert.deepEqual(codes(b), ['alias-expansion']);
  });

  for (const [name, body] of [
    ['flow sequences nested 10,000 deep', `levels: ${'['.repeat(10000)}${']'.repeat(10000)}`],
    ['flow mappings nested 10,000 deep', `levels: ${'{a: '.repeat(10000)}1${'}'.repeat(10000)}`],
    [
      'block mappings nested 10,000 deep',
      Array.from({ length: 10000 }, (_, i) => `${' '.repeat(i)}a:`).join('\n') + ' 1',
    ],
    ['a flow sequence opened 10,000 times and never closed', `levels: ${'['.repeat(10000)}`],
  ] as const) {
    it(`reads ${name} as an invalid block with a YAML error`, () => {
      const b = only(fenced(body));
      assert.equal(b.status, 'invalid');
      assert.ok(
        b.problems.some((p) => p.severity === 'error'),
        codes(b).join(', '),
      );
    });
  }

  // Each shape nested `depth` deep under `note:` (the body's own mapping is one more level), and where the
  // collection that makes it `depth` deep opens.
  const NESTED: readonly [string, (depth: number) => string][] = [
    ['flow lists', (d) => `note: ${'['.repeat(d)}${']'.repeat(d)}`],
    ['flow mappings', (d) => `note: ${'{a: '.repeat(d)}1${'}'.repeat(d)}`],
    [
      'block mappings',
      (d) => 'note:\n' + Array.from({ length: d }, (_, i) => `${' '.repeat(i + 1)}k${i}:`).join('\n') + ' 1',
    ],
    ['block lists', (d) => 'note:\n' + Array.from({ length: d }, (_, i) => `${' '.repeat(i + 1)}-`).join('\n') + ' 1'],
  ];
  const innermost = (body: string, d: number, shape: string): number => {
    // The d-th collection under `note:`: the d-th `[` or `{`, or the d-th nested key or dash, which is
    // indented d spaces on the line after the two routine lines, `note:` and d - 1 nested lines.
    if (shape.startsWith('flow')) {
      let at = -1;
      for (let i = 0; i < d; i++) at = body.slice(at + 1).search(/[[{]/) + at + 1;
      return at;
    }
    const before = body.split('\n').slice(0, d + 2);
    return before.join('\n').length + 1 + d;
  };
  const ROUTINE = 'gap: 1 K\nratio: 0.5\n';

  for (const [shape, nest] of NESTED) {
    it(`reads ${shape} nested 63 deep under a key (64 with the body) and refuses 64, at the list or mapping past the bound`, () => {
      const fits = only(fenced(ROUTINE + nest(63)));
      assert.equal(fits.status, 'normal', codes(fits).join(', '));
      // The same body through the package's composer (an anchor keeps it off the plain-body path) fits too.
      const composed = only(fenced(ROUTINE + nest(63).replace('note:', 'note: &deep')));
      assert.equal(composed.status, 'normal', codes(composed).join(', '));
      const text = fenced(ROUTINE + nest(64));
      const over = only(text);
      assert.equal(over.status, 'invalid');
      assert.deepEqual(codes(over), ['nesting-too-deep']);
      const p = over.problems[0]!;
      const bodyStart = text.indexOf(ROUTINE);
      assert.equal(p.span.start - bodyStart, innermost(ROUTINE + nest(64), 64, shape));
      assert.match(p.message, /64/);
    });
  }

  it('refuses nesting from 500 to 1,000 deep the same way each time, in a fresh reader and in a warm one, and reads the blocks around it', () => {
    // Past the bound the answer must not depend on how much stack the engine has left: once, this range was
    // read or refused (with a stack overflow's message) depending on what the process had run before.
    const warm = new Analyzer();
    for (let d = 500; d <= 1000; d += 50)
      for (const [shape, nest] of NESTED) {
        const text = `${fenced(ROUTINE + 'id: a')}${fenced(ROUTINE + nest(d))}${fenced(ROUTINE + 'id: b')}`;
        for (const r of [analyse(text), analyse(text, warm)]) {
          assert.deepEqual(
            r.blocks.map((b) => b.status),
            ['normal', 'invalid', 'normal'],
            `${shape} ${d}`,
          );
          assert.deepEqual(codes(r.blocks[1]!), ['nesting-too-deep'], `${shape} ${d}`);
        }
      }
  });

  it('analyses a block of 100,000 levels completely when unbounded (the command line), back to the β it was made at', () => {
    const beta = 1 / 5000;
    const lines = ['id: huge', 'levels:'];
    for (let i = 0; i < 100_000; i++) lines.push(`  - { energy: ${i} K, population: ${Math.exp(-beta * i)} }`);
    const b = only(fenced(lines.join('\n')));
    assert.equal(b.status, 'normal', codes(b).join(', '));
    assert.equal(b.input?.levels.length, 100_000);
    assert.ok(Math.abs(b.results!.beta!.value - beta) < 1e-9 * beta, String(b.results?.beta?.value));
  });

  it('lists at most 100 problems of a block, errors first, and says how many more there are', () => {
    // 150 unknown keys (warnings), then one error at the end of the body: the error is listed, the warnings fill up.
    const body = [...GOOD, ...Array.from({ length: 150 }, (_, i) => `extra${i}: 1`), 'field-bad: [1'].join('\n');
    const b = only(fenced(body));
    assert.equal(b.status, 'invalid');
    assert.equal(b.problems.length, MAX_BLOCK_PROBLEMS + 1);
    const first = b.problems[0]!;
    assert.equal(first.code, 'problems-not-listed');
    assert.equal(first.severity, 'info');
    const all = new Analyzer().analyzeText(fenced(body)).blocks[0]!;
    assert.equal(all.problems.length, MAX_BLOCK_PROBLEMS + 1, 'the same from a warm reader');
    assert.ok(
      b.problems.some((p) => p.severity === 'error'),
      'the error at the end is among those listed',
    );
    const errors = b.problems.filter((p) => p.severity === 'error').length;
    const warnings = b.problems.filter((p) => p.severity === 'warning').length;
    assert.equal(errors + warnings, MAX_BLOCK_PROBLEMS);
    // The note counts what is left out: every problem above the hundred.
    const left = Number(/has ([\d,]+) more problems?/.exec(first.message)![1]!.replace(/,/g, ''));
    assert.ok(left >= 51, first.message);
    const starts = b.problems.map((p) => p.span.start);
    assert.deepEqual(
      starts,
      [...starts].sort((x, y) => x - y),
      'in body order',
    );
    // A block with a hundred problems or fewer lists them all, without the note.
    const few = only(fenced([...GOOD, ...Array.from({ length: 20 }, (_, i) => `extra${i}: 1`)].join('\n')));
    assert.equal(few.problems.length, 20);
    assert.ok(few.problems.every((p) => p.code === 'key-unknown'));
  });

  it('gives a pasted log of 50,000 broken lines a bounded list of problems', () => {
    const body = Array.from({ length: 50_000 }, (_, i) => `key${i}: [${i}`).join('\n');
    const b = only(`# note\n\n\`\`\`levels\n${body}\n`);
    assert.equal(b.status, 'invalid');
    // The unclosed fence is the note's finding, besides the body's own list.
    const own = b.problems.filter((p) => p.code !== 'fence-unclosed');
    assert.equal(own.length, MAX_BLOCK_PROBLEMS + 1, `${b.problems.length} problems`);
    assert.match(b.problems.find((p) => p.code === 'problems-not-listed')!.message, /errors/);
  });

  it('does not read one block past the server bound on a body, says so on its first line, and reads the blocks around it', () => {
    const levels = ['levels:'];
    for (let i = 0, length = 0; length <= SERVER_BLOCK_CHARS; i++) {
      levels.push(`  - { energy: ${i} K, population: ${Math.exp(-i / 5000)} }`);
      length += levels[levels.length - 1]!.length + 1;
    }
    const huge = levels.join('\n');
    const text = `${fenced(GOOD.join('\n'))}${fenced(huge)}${fenced(GOOD.join('\n'))}`;
    const r = analyse(text, new Analyzer({ limits: SERVER_LIMITS }));
    assert.deepEqual(
      r.blocks.map((b) => b.status),
      ['normal', 'invalid', 'normal'],
    );
    const big = r.blocks[1]!;
    assert.deepEqual(codes(big), ['block-large']);
    const lines = new LineIndex(text);
    const at = lines.positionAt(big.problems[0]!.span.start);
    assert.equal(at.line, lines.positionAt(text.indexOf('levels:\n  - {')).line, 'on the first line of the body');
    assert.match(big.problems[0]!.message, /500,000/);
    // The command line reads it whole.
    const cli = analyse(text).blocks[1]!;
    assert.equal(cli.status, 'normal', codes(cli).join(', '));
  });

  it('does not read a block past a bound on the bodies, and says why on the first line', () => {
    const lines = ['levels:'];
    for (let i = 0; i < 100_000; i++) lines.push(`  - { energy: ${i} K, population: 1 }`);
    const text = fenced(lines.join('\n'));
    // The server's own bound (100 million characters) is the same mechanism at a size too large for a test.
    const r = analyse(text, new Analyzer({ limits: { maxBlocks: Infinity, maxBodyChars: 2_000_000 } }));
    assert.equal(r.blocks.length, 0);
    assert.deepEqual(r.bounded, { offset: text.indexOf('```'), line: 2, reason: 'size' });
    assert.equal(r.problems.length, 1);
    assert.equal(r.problems[0]!.code, 'note-bounded');
    assert.deepEqual(r.problems[0]!.span, { start: 0, end: '# note'.length });
    assert.match(r.problems[0]!.message, /line 3/);
  });

  it('reads binary garbage as a note without throwing', () => {
    let seed = 12345;
    const byte = (): number => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) >> 16) & 0xff;
    const bytes = Buffer.from(Array.from({ length: 200_000 }, byte));
    for (const text of [
      bytes.toString('latin1'),
      bytes.toString('utf8'),
      `\`\`\`levels\n${bytes.toString('latin1')}\n\`\`\`\n`,
      `\`\`\`levels\n${'\u0000'.repeat(1000)}\n\`\`\`\n`,
    ]) {
      const r = analyse(text);
      for (const b of r.blocks) for (const p of b.problems) assert.ok(p.span.start >= 0 && p.span.end <= text.length);
    }
  });

  it('gives the same results and exact positions with CRLF, lone CR and mixed line endings', () => {
    const lf = fenced([...GOOD, 'sample: x\nfrequency: 75.5 MHz', 'note: 9.4 MT'].join('\n'));
    const bad = fenced(['system: 13C', 'field: 7.05 MT', 'polarisation: 0.3'].join('\n'));
    for (const eol of ['\r\n', '\r', 'mixed'] as const) {
      const convert = (t: string): string =>
        eol === 'mixed'
          ? t
              .split('\n')
              .map((l, i, all) => l + (i === all.length - 1 ? '' : ['\r\n', '\n', '\r'][i % 3]))
              .join('')
          : t.replace(/\n/g, eol);
      for (const original of [lf, bad]) {
        const want = only(original);
        const text = convert(original);
        const got = only(text);
        assert.equal(got.status, want.status, `${JSON.stringify(eol)}: ${codes(got).join(', ')}`);
        assert.equal(got.results?.beta?.value, want.results?.beta?.value);
        assert.deepEqual(codes(got), codes(want));
        // Every problem points at the same text, at the same line and column.
        const [a, b] = [new LineIndex(original), new LineIndex(text)];
        got.problems.forEach((p, i) => {
          const q = want.problems[i]!;
          assert.equal(
            text.slice(p.span.start, p.span.end).replace(/\r\n?/g, '\n'),
            original.slice(q.span.start, q.span.end),
            p.code,
          );
          assert.deepEqual(b.positionAt(p.span.start), a.positionAt(q.span.start), p.code);
        });
      }
    }
  });

  it('reads a block right after a byte-order mark, with offsets that count the mark', () => {
    const text = `\uFEFF\`\`\`levels\n${GOOD.join('\n')}\n\`\`\`\n`;
    const b = only(text);
    assert.equal(b.status, 'normal');
    assert.equal(b.block.openStart, 1);
    assert.equal(text.slice(b.toNote(b.meta.idSpan!).start, b.toNote(b.meta.idSpan!).end), 'cell-B run 7');
  });

  it('reports tabs used as YAML indentation, and reads tabs inside values and around a fence without throwing', () => {
    const tabbed = only(fenced('levels:\n\t- { energy: 0 K, population: 0.7 }\n\t- { energy: 1 K, population: 0.3 }'));
    assert.equal(tabbed.status, 'invalid');
    assert.ok(
      codes(tabbed).some((c) => c.startsWith('yaml-')),
      codes(tabbed).join(', '),
    );
    const inValues = only(fenced('gap:\t1 K\npopulations: [0.7,\t0.3]'));
    assert.equal(inValues.status, 'normal', codes(inValues).join(', '));
    // A tab before the fence indents it by four columns: indented code, not a fence (CommonMark §4.4).
    assert.equal(analyse('\t```levels\ngap: 1 K\n\t```\n').blocks.length, 0);
  });

  it('reports a note of bytes that are not UTF-8 from the command line, without failing', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-hostile-'));
    try {
      // Latin-1: 0xB1 is ±, 0xB5 is µ; read as UTF-8 they become U+FFFD.
      const file = join(dir, 'latin1.md');
      writeFileSync(
        file,
        Buffer.concat([
          Buffer.from('```levels\ngap: 1 K\npopulations: [0.7 '),
          Buffer.from([0xb1]),
          Buffer.from(' 0.01, 0.3]\nlattice: 5 '),
          Buffer.from([0xb5]),
          Buffer.from('K\n```\n'),
        ]),
      );
      const r = spawnSync(process.execPath, ['dist/cli.js', 'check', file], { encoding: 'utf8' });
      assert.equal(r.status, 1, r.stderr);
      assert.match(r.stdout, /latin1\.md:3:\d+: error/);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('reads every block of a 20,000-block note in the server: a hover at the end answers before the whole note is read', async () => {
    const text = generateNote({ blocks: 20_000 });
    assert.ok(SERVER_LIMITS.maxBlocks >= 20_000 && text.length < SERVER_LIMITS.maxBodyChars);
    const uri = 'file:///notes/large.md';
    const s = await startLsp({ pull: true });
    try {
      await s.conn.sendNotification('textDocument/didOpen', {
        textDocument: { uri, languageId: 'markdown', version: 1, text },
      });
      const lines = new LineIndex(text);
      const last = lines.positionAt(text.lastIndexOf('```levels')).line;
      const hover = (line: number): Promise<unknown> =>
        s.conn.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line, character: 1 } });
      // Asked right after opening: answered from that block alone, before any whole analysis of the note.
      assert.ok(await hover(last + 1), 'the last block has a hover');
      assert.equal(await s.conn.sendRequest(AnalysisStatsRequest, { uri }), null, 'no whole analysis yet');
      const d = (await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } })) as {
        items: { code: string }[];
      };
      assert.equal(d.items.filter((x) => x.code === 'note-bounded').length, 0);
      assert.equal((await s.conn.sendRequest(AnalysisStatsRequest, { uri }))?.blocks, 20_000);
      // An edit is taken and answered.
      await s.conn.sendNotification('textDocument/didChange', {
        textDocument: { uri, version: 2 },
        contentChanges: [{ range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } }, text: 'x' }],
      });
      assert.ok(await hover(last + 1));
      await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri } });
      const after = await s.conn.sendRequest(AnalysisStatsRequest, { uri });
      assert.equal(after?.version, 2);
      assert.equal(after?.analysed, 0, 'the edit touched no block: nothing is read again');
    } finally {
      await s.close();
    }
  });
});

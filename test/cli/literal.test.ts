import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import MarkdownIt from 'markdown-it';
import { main } from '../../src/cli/main';
import { markdownCode, markdownText, terminalText } from '../../src/core';

// Note text reaches a Markdown summary and a terminal; neither may interpret it.
// The Markdown reader is markdown-it (a general-purpose CommonMark renderer with
// GFM tables, independent of this code), run with raw HTML and bare-link
// detection on, the most permissive way a summary note could be rendered.

function run(args: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(args, { out: (s) => (out += s), err: (s) => (err += s), cwd });
  return { code, out, err };
}

const md = new MarkdownIt({ html: true, linkify: true });

/** Text of rendered HTML without tags, with markdown-it's four escapes undone. */
function decode(html: string): string {
  return html
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&amp;/g, '&');
}

/** The inner HTML of each body cell of the first rendered table. */
function cells(markdown: string): string[][] {
  const html = md.render(markdown);
  const body = /<tbody>([\s\S]*)<\/tbody>/.exec(html)?.[1] ?? '';
  return [...body.matchAll(/<tr>([\s\S]*?)<\/tr>/g)].map((r) =>
    [...r[1]!.matchAll(/<td>([\s\S]*?)<\/td>/g)].map((c) => c[1]!),
  );
}

/** Ids written to attack a Markdown summary: each must be shown as the very text it is. */
const MARKDOWN_IDS = [
  '![x](http://evil.example/x.png)',
  '[click](http://evil.example)',
  '<img src=x onerror=alert(1)>',
  '<http://evil.example>',
  'http://evil.example/x and www.evil.example',
  '*em* _em_ **strong** ~~gone~~',
  '`code` and ``more``',
  'a|b|c',
  '&amp; &lt;b&gt; &#60;',
  '\\*escaped\\* \\',
  '# heading? - list? > quote?',
  '[ref]: http://evil.example',
];

/** Control characters of ECMA-48 (C0, DEL, C1) other than the line feed ending each printed line. */
// Matching control characters is the point here.
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/;

describe('note text in the outputs people read', () => {
  it('escapes ids so that a CommonMark renderer shows exactly their text, with no link, image, emphasis or HTML', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-md-'));
    try {
      const note = MARKDOWN_IDS.map(
        (id) => `\`\`\`levels\nid: ${JSON.stringify(id)}\ngap: 10 K\nratio: 0.50 ± 0.01\n\`\`\`\n`,
      ).join('\n');
      writeFileSync(join(dir, 'n.md'), note);
      const { code, out } = run(['report', 'n.md', '--format', 'markdown'], dir);
      assert.equal(code, 0);
      const rows = cells(out);
      assert.equal(rows.length, MARKDOWN_IDS.length);
      rows.forEach((row, i) => {
        // where, id, status, T, β, P: the columns no block fills (P_th, ε, also) are left out.
        assert.equal(row.length, 6, `six cells in ${JSON.stringify(row)}`);
        assert.ok(!row[1]!.includes('<'), `no HTML element from the id: ${row[1]}`);
        assert.equal(decode(row[1]!), MARKDOWN_IDS[i]);
      });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('shows file names with backticks, pipes and brackets whole inside their code span', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-md-'));
    try {
      const names = ['a`b.md', '``x``.md', '`start.md', 'end`.md', 'pipe|name.md', '![i](http:x).md', ' spaced .md'];
      for (const n of names) writeFileSync(join(dir, n), '```levels\ngap: 10 K\nratio: 0.5\n```\n');
      const { out } = run(['report', ...names, '--format', 'markdown'], dir);
      const rows = cells(out);
      assert.equal(rows.length, names.length);
      rows.forEach((row, i) => {
        const m = /^<code>([^<]*)<\/code>$/.exec(row[0]!);
        assert.ok(m, `one code span and nothing else: ${row[0]}`);
        assert.equal(decode(m[1]!), `${names[i]}:1`);
      });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('makes any text literal for Markdown, checked by rendering it in a paragraph and in a table', () => {
    const samples = [...MARKDOWN_IDS, 'x\ny', '\u001b[2J', 'tab\there', ''];
    for (const s of samples) {
      const expected = terminalText(s);
      const para = md.render(markdownText(s)).trim();
      if (expected.trim() === '') continue;
      assert.equal(decode(para.replace(/^<p>|<\/p>$/g, '')), expected.trim(), JSON.stringify(s));
      const code = cells(`| a |\n| --- |\n| ${markdownCode(s)} |\n`)[0]![0]!;
      assert.equal(decode(code.replace(/^<code>|<\/code>$/g, '')), expected, JSON.stringify(s));
    }
  });

  it('prints no control characters from a note on the terminal: the table and `check`', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-tty-'));
    try {
      // Clear the screen, ring the bell, plant an OSC 8 hyperlink, a C1 CSI, a tab and a carriage return.
      const id = '\u001b[2J\u0007run\u001b]8;;http://evil.example\u0007click\u001b]8;;\u0007\u009b31m\tx\ry';
      const name = 'esc\u001b[31m.md';
      writeFileSync(
        join(dir, name),
        `\`\`\`levels\nid: ${JSON.stringify(id)}\ngap: 10 K\nratio: 0.5\n${JSON.stringify('\u001b[2Jkey')}: 1\n\`\`\`\n`,
      );
      for (const args of [
        ['report', name],
        ['check', name],
        ['report', '.'],
      ]) {
        const r = run(args, dir);
        assert.ok(!CONTROL.test(r.out), `${args.join(' ')}: ${JSON.stringify(r.out)}`);
        assert.ok(!CONTROL.test(r.err), `${args.join(' ')}: ${JSON.stringify(r.err)}`);
      }
      const table = run(['report', name], dir).out;
      assert.ok(table.includes('[2Jrun]8;;http://evil.exampleclick]8;;31m x y'), table);
      assert.ok(run(['check', name], dir).out.includes('Unknown key `[2Jkey`'));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('writes no escape sequence and no text-reordering character into a CSV, line points, the table or Markdown', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-csv-tty-'));
    try {
      // ESC clears the screen, OSC 52 writes the clipboard, C1 CSI; U+202E turns `safe‮gnp.exe` into `safeexe.png` (UAX #9).
      const id = '\u001b[2J\u001b]52;c;aGk=\u0007safe\u202egnp.exe\u009b2J\u2066x\u2069\u200b\ufeff';
      const label = '\u001b]8;;http://evil.example\u0007L\u001b]8;;\u0007';
      writeFileSync(
        join(dir, 'n.md'),
        [
          '```levels',
          `id: ${JSON.stringify(id)}`,
          'detector: energy',
          'wavelengths: vacuum',
          'lines:',
          `  - { label: ${JSON.stringify(label)}, wavelength: 500 nm, upper: 3.0 eV, g: 1, A: 1e7, intensity: 1000 }`,
          '  - { label: b, wavelength: 500 nm, upper: 3.5 eV, g: 1, A: 1e7, intensity: 560 }',
          '  - { label: c, wavelength: 500 nm, upper: 4.0 eV, g: 1, A: 1e7, intensity: 313 }',
          '```',
          '',
        ].join('\n'),
      );
      const bidi = /[\u202a-\u202e\u2066-\u2069\u200b\ufeff]/;
      for (const format of ['csv', 'line-points', 'table', 'markdown']) {
        const r = run(['report', 'n.md', '--format', format], dir);
        // A CSV ends each record with CRLF (RFC 4180); nothing else of C0, DEL or C1 may be left.
        const out = r.out.replace(/\r\n/g, '\n');
        assert.ok(!CONTROL.test(out), `${format}: ${JSON.stringify(out)}`);
        assert.ok(!bidi.test(out), `${format}: ${JSON.stringify(out)}`);
        assert.ok(
          out.replace(/\\/g, '').includes('safegnp.exe'),
          `${format}: the id's printable text stays: ${JSON.stringify(out)}`,
        );
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

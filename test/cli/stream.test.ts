import { strict as assert } from 'node:assert';
import { chmodSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';
import { formatJson, jsonElement } from '../../src/cli/formats';

function run(args: string[], cwd = process.cwd()): { code: number; out: string; chunks: string[] } {
  const chunks: string[] = [];
  const code = main(args, { out: (s) => void chunks.push(s), err: () => undefined, cwd });
  return { code, out: chunks.join(''), chunks };
}

describe('boltzmark report --format json, written note by note', () => {
  it('writes the same bytes as the whole array at once (JSON.stringify, two-space indent)', () => {
    const { out } = run(['report', 'demo', '--format', 'json']);
    const entries = JSON.parse(out) as unknown[];
    assert.ok(entries.length > 3);
    assert.equal(out, JSON.stringify(entries, null, 2) + '\n');
  });

  it('writes each note as soon as it is read: more notes give more writes, each a whole entry', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-stream-'));
    try {
      for (let i = 0; i < 5; i++)
        writeFileSync(
          join(dir, `n${i}.md`),
          `# note ${i}\n\n\`\`\`levels\nid: run ${i}\nsystem: 1H\nfield: 9.4 T\nlattice: 1.4 K\npolarization: 0.${i + 1}\n\`\`\`\n`,
        );
      writeFileSync(join(dir, 'bad.md'), '```levels\npolarization: [\n```\n');
      const { code, out, chunks } = run(['report', dir, '-f', 'json']);
      assert.equal(code, 1, 'the broken note still fails the run');
      const entries = JSON.parse(out) as { file: string }[];
      assert.equal(entries.length, 6, 'no note lost to the one that failed');
      assert.equal(chunks.length, 7, 'one write per note and one to close the array');
      assert.equal(out, formatJson(entries.map((entry) => ({ block: null, entry }) as never)));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('an empty selection is an empty array, and an entry inside the array is indented by two', () => {
    const empty = mkdtempSync(join(tmpdir(), 'boltzmark-empty-'));
    try {
      assert.equal(run(['report', empty, '-f', 'json']).out, '[]\n');
    } finally {
      rmSync(empty, { recursive: true, force: true });
    }
    assert.equal(jsonElement({ a: 1 } as never), '  {\n    "a": 1\n  }');
  });

  it('on worker threads (the built command), writes the same bytes in file order and loses no note to a bad one', () => {
    const dir = mkdtempSync(join(tmpdir(), 'boltzmark-workers-'));
    try {
      // More notes than the command shares out below (32), of different lengths so they finish out of order.
      for (let i = 0; i < 40; i++) {
        const blocks = Array.from(
          { length: 1 + (i % 7) * 3 },
          (_, k) =>
            `\`\`\`levels\nid: n${i}-${k}\nsystem: 1H\nfield: 9.4 T\nlattice: 1.4 K\npolarization: 0.${k + 1}\n\`\`\`\n`,
        );
        writeFileSync(join(dir, `n${String(i).padStart(2, '0')}.md`), blocks.join('\n'));
      }
      writeFileSync(join(dir, 'n05-bad.md'), '```levels\npolarization: [\n```\n');
      writeFileSync(join(dir, 'n06-locked.md'), '```levels\npolarization: 0.1\n```\n');
      chmodSync(join(dir, 'n06-locked.md'), 0o000);
      const run1 = (workers: string) =>
        spawnSync(process.execPath, ['dist/cli.js', 'report', dir, '-f', 'json', '--workers', workers], {
          encoding: 'utf8',
        });
      const one = run1('1');
      const three = run1('3');
      assert.equal(three.stdout, one.stdout);
      assert.equal(three.status, 1);
      assert.equal(one.status, 1);
      const files = (JSON.parse(three.stdout) as { file: string }[]).map((e) => e.file);
      assert.deepEqual(files, [...files].sort(), 'in the order of the files');
      assert.ok(files.some((f) => f.endsWith('n05-bad.md')) && files.some((f) => f.endsWith('n39.md')));
      // Root reads any file; otherwise the locked note is one row of its own, in its place.
      if (process.getuid?.() !== 0) assert.ok(files.some((f) => f.endsWith('n06-locked.md')));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

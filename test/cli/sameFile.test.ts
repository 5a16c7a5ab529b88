import { strict as assert } from 'node:assert';
import { mkdirSync, mkdtempSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

// A file named more than once on the command line (the same name twice, another spelling of its path, a link to
// it, or a folder and a file inside it, either way round) is reported once, under the name it was first reached
// by, in the order the paths were given.

const note = (id: string): string => `\`\`\`levels\nid: ${id}\ngap: 10 K\nratio: 0.5\n\`\`\`\n`;

function files(args: string[], cwd: string): string[] {
  let out = '';
  main(['report', ...args, '-f', 'json'], { out: (s) => (out += s), err: () => undefined, cwd });
  return (JSON.parse(out) as { file: string }[]).map((e) => e.file);
}

describe('boltzmark report with a file named twice', () => {
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-twice-'));
    mkdirSync(join(dir, 'notes'));
    writeFileSync(join(dir, 'a.md'), note('a'));
    writeFileSync(join(dir, 'notes', 'b.md'), note('b'));
    writeFileSync(join(dir, 'notes', 'c.md'), note('c'));
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('reports a file given twice by the same name, or by two spellings of its path, once', () => {
    assert.deepEqual(files(['a.md', 'a.md'], dir), ['a.md']);
    assert.deepEqual(files(['a.md', './a.md', join(dir, 'a.md')], dir), ['a.md']);
    assert.deepEqual(files(['./a.md', 'a.md'], dir), ['./a.md']);
  });

  it('reports a file inside a folder given too once, in the place it was first reached', () => {
    assert.deepEqual(files(['notes', 'notes/c.md', 'a.md'], dir), ['notes/b.md', 'notes/c.md', 'a.md']);
    assert.deepEqual(files(['notes/c.md', 'a.md', 'notes'], dir), ['notes/c.md', 'a.md', 'notes/b.md']);
    assert.deepEqual(files(['notes', 'notes/'], dir), ['notes/b.md', 'notes/c.md']);
  });

  it('reports a file and a link to it once, and a missing path named twice once', () => {
    symlinkSync(join(dir, 'a.md'), join(dir, 'link.md'));
    assert.deepEqual(files(['a.md', 'link.md'], dir), ['a.md']);
    assert.deepEqual(files(['gone.md', 'a.md', './gone.md'], dir), ['gone.md', 'a.md']);
  });
});

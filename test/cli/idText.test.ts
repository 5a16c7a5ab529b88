import { strict as assert } from 'node:assert';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

// An id is a label: it is reported as written, even when YAML's core schema would read it as a number or a
// boolean, and a reference `{ run: 007 }` finds the block whose id is written `007`.

interface Entry {
  id: string | null;
  status: string;
  diagnostics: { code: string; message: string }[];
  thermalReference: { id: string } | null;
}

function report(dir: string, text: string): Entry[] {
  writeFileSync(join(dir, 'ids.md'), text);
  let out = '';
  main(['report', 'ids.md', '-f', 'json'], { out: (s) => (out += s), err: () => undefined, cwd: dir });
  return JSON.parse(out) as Entry[];
}

const plain = (id: string): string => `\`\`\`levels\nid: ${id}\ngap: 10 K\nratio: 0.5\n\`\`\`\n\n`;

describe('boltzmark report: ids written like numbers', () => {
  let dir = '';
  beforeEach(() => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-ids-'));
  });
  afterEach(() => rmSync(dir, { recursive: true, force: true }));

  it('keeps the text of an id as written: leading zeros, exponents, hexadecimal, trailing zeros', () => {
    const written = ['007', '1e3', '0x1F', '1.50', '+12', 'true', '"0042"', "'1e3 b'"];
    const entries = report(dir, written.map(plain).join(''));
    assert.deepEqual(
      entries.map((e) => e.id),
      ['007', '1e3', '0x1F', '1.50', '+12', 'true', '0042', '1e3 b'],
    );
  });

  it('gives no id for a null scalar', () => {
    assert.deepEqual(
      report(dir, plain('~') + plain('null')).map((e) => e.id),
      [null, null],
    );
  });

  it('resolves `{ run: 007 }` to the block whose id is `007`, and tells `007` from `7`', () => {
    const reference =
      '```levels\nid: 007\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  thermal: 100\n```\n\n' +
      '```levels\nid: 7\nsystem: 13C\nfield: 9.4 T\nlattice: 298 K\nsignal:\n  thermal: 50\n```\n\n';
    const user = (ref: string): string =>
      `\`\`\`levels\nid: uses ${ref}\nsystem: 13C\nfield: 9.4 T\nsignal:\n  hyperpolarized: 5000\n  thermal: { run: ${ref} }\n\`\`\`\n\n`;
    const entries = report(dir, reference + user('007') + user('7') + user('"007"'));
    for (const e of entries) assert.deepEqual(e.diagnostics, [], JSON.stringify(e.diagnostics));
    assert.deepEqual(
      entries.map((e) => e.thermalReference?.id ?? null),
      [null, null, '007', '7', '007'],
    );
  });

  it('calls `id: 007` and `id: "007"` the same id, and `id: 7` another', () => {
    const entries = report(dir, plain('007') + plain('"007"') + plain('7'));
    assert.deepEqual(
      entries.map((e) => e.diagnostics.map((d) => d.code)),
      [['id-duplicate'], ['id-duplicate'], []],
    );
  });
});

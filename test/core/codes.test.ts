import { strict as assert } from 'node:assert';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { CODES } from '../../src/core/codes';

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((e) => {
    const p = join(dir, e);
    return statSync(p).isDirectory() ? sources(p) : p.endsWith('.ts') ? [p] : [];
  });
}

describe('diagnostic codes', () => {
  const docs = readFileSync('docs/format.md', 'utf8');

  it('documents every registered code under a heading of its own in docs/format.md', () => {
    for (const code of Object.keys(CODES))
      assert.match(docs, new RegExp(`^#+ ${code}$`, 'm'), `docs/format.md lacks a section for ${code}`);
  });

  it('registers every code the core emits', () => {
    const emitted = new Set<string>();
    for (const f of sources('src/core')) {
      const text = readFileSync(f, 'utf8');
      // Codes are passed as the first string argument of report()/problem() or as `code: '…'`.
      for (const m of text.matchAll(
        /(?:report\(ctx, '(?:error|warning|info)', |code: |problem\(|fix\()'([a-z]+(?:-[a-z]+)+)'/g,
      ))
        emitted.add(m[1]);
    }
    assert.ok(emitted.size > 20, `found ${emitted.size} codes`);
    for (const c of emitted) assert.ok(c in CODES, `code ${c} is emitted but not registered`);
  });

  it('uses stable kebab-case codes', () => {
    for (const code of Object.keys(CODES)) assert.match(code, /^[a-z]+(-[a-z]+)*$/);
  });
});

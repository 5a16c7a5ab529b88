import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateNote } from '../../bench/note';

/**
 * A new temporary folder of `count` copies of the invented benchmark notebook (bench/note.ts) of `blocks` blocks,
 * each copy with ids of its own (`n<i> run …`), named so that they sort in order; the caller removes it.
 */
export function benchFolder(prefix: string, count: number, blocks: number): string {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  const note = generateNote({ blocks });
  for (let i = 0; i < count; i++)
    writeFileSync(join(dir, `n${String(i).padStart(3, '0')}.md`), note.replace(/id: run /g, `id: n${i} run `));
  return dir;
}

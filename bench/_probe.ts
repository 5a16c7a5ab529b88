import { Analyzer, scanFencedBlocks } from '../src/core';
import { generateNote } from './note';
import { NoteDocument } from '../src/server/noteDocument';
import { Notes } from '../src/server/notes';
import { noteDiagnostics } from '../src/server/diagnostics';
import { DEFAULT_SETTINGS } from '../src/shared/settings';
const N = Number(process.argv[2] ?? 16000);
const note = generateNote({ blocks: N });
let t = performance.now();
let n = 0; for (const b of scanFencedBlocks(note)) n++;
console.log('scan', performance.now() - t, n);
const doc = new NoteDocument('x', 'markdown', 1, note);
const notes = new Notes();
t = performance.now(); const st = notes.get(doc, DEFAULT_SETTINGS); console.log('full', performance.now() - t);
const blocks = st.report.blocks;
for (let k = 0; k < 8; k++) {
  const b = blocks[(k * 97 + 13) % blocks.length].block;
  const pos = doc.positionAt(b.bodyStart + 9);
  t = performance.now();
  doc.update([{ range: { start: pos, end: { line: pos.line, character: pos.character + 1 } }, text: String(k) }], k + 2);
  const t1 = performance.now();
  const s = notes.get(doc, DEFAULT_SETTINGS);
  const t2 = performance.now();
  const d = noteDiagnostics(s);
  const t3 = performance.now();
  console.log('update', (t1 - t).toFixed(2), 'analyze', (t2 - t1).toFixed(2), 'diag', (t3 - t2).toFixed(2), d.length, s.report.stats);
}

import { strict as assert } from 'node:assert';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Analyzer, RunLog, runLogCsv } from '../../../src/core';

const block = (id: string, body: string, date?: string): string =>
  `\`\`\`levels\nid: ${id}\n${date ? `date: ${date}\n` : ''}${body}\n\`\`\`\n`;

describe('workspace run log', () => {
  it('lists every run of the demo notebook folder', () => {
    const log = new RunLog();
    for (const f of readdirSync('demo').filter((x) => x.endsWith('.md')))
      log.update(`file:///demo/${f}`, `demo/${f}`, readFileSync(join('demo', f), 'utf8'));
    const all = log.entries();
    const expected = readdirSync('demo')
      .filter((x) => x.endsWith('.md'))
      .reduce((n, f) => n + new Analyzer().analyzeText(readFileSync(join('demo', f), 'utf8')).blocks.length, 0);
    assert.equal(all.length, expected);
    assert.ok(all.some((e) => e.id === 'cell-B run 1' && e.status === 'normal'));
    assert.ok(log.entries(['inverted']).every((e) => e.status === 'inverted'));
    assert.ok(log.entries(['inverted']).length >= 1);
  });

  it('follows adds, edits and deletes, and says when nothing changed', () => {
    const log = new RunLog();
    assert.equal(log.update('a', 'a.md', block('one', 'gap: 1 K\nratio: 0.5')), true);
    assert.equal(log.update('b', 'b.md', block('two', 'gap: 1 K\nratio: 2')), true);
    assert.deepEqual(
      log.entries().map((e) => [e.id, e.status]),
      [
        ['one', 'normal'],
        ['two', 'inverted'],
      ],
    );
    assert.equal(
      log.update('a', 'a.md', `# title\n\n${block('one', 'gap: 1 K\nratio: 0.5')}`),
      true,
      'the block moved down two lines',
    );
    assert.equal(log.entries()[0].line, 2);
    assert.equal(
      log.update('a', 'a.md', `# title\n\n${block('one', 'gap: 1 K\nratio: 0.5')}`),
      false,
      'same text, no change',
    );
    assert.equal(log.update('a', 'a.md', `# title\n\n${block('one', 'gap: 1 K\nratio: 1.5')}`), true);
    assert.equal(log.entries()[0].status, 'inverted');
    assert.equal(log.remove('b'), true);
    assert.deepEqual(
      log.entries().map((e) => e.id),
      ['one'],
    );
    assert.equal(log.update('a', 'a.md', 'no blocks any more'), true);
    assert.equal(log.noteCount, 0);
  });

  it('groups by note or by date, newest date first and undated runs last', () => {
    const log = new RunLog();
    log.update(
      'a',
      'a.md',
      block('r1', 'gap: 1 K\nratio: 0.5', '2026-03-09') + block('r2', 'gap: 1 K\nratio: 0.5', '2026-03-11'),
    );
    log.update('b', 'b.md', block('r3', 'gap: 1 K\nratio: 0.5', '2026-03-09') + block('r4', 'gap: 1 K\nratio: 0.5'));
    assert.deepEqual(
      log.groups('file').map((g) => [g.label, g.entries.map((e) => e.id)]),
      [
        ['a.md', ['r1', 'r2']],
        ['b.md', ['r3', 'r4']],
      ],
    );
    assert.deepEqual(
      log.groups('date').map((g) => [g.label, g.entries.map((e) => e.id)]),
      [
        ['2026-03-11', ['r2']],
        ['2026-03-09', ['r1', 'r3']],
        ['no date', ['r4']],
      ],
    );
  });

  it('exports CSV with full-precision numbers and quotes hostile text', () => {
    const log = new RunLog();
    log.update('a', 'a.md', block('"=cmd|x, y"', 'gap: 10 K\nratio: 0.50 ± 0.01'));
    const csv = runLogCsv(log.entries()).split('\r\n');
    assert.equal(csv[0].split(',')[0], 'note');
    const row = csv[1];
    assert.ok(row.startsWith('a.md,1,"\'=cmd|x, y",,normal,14.4269504088896'), row);
  });
});

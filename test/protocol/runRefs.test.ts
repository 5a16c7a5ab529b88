import { strict as assert } from 'node:assert';
import { mkdtempSync, mkdirSync, readFileSync, rmSync, unlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startLsp, type LspSession } from './lspClient';
import { fileUri } from '../../src/server/runs/workspaceRuns';
import { fence, hpBlock, refBlock } from '../support/runNotes';

// Runs by reference over LSP: a workspace folder of notes on disk, some of them open, and the server's
// index of run ids. Invented notes: the numbers only exercise the references (the physics is tested in
// test/core/runs/physics.test.ts).

const REF = refBlock();
const hp = (id: string, ref: string): string => hpBlock(id, ref);

type Pos = { line: number; character: number };
type Range = { start: Pos; end: Pos };
type Diag = { code?: string | number; message: string; range: unknown };

/** The position of the first `needle` in `text` (plus `delta` characters). */
function posOf(text: string, needle: string, delta = 0): Pos {
  const at = text.indexOf(needle);
  assert.ok(at >= 0, `"${needle}" is in the text`);
  const before = text.slice(0, at + delta);
  const lines = before.split('\n');
  return { line: lines.length - 1, character: lines[lines.length - 1]!.length };
}

/** The text a range covers. */
function slice(text: string, r: Range): string {
  const lines = text.split('\n');
  const off = (p: Pos): number => lines.slice(0, p.line).reduce((n, l) => n + l.length + 1, 0) + p.character;
  return text.slice(off(r.start), off(r.end));
}

/** Applies non-overlapping edits to a text. */
function apply(text: string, edits: { range: Range; newText: string }[]): string {
  const lines = text.split('\n');
  const off = (p: Pos): number => lines.slice(0, p.line).reduce((n, l) => n + l.length + 1, 0) + p.character;
  const sorted = [...edits].sort((a, b) => off(b.range.start) - off(a.range.start));
  let out = text;
  for (const e of sorted) out = out.slice(0, off(e.range.start)) + e.newText + out.slice(off(e.range.end));
  return out;
}

const codes = (d: { diagnostics: Diag[] } | undefined): string[] => (d?.diagnostics ?? []).map((x) => String(x.code));

describe('runs by reference over LSP', function () {
  this.timeout(30000);
  let dir: string;
  let s: LspSession;
  const uri = (rel: string): string => fileUri(join(dir, rel));
  const write = (rel: string, text: string): void => {
    mkdirSync(join(dir, rel, '..'), { recursive: true });
    writeFileSync(join(dir, rel), text);
  };
  const open = (rel: string, text: string, version = 1): Promise<void> =>
    s.conn.sendNotification('textDocument/didOpen', {
      textDocument: { uri: uri(rel), languageId: 'markdown', version, text },
    });
  const change = (rel: string, text: string, version: number): Promise<void> =>
    s.conn.sendNotification('textDocument/didChange', {
      textDocument: { uri: uri(rel), version },
      contentChanges: [{ text }],
    });
  const at = (rel: string, p: Pos): { textDocument: { uri: string }; position: Pos } => ({
    textDocument: { uri: uri(rel) },
    position: p,
  });

  const MON = '# Monday reference\n\n' + REF;
  const R1 = '# Run 1\n\n' + hp('run 1', '../refs/mon.md#ref-13C Monday');
  const R2 = '# Run 2\n\n' + hp('run 2', 'ref-13C Monday');
  const R3 = '# Run 3\n\n' + hp('run 3', 'ref-13C Monday');

  beforeEach(async () => {
    dir = mkdtempSync(join(tmpdir(), 'boltzmark-runs-'));
    write('refs/mon.md', MON);
    write('runs/r1.md', R1);
    write('runs/r2.md', R2);
    write('other/r3.md', R3);
    // Not a note: never read.
    write('node_modules/x/readme.md', '```levels\nid: ref-13C Monday\nsystem: 1H\n```\n');
    s = await startLsp({
      workspaceFolders: [{ uri: fileUri(dir), name: 'lab' }],
      capabilities: {
        workspace: {
          configuration: true,
          didChangeWatchedFiles: { dynamicRegistration: true },
          workspaceEdit: { documentChanges: true, changeAnnotationSupport: { groupsOnLabel: false } },
        },
        textDocument: { publishDiagnostics: { versionSupport: true }, hover: { contentFormat: ['markdown'] } },
      },
    });
  });
  afterEach(async () => {
    await s.close();
    rmSync(dir, { recursive: true, force: true });
  });

  it('asks for the file events of notes', async () => {
    await s.conn.sendRequest('workspace/symbol', { query: '' });
    const reg = s.requests.find((r) => r.method === 'client/registerCapability');
    const methods = (reg?.params as { registrations: { method: string }[] }).registrations.map((r) => r.method);
    assert.ok(methods.includes('workspace/didChangeWatchedFiles'));
  });

  it('follows a reference to a note that is not open, and goes to its id line (definition)', async () => {
    await open('runs/r1.md', R1);
    await s.waitForPush(uri('runs/r1.md'));
    assert.deepEqual(codes(s.pushed.get(uri('runs/r1.md'))), []);
    const defs = (await s.conn.sendRequest('textDocument/definition', at('runs/r1.md', posOf(R1, 'Monday }', 2)))) as {
      uri: string;
      range: Range;
    }[];
    assert.equal(defs.length, 1);
    assert.equal(defs[0]!.uri, uri('refs/mon.md'));
    assert.equal(defs[0]!.range.start.line, 3);
    assert.equal(slice(MON, defs[0]!.range), 'ref-13C Monday');
    // Nothing is at a key: no definition.
    const none = await s.conn.sendRequest('textDocument/definition', at('runs/r1.md', posOf(R1, 'system')));
    assert.deepEqual(none, []);
  });

  it('finds every reference to a run, in every note, open or not', async () => {
    await open('runs/r2.md', R2);
    const refs = (await s.conn.sendRequest('textDocument/references', {
      ...at('runs/r2.md', posOf(R2, 'ref-13C', 3)),
      context: { includeDeclaration: true },
    })) as { uri: string; range: Range }[];
    const where = refs.map((r) => `${r.uri.slice(fileUri(dir).length)}:${r.range.start.line}`).sort();
    assert.deepEqual(where, ['/other/r3.md:8', '/refs/mon.md:3', '/runs/r1.md:8', '/runs/r2.md:8']);
    for (const r of refs) {
      const text = readFileSync(join(dir, decodeURIComponent(r.uri.slice(fileUri(dir).length))), 'utf8');
      assert.equal(slice(text, r.range), 'ref-13C Monday');
    }
    const noDecl = (await s.conn.sendRequest('textDocument/references', {
      ...at('runs/r2.md', posOf(R2, 'ref-13C', 3)),
      context: { includeDeclaration: false },
    })) as unknown[];
    assert.equal(noDecl.length, 3);
  });

  it('renames an id and every reference to it across three notes, as one labelled edit', async () => {
    await open('runs/r2.md', R2);
    // prepareRename refuses what is not an id or a reference.
    assert.equal(await s.conn.sendRequest('textDocument/prepareRename', at('runs/r2.md', posOf(R2, 'field'))), null);
    assert.equal(await s.conn.sendRequest('textDocument/prepareRename', at('runs/r2.md', posOf(R2, '2.985e4'))), null);
    const prep = (await s.conn.sendRequest('textDocument/prepareRename', at('runs/r2.md', posOf(R2, 'Monday')))) as {
      range: Range;
      placeholder: string;
    };
    assert.equal(prep.placeholder, 'ref-13C Monday');
    assert.equal(slice(R2, prep.range), 'ref-13C Monday');
    // A name that YAML would read otherwise is refused with a reason.
    await assert.rejects(
      s.conn.sendRequest('textDocument/rename', { ...at('runs/r2.md', posOf(R2, 'Monday')), newName: 'a: b' }),
      /cannot hold/,
    );
    const edit = (await s.conn.sendRequest('textDocument/rename', {
      ...at('runs/r2.md', posOf(R2, 'Monday')),
      newName: 'ref-13C Mon 12 Apr',
    })) as {
      changeAnnotations: Record<string, { label: string }>;
      documentChanges: {
        textDocument: { uri: string };
        edits: { range: Range; newText: string; annotationId: string }[];
      }[];
    };
    assert.deepEqual(
      Object.values(edit.changeAnnotations).map((a) => a.label),
      ['Rename run "ref-13C Monday" to "ref-13C Mon 12 Apr"'],
    );
    const byNote = new Map(edit.documentChanges.map((d) => [d.textDocument.uri.slice(fileUri(dir).length), d.edits]));
    assert.deepEqual([...byNote.keys()].sort(), ['/other/r3.md', '/refs/mon.md', '/runs/r1.md', '/runs/r2.md']);
    const texts: Record<string, string> = {
      '/refs/mon.md': MON,
      '/runs/r1.md': R1,
      '/runs/r2.md': R2,
      '/other/r3.md': R3,
    };
    for (const [note, edits] of byNote) {
      assert.equal(edits.length, 1);
      assert.ok(edits[0]!.annotationId in edit.changeAnnotations);
      // Exactly the id changes, nothing else.
      assert.equal(apply(texts[note]!, edits), texts[note]!.replace('ref-13C Monday', 'ref-13C Mon 12 Apr'));
    }
    // The server wrote nothing: the edit is the client's to apply.
    assert.equal(readFileSync(join(dir, 'refs/mon.md'), 'utf8'), MON);
  });

  it('reports a cycle of three blocks on each of them', async () => {
    const note = [
      fence(
        'id: a\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2\nextrapolate: { from: 42 s, to: 0 s, decay: { run: b } }',
      ),
      fence(
        'id: b\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2\nextrapolate: { from: 42 s, to: 0 s, decay: { run: c } }',
      ),
      fence(
        'id: c\nsystem: 13C\nfield: 9.4 T\npolarization: 0.2\nextrapolate: { from: 42 s, to: 0 s, decay: { run: a } }',
      ),
    ].join('\n');
    await open('cycle.md', note);
    await s.waitForPush(uri('cycle.md'));
    const cyc = (s.pushed.get(uri('cycle.md'))?.diagnostics ?? []).filter((d) => d.code === 'reference-cycle');
    assert.equal(cyc.length, 3, JSON.stringify(s.pushed.get(uri('cycle.md'))));
    assert.match(cyc[0]!.message, /a.*b.*c.*a/);
  });

  it('re-publishes a referring note on an unsaved edit of the referenced block, and only the notes that use it', async () => {
    await open('runs/r1.md', R1);
    await open('cycle.md', fence('id: alone\nsystem: 1H\nfield: 9.4 T\npolarization: 0.01'));
    await s.waitForPush(uri('runs/r1.md'));
    await s.waitForPush(uri('cycle.md'));
    // Each push replaces the note's entry: the same object afterwards means no push.
    const before = s.pushed.get(uri('cycle.md'));
    await open('refs/mon.md', MON);
    const broken = MON.replace('  thermal: 1.08e3\n', '');
    await change('refs/mon.md', broken, 2);
    await s.waitForPush(uri('runs/r1.md'), (d) => codes(d).includes('reference-invalid'));
    const d = s.pushed.get(uri('runs/r1.md'))!.diagnostics.find((x) => x.code === 'reference-invalid')!;
    assert.match(d.message, /mon\.md/);
    // Back as it was: the reference works again.
    await change('refs/mon.md', MON, 3);
    await s.waitForPush(uri('runs/r1.md'), (x) => !codes(x).includes('reference-invalid'));
    assert.equal(s.pushed.get(uri('cycle.md')), before, 'the note that uses no reference was not published again');
  });

  it('pushes the reference diagnostics of closed referring notes when their reference breaks, and takes them back', async () => {
    await open('refs/mon.md', MON);
    await s.waitForPush(uri('refs/mon.md'));
    // Closed notes whose references hold get nothing.
    assert.equal(s.pushed.get(uri('runs/r2.md')), undefined);
    // The reference loses its thermal signal: every note that uses it, none of them open, says so.
    await change('refs/mon.md', MON.replace('  thermal: 1.08e3\n', ''), 2);
    for (const rel of ['runs/r1.md', 'runs/r2.md', 'other/r3.md'])
      await s.waitForPush(uri(rel), (d) => codes(d).includes('reference-invalid'));
    // Only the reference diagnostics of a closed note are sent, on the reference's own line.
    const r2 = s.pushed.get(uri('runs/r2.md'))!.diagnostics as (Diag & { range: Range })[];
    assert.ok(r2.every((d) => /^reference-|^id-duplicate$/.test(String(d.code))));
    assert.equal(slice(R2, r2[0]!.range).includes('ref-13C Monday'), true);
    // Mended: the closed notes' diagnostics are taken back.
    await change('refs/mon.md', MON, 3);
    await s.waitForPush(uri('runs/r2.md'), (d) => codes(d).length === 0);
    // Opened, a note's own diagnostics take over (here: none), and nothing stays from while it was closed.
    await change('refs/mon.md', MON.replace('  thermal: 1.08e3\n', ''), 4);
    await s.waitForPush(uri('other/r3.md'), (d) => codes(d).includes('reference-invalid'));
    await change('refs/mon.md', MON, 5);
    await open('other/r3.md', R3);
    await s.waitForPush(uri('other/r3.md'), (d) => codes(d).length === 0);
  });

  it('reports a referenced note deleted on disk, and follows it again when it comes back', async () => {
    await open('runs/r1.md', R1);
    await s.waitForPush(uri('runs/r1.md'));
    assert.deepEqual(codes(s.pushed.get(uri('runs/r1.md'))), []);
    unlinkSync(join(dir, 'refs/mon.md'));
    await s.conn.sendNotification('workspace/didChangeWatchedFiles', {
      changes: [{ uri: uri('refs/mon.md'), type: 3 }],
    });
    await s.waitForPush(uri('runs/r1.md'), (d) => codes(d).includes('reference-unknown'));
    write('refs/mon.md', MON);
    await s.conn.sendNotification('workspace/didChangeWatchedFiles', {
      changes: [{ uri: uri('refs/mon.md'), type: 1 }],
    });
    await s.waitForPush(uri('runs/r1.md'), (d) => codes(d).length === 0);
  });

  it('lists every run id as a workspace symbol with its status and temperature', async () => {
    const syms = (await s.conn.sendRequest('workspace/symbol', { query: '' })) as {
      name: string;
      containerName: string;
      location: { uri: string; range: Range };
    }[];
    assert.deepEqual(syms.map((x) => x.name).sort(), ['ref-13C Monday', 'run 1', 'run 2', 'run 3']);
    const ref = syms.find((x) => x.name === 'ref-13C Monday')!;
    assert.match(ref.containerName, /T = /);
    assert.match(ref.containerName, /mon\.md/);
    assert.equal(slice(MON, ref.location.range), 'ref-13C Monday');
    const some = (await s.conn.sendRequest('workspace/symbol', { query: 'run2' })) as { name: string }[];
    assert.deepEqual(
      some.map((x) => x.name),
      ['run 2'],
    );
  });

  it('completes ids after `run: `, hovers a reference and links its note', async () => {
    const draft =
      '# Draft\n\n' +
      fence('id: run 9\nsystem: 13C\nfield: 9.4 T\nsignal:\n  hyperpolarized: 1e4\n  thermal: { run: ref }');
    await open('runs/draft.md', draft);
    const items = (await s.conn.sendRequest(
      'textDocument/completion',
      at('runs/draft.md', posOf(draft, 'ref }', 3)),
    )) as { label: string; textEdit: { range: Range } }[] | { items: { label: string }[] };
    const labels = (Array.isArray(items) ? items : items.items).map((i) => i.label);
    assert.ok(labels.includes('ref-13C Monday'), labels.join(', '));
    assert.ok(!labels.includes('run 9'), 'not the block itself');

    await open('runs/r1.md', R1);
    const h = (await s.conn.sendRequest('textDocument/hover', at('runs/r1.md', posOf(R1, 'Monday')))) as {
      contents: { value: string };
    };
    // Markdown-escaped: `\\-` and `\\.` stand for `-` and `.`.
    assert.match(h.contents.value, /Thermal reference: ref\\-13C Monday/);
    assert.match(h.contents.value, /2026\\-04\\-12/);
    assert.match(h.contents.value, /T = 298 K/);
    assert.match(h.contents.value, /mon\\\.md, line 4/);
    const links = (await s.conn.sendRequest('textDocument/documentLink', {
      textDocument: { uri: uri('runs/r1.md') },
    })) as {
      range: Range;
      target: string;
    }[];
    assert.equal(links.length, 1);
    assert.equal(slice(R1, links[0]!.range), '../refs/mon.md');
    assert.equal(links[0]!.target, uri('refs/mon.md') + '#L4');
  });

  it('with pull diagnostics, asks the client to pull again after a referenced block changed, and the pull shows it', async () => {
    await s.close();
    s = await startLsp({
      pull: true,
      workspaceFolders: [{ uri: fileUri(dir), name: 'lab' }],
      capabilities: {
        workspace: { configuration: true, diagnostics: { refreshSupport: true } },
        textDocument: { diagnostic: { dynamicRegistration: false }, publishDiagnostics: { versionSupport: true } },
      },
    });
    const provider = s.initialized.capabilities.diagnosticProvider as { interFileDependencies: boolean };
    assert.equal(provider.interFileDependencies, true);
    await open('runs/r1.md', R1);
    const pull = async (): Promise<string[]> =>
      (
        (await s.conn.sendRequest('textDocument/diagnostic', { textDocument: { uri: uri('runs/r1.md') } })) as {
          items: Diag[];
        }
      ).items.map((d) => String(d.code));
    await s.conn.sendRequest('workspace/symbol', { query: '' }); // the first walk of the folder is over
    assert.deepEqual(await pull(), []);
    const refreshes = (): number => s.requests.filter((r) => r.method === 'workspace/diagnostic/refresh').length;
    const before = refreshes();
    await open('refs/mon.md', MON);
    await change('refs/mon.md', MON.replace('lattice: 298 K', 'lattice: -3 K'), 2);
    // Waits for the request itself (the test's own timeout bounds the wait; no time is asserted).
    while (refreshes() === before) await new Promise((r) => setTimeout(r, 20));
    assert.ok((await pull()).includes('reference-invalid'));
  });
});

import { strict as assert } from 'node:assert';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { readSpectrum, type SpectrumRead } from '../../src/core';
import { noteExternals } from '../../src/server/externals';
import { Notes } from '../../src/server/notes';
import {
  locateSpectrum,
  MAX_KNOWN_FILES,
  noteFileUri,
  SpectrumFiles,
  type SpectrumFileAccess,
} from '../../src/server/spectra';
import { noteDiagnostics } from '../../src/server/diagnostics';
import { FakeDisk, flat } from './spectraHelpers';
import { DEFAULT_SETTINGS } from '../../src/shared/settings';

const ROOT = 'file:///lab';
const NOTE = 'file:///lab/day/note.md';

function files(disk: FakeDisk, changes: string[][] = [], maxBytes?: number): SpectrumFiles {
  return new SpectrumFiles({
    access: disk,
    parse: (text, name): Promise<SpectrumRead> => Promise.resolve(readSpectrum(text, name)),
    folders: () => [ROOT],
    onChange: (keys) => changes.push([...keys]),
    maxBytes,
  });
}

describe('server spectrum files', () => {
  describe('where a written path leads', () => {
    it('resolves relative to the note, inside the workspace folder', () => {
      assert.deepEqual(locateSpectrum(NOTE, 'spectra/hp.csv', [ROOT]), {
        uri: 'file:///lab/day/spectra/hp.csv',
        root: 'file:///lab',
      });
      assert.deepEqual(locateSpectrum(NOTE, '../shared/th.jdx', [ROOT]), {
        uri: 'file:///lab/shared/th.jdx',
        root: 'file:///lab',
      });
      // Spaces and other characters are encoded as in a URI.
      assert.equal(
        (locateSpectrum(NOTE, 'run 12#a.csv', [ROOT]) as { uri: string }).uri,
        'file:///lab/day/run%2012%23a.csv',
      );
    });

    it('refuses what leaves the workspace folder, absolute paths, URIs and backslashes', () => {
      for (const written of ['../../etc/passwd', '/etc/passwd', 'file:///etc/passwd', 'C:/x.csv', '..\\x.csv'])
        assert.ok('outside' in locateSpectrum(NOTE, written, [ROOT]), written);
      // A sibling folder whose name starts like the root is outside it.
      assert.ok('outside' in locateSpectrum('file:///lab2/note.md', 'a.csv', [ROOT]) === false);
      assert.ok('outside' in locateSpectrum(NOTE, '../../lab2/a.csv', [ROOT]));
    });

    it('a note in no workspace folder reaches only its own folder tree', () => {
      assert.ok('uri' in locateSpectrum('file:///elsewhere/n.md', 'a/b.csv', [ROOT]));
      assert.ok('outside' in locateSpectrum('file:///elsewhere/n.md', '../b.csv', [ROOT]));
      assert.ok('outside' in locateSpectrum('untitled:Untitled-1', 'b.csv', [ROOT]));
    });

    it("a notebook cell's references are relative to its notebook", () => {
      assert.deepEqual(locateSpectrum('vscode-notebook-cell:/lab/day/nb.ipynb#W1sZmlsZQ%3D%3D', 'hp.csv', [ROOT]), {
        uri: 'file:///lab/day/hp.csv',
        root: 'file:///lab',
      });
    });

    it("a cell of a remote window's notebook finds its spectra beside the notebook's file", () => {
      // The window names the cell after the notebook it shows (`vscode-remote://host/…`); the server, beside the
      // files, knows the folder as `file:///lab`.
      assert.deepEqual(
        locateSpectrum(
          'vscode-notebook-cell://127.0.0.1:43133/lab/day/nb.ipynb#W1sdnNjb2RlLXJlbW90ZQ%3D%3D',
          'hp.csv',
          [ROOT],
        ),
        { uri: 'file:///lab/day/hp.csv', root: 'file:///lab' },
      );
    });

    it("reads a cell's notebook with the scheme VS Code writes into the cell's fragment", () => {
      // VS Code's cell URIs: the notebook's URI with the scheme `vscode-notebook-cell` and the fragment
      // `<handle in base 7, length-prefixed>s<base64 of the notebook's scheme>` (common practice of the
      // editor, no published source).
      assert.equal(noteFileUri('vscode-notebook-cell:/lab/nb.ipynb#W1sZmlsZQ%3D%3D'), 'file:///lab/nb.ipynb');
      assert.equal(noteFileUri('vscode-notebook-cell:/lab/nb.ipynb#X12sZmlsZQ'), 'file:///lab/nb.ipynb');
      // A remote workspace's notebook: the server runs where its files are, and names them `file:` there.
      assert.equal(
        noteFileUri('vscode-notebook-cell://127.0.0.1:43133/lab/nb.ipynb#W3sdnNjb2RlLXJlbW90ZQ%3D%3D'),
        'file:///lab/nb.ipynb',
      );
      assert.equal(
        noteFileUri('vscode-notebook-cell://srv/share/nb.ipynb#W3sZmlsZQ%3D%3D'),
        'file://srv/share/nb.ipynb',
      );
      assert.equal(noteFileUri('vscode-notebook-cell:/nb.ipynb#W3sdnNjb2RlLXZmcw%3D%3D'), 'vscode-vfs:/nb.ipynb');
      assert.equal(noteFileUri('vscode-notebook-cell:Untitled-1.ipynb#W0sdW50aXRsZWQ%3D'), 'untitled:Untitled-1.ipynb');
      // A fragment that does not read so stands for a file on disk.
      assert.equal(noteFileUri('vscode-notebook-cell:/lab/nb.ipynb#W1s%%%'), 'file:///lab/nb.ipynb');
      assert.equal(noteFileUri('vscode-notebook-cell:/lab/nb.ipynb#W1sPHNjcmlwdD4'), 'file:///lab/nb.ipynb');
      assert.equal(noteFileUri('vscode-notebook-cell:/lab/nb.ipynb'), 'file:///lab/nb.ipynb');
    });
  });

  describe('lookups', () => {
    it('answers pending at once, parses off the request path, then ready with a changed stamp', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/hp.csv', flat(2), 7);
      const changes: string[][] = [];
      const f = files(disk, changes);
      const first = f.lookup(NOTE, 'hp.csv');
      assert.equal(first.state, 'pending');
      const key = 'file:file:///lab/day/hp.csv';
      assert.equal(first.key, key);
      assert.equal(f.stamp(key), 'pending:0');
      await f.settled();
      assert.deepEqual(changes, [[key]]);
      const second = f.lookup(NOTE, 'hp.csv');
      assert.equal(second.state, 'ready');
      assert.equal(f.stamp(key), second.stamp);
      assert.notEqual(second.stamp, first.stamp);
    });

    it('parses a file once however many notes and references use it', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/hp.csv', flat(2));
      const f = files(disk);
      f.lookup(NOTE, 'hp.csv');
      f.lookup('file:///lab/day/other.md', './hp.csv');
      f.lookup('file:///lab/note2.md', 'day/hp.csv');
      await f.settled();
      for (let i = 0; i < 5; i++) assert.equal(f.lookup(NOTE, 'hp.csv').state, 'ready');
      assert.equal(f.parses, 1);
      assert.equal(disk.reads.length, 1);
    });

    it('a watched change re-reads the file; a deletion makes it missing; a creation finds it', async () => {
      const disk = new FakeDisk();
      const uri = 'file:///lab/day/hp.csv';
      disk.put(uri, flat(2), 1);
      const changes: string[][] = [];
      const f = files(disk, changes);
      f.lookup(NOTE, 'hp.csv');
      await f.settled();
      disk.put(uri, flat(3) + '\n', 2);
      f.changed(uri);
      // The old answer stands while the new one is read.
      assert.equal(f.lookup(NOTE, 'hp.csv').state, 'ready');
      await f.settled();
      const a = f.lookup(NOTE, 'hp.csv');
      assert.equal(a.state === 'ready' && a.spectrum.y[0], 3);
      assert.equal(f.parses, 2);
      disk.files.delete(uri);
      f.changed(uri);
      await f.settled();
      assert.equal(f.lookup(NOTE, 'hp.csv').state, 'missing');
      assert.equal(f.stamp(`file:${uri}`), null);
      disk.put(uri, flat(4), 3);
      f.changed(uri);
      await f.settled();
      assert.equal(f.lookup(NOTE, 'hp.csv').state, 'ready');
      assert.equal(changes.length, 4);
      // An event for a file nobody asked for reads nothing.
      f.changed('file:///lab/day/unused.csv');
      await f.settled();
      assert.equal(disk.reads.filter((r) => r.endsWith('unused.csv')).length, 0);
    });

    it('an event spelled with an encoded drive colon (as VS Code spells Windows paths) reaches the same file', async () => {
      const disk = new FakeDisk();
      const uri = 'file:///c:/lab/a.csv';
      disk.put(uri, flat(1), 1);
      const f = new SpectrumFiles({
        access: disk,
        parse: (t, n) => Promise.resolve(readSpectrum(t, n)),
        folders: () => ['file:///c%3A/lab'],
        onChange: () => undefined,
      });
      const note = 'file:///c%3A/lab/note.md';
      assert.equal(f.lookup(note, 'a.csv').key, `file:${uri}`);
      await f.settled();
      disk.put(uri, flat(5), 2);
      f.changed('file:///c%3A/lab/a.csv');
      await f.settled();
      const a = f.lookup(note, 'a.csv');
      assert.equal(a.state === 'ready' && a.spectrum.y[0], 5);
    });

    it('forgets the oldest missing files past the bound (every prefix of a path being typed is one)', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/keep.csv', flat(1));
      const f = files(disk);
      f.lookup(NOTE, 'keep.csv');
      await f.settled();
      for (let i = 0; i < 2 * MAX_KNOWN_FILES; i++) {
        f.lookup(NOTE, `typing/${i}.csv`);
        if (i % 100 === 99) await f.settled();
      }
      await f.settled();
      assert.ok(f.known.length <= MAX_KNOWN_FILES, String(f.known.length));
      assert.ok(f.known.includes('file:///lab/day/keep.csv'), 'a parsed file stays');
      assert.equal(f.lookup(NOTE, 'keep.csv').state, 'ready');
    });

    it('refuses a file above 64 MB without reading it', async () => {
      const disk: SpectrumFileAccess & { reads: number } = {
        reads: 0,
        stat: () => Promise.resolve({ size: 64 * 1024 * 1024 + 1, mtime: 1 }),
        read() {
          this.reads++;
          return Promise.resolve('');
        },
      };
      const f = new SpectrumFiles({
        access: disk,
        parse: (t, n) => Promise.resolve(readSpectrum(t, n)),
        folders: () => [ROOT],
        onChange: () => undefined,
      });
      f.lookup(NOTE, 'big.jdx');
      await f.settled();
      const a = f.lookup(NOTE, 'big.jdx');
      assert.equal(a.state, 'large');
      assert.equal(disk.reads, 0);
    });

    it('refuses a link that leads out of the workspace, unread', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/link.csv', flat(1));
      disk.links.set('file:///lab/day/link.csv', 'file:///etc/secret.csv');
      const f = files(disk);
      f.lookup(NOTE, 'link.csv');
      await f.settled();
      assert.equal(f.lookup(NOTE, 'link.csv').state, 'outside');
      assert.equal(disk.reads.length, 0);
    });

    it('a malformed file is an answer with its line, not an exception', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/bad.csv', 'ppm,intensity\n1,2\nthree,four\n');
      const f = files(disk);
      f.lookup(NOTE, 'bad.csv');
      await f.settled();
      const a = f.lookup(NOTE, 'bad.csv');
      assert.equal(a.state, 'malformed');
      assert.equal(a.state === 'malformed' && a.line, 3);
    });

    it('a parser that rejects costs a log line, and the file reads as missing', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/a.csv', flat(1));
      const logs: string[] = [];
      const f = new SpectrumFiles({
        access: disk,
        parse: () => Promise.reject(new Error('worker gone')),
        folders: () => [ROOT],
        onChange: () => undefined,
        log: (m) => logs.push(m),
      });
      f.lookup(NOTE, 'a.csv');
      await f.settled();
      assert.equal(f.lookup(NOTE, 'a.csv').state, 'missing');
      assert.match(logs[0]!, /worker gone/);
    });

    it('keeps parsed spectra within the memory bound, reading a dropped one again when asked', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/a.csv', flat(1));
      disk.put('file:///lab/day/b.csv', flat(2));
      // One 101-point spectrum holds 2 × 101 × 8 bytes + 256; the bound fits one.
      const f = files(disk, [], 2000);
      f.lookup(NOTE, 'a.csv');
      f.lookup(NOTE, 'b.csv');
      await f.settled();
      assert.equal(f.lookup(NOTE, 'b.csv').state, 'ready');
      assert.equal(f.lookup(NOTE, 'a.csv').state, 'pending');
      await f.settled();
      assert.equal(f.lookup(NOTE, 'a.csv').state, 'ready');
      assert.equal(f.parses, 3);
    });
  });

  describe('notes that use them', () => {
    const text = [
      '# Day',
      '',
      '```levels',
      'id: run 12',
      'system: 13C',
      'field: 9.4 T',
      'lattice: 298 K',
      'signal:',
      '  hyperpolarized: { spectrum: spectra/hp.csv, region: [10 ppm, 20 ppm], baseline: none }',
      '  thermal: { spectrum: spectra/th.csv, region: [10 ppm, 20 ppm], baseline: none }',
      '```',
      '',
    ].join('\n');

    it('re-analyses a note of the same version when a file it uses is parsed, changes or disappears', async () => {
      const disk = new FakeDisk();
      disk.put('file:///lab/day/spectra/hp.csv', flat(300), 1);
      disk.put('file:///lab/day/spectra/th.csv', flat(1), 1);
      const changed: string[][] = [];
      const f = files(disk, changed);
      const notes = new Notes((uri) => noteExternals(uri, [f]));
      const doc = TextDocument.create(NOTE, 'markdown', 1, text);
      const pending = notes.get(doc, DEFAULT_SETTINGS);
      assert.equal(pending.report.blocks[0]!.results, null);
      assert.deepEqual(
        noteDiagnostics(pending).filter((d) => d.severity === 1),
        [],
        'no error while the files are read',
      );
      await f.settled();
      assert.deepEqual(notes.usersOf(new Set(changed.flat())), [NOTE]);
      const ready = notes.get(doc, DEFAULT_SETTINGS);
      assert.notEqual(ready, pending);
      const uses = ready.report.blocks[0]!.meta.spectra!;
      assert.deepEqual(
        uses.map((u) => [u.key, u.result?.value, u.result?.points]),
        [
          ['signal.hyperpolarized', 3000, 11],
          ['signal.thermal', 10, 11],
        ],
      );
      // P = P_th · S_hp / S_th with equal scans: the enhancement is the ratio of the integrals, 300.
      const r = ready.report.blocks[0]!.results!;
      assert.ok(Math.abs(r.enhancement! - 300) < 1e-6, String(r.enhancement));
      // Unchanged stamps: the same analysis is kept.
      assert.equal(notes.get(doc, DEFAULT_SETTINGS), ready);
      disk.files.delete('file:///lab/day/spectra/th.csv');
      f.changed('file:///lab/day/spectra/th.csv');
      await f.settled();
      const gone = notes.get(doc, DEFAULT_SETTINGS);
      const errors = noteDiagnostics(gone).filter((d) => d.code === 'spectrum-missing');
      assert.equal(errors.length, 1);
      assert.equal(errors[0]!.range.start.line, 9);
      assert.match(JSON.stringify(errors[0]!.message), /spectra\/th\.csv/);
    });
  });
});

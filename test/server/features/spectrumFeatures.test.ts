import { strict as assert } from 'node:assert';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { formatMeasured, readSpectrum } from '../../../src/core';
import { noteExternals } from '../../../src/server/externals';
import { Notes } from '../../../src/server/notes';
import { SpectrumFiles } from '../../../src/server/spectra';
import { spectrumHover } from '../../../src/server/features/spectrumHover';
import { spectrumLinks } from '../../../src/server/features/spectrumLinks';
import { spectrumFileCompletion, relativeSpectrumPaths } from '../../../src/server/features/spectrumCompletion';
import type { NoteState } from '../../../src/server/state';
import { DEFAULT_SETTINGS } from '../../../src/shared/settings';
import { FakeDisk, flat } from '../spectraHelpers';

const NOTE = 'file:///lab/day/note.md';

/**
 * A ramp y = x on x = 0 … 100 ppm, with ±0.5 alternating above 50 ppm as noise: ∫₁₀²⁰ x dx = 150 exactly by
 * the trapezoid rule (common practice, no source: the rule is exact for a straight line).
 */
function ramp(): string {
  const rows = ['ppm,intensity'];
  for (let x = 0; x <= 100; x++) rows.push(`${x},${x + (x > 50 ? (x % 2 ? 0.5 : -0.5) : 0)}`);
  return rows.join('\n');
}

const TEXT = [
  '# Day', // 0
  '', // 1
  '```levels', // 2
  'system: 13C', // 3
  'field: 9.4 T', // 4
  'lattice: 298 K', // 5
  'spectrum: spectra/hp.csv', // 6
  'signal:', // 7
  '  hyperpolarized: { region: [10 ppm, 20 ppm], baseline: none, noise: [60 ppm, 90 ppm] }', // 8
  '  thermal: { spectrum: spectra/th.csv, region: [10 ppm, 20 ppm], baseline: none }', // 9
  '  noise: { thermal: 0.1 }', // 10
  '```', // 11
  '',
].join('\n');

async function analysed(text: string): Promise<NoteState> {
  const disk = new FakeDisk();
  disk.put('file:///lab/day/spectra/hp.csv', ramp());
  disk.put('file:///lab/day/spectra/th.csv', flat(1));
  const f = new SpectrumFiles({
    access: disk,
    parse: (t, n) => Promise.resolve(readSpectrum(t, n)),
    folders: () => ['file:///lab'],
    onChange: () => undefined,
  });
  const notes = new Notes((uri) => noteExternals(uri, [f]));
  const doc = TextDocument.create(NOTE, 'markdown', 1, text);
  notes.get(doc, DEFAULT_SETTINGS);
  await f.settled();
  return notes.get(doc, DEFAULT_SETTINGS);
}

function hoverText(state: NoteState, line: number, character: number): string | null {
  const h = spectrumHover(state, { line, character }, DEFAULT_SETTINGS);
  return h ? (h.contents as { value: string }).value : null;
}

describe('spectrum references in the editor', () => {
  it('hover shows the integral ± u, the points, the x unit, the baseline, the noise region and the file', async () => {
    const state = await analysed(TEXT);
    const v = hoverText(state, 8, 30)!;
    assert.ok(v, 'a hover on the reference');
    // ∫₁₀²⁰ x dx = 150 over 11 points; u = σ·|Δx|·√n from the noise region's scatter (the core's numbers).
    const use = state.report.blocks[0]!.meta.spectra![0]!;
    assert.equal(use.result!.value, 150);
    assert.ok(use.result!.uncertainty! > 0);
    assert.ok(v.includes(`| integral | ${formatMeasured(150, use.result!.uncertainty)} (y × ppm) |`), v);
    assert.match(v, /\| region \| 10 … 20 ppm, 11 points/);
    assert.match(v, /\| noise \| 60 … 90 ppm, 31 points, σ = 0\.5\d*/);
    assert.match(v, /\| x unit \| ppm/);
    assert.match(v, /\| file \| `spectra\/hp\.csv`/);
    assert.match(v, /signal\.hyperpolarized/);
    const h = spectrumHover(state, { line: 8, character: 30 }, DEFAULT_SETTINGS)!;
    assert.deepEqual(h.range, { start: { line: 8, character: 18 }, end: { line: 8, character: 87 } });
    // The thermal reference: its own file, no noise region, so no uncertainty.
    const t = hoverText(state, 9, 20)!;
    assert.match(t, /\| integral \| 10\.00 \(y × ppm\), no noise region: no uncertainty/);
    assert.match(t, /`spectra\/th\.csv`/);
    // Elsewhere in the block the ordinary hovers apply.
    assert.equal(hoverText(state, 4, 3), null);
    // Without a baseline there is no baseline noise to add; with the linear one, its u is shown beside.
    assert.ok(!v.includes('with baseline'), v);
    const linear = await analysed(TEXT.replace('baseline: none, noise', 'noise'));
    const withBaseline = linear.report.blocks[0]!.meta.spectra![0]!.result!;
    assert.ok(withBaseline.uncertaintyWithBaseline! > 0);
    assert.ok(
      hoverText(linear, 8, 30)!.includes(
        `| with baseline | with the linear baseline's own noise, u = ${formatMeasured(withBaseline.uncertaintyWithBaseline!, null, { digits: 2 })};`,
      ),
      hoverText(linear, 8, 30)!,
    );
  });

  it('hover on a reference that could not be followed names the file and its diagnostic', async () => {
    const state = await analysed(TEXT.replace('spectra/th.csv', 'spectra/nope.csv'));
    assert.match(hoverText(state, 9, 20)!, /`spectra\/nope\.csv`[\s\S]*Not read: see the diagnostic/);
  });

  it('a path with Markdown in it stays a code span', async () => {
    const state = await analysed(TEXT.replace('spectra/th.csv', '"x`<img src=y>|.csv"'));
    const t = hoverText(state, 9, 20)!;
    assert.ok(t.includes('``x`<img src=y>\\|.csv``'), t);
  });

  it('links each written path once to the file it resolves to; a refused path gets none', async () => {
    const state = await analysed(
      TEXT.replace(
        '  noise: { thermal: 0.1 }',
        '  amount: { thermal: { spectrum: ../../../etc/x.csv, region: [1, 2] } }',
      ),
    );
    const links = spectrumLinks(state, ['file:///lab']);
    assert.deepEqual(
      links.map((l) => [l.range.start.line, l.range.start.character, l.range.end.character, l.target]),
      [
        [6, 10, 24, 'file:///lab/day/spectra/hp.csv'],
        [9, 23, 37, 'file:///lab/day/spectra/th.csv'],
      ],
    );
  });

  it('completes spectrum files under the note folder after `spectrum: `, replacing what is typed', async () => {
    const state = await analysed(TEXT.replace('spectrum: spectra/th.csv', 'spectrum: spe'));
    let asked = '';
    const list = (folder: string): Promise<string[]> => {
      asked = folder;
      return Promise.resolve([
        'file:///lab/day/spectra/th.csv',
        'file:///lab/day/a%20b.jdx',
        'file:///lab/other/x.csv',
      ]);
    };
    const items = await spectrumFileCompletion(() => Promise.resolve(state), { line: 9, character: 26 }, list);
    assert.equal(asked, 'file:///lab/day/');
    assert.deepEqual(
      items!.map((i) => [i.label, (i.textEdit as { range: { start: { character: number } } }).range.start.character]),
      [
        ['a b.jdx', 23],
        ['spectra/th.csv', 23],
      ],
    );
    // Not after `spectrum:`: the ordinary completions apply.
    assert.equal(await spectrumFileCompletion(() => Promise.resolve(state), { line: 4, character: 7 }, list), null);
    // The block-level default too.
    const top = await spectrumFileCompletion(() => Promise.resolve(state), { line: 6, character: 10 }, list);
    assert.equal(top!.length, 2);
  });

  it('relative paths keep only files under the folder, shallow ones first', () => {
    assert.deepEqual(relativeSpectrumPaths('file:///a/', ['file:///a/z/y.csv', 'file:///a/b.csv', 'file:///b/c.csv']), [
      'b.csv',
      'z/y.csv',
    ]);
  });
});

import { strict as assert } from 'node:assert';
import type { CompletionItem, TextEdit } from 'vscode-languageserver';
import { completion } from '../../../src/server/features/completion';
import { plainSnippet } from '../../../src/server/features/newBlocks';
import { note, noteState, withCursor } from '../helpers';

/** The items at the cursor marker. */
function itemsAt(marked: string): CompletionItem[] {
  const { state, position } = withCursor(marked);
  return completion(state, position);
}

/** Compares the labels of the items at the cursor, in sort order. */
function check(marked: string, expected: readonly string[]): void {
  const items = itemsAt(marked).sort((a, b) => (a.sortText ?? a.label).localeCompare(b.sortText ?? b.label));
  assert.deepEqual(
    items.map((i) => i.label),
    expected,
  );
}

/** The text an item inserts. */
function inserted(item: CompletionItem | undefined): string {
  assert.ok(item, 'the item exists');
  return (item.textEdit as TextEdit | undefined)?.newText ?? item.insertText ?? item.label;
}

const SPIN_KEYS = [
  'field',
  'frequency',
  'g-factor',
  'populations',
  'polarization',
  'signal',
  'extrapolate',
  'spectrum',
  'series',
  'lattice',
  'count',
  'uncertainty',
  'note',
  'sample',
  'date',
];

describe('completion', () => {
  describe('of keys', () => {
    it('offers every key in an empty block', () => {
      check(note('$0'), [
        'id',
        'levels',
        'system',
        'field',
        'frequency',
        'g-factor',
        'populations',
        'polarization',
        'gap',
        'g',
        'ratio',
        'signal',
        'extrapolate',
        'spectrum',
        'series',
        'lines',
        'detector',
        'cross-section',
        'length',
        'mirrors',
        'loss',
        'brightness',
        'optical-depth',
        'background',
        'wavelengths',
        'rotational-constant',
        'lattice',
        'count',
        'uncertainty',
        'note',
        'sample',
        'date',
      ]);
    });

    it('never proposes a key already in the mapping, nor one of another form', () => {
      check(note('id: a', 'system: 13C', '$0'), SPIN_KEYS);
      check(note('id: a', 'system: 13C', 'fi$0'), SPIN_KEYS);
      check(note('system: 13C', '$0', 'field: 9.4 T', 'polarization: 0.3'), [
        'id',
        'frequency',
        'g-factor',
        'extrapolate',
        'spectrum',
        'series',
        'lattice',
        'count',
        'uncertainty',
        'note',
        'sample',
        'date',
      ]);
      check(note('levels:', '  - { energy: 0 K, population: 1 }', '$0'), [
        'id',
        'extrapolate',
        'spectrum',
        'series',
        'background',
        'wavelengths',
        'rotational-constant',
        'lattice',
        'count',
        'note',
        'sample',
        'date',
      ]);
      check(note('lines:', '  - { upper: 13 eV, $0'), [
        'wavelength',
        'g',
        'A',
        'intensity',
        'uncertainty',
        'species',
        'label',
        'frequency',
        'optical-depth',
      ]);
    });

    it('documents each key with its summary and inserts `key: `', () => {
      const field = itemsAt(note('system: 13C', '$0')).find((i) => i.label === 'field');
      assert.equal(inserted(field), 'field: ');
      assert.equal(field!.kind, 10, 'Property');
      assert.deepEqual(field!.documentation, {
        kind: 'markdown',
        value:
          'Magnetic field: gives the Zeeman splitting from the isotope table’s γ (`T`, `mT`, `G`).\n\n`field: 9.4 T`',
      });
    });

    it('offers the keys of a level inside a flow item, without those it has', () => {
      check(note('levels:', '  - { label: A, $0'), ['energy', 'g', 'population', 'uncertainty']);
      check(note('levels:', '  - { label: A, energy: 1 K, $0, population: 3 }'), ['g', 'uncertainty']);
      check(note('levels:', '  - {$0'), ['label', 'energy', 'g', 'population', 'uncertainty']);
    });

    it('offers the keys of a level in a block-style item, without those it has', () => {
      check(note('levels:', '  - $0'), ['label', 'energy', 'g', 'population', 'uncertainty']);
      check(note('levels:', '  - label: A', '    $0', '    population: 0.3', '  - label: B'), [
        'energy',
        'g',
        'uncertainty',
      ]);
    });

    it('offers nothing in the middle of a value or on a fence line', () => {
      check(note('id: cell$0'), []);
      check(note('id: a').replace('```levels', '```lev$0els'), []);
    });
  });

  describe('of isotopes', () => {
    it('lists the table after `system:`, by mass number, the electron last', () => {
      const labels = itemsAt(note('system: $0')).map((i) => String(i.label));
      // The isotope table of Harris et al. 2001 (120 magnetic nuclei), then the electron.
      assert.equal(labels.length, 121);
      assert.deepEqual(labels.slice(0, 4), ['1H', '2H', '3H', '3He']);
      assert.deepEqual(labels.slice(-3), ['209Bi', '235U', 'electron']);
      const masses = labels.slice(0, -1).map((l) => Number.parseInt(l, 10));
      assert.deepEqual(
        masses,
        [...masses].sort((a, c) => a - c),
      );
      for (const required of ['7Li', '13C', '15N', '17O', '19F', '23Na', '29Si', '31P', '129Xe', '73Ge', '93Nb'])
        assert.ok(labels.includes(required), required);
    });

    it('gives spin and signed γ/2π as detail', () => {
      // IUPAC 2001 (Harris et al., Pure Appl. Chem. 73, 1795 (2001)): γ(13C) = 6.728 284 × 10⁷ rad s⁻¹ T⁻¹,
      // so γ/2π = 10.7084 MHz/T; γ(15N) = −2.712 618 04 × 10⁷, γ/2π = −4.317 27 MHz/T; 23Na has I = 3/2.
      const items = itemsAt(note('system: 1$0'));
      const detail = (label: string): string | undefined => items.find((i) => i.label === label)?.detail;
      assert.equal(detail('13C'), 'I = 1/2 · γ/2π = +10.7084 MHz/T');
      assert.equal(detail('15N'), 'I = 1/2 · γ/2π = −4.31727 MHz/T');
      assert.equal(detail('23Na'), 'I = 3/2 · γ/2π = +11.2695 MHz/T');
      // CODATA 2022: |γ_e|/2π = 28 024.951 MHz/T, negative with g_e.
      assert.equal(detail('electron'), 'I = 1/2 · γ/2π = −28.0250 GHz/T');
      assert.deepEqual(
        (items[0].textEdit as TextEdit).range,
        { start: { line: 3, character: 8 }, end: { line: 3, character: 9 } },
        'replaces the typed `1`',
      );
    });
  });

  describe('of units', () => {
    it('offers the field units after a field value', () => {
      check(note('system: 13C', 'field: 9.4 $0'), ['T', 'mT', 'µT', 'nT', 'G', 'kG']);
    });

    it('offers them after a value and its uncertainty in brackets, as the GUM writes a result', () => {
      check(note('system: 13C', 'field: (9.4 ± 0.1) $0'), ['T', 'mT', 'µT', 'nT', 'G', 'kG']);
      check(note('system: 13C', 'lattice: (300 +- 1) $0'), ['K', 'mK', 'µK', 'nK', '°C']);
    });

    it('replaces a partly typed unit', () => {
      const mt = itemsAt(note('system: 13C', 'field: 9.4 M$0')).find((i) => i.label === 'mT');
      assert.deepEqual(mt!.textEdit, {
        range: { start: { line: 4, character: 11 }, end: { line: 4, character: 12 } },
        newText: 'mT',
      });
      assert.equal(mt!.detail, '1 mT = 0.001 T');
    });

    it('adds the separating space right after a number', () => {
      const k = itemsAt(note('gap: 10 K', 'ratio: 2', 'lattice: 1.$0')).find((i) => i.label === 'K');
      assert.equal(inserted(k), ' K');
      check(note('gap: 10 K', 'ratio: 2', 'lattice: 1.$0'), ['K', 'mK', 'µK', 'nK', '°C']);
    });

    it('offers energy units in a level item, wavelengths for a gap, hertz first for a frequency', () => {
      check(note('levels:', '  - { label: A, energy: 120 $0'), [
        'J',
        'eV',
        'meV',
        'µeV',
        'cm-1',
        'Hz',
        'kHz',
        'MHz',
        'GHz',
        'THz',
        'K',
      ]);
      check(note('gap: 1064 $0'), [
        'J',
        'eV',
        'meV',
        'µeV',
        'cm-1',
        'Hz',
        'kHz',
        'MHz',
        'GHz',
        'THz',
        'K',
        'nm',
        'µm',
        'Å',
        'mm',
        'cm',
      ]);
      check(note('system: 1H', 'frequency: 400 $0'), [
        'Hz',
        'kHz',
        'MHz',
        'GHz',
        'THz',
        'J',
        'eV',
        'meV',
        'µeV',
        'cm-1',
        'K',
      ]);
    });

    it('offers density units after a population, in a flow list or a block list', () => {
      check(note('gap: 10 K', 'populations: [2.0e16 $0]'), ['cm-3', 'm-3']);
      check(note('gap: 10 K', 'populations:', '  - 2.0e16 $0'), ['cm-3', 'm-3']);
    });

    it('offers no unit after a plain number such as a polarization', () => {
      check(note('system: 13C', 'polarization: 0.3 $0'), []);
    });
  });

  describe('outside blocks', () => {
    it('offers new-block snippets at a line start', () => {
      check('# Run 7\n\n$0\n', ['levels block', 'levels block (transition)', 'levels block (explicit levels)']);
      check('# Run 7\n\nSome text $0\n', []);
    });

    it('inserts a fenced spin template with tab stops, replacing a typed fence', () => {
      const [spin] = itemsAt('# Run 7\n\n```$0\n');
      assert.equal(spin.insertTextFormat, 2, 'Snippet');
      assert.equal(spin.kind, 15, 'Snippet');
      assert.deepEqual(spin.textEdit, {
        range: { start: { line: 2, character: 0 }, end: { line: 2, character: 3 } },
        newText:
          '```levels\nid: ${1:run name}\nsystem: ${2:isotope}\nfield: ${3:field with unit}\nlattice: ${4:bath temperature with unit}\npolarization: ${5:measured P}\n```',
      });
    });

    it('fill every template with placeholder words, so a template left as inserted records no run', () => {
      for (const item of itemsAt('# Run 7\n\n$0\n')) {
        const text = (item.textEdit as { newText: string }).newText;
        const defaults = [...text.matchAll(/\$\{\d+:([^}]*)\}/g)].map((m) => m[1]!);
        assert.ok(defaults.length > 0);
        for (const d of defaults) assert.doesNotMatch(d, /\d/, `${item.label}: placeholder ${d} is no number`);
        // The template as inserted (placeholders kept) must read as invalid, not as a measurement.
        const inserted = text.replace(/\$\{\d+:([^}]*)\}/g, '$1');
        const b = noteState(`# Run\n\n${inserted}\n`).report.blocks[0]!;
        assert.equal(b.status, 'invalid', `${item.label} left as inserted`);
      }
    });

    it('inserts plain text with the placeholders’ defaults for a client without snippet support', () => {
      // LSP 3.17 §Snippet syntax: `${1:run}` is a placeholder with default `run`, `$0` / `${2}` are tab stops.
      assert.equal(plainSnippet('id: ${1:run}\ng: [${3:1}, ${4:3}]\n$0x${2}'), 'id: run\ng: [1, 3]\nx');
      const { state, position } = withCursor('# Run 7\n\n```$0\n');
      const items = completion(state, position, false);
      assert.equal(items.length, 3);
      for (const item of items) {
        assert.equal(item.insertTextFormat, 1, 'PlainText');
        assert.doesNotMatch(inserted(item), /\$/, item.label);
      }
      assert.equal(
        inserted(items[0]),
        '```levels\nid: run name\nsystem: isotope\nfield: field with unit\nlattice: bath temperature with unit\npolarization: measured P\n```',
      );
    });
  });
});

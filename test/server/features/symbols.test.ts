import { strict as assert } from 'node:assert';
import type { DocumentSymbol } from 'vscode-languageserver';
import { hover } from '../../../src/server/features/hover';
import { documentSymbols, flatSymbols } from '../../../src/server/features/symbols';
import { DEFAULT_SETTINGS } from '../../../src/shared/settings';
import { CONTRACT, note, noteState, URI, withCursor } from '../helpers';

/** A symbol as [name, detail, range as [line, character, line, character], selection range, children]. */
type Flat = [string, string, number[], number[], Flat[]];

function flat(s: DocumentSymbol): Flat {
  const r = (x: DocumentSymbol['range']): number[] => [x.start.line, x.start.character, x.end.line, x.end.character];
  return [s.name, s.detail ?? '', r(s.range), r(s.selectionRange), (s.children ?? []).map(flat)];
}

/** Compares the outline of a note. */
function check(text: string, expected: readonly Flat[]): void {
  assert.deepEqual(documentSymbols(noteState(text)).map(flat), expected);
}

describe('document symbols', () => {
  it('name a block by its id, with status and short results, selecting the id', () => {
    check(note(...CONTRACT), [
      ['cell-B run 7', 'normal · T = 5.61 mK · P = 31.2 % · ε = 241', [2, 0, 8, 3], [3, 4, 3, 16], []],
    ]);
  });

  it('clip an id of thousands of characters to 80 in the outline and the hover title, and keep its beginning', () => {
    const id = `cell-B ${'x'.repeat(5000)}`;
    const [symbol] = documentSymbols(noteState(note(`id: ${id}`, 'gap: 10 K', 'ratio: 2')));
    assert.equal(symbol!.name.length, 80);
    assert.equal(symbol!.name, `${id.slice(0, 79)}…`);
    const { state, position } = withCursor(note(`id: ${id}`, 'gap: 10 K', '$0ratio: 2'));
    const h = hover(state, position, DEFAULT_SETTINGS);
    const title = (h!.contents as { value: string }).value.split('\n')[0]!;
    assert.ok(title.length < 200, `${title.length} characters`);
    assert.ok(title.startsWith('**cell\\-B xxx'), title.slice(0, 40));
  });

  it('name a block without an id by its line and select its fence', () => {
    check(note('gap: 10 K', 'ratio: 2'), [
      ['levels block at line 3', 'inverted · T = −14.4 K · P = −33.3 %', [2, 0, 5, 3], [2, 0, 2, 9], []],
    ]);
  });

  it('give an invalid block its first error code', () => {
    check(note('id: hurried', 'system: 1H', 'field: 9.4 MT', 'polarization: 0.001'), [
      ['hurried', 'invalid · unit-case', [2, 0, 7, 3], [3, 4, 3, 11], []],
    ]);
  });

  it('list explicit levels as children, in the order they are written', () => {
    // Written from the top down; the core sorts them by energy, the outline keeps the note's order.
    check(
      note(
        'id: scheme',
        'levels:',
        '  - { label: up, energy: 10 K, population: 0.2 }',
        '  - { label: down, energy: 0 K, population: 0.8 }',
      ),
      [
        // T = 10 K / ln(0.8/0.2) = 7.213 K; P = (0.8 − 0.2)/(0.8 + 0.2) = 60 %.
        [
          'scheme',
          'normal · T = 7.21 K · P = 60.0 %',
          [2, 0, 7, 3],
          [3, 4, 3, 10],
          [
            ['up', 'E/k = 10.00 K · g = 1 · n/g = 0.200', [5, 4, 5, 48], [5, 4, 5, 48], []],
            ['down', 'E/k = 0 K · g = 1 · n/g = 0.800', [6, 4, 6, 49], [6, 4, 6, 49], []],
          ],
        ],
      ],
    );
  });

  it('never give a blank name: an id or level label that is empty or only spaces falls back to the line or the index', () => {
    // LSP 3.17, DocumentSymbol.name: "must not be an empty string or a string only consisting of white spaces".
    for (const id of ['id: ""', 'id: "   "', 'id: "\\t\\u3000"', 'id:'])
      assert.equal(documentSymbols(noteState(note(id, 'gap: 10 K', 'ratio: 2')))[0].name, 'levels block at line 3', id);
    const [scheme] = documentSymbols(
      noteState(
        note(
          'id: scheme',
          'levels:',
          '  - { label: "", energy: 10 K, population: 0.2 }',
          '  - { label: "  ", energy: 0 K, population: 0.8 }',
        ),
      ),
    );
    // Levels are numbered in energy order (the core sorts them): the 0 K level is level 1.
    assert.deepEqual(
      scheme.children!.map((c) => c.name),
      ['level 2', 'level 1'],
    );
  });

  it('flatten for a client without hierarchical symbols, each level naming its block as container', () => {
    const state = noteState(
      note(
        'id: scheme',
        'levels:',
        '  - { label: up, energy: 10 K, population: 0.2 }',
        '  - { label: down, energy: 0 K, population: 0.8 }',
      ),
    );
    const flat = flatSymbols(URI, documentSymbols(state));
    assert.deepEqual(
      flat.map((s) => [s.name, s.containerName ?? null, s.location.uri, s.location.range.start.line]),
      [
        ['scheme', null, URI, 2],
        ['up', 'scheme', URI, 5],
        ['down', 'scheme', URI, 6],
      ],
    );
  });
});

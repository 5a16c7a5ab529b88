/**
 * The outline: each block as a symbol named by its id, with its status and
 * short results as detail, and for explicit levels one child per level.
 */
import { SymbolKind, type DocumentSymbol, type SymbolInformation } from 'vscode-languageserver';
import { clipText, formatNumber, formatTemperature, NAME_CHARS, shortSummary, type BlockReport } from '../../core';
import { toRange, type NoteState } from '../state';
import { firstError } from './markdown';

/** One symbol per block, in note order. */
export function documentSymbols(state: NoteState): DocumentSymbol[] {
  return state.report.blocks.map((b) => {
    const range = toRange(state.lines, { start: b.block.openStart, end: b.block.blockEnd });
    const selection = b.meta.idSpan
      ? toRange(state.lines, b.toNote(b.meta.idSpan))
      : toRange(state.lines, { start: b.block.openStart, end: b.block.openEnd });
    return {
      name: nameOr(b.meta.id, `levels block at line ${b.block.openLine + 1}`),
      detail: detail(b),
      // LSP has no kind for a status; every block is an Object and the status goes in the detail.
      kind: SymbolKind.Object,
      range,
      selectionRange: selection,
      children: levelSymbols(state, b),
    };
  });
}

/**
 * The outline for a client without `hierarchicalDocumentSymbolSupport`: the
 * same symbols as a flat list, each level naming its block as container.
 */
export function flatSymbols(uri: string, symbols: readonly DocumentSymbol[], container?: string): SymbolInformation[] {
  return symbols.flatMap((s) => [
    {
      name: s.name,
      kind: s.kind,
      location: { uri, range: s.range },
      ...(container ? { containerName: container } : {}),
    },
    ...flatSymbols(uri, s.children ?? [], s.name),
  ]);
}

/**
 * A symbol's name: the note's own text unless it is missing or blank. LSP
 * forbids empty names, and VS Code drops the whole outline over one
 * (so does a name of spaces once trimmed), so a blank id or label gets the fallback; a long one is clipped.
 */
export function nameOr(text: string | null | undefined, fallback: string): string {
  return typeof text === 'string' && text.trim() !== '' ? clipText(text, NAME_CHARS) : fallback;
}

/** `normal · T = 5.61 mK · P = 31.2 % · ε = 241`, or `invalid · unit-case`. */
function detail(b: BlockReport): string {
  if (!b.results) {
    const e = firstError(b);
    return e ? `invalid · ${e.code}` : 'invalid';
  }
  // shortSummary ends with the status word unless normal; the detail leads with it instead.
  const summary = shortSummary(b.results).replace(new RegExp(` · ${b.status}$`), '');
  return `${b.status} · ${summary}`;
}

/** The levels of an explicit scheme, in the order they are written. */
function levelSymbols(state: NoteState, b: BlockReport): DocumentSymbol[] {
  if (b.input?.form !== 'levels') return [];
  const fractions = b.results?.fractions ?? null;
  return b.input.levels
    .map((l, i) => ({ l, i }))
    .filter(({ l }) => l.span !== null)
    .sort((x, y) => x.l.span!.start - y.l.span!.start)
    .map(({ l, i }) => {
      const range = toRange(state.lines, b.toNote(l.span!));
      const share = fractions ? ` · n/g = ${formatNumber(fractions[i] / l.g, 3)}` : '';
      return {
        name: nameOr(l.label, `level ${i + 1}`),
        detail: `E/k = ${formatTemperature(l.energy, null, { digits: 4 })} · g = ${l.g}${share}`,
        kind: SymbolKind.EnumMember,
        range,
        selectionRange: range,
      };
    });
}

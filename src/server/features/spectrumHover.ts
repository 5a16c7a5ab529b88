/**
 * The hover on a spectrum reference (docs/format.md, "Spectra by
 * reference"): the integral with its uncertainty, the region and the points
 * used, the baseline, the noise region with σ, the x unit and the file. A
 * reference that could not be followed shows the file and points at its
 * diagnostic. The file's path is note text: it goes into the Markdown only
 * as a code span.
 */
import { MarkupKind, type Hover, type Position } from 'vscode-languageserver';
import { baselineNote, formatMeasured, markdownCode, type BlockReport, type Span, type SpectrumUse } from '../../core';
import type { Settings } from '../../shared/settings';
import { blockAt, toOffset, toRange, type NoteState } from '../state';
import { markdownTable } from './markdown';

function within(span: Span, offset: number): boolean {
  return offset >= span.start && offset < span.end;
}

function num(v: number): string {
  return Number(v.toPrecision(6)).toString();
}

/** The reference under an offset of a block, with its span in the note, or null. */
export function spectrumUseAt(b: BlockReport, offset: number): { use: SpectrumUse; span: Span } | null {
  for (const use of b.meta.spectra ?? []) {
    const span = b.toNote(use.span);
    if (within(span, offset)) return { use, span };
  }
  return null;
}

/** The hover's Markdown for one reference. */
export function spectrumUseMarkdown(use: SpectrumUse, settings: Pick<Settings, 'significantDigits'>): string {
  const head = `**${markdownCode(use.key)}** from the spectrum ${markdownCode(use.file)}`;
  const r = use.result;
  if (!r) return `${head}\n\nNot read: see the diagnostic on this reference.`;
  const unit = r.unit ?? 'the region’s unit';
  const xu = r.unit ? ` ${r.unit}` : '';
  const rows: [string, string][] = [
    [
      'integral',
      `${formatMeasured(r.value, r.uncertainty, { digits: settings.significantDigits })} (y × ${unit})${r.uncertainty === null ? ', no noise region: no uncertainty' : ''}`,
    ],
    ['region', `${num(r.region[0])} … ${num(r.region[1])}${xu}, ${r.points} points`],
    [
      'baseline',
      r.baseline === 'none'
        ? 'none'
        : `linear, from (${num(r.baselineLine[0])}, ${num(r.baselineLine[1])}) to (${num(r.baselineLine[2])}, ${num(r.baselineLine[3])})`,
    ],
  ];
  if (r.noise)
    rows.push([
      'noise',
      `${num(r.noise[0])} … ${num(r.noise[1])}${xu}, ${r.noisePoints} points, σ = ${r.sigma === null ? '—' : num(r.sigma)}`,
    ]);
  if (r.uncertaintyWithBaseline !== null) rows.push(['with baseline', baselineNote(r.uncertaintyWithBaseline)]);
  rows.push(['x unit', r.unit ?? 'none in the file (read in the region’s unit)']);
  rows.push(['file', markdownCode(use.file)]);
  return `${head}\n\n${markdownTable(['', ''], rows)}`;
}

/** The hover on a spectrum reference at a position, or null when the position is on none. */
export function spectrumHover(state: NoteState, position: Position, settings: Settings): Hover | null {
  const offset = toOffset(state.lines, position);
  const b = blockAt(state, offset);
  if (!b?.meta.spectra?.length) return null;
  const at = spectrumUseAt(b, offset);
  if (!at) return null;
  return {
    contents: { kind: MarkupKind.Markdown, value: spectrumUseMarkdown(at.use, settings) },
    range: toRange(state.lines, at.span),
  };
}

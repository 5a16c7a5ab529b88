/**
 * The server's copy of an open note: the text, its line index, and what
 * changed since the last analysis, all updated by each edit in time that
 * grows with the edit, not with the note. It takes the place of the
 * `vscode-languageserver-textdocument` document (same interface, given to
 * `TextDocuments`), whose update rebuilds its line table and whose text
 * the server would then have to index again.
 *
 * The text after an edit is `before + inserted + after`, which the engine
 * keeps as a rope until something reads it character by character; the line
 * index is edited in place of being rebuilt (core/text/lineIndex.ts).
 */
import type { TextDocument, TextDocumentContentChangeEvent } from 'vscode-languageserver-textdocument';
import type { Range } from 'vscode-languageserver';
import { LineIndex, scanFencedBlocks, type FencedBlock, type TextChange } from '../core';

/** An open note. */
export class NoteDocument implements TextDocument {
  private text: string;
  private index: LineIndex;
  /** The text of the last analysis and how much of it the current text still shares at each end; null: unknown. */
  private since: { previous: string; prefix: number; suffix: number } | null = null;

  constructor(
    readonly uri: string,
    readonly languageId: string,
    public version: number,
    content: string,
  ) {
    this.text = content;
    this.index = new LineIndex(content);
  }

  /** Every fenced block of the current text, found once per version on first use (see {@link fences}). */
  private scanned: { version: number; blocks: readonly FencedBlock[] } | null = null;

  /**
   * Every fenced block of the current text, in order (any info string: the
   * scan does not depend on settings). The server takes it when the note
   * opens, so that a request about one block of a large note, before the
   * note's whole analysis, finds that block at once.
   */
  fences(): readonly FencedBlock[] {
    if (this.scanned?.version !== this.version)
      this.scanned = { version: this.version, blocks: [...scanFencedBlocks(this.text)] };
    return this.scanned.blocks;
  }

  /** The line index of the current text. */
  get lines(): LineIndex {
    return this.index;
  }

  get lineCount(): number {
    return this.index.lineCount;
  }

  getText(range?: Range): string {
    if (!range) return this.text;
    const start = this.index.offsetAt(range.start);
    const end = this.index.offsetAt(range.end);
    return this.text.slice(start, Math.max(start, end));
  }

  positionAt(offset: number): { line: number; character: number } {
    return this.index.positionAt(offset);
  }

  offsetAt(position: { line: number; character: number }): number {
    return this.index.offsetAt(position);
  }

  getLineRange(line: number): Range {
    if (line < 0) return { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } };
    if (line >= this.index.lineCount) {
      const end = this.index.positionAt(this.text.length);
      return { start: end, end };
    }
    return {
      start: { line, character: 0 },
      end: { line, character: this.index.lineEnd(line) - this.index.lineStart(line) },
    };
  }

  getEOLCharacters(line: number): string {
    if (line < 0 || line >= this.index.lineCount - 1) return '';
    return this.text.slice(this.index.lineEnd(line), this.index.lineStart(line + 1));
  }

  /** Applies the changes of one `didChange`, in order. */
  update(changes: readonly TextDocumentContentChangeEvent[], version: number): void {
    for (const c of changes) {
      if ('range' in c) {
        // A range given end first is read start first, as the protocol library's document reads it.
        const a = this.index.offsetAt(c.range.start);
        const b = this.index.offsetAt(c.range.end);
        const start = Math.min(a, b);
        const end = Math.max(a, b);
        const oldLength = this.text.length;
        this.text = this.text.slice(0, start) + c.text + this.text.slice(end);
        this.index = this.index.edit(start, end, c.text.length, this.text);
        if (this.since)
          this.since = {
            previous: this.since.previous,
            prefix: Math.min(this.since.prefix, start),
            suffix: Math.min(this.since.suffix, oldLength - end),
          };
      } else {
        this.text = c.text;
        this.index = new LineIndex(c.text);
        this.since = null;
      }
    }
    this.version = version;
  }

  /** What changed since the text last given to {@link analysed}, for the analyzer; undefined when unknown. */
  change(): TextChange | undefined {
    return this.since ?? undefined;
  }

  /** Records that `text` (the current text) was just analysed: later changes are counted from it. */
  analysed(text: string): void {
    this.since = { previous: text, prefix: text.length, suffix: text.length };
  }
}

/** The configuration `TextDocuments` builds and updates its documents with. */
export const noteDocuments = {
  create: (uri: string, languageId: string, version: number, content: string): NoteDocument =>
    new NoteDocument(uri, languageId, version, content),
  update: (doc: NoteDocument, changes: TextDocumentContentChangeEvent[], version: number): NoteDocument => {
    doc.update(changes, version);
    return doc;
  },
};

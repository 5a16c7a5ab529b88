/**
 * The server's copy of an open note: the text, its line index, and what
 * changed since the last analysis, all updated by each edit in time that
 * grows with the edit, not with the note. It takes the place of the
 * `vscode-languageserver-textdocument` document (same interface, given to
 * `TextDocuments`), whose update rebuilds its line table and whose text
 * the server would then have to index again.
 *
 * The text is kept in pieces with their line starts (core/text/noteText.ts):
 * an edit rebuilds the few pieces it touched, and the whole text is made as
 * one string only when something asks for it.
 */
import type { TextDocument, TextDocumentContentChangeEvent } from 'vscode-languageserver-textdocument';
import type { Range } from 'vscode-languageserver';
import { NoteText, scanFencedBlocks, type FencedBlock, type TextChange } from '../core';

/** An open note. */
export class NoteDocument implements TextDocument {
  private text: NoteText;
  /** The latest edits, oldest first: the text each was made to and the stretch it left alone at each end. */
  private edits: { readonly before: NoteText; readonly prefix: number; readonly suffix: number }[] = [];

  constructor(
    readonly uri: string,
    readonly languageId: string,
    public version: number,
    content: string,
  ) {
    this.text = NoteText.of(content);
  }

  /**
   * Every fenced block of the current text, found once per text on first use (see {@link fences}); kept with the
   * text it was found in, not its version number, which a client may send unchanged with a changed text.
   */
  private scanned: { text: NoteText; blocks: readonly FencedBlock[] } | null = null;

  /**
   * Every fenced block of the current text, in order (any info string: the
   * scan does not depend on settings). The server takes it when the note
   * opens, so that a request about one block of a large note, before the
   * note's whole analysis, finds that block at once.
   */
  fences(): readonly FencedBlock[] {
    if (this.scanned?.text !== this.text)
      this.scanned = { text: this.text, blocks: [...scanFencedBlocks(this.text.toString())] };
    return this.scanned.blocks;
  }

  /** The current text, in pieces, with its line index. */
  get lines(): NoteText {
    return this.text;
  }

  /** The current text, in pieces (an edit makes a new one; this one never changes). */
  get pieces(): NoteText {
    return this.text;
  }

  get lineCount(): number {
    return this.text.lineCount;
  }

  getText(range?: Range): string {
    if (!range) return this.text.toString();
    const start = this.text.offsetAt(range.start);
    const end = this.text.offsetAt(range.end);
    return this.text.slice(start, Math.max(start, end));
  }

  positionAt(offset: number): { line: number; character: number } {
    return this.text.positionAt(offset);
  }

  offsetAt(position: { line: number; character: number }): number {
    return this.text.offsetAt(position);
  }

  getLineRange(line: number): Range {
    if (line < 0) return { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } };
    if (line >= this.text.lineCount) {
      const end = this.text.positionAt(this.text.length);
      return { start: end, end };
    }
    return {
      start: { line, character: 0 },
      end: { line, character: this.text.lineEnd(line) - this.text.lineStart(line) },
    };
  }

  getEOLCharacters(line: number): string {
    if (line < 0 || line >= this.text.lineCount - 1) return '';
    return this.text.slice(this.text.lineEnd(line), this.text.lineStart(line + 1));
  }

  /** Applies the changes of one `didChange`, in order. */
  update(changes: readonly TextDocumentContentChangeEvent[], version: number): void {
    for (const c of changes) {
      if ('range' in c) {
        // A range given end first is read start first, as the protocol library's document reads it.
        const a = this.text.offsetAt(c.range.start);
        const b = this.text.offsetAt(c.range.end);
        const start = Math.min(a, b);
        const end = Math.max(a, b);
        const before = this.text;
        this.text = before.edit(start, end, c.text);
        this.edits.push({ before, prefix: start, suffix: before.length - end });
        if (this.edits.length > EDITS_KEPT) this.edits.shift();
      } else {
        this.text = NoteText.of(c.text);
        this.edits = [];
      }
    }
    this.version = version;
  }

  /**
   * What changed between an earlier version of the text and the current one (how much they share at each
   * end), for a reader that remembers its reading of `previous`; undefined when `previous` is not among the
   * latest versions.
   */
  changeSince(previous: NoteText): TextChange | undefined {
    if (previous === this.text) return { previous, prefix: previous.length, suffix: previous.length };
    let prefix = Infinity;
    let suffix = Infinity;
    for (let i = this.edits.length - 1; i >= 0; i--) {
      const e = this.edits[i]!;
      prefix = Math.min(prefix, e.prefix);
      suffix = Math.min(suffix, e.suffix);
      if (e.before === previous) return { previous, prefix, suffix };
    }
    return undefined;
  }
}

/** Edits remembered for {@link NoteDocument.changeSince}: more than come in between two readings of a note. */
const EDITS_KEPT = 64;

/** The configuration `TextDocuments` builds and updates its documents with. */
export const noteDocuments = {
  create: (uri: string, languageId: string, version: number, content: string): NoteDocument =>
    new NoteDocument(uri, languageId, version, content),
  update: (doc: NoteDocument, changes: TextDocumentContentChangeEvent[], version: number): NoteDocument => {
    doc.update(changes, version);
    return doc;
  },
};

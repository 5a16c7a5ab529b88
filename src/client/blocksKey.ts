/**
 * The `boltzmark.noteHasBlocks` context key: true while the active editor
 * shows a Markdown note with at least one `levels` block (or a block of an
 * extra info string), so that the editor title's curve button appears only
 * on such notes (`when` in package.json's `editor/title` menu). Pure logic:
 * the extension feeds it the active editor and passes the value on to
 * VS Code's `setContext` only when it changes.
 */
import { hasLevelsBlock } from '../core/packageFree';

/** The context key's name, as package.json's `when` clauses spell it. */
export const NOTE_HAS_BLOCKS = 'boltzmark.noteHasBlocks';

/** Pause after the last edit of the active note before its blocks are looked for again. */
export const BLOCKS_KEY_DELAY_MS = 250;

/** The part of a document the key reads. */
export interface NoteLike {
  readonly languageId: string;
  getText(): string;
}

/** Whether the title button belongs on this document. */
export function noteHasBlocks(doc: NoteLike | undefined, infoStrings: readonly string[]): boolean {
  return doc !== undefined && doc.languageId === 'markdown' && hasLevelsBlock(doc.getText(), infoStrings);
}

/** Keeps the key's last value and reports only changes (VS Code's `setContext` is a command round trip). */
export class BlocksKey {
  private value: boolean | undefined;

  constructor(
    private readonly set: (value: boolean) => void,
    private readonly infoStrings: () => readonly string[],
  ) {}

  /** The active editor's document changed (another editor, an edit, a settings change): look again. */
  update(doc: NoteLike | undefined): void {
    const value = noteHasBlocks(doc, this.infoStrings());
    if (value === this.value) return;
    this.value = value;
    this.set(value);
  }
}

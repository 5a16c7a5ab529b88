/**
 * Editor support for runs by reference (docs/format.md, "A run by
 * reference"): a run's id is a symbol of the workspace. Go to definition
 * leads from a reference to the referenced block's `id` line, find
 * references lists every block that refers to a run, rename changes an id
 * and every reference to it (one workspace edit the user confirms), every
 * run id is a workspace symbol, ids are completed after `run: `, a reference
 * has a hover with the referenced run's summary, and the note part of a
 * reference is a link to its note.
 *
 * Everything is read from the workspace's {@link WorkspaceRuns} index; the
 * referring note's own text is the one the editor has.
 */
import {
  CompletionItemKind,
  MarkupKind,
  ResponseError,
  ErrorCodes,
  SymbolKind,
  type CompletionItem,
  type DocumentLink,
  type Hover,
  type Location,
  type Position,
  type Range,
  type SymbolInformation,
  type TextEdit,
  type WorkspaceEdit,
} from 'vscode-languageserver';
import {
  DEFAULT_DISPLAY,
  shortSummary,
  spanToNote,
  STATUS_WORDS,
  type BookBlock,
  type DisplayOptions,
  type RunFacts,
  type RunPlace,
  type RunRef,
  type Span,
} from '../../core';
import { isNotebookNote } from '../runs/notebookNotes';
import { notebookOfCell, type WorkspaceRuns } from '../runs/workspaceRuns';
import { toOffset, toRange, type NoteState } from '../state';
import { escapeMarkdown } from './markdown';

/** What stands at a position: a block's own id value, or a reference's id (or note) part. */
export type RunSymbolAt =
  | { readonly kind: 'id'; readonly block: BookBlock; readonly span: Span }
  | {
      readonly kind: 'ref';
      readonly from: BookBlock;
      readonly ref: RunRef;
      /** Note offsets of the reference's id part and of the whole value. */
      readonly span: Span;
      readonly whole: Span;
    };

/** True when the offset lies on the span or just after its last character (where a cursor stands after typing). */
function touches(span: Span, offset: number): boolean {
  return offset >= span.start && offset <= span.end;
}

/** The run id or reference at a note offset, or null. */
export function runSymbolAt(runs: WorkspaceRuns, uri: string, offset: number): RunSymbolAt | null {
  // Found by binary search: a hover in a note of thousands of blocks touches a few of them.
  const b = runs.book.blockHolding(uri, offset);
  if (!b) return null;
  for (const ref of b.refs) {
    const whole = spanToNote(b.block, ref.span);
    if (touches(whole, offset)) return { kind: 'ref', from: b, ref, span: spanToNote(b.block, ref.idSpan), whole };
  }
  if (b.place && touches(b.place.span, offset)) return { kind: 'id', block: b, span: b.place.span };
  return null;
}

/** The run a symbol names: the block itself for an id, the referenced block for a reference (null when unknown). */
function runOf(runs: WorkspaceRuns, uri: string, s: RunSymbolAt): BookBlock | null {
  return s.kind === 'id' ? s.block : runs.book.target(uri, s.ref);
}

/**
 * An LSP range of note offsets in any note of the index (the editor's text for the asking note; in a notebook's
 * file for a notebook, see notebookNotes.ts).
 */
function rangeIn(runs: WorkspaceRuns, state: NoteState, note: string, span: Span): Range | null {
  if (note === state.uri) return toRange(state.lines, span);
  return runs.rangeOf(note, span);
}

/** Go to definition: from a reference to the `id` value of the referenced block, in its note. */
export function runDefinition(runs: WorkspaceRuns, state: NoteState, position: Position): Location[] {
  const s = runSymbolAt(runs, state.uri, toOffset(state.lines, position));
  if (!s) return [];
  const target = runOf(runs, state.uri, s);
  if (!target?.place) return [];
  const range = rangeIn(runs, state, target.note, target.place.span);
  return range ? [{ uri: target.note, range }] : [];
}

/** Find references: every reference to the run at the position, in every note, and its id when asked. */
export function runReferences(
  runs: WorkspaceRuns,
  state: NoteState,
  position: Position,
  includeDeclaration: boolean,
): Location[] {
  const s = runSymbolAt(runs, state.uri, toOffset(state.lines, position));
  if (!s) return [];
  const target = runOf(runs, state.uri, s);
  if (!target) return [];
  const out: Location[] = [];
  if (includeDeclaration && target.place) {
    const range = rangeIn(runs, state, target.note, target.place.span);
    if (range) out.push({ uri: target.note, range });
  }
  for (const r of runs.book.referrers(target)) {
    const range = rangeIn(runs, state, r.from.note, r.idSpan);
    if (range) out.push({ uri: r.from.note, range });
  }
  return out;
}

/** The text at a span of a note of the index. */
function textAt(runs: WorkspaceRuns, state: NoteState, note: string, span: Span): string | null {
  const text = note === state.uri ? state.text : runs.textOf(note);
  return text === null ? null : text.slice(span.start, span.end);
}

/** prepareRename: the id under the cursor (a block's id or a reference's id part); null (refused) elsewhere. */
export function runPrepareRename(
  runs: WorkspaceRuns,
  state: NoteState,
  position: Position,
): { range: Range; placeholder: string } | null {
  const s = runSymbolAt(runs, state.uri, toOffset(state.lines, position));
  if (!s) return null;
  const id = s.kind === 'id' ? s.block.id : s.ref.id;
  // Only an id written as it reads (no escapes) can be replaced in place.
  if (id === null || state.text.slice(s.span.start, s.span.end) !== id) return null;
  if (s.kind === 'ref' && !runs.book.target(state.uri, s.ref))
    throw new ResponseError(ErrorCodes.InvalidRequest, `No run has the id "${id}": there is nothing to rename.`);
  return { range: toRange(state.lines, s.span), placeholder: id };
}

/**
 * Control characters (C0, DEL, C1), the byte-order mark, zero-width characters and the bidirectional controls
 * (UAX #9): YAML refuses the first in a plain scalar, and the others would make two ids that read alike differ.
 */
const INVISIBLE_OR_CONTROL =
  // eslint-disable-next-line no-control-regex -- the control characters are what it finds
  /[\u0000-\u001f\u007f-\u009f\u00ad\u061c\u180e\u200b-\u200f\u202a-\u202e\u2060-\u2064\u2066-\u206f\ufeff]/;

/** Why a new id cannot be written as a plain YAML value of `id:` and of `run:`, or null when it can. */
export function badRunId(name: string): string | null {
  if (name.trim() === '') return 'An id cannot be empty.';
  if (name !== name.trim()) return 'An id cannot start or end with a space.';
  if (/[\r\n\t\u0085\u2028\u2029]/.test(name)) return 'An id is one line.';
  if (INVISIBLE_OR_CONTROL.test(name))
    return 'An id holds only visible characters: no control, zero-width or direction-changing ones.';
  // YAML reads these plain words as null (core schema, YAML 1.2.2 §10.3.2): the block would have no id.
  if (/^(?:null|Null|NULL|~)$/.test(name)) return `YAML reads "${name}" as no value at all, so it cannot be an id.`;
  if (/[#:{}[\],&*!|>'"%@`]/.test(name))
    return 'An id is written plain, so it cannot hold any of # : { } [ ] , & * ! | > \' " % @ `.';
  if (/^[-?]/.test(name)) return 'An id cannot start with - or ?.';
  return null;
}

/** Options of the rename edit, from the client's capabilities. */
export interface RenameOptions {
  /** The client takes `documentChanges` with change annotations: the edit's places are labelled as one rename. */
  readonly annotations: boolean;
}

/** Rename: the run's id and every reference to it, in every note, as one edit; nothing else changes. */
export function runRename(
  runs: WorkspaceRuns,
  state: NoteState,
  position: Position,
  newName: string,
  options: RenameOptions,
): WorkspaceEdit | null {
  const s = runSymbolAt(runs, state.uri, toOffset(state.lines, position));
  if (!s) return null;
  const target = runOf(runs, state.uri, s);
  if (!target?.place || target.id === null) return null;
  const bad = badRunId(newName);
  if (bad) throw new ResponseError(ErrorCodes.InvalidParams, bad);
  if (newName === target.id) return null;
  if (runs.book.blocksWithId(newName).length > 0)
    throw new ResponseError(ErrorCodes.InvalidParams, `Another run already has the id "${newName}".`);
  // A notebook's file is JSON: an edit there is not a replacement of the text the book reads. Rather than leave a
  // reference behind, the rename is refused and names the notebook.
  const notebooks = [target.note, ...runs.book.referrers(target).map((r) => r.from.note)].filter(isNotebookNote);
  if (notebooks.length > 0)
    throw new ResponseError(
      ErrorCodes.InvalidRequest,
      `The run "${target.id}" is written or referred to in the notebook ${noteName(notebooks[0]!)}, which rename does not edit; change the id there by hand.`,
    );
  const edits = new Map<string, TextEdit[]>();
  const add = (note: string, span: Span): void => {
    // Replaced only where the id is written as it reads; a quoted id with escapes is left to the user.
    if (textAt(runs, state, note, span) !== target.id) return;
    const range = rangeIn(runs, state, note, span);
    if (!range) return;
    const list = edits.get(note) ?? [];
    list.push({ range, newText: newName });
    edits.set(note, list);
  };
  add(target.note, target.place.span);
  for (const r of runs.book.referrers(target)) add(r.from.note, r.idSpan);
  if (!options.annotations) return { changes: Object.fromEntries(edits) };
  const annotationId = 'boltzmark.renameRun';
  return {
    changeAnnotations: {
      [annotationId]: {
        label: `Rename run "${target.id}" to "${newName}"`,
        // Not `needsConfirmation`: VS Code would then show every place unticked in its preview. The rename is
        // the user's own command, applied on Enter or first shown in the refactor preview (Ctrl+Enter).
        needsConfirmation: false,
        description: `${[...edits.values()].reduce((n, e) => n + e.length, 0)} place(s) in ${edits.size} note(s)`,
      },
    },
    documentChanges: [...edits].map(([uri, list]) => ({
      textDocument: { uri, version: null },
      edits: list.map((e) => ({ ...e, annotationId })),
    })),
  };
}

/** The workspace's notes path of a note, for details: relative to the asking note's folder when it is near. */
function noteName(note: string): string {
  const path = note.split(/[?#]/)[0] ?? note;
  let name = path.slice(path.lastIndexOf('/') + 1);
  try {
    name = decodeURIComponent(name);
  } catch {
    // kept as written
  }
  return name;
}

/** One line about a run: status and temperature (or why it has none). */
export function runLine(facts: RunFacts, o: DisplayOptions = DEFAULT_DISPLAY): string {
  if (facts.error) return `${STATUS_WORDS.invalid}: ${facts.error.code}`;
  if (!facts.results) return STATUS_WORDS[facts.status];
  return shortSummary(facts.results, o);
}

/** Workspace symbols: every run id matching the query (letters in order, any case), at most `limit`. */
export function runSymbols(runs: WorkspaceRuns, query: string, limit = 500): SymbolInformation[] {
  const q = query.toLowerCase().replace(/\s+/g, '');
  const out: SymbolInformation[] = [];
  for (const b of runs.book.runs()) {
    if (out.length >= limit) break;
    if (!b.place || b.id === null || !fuzzy(b.id.toLowerCase(), q)) continue;
    const range = runs.rangeOf(b.note, b.place.span);
    if (!range) continue;
    const facts = runs.book.facts(b);
    out.push({
      name: b.id,
      kind: SymbolKind.Event,
      location: { uri: b.note, range },
      containerName: `${runLine(facts)} · ${noteName(b.note)}`,
    });
  }
  return out;
}

/** True when every character of `q` appears in `s`, in order. */
function fuzzy(s: string, q: string): boolean {
  let i = 0;
  for (let k = 0; k < s.length && i < q.length; k++) if (s[k] === q[i]) i++;
  return i === q.length;
}

/** Completion of run ids after `run: ` (and after `note.md#`), or null when the cursor is not there. */
export function runCompletion(runs: WorkspaceRuns, state: NoteState, position: Position): CompletionItem[] | null {
  const lineStart = state.lines.offsetAt({ line: position.line, character: 0 });
  const offset = toOffset(state.lines, position);
  const before = state.text.slice(lineStart, offset);
  const m = /\brun:[ \t]*(["']?)([^"'{}#\n]*?(?:\.(?:md|markdown|ipynb)#)?)([^"'{}#\n,]*)$/i.exec(before);
  if (!m) return null;
  const inBlock = runs.book.blocksOf(state.uri).find((b) => offset > b.block.openEnd && offset <= b.block.blockEnd);
  if (!inBlock) return null;
  const notePart = m[2]!.endsWith('#') ? m[2]!.slice(0, -1) : null;
  const typed = m[3]!;
  const range: Range = {
    start: { line: position.line, character: position.character - typed.length },
    end: position,
  };
  const candidates = notePart
    ? runs.book.blocksNamed(runs.book.notePath(state.uri, notePart)).filter((b) => b.id !== null)
    : runs.book.runs();
  const items: CompletionItem[] = [];
  const seen = new Set<string>();
  for (const b of candidates) {
    if (b.id === null || seen.has(b.id) || b === inBlock) continue;
    seen.add(b.id);
    items.push({
      label: b.id,
      kind: CompletionItemKind.Reference,
      detail: b.note === state.uri ? 'run in this note' : `run in ${noteName(b.note)}`,
      textEdit: { range, newText: b.id },
    });
    if (items.length >= 1000) break;
  }
  return items;
}

/**
 * Where a run is, in words: `note.md, line 5`; in a notebook, its cell and the line in the cell, as the command
 * line prints them (`day.ipynb, cell 2, line 4`); in a cell of a notebook open in the editor, whose place among
 * the cells the server is not told, `a cell of day.ipynb, line 4`.
 */
export function placeWords(place: RunPlace): string {
  if (place.cell) return `${noteName(place.note)}, cell ${place.cell.index + 1}, line ${place.cell.line + 1}`;
  const notebook = notebookOfCell(place.note);
  if (notebook !== null) return `a cell of ${noteName(notebook)}, line ${place.line + 1}`;
  return `${noteName(place.note)}, line ${place.line + 1}`;
}

/** Hover on a reference: the referenced run's summary and where it is. */
export function runHover(
  runs: WorkspaceRuns,
  state: NoteState,
  position: Position,
  o: DisplayOptions = DEFAULT_DISPLAY,
): Hover | null {
  const s = runSymbolAt(runs, state.uri, toOffset(state.lines, position));
  if (!s || s.kind !== 'ref') return null;
  const answer = runs.book.resolve(state.uri, s.ref, s.from.block.body);
  const range = toRange(state.lines, s.whole);
  const lines: string[] = [];
  const what = s.ref.use === 'thermal' ? 'Thermal reference' : 'Decay (T₁) from run';
  switch (answer.kind) {
    case 'found': {
      const f = answer.run;
      const where = placeWords(f.place);
      lines.push(`**${what}: ${escapeMarkdown(f.id)}**${f.date ? ` (${escapeMarkdown(f.date)})` : ''}`, '');
      lines.push(`${escapeMarkdown(runLine(f, o))}`, '');
      if (f.error) lines.push(`First error (line ${f.error.line + 1}): ${escapeMarkdown(f.error.message)}`, '');
      lines.push(`In ${escapeMarkdown(where)}`);
      break;
    }
    case 'unknown':
      lines.push(`**${what}**: no run has the id "${escapeMarkdown(s.ref.id)}".`);
      break;
    case 'cycle':
      lines.push(`**${what}**: the references go round: ${escapeMarkdown(answer.chain.join(' → '))}.`);
      break;
    case 'note-missing':
      lines.push(`**${what}**: the note ${escapeMarkdown(noteName(answer.note))} is not in the workspace.`);
      break;
  }
  return { contents: { kind: MarkupKind.Markdown, value: lines.join('\n') }, range };
}

/** Document links: the note part of each reference that names another note. */
export function runLinks(runs: WorkspaceRuns, state: NoteState): DocumentLink[] {
  const out: DocumentLink[] = [];
  for (const b of runs.book.blocksOf(state.uri))
    for (const ref of b.refs) {
      if (ref.note === null || ref.noteSpan === null) continue;
      const note = runs.book.notePath(state.uri, ref.note);
      const target = runs.book.target(state.uri, ref);
      // A run in a cell of a notebook open in the editor: its line is the cell's, not the notebook file's.
      const at = target?.place && target.note === note ? `#L${target.place.line + 1}` : '';
      out.push({
        range: toRange(state.lines, spanToNote(b.block, ref.noteSpan)),
        target: note + at,
        tooltip: target ? `Open ${ref.id} in ${ref.note}` : `Open ${ref.note}`,
      });
    }
  return out;
}

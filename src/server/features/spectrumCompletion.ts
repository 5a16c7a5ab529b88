/**
 * Completion of spectrum files after `spectrum: ` inside a block (in a
 * reference's mapping or as the block's default): the files with a spectrum
 * ending found under the note's folder, as paths relative to it. The host
 * lists the folder (`SpectrumHost.list`); a host that cannot gives none.
 */
import { CompletionItemKind, type CompletionItem, type Position } from 'vscode-languageserver';
import { noteFileUri } from '../spectra';
import { blockAt, clampPosition, toOffset, type NoteState } from '../state';

/** `spectrum:` then the path typed so far, up to the cursor. */
const AFTER_KEY = /(?:^|[\s{,])spectrum:\s+([^\s,{}[\]]*)$/;

/** The folder URI of a note (with a trailing `/`), or null for a note in no folder. */
export function noteFolderUri(noteUri: string): string | null {
  const u = noteFileUri(noteUri);
  if (!/^[A-Za-z][A-Za-z0-9+.-]*:\/\//.test(u) || u.startsWith('untitled:')) return null;
  const i = u.lastIndexOf('/');
  return i > u.indexOf('//') + 1 ? u.slice(0, i + 1) : null;
}

/** Paths relative to `folder` (a URI ending in `/`) of the listed URIs under it, decoded, sorted. */
export function relativeSpectrumPaths(folder: string, uris: readonly string[]): string[] {
  const out: string[] = [];
  for (const u of uris) {
    if (!u.startsWith(folder)) continue;
    try {
      out.push(decodeURIComponent(u.slice(folder.length)));
    } catch {
      // A name that does not decode cannot be written in a note either.
    }
  }
  return out.sort((a, b) => a.split('/').length - b.split('/').length || a.localeCompare(b));
}

/**
 * The file completions at a position, or null when the position is not after `spectrum: ` in a block (the
 * other completions apply then).
 */
export async function spectrumFileCompletion(
  stateOf: () => Promise<NoteState | null>,
  position: Position,
  list: ((folderUri: string) => Promise<string[]>) | undefined,
): Promise<CompletionItem[] | null> {
  const state = await stateOf();
  if (!state) return null;
  position = clampPosition(state, position);
  const offset = toOffset(state.lines, position);
  const b = blockAt(state, offset);
  if (!b || position.line <= b.block.openLine) return null;
  const before = state.text.slice(state.lines.lineStart(position.line), offset);
  const m = AFTER_KEY.exec(before);
  if (!m) return null;
  const folder = noteFolderUri(state.uri);
  if (!folder || !list) return [];
  const typed = m[1]!;
  const paths = relativeSpectrumPaths(folder, await list(folder));
  const start = { line: position.line, character: position.character - typed.length };
  return paths.map((p, i) => ({
    label: p,
    kind: CompletionItemKind.File,
    detail: 'spectrum file',
    sortText: String(i).padStart(5, '0'),
    textEdit: { range: { start, end: position }, newText: p },
  }));
}

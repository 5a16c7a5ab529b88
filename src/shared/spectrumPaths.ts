/**
 * Where a spectrum file named in a note lies (docs/format.md, "Spectra by
 * reference"): the path as written resolves against the note's folder (a
 * notebook cell's against its notebook) and must stay inside the workspace
 * folder that holds the note (or the note's own folder tree when it is in no
 * workspace folder); anything else is refused unread (`spectrum-outside`).
 * Used by `SpectrumFiles` (spectrumFiles.ts), which re-exports these
 * names. Pure string work on URIs: no Node built-in and no editor API.
 */

/** The resolved location of a path written in a note, or why it is refused. */
export type SpectrumLocation = { readonly uri: string; readonly root: string } | { readonly outside: string };

/** Splits a URI into the part before the path and its path (`file:///a/b` → `file://`, `/a/b`). */
function splitUri(uri: string): { head: string; path: string } | null {
  const m = /^([A-Za-z][A-Za-z0-9+.-]*:(?:\/\/[^/?#]*)?)([^?#]*)/.exec(uri);
  return m ? { head: m[1]!, path: m[2]! } : null;
}

/**
 * The URI a note's files are relative to: a notebook cell's URI stands for its notebook
 * (`vscode-notebook-cell:/a/nb.ipynb#W1sZmlsZQ==` → `file:///a/nb.ipynb`). VS Code names a cell by its
 * notebook's URI with the scheme `vscode-notebook-cell` and a fragment of the cell's handle, `s`, and the
 * notebook's own scheme in base64; a fragment that does not read so stands for `file`. A notebook of a remote
 * workspace (`vscode-remote://host/a/nb.ipynb`) is, where the server runs beside its files, `file:///a/nb.ipynb`:
 * VS Code's remote extension host names the workspace's files so, but leaves a cell's URI as the window wrote it.
 */
export function noteFileUri(noteUri: string): string {
  if (noteUri.startsWith('vscode-notebook-cell:')) {
    const rest = noteUri.slice('vscode-notebook-cell:'.length).replace(/[?#].*$/, '');
    const scheme = cellNotebookScheme(noteUri);
    if (scheme === 'vscode-remote') return `file://${rest.replace(/^\/\/[^/]*/, '')}`;
    // Spelled as VS Code spells a URI: `file:` always with `//`, another scheme with them only for an authority.
    return scheme === 'file' && !rest.startsWith('//') ? `file://${rest}` : `${scheme}:${rest}`;
  }
  return noteUri.replace(/[?#].*$/, '');
}

/** The scheme of a cell's notebook, read from the cell URI's fragment; `file` when it does not read as one. */
function cellNotebookScheme(cellUri: string): string {
  const hash = cellUri.indexOf('#');
  if (hash < 0) return 'file';
  let fragment: string;
  try {
    fragment = decodeURIComponent(cellUri.slice(hash + 1));
  } catch {
    return 'file';
  }
  const s = fragment.indexOf('s');
  const b64 =
    s < 0
      ? ''
      : fragment
          .slice(s + 1)
          .replace(/-/g, '+')
          .replace(/_/g, '/');
  if (!/^[A-Za-z0-9+/]+={0,2}$/.test(b64)) return 'file';
  let scheme: string;
  try {
    scheme = atob(b64.padEnd(Math.ceil(b64.length / 4) * 4, '='));
  } catch {
    return 'file';
  }
  return /^[a-z][a-z0-9+.-]*$/i.test(scheme) ? scheme.toLowerCase() : 'file';
}

/** Lexically normalised path segments, or null when `..` climbs above the top. */
function normalise(segments: readonly string[]): string[] | null {
  const out: string[] = [];
  for (const s of segments) {
    if (s === '' || s === '.') continue;
    if (s === '..') {
      if (out.length === 0) return null;
      out.pop();
    } else out.push(s);
  }
  return out;
}

function trimSlash(path: string): string {
  return path.endsWith('/') ? path.slice(0, -1) : path;
}

/** True when `uri` is `root` or lies inside it (both URIs, compared by their path segments). */
export function uriWithin(root: string, uri: string): boolean {
  const r = trimSlash(root);
  return uri === r || uri.startsWith(`${r}/`);
}

/**
 * Resolves a path as written in a note (relative to the note's folder, `/` as separator) against the
 * workspace folders. Absolute paths, drive letters, URIs and backslashes are refused, and so is anything
 * that leaves the boundary: the workspace folder holding the note, or the note's own folder tree.
 */
export function locateSpectrum(noteUri: string, written: string, folders: readonly string[]): SpectrumLocation {
  const note = splitUri(noteFileUri(noteUri));
  if (!note || note.head === 'untitled:' || !note.path.includes('/'))
    return { outside: 'reach: the note is not saved in a folder' };
  const dir = note.path.slice(0, note.path.lastIndexOf('/'));
  const noteDir = `${note.head}${dir}`;
  const root =
    folders
      .map(trimSlash)
      .filter((f) => uriWithin(f, noteFileUri(noteUri)))
      .sort((a, b) => b.length - a.length)[0] ?? noteDir;
  const where = root === noteDir ? `the note's folder` : `the workspace folder`;
  if (/^[A-Za-z][A-Za-z0-9+.-]*:/.test(written) || written.startsWith('/') || written.includes('\\'))
    return { outside: where };
  let decodedDir: string;
  try {
    decodedDir = decodeURIComponent(dir);
  } catch {
    return { outside: where };
  }
  const segs = normalise([...decodedDir.split('/'), ...written.split('/')]);
  if (!segs) return { outside: where };
  const uri = `${note.head}/${segs.map((s) => encodeURIComponent(s).replace(/%3A/g, ':')).join('/')}`;
  const rootNorm = splitUri(root);
  if (!rootNorm) return { outside: where };
  let rootPath: string;
  try {
    rootPath = decodeURIComponent(rootNorm.path);
  } catch {
    return { outside: where };
  }
  const rootSegs = normalise(rootPath.split('/')) ?? [];
  const rootUri = `${rootNorm.head}/${rootSegs.map((s) => encodeURIComponent(s).replace(/%3A/g, ':')).join('/')}`;
  if (rootNorm.head.toLowerCase() !== note.head.toLowerCase() || !uriWithin(rootUri, uri)) return { outside: where };
  return { uri, root: rootUri };
}

/** The last path segment of a URI, decoded (for choosing the reader by the file's ending). */
export function uriFileName(uri: string): string {
  const last =
    uri
      .replace(/[?#].*$/, '')
      .split('/')
      .pop() ?? '';
  try {
    return decodeURIComponent(last);
  } catch {
    return last;
  }
}

export function decodedUri(uri: string): string {
  try {
    return decodeURIComponent(uri);
  } catch {
    return uri;
  }
}

/**
 * Note paths of references: `{ run: other.md#run 4 }` names a note relative
 * to the referring note's folder. Notes are named by the host, either as
 * absolute paths (the command line) or as URIs (the language server); both
 * are handled here without any Node built-in.
 */

/** Splits a reference's text into its note path (before `#`, when it names a note) and its id. */
export function splitReference(text: string): { note: string | null; id: string; idOffset: number } {
  const hash = text.indexOf('#');
  if (hash > 0) {
    const note = text.slice(0, hash).trim();
    if (/\.(md|markdown|ipynb)$/i.test(note)) {
      const rest = text.slice(hash + 1);
      const lead = rest.length - rest.trimStart().length;
      return { note, id: rest.trim(), idOffset: hash + 1 + lead };
    }
  }
  const lead = text.length - text.trimStart().length;
  return { note: null, id: text.trim(), idOffset: lead };
}

/** True when the host names notes by URI (`file:///…`, `vscode-notebook-cell:…`, `untitled:…`). */
function isUri(note: string): boolean {
  return /^[a-z][a-z0-9+.-]+:/i.test(note) && !/^[a-z]:[\\/]/i.test(note);
}

/**
 * The note a relative path written in `from` names, spelled the way `from` is
 * (an absolute path or a URI). `..` climbs folders; it never climbs above the
 * root. A path written absolute (`/lab/ref.md`) is taken as it is.
 */
export function resolveNotePath(from: string, relative: string): string {
  const uri = isUri(from);
  const rel = relative.replace(/\\/g, '/');
  let prefix = '';
  let path: string;
  if (uri) {
    const m = /^([a-z][a-z0-9+.-]*:(?:\/\/[^/]*)?)(.*)$/i.exec(from.split(/[?#]/)[0]!)!;
    prefix = m[1]!;
    path = m[2]!;
  } else {
    path = from.replace(/\\/g, '/');
    const drive = /^[a-z]:/i.exec(path);
    if (drive) {
      prefix = drive[0];
      path = path.slice(drive[0].length);
    }
  }
  const base = rel.startsWith('/') ? [] : path.split('/').slice(0, -1);
  const parts = rel.split('/').map((p) => (uri ? encodeSegment(p) : p));
  const out: string[] = [];
  for (const p of [...base, ...parts]) {
    if (p === '' || p === '.') continue;
    if (p === '..') out.pop();
    else out.push(p);
  }
  return prefix + '/' + out.join('/');
}

/** A path segment as a URI spells it (spaces and other reserved characters percent-encoded, once). */
function encodeSegment(p: string): string {
  let decoded = p;
  try {
    decoded = decodeURIComponent(p);
  } catch {
    // A lone `%` is taken literally.
  }
  return encodeURIComponent(decoded).replace(/[!'()*]/g, (c) => '%' + c.charCodeAt(0).toString(16).toUpperCase());
}

/** True when `note` lies inside the folder `root` (both spelled alike: paths or URIs). */
export function isInside(note: string, root: string): boolean {
  const r = root.replace(/\\/g, '/').replace(/\/+$/, '');
  const n = note.replace(/\\/g, '/');
  return n.startsWith(r + '/');
}

/** The last segment of a note's path or URI, decoded. */
export function shortNote(note: string): string {
  // A URI's query and fragment are not the note's name (a notebook cell's URI names its cell in the fragment); in a
  // URI a `#` of a file name is written `%23`. A plain path (the command line's) keeps every character.
  const path = /^[a-z][a-z0-9+.-]+:/i.test(note) && !/^[a-z]:[\\/]/i.test(note) ? note.replace(/[?#].*$/, '') : note;
  const last = path.split(/[/\\]/).pop() ?? path;
  try {
    return decodeURIComponent(last);
  } catch {
    return last;
  }
}

/**
 * The notes of the workspace folders on disk, for the index of runs
 * (workspaceRuns.ts), where the server runs on Node.js.
 */
import { promises as fs, readFileSync, statSync, type Dirent } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fileUri, NOTE_FILE, type NoteFiles } from './workspaceRuns';

/** Folders never walked (besides hidden ones). */
const SKIPPED_FOLDER = /^(node_modules|bower_components)$/;
/** A note file larger than this is not indexed (the server's own bound on a note is 2 M characters). */
const MAX_NOTE_BYTES = 4_000_000;
/** At most this many notes are indexed per folder. */
const MAX_NOTES = 50_000;

/** The path of a `file:` URI, or null for another scheme. */
export function uriPath(uri: string): string | null {
  if (!uri.startsWith('file:')) return null;
  try {
    return fileURLToPath(uri);
  } catch {
    return null;
  }
}

/** Reads notes from disk. */
export const diskNotes: NoteFiles = {
  async list(folder) {
    const root = uriPath(folder);
    const out: string[] = [];
    if (root !== null) await walk(root, out);
    return out.map(fileUri);
  },
  async read(uri) {
    const path = uriPath(uri);
    if (path === null) return null;
    try {
      const st = await fs.stat(path);
      if (!st.isFile() || st.size > MAX_NOTE_BYTES) return null;
      return await fs.readFile(path, 'utf8');
    } catch {
      return null;
    }
  },
  readNow(uri) {
    const path = uriPath(uri);
    if (path === null) return null;
    try {
      const st = statSync(path);
      if (!st.isFile() || st.size > MAX_NOTE_BYTES) return null;
      return readFileSync(path, 'utf8');
    } catch {
      return null;
    }
  },
};

/** Every note file under a folder (depth first, hidden and dependency folders skipped), at most MAX_NOTES. */
async function walk(dir: string, out: string[]): Promise<void> {
  let entries: Dirent[];
  try {
    entries = await fs.readdir(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    if (out.length >= MAX_NOTES) return;
    if (e.isDirectory()) {
      if (!SKIPPED_FOLDER.test(e.name) && !e.name.startsWith('.')) await walk(join(dir, e.name), out);
    } else if (e.isFile() && NOTE_FILE.test(e.name)) out.push(join(dir, e.name));
  }
}

/**
 * Collects and reads the Markdown notes named on the command line: files as
 * given, folders walked for `*.md` and `*.ipynb` (hidden folders and node_modules skipped)
 * in a stable order, `-` for one note on standard input. Nothing here throws
 * for a path that cannot be read: it becomes an unreadable note with a reason,
 * reported in place of its blocks, so no other file's results are lost.
 *
 * Symbolic links are followed, to notes and to folders, each real folder and
 * real file at most once (by real path), so a link back up the tree cannot
 * loop. A file is opened without blocking (a FIFO or a device named `x.md`
 * would otherwise wait forever) and read only when it is a regular file.
 */
import {
  closeSync,
  constants,
  fstatSync,
  lstatSync,
  openSync,
  readdirSync,
  readSync,
  realpathSync,
  statSync,
} from 'node:fs';
import { join, resolve } from 'node:path';

/** A note to report on: the name to print and its bytes, or why it could not be read. */
export type Note =
  { readonly name: string; readonly bytes: Uint8Array } | { readonly name: string; readonly unreadable: string };

/** A usage error (exit status 2): a mistake in the command line itself. */
export class UsageError extends Error {}

/** The name standard input is given and reported under. */
export const STDIN = '-';

/** What a system error code means, for the reason printed with a path. */
function reason(err: unknown, link: boolean): string {
  const code = (err as NodeJS.ErrnoException).code;
  switch (code) {
    case 'ENOENT':
      return link ? 'a symbolic link to nothing' : 'no such file or folder';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'ELOOP':
      return 'a loop of symbolic links';
    case 'ENOTDIR':
      return 'a path through something that is not a folder';
    case 'EISDIR':
      return 'a folder';
    default:
      return code ?? (err as Error).message;
  }
}

/** What kind of thing a non-regular file is, for the reason printed with it. */
function kind(st: {
  isFIFO(): boolean;
  isCharacterDevice(): boolean;
  isBlockDevice(): boolean;
  isSocket(): boolean;
}): string {
  if (st.isFIFO()) return 'a FIFO (named pipe), which is not read';
  if (st.isCharacterDevice() || st.isBlockDevice()) return 'a device, which is not read';
  if (st.isSocket()) return 'a socket, which is not read';
  return 'not a regular file';
}

/** The collector's state: real paths already taken, and the notes in order. */
class Collector {
  readonly notes: (Note | { readonly name: string; readonly path: string })[] = [];
  private readonly seen = new Set<string>();

  constructor(private readonly cwd: string) {}

  /**
   * A path named on the command line: a folder is walked, a file taken, each once by its real path. `a.md a.md`,
   * `a.md ./a.md`, a link to `a.md`, or a folder and a file inside it (either way round) give the file once, under
   * the name it was first reached by.
   */
  add(name: string): void {
    const path = resolve(this.cwd, name);
    const st = this.stat(name, path);
    if (!st) return;
    if (st.isDirectory()) {
      if (this.first(path)) this.walk(name, path);
    } else if (st.isFile()) {
      if (this.first(path)) this.notes.push({ name, path });
    } else this.notes.push({ name, unreadable: kind(st) });
  }

  /** stat (following links), or an unreadable note with the reason (once per path); null then. */
  private stat(name: string, path: string): ReturnType<typeof statSync> | null {
    try {
      return statSync(path);
    } catch (err) {
      let link = false;
      try {
        link = lstatSync(path).isSymbolicLink();
      } catch {
        // Not there at all: the reason says so.
      }
      if (this.first(path)) this.notes.push({ name, unreadable: reason(err, link) });
      return null;
    }
  }

  /** True the first time a real path is met (a path whose real path fails counts as itself). */
  private first(path: string): boolean {
    let real = path;
    try {
      real = realpathSync(path);
    } catch {
      // Reported where it is read.
    }
    if (this.seen.has(real)) return false;
    this.seen.add(real);
    return true;
  }

  /** Walks a folder for `*.md`, following links; an entry that cannot be read is a note with its reason. */
  private walk(name: string, path: string): void {
    let entries;
    try {
      entries = readdirSync(path, { withFileTypes: true });
    } catch (err) {
      this.notes.push({ name, unreadable: `cannot list the folder: ${reason(err, false)}` });
      return;
    }
    entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
    for (const e of entries) {
      if (e.name.startsWith('.') || e.name === 'node_modules') continue;
      const childName = join(name, e.name);
      const childPath = join(path, e.name);
      const isNote = /\.(md|ipynb)$/i.test(e.name);
      if (e.isDirectory()) {
        if (this.first(childPath)) this.walk(childName, childPath);
      } else if (e.isFile()) {
        if (isNote && this.first(childPath)) this.notes.push({ name: childName, path: childPath });
      } else if (e.isSymbolicLink()) {
        let st;
        try {
          st = statSync(childPath);
        } catch (err) {
          // A broken link is reported when it looks like a note; one to a folder cannot be told from others.
          if (isNote) this.notes.push({ name: childName, unreadable: reason(err, true) });
          continue;
        }
        if (st.isDirectory()) {
          if (this.first(childPath)) this.walk(childName, childPath);
        } else if (isNote) {
          if (!st.isFile()) this.notes.push({ name: childName, unreadable: kind(st) });
          else if (this.first(childPath)) this.notes.push({ name: childName, path: childPath });
        }
      } else if (isNote) this.notes.push({ name: childName, unreadable: kind(e) });
    }
  }
}

/**
 * The notes under the given paths, in order: each file as given, each folder's
 * notes joined to the folder's name as written. `stdin` reads standard input
 * (for `-`, which may be given once). Throws only {@link UsageError}.
 */
export function collectNotes(paths: readonly string[], cwd: string, stdin: () => Uint8Array): Note[] {
  if (paths.filter((p) => p === STDIN).length > 1)
    throw new UsageError(`'${STDIN}' (standard input) can be given once`);
  const c = new Collector(cwd);
  for (const p of paths) {
    if (p === STDIN) c.notes.push({ name: STDIN, bytes: stdin() });
    else c.add(p);
  }
  return c.notes.map((n) => ('path' in n ? readNote(n.name.split('\\').join('/'), n.path) : n));
}

/**
 * Reads a regular file without ever blocking: opened with O_NONBLOCK (a FIFO
 * that took a file's place since it was listed opens at once instead of
 * waiting for a writer), checked to be a regular file, then read.
 */
export function readNote(name: string, path: string): Note {
  let fd: number;
  try {
    fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
  } catch (err) {
    return { name, unreadable: reason(err, false) };
  }
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) return { name, unreadable: kind(st) };
    const chunks: Buffer[] = [];
    let total = 0;
    for (;;) {
      // The size stated, and one byte more to see the end at once (a file that grew is read on in larger pieces).
      const chunk = Buffer.allocUnsafe(Math.max(4096, Math.min(st.size - total + 1, 1 << 26)));
      const n = readSync(fd, chunk, 0, chunk.length, null);
      if (n === 0) break;
      chunks.push(chunk.subarray(0, n));
      total += n;
    }
    return { name, bytes: chunks.length === 1 ? chunks[0]! : Buffer.concat(chunks, total) };
  } catch (err) {
    return { name, unreadable: reason(err, false) };
  } finally {
    closeSync(fd);
  }
}

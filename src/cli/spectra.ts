/**
 * The command line's spectrum files: read from disk relative to each note,
 * never outside the note's folder tree (a `..`, an absolute path or a
 * symbolic link leading out is refused unopened), never above 64 MB, never a
 * FIFO or device (which could block). One {@link SpectrumShelf} serves the
 * whole run, so a file that several notes use is parsed once.
 */
import { closeSync, constants, fstatSync, openSync, readSync, realpathSync, statSync } from 'node:fs';
import { isAbsolute, relative, resolve, sep } from 'node:path';
import {
  decodeUtf8,
  fileStamp,
  shelfSource,
  SPECTRUM_MAX_BYTES,
  type Externals,
  type FileStat,
  type Located,
  type SpectrumShelf,
  type SyncFileAccess,
} from '../core';

const KEY_PREFIX = 'file:';

/**
 * True when `path` is `root` or lies inside it: the relative path climbs out only when its first segment is `..`
 * (a name that merely begins with two dots, such as `..data`, is a folder inside), or it is absolute (another drive).
 */
function within(root: string, path: string): boolean {
  const r = relative(root, path);
  return r !== '..' && !r.startsWith(`..${sep}`) && !isAbsolute(r);
}

function realOrSelf(path: string): string {
  try {
    return realpathSync(path);
  } catch {
    return path;
  }
}

/** Regular files only: a folder, FIFO, device or socket is no spectrum (and a FIFO could block a read). */
const diskAccess: SyncFileAccess = {
  stat(path: string): FileStat | null {
    try {
      const st = statSync(path);
      return st.isFile() ? { size: st.size, mtime: st.mtimeMs } : null;
    } catch {
      return null;
    }
  },
  readText(path: string): string | null {
    let fd: number;
    try {
      fd = openSync(path, constants.O_RDONLY | (constants.O_NONBLOCK ?? 0));
    } catch {
      return null;
    }
    try {
      const st = fstatSync(fd);
      if (!st.isFile() || st.size > SPECTRUM_MAX_BYTES) return null;
      const chunks: Buffer[] = [];
      let total = 0;
      for (;;) {
        const chunk = Buffer.allocUnsafe(Math.max(65536, Math.min(st.size - total + 1, 1 << 24)));
        const n = readSync(fd, chunk, 0, chunk.length, null);
        if (n === 0) break;
        total += n;
        // A file grown past the bound since it was measured is not read on.
        if (total > SPECTRUM_MAX_BYTES) return null;
        chunks.push(chunk.subarray(0, n));
      }
      return decodeUtf8(Buffer.concat(chunks, total)).text;
    } catch {
      return null;
    } finally {
      closeSync(fd);
    }
  },
};

/**
 * The externals of one note: spectrum paths resolve against `noteFolder` and
 * must stay inside it (after following symbolic links).
 */
export function noteSpectra(shelf: SpectrumShelf, notePath: string | null, noteFolder: string): Externals {
  const folder = resolve(noteFolder);
  // Found on the first reference: most notes refer to no spectrum, and the walk of links costs a system call per
  // folder of the path.
  let realFolder: string | null = null;
  const locate = (written: string): Located => {
    const where = `the note's folder ${folder}`;
    if (isAbsolute(written) || /^[A-Za-z]:[\\/]/.test(written)) return { outside: where };
    const path = resolve(folder, written);
    if (!within(folder, path)) return { outside: where };
    // A link inside the tree that leads out of it is refused too; a missing file is reported as missing.
    if (!within((realFolder ??= realOrSelf(folder)), realOrSelf(path))) return { outside: where };
    return { path };
  };
  return {
    note: notePath ?? folder,
    stamp(key: string): string | null {
      if (!key.startsWith(KEY_PREFIX)) return null;
      const st = diskAccess.stat(key.slice(KEY_PREFIX.length));
      return st ? fileStamp(st) : null;
    },
    spectra: shelfSource(shelf, diskAccess, locate),
  };
}

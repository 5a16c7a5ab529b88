/**
 * Reading a text in pieces (core/text/noteText.ts) from a place on, as the
 * fence scan reads a whole text, without making the whole text one string.
 */
import { movedBlock } from './rescanPlan';
import { scanFencedBlocks, type FencedBlock } from '../text/fences';
import type { NoteText } from '../text/noteText';

/** Characters of the first window read past the end of a change (doubled until the scan is sure). */
const WINDOW_CHARS = 8192;

/**
 * The fenced blocks of a text in pieces from `from` (a line start outside
 * every block, on line `line`) on, as {@link scanFencedBlocks} finds them in
 * the whole text, read in windows: a window ends at a line start past
 * `syncFrom` (where the unchanged end of the text begins), and a block that
 * runs to a window's end is read again in a window twice as long. The caller
 * stops reading where the scan meets the previous version's (rescanPlan.ts),
 * which is usually in the first window: an edit reads a few kilobytes of the
 * note, not all of it.
 */
export function* scanInWindows(text: NoteText, from: number, line: number, syncFrom: number): Generator<FencedBlock> {
  let size = WINDOW_CHARS;
  let given = 0;
  for (;;) {
    const wanted = Math.max(syncFrom, from) + size;
    const end = wanted >= text.length ? text.length : text.lineStart(text.positionAt(wanted).line + 1);
    const atEnd = end >= text.length;
    const window = text.slice(from, end);
    let seen = 0;
    for (const b of scanFencedBlocks(window, 0, line)) {
      // A block running to the window's end may run on past it: only the whole text's end is sure.
      if (!atEnd && (b.closeLine === null || b.blockEnd >= window.length)) break;
      if (seen++ < given) continue;
      given++;
      yield movedBlock(b, from, 0);
    }
    if (atEnd) return;
    size *= 2;
  }
}

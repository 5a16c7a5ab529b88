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
 * every fenced block and every HTML block, on line `line`) on, as
 * {@link scanFencedBlocks} finds them in the whole text, read in windows: the
 * first window ends at a line start a few kilobytes past `syncFrom` (where the
 * unchanged end of the text begins), and when the caller reads on past a
 * window's end (a fence or an HTML block may run on past it, hiding the fences
 * after it, so only the blocks that close before it are sure), the stretch is
 * read again from `from` in a window twice as long. The caller stops reading
 * where the scan meets the previous version's (rescanPlan.ts), which is
 * usually in the first window: an edit reads a few kilobytes of the note, not
 * all of it. Since each window doubles the last, all of them together read at
 * most about twice the last one, so an edit that opens a comment above every
 * block (which then all vanish) reads the rest of the note a few times, not
 * once per window over the distance from `from` to the change.
 */
export function* scanInWindows(text: NoteText, from: number, line: number, syncFrom: number): Generator<FencedBlock> {
  let size = Math.max(syncFrom, from) - from + WINDOW_CHARS;
  let given = 0;
  for (;;) {
    const wanted = from + size;
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

/**
 * Finds fenced code blocks by the CommonMark rules (spec 0.31, §4.5): a fence
 * is three or more backticks or tildes indented by at most three spaces; a
 * backtick fence's info string holds no backtick; the block closes at a fence
 * of the same character, at least as long, indented at most three spaces and
 * followed only by spaces or tabs; an unclosed block runs to the end of the
 * document. Content lines lose up to as many leading spaces as the opening
 * fence was indented. Container blocks (lists, block quotes) are not parsed:
 * blocks are recognised at the left margin only, which is where notes keep them.
 * A byte-order mark at the start of the note is skipped.
 */

/**
 * Where a run of body lines starts: its offset in the note and in the body,
 * and how many indent spaces were removed from its first line. Consecutive
 * lines whose body offsets map to the note by the same shift share one entry
 * (every line of a fence at the left margin does), so a block keeps one entry
 * unless its fence is indented.
 */
export interface BodyLine {
  /** Offset of the line's first character in the note (before stripping). */
  readonly docStart: number;
  /** Offset of the line's first kept character in the body text. */
  readonly bodyStart: number;
  /** Spaces removed at the start of the line. */
  readonly stripped: number;
}

/** A fenced code block of any language, with exact offsets into the note. */
export interface FencedBlock {
  /** The whole info string, trimmed. */
  readonly info: string;
  /** Its first word (the language), e.g. `levels`. */
  readonly language: string;
  /** 0-based line of the opening fence. */
  readonly openLine: number;
  /** 0-based line of the closing fence, or null when the block runs to the end. */
  readonly closeLine: number | null;
  /** Offsets of the opening fence line (start, end without the line break). */
  readonly openStart: number;
  readonly openEnd: number;
  /** Offset just after the closing fence line's last character (or the text's end). */
  readonly blockEnd: number;
  /** The content as CommonMark defines it (indentation stripped), lines joined by their own breaks. */
  readonly body: string;
  /** Note offset of the first body line (where the body starts when the fence is at the left margin). */
  readonly bodyStart: number;
  /**
   * Mapping of body offsets back to the note for an indented fence, one entry per run of
   * equally shifted lines. Empty at the left margin, where the body is one stretch of the note
   * from `bodyStart`, and for an empty body.
   */
  readonly lines: readonly BodyLine[];
  /** 0-based line of the first body line. */
  readonly bodyLine: number;
}

interface Fence {
  readonly char: number;
  readonly length: number;
  readonly indent: number;
  readonly info: string;
}

const BACKTICK = 96;
const TILDE = 126;
const SPACE = 32;

function openingFence(text: string, start: number, end: number): Fence | null {
  let i = start;
  while (i < end && i - start < 4 && text.charCodeAt(i) === SPACE) i++;
  const indent = i - start;
  if (indent > 3) return null;
  // Past the end of the line is no fence (and no read past the note's end, which costs the engine a recompile).
  const ch = i < end ? text.charCodeAt(i) : -1;
  if (ch !== BACKTICK && ch !== TILDE) return null;
  let j = i;
  while (j < end && text.charCodeAt(j) === ch) j++;
  const length = j - i;
  if (length < 3) return null;
  // The usual info string is kept as the constant, not as a new slice of the note.
  const info = end - j === 6 && text.startsWith('levels', j) ? 'levels' : text.slice(j, end).trim();
  if (ch === BACKTICK && info.includes('`')) return null;
  return { char: ch, length, indent, info };
}

function isClosingFence(text: string, start: number, end: number, open: Fence): boolean {
  let i = start;
  while (i < end && i - start < 4 && text.charCodeAt(i) === SPACE) i++;
  if (i - start > 3) return false;
  let j = i;
  while (j < end && text.charCodeAt(j) === open.char) j++;
  if (j - i < open.length) return false;
  for (; j < end; j++) {
    const c = text.charCodeAt(j);
    if (c !== SPACE && c !== 9) return false;
  }
  return true;
}

/**
 * True when a fence's info string marks a `levels` block: its language is
 * `levels`, or one of the extra info strings names its language or its whole
 * info string.
 */
export function isLevelsInfo(block: Pick<FencedBlock, 'info' | 'language'>, infoStrings: readonly string[]): boolean {
  return block.language === 'levels' || infoStrings.includes(block.language) || infoStrings.includes(block.info);
}

/** True when the note has at least one `levels` block; the scan stops at the first. O(length of the note). */
export function hasLevelsBlock(text: string, infoStrings: readonly string[] = []): boolean {
  for (const block of scanFencedBlocks(text)) if (isLevelsInfo(block, infoStrings)) return true;
  return false;
}

/** Scans the note line by line; O(length of the note). */
export function findFencedBlocks(text: string): FencedBlock[] {
  return [...scanFencedBlocks(text)];
}

/**
 * The blocks of {@link findFencedBlocks}, one at a time, so a caller that
 * stops early (a bounded analysis of a huge note) scans only up to there.
 * A caller that knows the scan is outside any block at the start of line
 * `line`, at offset `from` (where an earlier scan of the same text up to
 * there found a fence opening), may start there instead of at the top.
 */
export function* scanFencedBlocks(text: string, from = 0, line = 0): Generator<FencedBlock, void, undefined> {
  // A byte-order mark is not part of the first line's content (a fence may follow it).
  let pos = from === 0 && text.charCodeAt(0) === 0xfeff ? 1 : from;
  let open: Open | null = null;

  // Next \r at or after pos, cached so the scan stays linear on long notes.
  let nextCr = -2;
  while (pos <= text.length) {
    if (nextCr !== -1 && nextCr < pos) nextCr = text.indexOf('\r', pos);
    const nl = text.indexOf('\n', pos);

    const end = nl === -1 ? text.length : nl;
    let next = nl === -1 ? text.length + 1 : nl + 1;
    let contentEnd = end;
    if (contentEnd > pos && text.charCodeAt(contentEnd - 1) === 13) contentEnd--;
    // A lone \r also ends a line in CommonMark.
    if (nextCr !== -1 && nextCr < contentEnd) {
      contentEnd = nextCr;
      next = nextCr + 1;
    }

    if (open === null) {
      const fence = openingFence(text, pos, contentEnd);
      if (fence)
        open = {
          fence,
          openStart: pos,
          openEnd: contentEnd,
          openLine: line,
          lines: [],
          parts: fence.indent > 0 ? [] : null,
          bodyFrom: next,
          bodyLen: 0,
        };
    } else if (isClosingFence(text, pos, contentEnd, open.fence)) {
      yield finish(text, open, line, pos, contentEnd);
      open = null;
    } else {
      let strip = 0;
      while (strip < open.fence.indent && text.charCodeAt(pos + strip) === SPACE) strip++;
      const lineEnd = Math.min(next, text.length);
      if (open.parts) {
        const last = open.lines[open.lines.length - 1];
        if (!last || last.docStart + last.stripped - last.bodyStart !== pos + strip - open.bodyLen) {
          open.lines.push({ docStart: pos, bodyStart: open.bodyLen, stripped: strip });
        }
        open.parts.push(text.slice(pos + strip, lineEnd));
      }
      open.bodyLen += lineEnd - pos - strip;
    }
    pos = next;
    line++;
  }
  if (open) yield finish(text, open, null, text.length, text.length);
}

/** A block being read. */
interface Open {
  readonly fence: Fence;
  readonly openStart: number;
  readonly openEnd: number;
  readonly openLine: number;
  readonly lines: BodyLine[];
  /** The stripped body lines of an indented fence; null at the left margin, whose body is one stretch of the note. */
  readonly parts: string[] | null;
  /** Note offset of the first body line. */
  readonly bodyFrom: number;
  bodyLen: number;
}

function finish(text: string, open: Open, closeLine: number | null, bodyTo: number, blockEnd: number): FencedBlock {
  const info = open.fence.info;
  return {
    info,
    language: info === 'levels' ? info : (info.split(/\s+/, 1)[0] ?? ''),
    openLine: open.openLine,
    closeLine,
    openStart: open.openStart,
    openEnd: open.openEnd,
    blockEnd,
    body: open.parts ? open.parts.join('') : text.slice(Math.min(open.bodyFrom, bodyTo), bodyTo),
    bodyStart: open.bodyFrom,
    lines: open.lines,
    bodyLine: open.openLine + 1,
  };
}

/**
 * Maps an offset in a block's body text back to an offset in the note.
 * Binary search over the body lines; exact also for indented fences.
 */
export function bodyToDocument(block: FencedBlock, bodyOffset: number): number {
  if (block.body.length === 0) return block.openEnd;
  const lines = block.lines;
  if (lines.length === 0) return block.bodyStart + bodyOffset;
  let lo = 0;
  let hi = lines.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (lines[mid].bodyStart <= bodyOffset) lo = mid;
    else hi = mid - 1;
  }
  const l = lines[lo];
  return l.docStart + l.stripped + (bodyOffset - l.bodyStart);
}

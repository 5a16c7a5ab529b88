/**
 * Finds fenced code blocks by the CommonMark rules (spec 0.31.2, §4.5): a fence
 * is three or more backticks or tildes indented by at most three spaces; a
 * backtick fence's info string holds no backtick; the block closes at a fence
 * of the same character, at least as long, indented at most three spaces and
 * followed only by spaces or tabs; an unclosed block runs to the end of the
 * document. Content lines lose up to as many leading spaces as the opening
 * fence was indented. Container blocks (lists, block quotes) are not parsed:
 * blocks are recognised at the left margin only, which is where notes keep them.
 * A byte-order mark at the start of the note is skipped.
 *
 * The lines of an HTML block (§4.6) are raw HTML, so a fence among them is no
 * fence: a `levels` fence inside `<!-- … -->` is commented out, as a CommonMark
 * renderer shows it. The HTML blocks of kinds 1 to 6 are followed, each from
 * its start condition (at most three spaces of indentation) to its end
 * condition: kinds 1 to 5 end at the line holding their end marker, which may
 * be the starting line itself, kind 6 (a block-level tag name) before a blank
 * line, and all at the end of the note. Kind 7 (any other tag alone on its
 * line) is not followed: it cannot interrupt a paragraph, and telling that
 * needs the paragraphs and containers this scan does not parse. None of the
 * followed kinds depends on paragraphs, so the scan's state at a line start is
 * only: in a fence, in an HTML block of some kind, or outside both.
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

/** The kind of an HTML block (CommonMark 0.31.2, §4.6, start conditions 1 to 6), or 0 for none. */
type HtmlKind = 0 | 1 | 2 | 3 | 4 | 5 | 6;

const LESS = 60;
const BANG = 33;
const QUESTION = 63;
const SLASH = 47;
const GREATER = 62;
const TAB = 9;

/** Tag names of start condition 1 (their block ends at a line holding one of their end tags). */
const RAW_TAGS: ReadonlySet<string> = new Set(['pre', 'script', 'style', 'textarea']);

/** Tag names of start condition 6 (their block ends before a blank line), as listed in CommonMark 0.31.2, §4.6. */
const BLOCK_TAGS: ReadonlySet<string> = new Set(
  (
    'address article aside base basefont blockquote body caption center col colgroup dd details dialog dir div dl ' +
    'dt fieldset figcaption figure footer form frame frameset h1 h2 h3 h4 h5 h6 head header hr html iframe legend ' +
    'li link main menu menuitem nav noframes ol optgroup option p param search section summary table tbody td ' +
    'tfoot th thead title tr track ul'
  ).split(' '),
);

function isAsciiLetter(c: number): boolean {
  return (c >= 65 && c <= 90) || (c >= 97 && c <= 122);
}

function isAsciiAlnum(c: number): boolean {
  return isAsciiLetter(c) || (c >= 48 && c <= 57);
}

/** The kind of HTML block the line [start, end) starts, or 0 (kind 7 is not told: see the module's comment). */
function htmlStart(text: string, start: number, end: number): HtmlKind {
  let i = start;
  while (i < end && i - start < 4 && text.charCodeAt(i) === SPACE) i++;
  if (i - start > 3 || i >= end || text.charCodeAt(i) !== LESS) return 0;
  const c = i + 1 < end ? text.charCodeAt(i + 1) : -1;
  if (c === BANG) {
    if (text.startsWith('--', i + 2) && i + 4 <= end) return 2;
    if (text.startsWith('[CDATA[', i + 2) && i + 9 <= end) return 5;
    return i + 2 < end && isAsciiLetter(text.charCodeAt(i + 2)) ? 4 : 0;
  }
  if (c === QUESTION) return 3;
  const closing = c === SLASH;
  let j = closing ? i + 2 : i + 1;
  const nameStart = j;
  while (j < end && j - nameStart <= 10 && isAsciiAlnum(text.charCodeAt(j))) j++;
  if (j === nameStart || j - nameStart > 10) return 0;
  const name = text.slice(nameStart, j).toLowerCase();
  const after = j < end ? text.charCodeAt(j) : -1;
  const ends = after === -1 || after === SPACE || after === TAB || after === GREATER;
  if (!closing && RAW_TAGS.has(name)) return ends ? 1 : 0;
  if (BLOCK_TAGS.has(name) && (ends || (after === SLASH && j + 1 < end && text.charCodeAt(j + 1) === GREATER)))
    return 6;
  return 0;
}

/** The end markers of kinds 2 to 5 (kind 1's end tags are found by {@link RAW_END}). */
const END_MARKERS: readonly string[] = ['', '', '-->', '?>', '>', ']]>'];
/** Kind 1's end tags, case-insensitive, searched from `lastIndex` on. */
const RAW_END = /<\/(?:script|pre|style|textarea)>/gi;

/** What a scan did, for tests that check that it stays linear in the note's length. */
export interface ScanWork {
  /** Lines visited. */
  lines: number;
  /** Characters passed over by the searches for the end markers of HTML blocks. */
  searched: number;
}

/**
 * Where the end markers of HTML blocks next occur in a text: one search per kind from a place on, remembered while
 * the scan has not passed it, so that a long unclosed block (100,000 lines of `<!--`) costs one search to the end of
 * the text, not one per line.
 */
class EndMarkers {
  /** Per kind, the first occurrence at or after the last place searched from; -1 when there is none, -2 before any search. */
  private readonly next: number[] = [-2, -2, -2, -2, -2, -2];

  constructor(
    private readonly text: string,
    private readonly work: ScanWork | undefined,
  ) {}

  /** True when the line [start, end) holds the end marker of `kind` (1 to 5); the line is at or after the last one asked about. */
  inLine(kind: HtmlKind, start: number, end: number): boolean {
    let at = this.next[kind]!;
    if (at !== -1 && at < start) {
      if (kind === 1) {
        RAW_END.lastIndex = start;
        const m = RAW_END.exec(this.text);
        at = m ? m.index : -1;
      } else at = this.text.indexOf(END_MARKERS[kind]!, start);
      if (this.work) this.work.searched += (at === -1 ? this.text.length : at) - start;
      this.next[kind] = at;
    }
    // A marker holds no line break, so one that starts on the line lies within it.
    return at !== -1 && at < end;
  }
}

function isBlankLine(text: string, start: number, end: number): boolean {
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c !== SPACE && c !== TAB) return false;
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
 * A caller that knows the scan is outside every fenced block and every HTML
 * block at the start of line `line`, at offset `from` (where an earlier scan
 * of the same text up to there found a fence opening: no fence opens inside
 * either), may start there instead of at the top. `work`, when given, counts
 * what the scan did.
 */
export function* scanFencedBlocks(
  text: string,
  from = 0,
  line = 0,
  work?: ScanWork,
): Generator<FencedBlock, void, undefined> {
  // A byte-order mark is not part of the first line's content (a fence may follow it).
  let pos = from === 0 && text.charCodeAt(0) === 0xfeff ? 1 : from;
  let open: Open | null = null;
  // The HTML block the scan is in (outside every fence), or 0.
  let html: HtmlKind = 0;
  const markers = new EndMarkers(text, work);

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

    if (work) work.lines++;
    if (html === 6) {
      // Kind 6 ends before a blank line; the blank line belongs to no block.
      if (isBlankLine(text, pos, contentEnd)) html = 0;
    } else if (html !== 0) {
      if (markers.inLine(html, pos, contentEnd)) html = 0;
    } else if (open === null) {
      const fence = openingFence(text, pos, contentEnd);
      if (!fence) {
        const kind = htmlStart(text, pos, contentEnd);
        // Kinds 1 to 5 may end on their first line (`<!-- a comment -->`).
        if (kind !== 0 && (kind === 6 || !markers.inLine(kind, pos, contentEnd))) html = kind;
      } else
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

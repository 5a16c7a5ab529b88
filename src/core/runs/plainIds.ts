/**
 * What a host can tell about a block's part in runs by reference from its
 * text alone, without reading its YAML: whether it can refer to a run, and
 * its id when the id is written the plainest way. The command line uses it
 * to learn whether a set of notes needs a book of runs at all (a block may
 * refer to another, or two blocks may carry one id): when no block can refer
 * to a run and every id is known and carried once, every block reads the same
 * without the book, and each block is read once instead of twice.
 *
 * Every answer errs on the safe side: a body this cannot be sure about is
 * `unsure`, and the host then builds the book.
 */
import type { Span } from '../types';

/** What the text of one block body tells. */
export type PlainFacts =
  /** The body may refer to a run, or its id is not written plainly: only reading it tells. */
  | { readonly kind: 'unsure' }
  /**
   * The body refers to no run; its id is `id`, its value at `idSpan` (body offsets), or it has none. (A reading
   * finds that id, or none where the YAML around it is too broken to read.)
   */
  | { readonly kind: 'plain'; readonly id: string | null; readonly idSpan: Span | null };

const UNSURE: PlainFacts = { kind: 'unsure' };
const NO_ID: PlainFacts = { kind: 'plain', id: null, idSpan: null };

/** A line of a block mapping's first level: a plain key at the left margin and its colon. */
const TOP_KEY = /^[A-Za-z_][A-Za-z0-9_-]*:(?:[ ]|$)/;

/**
 * A key named `run` anywhere (plain or quoted, in a block or a flow mapping), which every reference to a run
 * is written with; escapes, anchors, aliases, tags, explicit keys, directives and document markers could hide
 * one or change what the text means, so they make the body unsure too.
 */
const MAY_REFER = /run['"]?[ \t]*:|[\\&*!?%]|^(?:---|\.\.\.)/m;

/** A key `id` anywhere, as a block key or inside a flow mapping. */
const ID_KEY = /(?:^|[\s{,[])["']?id["']?[ \t]*:/gm;

/** The plainest id line: `id:` at the left margin, one space or more, a value the core schema reads as text. */
const PLAIN_ID = /^id:[ ]+([A-Za-z][A-Za-z0-9 _.+/-]*?)[ ]*$/;

/** Words a YAML reader takes for null or a boolean (the core schema's and, to be safe, YAML 1.1's). */
const NOT_TEXT = /^(?:y|yes|n|no|true|false|on|off|null|nan|inf|infinity)$/i;

/** What the text of a block body tells (see {@link PlainFacts}). */
export function plainFacts(body: string): PlainFacts {
  if (MAY_REFER.test(body) || body.includes('\t')) return UNSURE;
  // One key `id` and no second (the pattern is global: each search goes on from the last match).
  ID_KEY.lastIndex = 0;
  if (!ID_KEY.test(body)) return NO_ID;
  const second = ID_KEY.test(body);
  ID_KEY.lastIndex = 0;
  if (second) return UNSURE;
  // The lines are walked in place (a break is \r\n, \r or \n), without a list of them: every body of a note
  // passes here when the command line decides whether it needs the book of runs.
  let firstSeen = false;
  let idLine: string | null = null;
  let idStart = 0;
  for (let from = 0; ;) {
    let to = from;
    while (to < body.length) {
      const c = body.charCodeAt(to);
      if (c === 10 || c === 13) break;
      to++;
    }
    if (!firstSeen) {
      // The body must be a block mapping: its first line with text (comments aside) a key at the left margin.
      const line = body.slice(from, to);
      if (line.trim() !== '' && !line.trimStart().startsWith('#')) {
        if (!TOP_KEY.test(line)) return UNSURE;
        firstSeen = true;
      }
    }
    if (idLine === null) {
      if (body.startsWith('id:', from)) {
        idLine = body.slice(from, to);
        idStart = from;
      }
    } else {
      // A plain scalar goes on over more indented lines (blank ones between them too): the next line with text
      // must start at the left margin, where the next key is.
      const line = body.slice(from, to);
      if (line.trim() !== '') {
        if (line.startsWith(' ')) return UNSURE;
        break;
      }
    }
    if (to >= body.length) break;
    from = to + (body.charCodeAt(to) === 13 && body.charCodeAt(to + 1) === 10 ? 2 : 1);
  }
  if (!firstSeen || idLine === null) return UNSURE;
  const m = PLAIN_ID.exec(idLine);
  if (!m || NOT_TEXT.test(m[1]!)) return UNSURE;
  const start = idStart + idLine.indexOf(m[1]!, 3);
  return { kind: 'plain', id: m[1]!, idSpan: { start, end: start + m[1]!.length } };
}

/**
 * True when the blocks (their bodies, every note's together) need a book of runs to be read as the contract
 * says: one may refer to a run, one's id is not written plainly, or two carry the same id.
 */
export function needRunBook(bodies: Iterable<string>): boolean {
  const ids = new Set<string>();
  for (const body of bodies) {
    const f = plainFacts(body);
    if (f.kind === 'unsure') return true;
    if (f.id === null) continue;
    if (ids.has(f.id)) return true;
    ids.add(f.id);
  }
  return false;
}

/**
 * The plain-body shortcut of the block reader. Most block bodies are the
 * simplest YAML there is: a mapping of plain keys to plain or quoted
 * scalars, flow lists and flow maps, a nested mapping or a list of levels,
 * and comments, with no anchors, tags or multi-line subtleties. For those, the `yaml`
 * package's own parser is run (its lexer and concrete syntax tree, its
 * scalar reader and its core-schema tags), and the tree the block readers
 * walk is built straight from that syntax tree, skipping the package's
 * composer, which spends much of its time on what such bodies never hold.
 *
 * The shortcut never reports a problem and never guesses: it accepts a
 * strict list of token shapes for which the composer reports nothing, and
 * returns null on anything else (a tab, an anchor, a tag, an empty value,
 * a duplicate key, a quoted key, a multi-line scalar, a comment inside a
 * flow list, a parser error…), and the body then goes through the package's
 * full `parseDocument`, whose document is turned into the same kind of tree
 * (`yamlTree.ts`). The test suite checks, over generated and mutated bodies,
 * that whenever the shortcut answers, `parseDocument` reports no error or
 * warning and gives the same tree: the same values, sources, scalar styles,
 * flow flags and ranges.
 */
import { CST, Document, isScalar, Parser, type ScalarTag } from 'yaml';
import type { ScalarStyle, TreeMap, TreeNode, TreeRange, TreeScalar, TreeSeq } from './tree';
import { MAX_NESTING } from './nesting';
import { YAML_OPTIONS } from './yamlOptions';

/** A document made with the reader's options: its schema and options are the ones the composer would use. */
const TEMPLATE = new Document(null, YAML_OPTIONS);
const SCHEMA = TEMPLATE.schema;
const OPTIONS = TEMPLATE.options;
/** The core schema's scalar tags, in the order the composer tries them on a plain scalar. */
const SCALAR_TAGS: readonly ScalarTag[] = SCHEMA.tags.filter(
  (t): t is ScalarTag => !('collection' in t && t.collection),
);
/** The tag of every quoted scalar and of a plain one no other tag claims. */
const STRING_TAG: ScalarTag = SCALAR_TAGS.find((t) => t.tag === 'tag:yaml.org,2002:str')!;
/** The null tag, the first whose test the composer tries: a plain scalar is null exactly when that test matches. */
const NULL_TAG: ScalarTag = SCALAR_TAGS.find((t) => t.tag === 'tag:yaml.org,2002:null')!;
if (SCALAR_TAGS.find((t) => t.default === true && t.test) !== NULL_TAG)
  throw new Error('the core schema no longer tries null first');

/** Thrown inside the walk when a token falls outside the accepted shapes; caught at the top. */
class NotPlain extends Error {}
const NOT_PLAIN = new NotPlain('not a plain body');

function refuse(): never {
  throw NOT_PLAIN;
}

/**
 * The root mapping of a plain body, built from the package's syntax tree, or
 * null when the body is not plain (the caller then runs the full composer).
 */
export function plainTree(body: string, tokens: Iterable<CST.Token> = new Parser().parse(body)): TreeMap | null {
  let doc: CST.Document | null = null;
  for (const token of tokens) {
    if (token.type === 'document' && !doc) doc = token;
    // Comment lines before the document are its prelude, which the composer reads without a rule to break.
    else if (!(
      token.type === 'comment' ||
      token.type === 'newline' ||
      (token.type === 'space' && !token.source.includes('\t'))
    ))
      return null;
  }
  if (!doc || !doc.value || doc.value.type !== 'block-map' || doc.value.indent !== 0) return null;
  try {
    separators(doc.start, 0, doc.start.length, true);
    // After the content the composer is not strict about comments.
    if (doc.end) separators(doc.end, 0, doc.end.length, true);
    return blockMap(doc.value, 0);
  } catch (err) {
    if (err === NOT_PLAIN) return null;
    throw err;
  }
}

type Node = TreeScalar | TreeMap | TreeSeq;

/** Spaces without a tab (a tab is where the composer's indentation rules start). */
function space(t: CST.SourceToken): boolean {
  return t.type === 'space' && !t.source.includes('\t');
}

/** Spaces without a tab, or a line break. */
function blank(t: CST.SourceToken): boolean {
  return t.type === 'newline' || space(t);
}

/**
 * The entries of one mapping as they are read, with the keys seen so far in a
 * set, so that a mapping of n keys is checked for duplicates in O(n) rather
 * than by scanning every earlier key (40,000 keys took seconds that way).
 */
class Pairs {
  readonly items: { key: TreeScalar; value: TreeNode }[] = [];
  private readonly seen = new Set<unknown>();

  /**
   * Adds an entry; a key equal to an earlier one is refused. The composer
   * compares resolved values with `===`, which a set matches (it also takes
   * -0 and 0 as equal) except for NaN, which `===` never finds equal: a NaN
   * key is never a duplicate there, so it is not looked up here either.
   */
  add(key: TreeScalar, value: TreeNode): void {
    const k = key.value;
    if (k === k) {
      if (this.seen.has(k)) refuse();
      this.seen.add(k);
    }
    this.items.push({ key, value });
  }
}

/**
 * Checks the separators from `from` to before `to`: spaces without a tab, line breaks and
 * comments, a comment only after white space (or first, where `spaced` says the
 * list starts a line), which is what the composer requires. True when a line
 * break was among them.
 */
function separators(tokens: readonly CST.SourceToken[], from: number, to: number, spaced: boolean): boolean {
  let newline = false;
  for (let i = from; i < to; i++) {
    const t = tokens[i]!;
    if (t.type === 'newline') {
      newline = true;
      spaced = true;
    } else if (space(t)) spaced = true;
    else if (t.type !== 'comment' || !spaced) refuse();
  }
  return newline;
}

function blockMap(bm: CST.BlockMap, depth: number): TreeMap {
  if (depth >= MAX_NESTING) refuse();
  const pairs = new Pairs();
  let offset = bm.offset;
  for (const item of bm.items) {
    if (item.explicitKey || !item.key || !item.sep) refuse();
    separators(item.start, 0, item.start.length, true);
    const key = item.key;
    if (key.type !== 'scalar' || key.indent !== bm.indent) refuse();
    const keyNode = scalar(key, true);
    // `:` then spaces and line breaks; a line break before the `:` would make a multi-line key.
    const sep = item.sep;
    let at = 0;
    while (at < sep.length && space(sep[at]!)) at++;
    // The composer (strict) wants the `:` of an implicit key at most 1024 characters after the key's start.
    if (sep[at]?.type !== 'map-value-ind' || sep[at]!.offset - key.offset > 1000) refuse();
    const newline = separators(sep, at + 1, sep.length, false);
    const value = item.value;
    if (!value) refuse();
    let valueNode: Node;
    if (newline) {
      // A nested block collection on the lines below, indented further.
      if (value.type === 'block-map' && value.indent > bm.indent) valueNode = blockMap(value, depth + 1);
      else if (value.type === 'block-seq' && value.indent >= bm.indent) valueNode = blockSeq(value, depth + 1);
      else refuse();
    } else if (value.type === 'flow-collection') valueNode = flow(value, depth + 1);
    else if (isFlowScalar(value)) valueNode = scalar(value, false);
    else refuse();
    offset = valueNode.range![2];
    pairs.add(keyNode, valueNode);
  }
  return { kind: 'map', items: pairs.items, range: [bm.offset, offset, offset], flow: false };
}

function blockSeq(bs: CST.BlockSequence, depth: number): TreeSeq {
  if (depth >= MAX_NESTING) refuse();
  const items: TreeNode[] = [];
  let offset = bs.offset;
  for (const item of bs.items) {
    // Line breaks, comments and indentation, one `-`, then spaces only (the item's value on the same line).
    const dash = item.start.findIndex((t) => t.type === 'seq-item-ind');
    if (dash < 0) refuse();
    separators(item.start, 0, dash, true);
    for (let i = dash + 1; i < item.start.length; i++) if (!space(item.start[i]!)) refuse();
    const value = item.value;
    if (!value) refuse();
    let node: Node;
    if (value.type === 'flow-collection') node = flow(value, depth + 1);
    else if (isFlowScalar(value)) node = scalar(value, false);
    else if (value.type === 'block-map' && value.indent > bs.indent) node = blockMap(value, depth + 1);
    else refuse();
    offset = node.range![2];
    items.push(node);
  }
  return { kind: 'seq', items, range: [bs.offset, offset, offset], flow: false };
}

function flow(fc: CST.FlowCollection, depth: number): TreeMap | TreeSeq {
  if (depth >= MAX_NESTING) refuse();
  const isMap = fc.start.source === '{';
  if (!isMap && fc.start.source !== '[') refuse();
  const pairs = new Pairs();
  const values: TreeNode[] = [];
  for (let i = 0; i < fc.items.length; i++) {
    const item = fc.items[i]!;
    // Before the item: spaces and line breaks, with exactly one comma between items and none before the first.
    let commas = 0;
    for (const t of item.start) {
      if (t.type === 'comma') commas++;
      else if (!blank(t)) refuse();
    }
    if (commas !== (i === 0 ? 0 : 1)) refuse();
    const value = item.value;
    if (!value) refuse();
    if (isMap) {
      const key = item.key;
      const sep = item.sep;
      if (!key || !sep || key.type !== 'scalar') refuse();
      const keyNode = scalar(key, true);
      let found = false;
      for (const t of sep) {
        if (t.type === 'map-value-ind') {
          if (found) refuse();
          found = true;
        } else if (!space(t)) refuse();
      }
      if (!found) refuse();
      pairs.add(keyNode, flowValue(value, depth));
    } else {
      if (item.key || item.sep) refuse();
      values.push(flowValue(value, depth));
    }
  }
  const [close, ...rest] = fc.end;
  if (close?.source !== (isMap ? '}' : ']')) refuse();
  const closed = close.offset + close.source.length;
  let end = closed;
  for (const t of rest) {
    if (!blank(t)) refuse();
    end += t.source.length;
  }
  const range: TreeRange = [fc.offset, closed, end];
  return isMap
    ? { kind: 'map', items: pairs.items, range, flow: true }
    : { kind: 'seq', items: values, range, flow: true };
}

function flowValue(value: CST.Token, depth: number): Node {
  if (value.type === 'flow-collection') return flow(value, depth + 1);
  if (isFlowScalar(value)) return scalar(value, false);
  return refuse();
}

function isFlowScalar(t: CST.Token): t is CST.FlowScalar {
  return t.type === 'scalar' || t.type === 'single-quoted-scalar' || t.type === 'double-quoted-scalar';
}

/**
 * One scalar, read by the package's scalar reader and typed by the core
 * schema's tags exactly as the composer types it: a plain scalar takes the
 * first default tag whose test matches, a quoted one is a string. A key is
 * typed at once (keys are compared); a plain value only when its value is
 * first asked for, since most values are read from their text (a number with
 * its unit, say) and never need it.
 */
function scalar(token: CST.FlowScalar, atKey: boolean): TreeScalar {
  if (token.source === '' || token.source.includes('\n') || token.source.includes('\r') || token.source.includes('\t'))
    refuse();
  // After a value: spaces, line breaks, a comment after white space. After a key, spaces only
  // (a key must end on its line, and a comment there would end the line before the `:`).
  if (token.end) {
    if (atKey) {
      for (const t of token.end) if (!space(t)) refuse();
    } else separators(token.end, 0, token.end.length, false);
  }
  let failed = false;
  const read = CST.resolveAsScalar(token, true, () => {
    failed = true;
  });
  if (failed || !read) refuse();
  const range: TreeRange = read.range;
  if (token.type !== 'scalar')
    return {
      kind: 'scalar',
      value: read.value,
      source: read.value,
      type: read.type as ScalarStyle,
      range,
      isNull: false,
    };
  return new PlainScalar(read.value, range, atKey);
}

/** A plain scalar, typed on first request. */
class PlainScalar implements TreeScalar {
  readonly kind = 'scalar';
  readonly type = 'PLAIN';
  readonly isNull: boolean;
  private typed: boolean;
  private resolved: unknown;

  constructor(
    readonly source: string,
    readonly range: TreeRange,
    atKey: boolean,
  ) {
    this.isNull = NULL_TAG.test!.test(source);
    this.typed = atKey || this.isNull;
    this.resolved = atKey && !this.isNull ? keyValue(source) : null;
  }

  get value(): unknown {
    if (!this.typed) {
      this.resolved = typeScalar(this.source, false);
      this.typed = true;
    }
    return this.resolved;
  }
}

/**
 * Typed keys by their text. A notebook uses the same few dozen keys in every
 * block, so each is typed once; the memo is cleared when it grows past a
 * bound, so odd keys cannot make it grow without limit.
 */
const KEY_VALUES = new Map<string, unknown>();
const KEY_VALUES_MAX = 4096;

function keyValue(source: string): unknown {
  let v = KEY_VALUES.get(source);
  if (v === undefined) {
    if (KEY_VALUES.size >= KEY_VALUES_MAX) KEY_VALUES.clear();
    v = typeScalar(source, true);
    KEY_VALUES.set(source, v);
  }
  return v;
}

/**
 * The value the composer gives a plain scalar: the first default tag whose
 * test matches resolves it. A tag that fails to resolve would make the
 * composer report a problem, so it cannot happen here: the tags' tests admit
 * only text they resolve (the core schema's do), and a failure is thrown as
 * an internal error rather than hidden.
 */
function typeScalar(source: string, atKey: boolean): unknown {
  let tag = STRING_TAG;
  for (const t of SCALAR_TAGS) {
    if ((t.default === true || (atKey && t.default === 'key')) && t.test?.test(source)) {
      tag = t;
      break;
    }
  }
  const res = tag.resolve(
    source,
    (message) => {
      throw new Error(`YAML tag ${tag.tag} could not resolve ${JSON.stringify(source)}: ${message}`);
    },
    OPTIONS,
  );
  return isScalar(res) ? res.value : res;
}

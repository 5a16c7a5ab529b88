/**
 * Reads a block body with the `yaml` package and gives the rest of the core a
 * small, position-keeping view of it (`tree.ts`). Offsets are body-relative
 * (the block layer maps them to the note). Parsing never throws; YAML's own
 * errors and our bounds come back as problems.
 */
import {
  type Document,
  isAlias as isYamlAlias,
  isMap as isYamlMap,
  isPair,
  isScalar as isYamlScalar,
  isSeq as isYamlSeq,
  parseDocument,
  Parser,
  type YAMLMap,
  type YAMLSeq,
} from 'yaml';
import type { Problem, Span } from '../types';
import { MAX_NESTING, tooDeep } from './nesting';
import { plainTree } from './plainBody';
import type { TreeAlias, TreeMap, TreeNode, TreeScalar, TreeSeq } from './tree';
import { YAML_OPTIONS } from './yamlOptions';

export { YAML_OPTIONS };

/** How many nodes aliases may add when expanded, in all, per block. */
export const ALIAS_EXPANSION_LIMIT = 10_000;

/** What the block readers walk: the body's root node. */
export interface YamlTree {
  readonly contents: TreeNode | null;
}

/** A parsed body: its tree (or null when unusable) and the problems found. */
export interface YamlBody {
  readonly doc: YamlTree | null;
  readonly problems: Problem[];
}

const YAML_CODES: Record<string, string> = {
  DUPLICATE_KEY: 'yaml-duplicate-key',
  BAD_ALIAS: 'yaml-alias',
  TAB_AS_INDENT: 'yaml-tab-indent',
};

/**
 * Runs `f` with stack traces of new errors turned off: the parser makes an Error object per problem it
 * finds, and a broken block pasted from a log can have one per line, whose stacks (never shown: a
 * problem is reported by its position) cost more than the parse.
 */
function withoutStacks<T>(f: () => T): T {
  // A V8 setting (Node.js, Chromium-based hosts); elsewhere the property is absent and nothing changes.
  const engine = Error as { stackTraceLimit?: number };
  const limit = engine.stackTraceLimit;
  if (limit === undefined) return f();
  engine.stackTraceLimit = 0;
  try {
    return f();
  } finally {
    engine.stackTraceLimit = limit;
  }
}

/**
 * Parses one block body as YAML 1.2 with unique keys required. A plain body
 * (see `plainBody.ts`) is built from the parser's syntax tree alone; any other
 * goes through the package's full `parseDocument`, which reports its problems.
 */
export function parseBody(body: string): YamlBody {
  const problems: Problem[] = [];
  let doc: Document.Parsed;
  // YAML 1.2 counts a lone \r as a line break (§5.4) but the parser does not; \n in its place keeps every offset.
  const text = body.includes('\r') ? body.replace(/\r(?!\n)/g, '\n') : body;
  try {
    const tokens = [...new Parser().parse(text)];
    const plain = plainTree(text, tokens);
    if (plain) return { doc: { contents: plain }, problems };
    const deep = tooDeep(tokens);
    if (deep) {
      const lineEnd = body.indexOf('\n', deep.offset);
      problems.push({
        severity: 'error',
        code: 'nesting-too-deep',
        message: `Lists and mappings nest more than ${MAX_NESTING} deep here; a block is read to ${MAX_NESTING} levels (a list of levels needs three), so this one is not read. Write the values at fewer levels.`,
        span: errorSpan([deep.offset, lineEnd === -1 ? body.length : lineEnd], body),
      });
      return { doc: null, problems };
    }
    doc = withoutStacks(() => parseDocument(text, COMPOSE_OPTIONS));
  } catch (err) {
    // The parser is robust, but a bug or a stack overflow on pathological nesting must not take the note down.
    problems.push({
      severity: 'error',
      code: 'yaml-syntax',
      message: `The block could not be read as YAML (${(err as Error).message}).`,
      span: { start: 0, end: body.length },
    });
    return { doc: null, problems };
  }
  const quoted = new Set<number>();
  for (const e of doc.errors) {
    const span = errorSpan(e.pos, body);
    const code = YAML_CODES[e.code] ?? 'yaml-syntax';
    const needsQuotes = code === 'yaml-syntax' ? valueNeedingQuotes(body, span.start) : null;
    if (needsQuotes) {
      // One plain message and one fix per line, however many errors the parser found on it.
      if (quoted.has(needsQuotes.span.start)) continue;
      quoted.add(needsQuotes.span.start);
      problems.push({
        severity: 'error',
        code,
        message: `\`${needsQuotes.key}\`: this text starts with or holds characters YAML reads as structure (${needsQuotes.why}); put it in quotes to keep it as text.`,
        span: needsQuotes.span,
        fixes: [{ title: 'Put the value in quotes', span: needsQuotes.span, newText: needsQuotes.quoted }],
      });
      continue;
    }
    problems.push({ severity: 'error', code, message: `YAML: ${e.message}`, span });
  }
  for (const p of duplicateKeys(doc, body)) problems.push(p);
  for (const w of doc.warnings) {
    problems.push({
      severity: 'warning',
      code: 'yaml-warning',
      message: `YAML: ${w.message}`,
      span: errorSpan(w.pos, body),
    });
  }
  // An alias is written `*name`: a body without a `*` has none, and the counting pass is skipped.
  const targets = body.includes('*') ? aliasTargets(doc) : NO_TARGETS;
  const expanded = targets.size > 0 ? aliasExpansion(doc, targets) : NO_ALIASES;
  if (expanded.added > ALIAS_EXPANSION_LIMIT) {
    problems.push({
      severity: 'error',
      code: 'alias-expansion',
      message: `Aliases in this block would expand to more than ${ALIAS_EXPANSION_LIMIT.toLocaleString('en-US')} extra nodes; the block is not read. Write the values out or use fewer nested aliases.`,
      span: expanded.firstAlias ?? { start: 0, end: body.length },
    });
    return { doc: null, problems };
  }
  return { doc: { contents: treeOfDocument(doc, targets) }, problems };
}

const NO_ALIASES = { added: 0, firstAlias: null } as const;

/** Each alias of a document with the node it refers to (undefined when no anchor of its name comes before it). */
type AliasTargets = ReadonlyMap<unknown, unknown>;

const NO_TARGETS: AliasTargets = new Map();

/**
 * Every alias's target in one pass: the last node anchored with its name that
 * comes before it in document order (YAML 1.2 §3.2.2.2; the `yaml` package's
 * `Alias.resolve` picks the same node). That method walks the whole document
 * on each call, so a block of 10,000 aliases took 13 s and one of 40,000 over
 * a minute; here the walk is made once, pre-order, keys before values, as the
 * package's own `visit` goes. Iterative, so deep nesting cannot overflow the stack.
 */
function aliasTargets(doc: Document.Parsed): AliasTargets {
  const targets = new Map<unknown, unknown>();
  const anchored = new Map<string, unknown>();
  const stack: unknown[] = doc.contents ? [doc.contents] : [];
  while (stack.length > 0) {
    const node = stack.pop();
    if (isYamlAlias(node)) {
      targets.set(node, anchored.get(node.source));
      continue;
    }
    const anchor = (node as { anchor?: unknown } | null)?.anchor;
    if (typeof anchor === 'string' && anchor !== '') anchored.set(anchor, node);
    const kids = children(node);
    for (let i = kids.length - 1; i >= 0; i--) stack.push(kids[i]);
  }
  return targets;
}

/**
 * The value of a `key: value` line holding the offset, when it is unquoted text that YAML cannot take
 * as a plain scalar: it starts with a flow or other indicator (`[1-13C]pyruvic acid`, `{x} y`, `@home`,
 * `` `x` ``, `%`, `!`, `&`, `*`, `|`, `>`) or holds `: ` or ` #` (YAML 1.2.2 §7.3.3, plain scalars). With
 * the text the value would be as a double-quoted scalar; null for any other line.
 */
export function valueNeedingQuotes(
  body: string,
  offset: number,
): { key: string; span: Span; quoted: string; why: string } | null {
  const lineStart = body.lastIndexOf('\n', Math.max(0, offset - 1)) + 1;
  const nl = body.indexOf('\n', offset);
  const line = body.slice(lineStart, nl < 0 ? body.length : nl).replace(/\r$/, '');
  const m = /^(\s*(?:-\s+)?)([A-Za-z_][\w./ -]*?):[ \t]+(\S.*?)[ \t]*$/.exec(line);
  if (!m) return null;
  const value = m[3]!;
  if (/^["']/.test(value)) return null;
  const indicator = /^[[\]{}@`%!&*|>,]/.exec(value);
  const inner = /: |\s#/.exec(value);
  // A flow collection that closes at the end of the line is a list or mapping the user meant.
  if (!indicator && !inner) return null;
  if (/^\[.*\]$|^\{.*\}$/.test(value)) return null;
  const start = lineStart + m[1]!.length + m[2]!.length + line.slice(m[1]!.length + m[2]!.length).indexOf(value);
  const why = indicator ? `\`${indicator[0]}\` at its start` : inner![0].trim() === '#' ? '` #`, a comment' : '`: `';
  const quoted = `"${value.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`;
  return { key: m[2]!, span: { start, end: start + value.length }, quoted, why };
}

/**
 * The options the composer is run with: the reader's, except that the
 * composer does not look for duplicate keys. Its check compares each key with
 * every earlier key of the mapping (40,000 keys took seconds), so
 * {@link duplicateKeys} does the same check in linear time afterwards.
 */
export const COMPOSE_OPTIONS = { ...YAML_OPTIONS, uniqueKeys: false } as const;

/**
 * The problems the composer reports with `uniqueKeys: true` (its message, at
 * the start of the repeated key), found in one pass with a set of the keys
 * seen per mapping. Keys are equal as the composer compares them: scalars
 * with `===` values (so NaN never repeats), any other key only as the same
 * node, which two key positions never are. Plain problems rather than the
 * package's error objects, each of which captures a stack trace: a block of
 * 100,000 repeated keys is then read in a fraction of the time. Iterative, so
 * deeply nested input cannot overflow the stack.
 */
function duplicateKeys(doc: Document.Parsed, body: string): Problem[] {
  const found: Problem[] = [];
  const stack: unknown[] = doc.contents ? [doc.contents] : [];
  const visited = new Set<unknown>();
  while (stack.length > 0) {
    const node = stack.pop();
    if (visited.has(node)) continue;
    visited.add(node);
    if (isYamlMap(node)) {
      const seen = new Set<unknown>();
      for (const pair of node.items) {
        const key: unknown = pair.key;
        if (isYamlScalar(key) && key.value === key.value) {
          if (seen.has(key.value)) {
            const at = key.range?.[0] ?? 0;
            found.push({
              severity: 'error',
              code: 'yaml-duplicate-key',
              message: 'YAML: Map keys must be unique',
              span: errorSpan([at, at + 1], body),
            });
          } else seen.add(key.value);
        }
      }
    }
    for (const kid of children(node)) stack.push(kid);
  }
  // In document order, as the composer would have found them.
  return found.sort((a, b) => a.span.start - b.span.start);
}

/**
 * The span of a YAML error: at least one character where the body has one,
 * inside the body (an error at the end of the input, such as an unclosed
 * quote, points at the last character).
 */
function errorSpan([from, to]: readonly [number, number], body: string): Span {
  const start = Math.max(0, Math.min(from, body.length - 1));
  return { start, end: Math.min(body.length, Math.max(to, start + 1)) };
}

/**
 * Counts how many nodes alias references would add if expanded, without
 * expanding anything: one post-order pass with each node's expanded size
 * memoised, so an "alias bomb" is measured in linear time. Iterative, so
 * deeply nested input cannot overflow the stack.
 */
function aliasExpansion(doc: Document.Parsed, targets: AliasTargets): { added: number; firstAlias: Span | null } {
  const size = new Map<unknown, number>();
  let added = 0;
  let firstAlias: Span | null = null;
  const root = doc.contents;
  if (!root) return { added, firstAlias };
  const stack: { node: unknown; done: boolean }[] = [{ node: root, done: false }];
  while (stack.length > 0) {
    const top = stack.pop()!;
    const node = top.node;
    if (isYamlAlias(node)) {
      const target = targets.get(node);
      const s = target ? (size.get(target) ?? 1) : 1;
      added += s;
      if (!firstAlias && node.range) firstAlias = { start: node.range[0], end: node.range[1] };
      size.set(node, s);
      if (added > ALIAS_EXPANSION_LIMIT) break;
      continue;
    }
    const kids = children(node);
    if (!top.done && kids.length > 0) {
      stack.push({ node, done: true });
      // Reversed, so children are finished in document order: an anchor is sized before its aliases.
      for (let i = kids.length - 1; i >= 0; i--) stack.push({ node: kids[i], done: false });
      continue;
    }
    let s = 1;
    for (const k of kids) s += size.get(k) ?? 1;
    size.set(node, s);
  }
  return { added, firstAlias };
}

function children(node: unknown): unknown[] {
  if (isYamlMap(node) || isYamlSeq(node)) {
    const out: unknown[] = [];
    for (const item of node.items as unknown[]) {
      if (isPair(item)) {
        if (item.key != null && typeof item.key === 'object') out.push(item.key);
        if (item.value != null) out.push(item.value);
      } else if (item != null) out.push(item);
    }
    return out;
  }
  return [];
}

/**
 * The package's document as our tree (exported for the tests that compare it
 * with the plain-body shortcut's): each node made once (an alias points at
 * its anchor's node, so aliases cost nothing more), iteratively, so that deeply
 * nested input cannot overflow the stack.
 */
export function treeOfDocument(doc: Document.Parsed, targets: AliasTargets = aliasTargets(doc)): TreeNode | null {
  const made = new Map<unknown, TreeNode>();
  const pending: [YAMLMap | YAMLSeq, TreeMap | TreeSeq][] = [];
  const make = (n: unknown): TreeNode | null => {
    if (n == null) return null;
    const seen = made.get(n);
    if (seen) return seen;
    let t: TreeNode | null = null;
    if (isYamlAlias(n)) {
      const target = targets.get(n);
      t = { kind: 'alias', target: target ? make(target) : null, range: n.range ?? null };
    } else if (isYamlScalar(n)) {
      t = {
        kind: 'scalar',
        value: n.value,
        source: typeof n.source === 'string' ? n.source : String(n.value),
        type: n.type ?? null,
        range: n.range ?? null,
        isNull: n.value === null,
      };
    } else if (isYamlMap(n)) {
      t = { kind: 'map', items: [], range: n.range ?? null, flow: n.flow === true };
      pending.push([n, t]);
    } else if (isYamlSeq(n)) {
      t = { kind: 'seq', items: [], range: n.range ?? null, flow: n.flow === true };
      pending.push([n, t]);
    }
    if (t) made.set(n, t);
    return t;
  };
  const root = make(doc.contents);
  while (pending.length > 0) {
    const [from, to] = pending.pop()!;
    if (to.kind === 'map') {
      for (const item of from.items as unknown[]) {
        if (isPair(item)) to.items.push({ key: make(item.key), value: make(item.value) });
      }
    } else {
      for (const item of from.items as unknown[]) to.items.push(make(item));
    }
  }
  return root;
}

/** Follows an alias to its anchored node; other nodes are returned as they are. */
export function deref(node: TreeNode | null | undefined): TreeNode | null {
  return isAlias(node) ? node.target : (node ?? null);
}

/** The span a node covers (value part, without trailing comments), or null. */
export function spanOf(node: TreeNode | null | undefined): Span | null {
  const r = node?.range;
  return r ? { start: r[0], end: Math.max(r[1], r[0]) } : null;
}

/** A mapping entry with the spans of its key and value. */
export interface Entry {
  readonly key: string;
  readonly keySpan: Span;
  readonly value: TreeNode | null;
  readonly valueSpan: Span;
}

/** Entries of a YAML mapping node; non-scalar keys are skipped (the caller reports them). */
export function entries(node: TreeNode | null | undefined): Entry[] {
  const map = deref(node);
  if (!isMap(map)) return [];
  const out: Entry[] = [];
  for (const pair of map.items) {
    const k = pair.key;
    if (!isScalar(k) || k.range == null) continue;
    const keySpan = spanOf(k)!;
    const value = deref(pair.value);
    const valueSpan = spanOf(pair.value) ?? { start: keySpan.end, end: keySpan.end };
    out.push({ key: String(k.value), keySpan, value, valueSpan });
  }
  return out;
}

export function isMap(node: TreeNode | null | undefined): node is TreeMap {
  return node?.kind === 'map';
}

export function isSeq(node: TreeNode | null | undefined): node is TreeSeq {
  return node?.kind === 'seq';
}

export function isScalar(node: TreeNode | null | undefined): node is TreeScalar {
  return node?.kind === 'scalar';
}

function isAlias(node: TreeNode | null | undefined): node is TreeAlias {
  return node?.kind === 'alias';
}

/** True for a scalar whose value is YAML's null (`~`, `null`, nothing at all). */
export function isNullScalar(node: TreeNode | null | undefined): boolean {
  return isScalar(node) && node.isNull;
}

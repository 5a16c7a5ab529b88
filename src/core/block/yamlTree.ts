/**
 * Reads a block body with the `yaml` package and gives the rest of the core a
 * small, position-keeping view of it (`tree.ts`). Offsets are body-relative
 * (the block layer maps them to the note). Parsing never throws; YAML's own
 * errors and our bounds come back as problems.
 *
 * This file holds the reader's entry, `parseBody`, and the helpers every block
 * reader walks the tree with. The way through the package's full document is
 * in `yamlDocument.ts`, the mapping of its errors to problems in
 * `yamlErrors.ts` and the bound on alias expansion in `yamlAliases.ts`; their
 * exports the rest of the core and the tests use are re-exported here.
 */
import { type Document, Parser } from 'yaml';
import type { Problem, Span } from '../types';
import { tooDeep } from './nesting';
import { plainTree } from './plainBody';
import type { TreeAlias, TreeMap, TreeNode, TreeScalar, TreeSeq } from './tree';
import { aliasExpansionProblem } from './yamlAliases';
import { aliasTargets, composeDocument, NO_TARGETS, treeOfDocument } from './yamlDocument';
import { documentProblems, nestingProblem, unreadableProblem } from './yamlErrors';
import { YAML_OPTIONS } from './yamlOptions';

export { YAML_OPTIONS };
export { ALIAS_EXPANSION_LIMIT } from './yamlAliases';
export { COMPOSE_OPTIONS, treeOfDocument } from './yamlDocument';
export { valueNeedingQuotes } from './yamlErrors';

/** What the block readers walk: the body's root node. */
export interface YamlTree {
  readonly contents: TreeNode | null;
}

/** A parsed body: its tree (or null when unusable) and the problems found. */
export interface YamlBody {
  readonly doc: YamlTree | null;
  readonly problems: Problem[];
}

/**
 * Parses one block body as YAML 1.2 with unique keys required. A plain body
 * (see `plainBody.ts`) is built from the parser's syntax tree alone; any other
 * goes through the package's full `parseDocument`, which reports its problems.
 */
export function parseBody(body: string): YamlBody {
  let doc: Document.Parsed;
  // YAML 1.2 counts a lone \r as a line break (§5.4) but the parser does not; \n in its place keeps every offset.
  const text = body.includes('\r') ? body.replace(/\r(?!\n)/g, '\n') : body;
  try {
    const tokens = [...new Parser().parse(text)];
    const plain = plainTree(text, tokens);
    if (plain) return { doc: { contents: plain }, problems: [] };
    const deep = tooDeep(tokens);
    if (deep) return { doc: null, problems: [nestingProblem(deep.offset, body)] };
    doc = composeDocument(text);
  } catch (err) {
    // The parser is robust, but a bug or a stack overflow on pathological nesting must not take the note down.
    return { doc: null, problems: [unreadableProblem(err, body)] };
  }
  const problems = documentProblems(doc, body);
  // An alias is written `*name`: a body without a `*` has none, and the counting pass is skipped.
  const targets = body.includes('*') ? aliasTargets(doc) : NO_TARGETS;
  const bomb = aliasExpansionProblem(doc, targets, body);
  if (bomb) {
    problems.push(bomb);
    return { doc: null, problems };
  }
  return { doc: { contents: treeOfDocument(doc, targets) }, problems };
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

/** An entry's whole extent: from its key to the end of its value. */
export function entrySpan(e: Entry): Span {
  return { start: e.keySpan.start, end: Math.max(e.keySpan.end, e.valueSpan.end) };
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

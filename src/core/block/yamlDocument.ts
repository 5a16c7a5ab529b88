/**
 * The full-document path of the block reader (`yamlTree.ts`): a body that is
 * not plain is composed by the `yaml` package into its document, each alias
 * is matched with the node it refers to, and the document is turned into the
 * reader's own tree (`tree.ts`). The walks over the package's document are
 * iterative, so that deeply nested input cannot overflow the stack; the other
 * passes over it (`yamlErrors.ts`, `yamlAliases.ts`) step with {@link children}.
 */
import {
  type Document,
  isAlias as isYamlAlias,
  isMap as isYamlMap,
  isPair,
  isScalar as isYamlScalar,
  isSeq as isYamlSeq,
  parseDocument,
  type YAMLMap,
  type YAMLSeq,
} from 'yaml';
import type { TreeMap, TreeNode, TreeSeq } from './tree';
import { YAML_OPTIONS } from './yamlOptions';

/**
 * The options the composer is run with: the reader's, except that the
 * composer does not look for duplicate keys. Its check compares each key with
 * every earlier key of the mapping (40,000 keys took seconds), so
 * `duplicateKeys` (`yamlErrors.ts`) does the same check in linear time afterwards.
 */
export const COMPOSE_OPTIONS = { ...YAML_OPTIONS, uniqueKeys: false } as const;

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

/** The package's document of a body, composed with {@link COMPOSE_OPTIONS} and without stack traces. */
export function composeDocument(text: string): Document.Parsed {
  return withoutStacks(() => parseDocument(text, COMPOSE_OPTIONS));
}

/** Each alias of a document with the node it refers to (undefined when no anchor of its name comes before it). */
export type AliasTargets = ReadonlyMap<unknown, unknown>;

/** The targets of a document without aliases. */
export const NO_TARGETS: AliasTargets = new Map();

/**
 * Every alias's target in one pass: the last node anchored with its name that
 * comes before it in document order (YAML 1.2 §3.2.2.2; the `yaml` package's
 * `Alias.resolve` picks the same node). That method walks the whole document
 * on each call, so a block of 10,000 aliases took 13 s and one of 40,000 over
 * a minute; here the walk is made once, pre-order, keys before values, as the
 * package's own `visit` goes. Iterative, so deep nesting cannot overflow the stack.
 */
export function aliasTargets(doc: Document.Parsed): AliasTargets {
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

/** The children of a node of the package's document, in document order (a pair's key before its value). */
export function children(node: unknown): unknown[] {
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

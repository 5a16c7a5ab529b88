/**
 * The bound on alias expansion in a block body (`yamlTree.ts`). Aliases are
 * allowed, but all aliases of a block together may add at most
 * {@link ALIAS_EXPANSION_LIMIT} nodes when expanded; past that (an "alias
 * bomb") the block is refused rather than read. The expansion is measured on
 * the package's document, without expanding anything, before our tree is
 * built (where an alias points at its anchor's node).
 */
import { type Document, isAlias as isYamlAlias } from 'yaml';
import type { Problem, Span } from '../types';
import { type AliasTargets, children } from './yamlDocument';

/** How many nodes aliases may add when expanded, in all, per block. */
export const ALIAS_EXPANSION_LIMIT = 10_000;

const NO_ALIASES = { added: 0, firstAlias: null } as const;

/**
 * The problem of a document whose aliases would expand past {@link ALIAS_EXPANSION_LIMIT} nodes (at its
 * first alias), or null when they stay within it.
 */
export function aliasExpansionProblem(doc: Document.Parsed, targets: AliasTargets, body: string): Problem | null {
  const expanded = targets.size > 0 ? aliasExpansion(doc, targets) : NO_ALIASES;
  if (expanded.added <= ALIAS_EXPANSION_LIMIT) return null;
  return {
    severity: 'error',
    code: 'alias-expansion',
    message: `Aliases in this block would expand to more than ${ALIAS_EXPANSION_LIMIT.toLocaleString('en-US')} extra nodes; the block is not read. Write the values out or use fewer nested aliases.`,
    span: expanded.firstAlias ?? { start: 0, end: body.length },
  };
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

/**
 * The bound on how deep a block body's collections may nest. A `levels`
 * block needs three or four levels (a list of levels, each a mapping of
 * quantities); the bound leaves far more room than that, and it is what
 * decides, the same way on every run, whether a deeply nested body is read.
 * Without it the decision would fall to the `yaml` package's composer
 * running out of call stack, at a depth that moves with the engine's state
 * (a body 700 deep was read in a warm process and refused in a fresh one).
 *
 * The depth is measured on the package's syntax tree, which its parser
 * builds without recursion, by a walk that does not recurse either.
 */
import type { CST } from 'yaml';

/** Collections (mappings and lists, block or flow) a body may nest; the root mapping is the first. */
export const MAX_NESTING = 64;

/** Where a body first nests past {@link MAX_NESTING}: the offset of that collection, body-relative. */
export interface TooDeep {
  readonly offset: number;
}

/** The first collection (in document order) nested deeper than the bound, or null when none is. */
export function tooDeep(tokens: Iterable<CST.Token>): TooDeep | null {
  const stack: { token: CST.Token | undefined; depth: number }[] = [];
  for (const token of tokens) if (token.type === 'document') stack.push({ token: token.value, depth: 0 });
  // Children are pushed in reverse, so collections are met in document order.
  stack.reverse();
  while (stack.length > 0) {
    const { token, depth } = stack.pop()!;
    if (!token) continue;
    if (token.type !== 'block-map' && token.type !== 'block-seq' && token.type !== 'flow-collection') continue;
    if (depth + 1 > MAX_NESTING) return { offset: token.offset };
    const items: readonly { key?: CST.Token | null; value?: CST.Token }[] = token.items;
    for (let i = items.length - 1; i >= 0; i--) {
      const item = items[i]!;
      stack.push({ token: item.value, depth: depth + 1 });
      if (item.key) stack.push({ token: item.key, depth: depth + 1 });
    }
  }
  return null;
}

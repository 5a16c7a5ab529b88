/**
 * The tree the block readers walk: a small, position-keeping view of a block
 * body's YAML. It is made either from the `yaml` package's document (any
 * body; see `yamlTree.ts`) or straight from the package's syntax tree (plain
 * bodies; see `plainBody.ts`), and both give the same tree for the same body.
 * Offsets are body-relative: start, end of the value, end of the node with
 * what follows it on its line, as the package's ranges are.
 */

/** Where a node was written: start, end of its value, end of the node with trailing space and comment. */
export type TreeRange = readonly [number, number, number];

/** How a scalar was written, in the package's words. */
export type ScalarStyle = 'PLAIN' | 'QUOTE_SINGLE' | 'QUOTE_DOUBLE' | 'BLOCK_LITERAL' | 'BLOCK_FOLDED';

export interface TreeScalar {
  readonly kind: 'scalar';
  /** The value as the core schema types it: string, number, boolean or null. */
  readonly value: unknown;
  /** The scalar's text after unquoting and line folding, before typing. */
  readonly source: string;
  readonly type: ScalarStyle | null;
  readonly range: TreeRange | null;
  /** True when the value is null (known without typing the scalar in full). */
  readonly isNull: boolean;
}

export interface TreePair {
  readonly key: TreeNode | null;
  readonly value: TreeNode | null;
}

export interface TreeMap {
  readonly kind: 'map';
  readonly items: TreePair[];
  readonly range: TreeRange | null;
  readonly flow: boolean;
}

export interface TreeSeq {
  readonly kind: 'seq';
  readonly items: (TreeNode | null)[];
  readonly range: TreeRange | null;
  readonly flow: boolean;
}

/** A `*name` reference, pointing at its anchor's node (null when there is none). */
export interface TreeAlias {
  readonly kind: 'alias';
  readonly target: TreeNode | null;
  readonly range: TreeRange | null;
}

export type TreeNode = TreeScalar | TreeMap | TreeSeq | TreeAlias;

/**
 * Plain data shared by every part of the core. Nothing here knows about
 * editors or protocols: positions are UTF-16 offsets into the note, and the
 * hosts (language server, CLI) turn them into their own range types.
 */

/** Severity of a problem found in a block. */
export type Severity = 'error' | 'warning' | 'info';

/** A half-open span of UTF-16 offsets `[start, end)`. */
export interface Span {
  readonly start: number;
  readonly end: number;
}

/** A text replacement that a user may choose (a quick fix). Never applied by the core. */
export interface Replacement {
  /** Short title shown to the user, e.g. "Change unit to mT". */
  readonly title: string;
  readonly span: Span;
  readonly newText: string;
  /** Further edits applied together with this one (e.g. the same unit added to every number of a list). */
  readonly more?: readonly { readonly span: Span; readonly newText: string }[];
}

/**
 * A problem found while reading or analysing a block.
 * `code` is a stable kebab-case identifier documented in docs/format.md.
 */
export interface Problem {
  readonly severity: Severity;
  readonly code: string;
  readonly message: string;
  readonly span: Span;
  readonly fixes?: readonly Replacement[];
}

/** A value with its standard uncertainty (1 σ), or null when no input carried one. */
export interface Measured {
  readonly value: number;
  readonly uncertainty: number | null;
}

/** The five status words of the notebook-format contract. */
export type Status = 'normal' | 'saturated' | 'inverted' | 'non-thermal' | 'invalid';

/** Every status word, in the order the contract lists them. */
export const STATUSES: readonly Status[] = ['normal', 'saturated', 'inverted', 'non-thermal', 'invalid'];

/** The "unknown key" warning shared by the block and the level items. */
import { closest } from '../text/suggest';
import { report, type ReadContext } from './values';
import type { Entry } from './yamlTree';

/** Problems a block may have before unknown keys get no "did you mean" (see below). */
const SUGGEST_UNTIL = 500;

/** Warns about a key the block does not know, offering the closest known one that its mapping (`present`) lacks. */
export function unknownKey(
  ctx: ReadContext,
  e: Entry,
  known: ReadonlySet<string>,
  present: { has(key: string): boolean },
): void {
  // Past a few hundred problems (a pasted log) no suggestion is looked for: the block lists only its first
  // hundred problems (analyzer/blockBounds.ts), and each search costs an edit distance per known key.
  if (ctx.problems.length > SUGGEST_UNTIL) {
    report(ctx, 'warning', 'key-unknown', `Unknown key \`${e.key}\`; it is ignored.`, e.keySpan);
    return;
  }
  // Allow about one edit per three letters, so short unrelated words get no suggestion.
  // A key the mapping has already is never offered: taking it would write that key twice, a YAML error.
  const guess = closest(
    e.key,
    [...known].filter((k) => !present.has(k)),
    Math.max(1, Math.min(3, Math.floor(e.key.length / 3))),
    {
      ignoreCase: true,
    },
  );
  const fixes = guess ? [{ title: `Change to \`${guess}\``, span: e.keySpan, newText: guess }] : [];
  const hint = guess ? ` Did you mean \`${guess}\`?` : '';
  report(ctx, 'warning', 'key-unknown', `Unknown key \`${e.key}\`; it is ignored.${hint}`, e.keySpan, fixes);
}

/**
 * `{ run: <id> }` and `{ run: <note path>#<id> }`: a value that another
 * block provides (notebook-format contract v1.2, "A run by reference").
 * Reading records the reference with its spans on the block (for the hosts'
 * definition, references and rename) and follows it through the host's
 * {@link RunResolver}; every way it can fail becomes a diagnostic on the
 * reference, and what was read becomes a dependency of the block.
 */
import type { TreeNode } from './tree';
import { deref, entries, isMap, isScalar, spanOf } from './yamlTree';
import { depend, report, type ReadContext } from './values';
import { shortNote, splitReference } from '../runs/paths';
import type { RunFacts, RunPlace, RunRef, RunUse } from '../runs/types';
import type { Replacement, Span } from '../types';
import type { CellLine } from '../text/jupyter';

/** True when the node is a `{ run: … }` mapping (whatever its value). */
export function isRunRefNode(node: TreeNode | null): boolean {
  const n = deref(node);
  return isMap(n) && entries(n).some((e) => e.key === 'run');
}

/**
 * Reads `{ run: … }` at `node` and records it on the block. Reports and returns null when the mapping holds
 * anything else or the reference is empty.
 */
export function readRunRef(ctx: ReadContext, node: TreeNode | null, use: RunUse, subject: string): RunRef | null {
  const n = deref(node);
  const at = spanOf(n) ?? { start: 0, end: 0 };
  if (!isMap(n)) return null;
  const list = entries(n);
  for (const e of list)
    if (e.key !== 'run')
      report(
        ctx,
        'error',
        'reference-syntax',
        `${subject}: a reference holds only \`run:\` (\`{ run: ref-13C Monday }\` or \`{ run: other.md#ref-13C Monday }\`); \`${e.key}\` does not belong here.`,
        e.keySpan,
      );
  const run = list.find((e) => e.key === 'run');
  const v = deref(run?.value ?? null);
  if (!run || !isScalar(v) || v.range === null || v.isNull || typeof v.value === 'object') {
    report(
      ctx,
      'error',
      'reference-syntax',
      `${subject}: give the run's id after \`run:\`, as \`{ run: ref-13C Monday }\` (or \`{ run: other.md#ref-13C Monday }\` for a run of another note).`,
      run?.keySpan ?? at,
    );
    return null;
  }
  if (list.length > 1) return null;
  const span = spanOf(v)!;
  const quoted = v.type === 'QUOTE_DOUBLE' || v.type === 'QUOTE_SINGLE';
  const raw = ctx.body.slice(span.start, span.end);
  // The text as written: offsets inside it map back to the body only where there are no escapes.
  const text = quoted ? raw.slice(1, -1) : raw;
  const base = span.start + (quoted ? 1 : 0);
  const exact = !quoted || text === v.source;
  const parts = splitReference(exact ? text : v.source);
  if (parts.id === '') {
    report(ctx, 'error', 'reference-syntax', `${subject}: the reference names no run id.`, span);
    return null;
  }
  const idSpan: Span = exact ? { start: base + parts.idOffset, end: base + parts.idOffset + parts.id.length } : span;
  const noteSpan: Span | null =
    parts.note === null ? null : exact ? { start: base, end: base + text.indexOf('#') } : span;
  const ref: RunRef = { use, note: parts.note, id: parts.id, span, idSpan, noteSpan };
  ctx.refs?.push(ref);
  return ref;
}

/**
 * Follows a reference through the host's resolver. Returns the referenced run when it can be used (read and
 * analysed without errors); otherwise reports why on the reference and returns null.
 */
export function followRun(ctx: ReadContext, ref: RunRef, subject: string): RunFacts | null {
  const runs = ctx.externals?.runs;
  const from = ctx.externals?.note ?? '';
  if (!runs) {
    report(
      ctx,
      'error',
      'reference-unavailable',
      `${subject}: the run \`${ref.id}\` cannot be looked up here; open the note in the editor with its workspace, or pass its notes to \`boltzmark report\`.`,
      ref.span,
    );
    return null;
  }
  const answer = runs.resolve(from, { note: ref.note, id: ref.id }, ctx.body);
  depend(ctx, answer.key, answer.stamp);
  switch (answer.kind) {
    case 'note-missing':
      report(
        ctx,
        'error',
        'reference-unknown',
        answer.why
          ? `${subject}: the note \`${ref.note ?? ''}\` is not read: ${answer.why}.`
          : `${subject}: the note \`${ref.note ?? ''}\` was not found (looked for ${shortNote(answer.note)}, relative to this note's folder).`,
        ref.noteSpan ?? ref.span,
      );
      return null;
    case 'unknown': {
      const fixes: Replacement[] = answer.known.slice(0, 3).map((id) => ({
        title: `Refer to \`${id}\``,
        span: ref.idSpan,
        newText: id,
      }));
      const where = ref.note === null ? 'no block of the workspace has' : `no block of \`${ref.note}\` has`;
      const hint = answer.known.length > 0 ? ` Did you mean \`${answer.known[0]}\`?` : '';
      report(ctx, 'error', 'reference-unknown', `${subject}: ${where} the id \`${ref.id}\`.${hint}`, ref.idSpan, fixes);
      return null;
    }
    case 'cycle':
      report(
        ctx,
        'error',
        'reference-cycle',
        `${subject}: the references go round in a circle (${[...answer.chain].map((c) => `\`${c}\``).join(' → ')}), so no value can be computed; one of them must give its value itself.`,
        ref.span,
      );
      return null;
    case 'found': {
      const run = answer.run;
      if (run.error || !run.results) {
        const what = run.error ? `${run.error.code}: ${run.error.message.replace(/\.$/, '')}` : 'it gives no results';
        const line = run.error ? run.error.line : run.place.line;
        const cell = run.error ? run.error.cell : run.place.cell;
        report(
          ctx,
          'error',
          'reference-invalid',
          `${subject}: the run \`${run.id}\` cannot be used: ${what} (${placeText(from, run.place.note, line, cell)}).`,
          ref.span,
        );
        return null;
      }
      return run;
    }
  }
}

/**
 * Where a run is, for a message: "line 12 of this note" or "ref.md, line 12"; in a notebook set whole, its cell
 * and the line in it ("cell 3, line 2 of this notebook", "day.ipynb, cell 3, line 2").
 */
export function placeText(from: string, note: string, line: number, cell?: CellLine): string {
  if (cell) {
    const at = `cell ${cell.index + 1}, line ${cell.line + 1}`;
    return note === from ? `${at} of this notebook` : `${shortNote(note)}, ${at}`;
  }
  return note === from ? `line ${line + 1} of this note` : `${shortNote(note)}, line ${line + 1}`;
}

/** A run's place as the contract's wording shows it (a note's last path segment). */
export function placeOf(place: RunPlace): string {
  return shortNote(place.note);
}

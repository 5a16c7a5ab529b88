/**
 * The problems the block reader (`yamlTree.ts`) reports for a body: the `yaml`
 * package's errors and warnings mapped to our codes (an unquoted value YAML
 * reads as structure gets a plain message and a fix that quotes it), the
 * repeated keys the composer is not asked to find, a body nested too deep and
 * one that could not be read at all. Spans are body-relative and always
 * inside the body.
 */
import { type Document, isMap as isYamlMap, isScalar as isYamlScalar } from 'yaml';
import type { Problem, Span } from '../types';
import { MAX_NESTING } from './nesting';
import { children } from './yamlDocument';

const YAML_CODES: Record<string, string> = {
  DUPLICATE_KEY: 'yaml-duplicate-key',
  BAD_ALIAS: 'yaml-alias',
  TAB_AS_INDENT: 'yaml-tab-indent',
};

/**
 * The problems of a composed document, in the order they are reported: the
 * package's errors (one quoting fix per line, however many errors the parser
 * found on it), the repeated keys, then the package's warnings.
 */
export function documentProblems(doc: Document.Parsed, body: string): Problem[] {
  const problems: Problem[] = [];
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
  return problems;
}

/** The problem of a body that nests past {@link MAX_NESTING} at `offset` (to the end of that line). */
export function nestingProblem(offset: number, body: string): Problem {
  const lineEnd = body.indexOf('\n', offset);
  return {
    severity: 'error',
    code: 'nesting-too-deep',
    message: `Lists and mappings nest more than ${MAX_NESTING} deep here; a block is read to ${MAX_NESTING} levels (a list of levels needs three), so this one is not read. Write the values at fewer levels.`,
    span: errorSpan([offset, lineEnd === -1 ? body.length : lineEnd], body),
  };
}

/**
 * The problem of a body the parser failed on with `err`: the parser is robust, but a bug or a stack
 * overflow on pathological nesting must not take the note down.
 */
export function unreadableProblem(err: unknown, body: string): Problem {
  return {
    severity: 'error',
    code: 'yaml-syntax',
    message: `The block could not be read as YAML (${(err as Error).message}).`,
    span: { start: 0, end: body.length },
  };
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

/** Shared helpers of the core tests: one block in, its report and problem texts out. */
import { strict as assert } from 'node:assert';
import { Analyzer, type BlockReport } from '../../src/core';

/** Wraps a YAML body in a `levels` fence after a heading line and analyses it. */
export function block(body: string, analyzer = new Analyzer()): { report: BlockReport; text: string } {
  const text = `# run\n\n\`\`\`levels\n${body}\n\`\`\`\n`;
  const reports = analyzer.analyzeText(text).blocks;
  assert.equal(reports.length, 1, 'one block expected');
  return { report: reports[0], text };
}

/** The problem with this code (asserting there is exactly one), with the note text it points at. */
export function problem(
  body: string,
  code: string,
): { severity: string; message: string; at: string; fixes: { title: string; newText: string; at: string }[] } {
  const { report, text } = block(body);
  const found = report.problems.filter((p) => p.code === code);
  assert.equal(
    found.length,
    1,
    `expected one '${code}', got: ${report.problems.map((p) => `${p.code} (${p.message})`).join('; ') || 'none'}`,
  );
  const p = found[0];
  assert.ok(p.span.start >= 0 && p.span.end <= text.length && p.span.end >= p.span.start, 'span inside the note');
  return {
    severity: p.severity,
    message: p.message,
    at: text.slice(p.span.start, p.span.end),
    fixes: (p.fixes ?? []).map((f) => ({
      title: f.title,
      newText: f.newText,
      at: text.slice(f.span.start, f.span.end),
    })),
  };
}

/** Applies a problem's first fix to the note and returns the new block body. */
export function applyFirstFix(body: string, code: string): string {
  const { report, text } = block(body);
  const p = report.problems.find((x) => x.code === code);
  assert.ok(p?.fixes?.length, `no fix for ${code}`);
  const f = p.fixes[0];
  const fixed = text.slice(0, f.span.start) + f.newText + text.slice(f.span.end);
  return fixed.slice(fixed.indexOf('```levels\n') + 10, fixed.lastIndexOf('\n```'));
}

/**
 * Relative closeness check that prints both numbers and Δ on failure; for an
 * expected 0 the tolerance is absolute.
 */
export function close(actual: number | null | undefined, expected: number, rel: number, what = 'value'): void {
  assert.ok(typeof actual === 'number' && Number.isFinite(actual), `${what}: got ${actual}`);
  const delta = Math.abs(actual - expected);
  const allowed = expected === 0 ? rel : rel * Math.abs(expected);
  assert.ok(
    delta <= allowed,
    `${what}: got ${actual}, expected ${expected}, Δ = ${delta.toExponential(3)} > ${allowed.toExponential(3)}`,
  );
}

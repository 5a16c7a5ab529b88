import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import {
  Analyzer,
  bodyToDocument,
  CODES,
  convert,
  findFencedBlocks,
  LineIndex,
  parseQuantity,
  STATUSES,
  type Dimension,
  type Problem,
  type Span,
} from '../../src/core';
import { interpretBody } from '../../src/core/block/interpret';
import { noteDiagnostics } from '../../src/server/diagnostics';
import { codeActions } from '../../src/server/features/codeActions';
import { codeLenses } from '../../src/server/features/codeLens';
import { completion } from '../../src/server/features/completion';
import { foldingRanges } from '../../src/server/features/folding';
import { hover } from '../../src/server/features/hover';
import { inlayHints } from '../../src/server/features/inlayHints';
import type { DocumentSymbol, Position } from 'vscode-languageserver';
import { documentSymbols } from '../../src/server/features/symbols';
import { DEFAULT_SETTINGS } from '../../src/shared/settings';
import { noteState } from '../server/helpers';
import { markdownNote, numericNote, quantityText, yamlBody } from './arbitraries';
import { runs } from './seed';

// Property-based tests: random notes, bodies and quantities (arbitraries.ts)
// must never make a reader throw, and what comes back must be well formed.
// On a failure fast-check prints the seed and the shrunk counterexample.

function assertSpanIn(span: Span, lo: number, hi: number, what: string): void {
  assert.ok(
    Number.isInteger(span.start) && Number.isInteger(span.end),
    `${what}: integer offsets ${JSON.stringify(span)}`,
  );
  assert.ok(
    lo <= span.start && span.start <= span.end && span.end <= hi,
    `${what}: ${JSON.stringify(span)} outside [${lo}, ${hi}]`,
  );
}

function assertRegistered(p: Problem): void {
  assert.ok(p.code in CODES, `unregistered code ${p.code}`);
  assert.ok(['error', 'warning', 'info'].includes(p.severity));
  assert.ok(p.message.length > 0);
}

/** Every number reachable from a result is finite (null stands for "not defined"). */
function assertFinite(value: unknown, path: string, seen = new Set<unknown>()): void {
  if (typeof value === 'number') assert.ok(Number.isFinite(value), `${path} = ${value}`);
  else if (value !== null && typeof value === 'object' && !seen.has(value)) {
    seen.add(value);
    for (const [k, v] of Object.entries(value)) if (k !== 'problems') assertFinite(v, `${path}.${k}`, seen);
  }
}

const DIMENSIONS: readonly Dimension[] = [
  'energy',
  'wavelengthEnergy',
  'field',
  'temperature',
  'time',
  'angle',
  'density',
  'crossSection',
  'length',
  'attenuation',
  'rate',
];

describe('robustness: properties of the readers and the analysis', function () {
  this.timeout(120000);

  it('finds fenced blocks in any note, in order, each body mapping back to the note character for character', () => {
    fc.assert(
      fc.property(markdownNote, (text) => {
        let previousEnd = -1;
        for (const b of findFencedBlocks(text)) {
          assert.ok(
            previousEnd < b.openStart &&
              b.openStart <= b.openEnd &&
              b.openEnd <= b.blockEnd &&
              b.blockEnd <= text.length,
            'blocks in order, inside the note',
          );
          previousEnd = b.blockEnd;
          for (let i = 0; i < b.body.length; i++)
            assert.equal(text[bodyToDocument(b, i)], b.body[i], `body offset ${i}`);
          const end = bodyToDocument(b, b.body.length);
          assert.ok(end >= b.openEnd && end <= b.blockEnd, 'the body ends inside its block');
        }
      }),
      runs(400),
    );
  });

  it('indexes lines as CommonMark and LSP count them: \\n, \\r\\n and a lone \\r each end one', () => {
    const text = fc
      .array(fc.constantFrom('a', 'xyz', '\n', '\r', '\r\n', '\u2028', ''), { maxLength: 40 })
      .map((parts) => parts.join(''));
    fc.assert(
      fc.property(text, (t) => {
        // Reference: walk the characters one by one.
        const starts = [0];
        for (let i = 0; i < t.length; i++) {
          if (t[i] === '\r' && t[i + 1] === '\n') i++;
          if (t[i] === '\r' || t[i] === '\n') starts.push(i + 1);
        }
        const lines = new LineIndex(t);
        assert.equal(lines.lineCount, starts.length);
        for (let line = 0; line < starts.length; line++) {
          assert.equal(lines.lineStart(line), starts[line]);
          assert.deepEqual(lines.positionAt(starts[line]!), { line, character: 0 });
        }
      }),
      runs(2000),
    );
  });

  it('reads any YAML body without throwing: problems inside the body with registered codes, input only without errors', () => {
    fc.assert(
      fc.property(yamlBody, (body) => {
        const r = interpretBody(body);
        for (const p of r.problems) {
          assertRegistered(p);
          assertSpanIn(p.span, 0, Math.max(1, body.length), p.code);
          for (const f of p.fixes ?? []) assertSpanIn(f.span, 0, body.length, `${p.code} fix`);
        }
        if (r.problems.some((p) => p.severity === 'error')) assert.equal(r.input, null, 'an error leaves no input');
      }),
      runs(600),
    );
  });

  it('parses any quantity without throwing, and converts it to a finite value or a registered problem in every dimension', () => {
    fc.assert(
      fc.property(fc.oneof(quantityText, fc.string({ maxLength: 24 })), (text) => {
        const r = parseQuantity(text);
        if ('problem' in r) {
          assert.ok(r.problem.code in CODES, r.problem.code);
          assertSpanIn(r.problem.span, 0, Math.max(1, text.length), r.problem.code);
          return;
        }
        const q = r.quantity;
        assert.ok(Number.isFinite(q.value), `value ${q.value}`);
        assert.ok(
          q.uncertainty === null || (Number.isFinite(q.uncertainty) && q.uncertainty >= 0),
          `uncertainty ${q.uncertainty}`,
        );
        for (const span of [q.valueSpan, q.uncertaintySpan, q.unitSpan])
          if (span) assertSpanIn(span, 0, text.length, 'quantity span');
        for (const dim of DIMENSIONS) {
          const c = convert(q, dim);
          if ('problem' in c) assert.ok(c.problem.code in CODES, c.problem.code);
          else {
            assert.ok(Number.isFinite(c.value), `${dim}: ${c.value}`);
            assert.ok(
              c.uncertainty === null || (Number.isFinite(c.uncertainty) && c.uncertainty >= 0),
              `${dim}: u = ${c.uncertainty}`,
            );
          }
        }
      }),
      runs(3000),
    );
  });

  it('analyses any note: diagnostics inside the note and their block, results finite or null, a status word', () => {
    fc.assert(
      fc.property(fc.oneof(markdownNote, numericNote), (text) => {
        const report = new Analyzer().analyzeText(text);
        for (const p of report.problems) assertSpanIn(p.span, 0, text.length, p.code);
        for (const b of report.blocks) {
          assert.ok((STATUSES as readonly string[]).includes(b.status), b.status);
          assert.equal(b.status === 'invalid', b.results === null || b.problems.some((p) => p.severity === 'error'));
          for (const p of b.problems) {
            assertRegistered(p);
            assertSpanIn(p.span, b.block.openStart, b.block.blockEnd, p.code);
            for (const f of p.fixes ?? []) assertSpanIn(f.span, b.block.openEnd, b.block.blockEnd, `${p.code} fix`);
          }
          if (b.results) assertFinite(b.results, 'results');
        }
      }),
      runs(800),
    );
  });

  it('serves every editor feature on any note without throwing, every range inside the note', () => {
    fc.assert(
      fc.property(fc.oneof(markdownNote, numericNote), fc.nat(), fc.nat(), (text, a, b) => {
        const state = noteState(text);
        const lines = new LineIndex(text);
        const inside = (r: {
          start: { line: number; character: number };
          end: { line: number; character: number };
        }): void => {
          for (const p of [r.start, r.end]) {
            assert.ok(p.line >= 0 && p.line < lines.lineCount && p.character >= 0, JSON.stringify(r));
            assert.ok(
              lines.offsetAt(p) === lines.lineStart(p.line) + p.character,
              `past the line's end: ${JSON.stringify(r)}`,
            );
          }
        };
        for (const d of noteDiagnostics(state)) inside(d.range);
        const position = lines.positionAt(a % (text.length + 1));
        const other = lines.positionAt(b % (text.length + 1));
        const range = position.line <= other.line ? { start: position, end: other } : { start: other, end: position };
        const h = hover(state, position, DEFAULT_SETTINGS);
        if (h?.range) inside(h.range);
        for (const hint of inlayHints(
          state,
          { start: { line: 0, character: 0 }, end: { line: lines.lineCount, character: 0 } },
          DEFAULT_SETTINGS,
        ))
          inside({ start: hint.position, end: hint.position });
        for (const action of codeActions(state, range))
          for (const edits of Object.values(action.edit?.changes ?? {})) for (const e of edits) inside(e.range);
        completion(state, position);
        // LSP 3.17 DocumentSymbol: a name that is not empty or only white space, the selection inside the range.
        const symbol = (s: DocumentSymbol): void => {
          assert.ok(s.name.trim() !== '', `a blank symbol name: ${JSON.stringify(s.name)}`);
          inside(s.range);
          inside(s.selectionRange);
          const before = (p: Position, q: Position): boolean =>
            p.line < q.line || (p.line === q.line && p.character <= q.character);
          assert.ok(before(s.range.start, s.selectionRange.start) && before(s.selectionRange.end, s.range.end));
          (s.children ?? []).forEach(symbol);
        };
        documentSymbols(state).forEach(symbol);
        for (const f of foldingRanges(state)) assert.ok(f.startLine <= f.endLine && f.endLine < lines.lineCount);
        for (const l of codeLenses(state)) inside(l.range);
      }),
      runs(300),
    );
  });
});

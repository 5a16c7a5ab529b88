import { strict as assert } from 'node:assert';
import fc from 'fast-check';
import { Analyzer, type AnalyzerLimits, type DocumentReport } from '../../src/core';
import { markdownNote } from './arbitraries';
import { runs } from './seed';

// An Analyzer that has seen earlier versions of a note scans a new version only
// where it changed (src/core/rescanPlan.ts). Whatever the edit, its report must
// be the one a fresh Analyzer gives for the same text: these properties edit
// random notes at random places with the characters that matter to fences and
// line breaks, and compare the two after every edit.

/** Everything a host reads from a report, as plain data (toNote through a few spans). */
function view(r: DocumentReport): unknown {
  return {
    bounded: r.bounded,
    problems: r.problems,
    blocks: r.blocks.map((b) => ({
      block: b.block,
      status: b.status,
      problems: b.problems,
      id: b.meta.id,
      date: b.meta.date,
      keys: [...b.meta.keys].map(([k, s]) => [k, b.toNote(s.key), b.toNote(s.value)]),
      input: b.input,
      results: b.results,
      whole: b.toNote({ start: 0, end: b.block.body.length }),
    })),
  };
}

/** Text that fences, info strings and line breaks are made of, and some that is not. */
const piece = fc.oneof(
  fc.constantFrom(
    '```',
    '~~~',
    '````',
    '```levels\n',
    '\n```\n',
    'levels',
    '\n',
    '\r',
    '\r\n',
    '\uFEFF',
    ' ',
    '   ',
    '`',
    'x',
    'gap: 1 K\nratio: 0.5\n',
    '- ',
    '±',
  ),
  fc.string({ maxLength: 6 }),
);

/** One edit: delete `remove` characters at a relative place and insert `insert` there. */
const edit = fc.record({
  at: fc.double({ min: 0, max: 1, noNaN: true }),
  remove: fc.nat({ max: 12 }),
  insert: fc.oneof(fc.constant(''), piece),
});

function apply(text: string, e: { at: number; remove: number; insert: string }): string {
  const at = Math.min(text.length, Math.floor(e.at * (text.length + 1)));
  return text.slice(0, at) + e.insert + text.slice(Math.min(text.length, at + e.remove));
}

function check(
  limits: AnalyzerLimits | undefined,
): fc.IPropertyWithHooks<[string, { at: number; remove: number; insert: string }[]]> {
  return fc.property(markdownNote, fc.array(edit, { minLength: 1, maxLength: 8 }), (note, edits) => {
    const warm = new Analyzer(limits ? { limits } : {});
    let text = note;
    warm.analyzeText(text);
    for (const e of edits) {
      text = apply(text, e);
      assert.deepStrictEqual(
        view(warm.analyzeText(text)),
        view(new Analyzer(limits ? { limits } : {}).analyzeText(text)),
        JSON.stringify(text),
      );
    }
  });
}

describe('robustness: an edited note is analysed as a fresh one', function () {
  this.timeout(120000);

  it('gives the fresh report after every random edit of a random note', () => {
    fc.assert(check(undefined), runs(300));
  });

  it('does so also when a bound stops the analysis part way', () => {
    fc.assert(check({ maxBlocks: 2, maxBodyChars: 120 }), runs(200));
  });

  it('does so when the analyzer goes back and forth between notes', () => {
    fc.assert(
      fc.property(
        fc.array(markdownNote, { minLength: 2, maxLength: 6 }),
        fc.array(edit, { maxLength: 6 }),
        (notes, edits) => {
          const warm = new Analyzer();
          const texts = [...notes];
          for (let i = 0; i < texts.length + edits.length; i++) {
            const k = i % texts.length;
            if (i >= texts.length) texts[k] = apply(texts[k]!, edits[i - texts.length]!);
            assert.deepStrictEqual(view(warm.analyzeText(texts[k]!)), view(new Analyzer().analyzeText(texts[k]!)));
          }
        },
      ),
      runs(150),
    );
  });
});

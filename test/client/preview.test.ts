import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import MarkdownIt from 'markdown-it';
import { fillIn } from '../../src/client/cellRenderer';
import { bodyKey, levelsPreview, madeResults } from '../../src/client/preview';
import { DEFAULT_DISPLAY, RunBook } from '../../src/core';

function render(markdown: string): string {
  const md = levelsPreview(new MarkdownIt({ html: false }), { infoStrings: () => [], display: () => DEFAULT_DISPLAY });
  return md.render(markdown);
}

/** Checks that every SVG fragment is well-formed XML: tags balanced and properly nested, attributes quoted. */
function assertWellFormedSvg(html: string): number {
  const svgs = html.match(/<svg[\s\S]*?<\/svg>/g) ?? [];
  for (const svg of svgs) {
    const stack: string[] = [];
    for (const m of svg.matchAll(/<(\/?)([a-zA-Z][\w:-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?)>/g)) {
      const [, close, name, , self] = m;
      if (self) continue;
      if (close) assert.equal(stack.pop(), name, `closing </${name}>`);
      else stack.push(name);
    }
    assert.deepEqual(stack, [], 'all SVG elements closed');
    // Nothing but tags and text: no stray '<' left unmatched by the tag pattern.
    assert.equal(svg.replace(/<(\/?)([a-zA-Z][\w:-]*)((?:\s+[\w:-]+="[^"<]*")*)\s*(\/?)>/g, '').includes('<'), false);
  }
  return svgs.length;
}

describe('Markdown preview of levels blocks', () => {
  it('follows each block of the demo notebook with a results table and an S(E) sparkline', () => {
    const html = render(readFileSync('demo/polarizer-log.md', 'utf8'));
    const tables = html.match(/<table class="boltzmark-table">/g) ?? [];
    assert.equal(tables.length, 5, 'five valid blocks with results');
    // The contract's example values, GUM-rounded as in the hover and the report.
    assert.match(html, /<strong>cell-B run 1<\/strong>/);
    assert.match(html, /<th scope="row">T<\/th><td>5\.61 ± 0\.19 mK<\/td>/);
    assert.match(html, /<th scope="row">β<\/th><td>178\.2 ± 6\.1 K⁻¹<\/td>/);
    // u(ε) = u(P)/P_th = 0.010/0.001294 = 7.7 (JCGM 100:2008 §5.1.2).
    assert.match(html, /<th scope="row">ε<\/th><td>241.1 ± 7.7<\/td>/);
    assert.match(html, /boltzmark-status-inverted/);
    // The broken block shows its first error instead of numbers.
    assert.match(html, /<p class="boltzmark-error"><code>[a-z-]+<\/code>/);
    assert.ok(assertWellFormedSvg(html) >= 5);
    // No script of any kind reaches the preview.
    assert.equal(/<script|on\w+=/i.test(html.replace(/<pre[\s\S]*?<\/pre>/g, '')), false);
  });

  it('keeps the block source itself in the preview', () => {
    const html = render('```levels\nid: x\ngap: 10 K\nratio: 0.5\n```\n');
    assert.match(html, /<pre><code class="language-levels">id: x\ngap: 10 K\nratio: 0.5\n<\/code><\/pre>/);
    assert.match(html, /14\.43 K/);
  });

  it('shows a hostile id as text, in the table title and in the SVG label', () => {
    const html = render('```levels\nid: "<img src=x onerror=alert(1)>"\ngap: 10 K\nratio: 0.5\n```\n');
    assert.equal(html.includes('<img'), false);
    assert.match(html, /<strong>&lt;img src=x onerror=alert\(1\)&gt;<\/strong>/);
    assertWellFormedSvg(html);
  });

  it('leaves other fences alone', () => {
    const html = render('```yaml\ngap: 10 K\n```\n');
    assert.equal(html.includes('boltzmark'), false);
  });

  it('puts the measured dot on the curve for a thermal two-level block, at the right height', () => {
    // p_upper = 1/(1 + e^x) at x = ε/kT = 1 gives S/(Nk) = 0.5822031089, the curve's value there
    // (canonical two-state system: S/(Nk) = ln(1 + e^−x) + x/(1 + e^x), D. V. Schroeder, An Introduction to Thermal
    // Physics, Addison Wesley Longman 2000, §2.1 and Problem 3.23; the value derived from it).
    const html = render(`\`\`\`levels\ngap: 1 K\nratio: ${Math.exp(-1)}\n\`\`\`\n`);
    const circle = /<circle cx="([\d.]+)" cy="([\d.]+)"/.exec(html)!;
    const cy = Number(circle[2]);
    // H = 48, PAD = 4, maximum S = ln 2 at the top of the plot.
    const expected = 48 - 4 - (0.5822031089 / Math.LN2) * 40;
    assert.ok(Math.abs(cy - expected) < 0.15, `cy ${cy} vs ${expected}`);
  });

  it('reads the fences and display settings for the note being rendered (markdown-it’s render env)', () => {
    const seen: unknown[] = [];
    const md = levelsPreview(new MarkdownIt({ html: false }), {
      infoStrings: (env) => {
        seen.push(env);
        return (env as { folder?: string }).folder === 'b' ? ['populations'] : [];
      },
      display: (env) => ({
        ...DEFAULT_DISPLAY,
        temperature: (env as { folder?: string }).folder === 'b' ? 'kelvin' : 'auto',
      }),
    });
    const note = '```populations\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: 0.312 ± 0.010\n```\n';
    const a = { folder: 'a' };
    const b = { folder: 'b' };
    assert.doesNotMatch(md.render(note, a), /boltzmark-table/);
    // Same block as the demo's cell-B run: T = 5.61 ± 0.19 mK, here written in kelvin.
    assert.match(md.render(note, b), /<th scope="row">T<\/th><td>0\.00561 ± 0\.00019 K<\/td>/);
    assert.deepEqual(seen, [a, b]);
  });
});

describe('rendered notebook cells: blocks that take values from other runs', () => {
  // Invented notes: a day's 13C thermal reference and a hyperpolarized run that takes its thermal signal from it.
  const reference =
    '```levels\nid: pyr thermal Sat\nsystem: 13C\nfield: 1.4 T\nlattice: 295 K\nsignal:\n  thermal: 412 ± 9\n  scans: { thermal: 256 }\n```\n';
  const run =
    '```levels\nid: pyr dissolution 1\nsystem: 13C\nfield: 1.4 T\nsignal:\n  hyperpolarized: 8.1e5 ± 2e3\n' +
    '  thermal: { run: pyr thermal Sat }\n  scans: { hyperpolarized: 1 }\n```\n';

  it('says where the values come from, not "invalid", where no reference can be followed', () => {
    const html = render(run);
    assert.doesNotMatch(html, /invalid/);
    assert.match(
      html,
      /<strong>pyr dissolution 1<\/strong> — <span class="boltzmark-status">takes values from other runs/,
    );
    assert.match(html, /From <code>pyr thermal Sat<\/code>: not read here yet/);
    // A block with an error of its own still says "invalid".
    assert.match(render(run.replace('field: 1.4 T', 'field: 1.4 MT')), /invalid: the block has an error/);
    // A hostile run name is text.
    assert.match(render(run.replace(/pyr thermal Sat/g, '<img src=x onerror=alert(1)>')), /<code>&lt;img src=x/);
  });

  it('shows the results made elsewhere for a block that refers out, keyed by its body, and fills them in later', () => {
    const book = new RunBook();
    const notebook = 'file:///lab/bench-day.ipynb';
    book.setNote(notebook, reference + '\n' + run);
    const made = madeResults([reference, run], book.externalsFor(notebook), DEFAULT_DISPLAY, []);
    // Only the block that refers out: ε = S_hp / (S_th/256) = 8.1e5 / 1.609 = 5.03 × 10⁵ (invented data).
    const keys = Object.keys(made);
    assert.deepEqual(keys, [bodyKey(run.split('\n').slice(1, -2).join('\n') + '\n')]);
    assert.match(made[keys[0]!]!, /<th scope="row">ε<\/th><td>503000 ± 11000<\/td>/);
    let known: Record<string, string> = {};
    const md = levelsPreview(new MarkdownIt(), {
      infoStrings: () => [],
      display: () => DEFAULT_DISPLAY,
      madeElsewhere: (key) => known[key],
    });
    // Rendered before the results came: the note, inside an element keyed by the body.
    const before = md.render(run);
    assert.match(
      before,
      new RegExp(
        `<div class="boltzmark-keyed" data-boltzmark-key="${keys[0]}"><div class="boltzmark-results">.*not read here yet`,
      ),
    );
    // The results come: the cells already rendered (each in a shadow root of its own) are filled in.
    const cell = { innerHTML: 'not read here yet', getAttribute: () => keys[0]!, shadowRoot: null };
    const other = { innerHTML: 'other', getAttribute: () => '00000000-1', shadowRoot: null };
    const shadow = { querySelectorAll: (s: string) => (s === '*' ? [] : [cell, other]) };
    const host = { innerHTML: '', getAttribute: () => null, shadowRoot: shadow };
    const doc = { querySelectorAll: (s: string) => (s === '*' ? [host] : []) };
    fillIn(doc, new Map(Object.entries(made)));
    assert.equal(cell.innerHTML, made[keys[0]!]);
    assert.equal(other.innerHTML, 'other');
    // Rendered after: the results at once.
    known = made;
    assert.match(md.render(run), /503000 ± 11000/);
    // A block that refers to nothing is analysed in the renderer itself, unkeyed.
    assert.doesNotMatch(md.render(reference), /boltzmark-keyed/);
  });
});

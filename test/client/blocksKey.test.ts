import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';
import MarkdownIt from 'markdown-it';
import { BlocksKey, NOTE_HAS_BLOCKS, noteHasBlocks } from '../../src/client/blocksKey';

// The `boltzmark.noteHasBlocks` context key that shows the editor title's
// curve button only on notes with a `levels` block.

const md = (text: string) => ({ languageId: 'markdown', getText: () => text });

/** Notes with and without blocks, including the fence rules that decide it (CommonMark 0.31.2, §4.5 fenced code blocks). */
const NOTES: Record<string, string> = {
  plain: '# Notes\n\nNo fenced blocks at all.\n',
  levels: '# Run\n\n```levels\ngap: 10 K\nratio: 0.5\n```\n',
  tildes: '~~~levels\ngap: 10 K\n~~~\n',
  'info after the language': '```levels  run 7\ngap: 10 K\n```\n',
  'other language': '```yaml\ngap: 10 K\n```\n',
  // Four spaces of indent make an indented code block, not a fence (§4.5: at most three).
  'indented four spaces': '    ```levels\n    gap: 10 K\n    ```\n',
  'indented three spaces': '   ```levels\n   gap: 10 K\n   ```\n',
  // A closing fence must be at least as long as the opening one, so the inner fence is content.
  'inside a longer fence': '````md\n```levels\ngap: 10 K\n```\n````\n',
  // An unclosed fence runs to the end of the document.
  unclosed: 'text\n\n```levels\ngap: 10 K\n',
  // A backtick fence's info string may not contain a backtick.
  'backtick in the info': '```levels`\ngap: 10 K\n```\n',
  'extra info string only': '```populations\ngap: 10 K\n```\n',
};

/** The same question answered by an independent CommonMark parser: is there a fence whose language is one of ours? */
function markdownItSays(text: string, infoStrings: readonly string[]): boolean {
  return new MarkdownIt()
    .parse(text, {})
    .some((t) => t.type === 'fence' && [...infoStrings, 'levels'].includes(t.info.trim().split(/\s+/)[0] ?? ''));
}

describe('the noteHasBlocks context key', () => {
  it('is true exactly for Markdown notes with a levels fence, as markdown-it reads the fences', () => {
    for (const [name, text] of Object.entries(NOTES)) {
      assert.equal(noteHasBlocks(md(text), []), markdownItSays(text, []), name);
      assert.equal(noteHasBlocks(md(text), ['populations']), markdownItSays(text, ['populations']), name);
    }
    // The cases are not all alike: both answers occur.
    assert.equal(noteHasBlocks(md(NOTES.levels), []), true);
    assert.equal(noteHasBlocks(md(NOTES['inside a longer fence']), []), false);
    assert.equal(noteHasBlocks(md(NOTES['extra info string only']), []), false);
    assert.equal(noteHasBlocks(md(NOTES['extra info string only']), ['populations']), true);
  });

  it('is false for other languages and without an editor', () => {
    assert.equal(noteHasBlocks({ languageId: 'plaintext', getText: () => NOTES.levels }, []), false);
    assert.equal(noteHasBlocks(undefined, []), false);
  });

  it('tells VS Code only when the value changes', () => {
    const sent: boolean[] = [];
    const key = new BlocksKey(
      (v) => sent.push(v),
      () => [],
    );
    key.update(md(NOTES.plain));
    key.update(md(NOTES.plain));
    key.update(md(NOTES.levels));
    key.update(md(NOTES.tildes));
    key.update(undefined);
    assert.deepEqual(sent, [false, true, false]);
  });

  it('gates the editor title button in package.json', () => {
    const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as {
      contributes: { menus: Record<string, { command: string; when?: string }[]> };
    };
    const button = manifest.contributes.menus['editor/title'].find((m) => m.command === 'boltzmark.showCurve');
    assert.equal(button?.when, `resourceLangId == markdown && ${NOTE_HAS_BLOCKS}`);
  });
});

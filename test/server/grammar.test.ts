import { strict as assert } from 'node:assert';
import { readFileSync } from 'node:fs';

// The injection grammar's fence patterns, checked with JavaScript regular
// expressions (they use only syntax that Oniguruma and JavaScript share).
describe('levels injection grammar', () => {
  const g = JSON.parse(readFileSync('syntaxes/levels.injection.tmLanguage.json', 'utf8'));
  const rule = g.repository['levels-fence'];
  const begin = new RegExp(rule.begin.replace('\\G', '^'));

  it('is injected into Markdown and embeds YAML in the block body', () => {
    const manifest = JSON.parse(readFileSync('package.json', 'utf8'));
    const entry = manifest.contributes.grammars.find((x: { scopeName: string }) => x.scopeName === g.scopeName);
    assert.deepEqual(entry.injectTo, ['text.html.markdown']);
    assert.equal(entry.embeddedLanguages['meta.embedded.block.levels'], 'yaml');
    assert.equal(rule.patterns[0].patterns[0].include, 'source.yaml');
  });

  it('opens on levels fences of backticks or tildes, up to three spaces in, and on nothing else', () => {
    for (const ok of ['```levels', '~~~levels', '````levels', '   ```levels', '```levels title'])
      assert.ok(begin.test(ok), ok);
    for (const no of ['    ```levels', '```yaml', '```levelsx', '``levels', '```level']) assert.ok(!begin.test(no), no);
  });

  it('closes on a fence of the same kind', () => {
    const end = new RegExp(rule.end.replace('\\G', '^').replace('\\3', '```'));
    assert.ok(end.test('```'));
    assert.ok(end.test('  ```  '));
    assert.ok(!end.test('``'));
  });
});

import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import MarkdownIt from 'markdown-it';
import { packagedReadme, relativeTargets, repositoryAddress } from '../../scripts/readmeLinks.cjs';

// The README inside the .vsix (scripts/package.mjs): VS Code shows it on the
// extension's page with the installed extension as its base, so a relative
// link must name a shipped file; anything else must be an absolute address.

const manifest = JSON.parse(readFileSync('package.json', 'utf8')) as {
  version: string;
  repository?: { url?: string };
  bugs?: { url?: string };
};

/** What `vsce ls` says the .vsix holds (the same call as scripts/package.mjs). */
function listing(): string[] {
  const vsce = join(dirname(createRequire(__filename).resolve('@vscode/vsce/package.json')), 'vsce');
  const r = spawnSync(process.execPath, [vsce, 'ls', '--no-dependencies'], { encoding: 'utf8' });
  assert.equal(r.status, 0, r.stderr);
  return r.stdout
    .split('\n')
    .map((l) => l.trim())
    .filter(Boolean);
}

/** Every link and image address in a Markdown text, as an independent CommonMark parser (markdown-it) reads it. */
function addresses(markdown: string): string[] {
  const out: string[] = [];
  const walk = (tokens: ReturnType<MarkdownIt['parse']>): void => {
    for (const t of tokens) {
      const a = t.type === 'link_open' ? t.attrGet('href') : t.type === 'image' ? t.attrGet('src') : null;
      if (a !== null) out.push(decodeURIComponent(a));
      if (t.children) walk(t.children);
    }
  };
  walk(new MarkdownIt().parse(markdown, {}));
  return out;
}

describe('the README inside the .vsix', function () {
  this.timeout(60000);

  it('keeps links to shipped files relative and points the rest at the repository, leaving code alone', () => {
    const source = [
      'See [the format](docs/format.md#diagnostics), [the guide](./DEVELOPERS.md) and [the demo](demo/).',
      '![shot](docs/images/a.png) and [elsewhere](https://example.org/x) and [here](#usage).',
      'Copied as `![id](relative/path.png)`, never a link.',
      '```md',
      '[inside](a/fence.md)',
      '```',
      '[ref]: docs/testing.md#the-editor-host',
      '',
    ].join('\n');
    const out = packagedReadme(
      source,
      ['README.md', 'docs/format.md', 'docs/images/a.png'],
      'https://example.org/lab/tool.git',
      '1.2.3',
    );
    assert.equal(
      out,
      [
        'See [the format](docs/format.md#diagnostics), [the guide](https://example.org/lab/tool/blob/v1.2.3/DEVELOPERS.md) and [the demo](https://example.org/lab/tool/blob/v1.2.3/demo/).',
        '![shot](docs/images/a.png) and [elsewhere](https://example.org/x) and [here](#usage).',
        'Copied as `![id](relative/path.png)`, never a link.',
        '```md',
        '[inside](a/fence.md)',
        '```',
        '[ref]: https://example.org/lab/tool/blob/v1.2.3/docs/testing.md#the-editor-host',
        '',
      ].join('\n'),
    );
    assert.deepEqual(relativeTargets(out), ['docs/format.md#diagnostics', 'docs/images/a.png']);
  });

  it('has no relative link to a file the .vsix lacks, by markdown-it’s reading of the packaged README', () => {
    const files = listing();
    const repository = repositoryAddress(manifest);
    assert.ok(repository, 'package.json names its repository');
    const readme = readFileSync('README.md', 'utf8');
    const shipped = (a: string): boolean => {
      const path = a.replace(/[?#].*$/, '').replace(/^\.\//, '');
      return path === '' || files.includes(path) || files.some((f) => f.startsWith(`${path.replace(/\/$/, '')}/`));
    };
    const relative = (a: string): boolean => !/^[a-z][a-z0-9+.-]*:/i.test(a) && !a.startsWith('#');
    // The source README does link to files that are not shipped (DEVELOPERS.md, demo/): the rewrite is needed.
    assert.ok(
      addresses(readme)
        .filter(relative)
        .some((a) => !shipped(a)),
    );
    const broken = addresses(packagedReadme(readme, files, repository, manifest.version))
      .filter(relative)
      .filter((a) => !shipped(a));
    assert.deepEqual(broken, []);
  });

  it('names the repository and where to report problems in package.json', () => {
    assert.match(manifest.repository?.url ?? '', /^https:\/\/\S+\.git$/);
    assert.match(manifest.bugs?.url ?? '', /^https:\/\/\S+\/issues$/);
    assert.ok(manifest.bugs!.url!.startsWith(repositoryAddress(manifest)!));
  });
});

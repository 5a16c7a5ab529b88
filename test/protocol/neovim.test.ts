import { strict as assert } from 'node:assert';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

// A real third-party LSP client: Neovim's built-in one (Debian's `neovim`,
// installed by .ci/run), headless, asks the bundled server for a hover.
describe('the stdio server in Neovim', function () {
  this.timeout(60000);

  it('answers a hover on a levels block with its results', () => {
    const which = spawnSync('nvim', ['--version'], { encoding: 'utf8' });
    assert.equal(which.status, 0, "nvim is missing: install Debian's neovim (.ci/run does)");
    const dir = mkdtempSync(join(tmpdir(), 'bm-nvim-'));
    const note = join(dir, 'note.md');
    writeFileSync(
      note,
      '# Run\n\n```levels\nid: cell-B run 7\nsystem: 13C\nfield: 7.05 T\nlattice: 1.4 K\npolarization: 0.312 ± 0.010\n```\n',
    );
    const out = join(dir, 'hover.txt');
    // Keep Neovim's logs, shada and state inside the temporary folder.
    for (const d of ['data', 'state', 'cache', 'config']) mkdirSync(join(dir, d));
    const r = spawnSync(
      'timeout',
      [
        '50',
        'nvim',
        '--headless',
        '-u',
        'NONE',
        '-i',
        'NONE',
        '-n',
        '-c',
        `luafile ${resolve('test/protocol/nvim/hover.lua')}`,
      ],
      {
        encoding: 'utf8',
        env: {
          ...process.env,
          BM_SERVER: resolve('dist/server.js'),
          BM_NOTE: note,
          BM_LINE: '5',
          BM_CHAR: '2',
          BM_OUT: out,
          XDG_DATA_HOME: join(dir, 'data'),
          XDG_STATE_HOME: join(dir, 'state'),
          XDG_CACHE_HOME: join(dir, 'cache'),
          XDG_CONFIG_HOME: join(dir, 'config'),
          HOME: dir,
        },
      },
    );
    const text = readFileSync(out, 'utf8');
    assert.equal(r.status, 0, `nvim exited ${r.status}: ${text} ${r.stderr}`);
    assert.match(text, /cell\\?-B run 7/); // Markdown-escaped in the hover
    assert.match(text, /5\.61 ± 0\.19 mK/);
    assert.match(text, /normal/);
  });
});

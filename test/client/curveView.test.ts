import { strict as assert } from 'node:assert';
import { altText, fileStem, imageLink, pngBytes } from '../../src/client/exportNames';
import { contentSecurityPolicy, escapeHtml, newNonce, viewHtml } from '../../src/client/viewHtml';

/** A URI as VS Code splits it, enough for the link rules. */
function uri(s: string): { scheme: string; authority: string; path: string; toString(): string } {
  const u = new URL(s);
  return {
    scheme: u.protocol.slice(0, -1),
    authority: u.host,
    path: decodeURIComponent(u.pathname),
    toString: () => s,
  };
}

describe('curve view page shell', () => {
  it('builds a strict policy: nothing by default, scripts by nonce only, resources from the webview origin', () => {
    const csp = contentSecurityPolicy('https://file+.vscode-resource.vscode-cdn.net', 'abc=');
    assert.equal(
      csp,
      "default-src 'none'; img-src https://file+.vscode-resource.vscode-cdn.net data:; style-src https://file+.vscode-resource.vscode-cdn.net 'nonce-abc='; script-src 'nonce-abc='; font-src https://file+.vscode-resource.vscode-cdn.net; form-action 'none'; base-uri 'none'",
    );
  });

  it('escapes every interpolated value and has no inline handlers or inline script', () => {
    const html = viewHtml({
      cspSource: 'https://x"><script>',
      scriptUri: 'https://x/view.js?a=1&b="2"',
      styleUri: 'https://x/view.css',
      nonce: 'n0nce',
    });
    assert.ok(!html.includes('"><script>'), 'attribute break-out escaped');
    assert.ok(html.includes('a=1&amp;b=&quot;2&quot;'));
    assert.doesNotMatch(html, /\son[a-z]+\s*=/i, 'no inline event handler');
    assert.doesNotMatch(html, /style\s*=/i, 'no style attribute');
    const scripts = [...html.matchAll(/<script([^>]*)>([\s\S]*?)<\/script>/g)];
    assert.equal(scripts.length, 1);
    assert.match(scripts[0]![1]!, /nonce="n0nce" src=/);
    assert.equal(scripts[0]![2], '', 'the script has no inline body');
    assert.match(html, /<canvas id="entropy-chart"/);
    assert.match(html, /<canvas id="beta-chart"/);
    assert.equal(escapeHtml(`<&>"'`), '&lt;&amp;&gt;&quot;&#39;');
  });

  it('draws a fresh 128-bit nonce each time', () => {
    const nonces = new Set(Array.from({ length: 50 }, newNonce));
    assert.equal(nonces.size, 50);
    for (const n of nonces) assert.equal(Buffer.from(n, 'base64').length, 16);
  });
});

describe('curve view export names', () => {
  it('makes a Markdown image link relative to the note, escaping the alt text', () => {
    assert.equal(
      imageLink(uri('file:///lab/notes/week 11.md'), uri('file:///lab/notes/cell-b-run-7-curve.png'), 'cell-B run 7'),
      '![cell-B run 7](cell-b-run-7-curve.png)',
    );
    assert.equal(
      imageLink(uri('file:///lab/notes/a.md'), uri('file:///lab/images/x.png'), 'a [b]'),
      '![a \\[b\\]](../images/x.png)',
    );
    assert.equal(
      imageLink(uri('file:///lab/a.md'), uri('file:///lab/my pics/x (1).png'), 'x'),
      '![x](<my pics/x (1).png>)',
    );
    assert.equal(
      imageLink(uri('file:///lab/a.md'), uri('vscode-remote://ssh/lab/x.png'), 'x'),
      '![x](vscode-remote://ssh/lab/x.png)',
    );
  });

  it('turns any block id into a safe file-name stem', () => {
    assert.equal(fileStem('cell-B run 7'), 'cell-b-run-7');
    assert.equal(fileStem('<img src=x onerror=alert(1)>'), 'img-src-x-onerror-alert-1');
    assert.equal(fileStem('../../etc/passwd'), 'etc-passwd');
    assert.equal(fileStem('¹³C'), '13c');
    assert.equal(fileStem('***'), 'block');
    assert.equal(altText('line\nbreak'), 'line break');
  });

  it('decodes the PNG bytes of a data URL', () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    assert.deepEqual(Buffer.from(pngBytes(`data:image/png;base64,${png.toString('base64')}`)), png);
  });
});

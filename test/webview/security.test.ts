import { strict as assert } from 'node:assert';
import { openView, usePageServer, type ViewPage } from './harness';
import { curveOf, payloadOf, render, TWO_LEVEL, XSS_ID } from './payloads';
import { LIGHT } from './themes';

// Page-side names for the functions passed to the page (this module is typed without the DOM library).
interface Violation {
  directive: string;
  blocked: string;
}
declare const window: { __test: { violations: Violation[] }; __injected?: boolean; __fromNote?: boolean };
declare const document: {
  createElement(tag: string): { textContent: string | null };
  head: { append(e: unknown): void };
  querySelectorAll(s: string): { length: number };
  getElementById(id: string): { textContent: string | null; hidden: boolean } | null;
  querySelector(s: string): { getAttribute(a: string): string | null } | null;
};

describe('curve view security (headless Chromium)', function () {
  this.timeout(60000);
  const pages = usePageServer();
  let view: ViewPage;
  const requests: string[] = [];
  let dialogs = 0;

  before(async () => {
    view = await openView(pages.browser, pages.origin, LIGHT);
    view.page.on('request', (r) => requests.push(r.url()));
    view.page.on('dialog', (d) => {
      dialogs++;
      void d.dismiss();
    });
  });

  it('shows a block id made of markup as text, in the title and in the pin list', async () => {
    const evil = curveOf(`id: '${XSS_ID}'\ngap: 10 K\npopulations: [0.7, 0.3]`);
    assert.equal(evil.id, XSS_ID);
    await view.post(render(evil, [{ key: 'k1', payload: evil }]));
    await view.drawn(1);
    const seen = await view.page.evaluate(() => ({
      title: document.getElementById('block-title')!.textContent,
      pins: document.getElementById('pin-list')!.textContent,
      images: document.querySelectorAll('img').length,
    }));
    assert.equal(seen.title, XSS_ID);
    assert.ok(seen.pins!.includes(XSS_ID), seen.pins!);
    assert.equal(seen.images, 0, 'no <img> element was created');
    assert.equal(dialogs, 0, 'no alert ran');
  });

  it('shows an error message with markup in it as text', async () => {
    const problem = payloadOf(`id: '${XSS_ID}'\nsystem: 13C\nfield: 7.05 MT\npolarization: 0.3`);
    assert.equal(problem.kind, 'problem');
    await view.post(render({ ...problem, message: `<script>window.__fromNote = true</script>${problem.message}` }));
    await view.page.waitForFunction(() => !document.getElementById('problem')!.hidden);
    const text = await view.page.evaluate(() => document.getElementById('problem')!.textContent);
    assert.ok(text!.startsWith('<script>window.__fromNote = true</script>'), text!);
    assert.equal(await view.page.evaluate(() => window.__fromNote), undefined);
    assert.equal(await view.page.evaluate(() => document.querySelectorAll('#problem script').length), 0);
  });

  it('loads nothing but its own script and stylesheet from the page server, with no CSP violation', async () => {
    await view.post(render(curveOf(TWO_LEVEL)));
    await view.drawn(2);
    assert.deepEqual(await view.page.evaluate(() => window.__test.violations), []);
    assert.ok(
      requests.every((u) => u.startsWith(`${pages.origin}/`)),
      requests.join('\n'),
    );
  });

  it('blocks an injected inline script and reports the violation', async () => {
    const csp = await view.page.evaluate(() =>
      document.querySelector('meta[http-equiv="Content-Security-Policy"]')!.getAttribute('content'),
    );
    assert.match(csp!, /default-src 'none'/);
    assert.match(csp!, new RegExp(`script-src 'nonce-${pages.nonces.at(-1)!.replace(/[+/=]/g, '\\$&')}'`));
    assert.doesNotMatch(csp!, /unsafe-inline|unsafe-eval/);
    await view.page.evaluate(() => {
      const s = document.createElement('script');
      s.textContent = 'window.__injected = true';
      document.head.append(s);
    });
    await view.page.waitForFunction(() => window.__test.violations.length > 0);
    const violations = await view.page.evaluate(() => window.__test.violations);
    assert.equal(await view.page.evaluate(() => window.__injected), undefined, 'the inline script did not run');
    assert.match(violations[0]!.directive, /^script-src/);
    assert.equal(violations[0]!.blocked, 'inline');
  });

  it('gives every page load a fresh nonce', async () => {
    const before = pages.nonces.length;
    await view.page.reload();
    await view.page.waitForFunction(
      () => document.querySelector('meta[http-equiv="Content-Security-Policy"]') !== null,
    );
    assert.equal(pages.nonces.length, before + 1);
    assert.equal(new Set(pages.nonces).size, pages.nonces.length, 'no nonce repeats');
    assert.match(pages.nonces.at(-1)!, /^[A-Za-z0-9+/]{22}==$/, '128 bits, base64');
  });
});

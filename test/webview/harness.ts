/**
 * Loads the curve view's page in headless Chromium (Debian's `chromium`,
 * driven by playwright-core) from a small HTTP server on 127.0.0.1 that
 * serves exactly what the extension would: the HTML of `viewHtml()`, the
 * bundled script and the stylesheet. Network access is cut to loopback.
 */
import { existsSync, readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { chromium, type Browser, type Page } from 'playwright-core';
import { newNonce, viewHtml } from '../../src/client/viewHtml';
import { standInScript } from './standIn';
import type { TestTheme } from './themes';

// Page-side names for the functions passed to the page (this module is typed without the DOM library).
declare const window: { __test: { posted: { type: string }[] }; postMessage(m: unknown, target: string): void };
declare const document: { body: { dataset: Record<string, string | undefined> } };

/** Debian's Chromium (installed by .ci/run). */
export const CHROMIUM = '/usr/bin/chromium';

const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--host-resolver-rules=MAP * ~NOTFOUND , EXCLUDE localhost , EXCLUDE 127.0.0.1',
];

/** The files the page may load, by URL path. */
const FILES: Readonly<Record<string, { path: string; type: string }>> = {
  '/dist/media/view.js': { path: 'dist/media/view.js', type: 'text/javascript' },
  '/media/view.css': { path: 'media/view.css', type: 'text/css' },
};

/** The page server: every request for `/` gets a fresh nonce, as every render in VS Code does. */
export async function startServer(): Promise<{ origin: string; server: Server; nonces: string[] }> {
  if (!existsSync('dist/media/view.js'))
    throw new Error('dist/media/view.js is missing: run `npm run build` first (npm test does)');
  if (!existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: install Debian's chromium (.ci/run does)`);
  const nonces: string[] = [];
  let origin = '';
  const server = createServer((req, res) => {
    const path = (req.url ?? '/').split('?')[0]!;
    if (path === '/') {
      const nonce = newNonce();
      nonces.push(nonce);
      const html = viewHtml({
        cspSource: origin,
        scriptUri: `${origin}/dist/media/view.js`,
        styleUri: `${origin}/media/view.css`,
        nonce,
      });
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(html);
      return;
    }
    const file = FILES[path];
    if (!file) return void res.writeHead(404).end();
    res.writeHead(200, { 'content-type': file.type }).end(readFileSync(file.path));
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return { origin, server, nonces };
}

/** Starts Chromium. */
export function launch(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, args: ARGS, headless: true });
}

/** A loaded view page and what it recorded. */
export interface ViewPage {
  readonly page: Page;
  readonly console: string[];
  /** Posts a host → view message (as VS Code's `webview.postMessage` would). */
  /** A message as the host would post it; deliberately any value, so that tests can send malformed ones too. */
  post(message: unknown): Promise<void>;
  /** Waits until `body[data-drawn]` reaches `n`. */
  drawn(n: number): Promise<void>;
  /** Messages the page posted to the host. */
  posted(): Promise<{ type: string; [k: string]: unknown }[]>;
}

/** Opens the page with the stand-in host and the given theme, and waits for its `ready`. */
export async function openView(browser: Browser, origin: string, theme: TestTheme): Promise<ViewPage> {
  const page = await browser.newPage({ viewport: { width: 1100, height: 900 } });
  const consoleLines: string[] = [];
  page.on('console', (m) => consoleLines.push(`${m.type()}: ${m.text()}`));
  page.on('pageerror', (e) => consoleLines.push(`pageerror: ${e.message}`));
  await page.addInitScript(standInScript(theme));
  await page.goto(`${origin}/`);
  // Functions, not strings: the page's CSP forbids eval, which string predicates need.
  await page.waitForFunction(() => window.__test.posted.some((m) => m.type === 'ready'));
  return {
    page,
    console: consoleLines,
    post: async (message) => void (await page.evaluate((m) => window.postMessage(m, '*'), message)),
    async drawn(n) {
      try {
        await page.waitForFunction((k) => Number(document.body.dataset.drawn) >= k, n, { timeout: 15000 });
      } catch (err) {
        throw new Error(
          `draw ${n} did not happen: ${(err as Error).message}\npage console:\n${consoleLines.join('\n')}`,
          { cause: err },
        );
      }
    },
    posted: () => page.evaluate(() => window.__test.posted),
  };
}

/** What a suite gets from {@link usePageServer}, filled in by the `before` hook it registers. */
export interface PageServer {
  browser: Browser;
  origin: string;
  /** The nonces of every page load so far. */
  nonces: string[];
}

/**
 * Starts the page server and Chromium before the calling suite's tests and
 * stops both after them. Call it first in the `describe`, so its `before`
 * runs before the suite's own.
 */
export function usePageServer(): PageServer {
  const pages = {} as PageServer;
  let server: Server | undefined;
  before(async () => {
    const started = await startServer();
    server = started.server;
    pages.origin = started.origin;
    pages.nonces = started.nonces;
    pages.browser = await launch();
  });
  after(async () => {
    await pages.browser?.close();
    server?.close();
  });
  return pages;
}

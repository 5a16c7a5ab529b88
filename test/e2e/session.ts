/**
 * One end-to-end session: the browser-hosted VS Code (code-server, installed
 * by scripts/editor-host.sh) with the packaged .vsix installed as a user
 * installs it, serving a copy of the demo notebook on 127.0.0.1, and Debian's
 * Chromium driven by playwright-core looking at it.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';

/** Where screenshots and logs of the e2e runs go (gitignored): one folder per host. */
export function outputDir(version: host.Version): string {
  return join(host.ROOT, 'test-output', version === 'oldest' ? 'e2e' : `e2e-${version}`);
}
/** The output folder of each session's page. */
const pageOutput = new WeakMap<Page, string>();

/** A running session. */
export interface Session {
  readonly page: Page;
  readonly context: BrowserContext;
  /** The workspace folder the editor has open: a copy of demo/. */
  readonly workspace: string;
  /** The extension folder the .vsix was installed into. */
  readonly installed: string;
  /** Requests that were aimed beyond 127.0.0.1 (none are expected). */
  readonly external: string[];
  /** Uncaught errors of the workbench page. */
  readonly pageErrors: string[];
  readonly serverLog: string;
  /** The host it runs in. */
  readonly version: host.Version;
  /** Where its screenshots and logs go. */
  readonly output: string;
  close(): Promise<void>;
}

let packaged: string | null = null;

/**
 * The .vsix of this checkout, built once per process by `npm run package`'s
 * script (minified bundles in a staging copy, then vsce).
 */
export function packagedVsix(): string {
  if (packaged) return packaged;
  const vsix = join(host.ROOT, 'out', 'e2e', 'boltzmark-e2e.vsix');
  const r = spawnSync(process.execPath, [join(host.ROOT, 'scripts', 'package.mjs'), '--out', vsix], {
    encoding: 'utf8',
  });
  if (r.status !== 0)
    throw new Error(`packaging the .vsix failed (exit ${r.status ?? r.signal}):\n${r.stdout}${r.stderr}`);
  packaged = vsix;
  return vsix;
}

/** What a request may address: the server, and what the page makes itself. */
function isLocal(url: string): boolean {
  return /^(http:\/\/127\.0\.0\.1[:/]|data:|blob:|about:|vscode-)/.test(url);
}

/**
 * Webview resources have https://*.vscode-resource.vscode-cdn.net URLs, but
 * the webview's service worker answers them from the server.
 */
function isWebviewResource(url: string): boolean {
  return /^https:\/\/[^/]*\.vscode-resource\.vscode-cdn\.net\//.test(url);
}

/**
 * Starts a session: host ready (installed if missing), .vsix packed and
 * installed into a fresh extensions folder, server up, workbench loaded.
 * `settings` are added to the user settings (a theme, for instance);
 * `version` picks the host (default: BOLTZMARK_VSCODE, else the oldest).
 */
export async function startSession(options: {
  name: string;
  version?: host.Version;
  settings?: Record<string, unknown>;
  viewport?: { width: number; height: number };
}): Promise<Session> {
  const version = options.version ?? host.chosenVersion();
  const output = outputDir(version);
  host.ensureHost({ echo: false, version });
  const vsix = packagedVsix();
  const run = host.makeRun('bm-e2e-', version);
  const workspace = join(run.dir, 'demo');
  cpSync(join(host.ROOT, 'demo'), workspace, { recursive: true });
  host.writeUserSettings(run, {
    'editor.hover.delay': 200,
    'editor.minimap.enabled': false,
    'editor.stickyScroll.enabled': false,
    'workbench.colorTheme': 'Default Dark Modern',
    ...options.settings,
  });
  const installed = host.installVsix(run, vsix);
  mkdirSync(output, { recursive: true });
  const serverLog = join(output, `${options.name}-server.log`);
  const server = await host.startServer(run, { workspace, logFile: serverLog });
  let browser: Browser | undefined;
  const close = async (): Promise<void> => {
    await browser?.close().catch(() => undefined);
    await server.stop();
    run.remove();
  };
  try {
    browser = await chromium.launch({
      executablePath: host.CHROMIUM,
      args: [...host.CHROMIUM_ARGS],
      env: run.env as Record<string, string>,
    });
    const context = await browser.newContext({ viewport: options.viewport ?? { width: 1280, height: 800 } });
    const page = await context.newPage();
    pageOutput.set(page, output);
    page.setDefaultTimeout(30000);
    const external: string[] = [];
    const pageErrors: string[] = [];
    context.on('request', (r) => {
      if (!isLocal(r.url()) && !isWebviewResource(r.url())) external.push(r.url());
    });
    context.on('response', (r) => {
      if (isWebviewResource(r.url()) && !r.fromServiceWorker())
        external.push(`${r.url()} (not from the webview's service worker)`);
    });
    page.on('pageerror', (e) => pageErrors.push(String(e).slice(0, 400)));
    await page.goto(server.open);
    await page.locator('.monaco-workbench').waitFor({ timeout: 90000 });
    return { page, context, workspace, installed, external, pageErrors, serverLog, version, output, close };
  } catch (err) {
    await close();
    throw err;
  }
}

/** The bytes of a demo note, as committed and as the session's copy now holds them. */
export function noteBytes(session: Session, name: string): { original: Buffer; now: Buffer } {
  return { original: readFileSync(join(host.ROOT, 'demo', name)), now: readFileSync(join(session.workspace, name)) };
}

/**
 * A folder inside the served workspace for what the steps save through the
 * editor's dialogs (exports, CSV files): inside, so the dialog can reach it;
 * apart from the notes, so no note is touched. The session's copy of demo/
 * and this folder go when the session closes.
 */
export function scratchFolder(session: Session): string {
  const dir = join(session.workspace, 'e2e-output');
  mkdirSync(dir, { recursive: true });
  return dir;
}

/** Saves a screenshot of the whole page in its session's output folder (test-output/e2e, e2e-newest). */
export async function shot(page: Page, name: string): Promise<string> {
  const output = pageOutput.get(page) ?? outputDir(host.chosenVersion());
  mkdirSync(output, { recursive: true });
  const file = join(output, `${name}.png`);
  await page.screenshot({ path: file });
  return file;
}

/** Writes a text file next to a session's screenshots (what a failing step saw). */
export function note(session: Session, name: string, text: string): void {
  mkdirSync(session.output, { recursive: true });
  writeFileSync(join(session.output, name), text);
}

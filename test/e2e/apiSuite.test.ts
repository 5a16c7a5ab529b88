import { strict as assert } from 'node:assert';
import { appendFileSync, cpSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { format } from 'node:util';
import { chromium, type Browser } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { bundleIntegration } from '../integration/bundle';
import { outputDir } from './session';

// The API-level suites of test/integration (the ones `npm run test:desktop`
// runs in desktop VS Code) run here inside the browser-hosted server's
// extension host: the workbench URL's `payload` carries
// extensionDevelopmentPath and extensionTestsPath (as vscode-remote URIs),
// the server's extension host loads the checkout as the development
// extension and runs the suites with mocha, and the workbench reports the
// exit code through window.codeAutomationExit, which the page exposes here.
for (const version of host.versionsToTest()) apiSuites(version);

function apiSuites(version: host.Version): void {
  describe(`API-level suites inside the extension host of ${host.TITLES[version]}, browser-hosted`, function () {
    this.timeout(10 * 60 * 1000);

    it('pass', async () => {
      host.ensureHost({ echo: false, version });
      const tests = await bundleIntegration();
      const OUTPUT = outputDir(version);
      const run = host.makeRun('bm-api-', version);
      const workspace = join(run.dir, 'demo');
      cpSync(join(host.ROOT, 'demo'), workspace, { recursive: true });
      host.writeUserSettings(run);
      // The extension host inherits the server's environment.
      run.env.BOLTZMARK_DEMO_ORIGINAL = join(host.ROOT, 'demo');
      mkdirSync(OUTPUT, { recursive: true });
      const server = await host.startServer(run, {
        workspace,
        logFile: join(OUTPUT, 'api-suite-server.log'),
        extensionTests: true,
      });
      let browser: Browser | undefined;
      const log: string[] = [];
      try {
        browser = await chromium.launch({
          executablePath: host.CHROMIUM,
          args: [...host.CHROMIUM_ARGS],
          env: run.env as Record<string, string>,
        });
        const page = await browser.newPage();
        // The workbench's console, as it comes (what to read when the host never reports).
        const consoleLog = join(OUTPUT, 'api-suite-console.log');
        writeFileSync(consoleLog, '');
        page.on('console', (m) => appendFileSync(consoleLog, `[${m.type()}] ${m.text()}\n`));
        let reportExit: (code: number) => void = () => undefined;
        const exit = new Promise<number>((resolve) => (reportExit = resolve));
        await page.exposeFunction('codeAutomationLog', (_type: string, args: unknown[]) =>
          log.push(format(...(Array.isArray(args) ? args : [args]))),
        );
        await page.exposeFunction('codeAutomationExit', (code: number) => reportExit(code));
        const remote = (path: string): string => `vscode-remote://127.0.0.1:${server.port}${path}`;
        const payload = JSON.stringify([
          ['extensionDevelopmentPath', remote(host.ROOT)],
          ['extensionTestsPath', remote(tests)],
        ]);
        await page.goto(`${server.open}&payload=${encodeURIComponent(payload)}`);
        // The window title names the folder once the workbench has set it; a workbench that took the
        // payload marks itself as an extension development host there (both versions do). One that
        // ignored it would never run the tests: say so now instead of at the deadline.
        await page.waitForFunction("document.title.includes('demo')", undefined, { timeout: 120000 });
        const title = await page.title();
        assert.ok(
          title.includes('[Extension Development Host]'),
          `the workbench ignored the payload's extension development and test paths (window title "${title}")`,
        );
        // A deadline (not a pause): if the host never reports, fail and still clean up.
        let timer: NodeJS.Timeout | undefined;
        const deadline = new Promise<never>((_, reject) => {
          timer = setTimeout(
            () =>
              reject(
                new Error(`no exit code from the extension host within 5 minutes; its log so far:\n${log.join('\n')}`),
              ),
            5 * 60 * 1000,
          );
        });
        const code = await Promise.race([exit, deadline]).finally(() => clearTimeout(timer));
        const suiteLog = log.filter((l) => !/^(Ignoring fetching|Updating additional builtin)/.test(l)).join('\n');
        writeFileSync(join(OUTPUT, 'api-suite.log'), `${suiteLog}\n`);
        assert.match(suiteLog, /\d+ passed, 0 failed/, `the suites did not all pass:\n${suiteLog}`);
        assert.equal(code, 0, `the extension host exited with ${code}:\n${suiteLog}`);
      } finally {
        await browser?.close().catch(() => undefined);
        await server.stop();
        run.remove();
      }
    });
  });
}

/**
 * `npm run test:desktop`: the API-level suites in desktop VS Code, through
 * @vscode/test-electron. It downloads VS Code (the oldest supported, 1.100.x,
 * unless VSCODE_TEST_VERSION says otherwise) into out/vscode-test/ on first use,
 * so it needs access to update.code.visualstudio.com; CI machines without it
 * run the same suites in the browser-hosted VS Code instead (runInHost.ts,
 * part of `npm test`). A headless Linux machine also needs a display
 * (xvfb-run).
 */
import { cpSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runTests } from '@vscode/test-electron';
import { bundleIntegration, ROOT } from './bundle';

async function main(): Promise<void> {
  const extensionTestsPath = await bundleIntegration();
  // The suites work on a copy of the demo, never on the committed notes.
  const scratch = mkdtempSync(join(tmpdir(), 'boltzmark-desktop-'));
  const workspace = join(scratch, 'demo');
  cpSync(join(ROOT, 'demo'), workspace, { recursive: true });
  try {
    await runTests({
      version: process.env.VSCODE_TEST_VERSION ?? '1.100.3',
      cachePath: join(ROOT, 'out', 'vscode-test'),
      extensionDevelopmentPath: ROOT,
      extensionTestsPath,
      extensionTestsEnv: { BOLTZMARK_DEMO_ORIGINAL: join(ROOT, 'demo') },
      launchArgs: [
        workspace,
        '--disable-extensions',
        '--skip-welcome',
        '--skip-release-notes',
        '--disable-workspace-trust',
        '--user-data-dir',
        join(scratch, 'user-data'),
      ],
    });
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}

main().catch((err) => {
  console.error(`desktop integration tests failed: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});

/**
 * Entry point VS Code's extension host loads with `--extensionTestsPath`:
 * runs the API-level suites (suite/*.itest.js, bundled beside this file by
 * build.mjs) with mocha inside the extension host and resolves when they pass.
 * The suites are not `*.test.ts`: the root mocha run (plain Node, no `vscode`
 * module) must not pick them up.
 */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import Mocha from 'mocha';

/** Called by the extension host; a rejection makes the host exit non-zero. */
export function run(): Promise<void> {
  const mocha = new Mocha({ ui: 'bdd', color: false, timeout: 60000, reporter: 'spec' });
  const suites = join(__dirname, 'suite');
  for (const f of readdirSync(suites)
    .filter((n) => n.endsWith('.itest.js'))
    .sort())
    mocha.addFile(join(suites, f));
  return new Promise((resolve, reject) => {
    mocha.run((failures) => {
      // The same closing line as the main test run, for whoever reads the log.
      const passed = mocha.suite.total() - failures;
      console.log(`${passed} passed, ${failures} failed`);
      if (failures > 0) reject(new Error(`${failures} integration test(s) failed`));
      else resolve();
    });
  });
}

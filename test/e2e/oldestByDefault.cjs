// `npm run test:e2e` (test/e2e/mocharc.json) runs the e2e suites in the oldest
// supported VS Code unless BOLTZMARK_VSCODE names another host (or "both");
// `npm test` loads the suites without this file and so runs them in both.
'use strict';
if (!process.env.BOLTZMARK_VSCODE) process.env.BOLTZMARK_VSCODE = 'oldest';

import assert from 'node:assert/strict';
import { ESLint } from 'eslint';

// The layer rules of docs/architecture.md, as eslint.config.mjs writes them: each case lints a line of code as if it
// stood in a file of that folder (an existing file's path, so the type-aware rules find it in the project).
const cases: readonly { file: string; code: string; allowed: boolean }[] = [
  { file: 'src/core/codes.ts', code: "import * as vscode from 'vscode';", allowed: false },
  { file: 'src/core/codes.ts', code: "import { readFileSync } from 'node:fs';", allowed: false },
  { file: 'src/core/codes.ts', code: "import { readFileSync } from 'fs';", allowed: false },
  { file: 'src/core/codes.ts', code: "import { TextDocuments } from 'vscode-languageserver/node';", allowed: false },
  { file: 'src/core/codes.ts', code: "import { H } from './quantities/constants';", allowed: true },
  { file: 'src/core/codes.ts', code: "import { parseDocument } from 'yaml';", allowed: true },
  { file: 'src/server/notes.ts', code: "import * as vscode from 'vscode';", allowed: false },
  { file: 'src/server/notes.ts', code: "import { readFileSync } from 'node:fs';", allowed: true },
  { file: 'src/cli/main.ts', code: "import { createConnection } from 'vscode-languageserver/node';", allowed: false },
  { file: 'src/client/commands.ts', code: "import { hover } from '../server/features/hover';", allowed: false },
  { file: 'src/client/commands.ts', code: "import { CurveDataRequest } from '../shared/protocol';", allowed: true },
  { file: 'src/shared/protocol.ts', code: "import * as vscode from 'vscode';", allowed: false },
  { file: 'media/src/view.ts', code: "import { readFileSync } from 'node:fs';", allowed: false },
];

describe('the layer rules (ESLint no-restricted-imports)', function () {
  this.timeout(120000);
  const eslint = new ESLint();
  for (const c of cases) {
    it(`${c.allowed ? 'allows' : 'refuses'} ${c.code} in ${c.file}`, async () => {
      const [result] = await eslint.lintText(`${c.code}\nexport const probe = 1;\n`, { filePath: c.file });
      const layer = result!.messages.filter((m) => m.ruleId === 'no-restricted-imports');
      assert.equal(layer.length === 0, c.allowed, JSON.stringify(layer.map((m) => m.message)));
    });
  }
});

// The floor the command line's report is measured against (bench/cli.ts): a
// script that does the least any reader of these notes must do, in a fresh
// process: walk the folder, read each note, find the `levels` fences (line
// by line) and give each body to the `yaml` package's parseDocument.
// Prints nothing but the number of blocks parsed.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseDocument } from 'yaml';

const dir = process.argv[2];
let blocks = 0;
for (const name of readdirSync(dir).sort()) {
  if (!name.endsWith('.md')) continue;
  const lines = readFileSync(join(dir, name), 'utf8').split('\n');
  let body = null;
  for (const line of lines) {
    if (body === null) {
      if (line.startsWith('```levels')) body = [];
    } else if (line.startsWith('```')) {
      parseDocument(body.join('\n'));
      blocks++;
      body = null;
    } else body.push(line);
  }
}
process.stdout.write(`${blocks}\n`);

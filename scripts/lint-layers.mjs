// Enforces the layer invariants of docs/architecture.md by reading imports:
// src/core imports neither vscode, the LSP packages nor Node built-ins;
// src/server never imports vscode; src/cli never imports vscode or the LSP packages;
// nothing reachable from src/core/packageFree.ts imports a package.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { builtinModules } from 'node:module';

const builtins = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));
const rules = [
  {
    dir: 'src/core',
    forbid: (m) =>
      m === 'vscode' ||
      m.startsWith('vscode-languageserver') ||
      m.startsWith('vscode-languageclient') ||
      m.startsWith('vscode-jsonrpc') ||
      builtins.has(m) ||
      builtins.has(m.split('/')[0]),
  },
  { dir: 'src/server', forbid: (m) => m === 'vscode' || m.startsWith('vscode-languageclient') },
  { dir: 'src/cli', forbid: (m) => m === 'vscode' || m.startsWith('vscode-language') },
];

function* files(dir) {
  let entries = [];
  try {
    entries = readdirSync(dir);
  } catch {
    return;
  }
  for (const e of entries) {
    const p = join(dir, e);
    if (statSync(p).isDirectory()) yield* files(p);
    else if (/\.(ts|js|mjs)$/.test(p)) yield p;
  }
}

const importRe =
  /(?:^|\n)\s*(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|require\(\s*['"]([^'"]+)['"]\s*\)|import\(\s*['"]([^'"]+)['"]\s*\)|(?:^|\n)\s*import\s+['"]([^'"]+)['"]/g;
let bad = 0;
for (const { dir, forbid } of rules) {
  for (const f of files(dir)) {
    const text = readFileSync(f, 'utf8');
    for (const m of text.matchAll(importRe)) {
      const mod = m[1] ?? m[2] ?? m[3] ?? m[4];
      if (mod && forbid(mod)) {
        console.error(`${f}: imports '${mod}', which ${dir} must not`);
        bad++;
      }
    }
  }
}
// src/core/packageFree.ts promises a core without packages (the activation bundle and the
// webview rely on it): follow its relative imports and refuse any bare one.
const seen = new Set();
const queue = ['src/core/packageFree.ts'];
while (queue.length) {
  const f = queue.pop();
  if (seen.has(f)) continue;
  seen.add(f);
  const text = readFileSync(f, 'utf8');
  for (const m of text.matchAll(importRe)) {
    const mod = m[1] ?? m[2] ?? m[3] ?? m[4];
    // Type-only imports are erased before bundling: they bring no code along.
    if (!mod || /^\s*(import|export)\s+type\s/.test(m[0])) continue;
    if (!mod.startsWith('.')) {
      console.error(
        `${f}: imports '${mod}', but it is reachable from src/core/packageFree.ts, which must import no package`,
      );
      bad++;
      continue;
    }
    const base = join(dirname(f), mod);
    const next = [`${base}.ts`, join(base, 'index.ts')].find((c) => existsSync(c));
    if (next) queue.push(next);
  }
}

if (bad) {
  console.error(`layer check: ${bad} forbidden import(s)`);
  process.exit(1);
}
console.log('layer check: ok');

// What ESLint cannot express: everything reachable from src/core/packageFree.ts
// (the activation bundle's and the webview's way into the core) must import no
// package at all, however many relative imports away. The per-folder layer rules
// (core, shared, server, cli, client, media) are `no-restricted-imports` rules in
// eslint.config.mjs.
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

const importRe =
  /(?:^|\n)\s*(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|require\(\s*['"]([^'"]+)['"]\s*\)|import\(\s*['"]([^'"]+)['"]\s*\)|(?:^|\n)\s*import\s+['"]([^'"]+)['"]/g;
let bad = 0;
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
  console.error(`reachability check: ${bad} forbidden import(s)`);
  process.exit(1);
}
console.log('reachability check: ok');

/**
 * Bundles the integration suites for the extension host:
 * out/integration/index.js and out/integration/suite/*.itest.js. `vscode`
 * and `mocha` stay external: the host provides the first, the checkout's
 * node_modules the second.
 */
import * as esbuild from 'esbuild';
import { readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';

/** The checkout. */
export const ROOT = resolve(__dirname, '..', '..');
/** Where the bundles go. */
export const OUT = join(ROOT, 'out', 'integration');

/** Builds the bundles; returns the path to give `--extensionTestsPath`. */
export async function bundleIntegration(): Promise<string> {
  const suites = readdirSync(join(__dirname, 'suite')).filter((n) => n.endsWith('.itest.ts'));
  await esbuild.build({
    entryPoints: [
      { in: join(__dirname, 'index.ts'), out: 'index' },
      ...suites.map((n) => ({ in: join(__dirname, 'suite', n), out: `suite/${n.replace(/\.ts$/, '')}` })),
    ],
    outdir: OUT,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    sourcemap: 'inline',
    external: ['vscode', 'mocha'],
    logLevel: 'warning',
  });
  return join(OUT, 'index.js');
}

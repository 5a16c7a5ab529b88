// Bundles every entry point with esbuild. `--watch` rebuilds on change,
// `--production` minifies (used for packaging and the size budget).
import * as esbuild from 'esbuild';
import { existsSync } from 'node:fs';
import lazy from './lazyNoteReader.cjs';
import docsLink from './browserDocsLink.cjs';
import sources from './packageSources.cjs';

const { lazyNoteReader } = lazy;
const { browserDocsLink } = docsLink;
// Which build of `yaml`, the fitting packages and `debug` goes in (see packageSources.cjs).
const { packageSources } = sources;

const watch = process.argv.includes('--watch');
const production = process.argv.includes('--production');

/**
 * Node-side bundles: CLI, language server, the extension client, and the
 * client's note reader (`dist/noteReader.js`), which the client loads only
 * when the preview, the run log or a CSV export first needs it.
 */
const nodeEntries = [
  { in: 'src/cli/index.ts', out: 'dist/cli' },
  { in: 'src/server/index.ts', out: 'dist/server' },
  { in: 'src/server/spectrumWorker.ts', out: 'dist/spectrumWorker' },
  { in: 'src/client/extension.ts', out: 'dist/extension', plugins: [lazyNoteReader] },
  { in: 'src/client/noteReader.ts', out: 'dist/noteReader' },
].filter((e) => existsSync(e.in));

/** Browser-side bundles for the webview (an IIFE page script). */
const webEntries = [{ in: 'media/src/view.ts', out: 'dist/media/view' }].filter((e) => existsSync(e.in));

/**
 * The extension where VS Code runs in a browser: the extension (CommonJS, as
 * the web worker extension host loads it), its language server in a web worker
 * (an IIFE), and the notebook cell renderer (an ES module, as VS Code's
 * renderer extension point loads it). The browser platform makes esbuild
 * refuse any Node built-in; the server's docs link has a browser variant.
 */
const browserEntries = [
  { in: 'src/client/browser.ts', out: 'dist/web/extension', format: 'cjs', external: ['vscode'] },
  { in: 'src/server/browser.ts', out: 'dist/web/server', format: 'iife' },
  { in: 'src/client/cellRenderer.ts', out: 'dist/cellRenderer', format: 'esm' },
].filter((e) => existsSync(e.in));

const common = {
  bundle: true,
  minify: production,
  sourcemap: !production,
  logLevel: 'warning',
  legalComments: 'linked',
};

/** esbuild options per kind of bundle; each entry adds only what is its own. */
const NODE = { platform: 'node', target: 'node20', format: 'cjs', external: ['vscode'] };
const PAGE = { platform: 'browser', target: 'es2022', format: 'iife' };
const BROWSER = {
  platform: 'browser',
  target: 'es2022',
  // The language packages read `process.env` in a few debug paths; a browser has none.
  define: { 'process.env.NODE_ENV': production ? '"production"' : '"development"' },
  plugins: [browserDocsLink, ...packageSources],
};

const contexts = [];
const builds = [
  ...nodeEntries.map((e) => ({ ...NODE, in: e.in, out: e.out, plugins: [...packageSources, ...(e.plugins ?? [])] })),
  ...webEntries.map((e) => ({ ...PAGE, in: e.in, out: e.out, plugins: packageSources })),
  ...browserEntries.map((e) => ({ ...BROWSER, in: e.in, out: e.out, format: e.format, external: e.external ?? [] })),
];
for (const { in: entry, out, ...options } of builds)
  contexts.push(await esbuild.context({ ...common, ...options, entryPoints: [{ in: entry, out }], outdir: '.' }));

if (watch) {
  await Promise.all(contexts.map((c) => c.watch()));
  console.log('esbuild: watching');
} else {
  await Promise.all(contexts.map((c) => c.rebuild()));
  await Promise.all(contexts.map((c) => c.dispose()));
  console.log(`esbuild: built ${contexts.length} bundle(s)${production ? ' (minified)' : ''}`);
}

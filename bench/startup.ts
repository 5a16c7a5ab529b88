/**
 * Start-up and size:
 *
 * - bundle sizes: every entry point built minified with the options of
 *   `scripts/build.mjs --production`, into a temporary folder (dist/ is left
 *   alone), counting the JavaScript file only (legal comments are linked,
 *   in a file of their own); KB = 1,024 bytes;
 * - extension activation: there is no VS Code here, so what is measured is
 *   the time from `require()` of the minified extension bundle (with a
 *   stand-in `vscode` module that answers every call with another stand-in)
 *   through `activate()` to the moment the language client forks the server
 *   process, the last step of activation before the server's own start-up
 *   (which bench/lsp.ts measures separately). The fork is stopped there.
 */
import * as esbuild from 'esbuild';
import childProcess from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import Module from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { lazyNoteReader } from '../scripts/lazyNoteReader.cjs';
import { browserDocsLink } from '../scripts/browserDocsLink.cjs';
import { packageSources } from '../scripts/packageSources.cjs';
import { median, now } from './stats';

/** One bundle: its size and its limit (KB), or null when its entry point does not exist yet. */
export interface BundleSize {
  readonly name:
    | 'client'
    | 'note reader'
    | 'server'
    | 'webview'
    | 'cli'
    | 'web extension'
    | 'web worker server'
    | 'notebook cell renderer'
    | 'language client alone';
  readonly entry: string;
  readonly kb: number | null;
  readonly limitKb: number | null;
  /** How the limit is set, when it is not a fixed number. */
  readonly limitNote?: string;
}

/**
 * The limits, KB minified. The client bundle (what VS Code loads at
 * activation) is held to the language-client library it cannot do without:
 * at most {@link CLIENT_OVER_FLOOR} times `vscode-languageclient/node`
 * bundled alone with the same options, i.e. our own activation code and what
 * it pulls in stay under a tenth of that floor. A fixed 300 KB cannot hold:
 * the library alone minifies to about 430 KB.
 */
const LIMITS: Record<BundleSize['name'], number | null> = {
  client: null,
  // Raised from 450 KB when the run log and the preview came to follow references: the JCAMP-DX reader (about
  // 25 KB minified) and the book of runs (runs/runBook.ts) that resolves them across notes.
  'note reader': 480,
  // Raised from 600 KB when the trades' physics, the uncertainty budget and the full IUPAC isotope table came
  // in, and from 700 KB when spectrum files (the JCAMP-DX reader, the worker's launcher) and the workspace
  // index of runs (runs by reference) came in together.
  server: 740,
  webview: 450,
  cli: null,
  // The browser bundles carry the whole core (the web extension host loads one file, no lazy second bundle):
  // held to the note reader's and the server's limits plus the browser client library they add. Raised from
  // 850 KB when the run log came to read spectrum files itself (the JCAMP-DX reader, about 25 KB minified),
  // and from 880 KB when the preview came to follow references through the run log (the book of runs).
  'web extension': 910,
  'web worker server': 740,
  'notebook cell renderer': 450,
  'language client alone': null,
};
const CLIENT_OVER_FLOOR = 1.1;

/** The floor: the language client and nothing else. */
const FLOOR_SOURCE =
  "import { LanguageClient } from 'vscode-languageclient/node';\nexport const floor = LanguageClient;\n";

const ENTRIES: readonly {
  name: BundleSize['name'];
  entry: string;
  out: string;
  browser: boolean | 'cjs' | 'esm';
}[] = [
  { name: 'client', entry: 'src/client/extension.ts', out: 'extension', browser: false },
  { name: 'note reader', entry: 'src/client/noteReader.ts', out: 'noteReader', browser: false },
  { name: 'server', entry: 'src/server/index.ts', out: 'server', browser: false },
  { name: 'webview', entry: 'media/src/view.ts', out: 'media/view', browser: true },
  { name: 'cli', entry: 'src/cli/index.ts', out: 'cli', browser: false },
  { name: 'web extension', entry: 'src/client/browser.ts', out: 'web/extension', browser: 'cjs' },
  { name: 'web worker server', entry: 'src/server/browser.ts', out: 'web/server', browser: true },
  { name: 'notebook cell renderer', entry: 'src/client/cellRenderer.ts', out: 'cellRenderer', browser: 'esm' },
];

const COMMON = {
  bundle: true,
  minify: true,
  sourcemap: false,
  logLevel: 'warning' as const,
  legalComments: 'linked' as const,
  write: false as const,
};
const NODE = {
  platform: 'node' as const,
  target: 'node20',
  format: 'cjs' as const,
  external: ['vscode'],
  plugins: [...packageSources, lazyNoteReader],
};

/** Writes the JavaScript output of a build; returns its size in KB. */
function writeJs(result: esbuild.BuildResult): number {
  const js = result.outputFiles!.find((f) => f.path.endsWith('.js'))!;
  mkdirSync(dirname(js.path), { recursive: true });
  writeFileSync(js.path, js.contents);
  return js.contents.length / 1024;
}

/** Builds every bundle minified into `outdir` (as `scripts/build.mjs --production` does); returns their sizes. */
export async function measureSizes(outdir: string): Promise<BundleSize[]> {
  const sizes: BundleSize[] = [];
  const floorKb = writeJs(
    await esbuild.build({
      ...COMMON,
      ...NODE,
      plugins: [],
      stdin: { contents: FLOOR_SOURCE, resolveDir: resolve('.'), loader: 'ts' },
      outfile: join(outdir, 'floor', 'languageClient.js'),
    }),
  );
  for (const e of ENTRIES) {
    const limitKb = e.name === 'client' ? CLIENT_OVER_FLOOR * floorKb : LIMITS[e.name];
    const limitNote = e.name === 'client' ? `${CLIENT_OVER_FLOOR} × language client alone` : undefined;
    if (!existsSync(e.entry)) {
      sizes.push({ name: e.name, entry: e.entry, kb: null, limitKb, limitNote });
      continue;
    }
    const result = await esbuild.build({
      ...COMMON,
      entryPoints: [{ in: e.entry, out: e.out }],
      outdir,
      ...(e.browser
        ? {
            platform: 'browser' as const,
            target: 'es2022',
            format: e.browser === true ? ('iife' as const) : e.browser,
            external: ['vscode'],
            define: { 'process.env.NODE_ENV': '"production"' },
            plugins: [browserDocsLink, ...packageSources],
          }
        : NODE),
    });
    sizes.push({ name: e.name, entry: e.entry, kb: writeJs(result), limitKb, limitNote });
  }
  sizes.push({ name: 'language client alone', entry: 'vscode-languageclient/node', kb: floorKb, limitKb: null });
  return sizes;
}

/** A stand-in for any part of the `vscode` API: callable, constructible, every property another stand-in. */
function standIn(name: string, known: Record<string, unknown> = {}): unknown {
  const cache = new Map<PropertyKey, unknown>(Object.entries(known));
  const target = function standInFunction(): void {};
  return new Proxy(target, {
    get(_t, p) {
      if (p === 'then') return undefined; // not a promise
      if (p === Symbol.iterator) return function* empty(): Generator<never> {};
      if (p === Symbol.toPrimitive) return () => name;
      if (!cache.has(p)) cache.set(p, standIn(`${name}.${String(p)}`));
      return cache.get(p);
    },
    apply: () => standIn(`${name}()`),
    construct: () => standIn(`new ${name}`) as object,
  });
}

/**
 * The stand-in `vscode` module: a plain object (bundles copy its own keys)
 * with every top-level name the API declares (read from @types/vscode), each
 * a stand-in, and the oldest supported version.
 */
function vscodeModule(): Record<string, unknown> {
  const types = readFileSync(require.resolve('@types/vscode/index.d.ts'), 'utf8');
  const names = new Set(
    [...types.matchAll(/^\texport (?:namespace|class|enum|const|let|function) (\w+)/gm)].map((m) => m[1]!),
  );
  const api: Record<string, unknown> = {};
  for (const name of names) api[name] = standIn(`vscode.${name}`);
  api.version = '1.100.0';
  return api;
}

/** Activation of the minified extension in `outdir`, `repetitions` times in fresh module caches; median ms. */
export async function measureActivation(outdir: string, repetitions: number): Promise<number> {
  const file = resolve(outdir, 'extension.js');
  const vscode = vscodeModule();
  const mod = Module as unknown as { _load: (request: string, parent: unknown, isMain: boolean) => unknown };
  const load = mod._load;
  const fork = childProcess.fork;
  const stop = new Error('bench: activation reached the server fork');
  let forkedAt: number;
  mod._load = function (request, parent, isMain) {
    return request === 'vscode' ? vscode : load.call(this, request, parent, isMain);
  };
  childProcess.fork = (() => {
    forkedAt = now();
    throw stop;
  }) as typeof childProcess.fork;
  const times: number[] = [];
  try {
    for (let i = 0; i < repetitions; i++) {
      delete require.cache[file];
      forkedAt = -1;
      const start = now();
      // A fresh load of the built bundle each time (the cache entry was deleted above): only require() does that.
      // eslint-disable-next-line @typescript-eslint/no-require-imports
      const ext = require(file) as { activate(ctx: unknown): Promise<unknown> };
      const context = standIn('context', {
        subscriptions: [],
        extensionPath: resolve('.'),
        asAbsolutePath: (p: string) => resolve(p),
      });
      await ext.activate(context).catch(() => undefined);
      if (forkedAt < 0) throw new Error('activate() returned without starting the language server');
      times.push(forkedAt - start);
    }
  } finally {
    mod._load = load;
    childProcess.fork = fork;
  }
  return median(times);
}

/** A fresh temporary folder for the minified bundles, and its removal. */
export function tempBundles(): { dir: string; dispose(): void } {
  const dir = mkdtempSync(join(tmpdir(), 'boltzmark-bench-'));
  return { dir, dispose: () => rmSync(dir, { recursive: true, force: true }) };
}

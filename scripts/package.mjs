// Builds the .vsix that users install: `npm run package`.
//
// The minified bundles are built in a staging copy (out/vsix/), so the
// development bundles in dist/ (with source maps, used by F5 and the tests)
// stay as they are. `vsce` then packs the staging copy; .vscodeignore decides
// what goes in, and the listing is checked here before packing: the bundles,
// media, grammar, manifest, README, LICENSE, CHANGELOG and the format
// reference, and no sources, tests, maps or node_modules.
//
// Prints the .vsix path on its last line. `--out FILE` writes elsewhere.
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import readmeLinks from './readmeLinks.cjs';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
const outIndex = process.argv.indexOf('--out');
const vsix =
  outIndex > 0 ? resolve(process.argv[outIndex + 1]) : join(root, `${manifest.name}-${manifest.version}.vsix`);
const stage = join(root, 'out', 'vsix');

/** What the staging copy needs: the packaged files plus what the build reads. */
const STAGED = [
  'package.json',
  'package.nls.json',
  'README.md',
  'LICENSE',
  'CHANGELOG.md',
  '.vscodeignore',
  'tsconfig.json',
  'src',
  'media',
  'syntaxes',
  'docs',
  'scripts/build.mjs',
  'scripts/lazyNoteReader.cjs',
  'scripts/browserDocsLink.cjs',
  'scripts/packageSources.cjs',
];
/** Files a user's install cannot do without. */
const REQUIRED = [
  'package.json',
  'package.nls.json',
  'README.md',
  'LICENSE',
  'CHANGELOG.md',
  'dist/extension.js',
  'dist/noteReader.js',
  'dist/server.js',
  'dist/spectrumWorker.js',
  'dist/web/extension.js',
  'dist/web/server.js',
  'dist/cellRenderer.js',
  'docs/format.md',
  'media/icon.png',
];
/** Nothing of the development tree goes in. */
const FORBIDDEN = [
  /tsconfig\.json$/,
  /^src\//,
  /^test\//,
  /^scripts\//,
  /^bench\//,
  /^demo\//,
  /node_modules\//,
  /\.map$/,
  /\.ts$/,
  /^\.editor-host(-newest)?\//,
  /^dist\/cli\.js$/,
];

function run(what, command, args) {
  const r = spawnSync(command, args, { cwd: stage, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  if (r.status !== 0) {
    process.stderr.write(`${r.stdout ?? ''}${r.stderr ?? ''}`);
    throw new Error(`package: ${what} failed (exit ${r.status ?? r.signal})`);
  }
  return r.stdout;
}

rmSync(stage, { recursive: true, force: true });
mkdirSync(stage, { recursive: true });
for (const p of STAGED) {
  if (existsSync(join(root, p))) cpSync(join(root, p), join(stage, p), { recursive: true });
}

// esbuild resolves the packages from the checkout's node_modules (out/vsix/ lies inside it).
process.stdout.write(run('the production build', process.execPath, ['scripts/build.mjs', '--production']));

const vsce = join(dirname(createRequire(import.meta.url).resolve('@vscode/vsce/package.json')), 'vsce');
// The bundles carry their dependencies, so vsce must not add node_modules; vsce
// leaves the README's links alone (see below for what is done with them).
const common = ['--no-dependencies'];
const files = run('vsce ls', process.execPath, [vsce, 'ls', ...common])
  .split('\n')
  .map((l) => l.trim())
  .filter(Boolean);
const missing = REQUIRED.filter((f) => !files.includes(f));
const stray = files.filter((f) => FORBIDDEN.some((re) => re.test(f)));
if (missing.length || stray.length) {
  throw new Error(
    `package: the listing is wrong${missing.length ? `; missing: ${missing.join(', ')}` : ''}${stray.length ? `; must not ship: ${stray.join(', ')}` : ''}`,
  );
}

// The README keeps relative links to shipped files (docs/format.md, the images: they resolve inside the
// installed extension) and points the others (DEVELOPERS.md, demo/, …) at the repository at this version's tag.
const { packagedReadme, relativeTargets, repositoryAddress, targetPath } = readmeLinks;
const repository = repositoryAddress(manifest);
if (!repository) throw new Error('package: package.json has no repository; the README links need it');
const stagedReadme = join(stage, 'README.md');
const readme = packagedReadme(readFileSync(stagedReadme, 'utf8'), files, repository, manifest.version);
const broken = relativeTargets(readme).filter((t) => {
  const path = targetPath(t);
  return !files.includes(path) && !files.some((f) => f.startsWith(`${path.replace(/\/$/, '')}/`));
});
if (broken.length) throw new Error(`package: the README links to files the .vsix lacks: ${broken.join(', ')}`);
writeFileSync(stagedReadme, readme);

mkdirSync(dirname(vsix), { recursive: true });
rmSync(vsix, { force: true });
run('vsce package', process.execPath, [vsce, 'package', ...common, '--no-rewrite-relative-links', '--out', vsix]);
const kb = (statSync(vsix).size / 1024).toFixed(0);
console.log(`package: ${files.length} files, ${kb} KiB`);
for (const f of files) console.log(`  ${f}`);
console.log(vsix);

// esbuild plugins that choose which build of a dependency goes into the bundles.
// Shared by scripts/build.mjs and the size benchmark (bench/startup.ts), so both
// build the bundles users get.
const { existsSync, readFileSync } = require('node:fs');
const { dirname, join } = require('node:path');

/** The folder of an installed package (found up from its entry: not every package exports its package.json). */
function packageDir(name) {
  for (let dir = dirname(require.resolve(name)); dir !== dirname(dir); dir = dirname(dir)) {
    const manifest = join(dir, 'package.json');
    if (existsSync(manifest) && JSON.parse(readFileSync(manifest, 'utf8')).name === name) return dir;
  }
  throw new Error(`the folder of the package ${name} was not found`);
}

/**
 * `yaml` as its own browser build in the Node bundles too: the same parser and
 * composer, compiled from the same source, but without the node build's look
 * at `process.env.LOG_TOKENS` for every token it reads (a debug log; reading
 * the environment costs about 0.15 µs each time, a tenth of the command line's
 * time over a thousand notes). The browser build never reads `process`.
 * @type {import('esbuild').Plugin}
 */
const yamlBrowserBuild = {
  name: 'yaml-browser-build',
  setup(build) {
    const root = packageDir('yaml');
    build.onResolve({ filter: /^yaml$/ }, () => ({ path: join(root, 'browser', 'index.js') }));
  },
};

/**
 * The ES modules of the fitting packages, which esbuild can shake: `ml-matrix`
 * ships its ES module source (`src/`) beside a CommonJS bundle that its
 * `matrix.mjs` only re-exports, and `ml-levenberg-marquardt` an ES build
 * (`lib-esm/`) beside the CommonJS one Node resolves. From the CommonJS builds
 * every decomposition and statistic of the matrix library goes into every
 * bundle; from the ES modules, what the fit uses. Same package versions, same
 * code.
 * @type {import('esbuild').Plugin}
 */
const fittingModules = {
  name: 'fitting-modules',
  setup(build) {
    const matrix = join(packageDir('ml-matrix'), 'src', 'index.js');
    const lm = join(packageDir('ml-levenberg-marquardt'), 'lib-esm', 'index.js');
    build.onResolve({ filter: /^ml-matrix$/ }, () => ({ path: matrix }));
    build.onResolve({ filter: /^ml-levenberg-marquardt$/ }, () => ({ path: lm }));
  },
};

/**
 * `debug`, which one special function of `@stdlib` calls to log its
 * iterations when the `DEBUG` variable names it, as a logger that says
 * nothing: Boltzmark never turns it on, and the library's node and browser
 * halves and their environment reads stay out of the bundles.
 * @type {import('esbuild').Plugin}
 */
const silentDebug = {
  name: 'silent-debug',
  setup(build) {
    build.onResolve({ filter: /^debug$/ }, () => ({ path: 'debug', namespace: 'silent-debug' }));
    build.onLoad({ filter: /.*/, namespace: 'silent-debug' }, () => ({
      contents: 'function off() {}\noff.enabled = false;\nmodule.exports = function logger() { return off; };\n',
      loader: 'js',
    }));
  },
};

/** Every plugin above, for every bundle. */
const packageSources = [yamlBrowserBuild, fittingModules, silentDebug];

module.exports = { yamlBrowserBuild, fittingModules, silentDebug, packageSources };

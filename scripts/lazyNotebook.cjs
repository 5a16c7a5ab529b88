// The esbuild plugin that keeps `require('./notebook')` in src/client/lazy.ts
// a runtime require of `notebook.js` beside the extension bundle, instead of
// bundling the note reader into it. Shared by scripts/build.mjs and the
// size benchmark, so both build the bundle users get.

/** @type {import('esbuild').Plugin} */
const lazyNotebook = {
  name: 'lazy-notebook',
  setup(build) {
    build.onResolve({ filter: /^\.\/notebook$/ }, (args) => (/[\\/]src[\\/]client[\\/]/.test(args.importer) ? { path: './notebook.js', external: true } : undefined));
  },
};

module.exports = { lazyNotebook };

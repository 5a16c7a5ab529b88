// The esbuild plugin that keeps `require('./noteReader')` in src/client/loadNoteReader.ts
// a runtime require of `noteReader.js` beside the extension bundle, instead of
// bundling the note reader into it. Shared by scripts/build.mjs and the
// size benchmark, so both build the bundle users get.

/** @type {import('esbuild').Plugin} */
const lazyNoteReader = {
  name: 'lazy-note-reader',
  setup(build) {
    build.onResolve({ filter: /^\.\/noteReader$/ }, (args) =>
      /[\\/]src[\\/]client[\\/]/.test(args.importer) ? { path: './noteReader.js', external: true } : undefined,
    );
  },
};

module.exports = { lazyNoteReader };

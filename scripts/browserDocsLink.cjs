// The esbuild plugin that swaps `./docsLink` (which searches the disk for
// docs/format.md) for `./docsLink.browser` in the browser bundles, where there
// is no file system. Shared by scripts/build.mjs and the size benchmark, so
// both build the bundle users get.

/** @type {import('esbuild').Plugin} */
const browserDocsLink = {
  name: 'browser-docs-link',
  setup(build) {
    build.onResolve({ filter: /\/docsLink$/ }, (args) => ({ path: `${args.resolveDir}/${args.path}.browser.ts` }));
  },
};

module.exports = { browserDocsLink };

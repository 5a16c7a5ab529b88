// Types of lazyNotebook.cjs (the esbuild plugin that keeps the client's note reader a separate bundle).
import type { Plugin } from 'esbuild';

/** Keeps `require('./notebook')` of src/client a runtime require of `notebook.js`. */
export declare const lazyNotebook: Plugin;

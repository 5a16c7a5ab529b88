// Types of lazyNoteReader.cjs (the esbuild plugin that keeps the client's note reader a separate bundle).
import type { Plugin } from 'esbuild';

/** Keeps `require('./noteReader')` of src/client a runtime require of `noteReader.js`. */
export declare const lazyNoteReader: Plugin;

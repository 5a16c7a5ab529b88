// Types of packageSources.cjs (the esbuild plugins that choose which build of a dependency the bundles take).
import type { Plugin } from 'esbuild';

/** `yaml` as its own browser build. */
export declare const yamlBrowserBuild: Plugin;
/** The ES modules of `ml-matrix` and `ml-levenberg-marquardt`, which esbuild can shake. */
export declare const fittingModules: Plugin;
/** `debug` as a logger that says nothing. */
export declare const silentDebug: Plugin;
/** Every plugin above. */
export declare const packageSources: Plugin[];

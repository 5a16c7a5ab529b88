/**
 * The note-reading half of the extension, bundled on its own
 * (`dist/noteReader.js`) and loaded only when first needed: the Markdown
 * preview plugin, the run log's model and the curve view's CSV. All three
 * analyse notes with the core (YAML reader, fits, formatting), which is most
 * of the core's weight; keeping them out of `dist/extension.js` keeps the
 * bundle VS Code loads at activation down to the language client and glue.
 */
export { levelsPreview, madeResults, type PreviewOptions } from './preview';
export { RunLog, runLogCsv, curveCsv, runChartCsv, runChartData, spectrumCsv } from '../core';
export { SpectrumFiles, deferredParser } from '../shared/spectrumFiles';
export { SPECTRUM_EXTENSIONS } from '../core';

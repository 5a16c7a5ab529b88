/**
 * The language server's spectrum files: the host-neutral `SpectrumFiles`
 * (src/shared/spectrumFiles.ts) is the server's `ExternalPart` for `file:`
 * keys; see docs/architecture.md, "Spectrum files in the language server".
 */
export * from '../shared/spectrumFiles';

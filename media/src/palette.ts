/**
 * The palette type on its own, free of the DOM, so that the chart model
 * (model.ts) can be built and tested in Node; theme.ts reads it from the page.
 */

/** Resolved theme colours for canvas drawing. */
export interface Palette {
  readonly background: string;
  readonly foreground: string;
  readonly muted: string;
  readonly grid: string;
  readonly curve: string;
  readonly finiteN: string;
  readonly measured: string;
  readonly lattice: string;
  readonly inversion: string;
  readonly saturation: string;
  /** Colours of pinned runs, in order. */
  readonly pins: readonly string[];
  readonly fontFamily: string;
  readonly fontSize: number;
  /** True in high-contrast themes: thicker lines, no transparency tricks. */
  readonly highContrast: boolean;
}

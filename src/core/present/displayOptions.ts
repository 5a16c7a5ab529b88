/**
 * How hosts ask for numbers to be shown (mirrors the `boltzmark.display.*`
 * settings). Its own file so that every display module can depend on it
 * without depending on each other.
 */

/** How numbers are shown; mirrors the editor settings. */
export interface DisplayOptions {
  /** Significant digits of values without an uncertainty. */
  readonly digits: number;
  /** `auto`: SI prefix; `kelvin`: always K; `beta-first`: lead with β. */
  readonly temperature: 'auto' | 'kelvin' | 'beta-first';
  /** Polarization as a percentage (true) or a fraction. */
  readonly percent: boolean;
}

/** The defaults of the settings. */
export const DEFAULT_DISPLAY: DisplayOptions = { digits: 4, temperature: 'auto', percent: true };

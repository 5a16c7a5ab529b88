/**
 * The extension's settings: one definition feeds the typed `Settings` the
 * server uses and `contributes.configuration` in package.json (a test checks
 * that the two agree). Pure data, no imports.
 */

/** One setting as the manifest declares it. */
export interface SettingDef {
  readonly key: string;
  readonly type: 'boolean' | 'number' | 'string' | 'array';
  readonly default: boolean | number | string | readonly string[];
  readonly description: string;
  readonly enum?: readonly string[];
  readonly enumDescriptions?: readonly string[];
  readonly minimum?: number;
  readonly maximum?: number;
  /**
   * Where it may be set: `resource` (the default: per workspace folder, so
   * the server reads it per note) or `window` (one value for the window).
   */
  readonly scope?: 'resource' | 'window';
}

/** Every setting, named `boltzmark.<area>.<feature>`. */
export const SETTING_DEFS: readonly SettingDef[] = [
  {
    key: 'boltzmark.display.significantDigits',
    type: 'number',
    default: 4,
    minimum: 2,
    maximum: 8,
    description:
      'Significant digits of values shown without an uncertainty. Values with an uncertainty always follow the GUM rule: two significant digits of the uncertainty, the value rounded to match.',
  },
  {
    key: 'boltzmark.display.temperature',
    type: 'string',
    default: 'auto',
    enum: ['auto', 'kelvin', 'beta-first'],
    enumDescriptions: [
      'Temperatures with an SI prefix (mK, µK, nK) chosen from their size.',
      'Temperatures always in kelvin.',
      'Lead with the inverse temperature β (K⁻¹), which stays finite through saturation.',
    ],
    description: 'How spin and excitation temperatures are shown in hovers and inlay hints.',
  },
  {
    key: 'boltzmark.display.polarization',
    type: 'string',
    default: 'percent',
    enum: ['percent', 'fraction'],
    enumDescriptions: [
      'Polarization as a percentage everywhere (below 0.01 % with a power of ten, still in %).',
      'Polarization as a fraction between −1 and 1.',
    ],
    description: 'How polarizations are shown.',
  },
  {
    key: 'boltzmark.inlayHints.enabled',
    type: 'boolean',
    default: true,
    description: 'Show short results (T, P, ε) at the end of each block’s first line and after each level.',
  },
  {
    key: 'boltzmark.status.saturationSigma',
    type: 'number',
    default: 2,
    minimum: 0,
    maximum: 10,
    description: 'A block is called saturated when β is within this many standard uncertainties of zero.',
  },
  {
    key: 'boltzmark.blocks.extraInfoStrings',
    type: 'array',
    default: [],
    description: 'Extra fence info strings (besides `levels`) whose blocks Boltzmark reads, e.g. `populations`.',
  },
  {
    // Read by the language client library itself (`<client id>.trace.server`), not by the server.
    key: 'boltzmark.trace.server',
    type: 'string',
    default: 'off',
    enum: ['off', 'messages', 'verbose'],
    enumDescriptions: [
      'No record of the messages.',
      'The name of each request and notification between VS Code and the language server, with its timing.',
      'Each message in full, with its parameters and result.',
    ],
    scope: 'window',
    description:
      'Record the messages between VS Code and the Boltzmark language server in the Boltzmark output channel, e.g. to report a problem.',
  },
];

/** The settings as the server uses them. */
export interface Settings {
  readonly significantDigits: number;
  readonly temperature: 'auto' | 'kelvin' | 'beta-first';
  readonly polarization: 'percent' | 'fraction';
  readonly inlayHints: boolean;
  readonly saturationSigma: number;
  readonly extraInfoStrings: readonly string[];
}

/** Defaults, taken from the definitions above. */
export const DEFAULT_SETTINGS: Settings = fromSection({});

/**
 * Typed settings from the `boltzmark` configuration section (as a client
 * returns it: nested objects), with defaults and bounds applied to anything
 * missing or malformed.
 */
export function fromSection(section: unknown): Settings {
  const s = (section ?? {}) as Record<string, Record<string, unknown> | undefined>;
  const def = (key: string): SettingDef => SETTING_DEFS.find((d) => d.key === key)!;
  const num = (key: string, v: unknown): number => {
    const d = def(key);
    return typeof v === 'number' && Number.isFinite(v)
      ? Math.min(d.maximum ?? v, Math.max(d.minimum ?? v, v))
      : (d.default as number);
  };
  const pick = <T extends string>(key: string, v: unknown): T =>
    def(key).enum!.includes(v as string) ? (v as T) : (def(key).default as T);
  const extra = s.blocks?.extraInfoStrings;
  return {
    significantDigits: Math.round(num('boltzmark.display.significantDigits', s.display?.significantDigits)),
    temperature: pick('boltzmark.display.temperature', s.display?.temperature),
    polarization: pick('boltzmark.display.polarization', s.display?.polarization),
    inlayHints: typeof s.inlayHints?.enabled === 'boolean' ? s.inlayHints.enabled : true,
    saturationSigma: num('boltzmark.status.saturationSigma', s.status?.saturationSigma),
    extraInfoStrings: Array.isArray(extra)
      ? extra.filter((x): x is string => typeof x === 'string' && x.trim() !== '').map((x) => x.trim())
      : [],
  };
}

/**
 * Theme variables the curve-view tests give the page, as VS Code would set
 * them on <html>. Values as in VS Code's "Light Modern", "Dark Modern",
 * "Dark High Contrast" and "Light High Contrast" themes (from memory); the
 * tests read their expected colours from here.
 */

/** A theme: the body class VS Code sets and the CSS variables. */
export interface TestTheme {
  readonly name: 'light' | 'dark' | 'high-contrast' | 'high-contrast-light';
  readonly bodyClass: string;
  readonly vars: Readonly<Record<string, string>>;
}

const common = {
  '--vscode-font-family': 'system-ui, "Ubuntu", "Droid Sans", sans-serif',
  '--vscode-font-size': '13px',
  '--vscode-font-weight': 'normal',
  '--vscode-editor-font-family': '"Droid Sans Mono", "monospace", monospace',
};

/** Light Modern–like colours. */
export const LIGHT: TestTheme = {
  name: 'light',
  bodyClass: 'vscode-light',
  vars: {
    ...common,
    '--vscode-foreground': '#3b3b3b',
    '--vscode-editor-foreground': '#3b3b3b',
    '--vscode-editor-background': '#ffffff',
    '--vscode-descriptionForeground': '#3b3b3b',
    '--vscode-editorWidget-border': '#e5e5e5',
    '--vscode-panel-border': '#e5e5e5',
    '--vscode-focusBorder': '#005fb8',
    '--vscode-errorForeground': '#f85149',
    '--vscode-charts-blue': '#1a85ff',
    '--vscode-charts-red': '#e51400',
    '--vscode-charts-green': '#388a34',
    '--vscode-charts-orange': '#d18616',
    '--vscode-charts-purple': '#652d90',
    '--vscode-charts-yellow': '#bf8803',
    '--vscode-button-background': '#005fb8',
    '--vscode-button-foreground': '#ffffff',
    '--vscode-button-hoverBackground': '#0258a8',
    '--vscode-button-secondaryBackground': '#e5e5e5',
    '--vscode-button-secondaryForeground': '#3b3b3b',
    '--vscode-button-secondaryHoverBackground': '#cccccc',
    '--vscode-badge-background': '#cccccc',
    '--vscode-badge-foreground': '#3b3b3b',
    '--vscode-settings-dropdownBackground': '#ffffff',
    '--vscode-settings-dropdownBorder': '#cecece',
    '--vscode-settings-dropdownForeground': '#3b3b3b',
    '--vscode-settings-dropdownListBorder': '#c8c8c8',
    '--vscode-textPreformat-foreground': '#3b3b3b',
    '--vscode-inputValidation-errorBackground': '#f2dede',
    '--vscode-inputValidation-errorBorder': '#be1100',
  },
};

/** Dark Modern–like colours. */
export const DARK: TestTheme = {
  name: 'dark',
  bodyClass: 'vscode-dark',
  vars: {
    ...common,
    '--vscode-foreground': '#cccccc',
    '--vscode-editor-foreground': '#cccccc',
    '--vscode-editor-background': '#1f1f1f',
    '--vscode-descriptionForeground': '#9d9d9d',
    '--vscode-editorWidget-border': '#313131',
    '--vscode-panel-border': '#2b2b2b',
    '--vscode-focusBorder': '#0078d4',
    '--vscode-errorForeground': '#f85149',
    '--vscode-charts-blue': '#3794ff',
    '--vscode-charts-red': '#f14c4c',
    '--vscode-charts-green': '#89d185',
    '--vscode-charts-orange': '#d18616',
    '--vscode-charts-purple': '#b180d7',
    '--vscode-charts-yellow': '#cca700',
    '--vscode-button-background': '#0078d4',
    '--vscode-button-foreground': '#ffffff',
    '--vscode-button-hoverBackground': '#026ec1',
    '--vscode-button-secondaryBackground': '#313131',
    '--vscode-button-secondaryForeground': '#cccccc',
    '--vscode-button-secondaryHoverBackground': '#3c3c3c',
    '--vscode-badge-background': '#616161',
    '--vscode-badge-foreground': '#f8f8f8',
    '--vscode-settings-dropdownBackground': '#313131',
    '--vscode-settings-dropdownBorder': '#3c3c3c',
    '--vscode-settings-dropdownForeground': '#cccccc',
    '--vscode-settings-dropdownListBorder': '#454545',
    '--vscode-textPreformat-foreground': '#d0d0d0',
    '--vscode-inputValidation-errorBackground': '#5a1d1d',
    '--vscode-inputValidation-errorBorder': '#be1100',
  },
};

/** Dark High Contrast–like colours: black ground, white text, cyan borders (from memory). */
export const HIGH_CONTRAST: TestTheme = {
  name: 'high-contrast',
  bodyClass: 'vscode-high-contrast',
  vars: {
    ...common,
    '--vscode-foreground': '#ffffff',
    '--vscode-editor-foreground': '#ffffff',
    '--vscode-editor-background': '#000000',
    '--vscode-descriptionForeground': '#ffffff',
    '--vscode-contrastBorder': '#6fc3df',
    '--vscode-panel-border': '#6fc3df',
    '--vscode-focusBorder': '#f38518',
    '--vscode-errorForeground': '#f48771',
    '--vscode-charts-blue': '#3794ff',
    '--vscode-charts-red': '#f48771',
    '--vscode-charts-green': '#89d185',
    '--vscode-charts-orange': '#ff8c00',
    '--vscode-charts-purple': '#b180d7',
    '--vscode-charts-yellow': '#ffd700',
    '--vscode-button-background': '#000000',
    '--vscode-button-foreground': '#ffffff',
    '--vscode-button-border': '#6fc3df',
    '--vscode-button-secondaryBackground': '#000000',
    '--vscode-button-secondaryForeground': '#ffffff',
    '--vscode-settings-dropdownBackground': '#000000',
    '--vscode-settings-dropdownBorder': '#6fc3df',
    '--vscode-settings-dropdownForeground': '#ffffff',
    '--vscode-settings-dropdownListBorder': '#6fc3df',
    '--vscode-textPreformat-foreground': '#ffffff',
    '--vscode-inputValidation-errorBackground': '#000000',
    '--vscode-inputValidation-errorBorder': '#f48771',
  },
};

/** Light High Contrast–like colours: white ground, near-black text, dark blue borders (from memory). */
export const HIGH_CONTRAST_LIGHT: TestTheme = {
  name: 'high-contrast-light',
  bodyClass: 'vscode-high-contrast-light',
  vars: {
    ...common,
    '--vscode-foreground': '#292929',
    '--vscode-editor-foreground': '#292929',
    '--vscode-editor-background': '#ffffff',
    '--vscode-descriptionForeground': '#292929',
    '--vscode-contrastBorder': '#0f4a85',
    '--vscode-panel-border': '#0f4a85',
    '--vscode-focusBorder': '#006bbd',
    '--vscode-errorForeground': '#b5200d',
    '--vscode-charts-blue': '#0f4a85',
    '--vscode-charts-red': '#b5200d',
    '--vscode-charts-green': '#374e06',
    '--vscode-charts-orange': '#b85600',
    '--vscode-charts-purple': '#5d1d8a',
    '--vscode-charts-yellow': '#895503',
    '--vscode-button-background': '#0f4a85',
    '--vscode-button-foreground': '#ffffff',
    '--vscode-button-border': '#0f4a85',
    '--vscode-button-secondaryBackground': '#ffffff',
    '--vscode-button-secondaryForeground': '#292929',
    '--vscode-settings-dropdownBackground': '#ffffff',
    '--vscode-settings-dropdownBorder': '#0f4a85',
    '--vscode-settings-dropdownForeground': '#292929',
    '--vscode-settings-dropdownListBorder': '#0f4a85',
    '--vscode-textPreformat-foreground': '#292929',
    '--vscode-inputValidation-errorBackground': '#ffffff',
    '--vscode-inputValidation-errorBorder': '#b5200d',
  },
};

/** An sRGB colour as [r, g, b] from `#rrggbb`. */
export function rgb(hex: string): [number, number, number] {
  const n = Number.parseInt(hex.slice(1), 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/** `top` drawn with opacity `alpha` over `bottom` (source-over), rounded per channel. */
export function blend(top: string, bottom: string, alpha: number): [number, number, number] {
  const t = rgb(top);
  const b = rgb(bottom);
  return [0, 1, 2].map((i) => Math.round(alpha * t[i]! + (1 - alpha) * b[i]!)) as [number, number, number];
}

/** WCAG 2.x relative luminance of an sRGB colour (https://www.w3.org/TR/WCAG21/#dfn-relative-luminance). */
export function luminance([r, g, b]: readonly [number, number, number]): number {
  const lin = (c: number): number => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

/** WCAG 2.x contrast ratio of two colours, from 1 to 21 (https://www.w3.org/TR/WCAG21/#dfn-contrast-ratio). */
export function contrastRatio(a: readonly [number, number, number], b: readonly [number, number, number]): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}

/**
 * Theme variables the curve-view tests give the page, as VS Code would set
 * them on <html>. Values as in VS Code's "Light Modern" and "Dark Modern"
 * themes (from memory); the tests read their expected colours from here.
 */

/** A theme: the body class VS Code sets and the CSS variables. */
export interface TestTheme {
  readonly name: 'light' | 'dark';
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

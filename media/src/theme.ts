/**
 * Colours and fonts of the charts, read from the VS Code theme's CSS
 * variables (the page hard-codes none), and re-read when the theme changes:
 * VS Code switches the body class (`vscode-light`, `vscode-dark`,
 * `vscode-high-contrast`, `vscode-high-contrast-light`) and the variables.
 */

import type { Palette } from './palette';

export type { Palette } from './palette';

/** The first of the variables that is set, else the fallback (itself a variable's value). */
function read(style: CSSStyleDeclaration, names: readonly string[], fallback: string): string {
  for (const n of names) {
    const v = style.getPropertyValue(n).trim();
    if (v) return v;
  }
  return fallback;
}

/** Reads the palette from the current theme variables. */
export function readPalette(): Palette {
  const style = getComputedStyle(document.documentElement);
  const body = getComputedStyle(document.body);
  const foreground = read(style, ['--vscode-editor-foreground', '--vscode-foreground'], body.color);
  const v = (names: string[]): string => read(style, names, foreground);
  const size = parseFloat(read(style, ['--vscode-font-size'], body.fontSize));
  return {
    background: read(style, ['--vscode-editor-background'], body.backgroundColor),
    foreground,
    muted: v(['--vscode-descriptionForeground']),
    grid: v(['--vscode-editorWidget-border', '--vscode-panel-border', '--vscode-contrastBorder']),
    curve: v(['--vscode-charts-blue']),
    finiteN: v(['--vscode-charts-purple']),
    measured: v(['--vscode-charts-red']),
    lattice: v(['--vscode-charts-green']),
    inversion: v(['--vscode-charts-orange', '--vscode-charts-red']),
    saturation: v(['--vscode-charts-yellow', '--vscode-focusBorder']),
    pins: [
      v(['--vscode-charts-orange']),
      v(['--vscode-charts-purple']),
      v(['--vscode-charts-yellow']),
      v(['--vscode-charts-green']),
      v(['--vscode-charts-blue']),
    ],
    fontFamily: read(style, ['--vscode-font-family'], body.fontFamily),
    fontSize: Number.isFinite(size) && size > 0 ? size : 13,
    highContrast:
      document.body.classList.contains('vscode-high-contrast') ||
      document.body.classList.contains('vscode-high-contrast-light'),
  };
}

/** Calls `changed` whenever the body's theme class or the theme variables on <html> change. */
export function onThemeChange(changed: () => void): void {
  const observer = new MutationObserver(() => changed());
  observer.observe(document.body, { attributes: true, attributeFilter: ['class'] });
  observer.observe(document.documentElement, { attributes: true, attributeFilter: ['style', 'class'] });
}

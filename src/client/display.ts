/**
 * How numbers are shown outside the language server (the Markdown preview,
 * the run log): the `boltzmark.display.*` settings read the way the server
 * reads them, so every place shows the same strings.
 */
import * as vscode from 'vscode';
import { DEFAULT_DISPLAY, type DisplayOptions } from '../core/packageFree';
import { fromSection } from '../shared/settings';

/** The display options from the settings (of the resource's folder, when one is given). */
export function displayOptions(scope?: vscode.Uri): DisplayOptions {
  const c = vscode.workspace.getConfiguration('boltzmark', scope);
  const s = fromSection({
    display: {
      significantDigits: c.get('display.significantDigits'),
      temperature: c.get('display.temperature'),
      polarization: c.get('display.polarization'),
    },
  });
  return {
    ...DEFAULT_DISPLAY,
    digits: s.significantDigits,
    temperature: s.temperature,
    percent: s.polarization === 'percent',
  };
}

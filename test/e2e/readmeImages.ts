/**
 * `npm run images`: the README's screenshots, taken in the browser-hosted
 * VS Code with the packaged .vsix, in the default light and dark themes:
 * docs/images/vscode-{hover,inlay-hints,curve-view}-{light,dark}.png.
 * Same session and waits as the e2e suite; run it after a visible change.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import * as host from '../../scripts/editorHost.cjs';
import { startSession } from './session';
import {
  dismissHover,
  frameWith,
  goToLine,
  hoverText,
  clickLensAbove,
  lensShown,
  line,
  lineOf,
  runCommand,
  waitAnimations,
} from './workbench';

const IMAGES = join(host.ROOT, 'docs', 'images');
const THEMES = [
  ['light', 'Default Light Modern'],
  ['dark', 'Default Dark Modern'],
] as const;

async function save(page: Page, name: string): Promise<void> {
  const file = join(IMAGES, `${name}.png`);
  await page.screenshot({ path: file });
  console.log(file);
}

async function images(kind: string, theme: string): Promise<void> {
  const s = await startSession({
    name: `images-${kind}`,
    viewport: { width: 1100, height: 620 },
    settings: { 'workbench.colorTheme': theme },
  });
  try {
    const { page } = s;
    await runCommand(page, 'View: Toggle Primary Side Bar Visibility');
    await quickOpen(page, 'pumped-cell.md', 'Optical-pumping cell');

    // Inlay hints: the three-level block of the pumped cell, with its pair temperatures.
    await goToLine(page, lineOf(demo('pumped-cell.md'), 'id: reference lamp L-1') + 4);
    await line(page, '· T(').waitFor({ timeout: 90000 });
    await save(page, `vscode-inlay-hints-${kind}`);

    // Hover on a block of the polarizer log.
    await runCommand(page, 'View: Close All Editors');
    await quickOpen(page, 'polarizer-log.md', 'Polarizer log');
    await goToLine(page, lineOf(demo('polarizer-log.md'), 'id: cell-B run 1') + 4);
    await line(page, 'T = 5.61 mK').waitFor({ timeout: 90000 });
    // Code lenses arriving late shift the lines and close a hover: wait for them first,
    // and take the picture only of a hover that is still up once its fade-in has ended.
    await lensShown(page, 'id: cell-B run 1', 'Show Curve View');
    const hover = page.locator('.monaco-hover-content', { hasText: 'cell-B run 1' }).first();
    for (let attempt = 0; ; attempt++) {
      await hoverText(page, 'id: cell-B run 1', 'cell-B', /cell-B run 1/);
      await waitAnimations(page);
      if (await hover.isVisible()) break;
      if (attempt === 3) throw new Error('the hover keeps closing before the picture');
    }
    await save(page, `vscode-hover-${kind}`);
    await dismissHover(page);

    // The curve view beside the note, from the block's code lens.
    const view = await clickLensAbove(page, 'id: cell-B run 1', 'Show Curve View', (ms) =>
      frameWith(page, 'body[data-state="chart"]:not([data-drawn="0"]) #block-title', 'cell-B run 1', ms),
    );
    await view.locator('#entropy-chart').waitFor();
    await save(page, `vscode-curve-view-${kind}`);
  } finally {
    await s.close();
  }
}

function demo(name: string): string {
  return readFileSync(join(host.ROOT, 'demo', name), 'utf8');
}

/** Opens a note by Quick Open (the side bar, with the Explorer, is hidden for the pictures). */
async function quickOpen(page: Page, name: string, firstLine: string): Promise<void> {
  await page.keyboard.press('Control+p');
  const input = page.locator('.quick-input-widget .quick-input-box input');
  await input.waitFor({ state: 'visible' });
  await input.fill(name);
  await page.locator('.quick-input-widget .monaco-list-row', { hasText: name }).first().waitFor();
  await page.keyboard.press('Enter');
  await page.locator('.quick-input-widget').waitFor({ state: 'hidden' });
  await line(page, firstLine).waitFor();
}

async function main(): Promise<void> {
  mkdirSync(IMAGES, { recursive: true });
  for (const [kind, theme] of THEMES) await images(kind, theme);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});

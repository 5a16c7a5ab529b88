/**
 * The workbench's own dialogs as the e2e tests answer them: the save dialog
 * (in the browser-hosted VS Code the "simple file dialog", a quick input
 * holding a path), multi-select quick picks, and notification toasts. As in
 * workbench.ts, every wait is on a DOM state.
 */
import { readdirSync } from 'node:fs';
import { dirname, extname } from 'node:path';
import type { Page } from 'playwright-core';

// The browser-side names used by the functions given to waitForFunction (see workbench.ts).
declare const document: any;
type DomNode = any;

const WIDGET = '.quick-input-widget';
const INPUT = '.quick-input-widget .quick-input-box input';

/**
 * Answers the save dialog that is opening with the absolute path `file` (in
 * a folder that exists, under a name not yet taken) and returns the path the
 * dialog offered first.
 *
 * The dialog first shows a bare folder (ending in `/`) while it reads it,
 * then the default path; text typed before that would be replaced. After a
 * path in another folder is typed, it lists that folder asynchronously, and
 * Enter pressed before the listing arrives is ignored; so the listing is
 * awaited: `..`, the subfolders and the files with the typed name's
 * extension (the dialog shows only those that match its filter).
 */
export async function saveDialog(page: Page, file: string): Promise<string> {
  const input = page.locator(INPUT);
  await input.waitFor({ state: 'visible' });
  await page.waitForFunction((sel: string) => {
    const i = document.querySelector(sel);
    return Boolean(i && i.value !== '' && !String(i.value).endsWith('/'));
  }, INPUT);
  const offered = await input.inputValue();
  const ext = extname(file);
  const listing = [
    '..',
    ...readdirSync(dirname(file), { withFileTypes: true })
      .filter((d) => d.isDirectory() || extname(d.name) === ext)
      .map((d) => d.name),
  ].sort();
  if (listing.includes(file.slice(dirname(file).length + 1)))
    throw new Error(`${file} exists already; the dialog would ask to overwrite it`);
  await input.fill(file);
  await page.waitForFunction(
    ([widget, want, value]: readonly [string, readonly string[], string]) => {
      const w = document.querySelector(widget);
      const i = w?.querySelector('.quick-input-box input');
      if (!i || i.value !== value || !w.querySelector('.quick-input-progress.done')) return false;
      const rows = Array.from<DomNode>(w.querySelectorAll('.quick-input-list .monaco-list-row'))
        .map((r) => String(r.getAttribute('aria-label')))
        .sort();
      return JSON.stringify(rows) === JSON.stringify(want);
    },
    [WIDGET, listing, file] as const,
  );
  await page.keyboard.press('Enter');
  await page.locator(WIDGET).waitFor({ state: 'hidden' });
  return offered;
}

/**
 * In the open multi-select quick pick, leaves exactly the rows labelled
 * `labels` checked (each row's checkbox toggled by a click event only where
 * its state must change, and its new state awaited), then presses OK.
 * Returns every row's label.
 */
export async function pickMany(page: Page, labels: readonly string[]): Promise<string[]> {
  const widget = page.locator(WIDGET);
  const rows = widget.locator('.quick-input-list .monaco-list-row[role="checkbox"]');
  await rows.first().waitFor();
  const all = await rows.evaluateAll((rs: DomNode[]) => rs.map((r) => String(r.getAttribute('aria-label'))));
  for (const label of all) {
    const row = widget.locator(`.quick-input-list .monaco-list-row[role="checkbox"][aria-label="${label}"]`);
    const want = String(labels.includes(label));
    if ((await row.getAttribute('aria-checked')) === want) continue;
    // The box gets the click event itself, with no pointer on the list: a row under the pointer shows its
    // description in a hover below it, over the next row's box, and a real click there lands on the hover.
    await row.locator('.monaco-checkbox').dispatchEvent('click');
    await widget.locator(`.quick-input-list .monaco-list-row[aria-label="${label}"][aria-checked="${want}"]`).waitFor();
  }
  await widget.locator('.quick-input-action .monaco-button', { hasText: /^OK$/ }).click();
  await widget.waitFor({ state: 'hidden' });
  return all;
}

/** Waits for a notification toast whose message contains `text`; returns its message. */
export async function notification(page: Page, text: string): Promise<string> {
  const message = page.locator('.notifications-toasts .notification-list-item-message', { hasText: text }).first();
  await message.waitFor();
  return message.innerText();
}

/**
 * Side bar views as the e2e tests read them: a view's section ("pane") in a
 * view container such as the Explorer, its title bar buttons, and the rows
 * of a tree view, read whole although the tree draws only the rows in view.
 */
import type { Locator, Page } from 'playwright-core';

type DomNode = any;

/** `text` as a pattern matching exactly that text. */
export function exact(text: string): RegExp {
  return new RegExp(`^${text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`);
}

/**
 * The section of the side bar whose header shows `title`. Found by the
 * header's title element: the header's aria-label also carries the view's
 * description (a filter's, say) when it has one.
 */
export function pane(page: Page, title: string): Locator {
  return page.locator('.pane', { has: page.locator('.pane-header h3.title', { hasText: exact(title) }) });
}

/** Expands a side bar section by clicking its header (when collapsed) and waits for its body. */
export async function expandPane(page: Page, title: string): Promise<Locator> {
  const p = pane(page, title);
  const header = p.locator('.pane-header');
  await header.waitFor();
  if ((await header.getAttribute('aria-expanded')) !== 'true') await header.click();
  await p.locator('.pane-header[aria-expanded="true"]').waitFor();
  await p.locator('.pane-body').waitFor();
  return p;
}

/**
 * Clicks a button of a section's title bar by its title. The buttons are
 * shown only while the pointer is over the section (or it has the focus),
 * so the pointer goes to the header first.
 */
export async function paneAction(section: Locator, title: string): Promise<void> {
  await section.locator('.pane-header').hover();
  await section.locator(`.pane-header .actions .action-label[aria-label="${title}"]`).click();
}

/**
 * A tree's rows, without the copies its sticky scroll draws of the parents of
 * the rows on top (same index, but no depth).
 */
export const ROWS = '.pane-body .monaco-list-rows > .monaco-list-row';

/** One row of a tree view as drawn: depth (1 for the top level), label and description. */
export interface TreeRow {
  readonly level: number;
  readonly label: string;
  readonly description: string;
}

/**
 * Every row of the tree in `section`, top to bottom. The list draws only the
 * rows in view, so the rows are gathered page by page with the keyboard
 * (Home, then PageDown until the last row has the focus), each page read in
 * the same look at the page as the focus; the list is left at its top.
 * Moving the focus does not open a row. A refresh of the tree can replace
 * its rows under the keyboard, dropping the focus or swallowing a key's
 * effect; when a key has no effect within 10 s the reading starts over.
 */
export async function treeRows(page: Page, section: Locator): Promise<TreeRow[]> {
  await section.locator(ROWS).first().waitFor();
  const list = await section.locator('.pane-body .monaco-list-rows').elementHandle();
  for (let attempt = 1; ; attempt++) {
    await section.locator('.pane-body .monaco-list').first().focus();
    await page.keyboard.press('Home');
    const seen = new Map<number, TreeRow>();
    // -1: wait for the first row to have the focus; else for the focus to leave row `before`.
    let before = -1;
    for (;;) {
      const handle = await page
        .waitForFunction(
          ([el, prev]: readonly [DomNode, number]) => {
            const drawn = Array.from<DomNode>(el.children);
            const focused = drawn.find((r) => r.classList.contains('focused'));
            if (!focused) return false;
            const index = Number(focused.getAttribute('data-index'));
            if (prev === -1 ? index !== 0 : index === prev) return false;
            const rows = drawn.map((r) => ({
              index: Number(r.getAttribute('data-index')),
              level: Number(r.getAttribute('aria-level')),
              label: String(r.querySelector('.label-name')?.textContent ?? ''),
              description: String(r.querySelector('.label-description')?.textContent ?? ''),
            }));
            return { focused: index, last: focused.getAttribute('data-last-element') === 'true', rows };
          },
          [list, before] as const,
          { timeout: 10000 },
        )
        .catch(() => null);
      // No answer: a refresh replaced the rows between a key press and its effect (the focus gone or left in place).
      if (!handle) break;
      const state = (await handle.jsonValue()) as {
        focused: number;
        last: boolean;
        rows: (TreeRow & { index: number })[];
      };
      for (const { index, ...row } of state.rows) seen.set(index, row);
      if (state.last) {
        await page.keyboard.press('Home');
        return [...seen.entries()].sort((a, b) => a[0] - b[0]).map(([, row]) => row);
      }
      before = state.focused;
      await page.keyboard.press('PageDown');
    }
    if (attempt === 5) throw new Error('the tree was redrawn under the keyboard five times while being read');
  }
}

/**
 * Reads the tree until its rows are `want`, or `timeout` ms have passed;
 * returns the rows read last, for the caller to compare and report. A tree
 * can be drawn in several steps (the run log shows each note as it is read),
 * so after a read that differs it waits for the drawn rows to change and
 * reads again. A change that lands during a read is caught by the final read
 * at the deadline: slower, never wrong.
 */
export async function waitTreeRows(
  page: Page,
  section: Locator,
  want: readonly TreeRow[],
  timeout = 30000,
): Promise<TreeRow[]> {
  const deadline = Date.now() + timeout;
  const list = await section.locator('.pane-body .monaco-list-rows').elementHandle();
  for (;;) {
    const rows = await treeRows(page, section);
    const left = deadline - Date.now();
    if (JSON.stringify(rows) === JSON.stringify(want) || left <= 0) return rows;
    // (The signature is written out twice: functions run in the page may not share a named helper, see workbench.ts.)
    const drawn = await section.locator('.pane-body .monaco-list-rows').evaluate((el: DomNode) =>
      Array.from<DomNode>(el.children)
        .map((r) => `${r.getAttribute('data-index')}|${r.textContent}`)
        .join('\n'),
    );
    await page
      .waitForFunction(
        ([el, before]: readonly [DomNode, string]) =>
          Array.from<DomNode>(el.children)
            .map((r) => `${r.getAttribute('data-index')}|${r.textContent}`)
            .join('\n') !== before,
        [list, drawn] as const,
        { timeout: left },
      )
      .catch(() => undefined);
  }
}

/** The drawn row of a tree whose label is exactly `label`, at depth `level`. */
export function treeRow(section: Locator, label: string, level: number): Locator {
  return section
    .locator(`${ROWS}[aria-level="${level}"]`)
    .filter({ has: section.page().locator('.label-name', { hasText: exact(label) }) });
}

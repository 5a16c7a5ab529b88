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

/** One row of a list as drawn: its depth in a tree (NaN in a flat list), aria-label, label and description. */
export interface ListRow extends TreeRow {
  readonly aria: string;
}

/**
 * Every row of a list (`rows`: its `.monaco-list-rows`), top to bottom. The
 * list draws only the rows in view, so it is scrolled through with wheel
 * events sent to the list itself (half a view at a time, so that no row is
 * skipped), each step's drawn rows read at once, and it is scrolled back to
 * its top. Neither the keyboard focus nor the pointer is used: a quick pick
 * closing, a notification or a hover cannot take the reading away. A step
 * that does not move the list within 10 s (a refresh replaced its rows)
 * starts the reading over, five times at most.
 */
export async function listRows(page: Page, rows: Locator): Promise<ListRow[]> {
  await rows.locator('> .monaco-list-row').first().waitFor();
  const list = await rows.elementHandle();
  if (!list) throw new Error('the list has no rows');
  // The list's scrolling element hears the wheel on the rows (the event bubbles); `down` is in view heights.
  const wheel = (down: number): Promise<void> =>
    list.evaluate((el: DomNode, d: number) => {
      const px = Math.round(d * Number(el.parentElement?.clientHeight ?? 0));
      // Chromium's legacy wheelDeltaY is what the list reads first; deltaY is the standard's.
      const init = { deltaY: px, wheelDeltaY: -px, deltaMode: 0, bubbles: true, cancelable: true };
      el.dispatchEvent(new el.ownerDocument.defaultView.WheelEvent('wheel', init));
    }, down);
  // What is drawn: each row's index, where it is drawn and what it says.
  const drawn = (): Promise<{ at: string; rows: (ListRow & { index: number; last: boolean })[] }> =>
    list.evaluate((el: DomNode) => {
      const rows = Array.from<DomNode>(el.children).map((r) => ({
        index: Number(r.getAttribute('data-index')),
        last: r.getAttribute('data-last-element') === 'true',
        level: Number(r.getAttribute('aria-level') ?? NaN),
        aria: String(r.getAttribute('aria-label') ?? ''),
        label: String(r.querySelector('.label-name')?.textContent ?? ''),
        description: String(r.querySelector('.label-description')?.textContent ?? ''),
      }));
      const at = Array.from<DomNode>(el.children)
        .map((r) => `${r.getAttribute('data-index')}@${Math.round(r.getBoundingClientRect().top)}`)
        .join(' ');
      return { at, rows };
    });
  for (let attempt = 1; ; attempt++) {
    // To the top: far more than any list (the list stops at its ends).
    await wheel(-1e4);
    const seen = new Map<number, ListRow>();
    for (;;) {
      const now = await drawn();
      for (const { index, last: _last, ...row } of now.rows) seen.set(index, row);
      const last = now.rows.find((r) => r.last);
      if (last && [...Array(last.index + 1).keys()].every((i) => seen.has(i))) {
        await wheel(-1e4);
        return [...seen.entries()].sort((a, b) => a[0] - b[0]).map(([, row]) => row);
      }
      await wheel(0.5);
      // The list moved when any row is drawn elsewhere (the list scrolls in the page's next frames).
      const end = Date.now() + 10000;
      while ((await drawn()).at === now.at && Date.now() < end) await page.waitForTimeout(50);
      if ((await drawn()).at === now.at) break;
    }
    if (attempt === 5) throw new Error('the list did not scroll to its last row, five times over');
  }
}

/** Every row of a side bar section's tree, top to bottom (see {@link listRows}), without the sticky-scroll copies. */
export async function treeRows(page: Page, section: Locator): Promise<TreeRow[]> {
  const rows = await listRows(page, section.locator('.pane-body .monaco-list-rows').first());
  return rows.map(({ level, label, description }) => ({ level, label, description }));
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

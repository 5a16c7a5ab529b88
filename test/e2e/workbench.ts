/**
 * What the e2e tests do in the VS Code 1.100 web workbench, by DOM selectors
 * that proved stable there. Every wait is on a DOM state or a predicate;
 * nothing sleeps for a fixed time.
 *
 * Editor text in the DOM: each `.view-line` holds the rendered line, with
 * spaces as U+00A0 and inlay hints as extra leaf `<span>`s; `clean()` turns
 * the no-break spaces back into spaces before comparing.
 */
import type { Frame, Locator, Page } from 'playwright-core';
import { listRows } from './views';

// Functions given to page.evaluate() and waitForFunction() run in the browser.
// The project compiles without the DOM library (src/ must not use it), so the
// few DOM names those functions use are declared here, loosely, for this
// module only.
declare const document: any;
declare const NodeFilter: { readonly SHOW_TEXT: number };
declare function getComputedStyle(element: DomNode): { readonly visibility: string };
type DomNode = any;

/** DOM text with the editor's no-break spaces as plain spaces. */
export function clean(text: string): string {
  return text.replace(/\u00a0/g, ' ');
}

/** The main editor (the first text editor that is not inside a widget). */
export function editor(page: Page): Locator {
  return page.locator('.editor-instance .monaco-editor').first();
}

/**
 * A pattern for DOM text: `text` literally, its spaces matching the editor's
 * no-break spaces too; `whole` anchors it to the whole text.
 */
export function pattern(text: string, whole = false): RegExp {
  const body = text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&').replace(/ /g, '[ \\u00a0]');
  return new RegExp(whole ? `^${body}$` : body);
}

/** The view line whose text (inlay hints included) contains `text`, or is exactly `text` with `whole`. */
export function line(page: Page, text: string, whole = false): Locator {
  return editor(page)
    .locator('.view-lines .view-line', { hasText: pattern(text, whole) })
    .first();
}

/** Opens a file of the workspace from the Explorer (pinned, as a double-click does). */
export async function openFromExplorer(page: Page, name: string, firstLine: string): Promise<void> {
  const row = page.locator(`.explorer-folders-view .monaco-list-row[aria-label="${name}"]`);
  await row.waitFor();
  await row.dblclick();
  await page.locator('.tabs-container .tab.active', { hasText: name }).waitFor();
  // The first note opened in a session may wait for the workbench to finish starting (longer in 1.139, which also
  // starts its chat and agent host): a longer deadline, still a wait on the line.
  await line(page, firstLine).waitFor({ timeout: 90000 });
}

/**
 * The element that takes the main editor's keyboard input: VS Code 1.100's
 * `textarea.inputarea`, or, where the editor reads keys through the browser's
 * EditContext (the default in 1.139), its `div.native-edit-context`. That
 * editor also holds a read-only `textarea.ime-text-area`: focused, it gets the
 * keys instead of the editor, and Undo (Ctrl+Z) there does nothing.
 */
export function editorInput(page: Page): Locator {
  return editor(page).locator('.native-edit-context, textarea.inputarea').first();
}

/** Puts the keyboard focus in the main editor, and waits until the editor says it has it. */
export async function focusEditor(page: Page): Promise<void> {
  await editorInput(page).focus();
  await page.locator('.editor-instance .monaco-editor.focused').first().waitFor();
}

/** Runs a command by its exact palette title. */
export async function runCommand(page: Page, title: string): Promise<void> {
  await focusEditor(page).catch(() => undefined);
  await page.keyboard.press('F1');
  const input = page.locator('.quick-input-widget .quick-input-box input');
  await input.waitFor({ state: 'visible' });
  await input.fill(`>${title}`);
  const exact = new RegExp(`^${title.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`);
  // The palette ranks fuzzy matches: take the row whose label is the exact title.
  const row = page
    .locator('.quick-input-widget .monaco-list-row')
    .filter({ has: page.locator('.label-name', { hasText: exact }) })
    .first();
  await row.waitFor();
  await row.click();
  await page.locator('.quick-input-widget').waitFor({ state: 'hidden' });
}

/** Moves the cursor to a 1-based line (Go to Line), which also scrolls it into view. */
export async function goToLine(page: Page, lineNumber: number, column = 1): Promise<void> {
  await focusEditor(page);
  await page.keyboard.press('Control+g');
  const input = page.locator('.quick-input-widget .quick-input-box input');
  await input.waitFor({ state: 'visible' });
  await input.fill(`:${lineNumber}:${column}`);
  // An Enter that comes before the picker has read the typed line does nothing and leaves it open (seen under
  // load in 1.100): Enter again while it stays, a few times at most.
  const widget = page.locator('.quick-input-widget');
  for (let attempt = 1; ; attempt++) {
    await page.keyboard.press('Enter');
    const hidden = await widget.waitFor({ state: 'hidden', timeout: 5000 }).then(
      () => true,
      () => false,
    );
    if (hidden) break;
    if (attempt >= 4) throw new Error(`Go to Line did not take line ${lineNumber}`);
  }
  await editor(page)
    .locator('.line-numbers.active-line-number', { hasText: new RegExp(`^${lineNumber}$`) })
    .waitFor();
}

/** The 1-based number of the first line of a note's text that contains `text`. */
export function lineOf(noteText: string, text: string, after = 0): number {
  const lines = noteText.split('\n');
  for (let i = after; i < lines.length; i++) if (lines[i].includes(text)) return i + 1;
  throw new Error(`no line contains ${JSON.stringify(text)}`);
}

/** A box on the page: x, y, width, height in CSS pixels. */
export interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * The box of the `nth` occurrence of `word` in the first view line starting
 * with `lineStart` (document text only: inlay-hint spans are skipped, they
 * carry no document text). Null when the line is not rendered.
 */
export async function wordBox(page: Page, lineStart: string, word: string): Promise<Box | null> {
  return editor(page).evaluate(
    (root: DomNode, [start, w]: readonly [string, string]) => {
      // (No named helper functions in here: the test runner's transpiler would wrap them in a helper the page lacks.)
      for (const el of Array.from<DomNode>(root.querySelectorAll('.view-lines .view-line'))) {
        if (
          !String(el.textContent ?? '')
            .replace(/\u00a0/g, ' ')
            .startsWith(start)
        )
          continue;
        // Text nodes of the line in order, with their running offsets.
        const walker = document.createTreeWalker(el, NodeFilter.SHOW_TEXT);
        const nodes: DomNode[] = [];
        for (let n = walker.nextNode(); n; n = walker.nextNode()) nodes.push(n);
        const full = nodes
          .map((n) => n.data as string)
          .join('')
          .replace(/\u00a0/g, ' ');
        const at = full.indexOf(w);
        if (at < 0) return null;
        let offset = 0;
        const range = document.createRange();
        for (const n of nodes) {
          const end = offset + n.data.length;
          if (at >= offset && at < end) range.setStart(n, at - offset);
          if (at + w.length > offset && at + w.length <= end) range.setEnd(n, at + w.length - offset);
          offset = end;
        }
        const r = range.getBoundingClientRect();
        return { x: r.x, y: r.y, width: r.width, height: r.height };
      }
      return null;
    },
    [lineStart, word] as const,
  );
}

/**
 * Hovers `word` on the line starting with `lineStart` until a hover whose
 * text matches `expect` shows; returns that text. A line re-rendered by
 * arriving inlay hints can move the word away under the mouse, so the
 * pointer leaves and comes back, each attempt waiting on the hover widget.
 */
export async function hoverText(page: Page, lineStart: string, word: string, expect: RegExp): Promise<string> {
  const hover = page.locator('.monaco-hover-content').filter({ hasText: expect }).first();
  const seen: string[] = [];
  for (let attempt = 0; attempt < 5; attempt++) {
    const box = await wordBox(page, lineStart, word);
    if (!box) throw new Error(`the line "${lineStart}" is not on screen`);
    await page.mouse.move(box.x + box.width / 2, box.y + box.height * 6);
    await page.mouse.move(box.x + Math.min(box.width / 2, 12), box.y + box.height / 2, { steps: 4 });
    try {
      await hover.waitFor({ state: 'visible', timeout: 6000 });
      return clean(await hover.innerText());
    } catch {
      seen.push(...(await page.locator('.monaco-hover-content').allInnerTexts()));
    }
  }
  throw new Error(`no hover matching ${expect} over "${word}"; hovers seen: ${JSON.stringify(seen)}`);
}

/** Moves the pointer out of the editor and closes any hover. */
export async function dismissHover(page: Page): Promise<void> {
  await page.mouse.move(640, 5);
  await page.keyboard.press('Escape');
  await page
    .locator('.monaco-hover-content')
    .first()
    .waitFor({ state: 'hidden' })
    .catch(() => undefined);
}

/** The active editor tab is dirty (unsaved changes). */
export async function activeTabDirty(page: Page): Promise<boolean> {
  return page
    .locator('.tabs-container .tab.active')
    .first()
    .evaluate((e: DomNode) => Boolean(e.classList.contains('dirty')));
}

/** Waits until the active editor tab has no unsaved changes. */
export async function waitClean(page: Page): Promise<void> {
  await page.waitForFunction(() => !document.querySelector('.tabs-container .tab.active.dirty'));
}

/** Waits until, for each group of `texts`, one Problems panel row contains all of the group. */
export async function waitProblems(page: Page, groups: readonly (readonly string[])[], timeout = 60000): Promise<void> {
  await page.waitForFunction(
    (want: readonly (readonly string[])[]) => {
      const rows = Array.from<DomNode>(document.querySelectorAll('.markers-panel .monaco-list-row')).map((r) =>
        String(r.textContent ?? '').replace(/\u00a0/g, ' '),
      );
      return want.every((group) => rows.some((r) => group.every((w) => r.includes(w))));
    },
    groups,
    { timeout },
  );
}

/** Waits until no Problems panel row contains `text`. */
export async function waitNoProblem(page: Page, text: string, timeout = 60000): Promise<void> {
  await page.waitForFunction(
    (t: string) =>
      Array.from<DomNode>(document.querySelectorAll('.markers-panel .monaco-list-row')).every(
        (r) =>
          !String(r.textContent ?? '')
            .replace(/\u00a0/g, ' ')
            .includes(t),
      ),
    text,
    { timeout },
  );
}

/** Waits until `count` squiggles of a kind are drawn in the main editor. */
export async function waitSquiggles(page: Page, kind: 'error' | 'warning' | 'info', count: number): Promise<void> {
  await page.waitForFunction(
    ([k, n]: readonly [string, number]) =>
      document.querySelectorAll(`.editor-instance .view-overlays .squiggly-${k}`).length >= n,
    [kind, count] as const,
  );
}

/** Every row label of the Outline view, top to bottom (its list draws only the rows in view: see `listRows`). */
export async function outlineLabels(page: Page): Promise<string[]> {
  return (await listRows(page, page.locator('.outline-pane .monaco-list-rows').first())).map((r) => r.aria);
}

/** The rows of the Problems panel, as text. */
export async function problemRows(page: Page): Promise<string[]> {
  return page
    .locator('.markers-panel .monaco-list-row')
    .evaluateAll((rows: DomNode[]) => rows.map((r) => String(r.textContent ?? '').replace(/\u00a0/g, ' ')));
}

/**
 * The text each squiggle of a kind (`error`, `warning`) underlines, read
 * from the DOM: the squiggle's horizontal extent against the characters of
 * the view line at the same height.
 */
export async function squiggledText(page: Page, kind: 'error' | 'warning' | 'info'): Promise<string[]> {
  return editor(page).evaluate((root: DomNode, k: string) => {
    const lines = Array.from<DomNode>(root.querySelectorAll('.view-lines .view-line'));
    const out: string[] = [];
    for (const sq of Array.from<DomNode>(root.querySelectorAll(`.view-overlays .squiggly-${k}`))) {
      const b = sq.getBoundingClientRect();
      const mid = b.y + b.height / 2;
      const el = lines.find((l) => {
        const r = l.getBoundingClientRect();
        return mid >= r.top && mid < r.bottom;
      });
      if (!el) continue;
      const walker = document.createTreeWalker(el, NodeFilter.SHOW_TEXT);
      let text = '';
      for (let n = walker.nextNode(); n; n = walker.nextNode()) {
        for (let i = 0; i < n.data.length; i++) {
          const range = document.createRange();
          range.setStart(n, i);
          range.setEnd(n, i + 1);
          const c = range.getBoundingClientRect();
          const cx = c.x + c.width / 2;
          if (c.width > 0 && cx > b.left && cx < b.right) text += n.data[i];
        }
      }
      out.push(text.replace(/\u00a0/g, ' '));
    }
    return out;
  }, kind);
}

/** The labels of the open suggest widget's rows. */
export async function suggestions(page: Page): Promise<string[]> {
  const widget = page.locator('.editor-widget.suggest-widget');
  await widget.locator('.monaco-list-row').first().waitFor();
  return widget.locator('.monaco-list-row .label-name').allInnerTexts();
}

/**
 * The frame (at any depth: webviews are an outer host frame holding the
 * extension's document) that has an element matching `selector`, with
 * `text` in it when given. Waits on each present frame and starts over when
 * a new frame is attached.
 */
export async function frameWith(page: Page, selector: string, text?: string, timeout = 60000): Promise<Frame> {
  const deadline = Date.now() + timeout;
  const never = new Promise<never>(() => undefined);
  for (;;) {
    const left = deadline - Date.now();
    if (left <= 0) throw new Error(`no frame shows ${selector}${text ? ` with "${text}"` : ''} within ${timeout} ms`);
    const frames = page.frames().filter((f) => f !== page.mainFrame());
    const found = await Promise.race([
      ...frames.map((f) =>
        f
          .locator(selector, text ? { hasText: pattern(text) } : {})
          .first()
          .waitFor({ timeout: left })
          .then(
            () => f,
            () => never,
          ),
      ),
      page.waitForEvent('frameattached', { timeout: left }).then(() => null),
    ]);
    if (found) return found;
  }
}

/**
 * Waits for the code lens titled `title` drawn just above the line starting
 * with `lineStart` and returns its centre on screen. Lenses are re-rendered
 * whenever they are refreshed, so the lens and the line are found together
 * in one look at the page.
 */
export async function lensShown(
  page: Page,
  lineStart: string,
  title: string,
): Promise<{ id: string; x: number; y: number }> {
  const handle = await page.waitForFunction(
    ([start, t]: readonly [string, string]) => {
      // (No named helper functions in here: see wordBox.)
      const root = document.querySelector('.editor-instance .monaco-editor');
      const target =
        root &&
        Array.from<DomNode>(root.querySelectorAll('.view-lines .view-line')).find((l) =>
          String(l.textContent ?? '')
            .replace(/\u00a0/g, ' ')
            .startsWith(start),
        );
      if (!target) return null;
      const line = target.getBoundingClientRect();
      for (const a of Array.from<DomNode>(root.querySelectorAll('.codelens-decoration a'))) {
        const box = a.getBoundingClientRect();
        const shown = getComputedStyle(a).visibility === 'visible' && box.width > 0;
        if (shown && String(a.textContent).trim() === t && box.y < line.y && line.y - box.y < 3 * line.height)
          return { id: String(a.id), x: box.x + box.width / 2, y: box.y + box.height / 2 };
      }
      return null;
    },
    [lineStart, title] as const,
  );
  const at = (await handle.jsonValue()) as { id: string; x: number; y: number };
  await handle.dispose();
  return at;
}

/**
 * Clicks that lens and waits for `opened` (what the click should bring up).
 * A lens refreshed between the press and the release of the button is a new
 * element and gets no click; then the lens is found again and clicked again.
 */
export async function clickLensAbove<T>(
  page: Page,
  lineStart: string,
  title: string,
  opened: (timeout: number) => Promise<T>,
): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    const lens = await lensShown(page, lineStart, title);
    await editor(page)
      .locator(`.codelens-decoration a[id="${lens.id}"]`)
      .click({ timeout: 5000 })
      .catch(() => undefined);
    try {
      return await opened(attempt < 3 ? 15000 : 60000);
    } catch (err) {
      if (attempt === 3) throw err;
    }
  }
}

/** How much of a canvas's plot area (its `data-area`: left, top, right, bottom in CSS pixels) has been painted. */
export interface Ink {
  /** Pixels with any opacity. */
  readonly painted: number;
  readonly total: number;
  /** Distinct opaque colours. */
  readonly colours: number;
}

/** Reads the pixels of a chart canvas's plot area in a frame. */
export async function canvasInk(frame: Frame, selector: string): Promise<Ink> {
  return frame.locator(selector).evaluate((c: DomNode) => {
    const [l, t, r, b] = String(c.dataset.area ?? '')
      .split(',')
      .map(Number);
    const ratio = c.width / c.clientWidth;
    const x = Math.floor(l * ratio);
    const y = Math.floor(t * ratio);
    const w = Math.max(1, Math.floor((r - l) * ratio));
    const h = Math.max(1, Math.floor((b - t) * ratio));
    const data = c.getContext('2d').getImageData(x, y, w, h).data;
    const colours = new Set<number>();
    let painted = 0;
    for (let i = 0; i < data.length; i += 4) {
      if (data[i + 3] === 0) continue;
      painted++;
      if (data[i + 3] === 255) colours.add((data[i] << 16) | (data[i + 1] << 8) | data[i + 2]);
    }
    return { painted, total: data.length / 4, colours: colours.size };
  });
}

/**
 * Waits until every finite CSS animation or transition of the page (a
 * hover's fade-in, say) has finished; endless ones (a blinking cursor) are
 * left alone.
 */
export async function waitAnimations(page: Page): Promise<void> {
  await page.waitForFunction(() =>
    document
      .getAnimations()
      .every((a: DomNode) => a.playState !== 'running' || a.effect?.getTiming().iterations === Infinity),
  );
}

/**
 * Where, within one view line, the inlay hint starting with `hint` and the
 * document text `text` are drawn: both measured in one look at the page, so
 * a re-render between two measurements cannot mix two layouts.
 */
export async function hintPlacement(viewLine: Locator, hint: string, text: string): Promise<{ hint: Box; text: Box }> {
  return viewLine.evaluate(
    (el: DomNode, [h, t]: readonly [string, string]) => {
      const leaves = Array.from<DomNode>(el.querySelectorAll('span')).filter((s) => s.querySelector('span') === null);
      const hintEl = leaves.find((s) =>
        String(s.textContent)
          .replace(/\u00a0/g, ' ')
          .startsWith(h),
      );
      const textEl = leaves.find((s) => String(s.textContent).includes(t));
      if (!hintEl || !textEl) throw new Error(`line without ${hintEl ? t : h}: ${String(el.textContent)}`);
      const a = hintEl.getBoundingClientRect();
      const b = textEl.getBoundingClientRect();
      return {
        hint: { x: a.x, y: a.y, width: a.width, height: a.height },
        text: { x: b.x, y: b.y, width: b.width, height: b.height },
      };
    },
    [hint, text] as const,
  );
}

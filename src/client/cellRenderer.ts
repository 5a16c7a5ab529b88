/**
 * Rendered Markdown cells of a notebook: after each `levels` fence, the
 * block's results table and sparkline, exactly as the Markdown preview shows
 * them (the same core HTML, no script). It extends VS Code's own notebook
 * Markdown renderer (`vscode.markdown-it-renderer`) through the renderer
 * extension point, and runs inside the notebook's output webview, so it is
 * bundled for the browser with the whole core and imports no editor API.
 *
 * The webview reads no other note, so a block that takes values from other
 * runs cannot be analysed here: the extension makes its results with the run
 * log's runs (cellRendererMessaging.ts) and sends them, keyed by the block's
 * body, with the display settings. A cell rendered before they come says
 * where its values come from, and is filled in when they do.
 */
import type MarkdownIt from 'markdown-it';
import { DEFAULT_DISPLAY, type DisplayOptions } from '../core';
import { levelsPreview } from './preview';

/** The part of VS Code's renderer context this module uses (`vscode-notebook-renderer`'s `RendererContext`). */
interface RendererContext {
  getRenderer(id: string): Promise<{ extendMarkdownIt(f: (md: MarkdownIt) => void): void } | undefined>;
  readonly onDidReceiveMessage?: (listener: (message: unknown) => void) => unknown;
  readonly postMessage?: (message: unknown) => void;
}

/** Display options sent by the extension host, checked field by field (a message may be anything). */
function displayFrom(message: unknown, current: DisplayOptions): DisplayOptions {
  if (typeof message !== 'object' || message === null) return current;
  const m = message as Record<string, unknown>;
  const digits = typeof m.digits === 'number' && m.digits >= 2 && m.digits <= 8 ? Math.round(m.digits) : current.digits;
  const temperature =
    m.temperature === 'auto' || m.temperature === 'kelvin' || m.temperature === 'beta-first'
      ? m.temperature
      : current.temperature;
  const percent = typeof m.percent === 'boolean' ? m.percent : current.percent;
  return { digits, temperature, percent };
}

/** The results the extension made for blocks that refer out, checked entry by entry (a message may be anything). */
function madeFrom(message: unknown): Map<string, string> | null {
  const given = (message as { results?: unknown } | null)?.results;
  if (typeof given !== 'object' || given === null || Array.isArray(given)) return null;
  const made = new Map<string, string>();
  for (const [key, html] of Object.entries(given as Record<string, unknown>))
    if (/^[0-9a-f]{8}-[0-9a-f]{1,8}$/.test(key) && typeof html === 'string') made.set(key, html);
  return made;
}

/** The little of the webview's DOM used here (the project's types leave the DOM out: no other code has one). */
interface DomElement {
  readonly shadowRoot: DomRoot | null;
  getAttribute(name: string): string | null;
  innerHTML: string;
}
interface DomRoot {
  querySelectorAll(selector: string): ArrayLike<DomElement>;
}

/**
 * Fills the rendered cells' keyed results in again from `made`. VS Code renders each Markdown cell into a shadow
 * root of its own (and renders a cell anew only when it changes), so the cells already shown are found there.
 */
export function fillIn(doc: DomRoot, made: ReadonlyMap<string, string>): void {
  const roots: DomRoot[] = [doc];
  for (const el of Array.from(doc.querySelectorAll('*'))) if (el.shadowRoot) roots.push(el.shadowRoot);
  for (const root of roots)
    for (const el of Array.from(root.querySelectorAll('.boltzmark-keyed[data-boltzmark-key]'))) {
      const html = made.get(el.getAttribute('data-boltzmark-key') ?? '');
      if (html !== undefined && el.innerHTML !== html) el.innerHTML = html;
    }
}

/** Called by VS Code when a notebook first renders Markdown. */
export async function activate(ctx: RendererContext): Promise<void> {
  const markdown = await ctx.getRenderer('vscode.markdown-it-renderer');
  if (!markdown) throw new Error('Boltzmark: VS Code’s notebook Markdown renderer is not available');
  let display: DisplayOptions = DEFAULT_DISPLAY;
  let infoStrings: readonly string[] = [];
  let made = new Map<string, string>();
  ctx.onDidReceiveMessage?.((message) => {
    display = displayFrom(message, display);
    const extra = (message as { infoStrings?: unknown } | null)?.infoStrings;
    if (Array.isArray(extra) && extra.every((s) => typeof s === 'string')) infoStrings = extra as string[];
    const results = madeFrom(message);
    if (results) {
      made = results;
      const doc = (globalThis as { document?: DomRoot }).document;
      if (doc) fillIn(doc, made);
    }
  });
  // Ask the extension for the settings; until they come, cells render with the defaults.
  ctx.postMessage?.({ request: 'display' });
  markdown.extendMarkdownIt((md) => {
    levelsPreview(md, {
      infoStrings: () => infoStrings,
      display: () => display,
      madeElsewhere: (key) => made.get(key),
    });
  });
}

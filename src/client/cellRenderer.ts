/**
 * Rendered Markdown cells of a notebook: after each `levels` fence, the
 * block's results table and sparkline, exactly as the Markdown preview shows
 * them (the same core HTML, no script). It extends VS Code's own notebook
 * Markdown renderer (`vscode.markdown-it-renderer`) through the renderer
 * extension point, and runs inside the notebook's output webview, so it is
 * bundled for the browser with the whole core and imports no editor API.
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

/** Called by VS Code when a notebook first renders Markdown. */
export async function activate(ctx: RendererContext): Promise<void> {
  const markdown = await ctx.getRenderer('vscode.markdown-it-renderer');
  if (!markdown) throw new Error('Boltzmark: VS Code’s notebook Markdown renderer is not available');
  let display: DisplayOptions = DEFAULT_DISPLAY;
  let infoStrings: readonly string[] = [];
  ctx.onDidReceiveMessage?.((message) => {
    display = displayFrom(message, display);
    const extra = (message as { infoStrings?: unknown } | null)?.infoStrings;
    if (Array.isArray(extra) && extra.every((s) => typeof s === 'string')) infoStrings = extra as string[];
  });
  // Ask the extension for the settings; until they come, cells render with the defaults.
  ctx.postMessage?.({ request: 'display' });
  markdown.extendMarkdownIt((md) => {
    levelsPreview(md, { infoStrings: () => infoStrings, display: () => display });
  });
}

/**
 * The Markdown preview plugin: after each `levels` fence, the block's results
 * as a table and an S(E) sparkline (HTML and SVG made by the core; no script,
 * so the preview's security settings and HTML export keep them).
 */
import type MarkdownIt from 'markdown-it';
import {
  Analyzer,
  escapeText,
  findFencedBlocks,
  resultsHtml,
  type DisplayOptions,
  type Externals,
  type PreviewBlock,
} from '../core';
import { refersOut } from './refersOut';

/**
 * Options: which fences are ours and how numbers are shown, for the note
 * being rendered: each gets markdown-it's render `env`, in which VS Code's
 * preview passes the note as `currentDocument`, so the note's folder settings apply.
 */
export interface PreviewOptions {
  readonly infoStrings: (env: unknown) => readonly string[];
  readonly display: (env: unknown) => DisplayOptions;
  /**
   * The note's sources for values given by reference (other runs: `thermal: { run: … }`), or null; without
   * them a block that refers to another run says so (see {@link unfollowedHtml}).
   */
  readonly externals?: (env: unknown) => Externals | null;
  /**
   * For a renderer that cannot follow references itself (a notebook's rendered cells): the results of a block
   * that refers out, made elsewhere, by the {@link bodyKey} of its body; undefined when not made yet.
   */
  readonly madeElsewhere?: (key: string) => string | undefined;
}

/** Extends a markdown-it instance (VS Code's preview one, or any other). */
export function levelsPreview(md: MarkdownIt, options: PreviewOptions): MarkdownIt {
  const analyzer = new Analyzer();
  const fence = md.renderer.rules.fence ?? ((tokens, idx, opts, _env, self) => self.renderToken(tokens, idx, opts));
  md.renderer.rules.fence = (tokens, idx, opts, env, self) => {
    const html = fence(tokens, idx, opts, env, self);
    const token = tokens[idx];
    const language = token.info.trim().split(/\s+/, 1)[0] ?? '';
    if (language !== 'levels' && !options.infoStrings(env).includes(language)) return html;
    try {
      const body = token.content;
      if (options.madeElsewhere && refersOut(body)) {
        const key = bodyKey(body);
        return html + keyed(key, options.madeElsewhere(key) ?? unfollowedHtml(analyzer.analyseBody(body, null)));
      }
      const externals = refersOut(body) ? (options.externals?.(env) ?? null) : null;
      return html + resultsOrUnfollowed(analyzer.analyseBody(body, externals), options.display(env));
    } catch {
      // The preview must render even if analysis fails; the editor shows the problem.
      return html;
    }
  };
  return md;
}

/** The results of a block, or, when its only errors are references nothing could follow, a note saying so. */
export function resultsOrUnfollowed(report: PreviewBlock, display: DisplayOptions): string {
  const errors = report.problems.filter((p) => p.severity === 'error');
  return errors.length > 0 && errors.every((p) => p.code === 'reference-unavailable')
    ? unfollowedHtml(report)
    : resultsHtml(report, display);
}

/**
 * What shows for a block whose values come from other runs where they have not been read (yet): the runs it
 * names, not an error (the block may well be right; the editor's hover follows the references).
 */
export function unfollowedHtml(report: PreviewBlock): string {
  const name = report.meta.id ?? 'levels block';
  const runs = [...new Set((report.meta.refs ?? []).map((r) => r.id))];
  const named = runs.map((id) => `<code>${escapeText(id)}</code>`).join(', ');
  return (
    `<div class="boltzmark-results"><p class="boltzmark-title"><strong>${escapeText(name)}</strong> — ` +
    `<span class="boltzmark-status">takes values from other runs</span></p>` +
    `<p class="boltzmark-unfollowed">${named ? `From ${named}: n` : 'N'}ot read here yet; the block's hover in the editor shows its results.</p></div>`
  );
}

/** A short key of a block body (FNV-1a, 32 bits, hex): names the results made elsewhere for it. */
export function bodyKey(body: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < body.length; i++) {
    h ^= body.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return `${h.toString(16).padStart(8, '0')}-${body.length.toString(16)}`;
}

/** The results wrapped with the key they can be found again by, when they are made anew. */
function keyed(key: string, html: string): string {
  return `<div class="boltzmark-keyed" data-boltzmark-key="${key}">${html}</div>`;
}

/**
 * The results of every block of these Markdown texts (a notebook's cells) that refers out, analysed with the
 * notebook's sources, by {@link bodyKey}: what a renderer that follows no reference shows for them.
 */
export function madeResults(
  texts: readonly string[],
  externals: Externals | null,
  display: DisplayOptions,
  infoStrings: readonly string[],
): Record<string, string> {
  const analyzer = new Analyzer({ infoStrings: [...infoStrings] });
  const out: Record<string, string> = {};
  for (const text of texts)
    for (const block of findFencedBlocks(text)) {
      if (block.language !== 'levels' && !infoStrings.includes(block.language)) continue;
      if (!refersOut(block.body)) continue;
      out[bodyKey(block.body)] = resultsOrUnfollowed(analyzer.analyseBody(block.body, externals), display);
    }
  return out;
}

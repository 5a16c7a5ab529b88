/**
 * The Markdown preview plugin: after each `levels` fence, the block's results
 * as a table and an S(E) sparkline (HTML and SVG made by the core; no script,
 * so the preview's security settings and HTML export keep them).
 */
import type MarkdownIt from 'markdown-it';
import { Analyzer, resultsHtml, type DisplayOptions, type Externals } from '../core';

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
   * it a block that refers to another run shows `reference-unavailable`.
   */
  readonly externals?: (env: unknown) => Externals | null;
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
      return (
        html +
        resultsHtml(
          analyzer.analyseBody(token.content, refersOut(token.content) ? (options.externals?.(env) ?? null) : null),
          options.display(env),
        )
      );
    } catch {
      // The preview must render even if analysis fails; the editor shows the problem.
      return html;
    }
  };
  return md;
}

/** Whether a block body may take values from outside (another run, a spectrum file): only those ask for sources. */
function refersOut(body: string): boolean {
  return body.includes('run:') || body.includes('spectrum');
}

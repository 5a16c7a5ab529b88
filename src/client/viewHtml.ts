/**
 * The curve view's HTML: a static page shell with a strict Content Security
 * Policy and a fresh nonce per render. Nothing from a note is written into
 * it: the block data arrive only by postMessage and are shown with
 * `textContent`. No vscode import, so tests can build the same page.
 */

/** What the page needs from its host. */
export interface ViewHtmlOptions {
  /** The webview's resource origin for the CSP (`webview.cspSource`). */
  readonly cspSource: string;
  /** URL of the bundled script (`dist/media/view.js`) as the webview sees it. */
  readonly scriptUri: string;
  /** URL of `media/view.css`. */
  readonly styleUri: string;
  /** A fresh nonce, from {@link newNonce}. */
  readonly nonce: string;
}

/**
 * 128 random bits from the platform's CSPRNG (Web Crypto, in Node.js as in a browser), base64-encoded: a nonce
 * for one render.
 */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

/** Escapes text for an HTML attribute value or text node. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** The Content-Security-Policy of the page: nothing but our own script, styles, images and fonts. */
export function contentSecurityPolicy(cspSource: string, nonce: string): string {
  return [
    "default-src 'none'",
    `img-src ${cspSource} data:`,
    `style-src ${cspSource} 'nonce-${nonce}'`,
    `script-src 'nonce-${nonce}'`,
    `font-src ${cspSource}`,
    "form-action 'none'",
    "base-uri 'none'",
  ].join('; ');
}

/** The page. Every interpolated value is escaped; controls get their listeners from the script. */
export function viewHtml(o: ViewHtmlOptions): string {
  const e = escapeHtml;
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${e(contentSecurityPolicy(o.cspSource, o.nonce))}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="stylesheet" href="${e(o.styleUri)}" nonce="${e(o.nonce)}">
<title>Curve view</title>
</head>
<body data-drawn="0" data-state="empty">
<header>
  <h1 id="block-title">Curve view</h1>
  <span id="block-status" role="status"></span>
  <div class="controls">
    <label for="unit-select">Energy in</label>
    <vscode-single-select id="unit-select" aria-label="Energy unit">
      <vscode-option value="block">the block’s unit</vscode-option>
      <vscode-option value="K">kelvin (E/k)</vscode-option>
    </vscode-single-select>
    <vscode-button id="pin-button" title="Keep this run on the chart while the cursor moves on">Pin run</vscode-button>
    <vscode-button id="export-png" secondary title="Save both charts as a PNG image">Save PNG</vscode-button>
    <vscode-button id="export-csv" secondary title="Save the curves and points as CSV">Save CSV</vscode-button>
    <vscode-button id="copy-link" secondary title="Save a PNG beside the note and copy a Markdown image link to it">Copy image link</vscode-button>
  </div>
</header>
<div id="problem" role="alert" hidden></div>
<main>
  <section id="charts" hidden>
    <div class="chart"><canvas id="entropy-chart" role="img" aria-label="Entropy against energy"></canvas></div>
    <div class="chart"><canvas id="beta-chart" role="img" aria-label="Inverse temperature against energy"></canvas></div>
  </section>
  <section id="measurement" hidden>
    <h2 id="measurement-title">Measurement</h2>
    <div class="chart small"><canvas id="measurement-chart" role="img" aria-label="The measurement and its fit"></canvas></div>
  </section>
  <section id="spectra" hidden>
    <div class="runs-head">
      <h2 id="spectra-title">Spectrum</h2>
      <label for="spectra-pick">Reference</label>
      <vscode-single-select id="spectra-pick" aria-label="The spectrum reference shown"></vscode-single-select>
      <vscode-button id="spectra-png" secondary title="Save the spectrum chart as a PNG image">Save PNG</vscode-button>
      <vscode-button id="spectra-csv" secondary title="Save the points drawn, the baseline and the integral as CSV">Save CSV</vscode-button>
    </div>
    <p id="spectra-caption" class="note"></p>
    <div class="chart small"><canvas id="spectrum-chart" role="img" aria-label="The spectrum with the integrated region shaded"></canvas></div>
  </section>
  <section id="runs" hidden>
    <div class="runs-head">
      <h2 id="runs-title">Runs compared</h2>
      <label for="runs-quantity">Result</label>
      <vscode-single-select id="runs-quantity" aria-label="Result compared across the runs">
        <vscode-option value="polarization">polarization P</vscode-option>
        <vscode-option value="beta">inverse temperature β</vscode-option>
        <vscode-option value="temperature">temperature T</vscode-option>
        <vscode-option value="enhancement">enhancement ε</vscode-option>
        <vscode-option value="timeConstant">time constant T₁ or τ</vscode-option>
        <vscode-option value="gain">gain coefficient g₀</vscode-option>
      </vscode-single-select>
      <vscode-button id="runs-png" secondary title="Save the run comparison as a PNG image">Save PNG</vscode-button>
      <vscode-button id="runs-csv" secondary title="Save the compared values and uncertainties as CSV">Save CSV</vscode-button>
    </div>
    <p id="runs-empty" class="note" hidden></p>
    <div class="chart"><canvas id="runs-chart" role="img" aria-label="A result of each run against date or order"></canvas></div>
  </section>
  <aside>
    <dl id="facts"></dl>
    <ul id="notes"></ul>
    <section id="pins" hidden>
      <h2>Pinned runs</h2>
      <ul id="pin-list"></ul>
    </section>
  </aside>
</main>
<script nonce="${e(o.nonce)}" src="${e(o.scriptUri)}"></script>
</body>
</html>
`;
}

/**
 * The stand-in for VS Code's side of a webview, injected before the page's
 * own script: `acquireVsCodeApi()` (recording posted messages, keeping state
 * in sessionStorage so it survives a reload) and the theme VS Code would
 * apply (variables on <html>, the body class). It also records CSP
 * violations and console warnings from the first moment.
 *
 * Written as plain JavaScript text: tsx compiles test files with esbuild's
 * keepNames, whose `__name` helper does not exist inside the page.
 */
import type { TestTheme } from './themes';

/** The init script for one page load. */
export function standInScript(theme: TestTheme): string {
  return `(() => {
  const test = (window.__test = { posted: [], violations: [], warnings: [], dialogs: 0 });
  document.addEventListener('securitypolicyviolation', (e) => {
    test.violations.push({ directive: e.violatedDirective, blocked: e.blockedURI, sample: e.sample });
  });
  test.applyTheme = (theme) => {
    for (const [k, v] of Object.entries(theme.vars)) document.documentElement.style.setProperty(k, v);
    document.body.classList.remove('vscode-light', 'vscode-dark', 'vscode-high-contrast');
    document.body.classList.add(theme.bodyClass);
  };
  let acquired = false;
  window.acquireVsCodeApi = () => {
    if (acquired) throw new Error('acquireVsCodeApi may be called only once');
    acquired = true;
    test.applyTheme(${JSON.stringify(theme)});
    return {
      postMessage: (m) => test.posted.push(JSON.parse(JSON.stringify(m))),
      getState: () => JSON.parse(sessionStorage.getItem('state') ?? 'null'),
      setState: (s) => sessionStorage.setItem('state', JSON.stringify(s)),
    };
  };
})();`;
}

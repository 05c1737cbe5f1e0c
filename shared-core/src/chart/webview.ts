/**
 * The HTML of a webview that shows the chart beside a note (pure: text in, text out; the VS Code
 * client creates the panel and posts updates). Strict Content Security Policy: nothing may be
 * loaded, and only the nonce'd style and script run. The page follows the editor theme through
 * {@link vscodeThemeCss} and replaces the chart when it receives
 * `{ type: 'dewmark.chart', svg }` — the host renders that SVG with the same `styleNonce`.
 */
import { escapeXml } from './render';
import { vscodeThemeCss } from './style';

/** The message a host posts to replace the chart. */
export interface ChartUpdateMessage {
  type: 'dewmark.chart';
  /** The new chart, rendered with `styleNonce` set to the page's nonce. */
  svg: string;
}

/** Options of {@link chartWebviewHtml}. */
export interface ChartWebviewOptions {
  /** The first chart, rendered with `styleNonce: nonce`. */
  svg: string;
  /** A fresh random nonce per panel (base64 or hex characters only). */
  nonce: string;
  /** Page title (the note's name). */
  title?: string;
}

/** A nonce is only letters, digits and `+/=_-` (what base64 and hex produce). */
function checkNonce(nonce: string): string {
  if (!/^[A-Za-z0-9+/=_-]{16,}$/.test(nonce))
    throw new RangeError('chartWebviewHtml: the nonce must be at least 16 base64 or hex characters');
  return nonce;
}

/** The webview page: CSP `default-src 'none'`, nonce'd style and script, the chart inline. */
export function chartWebviewHtml(opts: ChartWebviewOptions): string {
  const nonce = checkNonce(opts.nonce);
  const csp = `default-src 'none'; style-src 'nonce-${nonce}'; script-src 'nonce-${nonce}'; img-src data:; base-uri 'none'; form-action 'none'`;
  const script = `(function () {
  var root = document.getElementById('dewmark-chart');
  window.addEventListener('message', function (event) {
    var m = event.data;
    if (m && m.type === 'dewmark.chart' && typeof m.svg === 'string') {
      root.innerHTML = m.svg;
      root.setAttribute('data-updates', String(Number(root.getAttribute('data-updates') || '0') + 1));
    }
  });
})();`;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${csp}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeXml(opts.title ?? 'Psychrometric chart')}</title>
<style nonce="${nonce}">${vscodeThemeCss()}
body{margin:0;padding:10px;background:var(--vscode-editor-background,transparent);color:var(--vscode-editor-foreground,inherit)}
#dewmark-chart svg{display:block;max-width:100%;height:auto}</style>
</head>
<body>
<main id="dewmark-chart" aria-live="polite">${opts.svg}</main>
<script nonce="${nonce}">${script}</script>
</body>
</html>
`;
}

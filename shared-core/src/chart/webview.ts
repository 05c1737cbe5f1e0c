/**
 * The HTML of a webview that shows the chart beside a note (pure: text in, text out; the VS Code
 * client creates the panel and posts updates). Strict Content Security Policy: nothing may be
 * loaded, and only the nonce'd style and script run. The page follows the editor theme through
 * {@link vscodeThemeCss} and replaces the chart when it receives
 * `{ type: 'dewmark.chart', svg, info? }` — the host renders that SVG with the same `styleNonce`.
 * It tells the host the width it has whenever that changes (`{ type: 'dewmark.chart.resize',
 * width }`, from a ResizeObserver), so the host draws the chart again at that width: the chart
 * follows its panel with its text at full size, instead of being scaled.
 */
import { escapeXml } from './render';
import { vscodeThemeCss } from './style';

/** The message a host posts to replace the chart. */
export interface ChartUpdateMessage {
  type: 'dewmark.chart';
  /** The new chart, rendered with `styleNonce` set to the page's nonce. */
  svg: string;
  /** A line above the chart saying what it shows (which section; that it follows the cursor). */
  info?: string;
}

/** The message the page posts when its width changes: the width the chart may take, CSS px. */
export interface ChartResizeMessage {
  type: 'dewmark.chart.resize';
  width: number;
}

/** The chart width for a panel width: the space the page gives it, within bounds (px). */
export function chartWidthFor(panelWidth: number): number {
  if (!Number.isFinite(panelWidth)) return 960;
  return Math.round(Math.min(2400, Math.max(480, panelWidth)));
}

/** The plot height that goes with a chart width (about the proportions of the default 960 × 520), px. */
export function plotHeightFor(width: number): number {
  return Math.round(Math.min(900, Math.max(260, width * 0.54)));
}

/** Options of {@link chartWebviewHtml}. */
export interface ChartWebviewOptions {
  /** The first chart, rendered with `styleNonce: nonce`. */
  svg: string;
  /** A fresh random nonce per panel (base64 or hex characters only). */
  nonce: string;
  /** Page title (the note's name). */
  title?: string;
  /** The first line above the chart (see {@link ChartUpdateMessage.info}). */
  info?: string;
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
  const csp =
    `default-src 'none'; style-src 'nonce-${nonce}'; script-src ` +
    `'nonce-${nonce}'; img-src data:; base-uri 'none'; form-action 'none'`;
  const script = `(function () {
  var root = document.getElementById('dewmark-chart');
  var info = document.getElementById('dewmark-chart-info');
  var host = typeof acquireVsCodeApi === 'function' ? acquireVsCodeApi() : null;
  window.addEventListener('message', function (event) {
    var m = event.data;
    if (m && m.type === 'dewmark.chart' && typeof m.svg === 'string') {
      root.innerHTML = m.svg;
      if (typeof m.info === 'string') info.textContent = m.info;
      root.setAttribute('data-updates', String(Number(root.getAttribute('data-updates') || '0') + 1));
    }
  });
  // Tell the host the width the chart may take (once per frame at most), so it draws it again at that width.
  var sent = 0, pending = false;
  function report() {
    pending = false;
    var w = Math.floor(root.clientWidth);
    if (host && w > 0 && Math.abs(w - sent) >= 8) {
      sent = w;
      host.postMessage({ type: 'dewmark.chart.resize', width: w });
    }
  }
  if (typeof ResizeObserver === 'function') {
    new ResizeObserver(function () {
      if (!pending) { pending = true; requestAnimationFrame(report); }
    }).observe(root);
  }
  report();
})();`;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="${csp}">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeXml(opts.title ?? 'Psychrometric chart')}</title>
<style nonce="${nonce}">${vscodeThemeCss()}
body{margin:0;padding:10px;background:var(--vscode-editor-background,\
transparent);color:var(--vscode-editor-foreground,inherit)}
#dewmark-chart svg{display:block;max-width:100%;height:auto}
#dewmark-chart-info{margin:0 0 6px;font:12px/1.4 var(--vscode-font-family,\
sans-serif);color:var(--vscode-descriptionForeground,inherit)}</style>
</head>
<body>
<p id="dewmark-chart-info">${escapeXml(opts.info ?? '')}</p>
<main id="dewmark-chart" aria-live="polite">${opts.svg}</main>
<script nonce="${nonce}">${script}</script>
</body>
</html>
`;
}

/**
 * Dewmark's chart style: a warm paper panel with ink-blue saturation, plum humidity curves, teal
 * dotted wet-bulb lines, amber dashed enthalpy lines and slate dash-dot volume lines; states are
 * crimson dots with tag labels, processes ink arrows.
 *
 * Theming: every colour is read as `var(--dm-chart-NAME, var(--dmc-NAME))`. The chart sets only
 * the internal defaults `--dmc-*` (light, and dark under `prefers-color-scheme: dark`), so a host
 * page overrides any colour by setting the public `--dm-chart-*` property on an ancestor — the VS
 * Code webview maps them to its `--vscode-*` variables that way.
 */

/** The custom properties of the light theme (also the fallbacks). */
export const LIGHT_THEME: Readonly<Record<string, string>> = {
  '--dm-chart-page': '#f7f4ee',
  '--dm-chart-panel': '#fffdf8',
  '--dm-chart-fog': '#ece8f3',
  '--dm-chart-ink': '#27232e',
  '--dm-chart-muted': '#6e6877',
  '--dm-chart-grid': '#e9e3d8',
  '--dm-chart-sat': '#23408e',
  '--dm-chart-rh': '#8a4f9e',
  '--dm-chart-wb': '#1f8a7a',
  '--dm-chart-h': '#b9770e',
  '--dm-chart-v': '#5f6f86',
  '--dm-chart-state': '#c8283f',
  '--dm-chart-mix': '#7a3fb8',
  '--dm-chart-process': '#1d1a22',
  '--dm-chart-flag': '#d35400',
  '--dm-chart-tag': '#ffffff',
  '--dm-chart-shr': '#2e7d32',
};

/** The custom properties of the dark theme. */
export const DARK_THEME: Readonly<Record<string, string>> = {
  '--dm-chart-page': '#15151b',
  '--dm-chart-panel': '#1d1c24',
  '--dm-chart-fog': '#272536',
  '--dm-chart-ink': '#ece8f2',
  '--dm-chart-muted': '#a59fb0',
  '--dm-chart-grid': '#2d2b37',
  '--dm-chart-sat': '#8fb0ff',
  '--dm-chart-rh': '#d49be6',
  '--dm-chart-wb': '#55cbb8',
  '--dm-chart-h': '#f2b84b',
  '--dm-chart-v': '#9fb0c9',
  '--dm-chart-state': '#ff6f83',
  '--dm-chart-mix': '#c39bff',
  '--dm-chart-process': '#f3f0fa',
  '--dm-chart-flag': '#ff9a4d',
  '--dm-chart-tag': '#24232d',
  '--dm-chart-shr': '#7fd08a',
};

/** The theme as declarations of the internal defaults (`--dm-chart-ink` → `--dmc-ink`). */
function block(vars: Readonly<Record<string, string>>): string {
  return Object.entries(vars)
    .map(([k, v]) => `${k.replace('--dm-chart-', '--dmc-')}:${v};`)
    .join('');
}

/** The stylesheet embedded in the SVG; every selector is scoped to `.dmc`. */
export function chartCss(): string {
  const v = (name: string): string => `var(--dm-chart-${name},var(--dmc-${name}))`;
  return [
    `.dmc{${block(LIGHT_THEME)}font-family:"Inter","Noto Sans","DejaVu ` +
      `Sans",system-ui,sans-serif;font-variant-numeric:tabular-nums}`,
    `@media (prefers-color-scheme:dark){.dmc{${block(DARK_THEME)}}}`,
    `.dmc .dmc-page{fill:${v('page')}}`,
    `.dmc .dmc-panel{fill:${v('panel')};stroke:${v('grid')};stroke-width:1}`,
    `.dmc .dmc-fog{fill:${v('fog')}}`,
    `.dmc .dmc-grid{stroke:${v('grid')};stroke-width:1;fill:none}`,
    `.dmc .dmc-axis{stroke:${v('muted')};stroke-width:1.2;fill:none}`,
    `.dmc text{fill:${v('ink')}}`,
    `.dmc .dmc-tick{font-size:11px;fill:${v('muted')}}`,
    `.dmc .dmc-axis-title{font-size:12.5px;font-weight:600;letter-spacing:.03em}`,
    `.dmc .dmc-heading{font-size:15px;font-weight:650}`,
    `.dmc .dmc-sub{font-size:11.5px;fill:${v('muted')}}`,
    `.dmc .dmc-sat{stroke:${v('sat')};stroke-width:2.6;fill:none;stroke-linejoin:round}`,
    `.dmc .dmc-rh{stroke:${v('rh')};stroke-width:.9;fill:none;opacity:.75}`,
    `.dmc .dmc-rh.dmc-rh-50{stroke-width:1.5;opacity:.95}`,
    `.dmc .dmc-wb{stroke:${v('wb')};stroke-width:1.1;fill:none;stroke-dasharray:1.2 3.2;stroke-linecap:round}`,
    `.dmc .dmc-h{stroke:${v('h')};stroke-width:.85;fill:none;stroke-dasharray:7 4}`,
    `.dmc .dmc-v{stroke:${v('v')};stroke-width:.85;fill:none;stroke-dasharray:9 3 2 3}`,
    `.dmc .dmc-lbl{font-size:10px;paint-order:stroke;stroke:${v('panel')};stroke-width:3px;stroke-linejoin:round}`,
    `.dmc .dmc-lbl-rh{fill:${v('rh')};font-weight:600}`,
    `.dmc .dmc-lbl-sat{fill:${v('sat')};font-weight:700}`,
    `.dmc .dmc-lbl-wb{fill:${v('wb')};font-style:italic}`,
    `.dmc .dmc-lbl-h{fill:${v('h')}}`,
    `.dmc .dmc-lbl-v{fill:${v('v')}}`,
    `.dmc .dmc-mixline{stroke:${v('mix')};stroke-width:2;fill:none;stroke-dasharray:5 2.5;stroke-linecap:round}`,
    `.dmc .dmc-process{stroke:${v('process')};stroke-width:2.4;fill:none;stroke-linecap:round}`,
    `.dmc .dmc-process.dmc-flagged{stroke:${v('flag')};stroke-dasharray:6 3}`,
    `.dmc .dmc-arrow{fill:${v('process')}}`,
    `.dmc .dmc-arrow-flag{fill:${v('flag')}}`,
    `.dmc .dmc-process-name{font-size:10.5px;font-style:italic;fill:${v('process')};` +
      `paint-order:stroke;stroke:${v('panel')};stroke-width:3px}`,
    `.dmc .dmc-marker{stroke:${v('tag')};stroke-width:1.6}`,
    `.dmc .dmc-marker-state,.dmc .dmc-marker-supply{fill:${v('state')}}`,
    `.dmc .dmc-marker-mix{fill:${v('mix')}}`,
    `.dmc .dmc-marker-fog{fill:${v('panel')};stroke:${v('flag')};stroke-width:2;stroke-dasharray:2 1.5}`,
    `.dmc .dmc-fogcross{stroke:${v('flag')};stroke-width:1.6}`,
    `.dmc .dmc-tag{fill:${v('tag')};stroke:${v('state')};stroke-width:1;opacity:.96}`,
    `.dmc .dmc-tag-mix{stroke:${v('mix')}}`,
    `.dmc .dmc-tag-fog{stroke:${v('flag')};stroke-dasharray:3 2}`,
    `.dmc .dmc-tagtext{font-size:11px;font-weight:650}`,
    `.dmc .dmc-leader{stroke:${v('muted')};stroke-width:.8}`,
    `.dmc .dmc-context .dmc-marker,.dmc .dmc-context .dmc-tag{opacity:.5}`,
    `.dmc .dmc-context .dmc-tagtext{fill:${v('muted')};font-weight:500}`,
    `.dmc .dmc-shrline{stroke:${v('shr')};stroke-width:1.6;fill:none;stroke-dasharray:10 3 2 3}`,
    `.dmc .dmc-shr-name{font-size:10.5px;font-weight:600;fill:${v('shr')};` +
      `paint-order:stroke;stroke:${v('panel')};stroke-width:3px}`,
    `.dmc .dmc-coilline{stroke:${v('sat')};stroke-width:1.3;fill:none;stroke-dasharray:3 3}`,
    `.dmc .dmc-adp{fill:${v('panel')};stroke:${v('sat')};stroke-width:2}`,
    `.dmc .dmc-adp-label{font-size:10px;font-weight:650;fill:${v('sat')};` +
      `paint-order:stroke;stroke:${v('panel')};stroke-width:3px}`,
    `.dmc .dmc-legend{font-size:11px;fill:${v('muted')}}`,
    `.dmc .dmc-caption{font-size:11px;fill:${v('muted')}}`,
    `.dmc .dmc-flag-title{font-size:11.5px;font-weight:650;fill:${v('flag')}}`,
    `.dmc .dmc-flag-item{font-size:11px}`,
  ].join('\n');
}

/**
 * The chart colours that keep the chart's own palette in a webview rather than follow a VS Code
 * theme colour: the region above saturation (so the fog has one colour, in the webview and in the
 * SVG file alike) and the room SHR line (no theme colour is free for it). The webview picks the
 * light or dark palette by the editor theme's kind.
 */
export const OWN_COLOURS: readonly string[] = ['--dm-chart-fog', '--dm-chart-shr'];

/** The VS Code theme colour each chart colour (but {@link OWN_COLOURS}) follows inside a webview. */
export const VSCODE_THEME_MAP: Readonly<Record<string, string>> = {
  '--dm-chart-page': '--vscode-editor-background',
  '--dm-chart-panel': '--vscode-editor-background',
  '--dm-chart-ink': '--vscode-editor-foreground',
  '--dm-chart-muted': '--vscode-descriptionForeground',
  '--dm-chart-grid': '--vscode-panel-border',
  '--dm-chart-sat': '--vscode-charts-blue',
  '--dm-chart-rh': '--vscode-charts-purple',
  '--dm-chart-wb': '--vscode-charts-green',
  '--dm-chart-h': '--vscode-charts-orange',
  '--dm-chart-v': '--vscode-descriptionForeground',
  '--dm-chart-state': '--vscode-charts-red',
  '--dm-chart-mix': '--vscode-charts-purple',
  '--dm-chart-process': '--vscode-editor-foreground',
  '--dm-chart-flag': '--vscode-editorWarning-foreground',
  '--dm-chart-tag': '--vscode-editor-background',
};

/**
 * A stylesheet for a VS Code webview that hosts the chart: maps each public `--dm-chart-*`
 * colour to the theme's `--vscode-*` variable on `body`. Where the theme lacks a variable the
 * chart's own default applies (an undefined `var()` makes the override invalid, so the fallback wins).
 * The chart's own palette follows the theme's kind (VS Code marks `body` with `vscode-light`,
 * `vscode-dark` or `vscode-high-contrast`), not the system's colour scheme.
 */
export function vscodeThemeCss(): string {
  const mapped = `body{${Object.entries(VSCODE_THEME_MAP)
    .map(([k, v]) => `${k}:var(${v});`)
    .join('')}}`;
  const own = (vars: Readonly<Record<string, string>>): string =>
    block(Object.fromEntries(OWN_COLOURS.map((k) => [k, vars[k]!])));
  return (
    `${mapped}\nbody.vscode-light .dmc,body.vscode-high-contrast-light ` +
    `.dmc{${own(LIGHT_THEME)}}\nbody.vscode-dark ` +
    `.dmc,body.vscode-high-contrast:not(.vscode-high-contrast-light) .dmc{${own(DARK_THEME)}}`
  );
}

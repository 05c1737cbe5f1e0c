/** The webview page for the chart: strict CSP, nonce'd style and script, the chart inline, theme mapping. */
import { describe, expect, it } from 'vitest';
import { chartWebviewHtml, renderChartFromData, type ChartData } from '../src/chart';

const data: ChartData = {
  pressurePa: 101_325,
  units: 'SI',
  points: [{ name: 'RA', kind: 'state', db: 24, w: 0.0093 }],
  mixes: [],
  processes: [],
  infeasible: [],
};
const NONCE = 'a1B2c3D4e5F6g7H8i9J0kL';

describe('chart webview page', () => {
  const svg = renderChartFromData(data, { styleNonce: NONCE });
  const html = chartWebviewHtml({ svg, nonce: NONCE, title: 'ahu <1>.md' });

  it("forbids loading anything and allows only the nonce'd style and script", () => {
    const csp = /<meta http-equiv="Content-Security-Policy" content="([^"]*)">/.exec(html)?.[1] ?? '';
    expect(csp).toContain("default-src 'none'");
    expect(csp).toContain(`style-src 'nonce-${NONCE}'`);
    expect(csp).toContain(`script-src 'nonce-${NONCE}'`);
    expect(csp).not.toMatch(/unsafe-inline|unsafe-eval|https?:|\*/);
    const scripts = html.match(/<script\b[^>]*>/g) ?? [];
    expect(scripts).toEqual([`<script nonce="${NONCE}">`]);
    const styles = html.match(/<style\b[^>]*>/g) ?? [];
    expect(styles.length).toBe(2); // the page's and the chart's
    for (const s of styles) expect(s).toBe(`<style nonce="${NONCE}">`);
    expect(html).not.toMatch(/\b(src|href)=/);
  });

  it('embeds the chart, maps the theme, and escapes the title', () => {
    expect(html).toContain('<main id="dewmark-chart" aria-live="polite"><svg ');
    expect(html).toContain('--dm-chart-sat:var(--vscode-charts-blue);');
    expect(html).toContain('<title>ahu &lt;1&gt;.md</title>');
    expect(html).toContain("m.type === 'dewmark.chart'");
  });

  it('refuses a short or ill-formed nonce (a programming error)', () => {
    expect(() => chartWebviewHtml({ svg, nonce: 'abc' })).toThrow(/nonce/);
    expect(() => chartWebviewHtml({ svg, nonce: 'abcdefghijklmnop"><script>' })).toThrow(/nonce/);
  });

  it('puts no nonce on the chart style unless asked, and never an unsafe one', () => {
    expect(renderChartFromData(data)).toContain('<style>');
    expect(renderChartFromData(data, { styleNonce: 'x" onload="1' })).toContain('<style>');
  });
});

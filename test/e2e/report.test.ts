/**
 * `dewmark report` and `dewmark chart`, rendered in headless Debian Chromium (playwright-core):
 * the report's tables and diagnostics as a reader sees them, the chart's state markers at the
 * pixels the chart's own mapping gives, screenshots in light and dark colour schemes
 * (test-artifacts/report/), and the refusals that protect the note. Under CI=true a missing
 * Chromium or playwright-core fails the suite (requireTool); elsewhere it is skipped with a message.
 *
 * The note is set in an invented building. The pixel checks compare two computations of the same
 * engine (the browser's layout against `toPixel`), so they need no published figure.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { runCli as dewmark } from '../../cli/test/lib/runCli';
import { analyzeNote } from '../../shared-core/src/analyze';
import {
  chartDataFromAnalysis,
  chartLayout,
  chartWebviewHtml,
  renderChart,
  toPixel,
} from '../../shared-core/src/chart';
import { artifactsDir, requireTool, skipWithout } from './lib/tools';
import { CHROMIUM_ARGS, loadPlaywright } from './lib/codeServer';

const NOTE = `# Quayside Gallery — AHU-2 summer check

Outdoor design for the gallery roof plant; return air from the east hall.

\`\`\`air
state OA: db=31C wb=22C          # outdoor summer design
state RA: db=24C rh=50% w=9.9g/kg  # east hall return; the w claim is stale
mix MA: OA 30% + RA 70%
state SA: db=13C rh=92%          # off-coil
process CC: MA -> SA q=3.2m3/s
state BAD: db=25C wb=30C         # a typo: wet-bulb above dry-bulb
state FOG: db=20C w=18g/kg       # above saturation: fog
\`\`\`

The hall is held at \`state HALL: db=23C rh=45%\` in summer.
`;

let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'dewmark-report-'));
  writeFileSync(join(dir, 'ahu-2.md'), NOTE);
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('report and chart commands (files)', () => {
  it('writes a self-contained report: no scripts, no external references, a CSP that forbids loading', async () => {
    const r = await dewmark(['report', 'ahu-2.md', '-o', 'report.html'], dir);
    // The note has errors (BAD), so the exit code is 1, and the report is still written.
    expect(r.code).toBe(1);
    expect(r.err).toContain('wrote report.html');
    const html = readFileSync(join(dir, 'report.html'), 'utf8');
    expect(html).toMatch(/^<!doctype html>/);
    expect(html).not.toMatch(/<script|<link\b|<img\b|<iframe|@import|url\(\s*['"]?(https?:|\/\/)/i);
    expect(html).not.toMatch(/\b(src|href)=["']?(https?:|\/\/)/i);
    expect(html).toContain(`content="default-src 'none'; style-src 'unsafe-inline'; img-src data:"`);
    expect(html).toContain('<svg xmlns="http://www.w3.org/2000/svg" class="dmc"');
    expect(html).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('writes the chart alone as an SVG document', async () => {
    const r = await dewmark(['chart', 'ahu-2.md', '-o', 'chart.svg'], dir);
    expect(r.code).toBe(1);
    const svg = readFileSync(join(dir, 'chart.svg'), 'utf8');
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg ')).toBe(true);
    expect(svg).toContain('<title id="dmc-title">Psychrometric chart — ahu-2.md</title>');
  });

  it('refuses to overwrite the note, or to write any .md file, with exit 2 and a clear message', async () => {
    const before = readFileSync(join(dir, 'ahu-2.md'), 'utf8');
    const same = await dewmark(['report', 'ahu-2.md', '-o', 'ahu-2.md'], dir);
    expect(same.code).toBe(2);
    expect(same.err).toContain("refusing to write the report over the note 'ahu-2.md' itself");
    const other = await dewmark(['report', 'ahu-2.md', '-o', 'notes/other.MD'], dir);
    expect(other.code).toBe(2);
    expect(other.err).toContain('it is a Markdown file name');
    const chart = await dewmark(['chart', 'ahu-2.md', '-o', './ahu-2.md'], dir);
    expect(chart.code).toBe(2);
    expect(chart.err).toContain("refusing to write the chart over the note 'ahu-2.md' itself");
    expect(readFileSync(join(dir, 'ahu-2.md'), 'utf8')).toBe(before);
    expect(existsSync(join(dir, 'notes'))).toBe(false);
  });

  it('needs -o, one note, and an existing folder; says how to fix each', async () => {
    const noOut = await dewmark(['report', 'ahu-2.md'], dir);
    expect(noOut.code).toBe(2);
    expect(noOut.err).toContain('say where to write the report with -o, e.g. report.html');
    const missing = await dewmark(['chart', 'nope.md', '-o', 'x.svg'], dir);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain("cannot read 'nope.md'");
    const badDir = await dewmark(['chart', 'ahu-2.md', '-o', 'no/such/dir/x.svg'], dir);
    expect(badDir.code).toBe(2);
    expect(badDir.err).toContain("cannot write 'no/such/dir/x.svg': its folder does not exist");
  });

  it('exits 0 for a note without errors, and writes only the path given', async () => {
    const clean = join(dir, 'clean');
    mkdirSync(clean);
    writeFileSync(join(clean, 'plant.md'), '```air\nstate RA: db=24C rh=50%\n```\n');
    const r = await dewmark(['chart', 'plant.md', '-o', 'out.svg'], clean);
    expect(r.code).toBe(0);
    expect(statSync(join(clean, 'out.svg')).size).toBeGreaterThan(1000);
    expect(readFileSync(join(clean, 'plant.md'), 'utf8')).toBe('```air\nstate RA: db=24C rh=50%\n```\n');
  });
});

// ---------------------------------------------------------------------------------------------
// In the browser

interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

interface Page {
  goto(url: string): Promise<unknown>;
  evaluate<T>(expression: string): Promise<T>;
  waitForFunction(expression: string): Promise<unknown>;
  screenshot(options: { path: string; fullPage?: boolean }): Promise<unknown>;
  on(event: 'request', listener: (r: { url(): string }) => void): unknown;
  close(): Promise<void>;
}
interface Browser {
  newContext(options: {
    viewport: { width: number; height: number };
    colorScheme?: 'light' | 'dark';
  }): Promise<{ newPage(): Promise<Page>; close(): Promise<void> }>;
  close(): Promise<void>;
}

describe.skipIf(skipWithout('chromium', 'playwright-core'))('in headless Chromium', () => {
  let browser: Browser | null = null;
  const shots = artifactsDir('report');

  async function open(
    url: string,
    colorScheme: 'light' | 'dark' = 'light',
  ): Promise<{ page: Page; requests: string[]; done: () => Promise<void> }> {
    const ctx = await browser!.newContext({ viewport: { width: 1200, height: 900 }, colorScheme });
    const page = await ctx.newPage();
    const requests: string[] = [];
    page.on('request', (r) => requests.push(r.url()));
    await page.goto(url);
    return { page, requests, done: () => ctx.close() };
  }

  beforeAll(async () => {
    // skipWithout has already failed the suite under CI, or skipped it elsewhere, when a tool is missing.
    const chromium = requireTool('chromium');
    requireTool('playwright-core');
    const pw = loadPlaywright();
    browser = (await pw.chromium.launch({
      executablePath: chromium.path,
      headless: true,
      args: [...CHROMIUM_ARGS],
      timeout: 60_000,
    })) as unknown as Browser;
    mkdirSync(shots, { recursive: true });
    expect((await dewmark(['report', 'ahu-2.md', '-o', 'report.html'], dir)).code).toBe(1);
    expect((await dewmark(['chart', 'ahu-2.md', '-o', 'chart.svg'], dir)).code).toBe(1);
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('shows the states, mixes, processes and every diagnostic in tables, and loads nothing from outside', async () => {
    const { page, requests, done } = await open(pathToFileURL(join(dir, 'report.html')).href);
    const analysis = analyzeNote(NOTE, {});
    const rows = await page.evaluate<Record<string, { cells: string[]; about: string }[]>>(`(() => {
      const items = (id) => [...document.querySelectorAll('#' + id + ' tbody')].map((tb) => ({
        cells: [...tb.rows[0].cells].map((c) => c.textContent.trim()),
        about: tb.rows[1] ? tb.rows[1].textContent.trim() : '',
      }));
      const t = (id) => [...document.querySelectorAll('#' + id + ' tbody tr')].map((tr) \
=> ({ cells: [...tr.cells].map((c) => c.textContent.trim()), about: '' }));
      return { states: items('states'), processes: items('processes'), diagnostics: t('diagnostics') };
    })()`);
    // The index lists states and mixes in the note's order.
    expect(rows.states!.map((r) => r.cells[0])).toEqual(['OA', 'RA', 'MA', 'SA', 'BAD', 'FOG', 'HALL']);
    expect(rows.states!.find((r) => r.cells[0] === 'BAD')!.about).toContain('not computed');
    // The stale claim reads as written → computed, with its verdict and band, in print.
    expect(rows.states!.find((r) => r.cells[0] === 'RA')!.about).toMatch(
      /w=9\.9g\/kg → \d+\.\d+\sg\/kg ✗ outside ±0\.05\sg\/kg/,
    );
    expect(rows.diagnostics!.some((r) => r.cells[2] === 'claim-mismatch' && r.cells[1] === 'warning')).toBe(true);
    expect(rows.states!.find((r) => r.cells[0] === 'MA')!.about).toContain('mix of OA 30.0 % + RA 70.0 %');
    expect(rows.processes!.map((r) => r.cells[0])).toEqual(['CCMA → SA']);
    // The comment on a statement's line is its description.
    expect(rows.states!.find((r) => r.cells[0] === 'SA')!.about).toContain('off-coil');
    // Every diagnostic of the analysis appears, with its code and message.
    expect(rows.diagnostics!.length).toBe(analysis.diagnostics.length);
    for (const d of analysis.diagnostics)
      expect(rows.diagnostics!.some((r) => r.cells[2] === d.code && r.cells[3] === d.message)).toBe(true);
    expect(analysis.diagnostics.some((d) => d.code === 'wb-above-db')).toBe(true);
    const text = await page.evaluate<{ caution: string; method: string; pressure: string; title: string }>(`({
      caution: document.querySelector('#caution').textContent,
      method: document.querySelector('#method').textContent,
      pressure: document.querySelector('#pressure-basis').textContent,
      title: document.title,
    })`);
    expect(text.caution).toContain('Design aid only');
    expect(text.caution).toContain('licensed professional engineer');
    expect(text.method).toContain('ASHRAE Handbook—Fundamentals');
    expect(text.method).toContain('ideal gases');
    expect(text.method).toContain('over ice below 0 °C');
    expect(text.pressure).toContain('101.325 kPa');
    expect(text.title).toBe('Quayside Gallery — AHU-2 summer check'); // the note's first heading
    expect(requests.filter((u) => !u.startsWith('file:') && !u.startsWith('data:'))).toEqual([]);
    await page.screenshot({ path: join(shots, 'report-light.png'), fullPage: true });
    await done();
  });

  it('places every state marker of the report chart at the pixel that toPixel gives', async () => {
    const { page, done } = await open(pathToFileURL(join(dir, 'report.html')).href);
    const data = chartDataFromAnalysis(analyzeNote(NOTE, {}), { source: NOTE });
    const layout = chartLayout(data);
    const got = await page.evaluate<{ svg: Rect; vbw: number; markers: { name: string; rect: Rect }[] }>(`(() => {
      const svg = document.querySelector('#chart svg');
      const r = (el) => { const b = el.getBoundingClientRect(); \
return { x: b.x, y: b.y, width: b.width, height: b.height }; };
      return { svg: r(svg), vbw: svg.viewBox.baseVal.width, markers: \
[...svg.querySelectorAll('circle.dmc-marker')].map((c) => ({ name: c.dataset.name, rect: r(c) })) };
    })()`);
    const scale = got.svg.width / got.vbw;
    expect(got.markers.map((m) => m.name).sort()).toEqual(data.points.map((p) => p.name).sort());
    expect(got.markers.length).toBeGreaterThanOrEqual(6);
    for (const p of data.points) {
      const m = got.markers.find((x) => x.name === p.name)!;
      const want = toPixel(layout, p.db, p.w);
      const cx = (m.rect.x + m.rect.width / 2 - got.svg.x) / scale;
      const cy = (m.rect.y + m.rect.height / 2 - got.svg.y) / scale;
      expect(Math.abs(cx - want.x)).toBeLessThan(0.6);
      expect(Math.abs(cy - want.y)).toBeLessThan(0.6);
    }
    // The fog state is marked as such, and the state that could not be computed is listed, not drawn.
    const marks = await page.evaluate<{ fog: string | null; flagged: string }>(`({
      fog: document.querySelector('circle.dmc-marker[data-name="FOG"]').getAttribute('data-infeasible'),
      flagged: document.querySelector('#chart .dmc-flags').textContent,
    })`);
    expect(marks.fog).toBe('fog');
    expect(marks.flagged).toContain('BAD');
    expect(marks.flagged).toContain('not plotted');
    await done();
  });

  it(
    'webview page: the chart shows under the strict CSP, ' +
      'follows --vscode-* colours, and updates live on a message',
    async () => {
      const nonce = 'Zt4kQ9wLm2Xc7Vb1Np8Rs3';
      const analysis = analyzeNote(NOTE, {});
      const first = renderChart(analysis, { source: NOTE, styleNonce: nonce });
      writeFileSync(join(dir, 'webview.html'), chartWebviewHtml({ svg: first, nonce, title: 'ahu-2.md' }));
      const { page, requests, done } = await open(pathToFileURL(join(dir, 'webview.html')).href);
      const before = await page.evaluate<{ markers: number; sat: string; injected: string }>(`(() => {
      // A style without the nonce is refused by the page's policy.
      const s = document.createElement('style');
      s.textContent = 'body { outline: 7px solid rgb(255, 0, 0); }';
      document.head.appendChild(s);
      return {
        markers: document.querySelectorAll('circle.dmc-marker').length,
        sat: getComputedStyle(document.querySelector('path.dmc-sat')).stroke,
        injected: getComputedStyle(document.body).outlineStyle,
      };
    })()`);
      expect(before.markers).toBe(6);
      expect(before.sat).toBe('rgb(35, 64, 142)'); // the chart's own default (#23408e) without a VS Code theme
      expect(before.injected).toBe('none');
      // A VS Code theme sets --vscode-* on the document element; the chart follows it.
      const themed = await page.evaluate<string>(`(() => {
      document.documentElement.style.setProperty('--vscode-charts-blue', 'rgb(0, 122, 204)');
      return getComputedStyle(document.querySelector('path.dmc-sat')).stroke;
    })()`);
      expect(themed).toBe('rgb(0, 122, 204)');
      // The note changes: the host posts the new chart and the page replaces it.
      const changed = NOTE.replace('state SA: db=13C rh=92%', 'state SA: db=15C rh=85%');
      const second = renderChart(analyzeNote(changed, {}), { source: changed, styleNonce: nonce });
      await page.evaluate(`window.postMessage({ type: 'dewmark.chart', svg: ${JSON.stringify(second)} }, '*')`);
      await page.waitForFunction(`document.getElementById('dewmark-chart').getAttribute('data-updates') === '1'`);
      const after = await page.evaluate<{ db: string | null; svgs: number; sat: string }>(`({
      db: document.querySelector('circle.dmc-marker[data-name="SA"]').getAttribute('data-db'),
      svgs: document.querySelectorAll('#dewmark-chart svg').length,
      sat: getComputedStyle(document.querySelector('path.dmc-sat')).stroke,
    })`);
      expect(Number(after.db)).toBeCloseTo(15, 9);
      expect(after.svgs).toBe(1);
      expect(after.sat).toBe('rgb(0, 122, 204)'); // the new chart's nonce'd style applies too
      expect(requests.filter((u) => !u.startsWith('file:') && !u.startsWith('data:'))).toEqual([]);
      // A dark VS Code-like theme, for the screenshot.
      await page.evaluate(`(() => {
      const r = document.documentElement.style;
      for (const [k, v] of Object.entries({ '--vscode-editor-background': '#1e1e1e', '--vscode-editor-foreground': \
'#d4d4d4', '--vscode-descriptionForeground': '#a0a0a0', '--vscode-panel-border': '#3c3c3c', \
'--vscode-charts-blue': '#3794ff', '--vscode-charts-purple': '#b180d7', '--vscode-charts-green': '#89d185', \
'--vscode-charts-orange': '#d18616', '--vscode-charts-red': '#f14c4c', '--vscode-editorWarning-foreground': \
'#cca700', '--vscode-editor-inactiveSelectionBackground': '#3a3d41' })) r.setProperty(k, v);
    })()`);
      await page.screenshot({ path: join(shots, 'webview-vscode-dark.png') });
      await done();
    },
  );

  it(
    'renders the standalone chart: well-formed, title and ' +
      'desc, markers at their pixels; light and dark screenshots',
    async () => {
      const data = chartDataFromAnalysis(analyzeNote(NOTE, {}), { source: NOTE });
      const layout = chartLayout(data);
      const colours: Record<string, string> = {};
      for (const scheme of ['light', 'dark'] as const) {
        const { page, done } = await open(pathToFileURL(join(dir, 'chart.svg')).href, scheme);
        const info = await page.evaluate<{
          root: string;
          errors: number;
          title: string;
          desc: string;
          markers: { name: string; x: number; y: number }[];
          panel: string;
        }>(`(() => {
        const svg = document.documentElement;
        const base = svg.getBoundingClientRect();
        return {
          root: svg.localName,
          errors: document.getElementsByTagName('parsererror').length,
          title: svg.querySelector('title').textContent,
          desc: svg.querySelector('desc').textContent,
          markers: [...svg.querySelectorAll('circle.dmc-marker')].map((c) => { const b = c.getBoundingClientRect();\
 return { name: c.dataset.name, x: b.x + b.width / 2 - base.x, y: b.y + b.height / 2 - base.y }; }),
          panel: getComputedStyle(svg.querySelector('.dmc-panel')).fill,
        };
      })()`);
        expect(info.root).toBe('svg');
        expect(info.errors).toBe(0);
        expect(info.title).toBe('Psychrometric chart — ahu-2.md');
        expect(info.desc).toContain('OA');
        for (const p of data.points) {
          const m = info.markers.find((x) => x.name === p.name)!;
          const want = toPixel(layout, p.db, p.w);
          expect(Math.abs(m.x - want.x)).toBeLessThan(0.6);
          expect(Math.abs(m.y - want.y)).toBeLessThan(0.6);
        }
        colours[scheme] = info.panel;
        await page.screenshot({ path: join(shots, `chart-${scheme}.png`) });
        await done();
      }
      // The dark scheme really changes the palette (prefers-color-scheme block).
      expect(colours.light).not.toBe(colours.dark);
      const { page, done } = await open(pathToFileURL(join(dir, 'report.html')).href, 'dark');
      await page.screenshot({ path: join(shots, 'report-dark.png'), fullPage: true });
      // A host page re-themes the chart by setting the public --dm-chart-* properties on an ancestor.
      const overridden = await page.evaluate<string>(`(() => {
      document.body.style.setProperty('--dm-chart-panel', 'rgb(1, 2, 3)');
      return getComputedStyle(document.querySelector('#chart .dmc-panel')).fill;
    })()`);
      expect(overridden).toBe('rgb(1, 2, 3)');
      await done();
    },
  );
});

/**
 * The chart webview as the extension really sets it up (client/src/chart.ts run against a stand-in
 * for the `vscode` module that records what the client asks for): the panel allows scripts but no
 * command links and no local resources; the HTML it sets has a Content Security Policy with
 * `default-src 'none'` and only a nonce for style and script; every `<script>` and `<style>`
 * carries that nonce; nothing refers to a remote or local resource (no `src=`, `href=`, no `url(`
 * except to a fragment of the page, no `@import`); each panel gets its own random nonce; the updates it posts as the
 * note changes obey the same rules, even for a note that tries to inject markup through its names and prose.
 */
import { beforeEach, describe, expect, it, vi } from 'vitest';

interface FakePanel {
  options: Record<string, unknown>;
  webview: {
    html: string;
    posted: unknown[];
    postMessage(m: unknown): Promise<boolean>;
    receivers: ((m: unknown) => void)[];
    onDidReceiveMessage(f: (m: unknown) => void): { dispose(): void };
  };
  visible: boolean;
  disposeListeners: (() => void)[];
  reveal(): void;
  onDidChangeViewState(): { dispose(): void };
  onDidDispose(f: () => void): { dispose(): void };
  dispose(): void;
}

const created: FakePanel[] = [];
const changeListeners: ((e: { document: unknown }) => void)[] = [];
const selectionListeners: ((e: { textEditor: { document: unknown }; selections: { active: unknown }[] }) => void)[] =
  [];
const contexts = new Map<string, unknown>();

vi.mock('vscode', () => {
  const disposable = { dispose: () => undefined };
  return {
    ViewColumn: { Beside: -2 },
    Position: class {
      constructor(
        readonly line: number,
        readonly character: number,
      ) {}
    },
    commands: {
      executeCommand: (id: string, key: string, value: unknown) => {
        if (id === 'setContext') contexts.set(key, value);
        return Promise.resolve(undefined);
      },
    },
    workspace: {
      getConfiguration: () => ({ get: () => undefined }),
      onDidChangeTextDocument: (f: (e: { document: unknown }) => void) => {
        changeListeners.push(f);
        return disposable;
      },
      onDidOpenTextDocument: () => disposable,
      onDidChangeConfiguration: () => disposable,
    },
    window: {
      activeTextEditor: undefined,
      onDidChangeTextEditorSelection: (
        f: (e: { textEditor: { document: unknown }; selections: { active: unknown }[] }) => void,
      ) => {
        selectionListeners.push(f);
        return disposable;
      },
      createWebviewPanel: (
        _type: string,
        _title: string,
        _column: unknown,
        options: Record<string, unknown>,
      ): FakePanel => {
        const panel: FakePanel = {
          options,
          visible: true,
          disposeListeners: [],
          webview: {
            html: '',
            posted: [],
            postMessage(m: unknown) {
              this.posted.push(m);
              return Promise.resolve(true);
            },
            receivers: [],
            onDidReceiveMessage(f: (m: unknown) => void) {
              this.receivers.push(f);
              return disposable;
            },
          },
          reveal: () => undefined,
          onDidChangeViewState: () => disposable,
          onDidDispose(f: () => void) {
            this.disposeListeners.push(f);
            return disposable;
          },
          dispose() {
            for (const f of this.disposeListeners) f();
          },
        };
        created.push(panel);
        return panel;
      },
    },
  };
});

const { ChartPanels } = await import('../../client/src/chart');

const log = { error: vi.fn(), info: vi.fn(), warn: vi.fn() };

/** A document whose text an edit replaces (its version goes up), with offsets as positions. */
function fakeDoc(path: string, text: string) {
  const uri = { path, toString: () => `file://${path}` };
  const doc = {
    uri,
    text,
    version: 1,
    getText: () => doc.text,
    languageId: 'markdown',
    offsetAt: (p: { offset: number }) => p.offset,
  };
  return doc;
}

/** The nonce of the page's CSP, after checking the policy itself. */
function checkPage(html: string): string {
  const metas = html.match(/<meta http-equiv="Content-Security-Policy" content="([^"]*)">/g) ?? [];
  expect(metas.length, 'exactly one CSP meta').toBe(1);
  const csp = /content="([^"]*)"/.exec(metas[0]!)![1]!;
  const directives = new Map(
    csp
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .map(([k, ...v]) => [k!, v]),
  );
  expect(directives.get('default-src')).toEqual(["'none'"]);
  const nonce = /^'nonce-([A-Za-z0-9+/=]+)'$/.exec(directives.get('script-src')?.[0] ?? '')?.[1];
  expect(nonce, 'script-src is a nonce').toBeTruthy();
  expect(directives.get('script-src')).toEqual([`'nonce-${nonce}'`]);
  expect(directives.get('style-src')).toEqual([`'nonce-${nonce}'`]);
  // Nothing else may load anything: images only as inline data, no base URI, no form targets.
  for (const [k, v] of directives) {
    if (['default-src', 'script-src', 'style-src'].includes(k)) continue;
    expect(
      v.every((x) => x === "'none'" || x === 'data:'),
      `${k} ${v.join(' ')}`,
    ).toBe(true);
  }
  expect(csp).not.toMatch(/unsafe-|https?:|\*|blob:|vscode-resource|self/);
  checkMarkup(html, nonce!);
  return nonce!;
}

/** No element loads anything; every script and style carries the nonce. */
function checkMarkup(html: string, nonce: string): void {
  for (const tag of html.match(/<(script|style)\b[^>]*>/gi) ?? [])
    expect(tag, 'nonce on every script and style').toMatch(
      new RegExp(`^<(script|style) nonce="${nonce.replace(/[+/=]/g, '\\$&')}">$`),
    );
  // Attributes are looked for inside tags: a note's text shown escaped (`&lt;img src=x`) is text, not markup.
  expect(html, 'no src or href attribute').not.toMatch(
    /<[^>]*\s(src|href|xlink:href|srcset|action|formaction|ping|background)\s*=/i,
  );
  // url(#id) points into the page itself (the SVG's clip path); any other url() would load something.
  expect(html, 'no CSS url() other than a fragment, no @import').not.toMatch(/url\s*\(\s*(?!['"]?#)|@import/i);
  expect(html, 'no inline event handler').not.toMatch(/<[^>]*\son[a-z]+\s*=/i);
  expect(html, 'no iframe, object, embed, link or base element').not.toMatch(
    /<(iframe|object|embed|link|base|meta http-equiv="refresh")\b/i,
  );
  expect(html, 'no javascript: URL').not.toMatch(/javascript:/i);
}

beforeEach(() => {
  created.length = 0;
  changeListeners.length = 0;
  selectionListeners.length = 0;
  contexts.clear();
});

describe('the chart webview the client sets up', () => {
  const NOTE = [
    '# Kestrel Ridge AHU-1',
    '',
    '```air',
    'state OA: db=32C wb=23C',
    'state RA: db=24C rh=50%',
    'mix MA: OA 30% + RA 70%',
    '```',
    '',
  ].join('\n');

  it('panel options: scripts (for updates) but no command links and no local resources', () => {
    new ChartPanels(log as never).show(fakeDoc('/notes/ahu-1.md', NOTE) as never, 0);
    expect(created.length).toBe(1);
    expect(created[0]!.options).toMatchObject({
      enableScripts: true,
      enableCommandUris: false,
      localResourceRoots: [],
    });
  });

  it('the page: default-src none, nonce-only style and script, nothing loaded', () => {
    new ChartPanels(log as never).show(fakeDoc('/notes/ahu-1.md', NOTE) as never, 0);
    const html = created[0]!.webview.html;
    checkPage(html);
    expect(html).toContain('<svg');
  });

  it('each panel has its own random nonce (18 random bytes, base64)', () => {
    const panels = new ChartPanels(log as never);
    panels.show(fakeDoc('/notes/a.md', NOTE) as never, 0);
    panels.show(fakeDoc('/notes/b.md', NOTE) as never, 0);
    const [n1, n2] = created.map((p) => checkPage(p.webview.html));
    expect(n1).not.toBe(n2);
    expect(Buffer.from(n1!, 'base64').length).toBe(18);
  });

  it(
    'a note that tries to inject markup through names, prose ' +
      'and title gets it escaped, in the page and in updates',
    async () => {
      vi.useFakeTimers();
      try {
        const evil = [
          '# <img src=x onerror=alert(1)>',
          '```air',
          'state A: db=24C rh=50%',
          'state B"><script>alert(1)</script>: db=30C rh=20%',
          'state D: db=20C wb=25C<script>alert(1)</script>',
          'state E: db=24C rh=50% p=84<b>kPa h=1"onload="x',
          'state F: db=20C wb=25C',
          '```',
          '`state C</style><link href="https://example.com/x.css">: db=20C rh=40%`',
          '',
        ].join('\n');
        const doc = fakeDoc('/notes/<script>evil</script>.md', evil);
        new ChartPanels(log as never).show(doc as never, 0);
        const panel = created[0]!;
        const nonce = checkPage(panel.webview.html);
        // An edit: the client redraws after a pause and posts the new chart.
        doc.version++;
        for (const f of changeListeners) f({ document: doc });
        await vi.advanceTimersByTimeAsync(1000);
        expect(panel.webview.posted.length).toBe(1);
        const msg = panel.webview.posted[0] as { type: string; svg: string };
        expect(msg.type).toBe('dewmark.chart');
        checkMarkup(msg.svg, nonce);
        expect(msg.svg).not.toMatch(/<script|<img|<link|<b>/i);
        expect(panel.webview.html).not.toMatch(/<script>|<img|<link|<b>/i);
        // The infeasible state F is drawn with its problem, so diagnostics text does reach the chart.
        expect(msg.svg).toMatch(/wet-bulb/i);
      } finally {
        vi.useRealTimers();
      }
    },
  );

  const SEASONS = [
    '# Kestrel Ridge AHU-1',
    '',
    '## Summer',
    '',
    '```air',
    'state OA: db=32C wb=16.5C',
    'state RA: db=24C rh=50%',
    'process CC: RA -> OFF adp=11C bf=0.1',
    '```',
    '',
    '## Winter',
    '',
    '```air',
    'state OA_W: db=-12C rh=70%',
    'state RA_W: db=21C rh=30%',
    '```',
    '',
  ].join('\n');

  /** The names of the states a chart SVG marks. */
  const marked = (svg: string): string[] =>
    [...svg.matchAll(/<circle class="dmc-marker[^"]*" data-name="([^"]*)"/g)].map((m) => m[1]!);

  it('shows the section at the cursor, follows the cursor into another section, and shows all on request', async () => {
    vi.useFakeTimers();
    try {
      const doc = fakeDoc('/notes/seasons.md', SEASONS);
      const panels = new ChartPanels(log as never);
      panels.show(doc as never, SEASONS.indexOf('state OA:'));
      const panel = created[0]!;
      expect(marked(panel.webview.html).sort()).toEqual(['OA', 'OFF', 'RA']);
      expect(panel.webview.html).toContain('Section 1 of 2, at the cursor: Summer.');
      expect(contexts.get('dewmark.chartOpen')).toBe(true);
      // The cursor moves within the section: nothing is redrawn.
      const move = (offset: number) => {
        for (const f of selectionListeners) f({ textEditor: { document: doc }, selections: [{ active: { offset } }] });
      };
      move(SEASONS.indexOf('state RA:'));
      await vi.advanceTimersByTimeAsync(1000);
      expect(panel.webview.posted).toEqual([]);
      // Into the winter block: the winter states.
      move(SEASONS.indexOf('state RA_W'));
      await vi.advanceTimersByTimeAsync(1000);
      expect(panel.webview.posted.length).toBe(1);
      const winter = panel.webview.posted[0] as { svg: string; info: string };
      expect(marked(winter.svg).sort()).toEqual(['OA_W', 'RA_W']);
      expect(winter.info).toContain('Section 2 of 2, at the cursor: Winter.');
      // Every state, then back to the section.
      expect(panels.toggleAll()).toBe(true);
      await vi.advanceTimersByTimeAsync(1000);
      const all = panel.webview.posted[1] as { svg: string; info: string };
      expect(marked(all.svg).sort()).toEqual(['OA', 'OA_W', 'OFF', 'RA', 'RA_W']);
      expect(all.info).toMatch(/^All states of the note\./);
      panels.toggleAll();
      await vi.advanceTimersByTimeAsync(1000);
      expect(marked((panel.webview.posted[2] as { svg: string }).svg).sort()).toEqual(['OA_W', 'RA_W']);
      panel.dispose();
      expect(contexts.get('dewmark.chartOpen')).toBe(false);
      expect(panels.toggleAll()).toBe(false);
    } finally {
      vi.useRealTimers();
    }
  });

  it('draws the chart again at the width the page reports when the panel is resized', async () => {
    vi.useFakeTimers();
    try {
      new ChartPanels(log as never).show(fakeDoc('/notes/ahu-1.md', NOTE) as never, 0);
      const panel = created[0]!;
      expect(panel.webview.html).toMatch(/<svg [^>]*width="960"/);
      // The page's script reports its width (see chartWebviewHtml).
      expect(panel.webview.html).toContain('new ResizeObserver(');
      for (const f of panel.webview.receivers) f({ type: 'dewmark.chart.resize', width: 700 });
      await vi.advanceTimersByTimeAsync(500);
      expect((panel.webview.posted[0] as { svg: string }).svg).toMatch(/<svg [^>]*width="700"/);
      // Too narrow to read: drawn at the least width (the page scales it down).
      for (const f of panel.webview.receivers) f({ type: 'dewmark.chart.resize', width: 200 });
      await vi.advanceTimersByTimeAsync(500);
      expect((panel.webview.posted[1] as { svg: string }).svg).toMatch(/<svg [^>]*width="480"/);
      // Anything else the page could send is ignored.
      for (const f of panel.webview.receivers) f({ type: 'dewmark.chart.resize', width: 'wide' });
      for (const f of panel.webview.receivers) f(null);
      await vi.advanceTimersByTimeAsync(500);
      expect(panel.webview.posted.length).toBe(2);
    } finally {
      vi.useRealTimers();
    }
  });
});

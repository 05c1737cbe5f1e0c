/**
 * `Dewmark: Show Psychrometric Chart`: the active note's chart in a webview beside it, redrawn as
 * the note or the settings change. It shows the heading section at the cursor (a chart per case:
 * summer, winter…) and follows the cursor into another section; `Dewmark: Chart: Show All
 * States…` switches to the whole note and back. It is drawn again at the panel's width when the
 * panel is resized (the page reports its width). The chart is drawn by the pure core (`shared-core/src/chart`)
 * from the note's analysis, with the same settings the server reads; the page comes from the
 * core's `chartWebviewHtml` (Content Security Policy `default-src 'none'`, nonce'd style and
 * script, VS Code theme colours). Nothing is loaded from disk or network.
 */
import * as vscode from 'vscode';
import {
  caseAt,
  chartCases,
  chartWebviewHtml,
  chartWidthFor,
  plotHeightFor,
  renderChart,
  type ChartCase,
  type ChartResizeMessage,
  type ChartUpdateMessage,
} from '@dewmark/core/chart';
import { analyzeText, readSettings } from '@dewmark/core/service';
import { HOST_MAX_NOTE_KB, hostBounded } from './hostLimit';
import { SETTINGS_SECTION } from '@dewmark/protocol';
import { COMMANDS } from './commands';
import { rawSettingsFor } from './settingKeys';

/** The last segment of a URI path (the file name). No Node module: the browser build runs this too. */
function basename(path: string): string {
  return path.slice(path.lastIndexOf('/') + 1);
}

/** A random nonce, base64 (the Web Crypto API: a global in Node ≥ 19 and in browsers). */
function randomNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(18));
  return btoa(String.fromCharCode(...bytes));
}

/** What the panel shows: the chart's SVG and the line above it. */
interface ChartView {
  svg: string;
  info: string;
  /** The case drawn (null: the whole note). */
  caseKey: string | null;
  /** The note's cases (empty when every state is drawn). */
  cases: readonly ChartCase[];
}

/**
 * The chart of a document, drawn with `nonce` on its style element: the heading section at
 * `offset` (the cursor), or every state when `all` is set, `width` px wide.
 */
function chartView(doc: vscode.TextDocument, nonce: string, offset: number, all: boolean, width: number): ChartView {
  const text = doc.getText();
  const settings = hostBounded(readSettings(rawSettingsFor(doc.uri)).settings);
  const note = analyzeText(text, settings);
  if (note.limited) {
    // Over the dewmark.maxNoteSizeKB limit: not evaluated, so nothing to draw; say why.
    return {
      svg:
        `<p role="status">This note is larger than ${settings.maxNoteKB} KB (dewmark.maxNoteSizeKB; ` +
        `at most ${HOST_MAX_NOTE_KB} KB inside VS Code), so it is not evaluated as you ` +
        `type and has no chart here. Use <code>dewmark chart</code> on the command ` +
        `line${settings.maxNoteKB < HOST_MAX_NOTE_KB ? ', or raise the setting' : ''}.</p>`,
      info: '',
      caseKey: null,
      cases: [],
    };
  }
  const name = basename(doc.uri.path);
  const size = { width, plotHeight: plotHeightFor(width), styleNonce: nonce };
  const cases = all ? [] : chartCases(note.analysis, 'section', text);
  const here = caseAt(cases, offset);
  if (!here) {
    const info =
      all && chartCases(note.analysis, 'section', text).length > 1
        ? `All states of the note. ${TOGGLE_HINT} to follow the section at the cursor.`
        : 'All states of the note.';
    return { svg: renderChart(note.analysis, { source: text, title: name, ...size }), info, caseKey: null, cases };
  }
  const svg = renderChart(note.analysis, {
    source: text,
    title: `${name} \u2014 ${here.title}`,
    statements: here.statements,
    notes: here.problems,
    ...size,
  });
  const info =
    cases.length > 1
      ? `Section ${cases.indexOf(here) + 1} of ${cases.length}, at ` +
        `the cursor: ${here.title}. ${TOGGLE_HINT} to see all states.`
      : `${here.title}.`;
  return { svg, info, caseKey: here.key, cases };
}

/** How to switch between the section at the cursor and all states, in the panel's words. */
const TOGGLE_HINT = `Run \u201cDewmark: ${COMMANDS.toggleChartCases.title}\u201d`;

/** One open chart panel, following one document and the section at its cursor. */
class ChartPanel {
  private readonly nonce = randomNonce();
  private timer: ReturnType<typeof setTimeout> | undefined;
  private readonly subscriptions: vscode.Disposable[] = [];
  /** Show every state rather than the section at the cursor. */
  private all = false;
  /** The chart width the panel has room for, px. */
  private width = chartWidthFor(960);
  /**
   * The cases of the document version last drawn, and the one drawn (to redraw only when the cursor moves to another).
   */
  private drawn: { version: number; caseKey: string | null; cases: readonly ChartCase[] } | undefined;

  constructor(
    readonly uri: string,
    private doc: vscode.TextDocument,
    readonly panel: vscode.WebviewPanel,
    private readonly log: vscode.LogOutputChannel,
    onDispose: () => void,
    private offset: number,
  ) {
    const title = basename(doc.uri.path);
    const first = this.render();
    panel.webview.html = chartWebviewHtml({
      svg: first.svg,
      info: first.info,
      nonce: this.nonce,
      title: `Chart — ${title}`,
    });
    this.subscriptions.push(
      vscode.workspace.onDidChangeTextDocument((e) => {
        if (e.document.uri.toString() === this.uri) {
          this.doc = e.document;
          this.soon();
        }
      }),
      vscode.workspace.onDidOpenTextDocument((d) => {
        if (d.uri.toString() === this.uri) {
          this.doc = d;
          this.soon();
        }
      }),
      vscode.window.onDidChangeTextEditorSelection((e) => {
        if (e.textEditor.document.uri.toString() !== this.uri) return;
        const at = e.textEditor.document.offsetAt(e.selections[0]?.active ?? new vscode.Position(0, 0));
        if (at === this.offset) return;
        this.offset = at;
        if (this.all) return;
        // Still in the section drawn (of the text drawn): nothing to do, not even an analysis.
        const d = this.drawn;
        if (d && d.version === this.doc.version && (caseAt(d.cases, at)?.key ?? null) === d.caseKey) return;
        this.soon();
      }),
      vscode.workspace.onDidChangeConfiguration((e) => {
        if (e.affectsConfiguration(SETTINGS_SECTION, this.doc.uri)) this.soon();
      }),
      panel.onDidChangeViewState(() => {
        if (panel.visible) this.soon();
      }),
      panel.webview.onDidReceiveMessage((m: unknown) => {
        const msg = m as Partial<ChartResizeMessage> | null;
        if (msg?.type !== 'dewmark.chart.resize' || typeof msg.width !== 'number') return;
        const width = chartWidthFor(msg.width);
        if (width === this.width) return;
        this.width = width;
        this.drawn = undefined;
        this.soon(60);
      }),
    );
    panel.onDidDispose(() => {
      if (this.timer) clearTimeout(this.timer);
      for (const s of this.subscriptions) s.dispose();
      onDispose();
    });
  }

  /** Switches between every state and the section at the cursor. */
  toggleAll(): void {
    this.all = !this.all;
    this.drawn = undefined;
    this.soon(0);
  }

  /** Moves the chart to the section at `offset`. */
  follow(offset: number): void {
    this.offset = offset;
    this.soon(0);
  }

  private render(): ChartView {
    try {
      const view = chartView(this.doc, this.nonce, this.offset, this.all, this.width);
      this.drawn = { version: this.doc.version, caseKey: view.caseKey, cases: view.cases };
      return view;
    } catch (err) {
      const why = err instanceof Error ? err.message : String(err);
      this.log.error(`the chart of ${this.uri} could not be drawn: ${why}`);
      return {
        svg:
          `<p role="alert">The chart could not be ` +
          `drawn: ${why.replace(/[<>&]/g, ' ')}. The log is in Output → Dewmark.</p>`,
        info: '',
        caseKey: null,
        cases: [],
      };
    }
  }

  /** Redraws shortly (typing does not redraw on every key; a cursor move within one section redraws nothing). */
  private soon(delay = 250): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = undefined;
      if (!this.panel.visible) return;
      const before = this.drawn;
      const view = this.render();
      if (before && before.version === this.doc.version && before.caseKey === view.caseKey) return;
      const message: ChartUpdateMessage = { type: 'dewmark.chart', svg: view.svg, info: view.info };
      void this.panel.webview.postMessage(message);
    }, delay);
  }
}

/** Opens (or reveals) the chart panels; one per note. */
export class ChartPanels implements vscode.Disposable {
  private readonly panels = new Map<string, ChartPanel>();
  private last: ChartPanel | undefined;

  constructor(private readonly log: vscode.LogOutputChannel) {}

  /** Shows the chart of `doc` beside the editor, at the section holding `offset`. */
  show(doc: vscode.TextDocument, offset: number): void {
    const key = doc.uri.toString();
    const existing = this.panels.get(key);
    if (existing) {
      existing.panel.reveal(vscode.ViewColumn.Beside, true);
      existing.follow(offset);
      this.last = existing;
      return;
    }
    const panel = vscode.window.createWebviewPanel(
      'dewmark.chart',
      `Chart: ${basename(doc.uri.path)}`,
      { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true },
      { enableScripts: true, enableCommandUris: false, localResourceRoots: [] },
    );
    const chart = new ChartPanel(
      key,
      doc,
      panel,
      this.log,
      () => {
        this.panels.delete(key);
        if (this.last === chart) this.last = undefined;
        void vscode.commands.executeCommand('setContext', 'dewmark.chartOpen', this.panels.size > 0);
      },
      offset,
    );
    this.panels.set(key, chart);
    this.last = chart;
    void vscode.commands.executeCommand('setContext', 'dewmark.chartOpen', true);
  }

  /**
   * Switches the chart of the active note (else the last one shown) between every state and the
   * section at the cursor. False when no chart is open.
   */
  toggleAll(): boolean {
    const active = vscode.window.activeTextEditor?.document.uri.toString();
    const chart = (active && this.panels.get(active)) || this.last;
    if (!chart) return false;
    chart.toggleAll();
    return true;
  }

  /** Closes every chart panel. */
  dispose(): void {
    for (const p of [...this.panels.values()]) p.panel.dispose();
  }
}

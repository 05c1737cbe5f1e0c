/**
 * `Dewmark: Show Psychrometric Chart`: the active note's chart in a webview beside it, redrawn as
 * the note or the settings change. The chart is drawn by the pure core (`shared-core/src/chart`)
 * from the note's analysis, with the same settings the server reads; the page comes from the
 * core's `chartWebviewHtml` (Content Security Policy `default-src 'none'`, nonce'd style and
 * script, VS Code theme colours). Nothing is loaded from disk or network.
 */
import { randomBytes } from 'node:crypto';
import { basename } from 'node:path';
import * as vscode from 'vscode';
import { chartWebviewHtml, renderChart, type ChartUpdateMessage } from '@dewmark/core/chart';
import { analyzeText, readSettings } from '@dewmark/core/service';
import { HOST_MAX_NOTE_KB, hostBounded } from './hostLimit';
import { SETTINGS_SECTION } from '@dewmark/protocol';

/** The `dewmark.*` keys the core reads, as one plain object for {@link readSettings}. */
const SETTING_KEYS = [
  'units',
  'pressure',
  'elevation',
  'inlayHints.properties',
  'precision',
  'checkClaims',
  'hover.secondaryUnits',
  'maxNoteSizeKB',
];

/** The settings section for a document, as the plain object the server would receive. */
function settingsFor(uri: vscode.Uri): Record<string, unknown> {
  const cfg = vscode.workspace.getConfiguration(SETTINGS_SECTION, uri);
  const out: Record<string, unknown> = {};
  for (const key of SETTING_KEYS) out[key] = cfg.get(key);
  return out;
}

/** The chart SVG of a document, drawn with `nonce` on its style element. */
function chartSvg(doc: vscode.TextDocument, nonce: string): string {
  const text = doc.getText();
  const settings = hostBounded(readSettings(settingsFor(doc.uri)).settings);
  const note = analyzeText(text, settings);
  if (note.limited) {
    // Over the dewmark.maxNoteSizeKB limit: not evaluated, so nothing to draw; say why.
    return `<p role="status">This note is larger than ${settings.maxNoteKB} KB (dewmark.maxNoteSizeKB; at most ${HOST_MAX_NOTE_KB} KB inside VS Code), so it is not evaluated as you type and has no chart here. Use <code>dewmark chart</code> on the command line${settings.maxNoteKB < HOST_MAX_NOTE_KB ? ', or raise the setting' : ''}.</p>`;
  }
  return renderChart(note.analysis, { source: text, title: basename(doc.uri.path), styleNonce: nonce });
}

/** One open chart panel, following one document. */
class ChartPanel {
  private readonly nonce = randomBytes(18).toString('base64');
  private timer: ReturnType<typeof setTimeout> | undefined;
  private readonly subscriptions: vscode.Disposable[] = [];

  constructor(
    readonly uri: string,
    private doc: vscode.TextDocument,
    readonly panel: vscode.WebviewPanel,
    private readonly log: vscode.LogOutputChannel,
    onDispose: () => void,
  ) {
    const title = basename(doc.uri.path);
    panel.webview.html = chartWebviewHtml({ svg: this.render(), nonce: this.nonce, title: `Chart — ${title}` });
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
      vscode.workspace.onDidChangeConfiguration((e) => {
        if (e.affectsConfiguration(SETTINGS_SECTION, this.doc.uri)) this.soon();
      }),
      panel.onDidChangeViewState(() => {
        if (panel.visible) this.soon();
      }),
    );
    panel.onDidDispose(() => {
      if (this.timer) clearTimeout(this.timer);
      for (const s of this.subscriptions) s.dispose();
      onDispose();
    });
  }

  private render(): string {
    try {
      return chartSvg(this.doc, this.nonce);
    } catch (err) {
      const why = err instanceof Error ? err.message : String(err);
      this.log.error(`the chart of ${this.uri} could not be drawn: ${why}`);
      return `<p role="alert">The chart could not be drawn: ${why.replace(/[<>&]/g, ' ')}. The log is in Output → Dewmark.</p>`;
    }
  }

  /** Redraws shortly (typing does not redraw on every key). */
  private soon(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = undefined;
      if (!this.panel.visible) return;
      const message: ChartUpdateMessage = { type: 'dewmark.chart', svg: this.render() };
      void this.panel.webview.postMessage(message);
    }, 250);
  }
}

/** Opens (or reveals) the chart panels; one per note. */
export class ChartPanels implements vscode.Disposable {
  private readonly panels = new Map<string, ChartPanel>();

  constructor(private readonly log: vscode.LogOutputChannel) {}

  /** Shows the chart of `doc` beside the editor. */
  show(doc: vscode.TextDocument): void {
    const key = doc.uri.toString();
    const existing = this.panels.get(key);
    if (existing) {
      existing.panel.reveal(vscode.ViewColumn.Beside, true);
      return;
    }
    const panel = vscode.window.createWebviewPanel(
      'dewmark.chart',
      `Chart: ${basename(doc.uri.path)}`,
      { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true },
      { enableScripts: true, enableCommandUris: false, localResourceRoots: [] },
    );
    this.panels.set(key, new ChartPanel(key, doc, panel, this.log, () => this.panels.delete(key)));
  }

  /** Closes every chart panel. */
  dispose(): void {
    for (const p of [...this.panels.values()]) p.panel.dispose();
  }
}

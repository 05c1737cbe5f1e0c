/**
 * The Dewmark VS Code extension: a thin client. It starts the bundled language server, restarts
 * it if it dies, and adds the commands and the status-bar item and the chart panel. Hovers,
 * hints, diagnostics, fixes and the results-table edits come from the server; the chart
 * (client/src/chart.ts) and the Markdown preview's results (client/src/preview.ts, through
 * `extendMarkdownIt`) are drawn by the pure core in the extension host.
 *
 * This file is shared by the extension's two builds, so it uses no Node module: how the server is
 * started is a {@link ServerLauncher}'s — ./node.ts (the `main` entry, dist/client.js: the Node
 * server dist/server.js over node IPC) or ./web.ts (the `browser` entry, dist/web/client.js: the
 * web build dist/web/server.js in a Web Worker).
 */
import * as vscode from 'vscode';
import {
  CloseAction,
  ErrorAction,
  State,
  WorkDoneProgress,
  type BaseLanguageClient,
  type LanguageClientOptions,
} from 'vscode-languageclient';
import {
  CHECK_WORKSPACE_METHOD,
  RESULTS_TABLE_COMMAND,
  SETTINGS_SECTION,
  type CheckWorkspaceParams,
  type CheckWorkspaceResult,
  type ResultsTableParams,
  type ResultsTableResult,
} from '@dewmark/protocol';
import { readSettings, type ServiceSettings } from '@dewmark/core/service';
import type { ChartPanels } from './chart';
import { COMMANDS, NO_WORKSPACE_CHECK_CONTEXT, OUTPUT_CHANNEL } from './commands';
import {
  advertisedNoteStatus,
  statusFromSettings,
  statusView,
  type NoteStatusParams,
  type NoteStatusResult,
} from './noteStatus';
import { dewmarkPreviewPlugin } from './preview';
import { RestartPolicy } from './restartPolicy';
import { rawSettingsFor } from './settingKeys';

/** When this module was loaded (for the activation-time marker). */
const loadedAt = performance.now();

/** URI schemes whose Markdown documents the server reads (local, unsaved and virtual files). */
export const DOCUMENT_SCHEMES = ['file', 'untitled', 'vscode-vfs'] as const;

/** How one build of the extension starts its language server. */
export interface ServerLauncher {
  /** Why the server cannot be started (its bundle is missing…), or null when it can. */
  problem(): string | null;
  /** The URI schemes of the Markdown documents the server is given. */
  schemes: readonly string[];
  /** A client (not started) for the server, with the shared client options. */
  createClient(id: string, name: string, options: LanguageClientOptions): BaseLanguageClient;
  /** Records activation timings for tests and benchmarks, where the build can. */
  marker?(data: Record<string, number | string>): void;
}

/** What `activate` returns: lets tests and other extensions wait for the server, and extends the Markdown preview. */
export interface DewmarkApi {
  /** Resolves once the language server is running (rejects when it could not start). */
  ready(): Promise<void>;
  /** Called by VS Code's Markdown preview (`markdown.markdownItPlugins`): adds the results tables. */
  extendMarkdownIt<T extends object>(md: T): T;
}

/** The service settings for a document (or the window's when there is none), as the server reads them. */
export function documentSettings(uri: vscode.Uri | undefined): ServiceSettings {
  return readSettings(rawSettingsFor(uri)).settings;
}

/** The preview's `env.currentDocument`, when VS Code passes it. */
function previewDocument(env: unknown): vscode.Uri | undefined {
  const doc = (env as { currentDocument?: unknown } | null | undefined)?.currentDocument;
  return doc instanceof vscode.Uri ? doc : undefined;
}

/** Adds the results tables to the preview's markdown-it (with the note's settings). */
function extendPreview<T extends object>(md: T, output: vscode.LogOutputChannel): T {
  return dewmarkPreviewPlugin(md, {
    settings: (env) => documentSettings(previewDocument(env)),
    onError: (err) =>
      output.error(
        `the preview's results could not be ` +
          `computed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`,
      ),
  });
}

/** The language server's client, restarted on crashes within the limits of a {@link RestartPolicy}. */
class ServerController {
  readonly client: BaseLanguageClient;
  private readonly policy = new RestartPolicy();
  private starting: Promise<void>;

  constructor(launcher: ServerLauncher, output: vscode.LogOutputChannel) {
    const clientOptions: LanguageClientOptions = {
      documentSelector: launcher.schemes.map((scheme) => ({ language: 'markdown', scheme })),
      outputChannel: output,
      markdown: { isTrusted: false, supportHtml: false },
      errorHandler: {
        // Write errors are expected while a dying server's channel closes; the close handler below
        // tells the user (once), so they only go to the log unless they keep coming.
        error: (error, _message, count) => {
          output.warn(`connection to the server: ${error.message}`);
          if ((count ?? 0) <= 3) return { action: ErrorAction.Continue, handled: true };
          return {
            action: ErrorAction.Shutdown,
            message:
              `The connection to the Dewmark language server keeps failing (${error.message}); ` +
              `it was stopped. Run "Dewmark: Restart Language Server" to start it again.`,
          };
        },
        closed: () => {
          const d = this.policy.onCrash();
          output.warn(d.message);
          if (d.announce) {
            if (d.restart) void vscode.window.showWarningMessage(d.message);
            else {
              void vscode.window.showErrorMessage(d.message, 'Restart', 'Show Log').then((choice) => {
                if (choice === 'Restart') void vscode.commands.executeCommand(COMMANDS.restartServer.id);
                if (choice === 'Show Log') output.show(true);
              });
            }
          }
          return {
            action: d.restart ? CloseAction.Restart : CloseAction.DoNotRestart,
            message: d.message,
            handled: true,
          };
        },
      },
    };
    // The id makes VS Code's client read the `dewmark.trace.server` setting.
    this.client = launcher.createClient(SETTINGS_SECTION, 'Dewmark', clientOptions);
    this.starting = this.client.start();
  }

  /** Resolves when the server is running. */
  async ready(): Promise<void> {
    await this.starting;
    if (this.client.state !== State.Running) await this.client.start();
  }

  /** Restarts the server by request of the user (forgets earlier crashes). */
  async restart(): Promise<void> {
    this.policy.reset();
    // Stop then start (what the Node client's restart() does; the browser client has none).
    if (this.client.state === State.Running) await this.client.stop();
    this.starting = this.client.start();
    await this.starting;
  }

  /** The note-status method when this server offers one. */
  noteStatusMethod(): string | null {
    if (this.client.state !== State.Running) return null;
    return advertisedNoteStatus(this.client.initializeResult?.capabilities.experimental);
  }

  /** Whether the running server can check the workspace (the web build's cannot: it has no file system). */
  canCheckWorkspace(): boolean {
    const experimental = this.client.initializeResult?.capabilities.experimental as
      | { dewmark?: { checkWorkspace?: unknown } }
      | undefined;
    return experimental?.dewmark?.checkWorkspace === CHECK_WORKSPACE_METHOD;
  }
}

/** The active note's status: from the server when it can say, else from the settings. */
async function noteStatus(
  ctl: ServerController,
  doc: vscode.TextDocument,
): Promise<{ status: NoteStatusResult; fromServer: boolean }> {
  const method = ctl.noteStatusMethod();
  if (method) {
    try {
      const params: NoteStatusParams = { textDocument: { uri: ctl.client.code2ProtocolConverter.asUri(doc.uri) } };
      const status = await ctl.client.sendRequest<NoteStatusResult | null>(method, params);
      if (status) return { status, fromServer: true };
    } catch (err) {
      ctl.client.debug(`note status request failed: ${String(err)}`);
    }
  }
  const cfg = vscode.workspace.getConfiguration(SETTINGS_SECTION, doc.uri);
  return {
    status: statusFromSettings({
      units: cfg.get('units'),
      pressure: cfg.get('pressure'),
      elevation: cfg.get('elevation'),
    }),
    fromServer: false,
  };
}

function activeNote(): vscode.TextEditor | undefined {
  const editor = vscode.window.activeTextEditor;
  return editor && editor.document.languageId === 'markdown' ? editor : undefined;
}

/** The status-bar item: the active note's unit system and pressure basis; a click switches units. */
function createStatusBar(ctl: ServerController, context: vscode.ExtensionContext): () => void {
  const item = vscode.window.createStatusBarItem('dewmark.status', vscode.StatusBarAlignment.Right, 100);
  item.name = 'Dewmark units';
  item.command = COMMANDS.switchUnits.id;
  context.subscriptions.push(item);
  let seq = 0;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const refresh = async (): Promise<void> => {
    const mine = ++seq;
    const editor = activeNote();
    if (!editor) {
      item.hide();
      return;
    }
    const { status, fromServer } = await noteStatus(ctl, editor.document);
    if (mine !== seq) return;
    const view = statusView(status, fromServer);
    item.text = view.text;
    item.tooltip = view.tooltip;
    item.accessibilityInformation = { label: view.tooltip.split('\n')[0] ?? view.text };
    item.show();
  };
  const soon = (): void => {
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => void refresh(), 250);
  };
  context.subscriptions.push(
    vscode.window.onDidChangeActiveTextEditor(() => void refresh()),
    vscode.workspace.onDidChangeTextDocument((e) => {
      if (e.document === vscode.window.activeTextEditor?.document) soon();
    }),
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration(SETTINGS_SECTION)) soon();
    }),
    ctl.client.onDidChangeState((e) => {
      if (e.newState === State.Running) soon();
    }),
    { dispose: () => timer && clearTimeout(timer) },
  );
  void refresh();
  return () => void refresh();
}

/** `Dewmark: Switch Result Units`: rewrites the note's `units:` line, or changes dewmark.units. */
async function switchUnits(ctl: ServerController, refreshStatus: () => void): Promise<void> {
  const editor = activeNote();
  if (!editor) {
    void vscode.window.showInformationMessage(
      'Dewmark: open a Markdown note first; the result units are switched for the active note.',
    );
    return;
  }
  const doc = editor.document;
  const { status } = await noteStatus(ctl, doc);
  const other = status.units === 'SI' ? 'IP' : 'SI';
  if (status.unitsSource === 'note') {
    if (!status.unitsValueRange) {
      void vscode.window.showInformationMessage(
        `Dewmark: this note sets its result units with a units: line; change it to "units: ${other}".`,
      );
      return;
    }
    const r = status.unitsValueRange;
    const edit = new vscode.WorkspaceEdit();
    edit.replace(doc.uri, new vscode.Range(r.start.line, r.start.character, r.end.line, r.end.character), other);
    if (!(await vscode.workspace.applyEdit(edit)))
      void vscode.window.showErrorMessage(`Dewmark: could not edit the note's units: line (is the file read-only?).`);
  } else if (status.unitsFile) {
    // The project file wins over the setting: changing dewmark.units would change nothing.
    void vscode.window.showInformationMessage(
      `Dewmark: this note's result units are set by ${status.unitsFile}; change "units" there to "${other}".`,
    );
    return;
  } else {
    const cfg = vscode.workspace.getConfiguration(SETTINGS_SECTION, doc.uri);
    const where = cfg.inspect('units');
    const target =
      where?.workspaceFolderValue !== undefined
        ? vscode.ConfigurationTarget.WorkspaceFolder
        : where?.workspaceValue !== undefined
          ? vscode.ConfigurationTarget.Workspace
          : vscode.ConfigurationTarget.Global;
    await cfg.update('units', other, target);
    vscode.window.setStatusBarMessage(`Dewmark: results in ${other} (setting dewmark.units)`, 4000);
  }
  refreshStatus();
}

/** `Dewmark: Check All Notes in the Workspace`, with the server's progress in a notification. */
async function checkWorkspace(ctl: ServerController): Promise<void> {
  if (!vscode.workspace.workspaceFolders?.length) {
    void vscode.window.showInformationMessage(
      'Dewmark: open a folder first; "Check All Notes" reads every Markdown file of the workspace folders.',
    );
    return;
  }
  await ctl.ready();
  if (!ctl.canCheckWorkspace()) {
    void vscode.window.showInformationMessage(WEB_CHECK_WORKSPACE_MESSAGE);
    return;
  }
  const summary = await vscode.window.withProgress(
    { location: vscode.ProgressLocation.Notification, title: 'Dewmark', cancellable: true },
    async (progress, token): Promise<string | null> => {
      const workDoneToken = `dewmark-check-${Date.now()}`;
      let last = 0;
      const sub = ctl.client.onProgress(WorkDoneProgress.type, workDoneToken, (v) => {
        if (v.kind === 'end') return;
        const pct = v.percentage;
        const increment = pct === undefined ? undefined : Math.max(0, pct - last);
        if (pct !== undefined) last = Math.max(last, pct);
        progress.report({ message: v.message ?? (v.kind === 'begin' ? v.title : undefined), increment });
      });
      try {
        const params: CheckWorkspaceParams = { workDoneToken };
        const r = await ctl.client.sendRequest<CheckWorkspaceResult>(CHECK_WORKSPACE_METHOD, params, token);
        const plural = (n: number, w: string) => `${n} ${w}${n === 1 ? '' : 's'}`;
        let text =
          `Dewmark: checked ${plural(r.notes.length, 'note')} with ` +
          `statements (${plural(r.filesRead, 'Markdown file')} ` +
          `read): ${plural(r.errors, 'error')}, ${plural(r.warnings, 'warning')}.`;
        if (r.unreadable.length > 0)
          text += ` ${plural(r.unreadable.length, 'file')} could not be read (see Output → Dewmark).`;
        for (const u of r.unreadable) ctl.client.warn(`could not read ${u.uri}: ${u.reason}`);
        const excluded = r.excluded ?? [];
        if (excluded.length > 0)
          text += ` ${plural(excluded.length, 'file')} left out by dewmark.json (see Output → Dewmark).`;
        for (const e of excluded) ctl.client.info(`left out ${e.uri}: ${e.reason}`);
        const skipped = r.skippedFolders ?? [];
        if (skipped.length > 0)
          text += ` ${plural(skipped.length, 'workspace folder')} skipped (see Output → Dewmark).`;
        for (const f of skipped) ctl.client.warn(`skipped the workspace folder ${f.uri}: ${f.reason}`);
        return text;
      } catch (err) {
        if (token.isCancellationRequested) return null;
        throw err;
      } finally {
        sub.dispose();
      }
    },
  );
  if (summary === null) {
    vscode.window.setStatusBarMessage('Dewmark: check cancelled', 4000);
    return;
  }
  const choice = await vscode.window.showInformationMessage(summary, 'Show Problems');
  if (choice === 'Show Problems') await vscode.commands.executeCommand('workbench.actions.view.problems');
}

/** What "Check All Notes" says where the server has no file system to search (the web build). */
export const WEB_CHECK_WORKSPACE_MESSAGE =
  'Dewmark: "Check All Notes" needs a file system to search, and the browser build of Dewmark has none: ' +
  'each note is checked when you open it (hints, hovers and problems as usual). To check every note at ' +
  'once, open the folder in desktop VS Code or a remote window, or run "dewmark check" on the command line.';

/**
 * `Dewmark: Insert or Refresh Results Table`: asks the server for the edit that writes the results
 * table below the air block at the cursor (every block when the cursor is in none) and applies it.
 */
async function insertResultsTable(ctl: ServerController): Promise<void> {
  const editor = activeNote();
  if (!editor) {
    void vscode.window.showInformationMessage(
      'Dewmark: open a Markdown note first; the results tables are written below its air blocks.',
    );
    return;
  }
  await ctl.ready();
  const doc = editor.document;
  const c2p = ctl.client.code2ProtocolConverter;
  const ask = async (all: boolean): Promise<ResultsTableResult | null> => {
    const params: ResultsTableParams = {
      textDocument: { uri: c2p.asUri(doc.uri) },
      ...(all ? { all: true } : { position: c2p.asPosition(editor.selection.active) }),
    };
    return ctl.client.sendRequest<ResultsTableResult | null>('workspace/executeCommand', {
      command: RESULTS_TABLE_COMMAND,
      arguments: [params],
    });
  };
  let r: ResultsTableResult | null = null;
  // The server answers for the text it has; ask again if the note changed meanwhile.
  for (let attempt = 0; attempt < 3; attempt++) {
    r = await ask(false);
    if (r && r.blocks === 0) r = await ask(true);
    if (!r || r.version === doc.version) break;
  }
  if (!r) {
    void vscode.window.showWarningMessage(
      'Dewmark: the language server does not have this note open; try again in a moment.',
    );
    return;
  }
  if (r.blocks === 0) {
    void vscode.window.showInformationMessage('Dewmark: this note has no ```air block to write a results table for.');
    return;
  }
  if (r.edit) {
    const edit = await ctl.client.protocol2CodeConverter.asWorkspaceEdit(
      r.edit as Parameters<typeof ctl.client.protocol2CodeConverter.asWorkspaceEdit>[0],
    );
    if (!edit || !(await vscode.workspace.applyEdit(edit))) {
      void vscode.window.showErrorMessage(
        'Dewmark: could not write the results table (is the file read-only, or did it change meanwhile?).',
      );
      return;
    }
  }
  let said: string;
  if (r.blocks === 1)
    said = r.inserted
      ? 'results table inserted'
      : r.refreshed
        ? 'results table refreshed'
        : r.unchanged
          ? 'results table already up to date'
          : 'results table left alone';
  else {
    const parts = [
      r.inserted ? `${r.inserted} inserted` : '',
      r.refreshed ? `${r.refreshed} refreshed` : '',
      r.unchanged ? `${r.unchanged} already up to date` : '',
    ].filter(Boolean);
    said = `results tables: ${parts.join(', ') || 'none changed'}`;
  }
  vscode.window.setStatusBarMessage(`Dewmark: ${said}`, 5000);
  if (r.unterminated > 0) {
    void vscode.window.showWarningMessage(
      `Dewmark: ${r.unterminated === 1 ? 'a results table has' : `${r.unterminated} results tables have`} ` +
        `no end marker and ${r.unterminated === 1 ? 'was' : 'were'} ` +
        `left alone; see its warning in the Problems view.`,
    );
  }
}

let controller: ServerController | undefined;

/**
 * Activates the extension with the server `launcher` starts (each build's `activate` calls this
 * when a Markdown document opens: activation event `onLanguage:markdown`).
 */
export function activateWith(context: vscode.ExtensionContext, launcher: ServerLauncher): DewmarkApi {
  const t0 = performance.now();
  const writeMarker = (data: Record<string, number | string>): void => launcher.marker?.(data);
  const output = vscode.window.createOutputChannel(OUTPUT_CHANNEL, { log: true });
  context.subscriptions.push(output);
  const problem = launcher.problem();
  if (problem !== null) {
    const message = `Dewmark: ${problem}`;
    output.error(message);
    void vscode.window.showErrorMessage(message);
    return { ready: () => Promise.reject(new Error(message)), extendMarkdownIt: (md) => extendPreview(md, output) };
  }
  const ctl = new ServerController(launcher, output);
  controller = ctl;
  const refreshStatus = createStatusBar(ctl, context);
  // The preview caches its rendering per document version: redraw it when a Dewmark setting
  // (units, pressure…) changes the results it shows.
  context.subscriptions.push(
    vscode.workspace.onDidChangeConfiguration((e) => {
      if (e.affectsConfiguration(SETTINGS_SECTION))
        void vscode.commands.executeCommand('markdown.preview.refresh').then(undefined, () => undefined);
    }),
  );
  // The chart code (and the core it draws with) is evaluated on first use, not at activation.
  let charts: ChartPanels | undefined;
  context.subscriptions.push({ dispose: () => charts?.dispose() });
  const guard = (name: string, run: () => Promise<void>) => async () => {
    try {
      await run();
    } catch (err) {
      const why = err instanceof Error ? err.message : String(err);
      output.error(`${name} failed: ${why}`);
      void vscode.window.showErrorMessage(`Dewmark: ${name} failed: ${why}`);
    }
  };
  context.subscriptions.push(
    vscode.commands.registerCommand(
      COMMANDS.switchUnits.id,
      guard('switching units', () => switchUnits(ctl, refreshStatus)),
    ),
    vscode.commands.registerCommand(
      COMMANDS.checkWorkspace.id,
      guard('checking the workspace', () => checkWorkspace(ctl)),
    ),
    vscode.commands.registerCommand(
      COMMANDS.restartServer.id,
      guard('restarting the server', async () => {
        await ctl.restart();
        vscode.window.setStatusBarMessage('Dewmark: language server restarted', 4000);
      }),
    ),
    vscode.commands.registerCommand(
      COMMANDS.showChart.id,
      guard('showing the chart', async () => {
        const editor = activeNote();
        if (!editor) {
          void vscode.window.showInformationMessage(
            'Dewmark: open a Markdown note first; the chart shows the active note.',
          );
          return;
        }
        charts ??= new (await import('./chart')).ChartPanels(output);
        charts.show(editor.document, editor.document.offsetAt(editor.selection.active));
      }),
    ),
    vscode.commands.registerCommand(
      COMMANDS.toggleChartCases.id,
      guard('switching the chart between all states and the section at the cursor', async () => {
        if (!charts?.toggleAll()) void vscode.window.showInformationMessage('Dewmark: no chart is open.');
      }),
    ),
    vscode.commands.registerCommand(
      COMMANDS.insertResultsTable.id,
      guard('writing the results table', () => insertResultsTable(ctl)),
    ),
    vscode.commands.registerCommand(COMMANDS.showLog.id, () => output.show(true)),
    { dispose: () => void ctl.client.stop() },
  );
  const activateMs = performance.now() - t0;
  const sinceLoadMs = performance.now() - loadedAt;
  writeMarker({ activateMs, sinceLoadMs });
  ctl.ready().then(
    () => {
      // The palette hides "Check All Notes" where the server cannot search the workspace (the web build).
      void vscode.commands.executeCommand('setContext', NO_WORKSPACE_CHECK_CONTEXT, !ctl.canCheckWorkspace());
      writeMarker({ activateMs, sinceLoadMs, readyMs: performance.now() - t0 });
    },
    (err: unknown) => {
      output.error(`the language server did not start: ${err instanceof Error ? err.message : String(err)}`);
      writeMarker({ activateMs, sinceLoadMs, error: String(err) });
    },
  );
  return { ready: () => ctl.ready(), extendMarkdownIt: (md) => extendPreview(md, output) };
}

/** Called by VS Code on shutdown: stops the server. */
export function deactivate(): Thenable<void> | undefined {
  const c = controller;
  controller = undefined;
  return c?.client.stop();
}

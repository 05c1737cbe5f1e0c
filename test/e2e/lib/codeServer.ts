/**
 * A real VS Code for the extension's end-to-end tests: code-server (VS Code in a browser, run on
 * Node 24 from `.e2e-tools/`) with a fresh profile per run, driven in Debian's headless Chromium
 * through playwright-core. Tests assert on what a user sees: inline hints, hovers, squiggles, the
 * Problems panel, quick fixes and the note's text afterwards.
 *
 * @example
 *   const cs = await startCodeServer({ extension: 'dewmark-0.1.0.vsix', files: { 'note.md': text } });
 *   const wb = await openWorkbench(cs, { name: 'hints' });
 *   try {
 *     await wb.openFile('note.md');
 *     const line = await wb.waitForEditorLine('rh 50 %');
 *     const hover = await wb.hover('A', { line: 'state A', expect: 'Dry-bulb' });
 *     await wb.screenshot('hover');
 *   } finally {
 *     await wb.close();
 *     await cs.stop();
 *   }
 *
 * Every wait is on a condition with a timeout. A wait that times out saves a screenshot (and the
 * visible editor lines) in `test-artifacts/code-server/<name>/` and throws a message saying what was
 * awaited. `stop()` copies code-server's log and the extension-host logs there too.
 *
 * playwright-core is loaded at run time from `.e2e-tools/` (installed by scripts/setup-e2e-tools.sh
 * beside code-server), so the project's own `npm ci` stays small; the few Playwright calls used here
 * are typed by the `Pw*` interfaces below.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import {
  cpSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  openSync,
  closeSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { artifactsDir, findTool, missingTools, type Tool } from './tools';

// ---------------------------------------------------------------------------------------------
// The Playwright surface used here (playwright-core 1.65).

/** Playwright's keyboard (the calls used here). */
export interface PwKeyboard {
  press(key: string, options?: { delay?: number }): Promise<void>;
  type(text: string, options?: { delay?: number }): Promise<void>;
  insertText(text: string): Promise<void>;
}

/** Playwright's mouse (the calls used here). */
export interface PwMouse {
  move(x: number, y: number, options?: { steps?: number }): Promise<void>;
  click(x: number, y: number, options?: { clickCount?: number; button?: 'left' | 'right' }): Promise<void>;
}

/** A console message from the page. */
export interface PwConsoleMessage {
  type(): string;
  text(): string;
}

/** Playwright's page (the calls used here). Browser-side code is passed as strings (see BROWSER_HELPERS). */
export interface PwPage {
  goto(
    url: string,
    options?: { timeout?: number; waitUntil?: 'load' | 'domcontentloaded' | 'networkidle' | 'commit' },
  ): Promise<unknown>;
  waitForSelector(
    selector: string,
    options?: { state?: 'attached' | 'detached' | 'visible' | 'hidden'; timeout?: number },
  ): Promise<unknown>;
  waitForFunction(
    expression: string,
    arg?: unknown,
    options?: { timeout?: number; polling?: number | 'raf' },
  ): Promise<unknown>;
  evaluate(expression: string): Promise<unknown>;
  addInitScript(script: { content: string }): Promise<void>;
  screenshot(options: { path: string; fullPage?: boolean }): Promise<unknown>;
  /** Resizes the browser window's page (the workbench lays itself out again). */
  setViewportSize(size: { width: number; height: number }): Promise<void>;
  on(event: 'console', listener: (m: PwConsoleMessage) => void): unknown;
  on(event: 'pageerror', listener: (e: Error) => void): unknown;
  keyboard: PwKeyboard;
  mouse: PwMouse;
  url(): string;
  close(): Promise<void>;
}

/** Playwright's browser context (the calls used here). */
export interface PwContext {
  newPage(): Promise<PwPage>;
  grantPermissions(permissions: string[], options?: { origin?: string }): Promise<void>;
  close(): Promise<void>;
}

/** Playwright's browser (the calls used here). */
export interface PwBrowser {
  newContext(options?: {
    viewport?: { width: number; height: number };
    deviceScaleFactor?: number;
  }): Promise<PwContext>;
  close(): Promise<void>;
  version(): string;
}

/** Playwright's `chromium` browser type (the call used here). */
export interface PwChromium {
  launch(options: { executablePath: string; headless: boolean; args: string[]; timeout?: number }): Promise<PwBrowser>;
}

/** Loads playwright-core from `.e2e-tools/` (throws naming the set-up script when it is missing). */
export function loadPlaywright(): { chromium: PwChromium } {
  const pw = findTool('playwright-core');
  if (!pw) throw new Error(missingTools('playwright-core'));
  const req = createRequire(join(pw.path, 'package.json'));
  return req(pw.path) as { chromium: PwChromium };
}

// ---------------------------------------------------------------------------------------------
// code-server

/**
 * User settings for a test profile: no workspace-trust prompt (Restricted Mode would disable the
 * extension), no welcome page, walkthroughs, tips, chat panel (it steals focus), telemetry, update
 * or gallery checks, git; inline hints always on; a short hover delay; no minimap.
 */
export const DEFAULT_USER_SETTINGS: Readonly<Record<string, unknown>> = Object.freeze({
  'security.workspace.trust.enabled': false,
  'workbench.startupEditor': 'none',
  'workbench.welcomePage.walkthroughs.openOnInstall': false,
  'workbench.tips.enabled': false,
  'workbench.enableExperiments': false,
  'telemetry.telemetryLevel': 'off',
  'update.mode': 'none',
  'extensions.autoCheckUpdates': false,
  'extensions.autoUpdate': false,
  'extensions.ignoreRecommendations': true,
  'chat.disableAIFeatures': true,
  'git.enabled': false,
  'editor.inlayHints.enabled': 'on',
  'editor.hover.delay': 100,
  'editor.minimap.enabled': false,
  'window.restoreWindows': 'none',
  'files.hotExit': 'off',
  'files.autoSave': 'off',
  // A quick fix leaves its file dirty (saved by the test when it wants), instead of an auto-save racing the test.
  'files.refactoring.autoSave': false,
  'workbench.secondarySideBar.defaultVisibility': 'hidden',
});

/** What {@link startCodeServer} needs. */
export interface CodeServerOptions {
  /** Extensions to install: `.vsix` files (installed with `--install-extension`) or unpacked folders (copied). */
  extensions?: string[];
  /** The folder to open; default `RUN/ws` (created). */
  workspace?: string;
  /** Files to write into the workspace, by relative path. */
  files?: Record<string, string>;
  /** User settings merged over {@link DEFAULT_USER_SETTINGS}. */
  settings?: Record<string, unknown>;
  /** Extra environment for code-server; it reaches the extension host (and so the extension and its server). */
  env?: Record<string, string>;
  /** The run folder (default: a new one under the system temp dir). Everything code-server writes stays in it. */
  runDir?: string;
  /** How long to wait for "HTTP server listening" (default 60 s). */
  startTimeoutMs?: number;
  /** Name of the artifacts sub-folder for logs (default `code-server`). */
  name?: string;
  /** Keep the run folder after `stop()` (default false; logs are copied to the artifacts anyway). */
  keepRunDir?: boolean;
}

/** A running code-server. */
export interface CodeServer {
  /** `http://127.0.0.1:PORT` (no trailing slash). */
  url: string;
  port: number;
  /** The process id; also the process group (`process.kill(-pid)` ends its children). */
  pid: number;
  runDir: string;
  /** The opened folder (absolute). */
  workspace: string;
  userDataDir: string;
  extensionsDir: string;
  /** code-server's own stdout+stderr. */
  logFile: string;
  /** Where `stop()` copies the logs: `test-artifacts/<name>/`. */
  artifactDir: string;
  /** Phase durations in ms (`install`, `listening`). */
  timings: Record<string, number>;
  /** code-server's log so far. */
  log(): string;
  /** Every extension-host log under the profile (extension host, output channels), concatenated with headers. */
  extensionHostLog(): string;
  /** Absolute path of a workspace file. */
  path(rel: string): string;
  /** Ends code-server with its whole process group (extension host, language server), copies logs. */
  stop(): Promise<void>;
}

const running = new Set<ChildProcess>();
let exitHookInstalled = false;

function killGroup(child: ChildProcess, signal: NodeJS.Signals): void {
  if (!child.pid) return;
  try {
    process.kill(-child.pid, signal);
  } catch {
    // already gone
  }
}

function installExitHook(): void {
  if (exitHookInstalled) return;
  exitHookInstalled = true;
  // A test run that ends without stop() must not leave code-server behind.
  process.on('exit', () => {
    for (const c of running) killGroup(c, 'SIGKILL');
  });
}

function need(name: 'node24' | 'code-server' | 'chromium' | 'playwright-core'): Tool {
  const t = findTool(name);
  if (!t) throw new Error(missingTools(name));
  return t;
}

/** Polls `check` (every `intervalMs`) until it returns a value other than false/undefined/null, or times out. */
export async function pollUntil<T>(
  what: string,
  check: () => T | false | undefined | null | Promise<T | false | undefined | null>,
  options: { timeoutMs?: number; intervalMs?: number } = {},
): Promise<T> {
  const timeoutMs = options.timeoutMs ?? 30_000;
  const intervalMs = options.intervalMs ?? 100;
  const deadline = Date.now() + timeoutMs;
  let lastError: unknown;
  for (;;) {
    try {
      const v = await check();
      if (v !== false && v !== undefined && v !== null) return v;
    } catch (e) {
      lastError = e;
    }
    if (Date.now() >= deadline) {
      const extra = lastError instanceof Error ? ` (last error: ${lastError.message})` : '';
      throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}${extra}`);
    }
    await new Promise((r) => setTimeout(r, intervalMs));
  }
}

function readIfExists(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch {
    return '';
  }
}

function listFiles(dir: string): string[] {
  if (!existsSync(dir)) return [];
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...listFiles(p));
    else out.push(p);
  }
  return out;
}

/**
 * Starts code-server (Node 24) in a fresh run folder, with the given extensions installed and a
 * test profile, bound to 127.0.0.1 on a free port; resolves once it logs "HTTP server listening".
 */
export async function startCodeServer(options: CodeServerOptions = {}): Promise<CodeServer> {
  const node24 = need('node24');
  const entry = need('code-server');
  installExitHook();
  const timings: Record<string, number> = {};
  const t0 = Date.now();
  const runDir = options.runDir ? resolve(options.runDir) : mkdtempSync(join(tmpdir(), 'dewmark-cs-'));
  mkdirSync(runDir, { recursive: true });
  const workspace = resolve(options.workspace ?? join(runDir, 'ws'));
  mkdirSync(workspace, { recursive: true });
  for (const [rel, text] of Object.entries(options.files ?? {})) {
    const p = join(workspace, rel);
    mkdirSync(dirname(p), { recursive: true });
    writeFileSync(p, text);
  }
  const userDataDir = join(runDir, 'ud');
  const extensionsDir = join(runDir, 'ext');
  mkdirSync(join(userDataDir, 'User'), { recursive: true });
  mkdirSync(extensionsDir, { recursive: true });
  writeFileSync(
    join(userDataDir, 'User', 'settings.json'),
    JSON.stringify({ ...DEFAULT_USER_SETTINGS, ...options.settings }, null, 2),
  );

  // Everything code-server writes (config.yaml, sockets, caches) goes under the run folder.
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...options.env,
    PATH: `${dirname(node24.path)}:${process.env.PATH ?? ''}`,
    HOME: join(runDir, 'home'),
    XDG_CONFIG_HOME: join(runDir, 'xdg-config'),
    XDG_DATA_HOME: join(runDir, 'xdg-data'),
    XDG_CACHE_HOME: join(runDir, 'xdg-cache'),
    XDG_STATE_HOME: join(runDir, 'xdg-state'),
    TMPDIR: join(runDir, 'tmp'),
  };
  delete env.VSCODE_IPC_HOOK_CLI; // would make code-server talk to an outer VS Code
  for (const k of ['HOME', 'XDG_CONFIG_HOME', 'XDG_DATA_HOME', 'XDG_CACHE_HOME', 'XDG_STATE_HOME', 'TMPDIR'] as const) {
    mkdirSync(env[k] as string, { recursive: true });
  }
  const common = ['--user-data-dir', userDataDir, '--extensions-dir', extensionsDir];

  for (const ext of options.extensions ?? []) {
    const src = resolve(ext);
    if (!existsSync(src)) throw new Error(`extension not found: ${src} (build it first, e.g. npm run package)`);
    if (statSync(src).isDirectory()) {
      const m = JSON.parse(readFileSync(join(src, 'package.json'), 'utf8')) as {
        publisher?: string;
        name?: string;
        version?: string;
      };
      if (!m.publisher || !m.name || !m.version)
        throw new Error(`${src}/package.json needs publisher, name and version`);
      cpSync(src, join(extensionsDir, `${m.publisher}.${m.name}-${m.version}`), { recursive: true, dereference: true });
    } else {
      const r = spawnSync(node24.path, [entry.path, ...common, '--install-extension', src], {
        env,
        encoding: 'utf8',
        timeout: 120_000,
        killSignal: 'SIGKILL',
      });
      if (r.status !== 0) {
        throw new Error(
          `code-server --install-extension ${basename(src)} failed ` +
            `(exit ${r.status}, signal ${r.signal}):\n${r.stdout}\n${r.stderr}`,
        );
      }
    }
  }
  timings.install = Date.now() - t0;

  const logFile = join(runDir, 'code-server.log');
  const fd = openSync(logFile, 'w');
  const child = spawn(
    node24.path,
    [
      entry.path,
      ...common,
      '--bind-addr',
      '127.0.0.1:0', // code-server picks a free port and logs it: no race for the port
      '--auth',
      'none',
      '--disable-telemetry',
      '--disable-update-check',
      '--disable-workspace-trust',
      '--disable-getting-started-override',
      '--disable-proxy',
      workspace,
    ],
    { env, cwd: runDir, stdio: ['ignore', fd, fd], detached: true },
  );
  closeSync(fd);
  running.add(child);
  let exited: { code: number | null; signal: NodeJS.Signals | null } | undefined;
  const exitPromise = new Promise<void>((res) => {
    child.on('exit', (code, signal) => {
      exited = { code, signal };
      running.delete(child);
      res();
    });
  });
  const name = options.name ?? 'code-server';
  const artifactDir = artifactsDir(name);
  const stop = async (): Promise<void> => {
    if (!exited) {
      killGroup(child, 'SIGTERM');
      const t = setTimeout(() => killGroup(child, 'SIGKILL'), 10_000);
      await exitPromise;
      clearTimeout(t);
      killGroup(child, 'SIGKILL'); // anything of the group still alive (the extension host's children)
    }
    mkdirSync(artifactDir, { recursive: true });
    if (existsSync(logFile)) cpSync(logFile, join(artifactDir, 'code-server.log'));
    const logs = join(userDataDir, 'logs');
    if (existsSync(logs)) cpSync(logs, join(artifactDir, 'vscode-logs'), { recursive: true });
    if (!options.keepRunDir) rmSync(runDir, { recursive: true, force: true });
  };

  const started = Date.now();
  let port: number;
  try {
    port = await pollUntil(
      'code-server to log "HTTP server listening"',
      () => {
        if (exited)
          throw new Error(
            `code-server exited (code ${exited.code}, signal ${exited.signal}):\n${readIfExists(logFile)}`,
          );
        const m = readIfExists(logFile).match(/HTTP server listening on http:\/\/127\.0\.0\.1:(\d+)/);
        return m ? Number(m[1]) : undefined;
      },
      { timeoutMs: options.startTimeoutMs ?? 60_000, intervalMs: 50 },
    );
  } catch (e) {
    await stop();
    throw new Error(`${(e as Error).message}\ncode-server log:\n${readIfExists(join(artifactDir, 'code-server.log'))}`);
  }
  timings.listening = Date.now() - started;

  return {
    url: `http://127.0.0.1:${port}`,
    port,
    pid: child.pid ?? -1,
    runDir,
    workspace,
    userDataDir,
    extensionsDir,
    logFile,
    artifactDir,
    timings,
    log: () => readIfExists(logFile),
    extensionHostLog: () =>
      listFiles(join(userDataDir, 'logs'))
        .filter((p) => p.endsWith('.log') && /exthost|output_/.test(p))
        .map((p) => `==> ${relative(userDataDir, p)}\n${readIfExists(p)}`)
        .join('\n'),
    path: (rel) => join(workspace, rel),
    stop,
  };
}

// ---------------------------------------------------------------------------------------------
// The workbench in Chromium

/**
 * Browser-side helpers, installed in the page as `window.__dm` before the workbench loads. Plain
 * JavaScript in a string: test transpilers must not rewrite code that runs in the browser.
 * Scoped to `.part.editor` (the chat input and other inputs are Monaco editors too); Monaco renders
 * spaces as U+00A0, so text is normalised to plain spaces.
 */
const BROWSER_HELPERS = String.raw`
(() => {
  const norm = (s) => (s || '').replace(/\u00a0/g, ' ');
  const visible = (el) => { const r = el.getBoundingClientRect(); return r.width > 0 && r.height > 0; };
  const editor = () => document.querySelector('.part.editor .editor-group-container.active .monaco-editor')
    || document.querySelector('.part.editor .monaco-editor');
  const lineEls = () => {
    const ed = editor();
    if (!ed) return [];
    return [...ed.querySelectorAll('.view-lines .view-line')]
      .map((el) => ({ el, top: parseFloat(el.style.top || '0') }))
      .sort((a, b) => a.top - b.top);
  };
  const lines = () => lineEls().map((l) => norm(l.el.textContent));
  // The box of the occurrence-th match of word in the first visible line containing lineText.
  const wordBox = (word, lineText, occurrence) => {
    const line = lineEls().find((l) => lineText == null || norm(l.el.textContent).includes(lineText));
    if (!line) return { error: 'no visible editor line contains ' + JSON.stringify(lineText) };
    const walker = document.createTreeWalker(line.el, NodeFilter.SHOW_TEXT);
    const nodes = []; let text = '';
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      nodes.push({ n, start: text.length });
      text += norm(n.textContent);
    }
    let at = -1;
    for (let i = 0; i <= (occurrence || 0); i++) { at = text.indexOf(word, at + 1); if (at < 0) break; }
    if (at < 0) {
      const which = 'occurrence #' + (occurrence || 0) + ' of ' + JSON.stringify(word);
      return { error: 'line ' + JSON.stringify(text) + ' has no ' + which };
    }
    const locate = (pos) => {
      for (let i = nodes.length - 1; i >= 0; i--) {
        if (nodes[i].start <= pos) return { node: nodes[i].n, off: pos - nodes[i].start };
      }
      return null;
    };
    const s = locate(at), e = locate(at + word.length - 1);
    const range = document.createRange();
    range.setStart(s.node, s.off); range.setEnd(e.node, e.off + 1);
    const r = range.getBoundingClientRect();
    return { x: r.x + r.width / 2, y: r.y + r.height / 2, width: r.width, height: r.height, line: text };
  };
  const hovers = () => [...document.querySelectorAll('.monaco-hover')]
    .filter((h) => !h.classList.contains('hidden') && visible(h))
    .map((h) => norm(h.innerText || h.textContent).trim()).filter(Boolean);
  const problems = () => [...document.querySelectorAll('.markers-panel .monaco-list-row')]
    .filter(visible)
    .sort((a, b) => Number(a.getAttribute('data-index')) - Number(b.getAttribute('data-index')))
    .map((row) => {
      const text = norm(row.innerText || row.textContent).replace(/\s+/g, ' ').trim();
      const ariaLabel = row.getAttribute('aria-label') || '';
      const part = (sel) => { const e = row.querySelector(sel); return e ? norm(e.textContent).trim() : undefined; };
      const message = part('.marker-message');
      if (message === undefined) return { kind: 'resource', file: part('.label-name'), text, ariaLabel };
      const icon = row.querySelector('.marker-icon');
      const severity = icon
        ? (['error', 'warning', 'info'].find((s) => icon.classList.contains(s)) || 'hint')
        : undefined;
      const pos = /Ln (\d+), Col (\d+)/.exec(part('.marker-line') || '');
      return { kind: 'marker', severity, message, source: part('.marker-source'), code: part('.marker-code'),
        line: pos ? Number(pos[1]) : undefined, column: pos ? Number(pos[2]) : undefined,
        hasQuickFix: !!(icon && icon.classList.contains('quickFix')), text, ariaLabel };
    });
  const squiggles = () => {
    const ed = editor(); if (!ed) return [];
    const ls = lineEls();
    const out = [];
    for (const el of ed.querySelectorAll('.view-overlays [class*="squiggly-"]')) {
      const m = /squiggly-(error|warning|info|hint)/.exec(el.className); if (!m) continue;
      const lineDiv = el.parentElement; const top = parseFloat((lineDiv && lineDiv.style.top) || '0');
      const line = ls.find((l) => Math.abs(l.top - top) < 1);
      out.push({ severity: m[1], line: line ? norm(line.el.textContent) : undefined,
        left: parseFloat(el.style.left || '0'), width: parseFloat(el.style.width || '0') });
    }
    return out;
  };
  const quickInputRows = () => [...document.querySelectorAll('.quick-input-widget .quick-input-list .monaco-list-row')]
    .filter(visible)
    .map((row) => { const r = row.getBoundingClientRect();
      return { label: norm((row.querySelector('.label-name') || row).textContent).trim(),
        ariaLabel: row.getAttribute('aria-label') || '',
        focused: row.classList.contains('focused'), x: r.x + r.width / 2, y: r.y + r.height / 2 }; });
  const quickInputOpen = () => {
    const w = document.querySelector('.quick-input-widget');
    return !!w && visible(w) && w.style.display !== 'none';
  };
  const actionRows = () => [...document.querySelectorAll('.action-widget .monaco-list-row')]
    .filter(visible)
    .map((row) => { const r = row.getBoundingClientRect();
      return { text: norm((row.querySelector('.title') || row).textContent).trim(),
        x: r.x + r.width / 2, y: r.y + r.height / 2, header: row.classList.contains('group-header') }; });
  const activeTab = () => { const t = document.querySelector('.part.editor .editor-group-container.active .tab.active');
    if (!t) return null;
    return { label: t.getAttribute('data-resource-name') || t.getAttribute('aria-label') || norm(t.textContent).trim(),
      dirty: t.classList.contains('dirty') }; };
  const notificationRows = '.notifications-toasts .notification-toast, .notifications-center .notification-list-item';
  const notifications = () => [...document.querySelectorAll(notificationRows)]
    .filter(visible).map((n) => norm((n.querySelector('.notification-list-item-message') || n).textContent).trim());
  const statusBar = () => [...document.querySelectorAll('.part.statusbar .statusbar-item')].filter(visible)
    .map((i) => norm(i.textContent).trim()).filter(Boolean);
  const editorFocused = () => { const ed = editor(); return !!ed && ed.contains(document.activeElement); };
  const firstLineStart = () => {
    const l = lineEls()[0];
    if (!l) return null;
    const r = l.el.getBoundingClientRect();
    return { x: r.x + 2, y: r.y + r.height / 2 };
  };
  window.__dm = { norm, lines, editorFocused, firstLineStart, wordBox, hovers, problems, squiggles, quickInputRows,
    quickInputOpen, actionRows, activeTab, notifications, statusBar,
    ready: () => !!document.querySelector('.monaco-workbench .part.editor')
      && !!document.querySelector('.monaco-workbench .part.statusbar') };
})();
`;

/** One row of the Problems panel, top to bottom. */
export interface ProblemRow {
  /** `resource` (a file row) or `marker` (a problem under it). */
  kind: 'resource' | 'marker';
  /** A file row's file name. */
  file?: string;
  /** A problem's severity, from its icon. */
  severity?: 'error' | 'warning' | 'info' | 'hint';
  /** A problem's message, source and code as shown. */
  message?: string;
  source?: string;
  code?: string;
  /** A problem's 1-based line and column as shown (`[Ln 4, Col 7]`). */
  line?: number;
  column?: number;
  /** Whether the row offers a quick fix (light bulb). */
  hasQuickFix?: boolean;
  /** The row's visible text, whitespace collapsed. */
  text: string;
  /** The row's aria-label (e.g. `Error: <message> at line 4 and character 7. generated by <source>`). */
  ariaLabel: string;
}

/** A squiggle (diagnostic underline) in the visible part of the active editor. */
export interface Squiggle {
  severity: 'error' | 'warning' | 'info' | 'hint';
  /** Text of the editor line it is on (inline hints included), when visible. */
  line?: string;
  /** Pixel offset and width inside the line. */
  left: number;
  width: number;
}

/** What {@link openWorkbench} needs. */
export interface WorkbenchOptions {
  /** Sub-folder of `test-artifacts/code-server/` for screenshots and browser logs (default `workbench`). */
  name?: string;
  /** Open this workspace file at load, through the `payload` URL parameter (no Quick Open). */
  openFile?: string;
  /** Default timeout of the waits (default 30 s). */
  timeoutMs?: number;
  /** Browser viewport (default 1280×800). */
  viewport?: { width: number; height: number };
}

/** Options shared by the waits. */
export interface WaitOptions {
  /** Default: the workbench's `timeoutMs`. */
  timeoutMs?: number;
}

/** The VS Code workbench in headless Chromium, with helpers that act and read as a user would. */
export interface Workbench {
  /** The Playwright page (typed to the calls this module uses). */
  page: PwPage;
  server: CodeServer;
  /** Where screenshots and the browser console go. */
  artifactDir: string;
  /** Phase durations in ms (`browser`, `workbench`, and one per `openFile` / wait that names itself). */
  timings: Record<string, number>;
  /** Opens a workspace file: Quick Open (Ctrl+P, type the path, Enter) or a reload with the `payload` URL. */
  openFile(rel: string, options?: WaitOptions & { via?: 'quickOpen' | 'payload' }): Promise<void>;
  /** The visible lines of the active editor, top to bottom, inline hints included, U+00A0 as spaces. */
  editorLines(): Promise<string[]>;
  /** Waits until a visible line of the active editor contains `text` (e.g. an inline hint); returns that line. */
  waitForEditorLine(text: string | RegExp, options?: WaitOptions): Promise<string>;
  /**
   * Hovers over `word` (in the first visible line containing `line`, `occurrence`-th match) until a
   * hover containing `expect` shows; moves away and back between tries. Returns the hover's text.
   */
  hover(
    word: string,
    options?: WaitOptions & { line?: string; occurrence?: number; expect?: string | RegExp },
  ): Promise<string>;
  /** Text of the visible hovers now. */
  hoverTexts(): Promise<string[]>;
  /** Opens the Problems panel (View: Focus on Problems View) and returns its rows. */
  problems(): Promise<ProblemRow[]>;
  /** Waits until some Problems row's text contains `text`; returns the rows then. */
  waitForProblem(text: string | RegExp, options?: WaitOptions): Promise<ProblemRow[]>;
  /** The squiggles in the visible part of the active editor. */
  squiggles(): Promise<Squiggle[]>;
  /** Waits for a squiggle of the severity (on a line containing `line`, if given). */
  waitForSquiggle(severity: Squiggle['severity'], options?: WaitOptions & { line?: string }): Promise<Squiggle>;
  /** Runs a command from the palette by its label as shown there (e.g. `Dewmark: Restart Server`). */
  runCommand(label: string, options?: WaitOptions): Promise<void>;
  /**
   * Puts the cursor on `word` (in the line containing `line`), opens Quick Fix (Ctrl+.) and applies the
   * action whose title contains `title`.
   */
  applyQuickFix(
    title: string,
    at: { word: string; line?: string; occurrence?: number },
    options?: WaitOptions,
  ): Promise<void>;
  /** Clicks on `word` (in the line containing `line`), which also focuses the editor there. */
  clickWord(word: string, options?: { line?: string; occurrence?: number }): Promise<void>;
  /**
   * The active editor's whole text as the document holds it (inline hints are not part of it):
   * Select All and Copy in the editor, read through the clipboard. Leaves the cursor at the start.
   */
  editorText(options?: WaitOptions): Promise<string>;
  /**
   * Saves `rel` if its editor is dirty (Ctrl+S), waits until the tab is clean and the file changed
   * on disk, and returns the file's text.
   */
  saveAndRead(rel: string, options?: WaitOptions): Promise<string>;
  /** The active tab's label and dirty state. */
  activeTab(): Promise<{ label: string; dirty: boolean } | null>;
  /** Visible notification toasts' messages. */
  notifications(): Promise<string[]>;
  /** Visible status-bar items' texts. */
  statusBar(): Promise<string[]>;
  /** Saves a PNG to the artifact folder; returns its path. */
  screenshot(name: string): Promise<string>;
  /** Waits on a Node-side condition; on timeout saves a screenshot and throws naming `what`. */
  waitFor<T>(
    what: string,
    check: () => Promise<T | false | undefined | null> | T | false | undefined | null,
    options?: WaitOptions & { intervalMs?: number },
  ): Promise<T>;
  /** Closes the browser; writes the browser console to the artifact folder. */
  close(): Promise<void>;
}

/** Chromium flags for this closed machine (no background networking, no sandbox as root, no GPU). */
export const CHROMIUM_ARGS: readonly string[] = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
];

function safeName(s: string): string {
  return s.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 80);
}

function matches(text: string, want: string | RegExp): boolean {
  return typeof want === 'string' ? text.includes(want) : want.test(text);
}

/** Launches headless Chromium, opens the workbench on the server's workspace and waits until it is ready. */
export async function openWorkbench(server: CodeServer, options: WorkbenchOptions = {}): Promise<Workbench> {
  const chromiumTool = need('chromium');
  const { chromium } = loadPlaywright();
  const defaultTimeout = options.timeoutMs ?? 30_000;
  const artifactDir = artifactsDir('code-server', safeName(options.name ?? 'workbench'));
  mkdirSync(artifactDir, { recursive: true });
  const timings: Record<string, number> = {};
  const consoleLines: string[] = [];
  let shots = 0;

  const t0 = Date.now();
  const browser = await chromium.launch({
    executablePath: chromiumTool.path,
    headless: true,
    args: [...CHROMIUM_ARGS],
    timeout: 60_000,
  });
  const context = await browser.newContext({ viewport: options.viewport ?? { width: 1280, height: 800 } });
  await context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: server.url }); // for editorText()
  const page = await context.newPage();
  timings.browser = Date.now() - t0;
  page.on('console', (m) => consoleLines.push(`${m.type()}: ${m.text()}`));
  page.on('pageerror', (e) => consoleLines.push(`pageerror: ${e.message}`));
  await page.addInitScript({ content: BROWSER_HELPERS });

  const call = async <T>(expr: string): Promise<T> => (await page.evaluate(expr)) as T;
  const workbenchUrl = (openRel?: string): string => {
    let url = `${server.url}/?folder=${encodeURIComponent(server.workspace)}`;
    if (openRel) {
      const payload = [['openFile', `vscode-remote://127.0.0.1:${server.port}${server.path(openRel)}`]];
      url += `&payload=${encodeURIComponent(JSON.stringify(payload))}`;
    }
    return url;
  };

  const screenshot = async (name: string): Promise<string> => {
    const p = join(artifactDir, `${safeName(name)}.png`);
    await page.screenshot({ path: p });
    return p;
  };

  const fail = async (what: string, cause: unknown): Promise<never> => {
    let shot = '';
    try {
      shot = await screenshot(`timeout-${++shots}-${what}`);
    } catch {
      shot = '(screenshot failed)';
    }
    let lines: string[] = [];
    try {
      lines = await call<string[]>('window.__dm ? window.__dm.lines() : []');
    } catch {
      // page gone
    }
    const msg = cause instanceof Error ? cause.message : String(cause);
    throw new Error(
      `${msg}\nscreenshot: ${shot}\nvisible editor lines:\n${lines.map((l) => `  | ${l}`).join('\n') || '  (none)'}`,
    );
  };

  const waitFor = async <T>(
    what: string,
    check: () => Promise<T | false | undefined | null> | T | false | undefined | null,
    opts: WaitOptions & { intervalMs?: number } = {},
  ): Promise<T> => {
    const started = Date.now();
    try {
      const v = await pollUntil(what, check, {
        timeoutMs: opts.timeoutMs ?? defaultTimeout,
        intervalMs: opts.intervalMs ?? 100,
      });
      timings[what] = Date.now() - started;
      return v;
    } catch (e) {
      return fail(what, e);
    }
  };

  const loadWorkbench = async (openRel?: string): Promise<void> => {
    await page.goto(workbenchUrl(openRel), { timeout: 60_000, waitUntil: 'domcontentloaded' });
    await waitFor('the workbench', () => call<boolean>('!!(window.__dm && window.__dm.ready())'), {
      timeoutMs: 60_000,
    });
  };

  const editorLines = () => call<string[]>('window.__dm.lines()');
  const activeTab = () => call<{ label: string; dirty: boolean } | null>('window.__dm.activeTab()');

  const waitForOpen = async (rel: string, timeoutMs?: number) => {
    const label = basename(rel);
    await waitFor(
      `the editor of ${rel}`,
      async () => {
        const tab = await activeTab();
        return tab?.label === label && (await editorLines()).length > 0;
      },
      { timeoutMs },
    );
  };

  const t1 = Date.now();
  try {
    await loadWorkbench(options.openFile);
    if (options.openFile) await waitForOpen(options.openFile);
  } catch (e) {
    writeFileSync(join(artifactDir, 'browser-console.txt'), `${consoleLines.join('\n')}\n`);
    await browser.close();
    throw e;
  }
  timings.workbench = Date.now() - t1;

  /** Opens the quick input with a key (retrying: the workbench may not have focus yet) and types. */
  const quickInput = async (key: string, text: string, timeoutMs?: number) => {
    const deadline = Date.now() + (timeoutMs ?? defaultTimeout);
    for (;;) {
      await page.keyboard.press(key);
      try {
        await page.waitForFunction('window.__dm.quickInputOpen()', undefined, { timeout: 2000 });
        break;
      } catch {
        if (Date.now() > deadline)
          return fail(`the quick input (${key})`, new Error(`${key} did not open the quick input`));
        await page.keyboard.press('Escape');
      }
    }
    await page.keyboard.insertText(text);
  };

  const openFile = async (rel: string, opts: WaitOptions & { via?: 'quickOpen' | 'payload' } = {}) => {
    const started = Date.now();
    if (opts.via === 'payload') {
      await loadWorkbench(rel);
    } else {
      await quickInput('Control+P', rel, opts.timeoutMs);
      const label = basename(rel);
      await waitFor(
        `Quick Open to list ${rel}`,
        async () => {
          const rows = await call<{ label: string; focused: boolean }[]>('window.__dm.quickInputRows()');
          return rows.some((r) => r.label === label && r.focused);
        },
        opts,
      );
      await page.keyboard.press('Enter');
    }
    await waitForOpen(rel, opts.timeoutMs);
    timings[`open ${rel}`] = Date.now() - started;
  };

  const waitForEditorLine = (text: string | RegExp, opts: WaitOptions = {}) =>
    waitFor(
      `an editor line containing ${String(text)}`,
      async () => (await editorLines()).find((l) => matches(l, text)),
      opts,
    );

  const box = async (word: string, line?: string, occurrence = 0) => {
    const b = await call<{ x: number; y: number; error?: string }>(
      `window.__dm.wordBox(${JSON.stringify(word)}, ${JSON.stringify(line ?? null)}, ${occurrence})`,
    );
    if (b.error) throw new Error(b.error);
    return b;
  };

  const hoverTexts = () => call<string[]>('window.__dm.hovers()');

  const hover = async (
    word: string,
    opts: WaitOptions & { line?: string; occurrence?: number; expect?: string | RegExp } = {},
  ) => {
    const want = opts.expect ?? '';
    const test = typeof want === 'string' ? `t.includes(${JSON.stringify(want)})` : `${want.toString()}.test(t)`;
    return waitFor(
      `a hover over "${word}"${want ? ` containing ${String(want)}` : ''}`,
      async () => {
        const b = await box(word, opts.line, opts.occurrence);
        // away, then onto the word: a hover only starts on a mouse move into the word
        await page.mouse.move(5, 5);
        await page.mouse.move(b.x, b.y, { steps: 4 });
        try {
          await page.waitForFunction(`window.__dm.hovers().some((t) => ${test})`, undefined, { timeout: 2500 });
        } catch {
          return undefined; // retry: move away and back
        }
        return (await hoverTexts()).find((t) => matches(t, want));
      },
      { timeoutMs: opts.timeoutMs, intervalMs: 50 },
    );
  };

  const runCommand = async (label: string, opts: WaitOptions = {}) => {
    await quickInput('Control+Shift+P', label, opts.timeoutMs);
    const row = await waitFor(
      `the command "${label}" in the palette`,
      async () => {
        const rows =
          await call<{ label: string; focused: boolean; x: number; y: number }[]>('window.__dm.quickInputRows()');
        return rows.find((r) => r.label === label);
      },
      opts,
    );
    if (row.focused) await page.keyboard.press('Enter');
    else await page.mouse.click(row.x, row.y);
    await waitFor(
      `the palette to close after "${label}"`,
      async () => !(await call<boolean>('window.__dm.quickInputOpen()')),
      opts,
    );
  };

  const problems = async () => {
    if ((await call<ProblemRow[]>('window.__dm.problems()')).length === 0) {
      await runCommand('Problems: Focus on Problems View');
    }
    return call<ProblemRow[]>('window.__dm.problems()');
  };

  const waitForProblem = async (text: string | RegExp, opts: WaitOptions = {}) => {
    await problems();
    return waitFor(
      `a Problems row containing ${String(text)}`,
      async () => {
        const rows = await call<ProblemRow[]>('window.__dm.problems()');
        return rows.some((r) => matches(r.text, text) || matches(r.ariaLabel, text)) ? rows : undefined;
      },
      opts,
    );
  };

  const squiggles = () => call<Squiggle[]>('window.__dm.squiggles()');

  const clickWord = async (word: string, opts: { line?: string; occurrence?: number } = {}) => {
    const b = await box(word, opts.line, opts.occurrence);
    await page.mouse.click(b.x, b.y);
  };

  const applyQuickFix = async (
    title: string,
    at: { word: string; line?: string; occurrence?: number },
    opts: WaitOptions = {},
  ) => {
    await page.keyboard.press('Escape');
    await clickWord(at.word, at);
    const row = await waitFor(
      `a quick fix "${title}"`,
      async () => {
        let rows = await call<{ text: string; x: number; y: number; header: boolean }[]>('window.__dm.actionRows()');
        if (rows.length === 0) {
          await page.keyboard.press('Control+.');
          await page
            .waitForFunction('window.__dm.actionRows().length > 0', undefined, { timeout: 3000 })
            .catch(() => undefined);
          rows = await call<{ text: string; x: number; y: number; header: boolean }[]>('window.__dm.actionRows()');
        }
        return rows.find((r) => !r.header && r.text.includes(title));
      },
      opts,
    );
    const before = JSON.stringify(await editorLines());
    await page.mouse.click(row.x, row.y);
    await waitFor(
      `the quick-fix menu to close after "${title}"`,
      async () => (await call<unknown[]>('window.__dm.actionRows()')).length === 0,
      opts,
    );
    // The edit lands asynchronously after the click: wait until the document shows it.
    await waitFor(
      `the quick fix "${title}" to change the document`,
      async () => {
        const tab = await activeTab();
        return tab?.dirty || JSON.stringify(await editorLines()) !== before;
      },
      opts,
    );
  };

  const editorText = async (opts: WaitOptions = {}) => {
    const sentinel = `\u0000dewmark-clipboard-${Date.now()}`;
    await page.evaluate(`navigator.clipboard.writeText(${JSON.stringify(sentinel)})`);
    if (!(await call<boolean>('window.__dm.editorFocused()'))) {
      const p = await call<{ x: number; y: number } | null>('window.__dm.firstLineStart()');
      if (!p) return fail('editorText', new Error('no editor is open'));
      await page.mouse.click(p.x, p.y);
    }
    await page.keyboard.press('Control+A');
    await page.keyboard.press('Control+C');
    const text = await waitFor(
      'the editor text on the clipboard',
      async () => {
        const t = await call<string>('navigator.clipboard.readText()');
        return t !== sentinel ? t : undefined;
      },
      opts,
    );
    await page.keyboard.press('ArrowLeft'); // collapse the selection
    return text;
  };

  const saveAndRead = async (rel: string, opts: WaitOptions = {}) => {
    const label = basename(rel);
    const file = server.path(rel);
    if ((await activeTab())?.label !== label) await openFile(rel, opts);
    if ((await activeTab())?.dirty) {
      const mtimeBefore = statSync(file).mtimeMs;
      const sizeBefore = statSync(file).size;
      await page.keyboard.press('Control+S');
      await waitFor(
        `${rel} to be saved (tab no longer dirty)`,
        async () => {
          const t = await activeTab();
          return t !== null && t.label === label && !t.dirty;
        },
        { ...opts, intervalMs: 100 },
      );
      await waitFor(
        `${rel} to change on disk`,
        () => {
          const st = statSync(file);
          return st.mtimeMs !== mtimeBefore || st.size !== sizeBefore;
        },
        { ...opts, intervalMs: 50 },
      );
    }
    return readFileSync(file, 'utf8');
  };

  return {
    page,
    server,
    artifactDir,
    timings,
    openFile,
    editorLines,
    waitForEditorLine,
    hover,
    hoverTexts,
    problems,
    waitForProblem,
    squiggles,
    waitForSquiggle: (severity, opts = {}) =>
      waitFor(
        `a ${severity} squiggle${opts.line ? ` on a line containing ${opts.line}` : ''}`,
        async () =>
          (await squiggles()).find(
            (s) => s.severity === severity && (!opts.line || (s.line ?? '').includes(opts.line)),
          ),
        opts,
      ),
    runCommand,
    applyQuickFix,
    clickWord,
    editorText,
    saveAndRead,
    activeTab,
    notifications: () => call<string[]>('window.__dm.notifications()'),
    statusBar: () => call<string[]>('window.__dm.statusBar()'),
    screenshot,
    waitFor,
    close: async () => {
      writeFileSync(join(artifactDir, 'browser-console.txt'), `${consoleLines.join('\n')}\n`);
      await browser.close();
    },
  };
}

/** A code-server and a workbench on it, started together; `close()` ends both. */
export interface CodeServerSession {
  server: CodeServer;
  workbench: Workbench;
  close(): Promise<void>;
}

/** Starts code-server and opens the workbench on it (stopping the server again if the workbench fails). */
export async function startSession(
  server: CodeServerOptions,
  workbench: WorkbenchOptions = {},
): Promise<CodeServerSession> {
  const cs = await startCodeServer({ name: `code-server/${safeName(workbench.name ?? 'workbench')}`, ...server });
  let wb: Workbench;
  try {
    wb = await openWorkbench(cs, workbench);
  } catch (e) {
    await cs.stop();
    throw e;
  }
  return {
    server: cs,
    workbench: wb,
    close: async () => {
      try {
        await wb.close();
      } finally {
        await cs.stop();
      }
    },
  };
}

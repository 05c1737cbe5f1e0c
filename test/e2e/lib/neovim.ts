/**
 * Headless Neovim (Debian's 0.7.2, or later) as an independent LSP client for the language-server
 * tests. One call runs one Neovim process with a fresh temporary folder (documents, XDG dirs, plan
 * and report), executes a plan of steps against the server and returns the parsed report.
 *
 * @example
 *   const nvim = requireTool('nvim', ctx);
 *   const run = await runNeovim({
 *     nvim: nvim.path,
 *     server: ['node', 'dist/server.js', '--stdio'],
 *     files: { 'note.md': text },
 *     steps: [
 *       { op: 'open', name: 'note.md' },
 *       { op: 'waitDiagnostics' },
 *       { op: 'hover', position: positionOf(text, 'A:') },
 *       { op: 'edit', startLine: 3, endLine: 4, lines: ['state A: db=25C wb=18C'] },
 *       { op: 'inlayHints' },
 *       { op: 'shutdown' },
 *     ],
 *   });
 *   const hover = run.step('hover');           // typed step result
 *   hoverText(hover.result)                    // markdown/plain text of the hover
 *
 * Neovim specifics the harness takes care of: no `-l` in 0.7 (`-c 'luafile …'` then `-c 'cquit 2'`),
 * a kill of the whole process group (Neovim and the server) on timeout, `-n` and a fresh folder per
 * run (no swap-file prompts), `filetype` set explicitly (languageId comes from it), `root_dir` set,
 * `debounce_text_changes = 0`, push diagnostics only in 0.7 (wait for the version of the change),
 * inlay hints requested raw (0.7 does not know them), and the LSP log kept in the run folder.
 * Positions on the wire are UTF-16; `vimDiagnostics` columns are bytes (see {@link byteColumn}).
 */
import { spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { findTool, missingReason } from './tools';

/** The Lua probe that Neovim runs (a project file beside this one). */
export const PROBE_LUA: string = fileURLToPath(new URL('./neovim-probe.lua', import.meta.url));

/** An LSP position: 0-based line, UTF-16 code-unit character. */
export interface LspPosition {
  line: number;
  character: number;
}

/** An LSP range. */
export interface LspRange {
  start: LspPosition;
  end: LspPosition;
}

/** A diagnostic as the server published it (UTF-16 range). */
export interface LspDiagnostic {
  range: LspRange;
  message: string;
  severity?: number;
  code?: string | number;
  source?: string;
  [key: string]: unknown;
}

/** A diagnostic as Neovim holds it (`vim.diagnostic.get`): 0-based lines, BYTE columns. */
export interface VimDiagnostic {
  lnum: number;
  col: number;
  end_lnum: number;
  end_col: number;
  severity: number;
  message: string;
  source?: string;
  code?: string | number;
}

/** Which document a step acts on: a file `name` given to `open` (default: the last opened). */
interface OnDoc {
  name?: string;
}

/** A position given either as an LSP position or as a cursor (0-based line, byte column). */
type At = { position: LspPosition; cursor?: never } | { cursor: { line: number; byteCol: number }; position?: never };

/** One step of a plan. */
export type NeovimStep =
  /** `:edit` one of `files` (or any path), set its filetype (default `markdown`) and attach the client. */
  | { op: 'open'; name: string; filetype?: string }
  /** Wait for diagnostics of the document's current version; `minCount` waits for at least that many. */
  | ({ op: 'waitDiagnostics'; timeoutMs?: number; minCount?: number } & OnDoc)
  /** `textDocument/hover`. */
  | ({ op: 'hover' } & At & OnDoc)
  /** `textDocument/documentSymbol`. */
  | ({ op: 'documentSymbols' } & OnDoc)
  /** `textDocument/completion` (invoked). */
  | ({ op: 'completion' } & At & OnDoc)
  /**
   * Replace lines as `nvim_buf_set_lines` does (0-based `startLine`, exclusive `endLine`, -1 = end), so
   * the client sends didChange; then (unless `waitDiagnostics: false`) wait for the new diagnostics.
   */
  | ({
      op: 'edit';
      startLine: number;
      endLine: number;
      lines: string[];
      waitDiagnostics?: boolean;
      timeoutMs?: number;
      minCount?: number;
    } & OnDoc)
  /** Raw `textDocument/inlayHint` for `range` (default: the whole document). */
  | ({ op: 'inlayHints'; range?: LspRange } & OnDoc)
  /**
   * `textDocument/codeAction` for `range` with the published diagnostics that touch it; with `apply`,
   * applies the first action whose title contains it (its edit, then its command) and returns the text.
   */
  | ({
      op: 'codeAction';
      range: LspRange;
      only?: string[];
      apply?: string;
      waitDiagnostics?: boolean;
      timeoutMs?: number;
      minCount?: number;
    } & OnDoc)
  /** Any request; the string `"$URI"` anywhere in `params` becomes the current document's uri. */
  | { op: 'request'; method: string; params?: unknown; allowError?: boolean }
  /** The buffer's current text. */
  | ({ op: 'text' } & OnDoc)
  /** `shutdown` + `exit`, and wait for the server process to end. */
  | { op: 'shutdown' };

/** What {@link runNeovim} needs. */
export interface NeovimPlan {
  /** The server's argv (e.g. `['node', 'dist/server.js', '--stdio']`); ignored with `configFile`. */
  server?: string[];
  /** Working directory for the server (default: the repository's current directory). */
  serverCwd?: string;
  /** Extra environment for the server. */
  serverEnv?: Record<string, string>;
  /**
   * A Lua file to `luafile` instead of the probe starting the client itself, e.g. the README's
   * configuration snippet; the probe then uses the client that attaches to the first opened document.
   */
  configFile?: string;
  /** A Lua file run just before `configFile` (e.g. a stand-in for an API of a later Neovim or a plugin). */
  preludeFile?: string;
  /** `settings` for the client (Neovim answers `workspace/configuration` from them). */
  settings?: Record<string, unknown>;
  /** `initializationOptions` sent with `initialize`. */
  initializationOptions?: Record<string, unknown>;
  /** Documents to write into the run folder (the workspace root), by relative name. */
  files?: Record<string, string>;
  /** The steps, in order. */
  steps: NeovimStep[];
  /** Per LSP wait inside Neovim (default 10 s). */
  stepTimeoutMs?: number;
  /** Whole run, after which Neovim and the server are killed (default 60 s). */
  timeoutMs?: number;
  /** Path of `nvim` (default: found by tools.ts). */
  nvim?: string;
  /** Neovim's LSP log level (default `warn`; server stderr is logged at that level). */
  logLevel?: 'trace' | 'debug' | 'info' | 'warn' | 'error';
  /** Extra environment for Neovim itself (also seen by a server started from a `configFile`). */
  env?: Record<string, string>;
  /** Keep the run folder afterwards (default: kept only when the run fails). */
  keepRunDir?: boolean;
  /** Throw when a step fails (default true); false returns the failed report instead. */
  throwOnFailure?: boolean;
}

/** Result of one step: `op`, its duration, and the step's own fields. */
export type StepResult<K extends NeovimStep['op'] = NeovimStep['op']> = { op: K; ms: number } & StepFields[K];

/** The fields each step adds to its result. */
export interface StepFields {
  open: { uri: string; bufnr: number; filetype: string; version: number };
  waitDiagnostics: DiagnosticsResult;
  hover: { position: LspPosition; result: HoverResult | null };
  documentSymbols: { result: unknown[] | null };
  completion: {
    position: LspPosition;
    result: { items: CompletionItem[]; isIncomplete?: boolean } | CompletionItem[] | null;
  };
  edit: { version: number; text: string; diagnostics?: DiagnosticsResult };
  inlayHints: { range: LspRange; result: InlayHint[] | null };
  codeAction: { result: CodeAction[]; applied?: string; text?: string; diagnostics?: DiagnosticsResult };
  request: { method: string; result: unknown; error?: { code: number; message: string; data?: unknown } };
  text: { text: string };
  shutdown: { exit?: { code: number; signal: number } };
}

/** Diagnostics of one document version. */
export interface DiagnosticsResult {
  uri: string;
  /** Neovim's version of the buffer that was awaited. */
  bufVersion: number;
  /** The version the server published (undefined when it sent none). */
  version?: number;
  /** As published (UTF-16 ranges). */
  diagnostics: LspDiagnostic[];
  /** As Neovim holds them (byte columns). */
  vimDiagnostics: VimDiagnostic[];
}

/** An LSP hover. */
export interface HoverResult {
  contents: unknown;
  range?: LspRange;
}

/** An LSP completion item (the fields tests look at). */
export interface CompletionItem {
  label: string;
  kind?: number;
  detail?: string;
  insertText?: string;
  [key: string]: unknown;
}

/** An LSP inlay hint. */
export interface InlayHint {
  position: LspPosition;
  label: string | { value: string }[];
  kind?: number;
  paddingLeft?: boolean;
  paddingRight?: boolean;
  [key: string]: unknown;
}

/** An LSP code action (or a bare command). */
export interface CodeAction {
  title: string;
  kind?: string;
  edit?: unknown;
  command?: unknown;
  diagnostics?: LspDiagnostic[];
  [key: string]: unknown;
}

/** The probe's report. */
export interface NeovimReport {
  /** True when every step succeeded. */
  ok: boolean;
  /** The failure, with a Lua traceback. */
  error?: string;
  /** 1-based index of the step that failed. */
  failedStep?: number;
  /** Neovim's version, e.g. `0.7.2`. */
  nvimVersion: string;
  /** From `initialize`. */
  serverCapabilities?: Record<string, unknown>;
  serverInfo?: { name: string; version?: string };
  offsetEncoding?: string;
  /** Time from client start to initialized (ms). */
  initMs?: number;
  /** One result per step, in order. */
  steps: StepResult[];
  /** How the server process ended. */
  serverExit?: { code: number; signal: number };
  /** Total time inside Neovim (ms). */
  totalMs?: number;
  /** Neovim's LSP log (server stderr lands here). */
  lspLogPath?: string;
}

/** A finished run: the report, plus process facts and typed access to step results. */
export interface NeovimRun {
  report: NeovimReport;
  /** Neovim's exit code (0 = success) and signal (SIGKILL after a timeout). */
  exitCode: number | null;
  signal: NodeJS.Signals | null;
  /** Wall time of the Neovim process (ms). */
  wallMs: number;
  stdout: string;
  stderr: string;
  /** The run folder (removed unless kept). */
  runDir: string;
  /** Absolute paths of the written `files`, by name. */
  paths: Record<string, string>;
  /** The LSP log's text (read before the run folder is removed). */
  lspLog: string;
  /** The `n`-th (0-based, default first) result of the given op; throws when there is none. */
  step<K extends NeovimStep['op']>(op: K, n?: number): StepResult<K>;
  /** Every result of the given op. */
  all<K extends NeovimStep['op']>(op: K): StepResult<K>[];
}

/** Thrown when Neovim cannot be found, times out, or a step fails (the message has the details). */
export class NeovimRunError extends Error {
  override name = 'NeovimRunError';
  /** The run, when Neovim got as far as reporting. */
  constructor(
    message: string,
    readonly run?: NeovimRun,
  ) {
    super(message);
  }
}

const REPORT_MARKER = 'DEWMARK_PROBE_REPORT ';

/** Turns Lua's "empty table" ambiguity into arrays where arrays are expected. */
function asArray<T>(x: unknown): T[] {
  if (Array.isArray(x)) return x as T[];
  if (x && typeof x === 'object' && Object.keys(x).length === 0) return [];
  return x === undefined || x === null ? [] : (x as T[]);
}

function normalise(report: NeovimReport): NeovimReport {
  report.steps = asArray<StepResult>(report.steps);
  for (const s of report.steps as Array<Record<string, unknown>>) {
    for (const key of ['diagnostics'] as const) {
      const d = s[key] as DiagnosticsResult | undefined;
      if (d && typeof d === 'object' && 'uri' in d) {
        d.diagnostics = asArray(d.diagnostics);
        d.vimDiagnostics = asArray(d.vimDiagnostics);
      }
    }
    if (s.op === 'waitDiagnostics') {
      s.diagnostics = asArray(s.diagnostics);
      s.vimDiagnostics = asArray(s.vimDiagnostics);
    }
    if (s.op === 'codeAction') s.result = asArray(s.result);
    if (!('result' in s) && ['hover', 'documentSymbols', 'completion', 'inlayHints', 'request'].includes(String(s.op)))
      s.result = null;
  }
  return report;
}

function tail(text: string, lines = 40): string {
  return text.split('\n').slice(-lines).join('\n');
}

/**
 * Runs one headless Neovim against the server with the given plan and returns the parsed report.
 * Throws {@link NeovimRunError} (with the step, the Lua traceback, Neovim's stderr and the LSP log's
 * tail) when Neovim is missing, exceeds `timeoutMs`, or a step fails (unless `throwOnFailure: false`).
 */
export async function runNeovim(plan: NeovimPlan): Promise<NeovimRun> {
  const nvim = plan.nvim ?? findTool('nvim')?.path;
  if (!nvim) throw new NeovimRunError(missingReason('nvim') ?? 'nvim not found');
  if (!plan.configFile && !plan.server?.length) {
    throw new NeovimRunError('runNeovim: give `server` (the server argv) or `configFile`');
  }
  const runDir = mkdtempSync(join(tmpdir(), 'dewmark-nvim-'));
  const root = join(runDir, 'ws');
  const paths: Record<string, string> = {};
  for (const [name, text] of Object.entries(plan.files ?? {})) {
    const p = join(root, name);
    mkdirSync(dirname(p), { recursive: true });
    writeFileSync(p, text);
    paths[name] = p;
  }
  mkdirSync(root, { recursive: true });
  const xdg = (k: string) => {
    const p = join(runDir, k);
    mkdirSync(p, { recursive: true });
    return p;
  };
  const resultFile = join(runDir, 'report.json');
  const steps = plan.steps.map((s) => {
    const withPath = (name: string | undefined) =>
      name === undefined ? undefined : (paths[name] ?? resolve(root, name));
    if (s.op === 'open') return { ...s, path: withPath(s.name) };
    if ('name' in s && s.name !== undefined) return { ...s, path: withPath(s.name) };
    return s;
  });
  const luaPlan = {
    cmd: plan.server,
    cmdCwd: plan.serverCwd,
    cmdEnv: plan.serverEnv,
    root,
    configFile: plan.configFile,
    preludeFile: plan.preludeFile,
    settings: plan.settings,
    initializationOptions: plan.initializationOptions,
    timeoutMs: plan.stepTimeoutMs ?? 10_000,
    resultFile,
    logLevel: plan.logLevel ?? 'warn',
    steps,
  };
  const planFile = join(runDir, 'plan.json');
  writeFileSync(planFile, JSON.stringify(luaPlan));
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...plan.env,
    DEWMARK_PROBE_PLAN: planFile,
    XDG_CONFIG_HOME: xdg('config'),
    XDG_DATA_HOME: xdg('data'),
    XDG_STATE_HOME: xdg('state'),
    XDG_CACHE_HOME: xdg('cache'), // 0.7 keeps lsp.log here
  };
  const timeoutMs = plan.timeoutMs ?? 60_000;
  const t0 = Date.now();
  const { code, signal, stdout, stderr, timedOut } = await new Promise<{
    code: number | null;
    signal: NodeJS.Signals | null;
    stdout: string;
    stderr: string;
    timedOut: boolean;
  }>((resolveRun, reject) => {
    // Detached: its own process group, so a timeout kills Neovim and the server it started.
    const child = spawn(
      nvim,
      ['--headless', '--clean', '-n', '-u', 'NONE', '-i', 'NONE', '-c', `luafile ${PROBE_LUA}`, '-c', 'cquit 2'],
      {
        cwd: root,
        env,
        stdio: ['ignore', 'pipe', 'pipe'],
        detached: true,
      },
    );
    let out = '';
    let err = '';
    let timedOut = false;
    child.stdout.on('data', (d: Buffer) => (out += d.toString()));
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    const timer = setTimeout(() => {
      timedOut = true;
      try {
        if (child.pid) process.kill(-child.pid, 'SIGKILL');
      } catch {
        child.kill('SIGKILL');
      }
    }, timeoutMs);
    child.on('error', (e) => {
      clearTimeout(timer);
      reject(new NeovimRunError(`could not start ${nvim}: ${e.message}`));
    });
    child.on('close', (c, s) => {
      clearTimeout(timer);
      // The server should be gone after shutdown; make sure nothing of the group outlives the run.
      try {
        if (child.pid) process.kill(-child.pid, 'SIGKILL');
      } catch {
        // already gone
      }
      resolveRun({ code: c, signal: s, stdout: out, stderr: err, timedOut });
    });
  });
  const wallMs = Date.now() - t0;

  let report: NeovimReport | undefined;
  const fromStdout = stdout.split('\n').find((l) => l.startsWith(REPORT_MARKER));
  try {
    if (existsSync(resultFile)) report = JSON.parse(readFileSync(resultFile, 'utf8')) as NeovimReport;
    else if (fromStdout) report = JSON.parse(fromStdout.slice(REPORT_MARKER.length)) as NeovimReport;
  } catch {
    report = undefined;
  }
  const lspLogPath = report?.lspLogPath ?? join(runDir, 'cache', 'nvim', 'lsp.log');
  const lspLog = existsSync(lspLogPath) ? readFileSync(lspLogPath, 'utf8') : '';
  const failed = timedOut || !report || !report.ok || code !== 0;
  const keep = plan.keepRunDir || failed;

  const base = report ? normalise(report) : { ok: false, nvimVersion: '', steps: [] };
  const run: NeovimRun = {
    report: base,
    exitCode: code,
    signal,
    wallMs,
    stdout,
    stderr,
    runDir,
    paths,
    lspLog,
    step<K extends NeovimStep['op']>(op: K, n = 0): StepResult<K> {
      const found = base.steps.filter((s) => s.op === op)[n];
      if (!found)
        throw new NeovimRunError(
          `no result #${n} for step '${op}' (steps: ${base.steps.map((s) => s.op).join(', ') || 'none'})`,
          run,
        );
      return found as StepResult<K>;
    },
    all<K extends NeovimStep['op']>(op: K): StepResult<K>[] {
      return base.steps.filter((s) => s.op === op) as StepResult<K>[];
    },
  };
  if (!keep) rmSync(runDir, { recursive: true, force: true });

  if (failed && plan.throwOnFailure !== false) {
    const what = timedOut
      ? `Neovim did not finish within ${timeoutMs} ms and was killed`
      : !report
        ? `Neovim exited (code ${code}, signal ${signal}) without a report`
        : report.ok
          ? `Neovim exited with code ${code}`
          : report.failedStep
            ? `${report.error}`
            : `the probe failed before the steps: ${report.error}`;
    throw new NeovimRunError(
      [
        `Neovim LSP run failed: ${what}`,
        `steps done: ${base.steps.map((s) => s.op).join(', ') || 'none'}`,
        stderr.trim() ? `nvim stderr:\n${tail(stderr)}` : '',
        lspLog.trim() ? `LSP log (${lspLogPath}):\n${tail(lspLog)}` : 'LSP log: empty',
        `run folder kept: ${runDir}`,
      ]
        .filter(Boolean)
        .join('\n'),
      run,
    );
  }
  return run;
}

/** The text of a hover's contents (MarkupContent, MarkedString or an array of them), joined by blank lines. */
export function hoverText(hover: HoverResult | null | undefined): string {
  if (!hover) return '';
  const one = (c: unknown): string => {
    if (typeof c === 'string') return c;
    if (c && typeof c === 'object' && 'value' in c) return String((c as { value: unknown }).value);
    return '';
  };
  const c = hover.contents;
  return Array.isArray(c) ? c.map(one).join('\n\n') : one(c);
}

/** The labels of inlay hints, flattening label parts; in document order. */
export function inlayHintLabels(hints: InlayHint[] | null | undefined): string[] {
  return asArray<InlayHint>(hints)
    .slice()
    .sort((a, b) => a.position.line - b.position.line || a.position.character - b.position.character)
    .map((h) =>
      typeof h.label === 'string'
        ? h.label
        : asArray<{ value: string }>(h.label)
            .map((p) => p.value)
            .join(''),
    );
}

/** The labels of a completion result (list or array). */
export function completionLabels(result: StepFields['completion']['result']): string[] {
  if (!result) return [];
  const items = Array.isArray(result) ? result : asArray<CompletionItem>(result.items);
  return items.map((i) => i.label);
}

/**
 * The LSP position (UTF-16) of the `occurrence`-th (0-based) appearance of `needle` in `text`, plus
 * `offset` code units into it. Throws when the needle is not there.
 */
export function positionOf(text: string, needle: string, occurrence = 0, offset = 0): LspPosition {
  let at = -1;
  for (let i = 0; i <= occurrence; i++) {
    at = text.indexOf(needle, at + 1);
    if (at < 0) throw new Error(`positionOf: "${needle}" occurs ${i} time(s) in the text, wanted #${occurrence}`);
  }
  const before = text.slice(0, at + offset);
  const line = before.split('\n').length - 1;
  return { line, character: before.length - before.lastIndexOf('\n') - 1 };
}

/** The byte column (UTF-8, as Neovim counts) of UTF-16 `character` in `lineText`. */
export function byteColumn(lineText: string, character: number): number {
  return Buffer.byteLength(lineText.slice(0, character), 'utf8');
}

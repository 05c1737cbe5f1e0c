/**
 * Batch Emacs with eglot (Debian's Emacs 28.2 and elpa-eglot 1.9, or later) as an independent LSP
 * client for the language-server tests. One call runs one Emacs process in a fresh folder (HOME,
 * the note, the report) with a configuration file (the README's, see `editorConfigs.ts`), and
 * returns the probe's report: what the server published, what flymake shows, a hover, and the
 * diagnostics after one edit (see `emacs-probe.el`).
 *
 * @example
 *   const emacs = requireTool('emacs', ctx);
 *   const run = await runEmacs({ emacs: emacs.path, configFile, env: { DEWMARK_LANGUAGE_SERVER: SERVER },
 *     note: { name: 'ahu.md', text }, hoverAt: 'OA:', edit: { from: 'db=24 ', to: 'db=24C ' } });
 *   run.report.hover  // the hover's Markdown
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The Emacs Lisp probe (a project file beside this one). */
export const EMACS_PROBE: string = fileURLToPath(new URL('./emacs-probe.el', import.meta.url));

/** A diagnostic as the server published it (0-based line, UTF-16 character of its start). */
export interface PublishedDiagnostic {
  code: string;
  severity: number;
  line: number;
  character: number;
  message: string;
}

/** A diagnostic as flymake shows it in the buffer (1-based line). */
export interface FlymakeDiagnostic {
  line: number;
  /** `eglot-error`, `eglot-warning` or `eglot-note`. */
  type: string;
  text: string;
}

/** The probe's report. */
export interface EmacsReport {
  emacsVersion?: string;
  eglotLibrary?: string;
  majorMode?: string;
  serverInfo?: { name?: string; version?: string };
  languageId?: string;
  diagnostics?: PublishedDiagnostic[];
  flymake?: FlymakeDiagnostic[];
  hover?: string;
  editVersion?: number;
  diagnosticsAfterEdit?: PublishedDiagnostic[];
  /** `step: message` when a step failed. */
  error?: string;
}

/** What {@link runEmacs} needs. */
export interface EmacsPlan {
  /** Path of `emacs`. */
  emacs: string;
  /** The configuration to load as an init file would. */
  configFile: string;
  /** Extra environment for Emacs (and the server it starts). */
  env?: Record<string, string>;
  /** The note to open (its name picks markdown-mode). */
  note: { name: string; text: string };
  /** Text whose first occurrence the hover is requested at. */
  hoverAt: string;
  /** The edit: the first `from` is replaced by `to`. */
  edit: { from: string; to: string };
  /** Whole run, after which Emacs and the server are killed (default 90 s). */
  timeoutMs?: number;
}

/** A finished run. */
export interface EmacsRun {
  report: EmacsReport;
  exitCode: number | null;
  stderr: string;
}

/** Runs the probe; throws with Emacs's output when it fails, times out or writes no report. */
export async function runEmacs(plan: EmacsPlan): Promise<EmacsRun> {
  const dir = mkdtempSync(join(tmpdir(), 'dewmark-emacs-'));
  try {
    const note = join(dir, plan.note.name);
    const reportPath = join(dir, 'report.json');
    writeFileSync(note, plan.note.text);
    const child = spawn(plan.emacs, ['--batch', '-q', '-l', EMACS_PROBE], {
      cwd: dir,
      detached: true, // its own process group: a timeout kills Emacs and the server together
      stdio: ['ignore', 'pipe', 'pipe'],
      env: {
        ...process.env,
        HOME: dir,
        ...plan.env,
        DEWMARK_PROBE_CONFIG: plan.configFile,
        DEWMARK_PROBE_NOTE: note,
        DEWMARK_PROBE_REPORT: reportPath,
        DEWMARK_PROBE_HOVER_AT: plan.hoverAt,
        DEWMARK_PROBE_EDIT_FROM: plan.edit.from,
        DEWMARK_PROBE_EDIT_TO: plan.edit.to,
      },
    });
    let stderr = '';
    child.stdout.on('data', (b: Buffer) => {
      stderr += b.toString();
    });
    child.stderr.on('data', (b: Buffer) => {
      stderr += b.toString();
    });
    const timeoutMs = plan.timeoutMs ?? 90_000;
    const exitCode = await new Promise<number | null>((resolve, reject) => {
      const timer = setTimeout(() => {
        try {
          process.kill(-child.pid!, 'SIGKILL');
        } catch {
          // already gone
        }
        reject(new Error(`Emacs did not finish in ${timeoutMs / 1000} s; its output:\n${stderr}`));
      }, timeoutMs);
      child.on('error', (err) => {
        clearTimeout(timer);
        reject(err);
      });
      child.on('exit', (code) => {
        clearTimeout(timer);
        resolve(code);
      });
    });
    let report: EmacsReport;
    try {
      report = JSON.parse(readFileSync(reportPath, 'utf8')) as EmacsReport;
      // Emacs writes an empty list as null.
      for (const key of ['diagnostics', 'flymake', 'diagnosticsAfterEdit'] as const)
        if (report[key] === null) report[key] = [];
    } catch {
      throw new Error(`Emacs (exit ${exitCode}) wrote no report; its output:\n${stderr}`);
    }
    if (exitCode !== 0 || report.error)
      throw new Error(`the Emacs probe failed (exit ${exitCode}): ${report.error ?? '?'}\n${stderr}`);
    return { report, exitCode, stderr };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

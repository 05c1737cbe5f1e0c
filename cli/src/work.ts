/**
 * The work done per file, as a pure function of the file's text, so that it can run in the main
 * thread or in worker threads (many files are checked in parallel on a multi-core machine).
 */
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import type { EvaluateSettings } from './core';
import { analyzeNote } from './core';
import { STDIN_PATH, decodeText, readInput, type Input } from './files';
import type { Counts } from './output';
import { countDiagnostics, diagnosticJson, diagnosticLine, evalFileJson, fileResult, processesTable, statesTable } from './output';

/** What is produced for each file. */
export type Mode = 'check-text' | 'check-json' | 'eval-table' | 'eval-json';

/** The output of one file: text to print, or a JSON value, and its diagnostic counts. */
export interface FileOutput {
  text: string;
  json: unknown;
  counts: Counts;
}

/** One file to do: a path, or text already read (standard input). */
export interface Task {
  input: Input;
  text?: string;
}

/** The outcome of one task. */
export type TaskResult = { ok: true; out: FileOutput } | { ok: false; message: string };

/** Analyses one note and renders it for `mode`. */
export function renderFile(mode: Mode, display: string, text: string, settings: Partial<EvaluateSettings>): FileOutput {
  const f = fileResult(display, text, analyzeNote(text, settings));
  const counts = countDiagnostics([f]);
  switch (mode) {
    case 'check-text': {
      let t = '';
      for (const d of f.analysis.diagnostics) t += `${diagnosticLine(f, d)}\n`;
      return { text: t, json: null, counts };
    }
    case 'check-json':
      return { text: '', json: { path: f.path, diagnostics: f.analysis.diagnostics.map((d) => diagnosticJson(f, d)) }, counts };
    case 'eval-json':
      return { text: '', json: evalFileJson(f), counts };
    case 'eval-table': {
      let t = `${f.path}  (results in ${f.analysis.units}${f.analysis.unitsSource === 'note' ? ', from the note' : ''})\n\n`;
      const st = statesTable(f);
      const pr = processesTable(f);
      if (st) t += `States\n${st}\n\n`;
      if (pr) t += `Processes (positive = heat or water added to the air)\n${pr}\n\n`;
      if (!st && !pr) t += 'no states or processes\n\n';
      if (f.analysis.diagnostics.length > 0) {
        t += 'Diagnostics\n';
        for (const d of f.analysis.diagnostics) t += `${diagnosticLine(f, d)}\n`;
        t += '\n';
      }
      return { text: t, json: null, counts };
    }
  }
}

/** Reads (unless the text is given) and renders one task; never throws. */
export function runTask(task: Task, mode: Mode, settings: Partial<EvaluateSettings>): TaskResult {
  const read = task.text !== undefined ? { ok: true as const, text: task.text } : task.input.abs === null ? decodeText(new Uint8Array(), STDIN_PATH) : readInput(task.input);
  if (!read.ok) return { ok: false, message: read.message };
  try {
    return { ok: true, out: renderFile(mode, task.input.display, read.text, settings) };
  } catch (err) {
    return { ok: false, message: `'${task.input.display}' could not be checked (${err instanceof Error ? err.message : String(err)}); please report it with the note` };
  }
}

interface WorkerJob {
  dewmarkWorker: true;
  tasks: Task[];
  mode: Mode;
  settings: Partial<EvaluateSettings>;
}

/** In a worker thread started by {@link runTasks}: does the job and posts the results. Returns true when it was one. */
export function workerMain(): boolean {
  if (isMainThread || !parentPort) return false;
  const job = workerData as WorkerJob | undefined;
  if (!job || job.dewmarkWorker !== true) return false;
  parentPort.postMessage(job.tasks.map((t) => runTask(t, job.mode, job.settings)));
  return true;
}

/** Files below which everything runs in the main thread (starting workers costs more). */
const PARALLEL_FROM = 64;

/** How many worker threads to use for `n` files (0: run in the main thread). */
export function workerCount(n: number): number {
  if (n < PARALLEL_FROM || process.env.DEWMARK_WORKERS === '0') return 0;
  // Workers run this same bundle; from TypeScript sources (no bundle) everything stays in one thread.
  if (typeof __filename !== 'string' || !__filename.endsWith('.js')) return 0;
  let cores = 1;
  try {
    cores = availableParallelism();
  } catch {
    cores = 1;
  }
  return Math.max(0, Math.min(4, cores, Math.ceil(n / PARALLEL_FROM)));
}

/**
 * Runs the tasks in order and calls `onResult` for each, in input order. With several files and
 * cores the work is split into contiguous chunks, one per worker thread.
 */
export async function runTasks(
  tasks: Task[],
  mode: Mode,
  settings: Partial<EvaluateSettings>,
  onResult: (task: Task, r: TaskResult) => void,
  onProgress?: (done: number) => void,
): Promise<void> {
  const k = workerCount(tasks.length);
  if (k <= 1) {
    tasks.forEach((t, i) => {
      onResult(t, runTask(t, mode, settings));
      if (onProgress && (i % 10 === 9 || i === tasks.length - 1)) onProgress(i + 1);
    });
    return;
  }
  const size = Math.ceil(tasks.length / k);
  const chunks: Task[][] = [];
  for (let i = 0; i < tasks.length; i += size) chunks.push(tasks.slice(i, i + size));
  let done = 0;
  const results = await Promise.all(
    chunks.map(
      (chunk) =>
        new Promise<TaskResult[]>((resolve) => {
          const job: WorkerJob = { dewmarkWorker: true, tasks: chunk, mode, settings };
          let settled = false;
          const w = new Worker(__filename, { workerData: job });
          w.once('message', (r: TaskResult[]) => {
            settled = true;
            done += chunk.length;
            onProgress?.(done);
            resolve(r);
          });
          const fallback = () => {
            // A worker that fails to start or dies: do its chunk here instead.
            if (settled) return;
            settled = true;
            resolve(chunk.map((t) => runTask(t, mode, settings)));
          };
          w.once('error', fallback);
          w.once('exit', fallback);
        }),
    ),
  );
  results.forEach((rs, c) => rs.forEach((r, i) => onResult(chunks[c]![i]!, r)));
}

/**
 * The work done per file, as a pure function of the file's text, so that it can run in the main
 * thread or in worker threads (many files are checked in parallel on a multi-core machine).
 */
import { os, workerThreads } from './builtins';
import type { EvaluateSettings } from './core';
import { LineIndex, analyzeHandingOut, analyzeNote, type Analysis } from './core';
import { STDIN_PATH, decodeText, readInput, type Input } from '@dewmark/files';
import type { CheckedFile, Counts, TakePiece } from './output';
import { safeLinePath } from './sanitize';
import {
  countDiagnostics,
  diagnosticCounts,
  diagnosticJson,
  diagnosticLine,
  evalFileText,
  evalNoteText,
  fileResult,
  pieceText,
  processesTable,
  statesTable,
} from './output';

/** What is produced for each file. */
export type Mode = 'check-text' | 'check-json' | 'eval-table' | 'eval-json';

/**
 * The output of one file: text to print, or a JSON value, and its diagnostic counts. For
 * `eval-json` the text is the file's object of the JSON document (nested two levels deep), or
 * empty when it was handed out in pieces as it was written (see {@link renderFile}).
 */
export interface FileOutput {
  text: string;
  json: unknown;
  counts: Counts;
}

/** Where a file's output may go in pieces of bytes as it is written, instead of as one string. */
export type Emit = TakePiece;

/** One file to do: a path, or text already read (standard input). */
export interface Task {
  input: Input;
  text?: string;
  /** The most bytes the file may be (--max-note-size); the default when absent. */
  maxBytes?: number;
  /** The note's own settings (its project file under the command-line options); else the run's. */
  settings?: Partial<EvaluateSettings>;
}

/** The outcome of one task. */
export type TaskResult = { ok: true; out: FileOutput } | { ok: false; message: string };

/**
 * Analyses one note and renders it for `mode`. With `emit`, the `eval-json` text goes there in
 * pieces (one per state, process or diagnostic) once the note is analysed, so that a large note's
 * document is never one string in memory.
 */
export function renderFile(
  mode: Mode,
  display: string,
  text: string,
  settings: Partial<EvaluateSettings>,
  emit?: Emit,
): FileOutput {
  if (mode === 'eval-json' && emit) {
    // Each state written as it is evaluated, nothing kept (for most notes; else analysed whole below).
    const counts = evalNoteText(display, text, settings, 2, emit);
    if (counts) return { text: '', json: null, counts };
  }
  if (mode === 'check-text' || mode === 'check-json') {
    // Only the diagnostics are printed: the items are let go as they are made (for most notes).
    const handingOut = analyzeHandingOut(text, settings);
    const analysis = handingOut ? handingOut.run(() => {}) : analyzeNote(text, settings);
    return checkOutput(mode, { path: display, text, lines: new LineIndex(text) }, analysis);
  }
  const f = fileResult(display, text, analyzeNote(text, settings));
  const counts = countDiagnostics([f]);
  switch (mode) {
    case 'eval-json': {
      // The file's object inside the document's `files` array: two levels deep.
      if (emit) {
        evalFileText(f, 2, emit);
        return { text: '', json: null, counts };
      }
      const pieces: string[] = [];
      evalFileText(f, 2, (piece) => {
        pieces.push(pieceText(piece));
        return false;
      });
      return { text: pieces.join(''), json: null, counts };
    }
    case 'eval-table': {
      const from = f.analysis.unitsSource === 'note' ? ', from the note' : '';
      let t = `${safeLinePath(f.path)}  (results in ${f.analysis.units}${from})\n\n`;
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

/** The `check` output of a file from its diagnostics (and those ignore comments acknowledged). */
function checkOutput(
  mode: 'check-text' | 'check-json',
  f: CheckedFile,
  analysis: Pick<Analysis, 'diagnostics' | 'suppressed'>,
): FileOutput {
  const counts = diagnosticCounts(analysis.diagnostics);
  if (mode === 'check-text') {
    let t = '';
    for (const d of analysis.diagnostics) t += `${diagnosticLine(f, d)}\n`;
    return { text: t, json: null, counts };
  }
  const json: Record<string, unknown> = {
    path: f.path,
    diagnostics: analysis.diagnostics.map((d) => diagnosticJson(f, d)),
  };
  // Diagnostics acknowledged by ignore comments: reported, not counted.
  if (analysis.suppressed)
    json.suppressed = analysis.suppressed.map((d) => ({
      ...diagnosticJson(f, d),
      justification: d.justification,
      ignoreLine: f.lines.lineCol(d.suppressedBy.start).line,
    }));
  return { text: '', json, counts };
}

/**
 * Reads (unless the text is given) and renders one task (its output to `emit` when given, see
 * {@link renderFile}); never throws.
 */
export function runTask(task: Task, mode: Mode, settings: Partial<EvaluateSettings>, emit?: Emit): TaskResult {
  const read =
    task.text !== undefined
      ? { ok: true as const, text: task.text }
      : task.input.abs === null
        ? decodeText(new Uint8Array(), STDIN_PATH)
        : readInput(task.input, task.maxBytes);
  if (!read.ok) return { ok: false, message: read.message };
  try {
    return { ok: true, out: renderFile(mode, task.input.display, read.text, task.settings ?? settings, emit) };
  } catch (err) {
    return {
      ok: false,
      message:
        `'${task.input.display}' could not be checked ` +
        `(${err instanceof Error ? err.message : String(err)}); please report it with the note`,
    };
  }
}

/** What a worker thread is started with. */
interface WorkerJob {
  dewmarkWorker: true;
  mode: Mode;
  settings: Partial<EvaluateSettings>;
}

/** The argument a worker thread is started with (after the bundle's path in its `process.argv`). */
const WORKER_ARGUMENT = '--dewmark-worker-thread';

/** A batch of tasks sent to a worker (its results come back with the same `start`). */
interface Batch {
  start: number;
  tasks: Task[];
}

/**
 * In a worker thread started by {@link runTasks}: does the batches it is sent and posts their
 * results. Returns true when it was one.
 */
export function workerMain(): boolean {
  // Only a thread started with the worker's argument may be one: the main thread of a usual run
  // loads no worker module to find out.
  if (process.argv[2] !== WORKER_ARGUMENT) return false;
  const { isMainThread, parentPort, workerData } = workerThreads();
  if (isMainThread || !parentPort) return false;
  const job = workerData as WorkerJob | undefined;
  if (job?.dewmarkWorker !== true) return false;
  const port = parentPort;
  port.on('message', (batch: Batch | null) => {
    if (batch === null) {
      port.close();
      return;
    }
    port.postMessage({ start: batch.start, results: batch.tasks.map((t) => runTask(t, job.mode, job.settings)) });
  });
  return true;
}

/** Files below which everything runs in the main thread (starting a worker costs more). */
const PARALLEL_FROM = 64;

/** At most this many worker threads (besides the main thread, which works too). */
const MAX_WORKERS = 3;

/**
 * How many worker threads to use for `n` files besides the main thread (0: the main thread
 * alone). A worker costs a start-up and a cold JIT of its own (about half a second of CPU), which
 * pays only when a core is free for it: so one core is left to the main thread, and cores the
 * load average shows busy with other work are not counted (a 2-core machine starts one worker
 * when it is otherwise idle, none when it is busy). `DEWMARK_WORKERS=0` keeps everything in one
 * thread; another whole number sets the count.
 */
export function workerCount(n: number): number {
  const forced = process.env.DEWMARK_WORKERS;
  if (forced === '0' || n < PARALLEL_FROM) return 0;
  // Workers run this same bundle; from TypeScript sources (no bundle) everything stays in one thread.
  if (typeof __filename !== 'string' || !__filename.endsWith('.js')) return 0;
  const byFiles = Math.floor(n / PARALLEL_FROM) - 1;
  if (forced !== undefined && /^[1-9][0-9]?$/.test(forced)) return Math.max(0, Math.min(Number(forced), byFiles + 1));
  let cores = 1;
  let load = 0;
  try {
    cores = os().availableParallelism();
    load = os().loadavg()[0] ?? 0; // 0 where the system has no load average (Windows)
  } catch {
    cores = 1;
  }
  const free = Math.floor(cores - load - 0.5);
  return Math.max(0, Math.min(MAX_WORKERS, cores - 1, free, byFiles));
}

/** Tasks per batch: small enough to share the work out evenly, large enough that messages are few. */
function batchSize(n: number, threads: number): number {
  return Math.max(4, Math.min(32, Math.ceil(n / (threads * 8))));
}

/**
 * Runs the tasks and calls `onResult` for each, in input order. With many files and several
 * cores, worker threads and the main thread take batches of files from one queue as they become
 * free (a worker that is slow to start, or a busy core, simply takes fewer). A worker that fails
 * to start or dies has its batch done in the main thread. When everything runs in the main
 * thread and `emitFor` is given, each task's output goes to `emitFor(task)` in pieces as it is
 * written (before its `onResult`, whose text is then empty).
 */
export async function runTasks(
  tasks: Task[],
  mode: Mode,
  settings: Partial<EvaluateSettings>,
  onResult: (task: Task, r: TaskResult) => void,
  onProgress?: (done: number) => void,
  emitFor?: (task: Task) => Emit,
): Promise<void> {
  const k = workerCount(tasks.length);
  if (k === 0) {
    tasks.forEach((t, i) => {
      onResult(t, runTask(t, mode, settings, emitFor?.(t)));
      if (onProgress && (i % 10 === 9 || i === tasks.length - 1)) onProgress(i + 1);
    });
    return;
  }
  const size = batchSize(tasks.length, k + 1);
  const results: (TaskResult | undefined)[] = new Array<TaskResult | undefined>(tasks.length);
  let next = 0;
  let emitted = 0;
  let done = 0;
  const take = (): Batch | null => {
    if (next >= tasks.length) return null;
    const start = next;
    next = Math.min(tasks.length, next + size);
    return { start, tasks: tasks.slice(start, next) };
  };
  const store = (start: number, rs: TaskResult[]): void => {
    rs.forEach((r, i) => {
      results[start + i] = r;
    });
    done += rs.length;
    onProgress?.(done);
    while (emitted < tasks.length && results[emitted] !== undefined) {
      onResult(tasks[emitted]!, results[emitted]!);
      results[emitted] = undefined;
      emitted++;
    }
  };
  const runHere = (b: Batch): void =>
    store(
      b.start,
      b.tasks.map((t) => runTask(t, mode, settings)),
    );

  const workers = Array.from(
    { length: k },
    () =>
      new Promise<void>((resolve) => {
        const job: WorkerJob = { dewmarkWorker: true, mode, settings };
        // Batches sent and not yet answered: two, so that a worker never waits for the next one.
        const inflight: Batch[] = [];
        let finished = false;
        const w = new (workerThreads().Worker)(__filename, { workerData: job, argv: [WORKER_ARGUMENT] });
        const fill = (): void => {
          while (inflight.length < 2) {
            const b = take();
            if (!b) break;
            inflight.push(b);
            w.postMessage(b);
          }
          if (inflight.length === 0 && !finished) {
            finished = true;
            w.postMessage(null);
            resolve();
          }
        };
        w.on('message', (m: { start: number; results: TaskResult[] }) => {
          const i = inflight.findIndex((b) => b.start === m.start);
          if (i >= 0) inflight.splice(i, 1);
          store(m.start, m.results);
          fill();
        });
        const fail = (): void => {
          // A worker that fails to start or dies: its batches are done here, and it takes no more.
          if (finished) return;
          finished = true;
          for (const b of inflight.splice(0)) runHere(b);
          resolve();
        };
        w.once('error', fail);
        w.once('exit', fail);
        w.once('online', fill);
      }),
  );
  // The main thread takes batches too, yielding between them so that workers' results and
  // requests for more are handled promptly.
  for (let b = take(); b; b = take()) {
    runHere(b);
    await new Promise<void>((r) => setImmediate(r));
  }
  await Promise.all(workers);
}

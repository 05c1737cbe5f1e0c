/**
 * The `dewmark` command line: `check` and `eval`. Exit codes: 0 no errors, 1 some error in the
 * notes (or more warnings than --max-warnings), 2 usage or I/O problems.
 */
import { Command, CommanderError, Option } from 'commander';
import {
  BINARY_SNIFF,
  DEFAULT_MAX_NOTE_BYTES,
  DEFAULT_MAX_NOTE_MB,
  STDIN_PATH,
  collectInputs,
  decodeText,
  explainEmpty,
} from '@dewmark/files';
import { pieceText, summaryLine, type Counts, type TakePiece } from './output';
import { runTasks, type Emit, type FileOutput, type Mode, type Task } from './work';
import { UsageError, maxNoteBytes, toSettings, type RawEvalOptions } from './settings';
import { registerChart } from './commands/chart';
import { registerReport } from './commands/report';
import { registerFix } from './commands/fix';
import { selectWithProjects } from './project';
import { registerDiff } from './commands/diff';
import type { DiagnosticJson } from './output';
import { githubAnnotations } from './formats/github';
import { sarifLog } from './formats/sarif';
import { safeText } from './sanitize';
import { writeWaiting } from './stdoutBytes';

declare const __DEWMARK_VERSION__: string | undefined;

/** The version printed by `--version` (set by the build; `0.0.0-dev` when run from source). */
export const VERSION: string = typeof __DEWMARK_VERSION__ === 'string' ? __DEWMARK_VERSION__ : '0.0.0-dev';

/** Where the command line reads and writes (a real process, or a test). */
export interface CliIO {
  cwd: string;
  out: (text: string) => void;
  /**
   * Writes bytes out, after what `out` wrote, and says whether it keeps them (see
   * {@link TakePiece}); without it, bytes go to `out` as their UTF-8 text.
   */
  outBytes?: TakePiece;
  err: (text: string) => void;
  /** Standard input as bytes (read only when `-` is given), at most `maxBytes` + 1 of them. */
  stdin: (maxBytes?: number) => Promise<Uint8Array>;
  /** Whether stderr is a terminal (progress is shown only then). */
  stderrIsTTY: boolean;
}

/** Files checked before a progress line appears on a terminal. */
const PROGRESS_FROM = 20;

interface CommonOptions extends RawEvalOptions {
  format?: string;
  maxWarnings?: string;
  gitignore?: boolean;
  exclude?: string[];
}

/** Per-file totals kept while files stream through (analyses are not kept, to spare memory). */
interface Totals {
  files: number;
  counts: Counts;
  ioProblems: number;
}

/**
 * Finds, reads and analyses the inputs, handing each file's rendered output to `onFile` in input
 * order. Analyses are not kept (holding 1000 at once makes the garbage collector the slowest part
 * of a run); many files are spread over worker threads. I/O problems are printed and counted.
 */
async function analyse(
  paths: string[],
  opts: CommonOptions,
  io: CliIO,
  mode: Mode,
  onFile: (out: FileOutput) => void,
  emitFor?: (task: Task) => Emit,
): Promise<Totals> {
  const settings = toSettings(opts);
  const maxBytes = maxNoteBytes(opts);
  const { inputs, problems, empty } = collectInputs(paths, {
    cwd: io.cwd,
    gitignore: opts.gitignore !== false,
    exclude: opts.exclude ?? [],
  });
  const totals: Totals = { files: 0, counts: { errors: 0, warnings: 0, infos: 0 }, ioProblems: 0 };
  for (const p of problems) {
    io.err(`dewmark: ${safeText(p.message)}\n`);
    totals.ioProblems++;
  }
  const project = selectWithProjects(inputs, io.cwd, settings);
  for (const p of project.problems) {
    io.err(`dewmark: ${safeText(p)}\n`);
    totals.ioProblems++;
  }
  const tasks: Task[] = [];
  for (const { input, settings: own } of project.tasks) {
    if (input.abs !== null) {
      tasks.push({ input, maxBytes, settings: own });
      continue;
    }
    const read = decodeText(await io.stdin(maxBytes), STDIN_PATH, maxBytes);
    if (read.ok) tasks.push({ input, text: read.text, settings: own });
    else {
      io.err(`dewmark: ${safeText(read.message)}\n`);
      totals.ioProblems++;
    }
  }
  const progress = tasks.length >= PROGRESS_FROM && io.stderrIsTTY;
  await runTasks(
    tasks,
    mode,
    settings,
    (_task, r) => {
      if (!r.ok) {
        if (progress) io.err('\r\x1b[K');
        io.err(`dewmark: ${safeText(r.message)}\n`);
        totals.ioProblems++;
        return;
      }
      totals.files++;
      totals.counts.errors += r.out.counts.errors;
      totals.counts.warnings += r.out.counts.warnings;
      totals.counts.infos += r.out.counts.infos;
      onFile(r.out);
    },
    progress ? (done) => io.err(`\rdewmark: checking ${done}/${tasks.length} files…`) : undefined,
    emitFor,
  );
  if (progress) io.err('\r\x1b[K');
  if (inputs.length > 0 && project.tasks.length === 0 && problems.length === 0) {
    const first = project.firstLeftOut;
    io.err(
      inputs.length === 1 && first
        ? `dewmark: '${safeText(first.display)}' is left out by ${safeText(first.file)}: ${safeText(first.why)}\n`
        : `dewmark: all ${inputs.length} Markdown file(s) found are ` +
            `left out by the include/exclude patterns of dewmark.json\n`,
    );
    totals.ioProblems++;
  }
  if (inputs.length === 0 && problems.length === 0) {
    const why = explainEmpty(empty).map(safeText);
    const where = paths.length > 0 ? paths.map((p) => `'${safeText(p)}'`).join(', ') : 'the current folder';
    io.err(
      `dewmark: no Markdown files (.md, .markdown) found in ${where}${why.length > 0 ? `; ${why.join('; ')}` : ''}\n`,
    );
    totals.ioProblems++;
  }
  return totals;
}

function maxWarningsOf(opts: CommonOptions): number | null {
  if (opts.maxWarnings === undefined) return null;
  const n = Number(opts.maxWarnings);
  if (!Number.isInteger(n) || n < 0)
    throw new UsageError(`--max-warnings must be a whole number of 0 or more, not '${opts.maxWarnings}'`);
  return n;
}

function exitCodeFor(t: Totals, maxWarnings: number | null): number {
  if (t.ioProblems > 0) return 2;
  if (t.counts.errors > 0) return 1;
  if (maxWarnings !== null && t.counts.warnings > maxWarnings) return 1;
  return 0;
}

/** Collects output and writes it in large pieces (a write per line is slow on a pipe). */
class OutBuffer {
  /** Characters of a piece large enough to be written on its own. */
  private static readonly LARGE = 1 << 14;
  private parts: string[] = [];
  private size = 0;
  /**
   * Set once a piece went out as bytes (the eval JSON, see `outBytes`): the text around the
   * pieces then goes the same way, so the output stream is never made when nothing else needs it
   * (see `processIO`).
   */
  private viaBytes = false;
  constructor(private readonly io: CliIO) {}
  push(text: string): void {
    if (text.length >= OutBuffer.LARGE) {
      // A large piece (of the eval JSON) goes out as it is, after what came before it: no copy.
      this.flush();
      this.write(text);
      return;
    }
    this.parts.push(text);
    this.size += text.length;
    if (this.size >= 1 << 16) this.flush();
  }
  /** Writes bytes (a piece of the eval JSON) after what came before: whether they are kept (see {@link TakePiece}). */
  pushBytes(bytes: Uint8Array): boolean {
    if (!this.io.outBytes) {
      this.flush();
      this.io.out(pieceText(bytes));
      return false;
    }
    this.viaBytes = true;
    this.flush();
    return this.io.outBytes(bytes) === true;
  }
  flush(): void {
    if (this.parts.length === 0) return;
    const text = this.parts.join('');
    this.parts = [];
    this.size = 0;
    this.write(text);
  }
  private write(text: string): void {
    // (A new buffer of the text's own: whether `outBytes` keeps it does not matter.)
    if (this.viaBytes && this.io.outBytes) this.io.outBytes(Buffer.from(text, 'utf8'));
    else this.io.out(text);
  }
}

/** Output formats of `check`. */
const CHECK_FORMATS = ['text', 'json', 'github', 'sarif'] as const;

async function runCheck(paths: string[], opts: CommonOptions, io: CliIO): Promise<number> {
  const format = opts.format ?? 'text';
  if (!(CHECK_FORMATS as readonly string[]).includes(format))
    throw new UsageError(`--format must be ${CHECK_FORMATS.join(', ')} for check, not '${safeText(format)}'`);
  const maxWarnings = maxWarningsOf(opts);
  const out = new OutBuffer(io);
  const jsonFiles: unknown[] = [];
  const t = await analyse(paths, opts, io, format === 'text' ? 'check-text' : 'check-json', (f) => {
    if (format === 'json' || format === 'sarif') jsonFiles.push(f.json);
    else if (format === 'github') {
      const j = f.json as { path: string; diagnostics: DiagnosticJson[] };
      out.push(githubAnnotations(j.path, j.diagnostics));
    } else if (f.text) out.push(f.text);
  });
  const c = t.counts;
  if (format === 'json') {
    const suppressed = jsonFiles.reduce<number>(
      (n, f) => n + ((f as { suppressed?: unknown[] }).suppressed?.length ?? 0),
      0,
    );
    const doc = {
      files: jsonFiles,
      summary: {
        files: t.files,
        errors: c.errors,
        warnings: c.warnings,
        infos: c.infos,
        suppressed,
        unreadable: t.ioProblems,
      },
    };
    out.push(`${JSON.stringify(doc, null, 2)}\n`);
  } else if (format === 'sarif') {
    const log = sarifLog(jsonFiles as { path: string; diagnostics: DiagnosticJson[] }[], VERSION, io.cwd);
    out.push(`${JSON.stringify(log, null, 2)}\n`);
  } else {
    out.push(`${summaryLine(t.files, c, t.ioProblems)}\n`);
    if (maxWarnings !== null && c.warnings > maxWarnings)
      out.push(`too many warnings: ${c.warnings} (at most ${maxWarnings} allowed by --max-warnings)\n`);
  }
  out.flush();
  return exitCodeFor(t, maxWarnings);
}

async function runEvalCommand(paths: string[], opts: CommonOptions, io: CliIO): Promise<number> {
  const format = opts.format ?? 'table';
  if (format !== 'table' && format !== 'json')
    throw new UsageError(`--format must be table or json for eval, not '${format}'`);
  const out = new OutBuffer(io);
  if (format === 'table') {
    const t = await analyse(paths, opts, io, 'eval-table', (f) => out.push(f.text));
    out.push(`${summaryLine(t.files, t.counts, t.ioProblems)}\n`);
    out.flush();
    return exitCodeFor(t, null);
  }
  // The JSON document is written as it is made, file after file (each file's object as it
  // comes, or in pieces as the file is written): the same text as
  // JSON.stringify({ files }, null, 2), without holding the whole document.
  let files = 0;
  const nextFile = (): void => out.push(files++ === 0 ? '{\n  "files": [\n    ' : ',\n    ');
  const t = await analyse(
    paths,
    opts,
    io,
    'eval-json',
    (f) => {
      if (f.text === '') return; // written in pieces already
      nextFile();
      out.push(f.text);
    },
    () => {
      let started = false;
      return (piece) => {
        if (!started) nextFile();
        started = true;
        return out.pushBytes(piece);
      };
    },
  );
  out.push(files === 0 ? '{\n  "files": []\n}\n' : '\n  ]\n}\n');
  out.flush();
  return exitCodeFor(t, null);
}

function addCommon(cmd: Command): Command {
  return cmd
    .addOption(new Option('--units <system>', 'unit system for results when a note has no units: line (SI or IP)'))
    .addOption(
      new Option(
        '--pressure <value>',
        "default barometric pressure with its unit, e.g. 84.5kPa (a note's site: line wins)",
      ).conflicts('elevation'),
    )
    .addOption(
      new Option('--elevation <value>', 'default site elevation with its unit, e.g. 1600m (standard atmosphere)'),
    )
    .option('--no-claims', 'do not compare written claims with computed values')
    .addOption(
      new Option(
        '--max-note-size <MB>',
        `the most one note may be, in MB (default ${DEFAULT_MAX_NOTE_MB}); a larger file is not read (exit 2)`,
      ),
    )
    .option('--no-gitignore', 'also read files that .gitignore or .git/info/exclude leave out of folders and globs')
    .addOption(
      new Option(
        '--exclude <pattern>',
        'leave files and folders matching this glob out of folders ' +
          'and globs (repeatable; a bare name matches at any depth)',
      ).argParser((value: string, previous: string[] | undefined) => [...(previous ?? []), value]),
    );
}

/**
 * Where commander writes. Its error messages quote the arguments given, so they are made safe:
 * an argument holding a newline or an escape sequence cannot start a line of its own.
 */
function outputOf(io: CliIO) {
  return {
    writeOut: (s: string) => io.out(s),
    writeErr: (s: string) => io.err(s),
    // Commander's own second line is a "(Did you mean …?)"; any other line break came from an argument.
    outputError: (s: string, write: (s: string) => void) =>
      write(
        `${s
          .replace(/\n+$/, '')
          .split(/\n(?=\(Did you mean )/)
          .map(safeText)
          .join('\n')}\n`,
      ),
  };
}

/** Builds the command tree; `onResult` receives each command's exit code. */
function program(io: CliIO, onResult: (code: number) => void): Command {
  const prog = new Command('dewmark')
    .description('Checks and evaluates moist-air states written in Markdown calculation notes.')
    .version(VERSION, '-V, --version', 'print the version')
    .helpOption('-h, --help', 'show help')
    .showHelpAfterError('(run dewmark --help for the commands and options)')
    .showSuggestionAfterError(true)
    .exitOverride()
    .configureOutput(outputOf(io));

  addCommon(
    prog
      .command('check')
      .description('check notes and print each problem as path:line:col: severity[code]: message')
      .argument(
        '[paths...]',
        'Markdown files, folders (recursive) or glob patterns; - for standard input (default: the current folder)',
      )
      .option(
        '--format <format>',
        'text, json, github (workflow annotations) or sarif (SARIF 2.1.0 for code scanning)',
        'text',
      )
      .option('--max-warnings <n>', 'exit 1 when there are more warnings than this')
      .addHelpText(
        'after',
        `
Exit codes:
  0  no errors (and no more warnings than --max-warnings)
  1  some note has an error, or more warnings than --max-warnings
  2  a usage problem, or a file that cannot be read (missing, binary, not UTF-8)

Examples:
  dewmark check                               every .md/.markdown below the current folder
  dewmark check docs/calcs --max-warnings 0   fail on stale claims too
  dewmark check "notes/**/*.md" README.md     globs and files
  dewmark check --format github docs/calcs    annotations in a GitHub Actions job
  dewmark check --format sarif . > dewmark.sarif
  cat note.md | dewmark check -               standard input

A diagnostic is acknowledged in the note with an air comment on its line:
  state RA: db=24C rh=50% w=11.0g/kg   # dewmark-ignore claim-mismatch -- measured
Stale claims and results tables are rewritten by: dewmark fix --write`,
      ),
  ).action(async (paths: string[], opts: CommonOptions) => onResult(await runCheck(paths, opts, io)));

  addCommon(
    prog
      .command('eval')
      .description('print the evaluated states, mixes and processes of notes')
      .argument(
        '[paths...]',
        'Markdown files, folders (recursive) or glob patterns; - for standard input (default: the current folder)',
      )
      .option('--format <format>', 'table or json', 'table')
      .addHelpText(
        'after',
        `
Exit codes:
  0  no errors
  1  some note has an error (its states are shown as far as they can be computed)
  2  a usage problem, or a file that cannot be read

Examples:
  dewmark eval notes/ahu-1.md                 tables in the note's unit system
  dewmark eval --units IP notes/              IP for notes without a units: line
  dewmark eval --elevation 1600m notes/       default site for notes without a site: line
  dewmark eval --format json notes/ahu-1.md   SI figures with stable field names, for tools`,
      ),
  ).action(async (paths: string[], opts: CommonOptions) => onResult(await runEvalCommand(paths, opts, io)));

  registerReport(prog, io, onResult, addCommon, VERSION);
  registerChart(prog, io, onResult, addCommon);
  registerFix(prog, io, onResult, addCommon);
  registerDiff(prog, io, onResult, addCommon);
  for (const c of prog.commands)
    c.exitOverride()
      .configureOutput(outputOf(io))
      .showHelpAfterError(`(run dewmark ${c.name()} --help for its options)`)
      .showSuggestionAfterError(true);
  return prog;
}

/** Runs the command line with `argv` (without `node` and the script) and returns the exit code. */
export async function run(argv: string[], io: CliIO): Promise<number> {
  let code: number | null = null;
  const prog = program(io, (c) => {
    code = c;
  });
  if (argv.length === 0) {
    io.out(prog.helpInformation());
    return 2;
  }
  try {
    await prog.parseAsync(argv, { from: 'user' });
  } catch (err) {
    if (err instanceof CommanderError) {
      if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help')
        return 0;
      return 2; // commander has printed the message
    }
    if (err instanceof UsageError) {
      io.err(`dewmark: ${safeText(err.message)}\n`);
      return 2;
    }
    io.err(`dewmark: unexpected failure: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    return 2;
  }
  return code ?? 0;
}

/**
 * `process.stdout` or `process.stderr`, with a closed pipe (`dewmark check | head`) ending the
 * output quietly. Node makes each stream at its first read, loading its stream modules (a few
 * milliseconds of every start); `eval --format json` writes its bytes to the descriptor itself
 * and a clean run writes nothing to stderr, so a stream is first read only to write to it.
 */
function quietOnClose(stream: NodeJS.WriteStream): NodeJS.WriteStream {
  stream.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw err;
  });
  return stream;
}

/**
 * Whether text for standard output goes to the descriptor as bytes, as the eval JSON does (see
 * `outBytes`), so that the output stream is not made for it (see `quietOnClose`). Not on
 * Windows, where a console shows text written through the stream only (the stream converts it
 * for the console).
 */
const TEXT_TO_DESCRIPTOR = process.platform !== 'win32';

/** The process's own I/O. */
export function processIO(): CliIO {
  let stdinBytes: Promise<Uint8Array> | null = null;
  let stdoutStream: NodeJS.WriteStream | null = null;
  let stderrStream: NodeJS.WriteStream | null = null;
  const stdout = (): NodeJS.WriteStream => (stdoutStream ??= quietOnClose(process.stdout));
  const stderr = (): NodeJS.WriteStream => (stderrStream ??= quietOnClose(process.stderr));
  // Bytes go to the descriptor as the system takes them, the reader setting the pace
  // (./stdoutBytes), unless text is still queued in the stream (they must come after it) or the
  // descriptor fails (a closed pipe): then to the stream, which queues what it cannot write at
  // once, holding on to it — the writer is told so and takes new memory. (A stream not made yet
  // holds nothing.)
  const outBytes = (bytes: Uint8Array): boolean => {
    const written = stdoutStream === null || stdoutStream.writableLength === 0 ? writeWaiting(1, bytes) : 0;
    if (written === bytes.length) return false;
    stdout().write(bytes.subarray(written));
    return stdout().writableLength > 0;
  };
  return {
    cwd: process.cwd(),
    out: (t) => {
      // (A new buffer of the text's own: whether the stream keeps it does not matter.)
      if (TEXT_TO_DESCRIPTOR) outBytes(Buffer.from(t, 'utf8'));
      else stdout().write(t);
    },
    outBytes,
    err: (t) => stderr().write(t),
    stdin: (maxBytes) => (stdinBytes ??= readStdin(maxBytes)),
    // Read only when a progress line could be shown (many files): see `quietOnClose`.
    get stderrIsTTY() {
      return stderr().isTTY === true;
    },
  };
}

/**
 * Reads standard input as bytes, stopping early: after the first bytes when they hold a NUL
 * (binary: no need to read on), and past `maxBytes` (the caller's `decodeText` then says it is
 * too large). So `dewmark check - < /dev/zero` ends at once.
 */
export async function readStdin(maxBytes: number = DEFAULT_MAX_NOTE_BYTES): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of process.stdin) {
    const b = typeof chunk === 'string' ? Buffer.from(chunk) : (chunk as Buffer);
    chunks.push(b);
    const sniffed = total < BINARY_SNIFF && b.subarray(0, BINARY_SNIFF - total).includes(0);
    total += b.length;
    if (sniffed || total > maxBytes) break;
  }
  return Buffer.concat(chunks, total);
}

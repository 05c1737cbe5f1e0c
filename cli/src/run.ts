/**
 * The `dewmark` command line: `check` and `eval`. Exit codes: 0 no errors, 1 some error in the
 * notes (or more warnings than --max-warnings), 2 usage or I/O problems.
 */
import { Command, CommanderError, Option } from 'commander';
import { analyzeNote } from './core';
import { STDIN_PATH, collectInputs, decodeText, readInput, readStdin } from './files';
import type { FileResult } from './output';
import { countDiagnostics, diagnosticJson, diagnosticLine, evalFileJson, fileResult, processesTable, statesTable, summaryLine } from './output';
import { UsageError, toSettings, type RawEvalOptions } from './settings';
import { registerChart } from './commands/chart';
import { registerReport } from './commands/report';

declare const __DEWMARK_VERSION__: string | undefined;

/** The version printed by `--version` (set by the build; `0.0.0-dev` when run from source). */
export const VERSION: string = typeof __DEWMARK_VERSION__ === 'string' ? __DEWMARK_VERSION__ : '0.0.0-dev';

/** Where the command line reads and writes (a real process, or a test). */
export interface CliIO {
  cwd: string;
  out: (text: string) => void;
  err: (text: string) => void;
  /** Standard input as bytes (read only when `-` is given). */
  stdin: () => Promise<Uint8Array>;
  /** Whether stderr is a terminal (progress is shown only then). */
  stderrIsTTY: boolean;
}

/** Files checked before a progress line appears on a terminal. */
const PROGRESS_FROM = 20;

interface CommonOptions extends RawEvalOptions {
  format?: string;
  maxWarnings?: string;
  gitignore?: boolean;
}

/** Reads and analyses the inputs; I/O problems are printed and counted. */
async function analyse(paths: string[], opts: CommonOptions, io: CliIO): Promise<{ files: FileResult[]; ioProblems: number }> {
  const settings = toSettings(opts);
  const { inputs, problems } = collectInputs(paths, { cwd: io.cwd, gitignore: opts.gitignore !== false });
  let ioProblems = 0;
  for (const p of problems) {
    io.err(`dewmark: ${p.message}\n`);
    ioProblems++;
  }
  const files: FileResult[] = [];
  const progress = io.stderrIsTTY && inputs.length >= PROGRESS_FROM;
  let i = 0;
  for (const input of inputs) {
    i++;
    if (progress && (i % 10 === 0 || i === inputs.length)) io.err(`\rdewmark: checking ${i}/${inputs.length} files…`);
    const read = input.abs === null ? decodeText(await io.stdin(), STDIN_PATH) : readInput(input);
    if (!read.ok) {
      if (progress) io.err('\r\x1b[K');
      io.err(`dewmark: ${read.message}\n`);
      ioProblems++;
      continue;
    }
    files.push(fileResult(input.display, read.text, analyzeNote(read.text, settings)));
  }
  if (progress) io.err('\r\x1b[K');
  if (inputs.length === 0 && problems.length === 0) {
    io.err(`dewmark: no Markdown files (.md, .markdown) found in ${paths.length > 0 ? paths.map((p) => `'${p}'`).join(', ') : 'the current folder'}\n`);
    ioProblems++;
  }
  return { files, ioProblems };
}

function maxWarningsOf(opts: CommonOptions): number | null {
  if (opts.maxWarnings === undefined) return null;
  const n = Number(opts.maxWarnings);
  if (!Number.isInteger(n) || n < 0) throw new UsageError(`--max-warnings must be a whole number of 0 or more, not '${opts.maxWarnings}'`);
  return n;
}

function exitCodeFor(files: FileResult[], ioProblems: number, maxWarnings: number | null): number {
  if (ioProblems > 0) return 2;
  const c = countDiagnostics(files);
  if (c.errors > 0) return 1;
  if (maxWarnings !== null && c.warnings > maxWarnings) return 1;
  return 0;
}

async function runCheck(paths: string[], opts: CommonOptions, io: CliIO): Promise<number> {
  const format = opts.format ?? 'text';
  if (format !== 'text' && format !== 'json') throw new UsageError(`--format must be text or json for check, not '${format}'`);
  const maxWarnings = maxWarningsOf(opts);
  const { files, ioProblems } = await analyse(paths, opts, io);
  const c = countDiagnostics(files);
  if (format === 'json') {
    const doc = {
      files: files.map((f) => ({ path: f.path, diagnostics: f.analysis.diagnostics.map((d) => diagnosticJson(f, d)) })),
      summary: { files: files.length, errors: c.errors, warnings: c.warnings, infos: c.infos, unreadable: ioProblems },
    };
    io.out(`${JSON.stringify(doc, null, 2)}\n`);
  } else {
    // One write per batch of lines: a write per diagnostic is slow on a pipe.
    let chunk: string[] = [];
    for (const f of files) {
      for (const d of f.analysis.diagnostics) chunk.push(diagnosticLine(f, d));
      if (chunk.length >= 2000) {
        io.out(`${chunk.join('\n')}\n`);
        chunk = [];
      }
    }
    if (chunk.length > 0) io.out(`${chunk.join('\n')}\n`);
    io.out(`${summaryLine(files.length, c, ioProblems)}\n`);
    if (maxWarnings !== null && c.warnings > maxWarnings) io.out(`too many warnings: ${c.warnings} (at most ${maxWarnings} allowed by --max-warnings)\n`);
  }
  return exitCodeFor(files, ioProblems, maxWarnings);
}

async function runEvalCommand(paths: string[], opts: CommonOptions, io: CliIO): Promise<number> {
  const format = opts.format ?? 'table';
  if (format !== 'table' && format !== 'json') throw new UsageError(`--format must be table or json for eval, not '${format}'`);
  const { files, ioProblems } = await analyse(paths, opts, io);
  if (format === 'json') {
    io.out(`${JSON.stringify({ files: files.map(evalFileJson) }, null, 2)}\n`);
  } else {
    for (const f of files) {
      io.out(`${f.path}  (results in ${f.analysis.units}${f.analysis.unitsSource === 'note' ? ', from the note' : ''})\n\n`);
      const st = statesTable(f);
      const pr = processesTable(f);
      if (st) io.out(`States\n${st}\n\n`);
      if (pr) io.out(`Processes (positive = heat or water added to the air)\n${pr}\n\n`);
      if (!st && !pr) io.out('no states or processes\n\n');
      if (f.analysis.diagnostics.length > 0) {
        io.out('Diagnostics\n');
        for (const d of f.analysis.diagnostics) io.out(`${diagnosticLine(f, d)}\n`);
        io.out('\n');
      }
    }
    io.out(`${summaryLine(files.length, countDiagnostics(files), ioProblems)}\n`);
  }
  return exitCodeFor(files, ioProblems, null);
}

function addCommon(cmd: Command): Command {
  return cmd
    .addOption(new Option('--units <system>', 'unit system for results when a note has no units: line (SI or IP)'))
    .addOption(new Option('--pressure <value>', 'default barometric pressure with its unit, e.g. 84.5kPa (a note\'s site: line wins)').conflicts('elevation'))
    .addOption(new Option('--elevation <value>', 'default site elevation with its unit, e.g. 1600m (standard atmosphere)'))
    .option('--no-claims', 'do not compare written claims with computed values')
    .option('--no-gitignore', 'also read files that .gitignore excludes when walking folders');
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
    .configureOutput({ writeOut: (s) => io.out(s), writeErr: (s) => io.err(s) });

  addCommon(
    prog
      .command('check')
      .description('check notes and print each problem as path:line:col: severity[code]: message')
      .argument('[paths...]', 'Markdown files, folders (recursive) or glob patterns; - for standard input (default: the current folder)')
      .option('--format <format>', 'text or json', 'text')
      .option('--max-warnings <n>', 'exit 1 when there are more warnings than this'),
  ).action(async (paths: string[], opts: CommonOptions) => onResult(await runCheck(paths, opts, io)));

  addCommon(
    prog
      .command('eval')
      .description('print the evaluated states, mixes and processes of notes')
      .argument('[paths...]', 'Markdown files, folders (recursive) or glob patterns; - for standard input (default: the current folder)')
      .option('--format <format>', 'table or json', 'table'),
  ).action(async (paths: string[], opts: CommonOptions) => onResult(await runEvalCommand(paths, opts, io)));

  registerReport(prog, io, onResult, addCommon, VERSION);
  registerChart(prog, io, onResult, addCommon);
  for (const c of prog.commands) c.exitOverride().configureOutput({ writeOut: (s) => io.out(s), writeErr: (s) => io.err(s) }).showHelpAfterError(`(run dewmark ${c.name()} --help for its options)`).showSuggestionAfterError(true);
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
      if (err.code === 'commander.helpDisplayed' || err.code === 'commander.version' || err.code === 'commander.help') return 0;
      return 2; // commander has printed the message
    }
    if (err instanceof UsageError) {
      io.err(`dewmark: ${err.message}\n`);
      return 2;
    }
    io.err(`dewmark: unexpected failure: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
    return 2;
  }
  return code ?? 0;
}

/** The process's own I/O. */
export function processIO(): CliIO {
  let stdinBytes: Promise<Uint8Array> | null = null;
  return {
    cwd: process.cwd(),
    out: (t) => process.stdout.write(t),
    err: (t) => process.stderr.write(t),
    stdin: () => (stdinBytes ??= readStdin()),
    stderrIsTTY: process.stderr.isTTY === true,
  };
}

/**
 * `dewmark diff [REV] [-- FILES]`: what the computed results of the notes were at a git revision
 * (default HEAD) against what they are in the working tree — each figure whose displayed value
 * changed, with the claims written about it. The old text of a note is read with
 * `git show REV:path` (git started with an argument array, never through a shell); both texts go
 * through the same analysis as `eval`, and figures are compared by statement name as the one
 * figure formatter shows them, so "changed" means "a reader of the results would see a different
 * figure" (a change below the last shown digit is not reported).
 */
import { existsSync, realpathSync } from 'node:fs';
import { isAbsolute, join, relative, sep } from 'node:path';
import type { Command } from 'commander';
import { MARKDOWN, collectInputs, decodeText, explainEmpty, readInput } from '@dewmark/files';
import {
  analyzeNote,
  processRow,
  stateRow,
  type Analysis,
  type EvaluateSettings,
  type ProcessResult,
  type StateResult,
  type UnitSystem,
} from '../core';
import { childProcess } from '../builtins';
import { LineIndex } from '../core';
import type { CliIO } from '../run';
import { UsageError, maxNoteBytes, toSettings, type RawEvalOptions } from '../settings';
import { safeLinePath, safeText } from '../sanitize';

/** Options of `dewmark diff`. */
export interface DiffOptions extends RawEvalOptions {
  format?: string;
  exitCode?: boolean;
  gitignore?: boolean;
  exclude?: string[];
}

/** Output formats of `diff`. */
const DIFF_FORMATS = ['text', 'json'] as const;

// ---------------------------------------------------------------------------------------------
// Figures compared
// ---------------------------------------------------------------------------------------------

/** A figure of one statement as displayed: its key (the notation's key, as claims name it), label and text. */
interface Shown {
  key: string;
  text: string;
}

const NONE = '—';

/**
 * The figures compared for a state, mix or supply, in the order they are listed, by the keys of
 * the notation (the same names a claim uses: `rh=50%` is about `rh`), read from the one results
 * row every table shows (`stateRow`).
 */
const STATE_FIGURES = ['p', 'db', 'wb', 'dp', 'rh', 'w', 'h', 'v'] as const;

/** The figures compared for a process (heat and water: positive = added to the air), from `processRow`. */
const PROCESS_FIGURES = [
  ['m', 'massFlow'],
  ['q_total', 'total'],
  ['q_sensible', 'sensible'],
  ['q_latent', 'latent'],
  ['shr', 'shr'],
  ['water', 'water'],
  ['q_coil', 'coil'],
] as const;

function stateShown(s: StateResult, sys: UnitSystem): Shown[] {
  const row = stateRow(s, sys);
  const out: Shown[] = STATE_FIGURES.map((key) => ({ key, text: row.figures[key].text }));
  if (s.kind !== 'state') out.push({ key: 'm', text: row.massFlow.text });
  return out;
}

function processShown(p: ProcessResult, sys: UnitSystem): Shown[] {
  const row = processRow(p, sys);
  return PROCESS_FIGURES.map(([key, field]) => ({ key, text: row[field].text }));
}

/** What kind of statement an item is. */
type ItemKind = 'state' | 'mix' | 'supply' | 'process';

/** A statement's figures as displayed, with its claims. */
interface ShownItem {
  kind: ItemKind;
  line: number;
  figures: Shown[];
  claims: ShownClaim[];
}

interface ShownClaim {
  key: string;
  /** The claim as written (`rh=50%`). */
  written: string;
  line: number;
  pass: boolean;
  computed: string;
}

/** Every named statement of an analysis with its displayed figures, by name. */
function shownItems(text: string, a: Analysis): Map<string, ShownItem> {
  const lines = new LineIndex(text);
  const out = new Map<string, ShownItem>();
  for (const item of a.items) {
    const span = item.statement.name?.span ?? item.statement.span;
    const line = lines.lineCol(span.start).line;
    const figures: Shown[] = item.kind === 'process' ? processShown(item, a.units) : stateShown(item, a.units);
    const claims = item.claims.map((c) => ({
      key: c.key,
      written: text.slice(c.prop.span.start, c.prop.span.end).replace(/\s+/g, ' '),
      line: lines.lineCol(c.prop.span.start).line,
      pass: c.pass,
      computed: c.computedText,
    }));
    // A name given twice is a diagnostic of its own; the first statement of that name is compared.
    if (!out.has(item.name)) out.set(item.name, { kind: item.kind, line, figures, claims });
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Comparison (the JSON shape is the contract documented in docs/diff.md)
// ---------------------------------------------------------------------------------------------

/** A claim written about a changed figure, or a claim whose computed value or verdict changed. */
export interface ClaimChange {
  key: string;
  written: string;
  line: number;
  old: { computed: string; pass: boolean } | null;
  new: { computed: string; pass: boolean } | null;
}

/** One figure whose displayed value changed. */
export interface FigureChange {
  key: string;
  old: string;
  new: string;
  claims: ClaimChange[];
}

/** A statement with changes: changed figures, or added/removed since the revision. */
export interface ItemChange {
  name: string;
  kind: ItemKind;
  status: 'changed' | 'added' | 'removed';
  /** Line in the working tree (in the revision for a removed statement). */
  line: number;
  figures: FigureChange[];
  /** Claims whose computed value or verdict changed although none of the figures above did. */
  claims: ClaimChange[];
}

/** One note with changes. */
export interface FileChange {
  path: string;
  status: 'changed' | 'added' | 'deleted';
  items: ItemChange[];
}

function claimSide(c: ShownClaim | undefined): { computed: string; pass: boolean } | null {
  return c ? { computed: c.computed, pass: c.pass } : null;
}

/** Claims of one statement, old and new paired by key and order of writing. */
function pairClaims(oldClaims: ShownClaim[], newClaims: ShownClaim[]): ClaimChange[] {
  const used = new Set<ShownClaim>();
  const out: ClaimChange[] = [];
  for (const n of newClaims) {
    const o = oldClaims.find((c) => c.key === n.key && !used.has(c));
    if (o) used.add(o);
    out.push({ key: n.key, written: n.written, line: n.line, old: claimSide(o), new: claimSide(n) });
  }
  for (const o of oldClaims)
    if (!used.has(o)) out.push({ key: o.key, written: o.written, line: o.line, old: claimSide(o), new: null });
  return out;
}

function claimChanged(c: ClaimChange): boolean {
  return c.old === null || c.new === null || c.old.computed !== c.new.computed || c.old.pass !== c.new.pass;
}

/**
 * The statements whose displayed figures or claims differ between two analyses of a note, in the
 * working tree's order (removed statements last). Cost is linear in the statements and figures.
 */
export function compareNotes(oldText: string, oldA: Analysis, newText: string, newA: Analysis): ItemChange[] {
  const before = shownItems(oldText, oldA);
  const after = shownItems(newText, newA);
  const out: ItemChange[] = [];
  for (const [name, n] of after) {
    const o = before.get(name);
    if (!o || o.kind !== n.kind) {
      out.push({ name, kind: n.kind, status: 'added', line: n.line, figures: [], claims: [] });
      continue;
    }
    const claims = pairClaims(o.claims, n.claims);
    const oldFig = new Map(o.figures.map((f) => [f.key, f.text]));
    const figures: FigureChange[] = [];
    const onFigure = new Set<string>();
    for (const f of n.figures) {
      const was = oldFig.get(f.key) ?? NONE;
      if (was === f.text) continue;
      onFigure.add(f.key);
      figures.push({ key: f.key, old: was, new: f.text, claims: claims.filter((c) => c.key === f.key) });
    }
    const other = claims.filter((c) => !onFigure.has(c.key) && claimChanged(c));
    if (figures.length > 0 || other.length > 0)
      out.push({ name, kind: n.kind, status: 'changed', line: n.line, figures, claims: other });
  }
  for (const [name, o] of before) {
    const n = after.get(name);
    if (!n || n.kind !== o.kind)
      out.push({ name, kind: o.kind, status: 'removed', line: o.line, figures: [], claims: [] });
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Git
// ---------------------------------------------------------------------------------------------

/** A git command that failed: the message says what and how to fix it. */
export class GitProblem extends Error {}

/** Runs git with an argument array (no shell) in `cwd`; resolves to stdout as bytes. */
function git(args: string[], cwd: string, maxBuffer = 64 * 1024 * 1024): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    childProcess().execFile(
      'git',
      args,
      {
        cwd,
        encoding: 'buffer',
        maxBuffer,
        windowsHide: true,
        env: { ...process.env, GIT_TERMINAL_PROMPT: '0', LC_ALL: 'C' },
      },
      (err, stdout, stderr) => {
        if (!err) return resolve(stdout);
        const e = err as NodeJS.ErrnoException & { code?: unknown };
        if (e.code === 'ENOENT')
          return reject(
            new GitProblem(
              'git was not found on PATH; dewmark diff reads old note text with git (install git, or add it to PATH)',
            ),
          );
        const why = Buffer.isBuffer(stderr) ? stderr.toString('utf8').trim().split('\n')[0] : '';
        reject(Object.assign(new GitProblem(why || e.message), { stderr: why }));
      },
    );
  });
}

/** The repository's top folder (real path); a clear problem outside a repository. */
async function topLevel(cwd: string): Promise<string> {
  try {
    return (await git(['rev-parse', '--show-toplevel'], cwd)).toString('utf8').trim();
  } catch (err) {
    if (err instanceof GitProblem && /git was not found/.test(err.message)) throw err;
    throw new GitProblem(
      `'${cwd}' is not inside a git repository; old versions of notes are read with git, so run ` +
        `dewmark diff (or report --since) in a clone of the notes' repository (git init, or cd into one)`,
    );
  }
}

/** The full commit id of `rev`; a clear problem for an unknown revision. */
async function resolveRevision(rev: string, cwd: string): Promise<string> {
  if (rev.startsWith('-') || rev.length === 0)
    throw new UsageError(
      `'${rev}' is not a revision; give a commit, branch or tag such as HEAD, HEAD~1 or main (files go after --)`,
    );
  try {
    return (await git(['rev-parse', '--verify', '--quiet', `${rev}^{commit}`], cwd)).toString('utf8').trim();
  } catch {
    throw new GitProblem(
      `unknown revision '${rev}': no commit of that name in this repository (try ` +
        `HEAD, HEAD~1, a branch, a tag or a commit id; git log --oneline lists commits)`,
    );
  }
}

/** The notes (.md, .markdown) at `commit` under the given paths (relative to `cwd`), as repository paths. */
async function notesAt(commit: string, paths: string[], cwd: string): Promise<string[]> {
  const specs = paths.length > 0 ? paths : ['.'];
  const out = await git(['ls-tree', '-r', '--full-name', '--name-only', '-z', commit, '--', ...specs], cwd);
  return out
    .toString('utf8')
    .split('\0')
    .filter((p) => p.length > 0 && MARKDOWN.test(p));
}

/** `path` (absolute) as a repository path with forward slashes, or null outside the repository. */
function repoPath(top: string, abs: string): string | null {
  let real = abs;
  try {
    real = realpathSync(abs);
  } catch {
    // A path that no longer exists keeps its name.
  }
  const rel = relative(top, real);
  if (rel === '' || rel.startsWith('..') || isAbsolute(rel)) return null;
  return rel.split(sep).join('/');
}

/** The text of repository path `rp` at `commit`, or why it could not be read (`display`, `rev` name it). */
async function textAt(
  commit: string,
  rp: string,
  top: string,
  display: string,
  rev: string,
  maxBytes: number,
): Promise<{ ok: true; text: string } | { ok: false; message: string }> {
  let bytes: Buffer;
  try {
    bytes = await git(['show', `${commit}:${rp}`], top, maxBytes + 1);
  } catch (err) {
    const tooLarge = err instanceof Error && /maxBuffer/i.test(err.message);
    return {
      ok: false,
      message: tooLarge
        ? `'${display}' at ${rev} is larger than --max-note-size ` +
          `(${(maxBytes / 1048576).toFixed(0)} MB); raise --max-note-size to compare it`
        : `'${display}' could not be read at ${rev}: ${err instanceof Error ? err.message : String(err)}`,
    };
  }
  const old = decodeText(bytes, `${display} at ${rev}`, maxBytes);
  return old.ok ? { ok: true, text: old.text } : { ok: false, message: old.message };
}

/** One note at a revision (`dewmark report --since`): its commit, and its text then (null: not there). */
export interface NoteThen {
  revision: string;
  commit: string;
  text: string | null;
}

/**
 * The note at `abs` as it was at `rev`, read as `dewmark diff` reads it (one home for both): a
 * {@link GitProblem} outside a repository, for an unknown revision, a note outside the repository,
 * or a version that cannot be read.
 */
export async function noteAtRevision(
  rev: string,
  abs: string,
  display: string,
  cwd: string,
  maxBytes: number,
): Promise<NoteThen> {
  const top = realpathSync(await topLevel(cwd));
  const commit = await resolveRevision(rev, cwd);
  const rp = repoPath(top, abs);
  if (rp === null)
    throw new GitProblem(
      `'${display}' is outside the git repository at '${top}'; only files of the repository have an old version`,
    );
  const listed = await git(['ls-tree', '--full-name', '--name-only', '-z', commit, '--', rp], top);
  if (!listed.toString('utf8').split('\0').includes(rp)) return { revision: rev, commit, text: null };
  const old = await textAt(commit, rp, top, display, rev, maxBytes);
  if (!old.ok) throw new GitProblem(old.message);
  return { revision: rev, commit, text: old.text };
}

// ---------------------------------------------------------------------------------------------
// The command
// ---------------------------------------------------------------------------------------------

/** What a run found, for the text and JSON output. */
interface DiffResult {
  revision: string;
  commit: string;
  compared: number;
  files: FileChange[];
}

/** Compares the notes of `paths` (default: the current folder) at `rev` with the working tree. */
async function diffNotes(
  rev: string,
  paths: string[],
  opts: DiffOptions,
  io: CliIO,
): Promise<{ result: DiffResult; problems: string[] }> {
  const settings: Partial<EvaluateSettings> = toSettings(opts);
  const maxBytes = maxNoteBytes(opts);
  const top = realpathSync(await topLevel(io.cwd));
  const commit = await resolveRevision(rev, io.cwd);
  const problems: string[] = [];

  // The working tree: existing paths go through the same selection as check and eval; a path
  // given by name that no longer exists may be a deleted note (looked up at the revision).
  const existing = paths.filter((p) => existsSync(join(io.cwd, p)) || /[*?[{]/.test(p));
  const {
    inputs,
    problems: inputProblems,
    empty,
  } = existing.length > 0 || paths.length === 0
    ? collectInputs(existing, { cwd: io.cwd, gitignore: opts.gitignore !== false, exclude: opts.exclude ?? [] })
    : { inputs: [], problems: [], empty: [] };
  for (const p of inputProblems) problems.push(p.message);
  const now = new Map<string, { display: string; abs: string }>();
  for (const input of inputs) {
    if (input.abs === null) {
      problems.push('dewmark diff compares files in the repository; standard input (-) has no old version');
      continue;
    }
    const rp = repoPath(top, input.abs);
    if (rp === null)
      problems.push(
        `'${input.display}' is outside the git repository at ` +
          `'${top}'; only files of the repository have an old version`,
      );
    else now.set(rp, { display: input.display, abs: input.abs });
  }
  const then = await notesAt(commit, paths, io.cwd);
  if (now.size === 0 && then.length === 0 && problems.length === 0) {
    const why = explainEmpty(empty);
    problems.push(
      `no Markdown files (.md, .markdown) found ` +
        `in ${paths.length > 0 ? paths.map((p) => `'${p}'`).join(', ') : 'the current folder'} ` +
        `at ${rev} or in the working tree${why.length > 0 ? `; ${why.join('; ')}` : ''}`,
    );
  }

  const files: FileChange[] = [];
  const thenSet = new Set(then);
  let compared = 0;
  const displayOf = (rp: string) => relative(io.cwd, join(top, rp)).split(sep).join('/') || rp;
  // In the working tree's order, then deleted notes in the revision's order.
  for (const [rp, f] of now) {
    if (!thenSet.has(rp)) {
      files.push({ path: f.display, status: 'added', items: [] });
      continue;
    }
    const read = readInput({ display: f.display, abs: f.abs }, maxBytes);
    if (!read.ok) {
      problems.push(read.message);
      continue;
    }
    const old = await textAt(commit, rp, top, f.display, rev, maxBytes);
    if (!old.ok) {
      problems.push(old.message);
      continue;
    }
    compared++;
    if (old.text === read.text) continue; // same text, same settings: same figures
    const items = compareNotes(old.text, analyzeNote(old.text, settings), read.text, analyzeNote(read.text, settings));
    if (items.length > 0) files.push({ path: f.display, status: 'changed', items });
  }
  for (const rp of then) {
    if (now.has(rp)) continue;
    // Left out of the working-tree selection (.gitignore, --exclude) but still there: not deleted.
    if (existsSync(join(top, rp))) continue;
    files.push({ path: displayOf(rp), status: 'deleted', items: [] });
  }
  return { result: { revision: rev, commit, compared, files }, problems };
}

const KIND_WORD: Record<ItemKind, string> = { state: 'state', mix: 'mix', supply: 'supply', process: 'process' };

function verdict(side: { computed: string; pass: boolean } | null): string {
  return side === null ? 'absent' : `${side.pass ? 'pass' : 'FAIL'} (computed ${side.computed})`;
}

function claimLine(c: ClaimChange): string {
  const same = c.old !== null && c.new !== null && c.old.pass === c.new.pass && c.old.computed === c.new.computed;
  const what = same ? `still ${verdict(c.new)}` : `${verdict(c.old)} → ${verdict(c.new)}`;
  return `      claim ${safeText(c.written)} (line ${c.line}): ${safeText(what)}\n`;
}

/** The text output: a block per changed note, nothing for unchanged notes, and a summary line. */
export function diffText(r: DiffResult): string {
  let t = '';
  let figures = 0;
  const count = { changed: 0, added: 0, deleted: 0 };
  for (const f of r.files) {
    count[f.status]++;
    if (f.status === 'added') {
      t += `${safeLinePath(f.path)}: added since ${safeText(r.revision)}\n`;
      continue;
    }
    if (f.status === 'deleted') {
      t += `${safeLinePath(f.path)}: deleted since ${safeText(r.revision)}\n`;
      continue;
    }
    t += `${safeLinePath(f.path)}: changed since ${safeText(r.revision)}\n`;
    for (const it of f.items) {
      const head = `  ${KIND_WORD[it.kind]} ${safeText(it.name)} (line ${it.line})`;
      if (it.status !== 'changed') {
        t += `${head}: ${it.status === 'added' ? 'added' : 'removed'}\n`;
        continue;
      }
      t += `${head}\n`;
      for (const fig of it.figures) {
        figures++;
        t += `    ${fig.key}: ${safeText(fig.old)} → ${safeText(fig.new)}\n`;
        for (const c of fig.claims) t += claimLine(c);
      }
      for (const c of it.claims) t += claimLine(c);
    }
    t += '\n';
  }
  const parts = [
    `${count.changed} note${count.changed === 1 ? '' : 's'} changed`,
    `${count.added} added`,
    `${count.deleted} deleted`,
    `${figures} figure${figures === 1 ? '' : 's'} changed`,
  ];
  t += `${parts.join(', ')} (${r.compared} compared with ${safeText(r.revision)} ${r.commit.slice(0, 12)})\n`;
  return t;
}

/** The JSON document (fields documented in docs/diff.md). */
export function diffJson(r: DiffResult, problems: string[]): Record<string, unknown> {
  let figures = 0;
  for (const f of r.files) for (const it of f.items) figures += it.figures.length;
  return {
    revision: r.revision,
    commit: r.commit,
    files: r.files,
    summary: {
      compared: r.compared,
      changed: r.files.filter((f) => f.status === 'changed').length,
      added: r.files.filter((f) => f.status === 'added').length,
      deleted: r.files.filter((f) => f.status === 'deleted').length,
      figures,
      problems: problems.length,
    },
  };
}

/**
 * Splits the operands: at most one revision before `--`, the files after it. Commander drops the
 * `--`, so it is found in the raw arguments (what follows it is files, whatever it looks like).
 */
function splitOperands(operands: string[], raw: readonly string[]): { rev: string; files: string[] } {
  const dash = raw.indexOf('--');
  const nFiles = dash >= 0 ? Math.min(operands.length, raw.length - dash - 1) : 0;
  const before = operands.slice(0, operands.length - nFiles);
  const files = operands.slice(operands.length - nFiles);
  if (before.length > 1) {
    throw new UsageError(
      `dewmark diff takes one revision, then files after --: e.g. ` +
        `dewmark diff ${before[0]} -- ${before.slice(1).join(' ')}`,
    );
  }
  return { rev: before[0] ?? 'HEAD', files };
}

/**
 * Runs `dewmark diff`. Exit codes: 0 compared (1 with --exit-code when a figure changed), 2 usage, git or I/O problems.
 */
export async function runDiff(
  operands: string[],
  raw: readonly string[],
  opts: DiffOptions,
  io: CliIO,
): Promise<number> {
  const format = opts.format ?? 'text';
  if (!(DIFF_FORMATS as readonly string[]).includes(format))
    throw new UsageError(`--format must be ${DIFF_FORMATS.join(' or ')} for diff, not '${format}'`);
  const { rev, files } = splitOperands(operands, raw);
  let found: Awaited<ReturnType<typeof diffNotes>>;
  try {
    found = await diffNotes(rev, files, opts, io);
  } catch (err) {
    if (err instanceof GitProblem) {
      io.err(`dewmark: ${safeText(err.message)}\n`);
      return 2;
    }
    throw err;
  }
  const { result, problems } = found;
  for (const p of problems) io.err(`dewmark: ${safeText(p)}\n`);
  io.out(format === 'json' ? `${JSON.stringify(diffJson(result, problems), null, 2)}\n` : diffText(result));
  if (problems.length > 0) return 2;
  const anyChange = result.files.length > 0;
  return opts.exitCode === true && anyChange ? 1 : 0;
}

const HELP_AFTER = `
The old text of each note is read with git show REV:path; both versions are evaluated as by
dewmark eval, and a figure is listed when it is displayed differently (a change below the last
shown digit is not). Notes added or deleted since REV are listed as such; unchanged notes print
nothing.

Exit codes:
  0  the notes were compared (also when figures changed, unless --exit-code)
  1  with --exit-code: some figure, statement or note changed
  2  usage error, not in a git repository, unknown revision, or a note that could not be read

Examples:
  dewmark diff                          # working tree against HEAD, every note under this folder
  dewmark diff main -- notes/ahu-1.md   # one note against the branch main
  dewmark diff HEAD~3 --format json     # for tools (fields in docs/diff.md)
`;

/** Adds the `diff` command to the program. */
export function registerDiff(
  prog: Command,
  io: CliIO,
  onResult: (code: number) => void,
  addCommon: (c: Command) => Command,
): void {
  addCommon(
    prog
      .command('diff')
      .description('list the computed figures that changed between a git revision (default HEAD) and the working tree')
      .argument(
        '[rev-and-files...]',
        'REV (default HEAD), then -- and Markdown files, folders or globs (default: the current folder)',
      )
      .usage('[options] [REV] [-- FILES...]')
      .option('--format <format>', 'text or json', 'text')
      .option('--exit-code', 'exit 1 when anything changed (as git diff --exit-code)')
      .addHelpText('after', HELP_AFTER),
  ).action(async (operands: string[], opts: DiffOptions, cmd: Command) => {
    // Commander keeps the arguments as given on the program (not in its typings).
    const raw = (cmd.parent as unknown as { rawArgs?: string[] } | null)?.rawArgs ?? [];
    const at = raw.indexOf('diff');
    onResult(await runDiff(operands, at >= 0 ? raw.slice(at + 1) : raw, opts, io));
  });
}

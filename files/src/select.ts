/**
 * Which files are notes: the one answer for `dewmark check`/`eval` and the language server's
 * "check all notes" request.
 *
 * - A file named as it is (a path that exists) is read whatever its name, ignore files and
 *   `--exclude` notwithstanding: naming it is asking for it.
 * - A folder is walked recursively, and a glob walks its base folder (`docs` for
 *   `docs/**\/*.md`) and keeps the paths that match it. Both keep only `.md` and `.markdown`
 *   files, and both leave out the same things: `node_modules`, hidden files and folders (a name
 *   starting with `.`), what `.gitignore` files and `.git/info/exclude` ignore (unless
 *   `gitignore: false`), what an `exclude` pattern matches, and symbolic links (a link's target
 *   is either in the tree already or outside it; links are never followed).
 * - A folder named as it is, or a glob's base folder, is walked even if an ignore file leaves it
 *   out, but what the ignore files leave out inside it stays out (as in git).
 * - `-` is standard input, read by the caller.
 * Inputs keep the order of the arguments (a folder's files in name order), each file once.
 */
import { statSync, type Dirent, readdirSync } from 'node:fs';
import { isAbsolute, join, relative, resolve, sep } from 'node:path';
import picomatch from 'picomatch';
import { IgnoreFiles } from './ignoreFiles';

/** The name standard input is reported under. */
export const STDIN_PATH = '<stdin>';

/** File name endings of notes, in folders and globs. */
export const MARKDOWN = /\.(md|markdown)$/i;

/** One input: a file path as the user will read it, or standard input. */
export interface Input {
  /** Path as printed (relative to the working directory where possible), or `<stdin>`. */
  display: string;
  /** Absolute path; null for standard input. */
  abs: string | null;
}

/** A problem finding an input (a missing path, a glob that matches nothing; exit code 2). */
export interface InputProblem {
  display: string;
  message: string;
}

/** Options for {@link collectInputs}. */
export interface CollectOptions {
  cwd: string;
  /** Honour `.gitignore` files and `.git/info/exclude` in folders and globs. Default true. */
  gitignore?: boolean;
  /**
   * Glob patterns (relative to `cwd`) of files and folders to leave out of folders and globs. A
   * pattern without a slash matches a name at any depth.
   */
  exclude?: readonly string[];
}

/** Why an entry met on a walk was left out. */
export type LeftOutReason = 'ignore-file' | 'exclude' | 'hidden' | 'node_modules' | 'symlink';

/** Folders and Markdown files left out of one walk, by reason. */
export type LeftOut = Record<LeftOutReason, number>;

/** A folder or glob argument that gave no file, and what was left out of it. */
export interface EmptyArgument {
  arg: string;
  kind: 'folder' | 'glob';
  leftOut: LeftOut;
  /** For a glob: files that matched it but are not Markdown. */
  notMarkdown: number;
}

/** What {@link collectInputs} finds. */
export interface Selection {
  inputs: Input[];
  problems: InputProblem[];
  /** Folders (and globs that matched) that gave no Markdown file: why, for the "nothing found" message. */
  empty: EmptyArgument[];
}

function toPosix(p: string): string {
  return sep === '\\' ? p.split('\\').join('/') : p;
}

function displayOf(abs: string, cwd: string): string {
  const rel = relative(cwd, abs);
  const shown = rel === '' ? '.' : rel.startsWith('..') ? abs : rel;
  return toPosix(shown);
}

function noneLeftOut(): LeftOut {
  return { 'ignore-file': 0, exclude: 0, hidden: 0, node_modules: 0, symlink: 0 };
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/**
 * "2 left out by .gitignore or .git/info/exclude (--no-gitignore reads them), 1 hidden" — or ''
 * when nothing was left out.
 */
export function describeLeftOut(leftOut: LeftOut): string {
  const parts: string[] = [];
  const n = leftOut['ignore-file'];
  if (n > 0)
    parts.push(`${n} left out by .gitignore or .git/info/exclude (--no-gitignore reads ${n === 1 ? 'it' : 'them'})`);
  if (leftOut.exclude > 0) parts.push(`${leftOut.exclude} left out by --exclude`);
  if (leftOut.hidden > 0)
    parts.push(
      `${leftOut.hidden} hidden (name starting with '.'; ` +
        `name ${leftOut.hidden === 1 ? 'it' : 'them'} to read ${leftOut.hidden === 1 ? 'it' : 'them'})`,
    );
  if (leftOut.node_modules > 0) parts.push(`${leftOut.node_modules} in node_modules`);
  if (leftOut.symlink > 0) parts.push(`${plural(leftOut.symlink, 'symbolic link')} not followed`);
  return parts.length === 0 ? '' : `folders and Markdown files: ${parts.join(', ')}`;
}

/** The walk of one folder: what it keeps and what it leaves out. */
interface Walk {
  top: string;
  ignores: IgnoreFiles | null;
  excluded: ((abs: string) => boolean) | null;
  /** For a glob: whether a file's path matches it. */
  matches: ((abs: string) => boolean) | null;
  /** Folder levels below `top` worth walking (a glob without `**` reaches only so deep). */
  maxDepth: number;
  found: string[];
  leftOut: LeftOut;
  notMarkdown: number;
}

/** Whether `abs` is a folder (following a link, without walking into it). */
function isFolder(abs: string): boolean {
  try {
    return statSync(abs).isDirectory();
  } catch {
    return false;
  }
}

const byName = (a: Dirent, b: Dirent) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0);

/**
 * Walks `dir` depth first in name order; yields once per folder, so that a caller can pause or stop between folders.
 */
function* walk(dir: string, w: Walk, depth = 0): Generator<void, void, void> {
  yield;
  let entries: Dirent[];
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return; // an unreadable folder holds no notes we can read
  }
  entries.sort(byName);
  for (const e of entries) {
    const isDir = e.isDirectory();
    const abs = join(dir, e.name);
    // What is left out is counted for the "found nothing" message: folders and Markdown files of
    // a folder walk; for a glob, only the Markdown files that match it.
    const counts = w.matches ? !isDir && MARKDOWN.test(e.name) && w.matches(abs) : isDir || MARKDOWN.test(e.name);
    if (e.isSymbolicLink()) {
      if (w.matches ? counts : MARKDOWN.test(e.name) || isFolder(abs)) w.leftOut.symlink++;
      continue;
    }
    if (!isDir && !e.isFile()) continue;
    if (e.name.startsWith('.')) {
      if (counts) w.leftOut.hidden++;
      continue;
    }
    if (isDir && e.name === 'node_modules') {
      if (counts) w.leftOut.node_modules++;
      continue;
    }
    if (w.excluded?.(abs)) {
      if (counts) w.leftOut.exclude++;
      continue;
    }
    if (w.ignores?.ignoredBy(dir, abs, isDir)) {
      if (counts) w.leftOut['ignore-file']++;
      continue;
    }
    if (isDir) {
      if (depth < w.maxDepth) yield* walk(abs, w, depth + 1);
      continue;
    }
    if (w.matches && !w.matches(abs)) continue;
    if (MARKDOWN.test(e.name)) w.found.push(abs);
    else if (w.matches) w.notMarkdown++;
  }
}

/**
 * A matcher of absolute paths for patterns written relative to `cwd` or absolute. With
 * `bareNames`, a pattern without a slash matches a name at any depth (`archive`, `*.draft.md`).
 */
function matcherOf(patterns: readonly string[], cwd: string, bareNames: boolean): (abs: string) => boolean {
  const cleaned = patterns.map((p) =>
    toPosix(p)
      .replace(/^\.\//, '')
      .replace(/(.)\/+$/, '$1'),
  );
  const compile = (list: string[], options = {}) => (list.length > 0 ? picomatch(list, options) : null);
  const names = bareNames
    ? compile(
        cleaned.filter((p) => !p.includes('/')),
        { basename: true },
      )
    : null;
  const rel = compile(cleaned.filter((p) => (!bareNames || p.includes('/')) && !isAbsolute(p)));
  const abs = compile(cleaned.filter((p) => isAbsolute(p)));
  return (path) => {
    const r = toPosix(relative(cwd, path));
    return Boolean(names?.(r) || rel?.(r) || abs?.(toPosix(path)));
  };
}

/**
 * A matcher of absolute paths for a project file's `include`/`exclude` patterns, written relative
 * to its folder `baseDir` (as `--exclude` patterns are to the working directory: a bare name
 * matches at any depth).
 */
export function patternMatcher(patterns: readonly string[], baseDir: string): (abs: string) => boolean {
  return matcherOf(patterns, baseDir, true);
}

/**
 * Turns arguments (paths, folders, globs, `-`) into inputs, in order, without duplicates. A
 * missing path or a glob that matches nothing is a problem (reported; the CLI exits 2). A
 * generator: it yields between folders (drive it with {@link collectInputs}, or step it and pause
 * between steps to keep a server responsive).
 */
export function* selectInputs(args: readonly string[], opts: CollectOptions): Generator<void, Selection, void> {
  const inputs: Input[] = [];
  const problems: InputProblem[] = [];
  const empty: EmptyArgument[] = [];
  const seen = new Set<string>();
  const useIgnore = opts.gitignore !== false;
  const excluded = opts.exclude && opts.exclude.length > 0 ? matcherOf(opts.exclude, opts.cwd, true) : null;
  const add = (abs: string) => {
    if (seen.has(abs)) return;
    seen.add(abs);
    inputs.push({ display: displayOf(abs, opts.cwd), abs });
  };
  const walkOf = (top: string, matches: Walk['matches'], maxDepth = Infinity): Walk => ({
    top,
    maxDepth,
    ignores: useIgnore ? new IgnoreFiles(top) : null,
    excluded,
    matches,
    found: [],
    leftOut: noneLeftOut(),
    notMarkdown: 0,
  });
  let stdinTaken = false;
  for (const arg of args.length > 0 ? args : ['.']) {
    if (arg === '-') {
      if (!stdinTaken) inputs.push({ display: STDIN_PATH, abs: null });
      stdinTaken = true;
      continue;
    }
    const abs = resolve(opts.cwd, arg);
    let isDir: boolean | null = null;
    try {
      isDir = statSync(abs).isDirectory();
    } catch {
      isDir = null;
    }
    if (isDir === true) {
      const w = walkOf(abs, null);
      yield* walk(abs, w);
      for (const f of w.found) add(f);
      if (w.found.length === 0) empty.push({ arg, kind: 'folder', leftOut: w.leftOut, notMarkdown: 0 });
      continue;
    }
    if (isDir === false) {
      add(abs);
      continue;
    }
    const scan = picomatch.scan(toPosix(arg));
    if (!scan.isGlob) {
      problems.push({ display: arg, message: `cannot read '${arg}': no such file or folder` });
      continue;
    }
    const base = resolve(opts.cwd, scan.base === '' ? '.' : scan.base);
    let baseIsDir = false;
    try {
      baseIsDir = statSync(base).isDirectory();
    } catch {
      baseIsDir = false;
    }
    // `docs/*/*.md` needs one folder level below `docs`; `**` any number.
    const depth = scan.glob.includes('**') ? Infinity : scan.glob.split('/').length - 1;
    const w = walkOf(base, matcherOf([arg], opts.cwd, false), depth);
    if (baseIsDir) yield* walk(base, w);
    for (const f of w.found) add(f);
    if (w.found.length > 0) continue;
    problems.push({ display: arg, message: emptyGlobMessage(arg, w) });
  }
  return { inputs, problems, empty };
}

function emptyGlobMessage(arg: string, w: Walk): string {
  const left = describeLeftOut(w.leftOut);
  if (w.notMarkdown > 0) {
    return (
      `the pattern '${arg}' matches ${plural(w.notMarkdown, 'file')}, none of them Markdown ` +
      `(.md, .markdown); name a file to read it whatever its name${left ? `; ${left}` : ''}`
    );
  }
  return `no files match the pattern '${arg}'${left ? ` (${left})` : ''}`;
}

/** {@link selectInputs} run to the end at once (the command line). */
export function collectInputs(args: readonly string[], opts: CollectOptions): Selection {
  const steps = selectInputs(args, opts);
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
  }
}

/** Why a run that found nothing found nothing: one sentence per folder that gave no file and had something left out. */
export function explainEmpty(empty: readonly EmptyArgument[]): string[] {
  const out: string[] = [];
  for (const e of empty) {
    const left = describeLeftOut(e.leftOut);
    if (left) out.push(`in '${e.arg}': ${left}`);
  }
  return out;
}

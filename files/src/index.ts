/**
 * Which files `dewmark` reads: paths, folders (recursive, `.gitignore` honoured), glob patterns
 * and `-` for standard input; and reading them as UTF-8 text with clear errors for missing,
 * unreadable, binary and non-UTF-8 files.
 */
import { readdirSync, readFileSync, statSync, existsSync } from 'node:fs';
import { join, relative, resolve, sep } from 'node:path';
import ignore, { type Ignore } from 'ignore';
import { globSync, isDynamicPattern } from 'tinyglobby';

/** The name standard input is reported under. */
export const STDIN_PATH = '<stdin>';

/** File name endings taken from folders and globs. */
const MARKDOWN = /\.(md|markdown)$/i;

/** Folders never walked into. */
const SKIP_DIRS = new Set(['node_modules', '.git', '.hg', '.svn']);

/** One input: a file path as the user will read it, or standard input. */
export interface Input {
  /** Path as printed (relative to the working directory where possible), or `<stdin>`. */
  display: string;
  /** Absolute path; null for standard input. */
  abs: string | null;
}

/** A problem finding or reading an input (exit code 2). */
export interface InputProblem {
  display: string;
  message: string;
}

/** Options for {@link collectInputs}. */
export interface CollectOptions {
  cwd: string;
  /** Honour `.gitignore` files when walking folders. Default true. */
  gitignore?: boolean;
}

function displayOf(abs: string, cwd: string): string {
  const rel = relative(cwd, abs);
  const shown = rel === '' ? '.' : rel.startsWith('..') ? abs : rel;
  return sep === '\\' ? shown.replace(/\\/g, '/') : shown;
}

/** Walks `dir` for Markdown files, honouring the `.gitignore` files found on the way. */
function walk(dir: string, root: string, rules: { base: string; ig: Ignore }[], useIgnore: boolean, out: string[]): void {
  let entries: import('node:fs').Dirent[];
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return;
  }
  let local = rules;
  if (useIgnore && entries.some((e) => e.name === '.gitignore' && e.isFile())) {
    try {
      const ig = ignore().add(readFileSync(join(dir, '.gitignore'), 'utf8'));
      local = [...rules, { base: dir, ig }];
    } catch {
      // an unreadable .gitignore is ignored
    }
  }
  entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
  for (const e of entries) {
    const abs = join(dir, e.name);
    const isDir = e.isDirectory();
    if (isDir && SKIP_DIRS.has(e.name)) continue;
    if (useIgnore && isIgnored(abs, isDir, local)) continue;
    if (isDir) walk(abs, root, local, useIgnore, out);
    else if (e.isFile() && MARKDOWN.test(e.name)) out.push(abs);
  }
}

function isIgnored(abs: string, isDir: boolean, rules: { base: string; ig: Ignore }[]): boolean {
  for (const { base, ig } of rules) {
    let rel = relative(base, abs);
    if (rel === '' || rel.startsWith('..')) continue;
    if (sep === '\\') rel = rel.replace(/\\/g, '/');
    if (ig.ignores(isDir ? `${rel}/` : rel)) return true;
  }
  return false;
}

/** The `.gitignore` rules that apply above a folder given on the command line (up to the repository root). */
function ancestorRules(dir: string): { base: string; ig: Ignore }[] {
  const chain: string[] = [];
  let cur = resolve(dir);
  for (let i = 0; i < 64; i++) {
    chain.unshift(cur);
    if (existsSync(join(cur, '.git'))) break;
    const parent = resolve(cur, '..');
    if (parent === cur) return []; // not inside a repository: only the folder's own rules apply
    cur = parent;
  }
  const rules: { base: string; ig: Ignore }[] = [];
  for (const d of chain.slice(0, -1)) {
    try {
      rules.push({ base: d, ig: ignore().add(readFileSync(join(d, '.gitignore'), 'utf8')) });
    } catch {
      // none there
    }
  }
  return rules;
}

/**
 * Turns command-line arguments into inputs, in order, without duplicates. A missing path or a
 * glob that matches nothing is a problem (reported, and the run exits 2).
 */
export function collectInputs(args: string[], opts: CollectOptions): { inputs: Input[]; problems: InputProblem[] } {
  const inputs: Input[] = [];
  const problems: InputProblem[] = [];
  const seen = new Set<string>();
  const useIgnore = opts.gitignore !== false;
  const add = (abs: string) => {
    if (seen.has(abs)) return;
    seen.add(abs);
    inputs.push({ display: displayOf(abs, opts.cwd), abs });
  };
  let stdinTaken = false;
  for (const arg of args.length > 0 ? args : ['.']) {
    if (arg === '-') {
      if (!stdinTaken) inputs.push({ display: STDIN_PATH, abs: null });
      stdinTaken = true;
      continue;
    }
    const abs = resolve(opts.cwd, arg);
    let st: import('node:fs').Stats | null = null;
    try {
      st = statSync(abs);
    } catch {
      st = null;
    }
    if (st?.isDirectory()) {
      const found: string[] = [];
      walk(abs, abs, useIgnore ? ancestorRules(abs) : [], useIgnore, found);
      for (const f of found) add(f);
      continue;
    }
    if (st) {
      add(abs);
      continue;
    }
    if (isDynamicPattern(arg)) {
      const matches = globSync(arg, { cwd: opts.cwd, absolute: true, onlyFiles: true, ignore: ['**/node_modules/**', '**/.git/**'] }).sort();
      if (matches.length === 0) {
        problems.push({ display: arg, message: `no files match the pattern '${arg}'` });
        continue;
      }
      for (const m of matches) add(resolve(m));
      continue;
    }
    problems.push({ display: arg, message: `cannot read '${arg}': no such file or folder` });
  }
  return { inputs, problems };
}

/** Outcome of reading one input. */
export type ReadOutcome = { ok: true; text: string } | { ok: false; message: string };

/** Bytes looked at for a NUL byte when deciding whether a file is binary. */
const BINARY_SNIFF = 8000;

/** Decodes bytes as UTF-8 text; a NUL byte means binary, an invalid sequence means not UTF-8. */
export function decodeText(bytes: Uint8Array, display: string): ReadOutcome {
  const sniff = bytes.subarray(0, Math.min(bytes.length, BINARY_SNIFF));
  if (sniff.includes(0)) return { ok: false, message: `'${display}' is a binary file, not a Markdown note; leave it out of the paths or globs` };
  try {
    return { ok: true, text: new TextDecoder('utf-8', { fatal: true }).decode(bytes) };
  } catch {
    const at = firstInvalidUtf8(bytes);
    return { ok: false, message: `'${display}' is not valid UTF-8 text (first bad byte at offset ${at}); save it as UTF-8` };
  }
}

/** Offset of the first byte that breaks UTF-8 (for messages). */
export function firstInvalidUtf8(b: Uint8Array): number {
  let i = 0;
  while (i < b.length) {
    const c = b[i]!;
    let n = 0;
    if (c < 0x80) n = 0;
    else if (c >= 0xc2 && c <= 0xdf) n = 1;
    else if (c >= 0xe0 && c <= 0xef) n = 2;
    else if (c >= 0xf0 && c <= 0xf4) n = 3;
    else return i;
    for (let k = 1; k <= n; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
    }
    i += n + 1;
  }
  return i;
}

/** Reads a file input as text (standard input is read by the caller). */
export function readInput(input: Input): ReadOutcome {
  if (input.abs === null) return { ok: false, message: 'standard input must be read by the caller' };
  let bytes: Buffer;
  try {
    bytes = readFileSync(input.abs);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === 'EACCES' ? 'permission denied' : code === 'EISDIR' ? 'it is a folder' : code === 'ENOENT' ? 'no such file' : (err as Error).message;
    return { ok: false, message: `cannot read '${input.display}': ${why}` };
  }
  return decodeText(bytes, input.display);
}

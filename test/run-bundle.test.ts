/**
 * bin/run-bundle.js: the CLI starts from V8's code cache the build made, only when the cache
 * belongs to the bundle beside it, and otherwise runs the bundle as `require` does. Each case runs
 * in a child process (a cache is V8's, per process) on a small bundle of its own, and one on the
 * real dist/cli.js the build trained.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = join(__dirname, '..');
const runBundle = join(root, 'bin', 'run-bundle.js');
const train = join(root, 'scripts', 'train-code-cache.cjs');

let tmp = '';
beforeAll(() => {
  tmp = mkdtempSync(join(tmpdir(), 'dewmark-run-bundle-'));
});
afterAll(() => {
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

/** A bundle that reports what a CommonJS module sees, its arguments, and a word of its own. */
function bundleSource(word: string): string {
  return `'use strict';
const path = require('node:path');
function report() {
  return JSON.stringify({
    word: ${JSON.stringify(word)},
    file: path.basename(__filename),
    dir: __dirname === path.dirname(__filename),
    exportsIsModuleExports: exports === module.exports,
    resolves: typeof require.resolve('node:fs') === 'string',
    args: process.argv.slice(2),
  });
}
process.stdout.write(report());
`;
}

/** Runs `bundle` through runBundle in a fresh process: what it printed, and whether a cache was used. */
function run(bundle: string): { out: Record<string, unknown>; used: boolean; status: number | null; stderr: string } {
  const loader = `const used = require(${JSON.stringify(runBundle)}).runBundle(${JSON.stringify(bundle)}, module);
process.stderr.write('used=' + used);`;
  const p = spawnSync(process.execPath, ['-e', loader, 'x', 'one', 'two'], { encoding: 'utf8' });
  return {
    out: p.stdout ? (JSON.parse(p.stdout) as Record<string, unknown>) : {},
    used: /used=true/.test(p.stderr),
    status: p.status,
    stderr: p.stderr,
  };
}

/** Makes `<bundle>.cache` as the build does: a training run with the bundle. */
function makeCache(bundle: string): void {
  const p = spawnSync(process.execPath, [train, 'train-arg'], {
    encoding: 'utf8',
    env: { ...process.env, DEWMARK_TRAIN_BUNDLE: bundle, DEWMARK_CODE_CACHE_OUT: `${bundle}.cache` },
  });
  expect(p.status, p.stderr).toBe(0);
  // The training run is the bundle's own run, with the training process's arguments.
  expect(JSON.parse(p.stdout)).toMatchObject({ word: 'first', args: ['train-arg'] });
}

describe('run-bundle: the code cache', () => {
  it('a bundle with no cache runs as require runs it: the module sees its file, exports and arguments', () => {
    const bundle = join(tmp, 'plain.js');
    writeFileSync(bundle, bundleSource('plain'));
    const r = run(bundle);
    expect(r.status, r.stderr).toBe(0);
    expect(r.used).toBe(false);
    expect(r.out).toEqual({
      word: 'plain',
      file: 'plain.js',
      dir: true,
      exportsIsModuleExports: true,
      resolves: true,
      args: ['one', 'two'],
    });
  });

  it('a cache made by a training run is used, and the bundle behaves as without it', () => {
    const bundle = join(tmp, 'cached.js');
    writeFileSync(bundle, bundleSource('first'));
    makeCache(bundle);
    expect(readFileSync(`${bundle}.cache`, 'latin1').startsWith('dewmark-code-cache 1\n')).toBe(true);
    const r = run(bundle);
    expect(r.status, r.stderr).toBe(0);
    expect(r.used).toBe(true);
    expect(r.out).toMatchObject({ word: 'first', file: 'cached.js', dir: true, exportsIsModuleExports: true });
    expect(r.out.args).toEqual(['one', 'two']);
  });

  it('a bundle rebuilt to the same size is not run from the old cache: the new code runs', () => {
    const bundle = join(tmp, 'rebuilt.js');
    writeFileSync(bundle, bundleSource('first'));
    makeCache(bundle);
    // Same length, other code (V8 alone would take the cache: it checks the source's length).
    writeFileSync(bundle, bundleSource('other'));
    const later = new Date(Date.now() + 5000);
    utimesSync(bundle, later, later);
    const r = run(bundle);
    expect(r.status, r.stderr).toBe(0);
    expect(r.used).toBe(false);
    expect(r.out.word).toBe('other');
  });

  it('a damaged cache is refused by V8 and the bundle still runs', () => {
    const bundle = join(tmp, 'damaged.js');
    writeFileSync(bundle, bundleSource('first'));
    makeCache(bundle);
    const bytes = readFileSync(`${bundle}.cache`);
    const head = 'dewmark-code-cache 1\n'.length;
    // Keep the two header lines, scramble V8's part.
    const second = bytes.indexOf(0x0a, head) + 1;
    for (let i = second; i < bytes.length; i++) bytes[i] = (bytes[i]! * 31 + 7) & 0xff;
    writeFileSync(`${bundle}.cache`, bytes);
    const r = run(bundle);
    expect(r.status, r.stderr).toBe(0);
    expect(r.used).toBe(false);
    expect(r.out.word).toBe('first');
  });

  it('the build trained a cache for the CLI, and `dewmark` starts from it', () => {
    const bundle = join(root, 'dist', 'cli.js');
    expect(existsSync(bundle), 'run npm run build first').toBe(true);
    expect(existsSync(`${bundle}.cache`), 'the build writes dist/cli.js.cache').toBe(true);
    const loader = `const used = require(${JSON.stringify(runBundle)}).runBundle(${JSON.stringify(bundle)}, module);
process.on('exit', () => process.stderr.write('used=' + used));`;
    const p = spawnSync(process.execPath, ['-e', loader, 'x', '--version'], { encoding: 'utf8' });
    expect(p.status, p.stderr).toBe(0);
    expect(p.stdout.trim()).toBe(JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version);
    expect(p.stderr).toContain('used=true');
  });
});

#!/usr/bin/env node
/**
 * `npm run package`: bundles the extension (npm run build) and packs it with @vscode/vsce into
 * dewmark-<version>.vsix at the repository root, then prints its size and contents. The manifest
 * is the root package.json; .vscodeignore keeps the package to the two bundles, the grammar, the
 * icon and the documents (no node_modules: `--no-dependencies`).
 *
 *   node client/package-vsix.mjs [--no-build] [--out FILE]
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
const args = process.argv.slice(2);
const outIdx = args.indexOf('--out');
const out = outIdx >= 0 && args[outIdx + 1] ? resolve(args[outIdx + 1]) : join(root, `${manifest.name}-${manifest.version}.vsix`);
/** Goal for the package size (issue: ≤ 1 MB). */
const SIZE_GOAL = 1024 * 1024;

function run(cmd, argv) {
  const r = spawnSync(cmd, argv, { cwd: root, stdio: 'inherit' });
  if (r.error) throw r.error;
  if (r.status !== 0) {
    console.error(`package: '${cmd} ${argv.join(' ')}' exited with ${r.status}`);
    process.exit(r.status ?? 1);
  }
}

if (!args.includes('--no-build')) {
  if (!existsSync(join(root, 'scripts', 'build.mjs'))) {
    console.error('package: scripts/build.mjs is missing, so dist/ cannot be built; pass --no-build to pack an existing dist/.');
    process.exit(1);
  }
  run(process.execPath, [join(root, 'scripts', 'build.mjs')]);
}
for (const f of ['dist/client.js', 'dist/server.js']) {
  if (!existsSync(join(root, f))) {
    console.error(`package: ${f} is missing after the build; the extension cannot run without it.`);
    process.exit(1);
  }
}

const vsce = join(root, 'node_modules', '@vscode', 'vsce', 'vsce');
const vsceArgs = [vsce, 'package', '--no-dependencies', '--out', out];
// No public repository is recorded yet; README links are packed as they are.
if (!manifest.repository) vsceArgs.push('--allow-missing-repository', '--no-rewrite-relative-links');
run(process.execPath, vsceArgs);

const size = statSync(out).size;
const list = spawnSync(process.execPath, [vsce, 'ls', '--no-dependencies'], { cwd: root, encoding: 'utf8' });
console.log(`package: ${relative(process.cwd(), out) || out}: ${(size / 1024).toFixed(1)} KiB (goal ≤ ${SIZE_GOAL / 1024} KiB: ${size <= SIZE_GOAL ? 'met' : 'NOT met'})`);
if (list.status === 0) console.log(`package: files:\n${list.stdout.trim().split('\n').map((l) => `  ${l}`).join('\n')}`);

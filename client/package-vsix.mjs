#!/usr/bin/env node
/**
 * `npm run package`: bundles the extension (npm run build) and packs it with @vscode/vsce into
 * dewmark-<version>.vsix at the repository root, then prints its size and contents. The manifest
 * is the root package.json, which is also the npm package's: its `files` list is the npm
 * package's contents, and vsce refuses a `files` list beside a .vscodeignore. So the files that
 * client/vsix.vscodeignore lets in (the editor bundles, Node and web, the grammar, the icon, the documents)
 * are copied into a staging folder with the manifest minus `files`, and vsce packs that folder
 * (no node_modules: `--no-dependencies`). Same manifest, same version as the npm package.
 *
 *   node client/package-vsix.mjs [--no-build] [--out FILE]
 */
import { spawnSync } from 'node:child_process';
import {
  copyFileSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
const args = process.argv.slice(2);
const outIdx = args.indexOf('--out');
const out =
  outIdx >= 0 && args[outIdx + 1] ? resolve(args[outIdx + 1]) : join(root, `${manifest.name}-${manifest.version}.vsix`);
/** Goal for the package size (issue: ≤ 1 MB). */
const SIZE_GOAL = 1024 * 1024;

function run(cmd, argv, cwd = root) {
  const r = spawnSync(cmd, argv, { cwd, stdio: 'inherit' });
  if (r.error) throw r.error;
  if (r.status !== 0) {
    console.error(`package: '${cmd} ${argv.join(' ')}' exited with ${r.status}`);
    process.exit(r.status ?? 1);
  }
}

if (!args.includes('--no-build')) {
  if (!existsSync(join(root, 'scripts', 'build.mjs'))) {
    console.error(
      'package: scripts/build.mjs is missing, so dist/ cannot be built; pass --no-build to pack an existing dist/.',
    );
    process.exit(1);
  }
  run(process.execPath, [join(root, 'scripts', 'build.mjs')]);
}
for (const f of ['dist/client.js', 'dist/server.js', 'dist/web/client.js', 'dist/web/server.js']) {
  if (!existsSync(join(root, f))) {
    console.error(`package: ${f} is missing after the build; the extension cannot run without it.`);
    process.exit(1);
  }
}

const vsce = join(root, 'node_modules', '@vscode', 'vsce', 'vsce');
const ignoreFile = join(root, 'client', 'vsix.vscodeignore');
const ignoreText = readFileSync(ignoreFile, 'utf8');
/** The files the .vsix holds: the `!path` lines of client/vsix.vscodeignore (plain paths, no globs). */
const packed = ignoreText
  .split('\n')
  .map((l) => l.trim())
  .filter((l) => l.startsWith('!'))
  .map((l) => l.slice(1));
const stage = mkdtempSync(join(tmpdir(), 'dewmark-vsix-'));
let size = 0;
let list;
try {
  for (const f of packed) {
    if (f === 'package.json') continue;
    if (!existsSync(join(root, f))) {
      console.error(`package: ${f} (named in client/vsix.vscodeignore) is missing.`);
      process.exit(1);
    }
    mkdirSync(dirname(join(stage, f)), { recursive: true });
    copyFileSync(join(root, f), join(stage, f));
  }
  const { files: _npmFiles, ...vsixManifest } = manifest;
  writeFileSync(join(stage, 'package.json'), `${JSON.stringify(vsixManifest, null, 2)}\n`);
  writeFileSync(join(stage, '.vscodeignore'), ignoreText);
  run(process.execPath, [vsce, 'package', '--no-dependencies', '--out', out], stage);
  size = statSync(out).size;
  list = spawnSync(process.execPath, [vsce, 'ls', '--no-dependencies'], { cwd: stage, encoding: 'utf8' });
} finally {
  rmSync(stage, { recursive: true, force: true });
}
console.log(
  `package: ${relative(process.cwd(), out) || out}: ${(size / 1024).toFixed(1)} ` +
    `KiB (goal ≤ ${SIZE_GOAL / 1024} KiB: ${size <= SIZE_GOAL ? 'met' : 'NOT met'})`,
);
if (list.status === 0)
  console.log(
    `package: files:\n${list.stdout
      .trim()
      .split('\n')
      .map((l) => `  ${l}`)
      .join('\n')}`,
  );

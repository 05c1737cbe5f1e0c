/**
 * The npm package as a team installs it: built into a staging folder, packed with `npm pack --json`
 * from the repository's own package.json and `files` list, installed offline into a scratch
 * project outside the monorepo (no registry: the package has no runtime dependencies), and run
 * there — `npx dewmark check`, `--version`, and the language server's initialize over stdio.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import {
  cpSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const root = join(__dirname, '..', '..');
const manifest = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
  name: string;
  version: string;
  files: string[];
  bin: Record<string, string>;
  dependencies?: Record<string, string>;
};
const npmCli = process.platform === 'win32' ? 'npm.cmd' : 'npm';

let tmp = '';
let stage = '';
let project = '';
let buildOut = '';
let packJson: { name: string; version: string; filename: string; files: { path: string }[]; size: number }[] = [];

/** npm with a private cache and an unreachable registry: nothing may come from the network. */
function npm(args: string[], cwd: string) {
  return spawnSync(
    npmCli,
    [
      ...args,
      '--cache',
      join(tmp, 'npm-cache'),
      '--registry',
      'http://127.0.0.1:9/',
      '--no-audit',
      '--no-fund',
      '--no-update-notifier',
    ],
    {
      cwd,
      encoding: 'utf8',
      timeout: 120_000,
      env: { ...process.env, npm_config_offline: 'true' },
    },
  );
}

const GOOD = ['# AHU-1 of the invented Larch Street clinic', '', '```air', 'state RA: db=24C rh=50%', '```', ''].join(
  '\n',
);
// An invented note with a wb above its db (an error), for the exit code.
const BAD = ['# Bad', '', '```air', 'state A: db=20C wb=25C', '```', ''].join('\n');

beforeAll(() => {
  tmp = mkdtempSync(join(tmpdir(), 'dewmark-pkg-'));
  stage = join(tmp, 'stage');
  mkdirSync(stage);
  // The build, as `npm pack` runs it (prepare), into the staging folder's dist/.
  const b = spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs'), '--outdir', join(stage, 'dist')], {
    cwd: root,
    encoding: 'utf8',
  });
  if (b.status !== 0) throw new Error(`build failed: ${b.stderr}`);
  buildOut = b.stdout;
  cpSync(join(root, 'package.json'), join(stage, 'package.json'));
  for (const f of manifest.files) {
    if (f.startsWith('dist/')) continue;
    const from = join(root, f);
    if (existsSync(from)) cpSync(from, join(stage, f), { recursive: true });
  }
  const p = npm(['pack', '--json', '--ignore-scripts', '--pack-destination', tmp], stage);
  if (p.status !== 0) throw new Error(`npm pack failed: ${p.stderr}`);
  packJson = JSON.parse(p.stdout);
  project = join(tmp, 'notes-repo');
  mkdirSync(project);
  writeFileSync(
    join(project, 'package.json'),
    JSON.stringify({ name: 'notes-repo', version: '1.0.0', private: true }, null, 2),
  );
  writeFileSync(join(project, 'good.md'), GOOD);
  writeFileSync(join(project, 'bad.md'), BAD);
  const i = npm(['install', '--offline', '--save-dev', join(tmp, packJson[0]!.filename)], project);
  if (i.status !== 0) throw new Error(`npm install of the tarball failed: ${i.stderr}`);
}, 240_000);

afterAll(() => {
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

describe('npm package', () => {
  it('the build says nothing on stdout, so `npm pack --json` (which runs it) prints only JSON', () => {
    expect(buildOut).toBe('');
    expect(packJson).toHaveLength(1);
    expect(packJson[0]!.name).toBe('dewmark');
    expect(packJson[0]!.version).toBe(manifest.version);
  });

  it('the root package.json packs exactly the commands, their bundles, the notices and the documents', () => {
    const paths = packJson[0]!.files.map((f) => f.path).sort();
    expect(paths).toEqual(
      [
        'CHANGELOG.md',
        'LICENSE',
        'README.md',
        'SECURITY.md',
        'bin/dewmark-language-server.js',
        'bin/dewmark.js',
        'bin/run-bundle.js',
        'dist/THIRD-PARTY-NOTICES.md',
        'dist/cli.js',
        'dist/server.js',
        'package.json',
      ]
        .concat(
          manifest.files
            .filter((f) => !f.startsWith('dist/') && !f.startsWith('bin/') && !/^[A-Z]+\.md$|^LICENSE$/.test(f))
            .flatMap((f) => packedUnder(f)),
        )
        .sort(),
    );
    expect(manifest.dependencies ?? {}, 'the package must have no runtime dependencies').toEqual({});
    expect(Object.keys(manifest.bin).sort()).toEqual(['dewmark', 'dewmark-language-server']);
  });

  it('`npm pack --dry-run --json` at the repository root parses and lists the same files', () => {
    const p = npm(['pack', '--dry-run', '--json', '--ignore-scripts'], root);
    expect(p.status, p.stderr).toBe(0);
    const j = JSON.parse(p.stdout) as typeof packJson;
    expect(j[0]!.files.map((f) => f.path).sort()).toEqual(packJson[0]!.files.map((f) => f.path).sort());
  });

  it('the notices carry the licence text of every bundled package', () => {
    const notices = readFileSync(join(stage, 'dist', 'THIRD-PARTY-NOTICES.md'), 'utf8');
    // Packages the CLI and server bundles are known to include (cli/, files/ and server/package.json dependencies).
    for (const name of ['commander', 'ignore', 'picomatch', 'markdown-it', 'vscode-languageserver', 'vscode-jsonrpc']) {
      expect(notices, name).toMatch(new RegExp(`^## ${name.replace(/[.]/g, '\\.')} \\d`, 'm'));
    }
    expect(notices).toContain('Permission is hereby granted, free of charge');
    for (const bundle of ['cli.js', 'server.js'])
      expect(readFileSync(join(stage, 'dist', bundle), 'utf8').slice(0, 200)).toContain('THIRD-PARTY-NOTICES.md');
  });

  it('installs offline into a project with no monorepo, and `npx dewmark check` runs there', () => {
    expect(existsSync(join(project, 'node_modules', 'dewmark', 'dist', 'cli.js'))).toBe(true);
    expect(
      existsSync(join(project, 'node_modules', 'dewmark', 'node_modules')),
      'nothing besides the package is installed',
    ).toBe(false);
    const npx = (args: string[]) =>
      spawnSync(process.platform === 'win32' ? 'npx.cmd' : 'npx', ['--no-install', ...args], {
        cwd: project,
        encoding: 'utf8',
        env: { ...process.env, npm_config_offline: 'true', NO_COLOR: '1' },
        timeout: 60_000,
      });
    const version = npx(['dewmark', '--version']);
    expect(version.stdout.trim()).toBe(manifest.version);
    const good = npx(['dewmark', 'check', 'good.md']);
    expect(good.status, good.stderr).toBe(0);
    expect(good.stdout).toContain('1 file, 0 errors, 0 warnings');
    const bad = npx(['dewmark', 'check', '.']);
    expect(bad.status).toBe(1);
    expect(bad.stdout).toMatch(/^bad\.md:4:\d+: error\[wb-above-db\]: /m);
  });

  it('`dewmark-language-server --stdio` from the install answers initialize', async () => {
    const bin = join(project, 'node_modules', '.bin', 'dewmark-language-server');
    const child = spawn(bin, ['--stdio'], { cwd: project, stdio: ['pipe', 'pipe', 'pipe'] });
    try {
      const body = JSON.stringify({
        jsonrpc: '2.0',
        id: 1,
        method: 'initialize',
        params: { processId: null, rootUri: null, capabilities: {} },
      });
      child.stdin.write(`Content-Length: ${Buffer.byteLength(body)}\r\n\r\n${body}`);
      const reply = await new Promise<{
        id: number;
        result: { capabilities: Record<string, unknown>; serverInfo?: { name: string; version?: string } };
      }>((resolve, reject) => {
        let buf = Buffer.alloc(0);
        const timer = setTimeout(() => reject(new Error('no answer to initialize within 30 s')), 30_000);
        child.stdout.on('data', (d: Buffer) => {
          buf = Buffer.concat([buf, d]);
          const head = buf.indexOf('\r\n\r\n');
          if (head < 0) return;
          const len = Number(/Content-Length: (\d+)/i.exec(buf.subarray(0, head).toString())?.[1]);
          if (buf.length < head + 4 + len) return;
          clearTimeout(timer);
          resolve(JSON.parse(buf.subarray(head + 4, head + 4 + len).toString('utf8')));
        });
        child.once('exit', (code) => reject(new Error(`server exited with ${code}`)));
      });
      expect(reply.id).toBe(1);
      expect(reply.result.capabilities.hoverProvider).toBeTruthy();
      expect(reply.result.serverInfo?.name).toMatch(/dewmark/i);
    } finally {
      child.kill();
    }
  });
});

/** Files the `files` entry `f` (a file or a folder) packs, relative to the package root. */
function packedUnder(f: string): string[] {
  const abs = join(stage, f);
  if (!existsSync(abs)) return [];
  if (!statSync(abs).isDirectory()) return [f];
  return readdirSync(abs).flatMap((e) => packedUnder(`${f.replace(/\/$/, '')}/${e}`));
}

/**
 * The web build's bundles (scripts/web-build.mjs): a Node built-in module anywhere in them fails
 * the build with a message naming the module and the file that imports it; the real web entries
 * build without one, leave out every Node-only file (the server's Node host and workspace check,
 * @dewmark/files, the client's Node entry), and require nothing at run time but `vscode`.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build, type BuildFailure, type Metafile } from 'esbuild';
import { repoRoot } from '../protocol/harness';
// @ts-expect-error -- a plain ES module without type declarations
import { webOptions } from '../../scripts/web-build.mjs';

const root = repoRoot();
const options = (format: 'iife' | 'cjs') => ({
  ...webOptions({ root, version: '0.0.0-test', format }),
  logLevel: 'silent',
});

/** Bundles `entry` in memory with the web build's options, minified as shipped (comments gone). */
async function bundle(entry: string, format: 'iife' | 'cjs', external: string[] = []) {
  const r = await build({
    ...options(format),
    minifyWhitespace: true,
    minifySyntax: true,
    entryPoints: [entry],
    write: false,
    outdir: '/virtual',
    external,
  });
  return { text: r.outputFiles![0]!.text, inputs: Object.keys((r.metafile as Metafile).inputs) };
}

describe('the web build', () => {
  it('fails on a Node built-in module, naming it and the file that imports it, also through another file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'dewmark-webbuild-'));
    try {
      writeFileSync(join(dir, 'helper.ts'), "import { join } from 'path';\nexport const j = join;\n");
      writeFileSync(join(dir, 'entry.ts'), "import { j } from './helper';\nconsole.log(j);\n");
      writeFileSync(join(dir, 'direct.ts'), "import { readFileSync } from 'node:fs';\nconsole.log(readFileSync);\n");
      for (const [entry, module, importer] of [
        ['entry.ts', 'path', 'helper.ts'],
        ['direct.ts', 'node:fs', 'direct.ts'],
      ] as const) {
        const failure = (await bundle(join(dir, entry), 'iife').then(
          () => null,
          (e: BuildFailure) => e,
        )) as BuildFailure | null;
        expect(failure, `${entry} built`).not.toBeNull();
        const text = failure!.errors.map((e) => e.text).join('\n');
        expect(text).toContain(`the web build may not use the Node module '${module}'`);
        expect(text).toContain(importer);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('bundles the server and the client without a Node-only file, requiring nothing but vscode', async () => {
    const server = await bundle(join(root, 'server/src/browserMain.ts'), 'iife');
    const client = await bundle(join(root, 'client/src/web.ts'), 'cjs', ['vscode']);
    for (const b of [server, client]) {
      const ours = b.inputs.filter((i) => !i.includes('node_modules/'));
      expect(ours.length).toBeGreaterThan(20);
      for (const nodeOnly of [
        'server/src/nodeHost.ts',
        'server/src/checkWorkspace.ts',
        'files/src/',
        'client/src/node.ts',
      ])
        expect(ours.filter((i) => i.includes(nodeOnly))).toEqual([]);
      expect(b.inputs.filter((i) => /vscode-language(server|client)\/lib\/node\//.test(i))).toEqual([]);
    }
    expect(server.text).not.toMatch(/\brequire\(/);
    expect([...new Set(client.text.match(/\brequire\("[^"]*"\)/g))]).toEqual(['require("vscode")']);
  });
});

// Bundles the command-line tool, and the language server and VS Code client when their sources
// exist, into single CommonJS files under dist/ that need no node_modules at run time.
import { build } from 'esbuild';
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));

/** Settings every bundle shares. */
const common = {
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  sourcemap: false,
  legalComments: 'none',
  logLevel: 'warning',
  // ES-module dependencies bundled into CommonJS may read import.meta.url (fdir does, for
  // createRequire); give them the bundle's own file URL.
  banner: { js: "var __bundleMetaUrl = require('url').pathToFileURL(__filename).href;" },
  define: { __DEWMARK_VERSION__: JSON.stringify(pkg.version), 'import.meta.url': '__bundleMetaUrl' },
};

const targets = [
  { entry: 'cli/src/main.ts', out: 'dist/cli.js', required: true },
  // The editor bundles ship in the .vsix: whitespace and syntax minified, names kept so that a
  // stack trace in the server log still reads.
  { entry: 'server/src/main.ts', out: 'dist/server.js', required: false, minify: true },
  { entry: 'client/src/extension.ts', out: 'dist/client.js', required: false, external: ['vscode'], minify: true },
];

// During `npm install` (the prepare script) a failing build only warns, so that installing the
// workspace never fails because a source file is mid-edit; `npm run build` fails loudly.
const lenient = process.env.npm_lifecycle_event === 'prepare';

let failed = 0;
for (const t of targets) {
  const entry = join(root, t.entry);
  if (!existsSync(entry)) {
    if (t.required) {
      console.error(`build: ${t.entry} is missing`);
      failed++;
    }
    continue;
  }
  try {
    const minify = t.minify ? { minifyWhitespace: true, minifySyntax: true } : {};
    await build({ ...common, ...minify, entryPoints: [entry], outfile: join(root, t.out), external: t.external ?? [] });
    console.log(`built ${t.out}`);
  } catch (err) {
    failed++;
    console.error(`build: ${t.out} failed${err instanceof Error && !err.message.includes('Build failed') ? `: ${err.message}` : ''}`);
  }
}
if (failed > 0) {
  if (lenient) console.warn(`build: ${failed} bundle(s) not built; run npm run build for details`);
  else process.exitCode = 1;
}

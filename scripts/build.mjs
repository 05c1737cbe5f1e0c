// Bundles the command-line tool, and the language server and VS Code client when their sources
// exist, into single CommonJS files under dist/ that need no node_modules at run time (and the web
// build of the server and client, for the browser, under dist/web/), and writes
// dist/THIRD-PARTY-NOTICES.md with the licence of every third-party package bundled into them.
// Everything it says goes to stderr, so that `npm pack --json` (which runs it) prints only JSON.
import { build } from 'esbuild';
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { thirdPartyNotices } from './notices.mjs';
import { webOptions } from './web-build.mjs';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
// `--outdir DIR` writes the bundles and notices to DIR instead of dist/ (the package test uses it).
const outdirArg = process.argv.indexOf('--outdir');
const outdir =
  outdirArg >= 0 && process.argv[outdirArg + 1] ? resolve(process.argv[outdirArg + 1]) : join(root, 'dist');
const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));

/** Settings every bundle shares. */
const common = {
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  sourcemap: false,
  // Licence comments are not kept inline; every bundled package's licence text is collected from
  // the metafile into dist/THIRD-PARTY-NOTICES.md instead (complete, and one copy per package).
  legalComments: 'none',
  metafile: true,
  logLevel: 'warning',
  // ES-module dependencies bundled into CommonJS may read import.meta.url (fdir does, for
  // createRequire); give them the bundle's own file URL.
  banner: {
    js:
      '// Third-party licences: THIRD-PARTY-NOTICES.md beside this file.\nvar ' +
      "__bundleMetaUrl = require('url').pathToFileURL(__filename).href;",
  },
  define: { __DEWMARK_VERSION__: JSON.stringify(pkg.version), 'import.meta.url': '__bundleMetaUrl' },
};

/**
 * commander loads node:child_process when it is loaded, for subcommands that are programs of
 * their own (it spawns them), which dewmark has none of; loading it (and the net and socket
 * modules it loads) is a few milliseconds of every command's start. commander is given a module
 * whose `spawn` loads it on first use instead.
 */
const lazyChildProcess = {
  name: 'lazy-child-process',
  setup(b) {
    b.onResolve({ filter: /^node:child_process$/ }, (args) =>
      /[\\/]node_modules[\\/]commander[\\/]/.test(args.importer)
        ? { path: 'child_process', namespace: 'lazy-builtin' }
        : undefined,
    );
    b.onLoad({ filter: /.*/, namespace: 'lazy-builtin' }, () => ({
      contents: "module.exports = { get spawn() { return require('node:child_process').spawn; } };",
      loader: 'js',
    }));
  },
};

/**
 * markdown-it loads the HTML entity decoder (`entities`) when it is loaded, and that module
 * builds its table of every named entity then (a few milliseconds of every start, compile
 * included). markdown-it calls it only for a `&…;` it has to decode (in a fence's info string or a
 * link, not in the rules dewmark keeps on: see shared-core/src/markdown/markdownIt.ts), so
 * markdown-it is given a module whose `decodeHTMLStrict` loads the real one at its first call
 * and hands over to it: the same function, decoding the same way, loaded when first needed.
 */
const lazyEntities = {
  name: 'lazy-entities',
  setup(b) {
    b.onResolve({ filter: /^entities$/ }, (args) =>
      args.namespace !== 'lazy-entities' && /[\\/]node_modules[\\/]markdown-it[\\/]/.test(args.importer)
        ? { path: 'entities', namespace: 'lazy-entities', pluginData: { resolveDir: args.resolveDir } }
        : undefined,
    );
    b.onLoad({ filter: /.*/, namespace: 'lazy-entities' }, (args) => ({
      // (esbuild runs a module reached by `require` only when it is first required.)
      contents: `let entities;
export function decodeHTMLStrict(text) {
  entities ??= require('entities');
  return entities.decodeHTMLStrict(text);
}
`,
      resolveDir: args.pluginData.resolveDir,
      loader: 'js',
    }));
  },
};

/**
 * Rewrites the bundle at `file` with the characters outside ASCII of its regular expressions
 * escaped (see ./ascii-bundle.mjs): every command reads the bundle as one-byte text then. Needs
 * TypeScript (a devDependency); without it the bundle stays as esbuild wrote it, which runs the same.
 */
async function keepAscii(file) {
  let escapeRegExps;
  try {
    ({ escapeRegExpNonAscii: escapeRegExps } = await import('./ascii-bundle.mjs'));
  } catch {
    console.warn(`build: ${relative(root, file)} left with its characters outside ASCII (no TypeScript to find them)`);
    return;
  }
  const { code, left } = escapeRegExps(readFileSync(file, 'utf8'));
  writeFileSync(file, code);
  if (left > 0)
    console.warn(
      `build: ${relative(root, file)} keeps ${left} characters outside ASCII ` +
        '(in a tagged template or an identifier); write them as \\u escapes in the source ' +
        'so that Node reads the bundle as one-byte text',
    );
}

const targets = [
  // Whitespace and syntax minified, names kept so that a stack trace still reads: every command
  // starts by compiling the whole bundle, and a third less text is a few milliseconds less of it.
  {
    entry: 'cli/src/main.ts',
    out: 'dist/cli.js',
    required: true,
    minify: true,
    plugins: [lazyChildProcess, lazyEntities],
    ascii: true,
  },
  // The editor bundles ship in the .vsix: minified in the same way.
  { entry: 'server/src/main.ts', out: 'dist/server.js', required: false, minify: true, plugins: [lazyEntities] },
  { entry: 'client/src/node.ts', out: 'dist/client.js', required: false, external: ['vscode'], minify: true },
  // The web build (the manifest's `browser` entry): the client for the browser-based editor's web
  // worker extension host, and the server it runs in a Web Worker (a classic script).
  { entry: 'server/src/browserMain.ts', out: 'dist/web/server.js', required: false, minify: true, web: 'iife' },
  {
    entry: 'client/src/web.ts',
    out: 'dist/web/client.js',
    required: false,
    external: ['vscode'],
    minify: true,
    web: 'cjs',
  },
];

// During `npm install` (the prepare script) a failing build only warns, so that installing the
// workspace never fails because a source file is mid-edit; `npm run build` fails loudly.
const lenient = process.env.npm_lifecycle_event === 'prepare';

let failed = 0;
/** Bundle file name → metafile, for the notices. */
const metafiles = new Map();
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
    const result = await build({
      ...(t.web ? webOptions({ root, version: pkg.version, format: t.web }) : common),
      ...minify,
      entryPoints: [entry],
      outfile: join(outdir, t.out.replace(/^dist\//, '')),
      external: t.external ?? [],
      // (Only when the target has its own: the web options bring theirs.)
      ...(t.plugins ? { plugins: t.plugins } : {}),
    });
    if (t.ascii) await keepAscii(join(outdir, t.out.replace(/^dist\//, '')));
    metafiles.set(t.out.replace(/^dist\//, ''), result.metafile);
    console.error(`built ${t.out}`);
  } catch (err) {
    failed++;
    const why = err instanceof Error && !err.message.includes('Build failed') ? `: ${err.message}` : '';
    console.error(`build: ${t.out} failed${why}`);
  }
}
if (failed === 0) {
  try {
    const { text, packages } = thirdPartyNotices(root, metafiles);
    writeFileSync(join(outdir, 'THIRD-PARTY-NOTICES.md'), text);
    console.error(`built dist/THIRD-PARTY-NOTICES.md (${packages} packages)`);
  } catch (err) {
    failed++;
    console.error(`build: dist/THIRD-PARTY-NOTICES.md: ${err instanceof Error ? err.message : String(err)}`);
  }
}
// V8's code cache of the CLI (dist/cli.js.cache, read by bin/run-bundle.js): made by a training
// run, `eval --format json` on the example notes, so that it holds the code that parses,
// evaluates and writes a note. Without it the CLI still runs, only starting a little slower, so a
// failed training run warns.
const cliBundle = join(outdir, 'cli.js');
const cliCache = `${cliBundle}.cache`;
rmSync(cliCache, { force: true });
if (failed === 0 && existsSync(cliBundle)) {
  const examples = readdirSync(join(root, 'examples'))
    .filter((f) => f.endsWith('.md'))
    .map((f) => join(root, 'examples', f));
  const run = spawnSync(
    process.execPath,
    [join(root, 'scripts', 'train-code-cache.cjs'), 'eval', '--format', 'json', ...examples],
    {
      cwd: root,
      env: { ...process.env, DEWMARK_TRAIN_BUNDLE: cliBundle, DEWMARK_CODE_CACHE_OUT: cliCache, DEWMARK_WORKERS: '0' },
      stdio: ['ignore', 'ignore', 'pipe'],
      encoding: 'utf8',
      timeout: 60_000,
    },
  );
  if (existsSync(cliCache)) console.error(`built ${relative(root, cliCache)}`);
  else {
    const why = run.error
      ? run.error.message
      : `${run.status ?? run.signal}: ${run.stderr.trim().split('\n')[0] ?? ''}`;
    console.warn(`build: no code cache for the CLI (training run ended with ${why}); it starts a little slower`);
  }
}
if (failed > 0) {
  if (lenient) console.warn(`build: ${failed} bundle(s) not built; run npm run build for details`);
  else process.exitCode = 1;
}

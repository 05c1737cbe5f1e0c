/**
 * esbuild settings of the web build (scripts/build.mjs; the manifest's `browser` entry): bundles
 * for the browser, and a build that fails when anything in them imports a Node built-in module —
 * a browser has none, and esbuild would otherwise quietly take a package's browser stand-in or
 * leave a `require` that fails at run time. The feature files of the server and the client import
 * the `/node` entries of vscode-languageserver and vscode-languageclient for types and constants
 * that their `/browser` entries export too; the web bundles take those from `/browser`.
 */
import { builtinModules } from 'node:module';
import { relative } from 'node:path';

/** Node's built-in modules, with and without the `node:` prefix. */
export const NODE_BUILTINS = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));

/**
 * The esbuild options of a web bundle (entry, outfile and externals are the caller's).
 * @param {{ root: string, version: string, format: 'iife' | 'cjs' }} o
 */
export function webOptions({ root, version, format }) {
  return {
    bundle: true,
    platform: 'browser',
    format,
    target: 'es2022',
    sourcemap: false,
    legalComments: 'none',
    metafile: true,
    logLevel: 'warning',
    define: { __DEWMARK_VERSION__: JSON.stringify(version) },
    plugins: [
      {
        name: 'dewmark-browser-only',
        setup(b) {
          b.onResolve({ filter: /^vscode-language(server|client)\/node$/ }, (args) =>
            b.resolve(args.path.replace(/\/node$/, '/browser'), {
              kind: args.kind,
              resolveDir: args.resolveDir,
              importer: args.importer,
            }),
          );
          b.onResolve({ filter: /^[a-z:_/]+$/ }, (args) => {
            if (!NODE_BUILTINS.has(args.path)) return undefined;
            return {
              errors: [
                {
                  text:
                    `the web build may not use the Node module '${args.path}' (imported ` +
                    `by ${relative(root, args.importer)}): a browser has none. Keep ` +
                    `Node-only code out of the files the web entries import (the server's ` +
                    `host seam: server/src/nodeHost.ts; the client's: client/src/node.ts).`,
                },
              ],
            };
          });
        },
      },
    ],
  };
}

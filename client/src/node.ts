/**
 * The extension's `main` entry (dist/client.js), for VS Code with a Node extension host (desktop,
 * remote, code-server): the language server is the Node bundle dist/server.js, started over node
 * IPC with the Node options that bound its heap slack (@dewmark/protocol, nodeOptions.ts, says
 * why). Everything else is ./extension.ts, shared with the browser entry (./web.ts).
 */
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type * as vscode from 'vscode';
import { LanguageClient, TransportKind, type ServerOptions } from 'vscode-languageclient/node';
import { SERVER_EXEC_ARGV } from '@dewmark/protocol';
import { activateWith, DOCUMENT_SCHEMES, type DewmarkApi, type ServerLauncher } from './extension';

export { deactivate } from './extension';

/** Env var naming a file where the extension writes its activation timings (tests and benchmarks). */
export const ACTIVATION_MARKER_ENV = 'DEWMARK_ACTIVATION_MARKER';

/** Starts dist/server.js in a Node process of its own. */
function nodeLauncher(context: vscode.ExtensionContext): ServerLauncher {
  const serverModule = context.asAbsolutePath(join('dist', 'server.js'));
  return {
    problem: () =>
      existsSync(serverModule)
        ? null
        : `the bundled language server is missing (${serverModule}). Reinstall ` +
          `the extension, or run "npm run build" in a development checkout.`,
    schemes: DOCUMENT_SCHEMES,
    createClient(id, name, options) {
      const serverOptions: ServerOptions = {
        run: { module: serverModule, transport: TransportKind.ipc, options: { execArgv: [...SERVER_EXEC_ARGV] } },
        debug: {
          module: serverModule,
          transport: TransportKind.ipc,
          options: { execArgv: [...SERVER_EXEC_ARGV, '--nolazy', '--inspect=6019'] },
        },
      };
      return new LanguageClient(id, name, serverOptions, options);
    },
    marker(data) {
      const path = process.env[ACTIVATION_MARKER_ENV];
      if (!path) return;
      try {
        writeFileSync(path, `${JSON.stringify(data)}\n`);
      } catch {
        // A marker is a test aid only; failing to write it must not disturb the user.
      }
    },
  };
}

/** Called by VS Code when a Markdown document opens (activation event `onLanguage:markdown`). */
export function activate(context: vscode.ExtensionContext): DewmarkApi {
  return activateWith(context, nodeLauncher(context));
}

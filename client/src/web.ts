/**
 * The extension's `browser` entry (dist/web/client.js), for the browser-based editor's web worker
 * extension host: the language server is the web build dist/web/server.js, run in a Web Worker
 * and spoken to over its messages. That server has no file system: it works on the documents
 * this client opens, asks this client for the project files `dewmark.json` (read here through
 * `workspace.fs`, the editor's own file system), and has no workspace check ("Check All Notes"
 * says so). Everything else is ./extension.ts, shared with the Node entry (./node.ts).
 */
import * as vscode from 'vscode';
import { BrowserMessageReader, BrowserMessageWriter, LanguageClient } from 'vscode-languageclient/browser';
import { READ_FILES_MAX, READ_FILES_METHOD, type ReadFilesParams, type ReadFilesResult } from '@dewmark/protocol';
import { activateWith, DOCUMENT_SCHEMES, type DewmarkApi, type ServerLauncher } from './extension';

export { deactivate } from './extension';

/** The web build of the language server, inside the extension. */
export const WEB_SERVER_PATH = 'dist/web/server.js';

/**
 * URI schemes of the notes the web build's server is given: the Node build's, and the notes of a
 * remote folder when the extension runs in the browser beside a remote (code-server).
 */
export const WEB_DOCUMENT_SCHEMES: readonly string[] = [...DOCUMENT_SCHEMES, 'vscode-remote'];

/** The Web Worker API as used here (the extension host's global `Worker`). */
interface WebWorker {
  terminate(): void;
}
declare const Worker: new (url: string, options?: { name?: string }) => WebWorker;

/**
 * Starts the server's worker. An extension served over http(s) (the editor's gallery) is loaded by
 * its URL; one installed beside a remote has a `vscode-remote:` location, from which the editor
 * does not start workers, so its script is read through `workspace.fs` and started from a blob.
 */
async function startWorker(extensionUri: vscode.Uri): Promise<WebWorker> {
  const script = vscode.Uri.joinPath(extensionUri, WEB_SERVER_PATH);
  const options = { name: 'Dewmark language server' };
  if (script.scheme === 'http' || script.scheme === 'https') return new Worker(script.toString(true), options);
  const bytes = await vscode.workspace.fs.readFile(script);
  const url = URL.createObjectURL(new Blob([bytes], { type: 'application/javascript' }));
  return new Worker(url, options);
}

/** The texts of the files at `uris` (null for each one that is not there or cannot be read). */
async function readFiles(params: ReadFilesParams): Promise<ReadFilesResult> {
  const uris = Array.isArray(params?.uris) ? params.uris.slice(0, READ_FILES_MAX) : [];
  const decoder = new TextDecoder('utf-8');
  const texts = await Promise.all(
    uris.map(async (uri) => {
      try {
        return decoder.decode(await vscode.workspace.fs.readFile(vscode.Uri.parse(uri, true)));
      } catch {
        return null; // not there (the usual case: most folders have no project file), or unreadable
      }
    }),
  );
  return { texts };
}

/** Starts dist/web/server.js in a Web Worker. */
function webLauncher(context: vscode.ExtensionContext): ServerLauncher {
  let worker: WebWorker | undefined;
  return {
    problem: () => null,
    schemes: WEB_DOCUMENT_SCHEMES,
    createClient(id, name, options) {
      const client = new LanguageClient(
        id,
        name,
        async () => {
          // A restart starts a new worker; the old one has closed itself after `exit`, or is ended here.
          worker?.terminate();
          worker = await startWorker(context.extensionUri);
          return {
            reader: new BrowserMessageReader(worker as never),
            writer: new BrowserMessageWriter(worker as never),
          };
        },
        options,
      );
      client.onRequest(READ_FILES_METHOD, readFiles);
      context.subscriptions.push({ dispose: () => worker?.terminate() });
      return client;
    },
  };
}

/** Called by the editor when a Markdown document opens (activation event `onLanguage:markdown`). */
export function activate(context: vscode.ExtensionContext): DewmarkApi {
  return activateWith(context, webLauncher(context));
}

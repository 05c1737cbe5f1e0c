/**
 * The web build of the language server (dist/web/server.js): the same server (./server) in a Web
 * Worker of the browser-based editor, speaking LSP over the worker's messages. It has no file
 * system: it works on the documents the client opens, reads the project files `dewmark.json`
 * through the client (./clientProjectFiles), and offers no workspace check (its client says so
 * when asked). Built with esbuild for the browser; the build fails if a Node module gets in.
 */
import { BrowserMessageReader, BrowserMessageWriter, createConnection } from 'vscode-languageserver/browser';
import { ClientProjectFiles } from './clientProjectFiles';
import { ShutdownGate } from './lifecycle';
import { startServer } from './server';

/** The parts of a dedicated worker's global scope used here. */
interface WorkerScope {
  postMessage(message: unknown): void;
  close(): void;
}

const scope = globalThis as unknown as WorkerScope;
const gate = new ShutdownGate();
const connection = createConnection(
  new BrowserMessageReader(scope as never),
  new BrowserMessageWriter(scope as never),
  gate.options,
);
// A worker has no process to exit: after `exit` it closes itself (its client also terminates it).
connection.onExit(() => scope.close());
startServer(connection, gate, (folders, conn) => ({ projectFiles: new ClientProjectFiles(conn, folders) }));

/**
 * The Dewmark language server: LSP glue over the pure language service of `@dewmark/core`.
 * Speaks LSP over `--stdio`, node IPC (`--node-ipc`), `--socket=PORT` or `--pipe=NAME`.
 * It reads open documents as the client sends them (and Markdown files only on an explicit
 * workspace check); it never writes files or opens network connections of its own. The wiring
 * is shared with the web build (./server); this file and ./nodeHost are the Node server's own.
 */
// First, so that it holds while every other module initialises (see its comment).
import './tierUp';
import { createConnection } from 'vscode-languageserver/node';
import { limitHeapSlack } from './heap';
import { ShutdownGate } from './lifecycle';
import { nodeHost } from './nodeHost';
import { SERVER_VERSION, startServer } from './server';

export { SERVER_VERSION, serverCapabilities } from './server';

const USAGE = `Usage: dewmark-language-server --stdio | --node-ipc | --socket=PORT | --pipe=NAME

The Dewmark language server speaks the Language Server Protocol to an editor. Start it from the
editor's LSP configuration with one of the transports above (--stdio for most editors).`;

/** Starts the server on the transport named by the command line. */
export function main(argv: readonly string[]): void {
  if (argv.includes('--version') || argv.includes('-v')) {
    process.stdout.write(`${SERVER_VERSION}\n`);
    return;
  }
  const transport = argv.some(
    (a) => a === '--stdio' || a === '--node-ipc' || a.startsWith('--socket') || a.startsWith('--pipe'),
  );
  if (argv.includes('--help') || argv.includes('-h') || !transport) {
    (transport ? process.stdout : process.stderr).write(`${USAGE}\n`);
    if (!argv.includes('--help') && !argv.includes('-h')) process.exitCode = 2;
    return;
  }

  limitHeapSlack();
  const gate = new ShutdownGate();
  startServer(createConnection(gate.options), gate, () => nodeHost());
}

main(process.argv.slice(2));

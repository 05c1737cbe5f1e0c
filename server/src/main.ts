/**
 * The Dewmark language server: LSP glue over the pure language service of `@dewmark/core`.
 * Speaks LSP over `--stdio`, node IPC (`--node-ipc`), `--socket=PORT` or `--pipe=NAME`.
 * It reads open documents as the client sends them (and Markdown files only on an explicit
 * workspace check); it never writes files or opens network connections of its own.
 */
import {
  createConnection,
  TextDocumentSyncKind,
  type InitializeResult,
  type ServerCapabilities,
} from 'vscode-languageserver/node';
import { registerCheckWorkspace } from './checkWorkspace';
import { registerCodeActions, CODE_ACTION_KINDS } from './codeActions';
import { COMPLETION_TRIGGERS, registerCompletion } from './completion';
import { Configuration } from './configuration';
import { readClientFeatures, type ServerContext } from './context';
import { Diagnostics } from './diagnostics';
import { NoteStore } from './documents';
import { registerHover } from './hover';
import { registerInlayHints } from './inlayHints';
import { limitHeapSlack } from './heap';
import { ShutdownGate } from './lifecycle';
import { registerNavigation } from './navigation';
import { registerNoteStatus } from './noteStatus';
import { EXECUTE_COMMANDS, registerResultsTable } from './resultsTable';
import { CHECK_WORKSPACE_METHOD, NOTE_STATUS_METHOD } from '@dewmark/protocol';
import { registerSymbols } from './symbols';

const USAGE = `Usage: dewmark-language-server --stdio | --node-ipc | --socket=PORT | --pipe=NAME

The Dewmark language server speaks the Language Server Protocol to an editor. Start it from the
editor's LSP configuration with one of the transports above (--stdio for most editors).`;

/** Replaced by the package version when bundled (scripts/build.mjs). */
declare const __DEWMARK_VERSION__: string | undefined;

/** The server's version, as bundled. */
export const SERVER_VERSION: string = typeof __DEWMARK_VERSION__ === 'string' ? __DEWMARK_VERSION__ : '0.0.0-dev';

/** Capabilities the server implements, adapted to what the client can use. */
export function serverCapabilities(ctx: ServerContext): ServerCapabilities {
  const caps: ServerCapabilities = {
    textDocumentSync: { openClose: true, change: TextDocumentSyncKind.Incremental },
    hoverProvider: true,
    inlayHintProvider: { resolveProvider: false },
    completionProvider: { triggerCharacters: COMPLETION_TRIGGERS, resolveProvider: false },
    documentSymbolProvider: { label: 'Dewmark' },
    definitionProvider: true,
    referencesProvider: true,
    renameProvider: ctx.client.prepareRename ? { prepareProvider: true } : true,
    codeActionProvider: { codeActionKinds: CODE_ACTION_KINDS, resolveProvider: false },
    executeCommandProvider: { commands: EXECUTE_COMMANDS },
    workspace: { workspaceFolders: { supported: true, changeNotifications: true } },
    experimental: { dewmark: { checkWorkspace: CHECK_WORKSPACE_METHOD, noteStatus: NOTE_STATUS_METHOD } },
  };
  if (ctx.client.pullDiagnostics) {
    caps.diagnosticProvider = { identifier: 'dewmark', interFileDependencies: false, workspaceDiagnostics: false };
  }
  return caps;
}

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
  const connection = createConnection(gate.options);
  gate.register(connection);
  const config = new Configuration(connection);
  const notes = new NoteStore(config);
  const ctx: ServerContext = {
    connection,
    notes,
    config,
    client: readClientFeatures({}),
    folders: [],
  };
  config.folders = () => ctx.folders;
  const diagnostics = new Diagnostics(ctx);

  let folderEvents = false;
  connection.onInitialize((params): InitializeResult => {
    ctx.client = readClientFeatures(params.capabilities);
    config.initialize(params);
    folderEvents = params.capabilities.workspace?.workspaceFolders === true;
    if (params.workspaceFolders) ctx.folders = params.workspaceFolders.map((f) => f.uri);
    else if (params.rootUri) ctx.folders = [params.rootUri];
    return {
      capabilities: serverCapabilities(ctx),
      serverInfo: { name: 'dewmark-language-server', version: SERVER_VERSION },
    };
  });
  connection.onInitialized(() => {
    config.initialized();
    if (folderEvents) {
      connection.workspace.onDidChangeWorkspaceFolders((e) => {
        const removed = new Set(e.removed.map((f) => f.uri));
        ctx.folders = [...ctx.folders.filter((f) => !removed.has(f)), ...e.added.map((f) => f.uri)];
      });
    }
  });

  diagnostics.register();
  registerHover(ctx);
  registerInlayHints(ctx);
  registerCompletion(ctx);
  registerSymbols(ctx);
  registerNavigation(ctx);
  registerCodeActions(ctx);
  registerCheckWorkspace(ctx, diagnostics);
  registerNoteStatus(ctx);
  registerResultsTable(ctx);

  notes.listen(connection);
  connection.listen();
}

main(process.argv.slice(2));

/**
 * The language server's wiring, shared by its two builds: the Node server (./main: stdio, node
 * IPC, socket or pipe; `dewmark-language-server`) and the web build (./browserMain: a Web Worker
 * in the browser-based editor). What differs between them is the {@link ServerHost}: where the
 * project files come from, and whether the workspace can be checked. Everything else — every
 * feature on open documents — is the same code.
 */
import { TextDocumentSyncKind, type InitializeResult, type ServerCapabilities } from 'vscode-languageserver/node';
import { registerCodeActions, CODE_ACTION_KINDS } from './codeActions';
import { COMPLETION_TRIGGERS, registerCompletion } from './completion';
import { Configuration } from './configuration';
import { readClientFeatures, type ServerContext } from './context';
import { Diagnostics } from './diagnostics';
import { NoteStore } from './documents';
import { registerHover } from './hover';
import { registerInlayHints } from './inlayHints';
import type { ShutdownGate } from './lifecycle';
import { registerNavigation } from './navigation';
import { registerNoteStatus } from './noteStatus';
import type { ProjectFiles } from './projectFiles';
import { EXECUTE_COMMANDS, registerResultsTable } from './resultsTable';
import { CHECK_WORKSPACE_METHOD, NOTE_STATUS_METHOD } from '@dewmark/protocol';
import { registerSymbols } from './symbols';

/** Replaced by the package version when bundled (scripts/build.mjs). */
declare const __DEWMARK_VERSION__: string | undefined;

/** The server's version, as bundled. */
export const SERVER_VERSION: string = typeof __DEWMARK_VERSION__ === 'string' ? __DEWMARK_VERSION__ : '0.0.0-dev';

/** What a build of the server can reach beyond the open documents. */
export interface ServerHost {
  /** Where the project files `dewmark.json` are read from. */
  projectFiles: ProjectFiles;
  /** Registers the workspace check (`dewmark/checkWorkspace`); absent where there is no file system to search. */
  registerCheckWorkspace?: (ctx: ServerContext, diagnostics: Diagnostics) => void;
}

/** Capabilities the server implements, adapted to what the client can use. */
export function serverCapabilities(ctx: ServerContext, checkWorkspace = true): ServerCapabilities {
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
    experimental: {
      dewmark: checkWorkspace
        ? { checkWorkspace: CHECK_WORKSPACE_METHOD, noteStatus: NOTE_STATUS_METHOD }
        : { noteStatus: NOTE_STATUS_METHOD },
    },
  };
  if (ctx.client.pullDiagnostics) {
    caps.diagnosticProvider = { identifier: 'dewmark', interFileDependencies: false, workspaceDiagnostics: false };
  }
  return caps;
}

/**
 * Registers every handler on `connection` (made with `gate.options`, its shutdown gate) and starts
 * listening. `makeHost` is given the workspace folders (as they are at each call) and the connection.
 */
export function startServer(
  connection: ServerContext['connection'],
  gate: ShutdownGate,
  makeHost: (folders: () => readonly string[], connection: ServerContext['connection']) => ServerHost,
): void {
  gate.register(connection);
  const host = makeHost(() => ctx.folders, connection);
  const config = new Configuration(connection, host.projectFiles);
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
      capabilities: serverCapabilities(ctx, host.registerCheckWorkspace !== undefined),
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
  host.registerCheckWorkspace?.(ctx, diagnostics);
  registerNoteStatus(ctx);
  registerResultsTable(ctx);

  notes.listen(connection);
  connection.listen();
}

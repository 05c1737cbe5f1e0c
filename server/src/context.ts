/**
 * What every feature handler of the server shares: the connection, the open notes, the settings,
 * and the client's capabilities as read once at initialize.
 */
import type { ClientCapabilities, Connection } from 'vscode-languageserver/node';
import type { Configuration } from './configuration';
import type { NoteStore } from './documents';

/** The client capabilities the server adapts to (read once at initialize). */
export interface ClientFeatures {
  /** `textDocument/diagnostic` (pull, 3.17); when false, diagnostics are pushed. */
  pullDiagnostics: boolean;
  relatedInformation: boolean;
  hierarchicalSymbols: boolean;
  prepareRename: boolean;
  /** `window/workDoneProgress/create`. */
  workDoneProgress: boolean;
  inlayHintRefresh: boolean;
  diagnosticRefresh: boolean;
  /** `workspace/workspaceEdit.documentChanges` (versioned edits). */
  documentChanges: boolean;
  /** Hover content as Markdown (otherwise plain text). */
  markdownHover: boolean;
  /** Completion documentation as Markdown. */
  markdownCompletion: boolean;
}

/** Reads the client capabilities the server adapts to. */
export function readClientFeatures(caps: ClientCapabilities): ClientFeatures {
  const td = caps.textDocument;
  return {
    pullDiagnostics: td?.diagnostic !== undefined,
    relatedInformation: td?.publishDiagnostics?.relatedInformation === true || td?.diagnostic !== undefined,
    hierarchicalSymbols: td?.documentSymbol?.hierarchicalDocumentSymbolSupport === true,
    prepareRename: td?.rename?.prepareSupport === true,
    workDoneProgress: caps.window?.workDoneProgress === true,
    inlayHintRefresh: caps.workspace?.inlayHint?.refreshSupport === true,
    diagnosticRefresh: caps.workspace?.diagnostics?.refreshSupport === true,
    documentChanges: caps.workspace?.workspaceEdit?.documentChanges === true,
    markdownHover: td?.hover?.contentFormat?.includes('markdown') ?? true,
    markdownCompletion: td?.completion?.completionItem?.documentationFormat?.includes('markdown') ?? true,
  };
}

/** The shared state every feature handler receives. */
export interface ServerContext {
  connection: Connection;
  notes: NoteStore;
  config: Configuration;
  /** Set at initialize. */
  client: ClientFeatures;
  /** Workspace folder URIs (from initialize; updated on folder changes when supported). */
  folders: string[];
}

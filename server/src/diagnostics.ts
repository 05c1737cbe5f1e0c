/**
 * Diagnostics, both ways: pulled (`textDocument/diagnostic`, 3.17, with a `resultId`) when the
 * client supports it, otherwise pushed (`textDocument/publishDiagnostics` with the document
 * version) after every change. Changes that arrive together are analysed once, for the latest text.
 */
import {
  DiagnosticSeverity,
  DocumentDiagnosticReportKind,
  type Diagnostic,
  type DocumentDiagnosticReport,
} from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { noteDiagnostics, type CoreDiagnostic, type Note } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toRange } from './convert';
import { DIAGNOSTIC_SOURCE } from '@dewmark/protocol';
import { noteForRequest, runSafe } from './safe';
import { later } from './turn';

const SEVERITY: Record<CoreDiagnostic['severity'], DiagnosticSeverity> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  info: DiagnosticSeverity.Information,
};

/** The LSP form of the core's diagnostics for one document. */
export function toLspDiagnostics(ctx: ServerContext, doc: TextDocument, note: Note): Diagnostic[] {
  return noteDiagnostics(note).map((d) => toLspDiagnostic(ctx, doc, d));
}

/** The LSP form of one core diagnostic (code, source, related places and fix data kept). */
export function toLspDiagnostic(ctx: ServerContext, doc: TextDocument, d: CoreDiagnostic): Diagnostic {
  const out: Diagnostic = {
    range: toRange(doc, d.span),
    severity: SEVERITY[d.severity],
    code: d.code,
    source: DIAGNOSTIC_SOURCE,
    message: d.message,
  };
  if (d.related && d.related.length > 0) {
    if (ctx.client.relatedInformation) {
      out.relatedInformation = d.related.map((r) => ({
        location: { uri: doc.uri, range: toRange(doc, r.span) },
        message: r.message,
      }));
    } else {
      const lines = d.related.map((r) => `line ${doc.positionAt(r.span.start).line + 1}: ${r.message}`);
      out.message = `${d.message}\n${lines.join('\n')}`;
    }
  }
  if (d.data !== undefined) out.data = d.data;
  return out;
}

/** Pushes or answers pulls for diagnostics. */
export class Diagnostics {
  private readonly pending = new Set<string>();
  private scheduled = false;
  /** Closed files that got pushed diagnostics from a workspace check. */
  private readonly pushedClosed = new Set<string>();

  constructor(private readonly ctx: ServerContext) {}

  /** Wires the handlers: document events, settings changes and the pull request. */
  register(): void {
    const { connection, notes, config } = this.ctx;
    notes.documents.onDidOpen((e) => {
      if (this.ctx.client.pullDiagnostics && this.pushedClosed.delete(e.document.uri)) {
        void connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] });
      }
    });
    notes.documents.onDidChangeContent((e) => {
      if (!this.ctx.client.pullDiagnostics) this.schedule(e.document.uri);
    });
    notes.documents.onDidClose((e) => {
      this.pending.delete(e.document.uri);
      if (!this.ctx.client.pullDiagnostics) void connection.sendDiagnostics({ uri: e.document.uri, diagnostics: [] });
    });
    config.onDidChange(() => {
      if (this.ctx.client.pullDiagnostics) {
        if (this.ctx.client.diagnosticRefresh) void connection.languages.diagnostics.refresh().catch(() => undefined);
      } else {
        for (const doc of notes.documents.all()) this.schedule(doc.uri);
      }
    });
    connection.languages.diagnostics.on((params, token) =>
      runSafe(connection, 'textDocument/diagnostic', token, async (): Promise<DocumentDiagnosticReport> => {
        const found = await noteForRequest(this.ctx, params.textDocument.uri, token);
        if (!found) return { kind: DocumentDiagnosticReportKind.Full, items: [] };
        const resultId = `${found.doc.version}.${config.generation}`;
        if (params.previousResultId === resultId) return { kind: DocumentDiagnosticReportKind.Unchanged, resultId };
        return {
          kind: DocumentDiagnosticReportKind.Full,
          resultId,
          items: toLspDiagnostics(this.ctx, found.doc, found.note),
        };
      }),
    );
  }

  /** Queues a push for `uri`; changes that arrive before it runs are analysed together. */
  schedule(uri: string): void {
    this.pending.add(uri);
    if (this.scheduled) return;
    this.scheduled = true;
    later(() => {
      this.scheduled = false;
      const uris = [...this.pending];
      this.pending.clear();
      for (const u of uris) void this.push(u);
    });
  }

  /** Records that a closed file got pushed diagnostics (so opening it in a pull client clears them). */
  pushedForClosed(uri: string): void {
    this.pushedClosed.add(uri);
  }

  /**
   * Clears what a workspace check pushed for a closed file that
   * is no longer checked (its project file now leaves it out).
   */
  clearClosed(uri: string): void {
    if (this.pushedClosed.delete(uri)) void this.ctx.connection.sendDiagnostics({ uri, diagnostics: [] });
  }

  private async push(uri: string): Promise<void> {
    try {
      const found = await this.ctx.notes.get(uri);
      if (!found) return;
      const current = this.ctx.notes.document(uri);
      if (!current || current.version !== found.doc.version) return; // a newer change is queued
      await this.ctx.connection.sendDiagnostics({
        uri,
        version: found.doc.version,
        diagnostics: toLspDiagnostics(this.ctx, found.doc, found.note),
      });
    } catch (err) {
      this.ctx.connection.console.error(
        `diagnostics for ${uri} failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`,
      );
    }
  }
}

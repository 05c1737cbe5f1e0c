/** `textDocument/documentSymbol`: states, mixes and processes under the Markdown headings. */
import { SymbolKind, type DocumentSymbol, type SymbolInformation } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { documentSymbols, type OutlineSymbol } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toRange } from './convert';
import { noteForRequest, runSafe } from './safe';

const KIND: Record<OutlineSymbol['kind'], SymbolKind> = {
  heading: SymbolKind.String,
  state: SymbolKind.Variable,
  mix: SymbolKind.Operator,
  process: SymbolKind.Function,
  supply: SymbolKind.Variable,
  site: SymbolKind.Constant,
};

function toDocumentSymbol(doc: TextDocument, s: OutlineSymbol): DocumentSymbol {
  const out: DocumentSymbol = {
    name: s.name,
    kind: KIND[s.kind],
    range: toRange(doc, s.span),
    selectionRange: toRange(doc, s.selectionSpan),
  };
  if (s.detail) out.detail = s.detail;
  if (s.children.length > 0) out.children = s.children.map((c) => toDocumentSymbol(doc, c));
  return out;
}

function flatten(
  doc: TextDocument,
  symbols: OutlineSymbol[],
  container: string | undefined,
  out: SymbolInformation[],
): void {
  for (const s of symbols) {
    const info: SymbolInformation = {
      name: s.name,
      kind: KIND[s.kind],
      location: { uri: doc.uri, range: toRange(doc, s.span) },
    };
    if (container !== undefined) info.containerName = container;
    out.push(info);
    flatten(doc, s.children, s.name, out);
  }
}

/** Registers the document-symbol handler (hierarchical when the client supports it, flat otherwise). */
export function registerSymbols(ctx: ServerContext): void {
  ctx.connection.onDocumentSymbol((params, token) =>
    runSafe(
      ctx.connection,
      'textDocument/documentSymbol',
      token,
      async (): Promise<DocumentSymbol[] | SymbolInformation[] | null> => {
        const found = await noteForRequest(ctx, params.textDocument.uri, token);
        if (!found) return null;
        const symbols = documentSymbols(found.note, token);
        if (ctx.client.hierarchicalSymbols) return symbols.map((s) => toDocumentSymbol(found.doc, s));
        const flat: SymbolInformation[] = [];
        flatten(found.doc, symbols, undefined, flat);
        return flat;
      },
    ),
  );
}

/** Conversions between the core's UTF-16 offsets and LSP positions and ranges. */
import type { Range, TextEdit } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Edit, Span } from '@dewmark/core/service';

/** The LSP range of a span of `doc`. */
export function toRange(doc: TextDocument, span: Span): Range {
  return { start: doc.positionAt(span.start), end: doc.positionAt(span.end) };
}

/** The span of an LSP range of `doc`. */
export function toSpan(doc: TextDocument, range: Range): Span {
  return { start: doc.offsetAt(range.start), end: doc.offsetAt(range.end) };
}

/** LSP text edits for the core's edits. */
export function toTextEdits(doc: TextDocument, edits: readonly Edit[]): TextEdit[] {
  return edits.map((e) => ({ range: toRange(doc, e.span), newText: e.newText }));
}

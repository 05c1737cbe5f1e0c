/** `textDocument/hover`: the service's Markdown for the name, key, unit or statement under the cursor. */
import { MarkupKind, type Hover } from 'vscode-languageserver/node';
import { hover, hoverPlainText } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toRange } from './convert';
import { noteForRequest, runSafe } from './safe';

/** Registers the hover handler. */
export function registerHover(ctx: ServerContext): void {
  ctx.connection.onHover((params, token) =>
    runSafe(ctx.connection, 'textDocument/hover', token, async (): Promise<Hover | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const result = hover(found.note, found.doc.offsetAt(params.position), token);
      if (!result) return null;
      return {
        // A client that does not take Markdown gets aligned plain text, not raw pipes and asterisks.
        contents: ctx.client.markdownHover
          ? { kind: MarkupKind.Markdown, value: result.markdown }
          : { kind: MarkupKind.PlainText, value: hoverPlainText(result.markdown) },
        range: toRange(found.doc, result.span),
      };
    }),
  );
}

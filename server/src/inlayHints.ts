/** `textDocument/inlayHint`: computed properties after each statement in the requested range. */
import { MarkupKind, type InlayHint } from 'vscode-languageserver/node';
import { inlayHints } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toSpan } from './convert';
import { noteForRequest, runSafe } from './safe';

/** Registers the inlay-hint handler (no resolve step: hints arrive complete). */
export function registerInlayHints(ctx: ServerContext): void {
  ctx.connection.languages.inlayHint.on((params, token) =>
    runSafe(ctx.connection, 'textDocument/inlayHint', token, async (): Promise<InlayHint[] | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const { doc } = found;
      return inlayHints(found.note, toSpan(doc, params.range), token).map((h) => ({
        position: doc.positionAt(h.offset),
        label: h.label,
        paddingLeft: true,
        tooltip: { kind: MarkupKind.Markdown, value: h.tooltip },
      }));
    }),
  );
  ctx.config.onDidChange(() => {
    if (ctx.client.inlayHintRefresh) void ctx.connection.languages.inlayHint.refresh().catch(() => undefined);
  });
}

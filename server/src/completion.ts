/** `textDocument/completion`: keywords, property keys, units after a number, earlier state names. */
import { CompletionItemKind, MarkupKind, type CompletionItem, type CompletionList } from 'vscode-languageserver/node';
import { completions, type CompletionEntry } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toRange } from './convert';
import { noteForRequest, runSafe } from './safe';

const KIND: Record<CompletionEntry['kind'], CompletionItemKind> = {
  keyword: CompletionItemKind.Keyword,
  key: CompletionItemKind.Property,
  unit: CompletionItemKind.Unit,
  name: CompletionItemKind.Reference,
  value: CompletionItemKind.EnumMember,
};

/** Characters after which the client should ask for completions without a word being typed. */
export const COMPLETION_TRIGGERS = ['>', '+', ':'];

/** Registers the completion handler (items arrive complete; no resolve step). */
export function registerCompletion(ctx: ServerContext): void {
  ctx.connection.onCompletion((params, token) =>
    runSafe(ctx.connection, 'textDocument/completion', token, async (): Promise<CompletionList | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const { doc } = found;
      const result = completions(found.note, doc.offsetAt(params.position), token);
      if (!result) return null;
      const range = toRange(doc, result.replace);
      const items = result.items.map((e, i): CompletionItem => {
        const item: CompletionItem = {
          label: e.label,
          kind: KIND[e.kind],
          textEdit: { range, newText: e.insertText },
          sortText: String(i).padStart(4, '0'),
          filterText: e.filterText ?? e.label,
        };
        if (e.detail) item.detail = e.detail;
        if (e.documentation) {
          item.documentation = ctx.client.markdownCompletion
            ? { kind: MarkupKind.Markdown, value: e.documentation }
            : e.documentation;
        }
        return item;
      });
      return { isIncomplete: false, items };
    }),
  );
}

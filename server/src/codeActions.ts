/** `textDocument/codeAction`: quick fixes keyed on diagnostic codes, and the unit-system rewrite. */
import { CodeActionKind, type CodeAction, type Diagnostic } from 'vscode-languageserver/node';
import { codeActions } from '../../shared-core/src/service';
import type { ServerContext } from './context';
import { toSpan, toTextEdits } from './convert';
import { DIAGNOSTIC_SOURCE } from './protocol';
import { noteForRequest, runSafe } from './safe';

/** The code-action kinds the server offers. */
export const CODE_ACTION_KINDS = [CodeActionKind.QuickFix, CodeActionKind.RefactorRewrite];

function sameRange(a: Diagnostic, b: { start: { line: number; character: number }; end: { line: number; character: number } }): boolean {
  return (
    a.range.start.line === b.start.line &&
    a.range.start.character === b.start.character &&
    a.range.end.line === b.end.line &&
    a.range.end.character === b.end.character
  );
}

/** Registers the code-action handler. */
export function registerCodeActions(ctx: ServerContext): void {
  ctx.connection.onCodeAction((params, token) =>
    runSafe(ctx.connection, 'textDocument/codeAction', token, async (): Promise<CodeAction[] | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const { doc } = found;
      const only = params.context.only;
      const actions = codeActions(found.note, toSpan(doc, params.range), token);
      const out: CodeAction[] = [];
      for (const a of actions) {
        const kind = a.kind === 'quickfix' ? CodeActionKind.QuickFix : CodeActionKind.RefactorRewrite;
        if (only && !only.some((o) => kind === o || kind.startsWith(`${o}.`))) continue;
        const action: CodeAction = { title: a.title, kind, edit: { changes: { [doc.uri]: toTextEdits(doc, a.edits) } } };
        if (a.preferred) action.isPreferred = true;
        if (a.diagnostic) {
          const fixes = a.diagnostic;
          const range = { start: doc.positionAt(fixes.span.start), end: doc.positionAt(fixes.span.end) };
          const matching = params.context.diagnostics.filter(
            (d) => d.source === DIAGNOSTIC_SOURCE && d.code === fixes.code && sameRange(d, range),
          );
          if (matching.length > 0) action.diagnostics = matching;
        }
        out.push(action);
      }
      return out;
    }),
  );
}

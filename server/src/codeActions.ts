/**
 * `textDocument/codeAction`: quick fixes keyed on diagnostic codes, the unit-system rewrite, and
 * the source actions that write the results tables (offered when the user asks for actions, or
 * for source actions, not on every cursor move).
 */
import { CodeActionKind, CodeActionTriggerKind, type CodeAction, type Diagnostic } from 'vscode-languageserver/node';
import { codeActions, resultsTableActions, type FixAction } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toSpan, toTextEdits } from './convert';
import { DIAGNOSTIC_SOURCE } from '@dewmark/protocol';
import { noteForRequest, runSafe } from './safe';

/** The kind of the source actions that write results tables. */
export const RESULTS_TABLE_ACTION_KIND = `${CodeActionKind.Source}.dewmark.resultsTable`;

/** The code-action kinds the server offers. */
export const CODE_ACTION_KINDS = [CodeActionKind.QuickFix, CodeActionKind.RefactorRewrite, RESULTS_TABLE_ACTION_KIND];

const KIND: Record<FixAction['kind'], string> = {
  quickfix: CodeActionKind.QuickFix,
  refactor: CodeActionKind.RefactorRewrite,
  source: RESULTS_TABLE_ACTION_KIND,
};

/** True when `kind` is asked for by `only` (a kind matches itself and its sub-kinds). */
function wanted(only: readonly string[] | undefined, kind: string): boolean {
  return !only || only.some((o) => kind === o || kind.startsWith(`${o}.`));
}

function sameRange(
  a: Diagnostic,
  b: { start: { line: number; character: number }; end: { line: number; character: number } },
): boolean {
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
      const span = toSpan(doc, params.range);
      const actions = codeActions(found.note, span, token);
      // Writing tables formats every block: only when asked (invoked, or source actions requested).
      const asked =
        params.context.triggerKind === CodeActionTriggerKind.Invoked ||
        (only?.some((o) => wanted([o], RESULTS_TABLE_ACTION_KIND)) ?? false);
      if (asked && wanted(only, RESULTS_TABLE_ACTION_KIND))
        actions.push(...resultsTableActions(found.note, span, token));
      const out: CodeAction[] = [];
      for (const a of actions) {
        const kind = KIND[a.kind];
        if (!wanted(only, kind)) continue;
        const action: CodeAction = {
          title: a.title,
          kind,
          edit: { changes: { [doc.uri]: toTextEdits(doc, a.edits) } },
        };
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

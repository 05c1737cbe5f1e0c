/**
 * `workspace/executeCommand` {@link RESULTS_TABLE_COMMAND}: the edit that inserts or refreshes
 * the results tables below a note's ` ```air ` blocks, computed by the core. The server answers
 * with the edit and never applies or writes anything itself.
 */
import { ErrorCodes, ResponseError, type WorkspaceEdit } from 'vscode-languageserver/node';
import { countChanges, resultsTableEdits } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toTextEdits } from './convert';
import { RESULTS_TABLE_COMMAND, type ResultsTableParams, type ResultsTableResult } from '@dewmark/protocol';
import { noteForRequest, runSafe } from './safe';

/** The commands this server executes. */
export const EXECUTE_COMMANDS = [RESULTS_TABLE_COMMAND];

function readParams(args: unknown[] | undefined): ResultsTableParams {
  const p = args?.[0] as Partial<ResultsTableParams> | undefined;
  if (!p || typeof p !== 'object' || typeof p.textDocument?.uri !== 'string') {
    throw new ResponseError(
      ErrorCodes.InvalidParams,
      `${RESULTS_TABLE_COMMAND} takes one argument { textDocument: { uri }, position?, all? }`,
    );
  }
  const pos = p.position;
  if (!p.all && (typeof pos?.line !== 'number' || typeof pos.character !== 'number')) {
    throw new ResponseError(
      ErrorCodes.InvalidParams,
      `${RESULTS_TABLE_COMMAND} needs a position (the block there) or all: true (every block)`,
    );
  }
  return p as ResultsTableParams;
}

/** Registers the executeCommand handler. */
export function registerResultsTable(ctx: ServerContext): void {
  ctx.connection.onExecuteCommand((params, token) =>
    runSafe(ctx.connection, 'workspace/executeCommand', token, async (): Promise<ResultsTableResult | null> => {
      if (params.command !== RESULTS_TABLE_COMMAND)
        throw new ResponseError(ErrorCodes.InvalidRequest, `unknown command ${params.command}`);
      const args = readParams(params.arguments);
      const found = await noteForRequest(ctx, args.textDocument.uri, token);
      if (!found) return null;
      const { doc, note } = found;
      const plan = resultsTableEdits(
        note,
        args.all ? { kind: 'all' } : { kind: 'at', offset: doc.offsetAt(args.position!) },
        token,
      );
      const n = countChanges(plan);
      let edit: WorkspaceEdit | null = null;
      if (plan.edits.length > 0) {
        const edits = toTextEdits(doc, plan.edits);
        edit = ctx.client.documentChanges
          ? { documentChanges: [{ textDocument: { uri: doc.uri, version: doc.version }, edits }] }
          : { changes: { [doc.uri]: edits } };
      }
      return {
        edit,
        blocks: plan.changes.length,
        inserted: n.insert,
        refreshed: n.refresh,
        unchanged: n.unchanged,
        unterminated: n.unterminated,
        version: doc.version,
      };
    }),
  );
}

/** `textDocument/definition`, `references`, `prepareRename` and `rename` for state names. */
import { ErrorCodes, ResponseError, type Location, type Range, type WorkspaceEdit } from 'vscode-languageserver/node';
import { definition, prepareRename, references, rename } from '@dewmark/core/service';
import type { ServerContext } from './context';
import { toRange, toTextEdits } from './convert';
import { noteForRequest, runSafe } from './safe';

/** Registers the navigation and rename handlers. */
export function registerNavigation(ctx: ServerContext): void {
  const { connection } = ctx;

  connection.onDefinition((params, token) =>
    runSafe(connection, 'textDocument/definition', token, async (): Promise<Location | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const target = definition(found.note, found.doc.offsetAt(params.position));
      return target ? { uri: found.doc.uri, range: toRange(found.doc, target.nameSpan) } : null;
    }),
  );

  connection.onReferences((params, token) =>
    runSafe(connection, 'textDocument/references', token, async (): Promise<Location[] | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const spans = references(found.note, found.doc.offsetAt(params.position), params.context.includeDeclaration);
      return spans ? spans.map((s) => ({ uri: found.doc.uri, range: toRange(found.doc, s) })) : null;
    }),
  );

  connection.onPrepareRename((params, token) =>
    runSafe(
      connection,
      'textDocument/prepareRename',
      token,
      async (): Promise<{ range: Range; placeholder: string } | null> => {
        const found = await noteForRequest(ctx, params.textDocument.uri, token);
        if (!found) return null;
        const r = prepareRename(found.note, found.doc.offsetAt(params.position));
        if (!r) return null;
        if ('error' in r) throw new ResponseError(ErrorCodes.InvalidRequest, r.error);
        return { range: toRange(found.doc, r.span), placeholder: r.placeholder };
      },
    ),
  );

  connection.onRenameRequest((params, token) =>
    runSafe(connection, 'textDocument/rename', token, async (): Promise<WorkspaceEdit | null> => {
      const found = await noteForRequest(ctx, params.textDocument.uri, token);
      if (!found) return null;
      const r = rename(found.note, found.doc.offsetAt(params.position), params.newName);
      if ('error' in r) throw new ResponseError(ErrorCodes.InvalidRequest, r.error);
      const edits = toTextEdits(found.doc, r.edits);
      if (ctx.client.documentChanges) {
        return { documentChanges: [{ textDocument: { uri: found.doc.uri, version: found.doc.version }, edits }] };
      }
      return { changes: { [found.doc.uri]: edits } };
    }),
  );
}

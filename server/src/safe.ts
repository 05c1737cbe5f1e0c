/**
 * Runs a request handler safely: answers a cancelled request with `RequestCancelled`, a request
 * whose document changed while it waited with `ContentModified`, and a failure with an error
 * naming the request (never an unanswered request, never a crash of the server).
 */
import {
  ErrorCodes,
  LSPErrorCodes,
  ResponseError,
  type CancellationToken,
  type Connection,
} from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Note } from '@dewmark/core/service';
import type { ServerContext } from './context';

/** The answer to a cancelled request. */
export function cancelled(): ResponseError<never> {
  return new ResponseError(LSPErrorCodes.RequestCancelled, 'The request was cancelled.');
}

/** Runs `fn`, honouring `token` before and after it, and turning a thrown error into an error response. */
export async function runSafe<T>(
  connection: Connection,
  what: string,
  token: CancellationToken,
  fn: () => T | Promise<T>,
): Promise<T | ResponseError<never>> {
  if (token.isCancellationRequested) return cancelled();
  try {
    return await fn();
  } catch (err) {
    if (err instanceof ResponseError) return err as ResponseError<never>;
    const message = err instanceof Error ? err.message : String(err);
    connection.console.error(`${what} failed: ${err instanceof Error ? (err.stack ?? message) : message}`);
    return new ResponseError(ErrorCodes.InternalError, `${what} failed: ${message}`);
  }
}

/**
 * Fetches the analysed note for a request on `uri`, or throws the right response error: cancelled
 * while waiting for settings, or the document changed since the request was sent. Null when the
 * document is not open.
 */
export async function noteForRequest(
  ctx: ServerContext,
  uri: string,
  token: CancellationToken,
): Promise<{ doc: TextDocument; note: Note } | null> {
  const before = ctx.notes.document(uri);
  if (!before) return null;
  const version = before.version;
  // A cancellation answers at once, also while a long analysis runs (it goes on for later requests).
  let stop: { dispose(): void } | undefined;
  const cancel = new Promise<'cancelled'>((resolve) => {
    stop = token.onCancellationRequested(() => resolve('cancelled'));
  });
  let found: Awaited<ReturnType<ServerContext['notes']['get']>>;
  try {
    const first = await Promise.race([ctx.notes.get(uri), cancel]);
    if (first === 'cancelled') throw cancelled();
    found = first;
  } finally {
    stop?.dispose();
  }
  if (token.isCancellationRequested) throw cancelled();
  if (!found) return null;
  if (found.doc.version !== version) {
    throw new ResponseError(LSPErrorCodes.ContentModified, 'The document changed while the request waited; ask again.');
  }
  return found;
}

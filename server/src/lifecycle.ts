/**
 * LSP 3.17 life cycle rule the library leaves to servers: once `shutdown` has been answered, every
 * further request is answered with `InvalidRequest` (only the `exit` notification is expected).
 * Applied to every message before it reaches a handler, so no feature can forget it.
 */
import { ErrorCodes, ResponseError, type ConnectionOptions } from 'vscode-languageserver/node';

/** Internal method a request is redirected to once the server has shut down. */
const AFTER_SHUTDOWN_METHOD = 'dewmark/$afterShutdown';

interface RawMessage {
  jsonrpc: string;
  id?: number | string | null;
  method?: string;
  params?: unknown;
}

/** The shutdown state and the message strategy that applies it (pass `options` to createConnection). */
export class ShutdownGate {
  private down = false;

  /** Connection options whose message strategy redirects requests that arrive after shutdown. */
  readonly options: ConnectionOptions = {
    messageStrategy: {
      handleMessage: (message, next) => {
        const m = message as RawMessage;
        const isRequest = typeof m.method === 'string' && m.id !== undefined && m.id !== null;
        if (!isRequest) return next(message);
        if (this.down) {
          return next({
            jsonrpc: m.jsonrpc,
            id: m.id,
            method: AFTER_SHUTDOWN_METHOD,
            params: { method: m.method },
          } as typeof message);
        }
        if (m.method === 'shutdown') this.down = true;
        return next(message);
      },
    },
  };

  /** Whether `shutdown` has been received. */
  get isDown(): boolean {
    return this.down;
  }

  /** Registers the handler that answers redirected requests with `InvalidRequest`. */
  register(connection: { onRequest(method: string, handler: (params: { method?: unknown }) => never): unknown }): void {
    connection.onRequest(AFTER_SHUTDOWN_METHOD, (params) => {
      const method = typeof params?.method === 'string' ? params.method : 'a request';
      throw new ResponseError(
        ErrorCodes.InvalidRequest,
        `The server has shut down: '${method}' is not accepted after 'shutdown'; ` +
          `only the 'exit' notification is. Restart the server to continue.`,
      );
    });
  }
}

/**
 * A minimal LSP client for round-trip tests: spawns `node bin/dewmark-language-server.js --stdio`
 * (or `--node-ipc`) and drives it with vscode-jsonrpc. Waits on conditions (a notification with
 * the expected version), never on fixed sleeps.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import {
  createMessageConnection,
  IPCMessageReader,
  IPCMessageWriter,
  StreamMessageReader,
  StreamMessageWriter,
  type MessageConnection,
} from 'vscode-jsonrpc/node';

/** The repository root: the nearest folder upwards from the working directory that holds the server's bin. */
export function repoRoot(): string {
  let dir = process.cwd();
  for (;;) {
    if (existsSync(join(dir, 'bin', 'dewmark-language-server.js'))) return dir;
    const up = dirname(dir);
    if (up === dir)
      throw new Error(`no bin/dewmark-language-server.js above ${process.cwd()}; run from the Dewmark repository`);
    dir = up;
  }
}

/** The server's entry point, as editors start it. */
export function serverBin(): string {
  return join(repoRoot(), 'bin', 'dewmark-language-server.js');
}

/** LSP position. */
export interface Position {
  line: number;
  character: number;
}

/** LSP range. */
export interface Range {
  start: Position;
  end: Position;
}

/** A pushed diagnostics notification. */
export interface Published {
  uri: string;
  version?: number;
  diagnostics: {
    range: Range;
    severity?: number;
    code?: string | number;
    source?: string;
    message: string;
    data?: unknown;
  }[];
}

/** Client capabilities of a modern client (pull diagnostics, Markdown, hierarchical symbols…). */
export const FULL_CAPABILITIES = {
  general: { positionEncodings: ['utf-16'] },
  window: { workDoneProgress: true },
  workspace: {
    configuration: true,
    didChangeConfiguration: { dynamicRegistration: true },
    workspaceFolders: true,
    inlayHint: { refreshSupport: true },
    diagnostics: { refreshSupport: true },
    workspaceEdit: { documentChanges: true },
  },
  textDocument: {
    synchronization: { dynamicRegistration: false },
    hover: { contentFormat: ['markdown', 'plaintext'] },
    completion: { completionItem: { documentationFormat: ['markdown'], snippetSupport: false } },
    documentSymbol: { hierarchicalDocumentSymbolSupport: true },
    rename: { prepareSupport: true },
    codeAction: { codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix', 'refactor.rewrite'] } } },
    publishDiagnostics: { relatedInformation: true, versionSupport: true },
    diagnostic: { dynamicRegistration: false, relatedDocumentSupport: false },
    inlayHint: { dynamicRegistration: false },
  },
};

/** Client capabilities of a client like Neovim 0.7: push diagnostics only, no configuration requests. */
export const PUSH_ONLY_CAPABILITIES = {
  textDocument: {
    hover: { contentFormat: ['markdown', 'plaintext'] },
    documentSymbol: { hierarchicalDocumentSymbolSupport: true },
    publishDiagnostics: { relatedInformation: true },
  },
};

/** A running server with a connection to it. */
export class Session {
  readonly connection: MessageConnection;
  readonly published: Published[] = [];
  readonly progress: unknown[] = [];
  readonly logs: string[] = [];
  stderr = '';
  private waiters: (() => void)[] = [];
  /** Answers the server's `workspace/configuration` requests (per item), when set. */
  configuration: ((item: { scopeUri?: string; section?: string }) => unknown) | null = null;
  readonly configurationRequests: { scopeUri?: string; section?: string }[] = [];
  readonly registrations: unknown[] = [];
  private exited: Promise<number | null>;

  constructor(
    readonly proc: ChildProcess,
    connection: MessageConnection,
  ) {
    this.connection = connection;
    proc.stderr?.on('data', (d: Buffer) => (this.stderr += d.toString()));
    this.exited = new Promise((resolve) => proc.on('exit', (code) => resolve(code)));
    connection.onNotification('textDocument/publishDiagnostics', (p: Published) => {
      this.published.push(p);
      this.wake();
    });
    const log = (p: { message: string }) => {
      this.logs.push(p.message);
      this.wake();
    };
    connection.onNotification('window/logMessage', log);
    connection.onNotification('window/showMessage', log);
    connection.onNotification('$/progress', (p: unknown) => {
      this.progress.push(p);
      this.wake();
    });
    connection.onRequest('window/showMessageRequest', () => null);
    connection.onRequest('window/workDoneProgress/create', () => null);
    connection.onRequest('client/registerCapability', (p: unknown) => {
      this.registrations.push(p);
      this.wake();
      return null;
    });
    connection.onRequest('workspace/inlayHint/refresh', () => null);
    connection.onRequest('workspace/diagnostic/refresh', () => null);
    connection.onRequest('workspace/configuration', (p: { items: { scopeUri?: string; section?: string }[] }) => {
      this.configurationRequests.push(...p.items);
      this.wake();
      return Promise.all(p.items.map((item) => (this.configuration ? this.configuration(item) : null)));
    });
    connection.listen();
  }

  private wake(): void {
    const w = this.waiters;
    this.waiters = [];
    for (const f of w) f();
  }

  /** Resolves when `pred` holds for what has arrived (checked on every notification). */
  async until<T>(what: string, pred: () => T | undefined | null | false, timeoutMs = 10_000): Promise<T> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const r = pred();
      if (r) return r;
      const left = deadline - Date.now();
      if (left <= 0) throw new Error(`timed out waiting for ${what}; server stderr:\n${this.stderr}`);
      await new Promise<void>((resolve) => {
        const t = setTimeout(resolve, left);
        this.waiters.push(() => {
          clearTimeout(t);
          resolve();
        });
      });
    }
  }

  /** The latest push for `uri` with at least `version`. */
  diagnosticsFor(uri: string, version: number): Promise<Published> {
    return this.until(`diagnostics for ${uri} v${version}`, () =>
      [...this.published].reverse().find((p) => p.uri === uri && (p.version ?? -1) >= version),
    );
  }

  /** `initialize` + `initialized`; returns the server's InitializeResult. */
  async initialize(
    capabilities: object = FULL_CAPABILITIES,
    extra: Record<string, unknown> = {},
  ): Promise<{ capabilities: Record<string, unknown>; serverInfo?: { name: string } }> {
    const result = await this.connection.sendRequest<{ capabilities: Record<string, unknown> }>('initialize', {
      processId: process.pid,
      rootUri: null,
      capabilities,
      workspaceFolders: null,
      ...extra,
    });
    await this.connection.sendNotification('initialized', {});
    return result;
  }

  /** Sends `didOpen` for a Markdown document. */
  open(uri: string, text: string, version = 1): Promise<void> {
    return this.connection.sendNotification('textDocument/didOpen', {
      textDocument: { uri, languageId: 'markdown', version, text },
    });
  }

  /** Sends one incremental `didChange`. */
  change(uri: string, version: number, changes: { range: Range; text: string }[]): Promise<void> {
    return this.connection.sendNotification('textDocument/didChange', {
      textDocument: { uri, version },
      contentChanges: changes,
    });
  }

  /** Sends a request. */
  request<R>(method: string, params: unknown): Promise<R> {
    return this.connection.sendRequest<R>(method, params);
  }

  /** `shutdown` then `exit`; resolves with the process exit code. */
  async shutdown(): Promise<number | null> {
    await this.connection.sendRequest('shutdown');
    await this.connection.sendNotification('exit');
    const code = await this.exited;
    this.connection.dispose();
    return code;
  }

  /** Kills the server if a test left it running. */
  kill(): void {
    if (this.proc.exitCode === null && this.proc.signalCode === null) this.proc.kill('SIGKILL');
    this.connection.dispose();
  }
}

/** Starts the server over stdio (default) or node IPC. */
export function startServer(transport: 'stdio' | 'node-ipc' = 'stdio'): Session {
  if (transport === 'stdio') {
    const proc = spawn(process.execPath, [serverBin(), '--stdio'], {
      cwd: repoRoot(),
      stdio: ['pipe', 'pipe', 'pipe'],
    });
    const connection = createMessageConnection(
      new StreamMessageReader(proc.stdout!),
      new StreamMessageWriter(proc.stdin!),
    );
    return new Session(proc, connection);
  }
  const proc = spawn(process.execPath, [serverBin(), '--node-ipc'], {
    cwd: repoRoot(),
    stdio: ['pipe', 'pipe', 'pipe', 'ipc'],
  });
  const connection = createMessageConnection(new IPCMessageReader(proc), new IPCMessageWriter(proc));
  return new Session(proc, connection);
}

/**
 * Splits `text` at its `|` cursor markers: the text without them and the LSP positions where they
 * were (line/character in UTF-16 code units).
 */
export function cursors(marked: string): { text: string; at: Position[] } {
  const at: Position[] = [];
  let text = '';
  let line = 0;
  let character = 0;
  for (const ch of marked) {
    if (ch === '|') {
      at.push({ line, character });
      continue;
    }
    text += ch;
    if (ch === '\n') {
      line++;
      character = 0;
    } else character += ch.length;
  }
  return { text, at };
}

/** The position just after the first occurrence of `needle` in `text` (or at its start). */
export function positionOf(text: string, needle: string, atStart = false): Position {
  const i = text.indexOf(needle);
  if (i < 0) throw new Error(`"${needle}" is not in the text`);
  const offset = atStart ? i : i + needle.length;
  const before = text.slice(0, offset);
  const line = before.split('\n').length - 1;
  const character = offset - (before.lastIndexOf('\n') + 1);
  return { line, character };
}

/**
 * The number shown for `key` in a state hover's table (`| \`w\` | 6.53 | g/kg | …` → 6.53): the cell after the key's.
 */
export function tableValue(markdown: string, key: string): number {
  const row = markdown.split('\n').find((l) => l.includes(`| \`${key}\` |`));
  if (!row) throw new Error(`no row for ${key} in:\n${markdown}`);
  const cells = row.split('|').map((c) => c.trim());
  const cell = cells[cells.indexOf(`\`${key}\``) + 1] ?? '';
  const m = /^[-−]?\d+(\.\d+)?/.exec(cell.replace('−', '-'));
  if (!m) throw new Error(`no number in the ${key} row: ${row}`);
  return Number(m[0]);
}

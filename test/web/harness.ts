/**
 * The web build of the language server (dist/web/server.js) driven over LSP without a browser: a
 * Node `worker_threads` Worker plays the Web Worker. The bundle is run as a function whose scope
 * holds what a dedicated worker's global scope has — `postMessage`, `onmessage`, `close`, and the
 * web platform's globals (timers, `TextEncoder`, `performance`, `crypto`…) — and in which Node's own
 * globals are shadowed by `undefined` (`process`, `require`, `Buffer`, `setImmediate`, `global`,
 * `module`, `__dirname`…), so code that reaches for Node fails here as it would in a browser.
 * The session is the protocol tests' {@link Session}, so the same checks read the answers.
 */
import { EventEmitter } from 'node:events';
import type { ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { createMessageConnection, PortMessageReader, PortMessageWriter } from 'vscode-jsonrpc/node';
import { repoRoot, Session } from '../protocol/harness';

/** The web build of the server. */
export function webServerBundle(): string {
  return join(repoRoot(), 'dist', 'web', 'server.js');
}

/** Node's globals a browser does not have: shadowed while the bundle runs. */
export const NODE_ONLY_GLOBALS = [
  'process',
  'require',
  'module',
  'exports',
  '__filename',
  '__dirname',
  'global',
  'Buffer',
  'setImmediate',
  'clearImmediate',
] as const;

/** Runs inside the worker thread: a dedicated-worker scope around the bundle. */
const BOOTSTRAP = `
const { parentPort, workerData } = require('node:worker_threads');
const { readFileSync } = require('node:fs');
const exitWorker = process.exit.bind(process);
const text = readFileSync(workerData.bundle, 'utf8');
// The scope holds the platform's globals as own data properties (Node's are accessors that check
// 'this', and whose setters would change the real global), their functions bound to the real
// global (a browser lets self.setTimeout(...) be called on self; Node checks 'this').
const scope = Object.create(null);
const own = (name, value) => Object.defineProperty(scope, name, { value, writable: true, configurable: true });
for (const name of Object.getOwnPropertyNames(globalThis)) {
  if (workerData.hidden.includes(name)) continue;
  let value;
  try {
    value = globalThis[name];
  } catch {
    continue;
  }
  own(name, typeof value === 'function' && !/^[A-Z]/.test(name) ? value.bind(globalThis) : value);
}
let onmessage = null;
parentPort.on('message', (data) => { if (onmessage) onmessage({ data }); });
own('postMessage', (message) => parentPort.postMessage(message));
own('addEventListener', () => undefined);
own('removeEventListener', () => undefined);
own('close', () => exitWorker(0));
Object.defineProperty(scope, 'onmessage', { get: () => onmessage, set: (f) => { onmessage = f; } });
for (const name of workerData.hidden) own(name, undefined);
own('self', scope);
own('globalThis', scope);
const names = ['globalThis', 'self', ...workerData.hidden];
// 'with' makes every free name of the script a property of the scope first, as in a worker.
new Function(...names, 'with (globalThis) {\\n' + text + '\\n}\
')(scope, scope, ...workerData.hidden.map(() => undefined));
`;

/** Starts the web build (or another script, for the harness's own test) in a worker thread and connects to it. */
export function startWebServer(bundle = webServerBundle()): Session {
  if (!existsSync(bundle)) throw new Error(`${bundle} is missing; run npm run build first`);
  const worker = new Worker(BOOTSTRAP, {
    eval: true,
    workerData: { bundle, hidden: [...NODE_ONLY_GLOBALS] },
    stderr: true,
  });
  // What Session needs of a server process: its stderr, its exit, its exit code, and a way to end it.
  const proc = Object.assign(new EventEmitter(), {
    stderr: worker.stderr,
    exitCode: null as number | null,
    signalCode: null as string | null,
    pid: undefined,
    kill: () => void worker.terminate(),
  });
  worker.on('error', (err) => proc.stderr.emit('data', Buffer.from(`worker error: ${err.stack ?? err.message}\n`)));
  worker.on('exit', (code) => {
    proc.exitCode = code;
    proc.emit('exit', code);
  });
  const connection = createMessageConnection(new PortMessageReader(worker), new PortMessageWriter(worker));
  return new Session(proc as unknown as ChildProcess, connection);
}

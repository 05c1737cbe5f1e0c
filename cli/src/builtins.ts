/**
 * Node's built-in modules that only some runs use, loaded on first use. Every command begins by
 * running the bundle's top, which loads whatever it imports there; these (child processes for
 * git and the browser, hashing for the report, worker threads and the OS for many files) cost
 * some milliseconds of start-up that `check` or `eval` on a few notes never needs.
 */

/**
 * A built-in module by name: `process.getBuiltinModule` (Node 20.16 and later), else the
 * CommonJS `require` of the bundle (older Node 20 runs only the bundle). Not `createRequire`:
 * its module loads more of Node's own at start than this saves.
 */
function load<T>(id: string): T {
  if (typeof process.getBuiltinModule === 'function') return process.getBuiltinModule(id) as T;
  return require(id) as T;
}

export const childProcess = () => load<typeof import('node:child_process')>('node:child_process');
export const crypto = () => load<typeof import('node:crypto')>('node:crypto');
export const os = () => load<typeof import('node:os')>('node:os');
export const workerThreads = () => load<typeof import('node:worker_threads')>('node:worker_threads');

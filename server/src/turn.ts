/**
 * A later turn of the event loop (I/O, timers and other requests first), in both builds of the
 * server: `setImmediate` in Node; a zero timeout in a Web Worker (the web build), which has no
 * `setImmediate`. Shared code uses these, never `setImmediate` itself.
 */

/** Runs `fn` on a later turn of the event loop. */
export function later(fn: () => void): void {
  if (typeof setImmediate === 'function') setImmediate(fn);
  else setTimeout(fn, 0);
}

/** Resolves on a later turn of the event loop. */
export function nextTurn(): Promise<void> {
  return new Promise((resolve) => later(resolve));
}

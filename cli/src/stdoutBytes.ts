/**
 * Bytes to standard output without Node queueing them. `process.stdout.write` to a pipe whose
 * reader is behind keeps what the pipe cannot take in memory until the reader catches up, so
 * `dewmark eval --format json big.md | jq …` would hold most of its output at once however little
 * the evaluation keeps. Here the bytes go to the file descriptor as the system takes them; while
 * the pipe is full, the command sleeps a millisecond and tries again — the reader sets the pace,
 * as with a blocking write.
 */
import { writeSync } from 'node:fs';

/** One millisecond's sleep, without the event loop (the command writes from synchronous code). */
const SLEEP = new Int32Array(new SharedArrayBuffer(4));

/**
 * Writes `bytes` to `fd`, waiting while the descriptor is full (EAGAIN). Returns the number of
 * bytes written: all of them, or fewer when the descriptor failed otherwise (a closed pipe:
 * EPIPE), in which case the caller writes the rest through its stream, whose error handling
 * applies.
 */
export function writeWaiting(fd: number, bytes: Uint8Array): number {
  let done = 0;
  while (done < bytes.length) {
    try {
      done += writeSync(fd, bytes, done, bytes.length - done);
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EAGAIN') break;
      Atomics.wait(SLEEP, 0, 0, 1);
    }
  }
  return done;
}

/**
 * `@dewmark/files` (Node only): which files are notes — paths, folders (recursive), globs, `-`
 * for standard input, ignore files, `--exclude` (see `select.ts`) — and reading them as UTF-8
 * text with clear errors for missing, unreadable, binary, non-UTF-8 and too large files. The command line
 * and the language server's "check all notes" both use it, so they read the same notes the same way.
 */
import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import type { Input } from './select';
export { cachedDiskFiles, type CachedDiskFiles } from './diskFiles';
export { projectFilter, type LeftOutByProject, type ProjectPatterns } from './project';

export {
  collectInputs,
  describeLeftOut,
  explainEmpty,
  MARKDOWN,
  patternMatcher,
  selectInputs,
  STDIN_PATH,
  type CollectOptions,
  type EmptyArgument,
  type Input,
  type InputProblem,
  type LeftOut,
  type LeftOutReason,
  type Selection,
} from './select';

/** Outcome of reading one input. */
export type ReadOutcome = { ok: true; text: string } | { ok: false; message: string };

/** Bytes looked at for a NUL byte when deciding whether a file is binary. */
export const BINARY_SNIFF = 8000;

/** The most one note may be by default, MB (raised with --max-note-size). */
export const DEFAULT_MAX_NOTE_MB = 8;

/** The default most bytes one note may be. */
export const DEFAULT_MAX_NOTE_BYTES = DEFAULT_MAX_NOTE_MB * 1024 * 1024;

function mb(bytes: number): string {
  const v = bytes / 1024 / 1024;
  return `${v >= 10 ? Math.round(v) : Number(v.toFixed(1))} MB`;
}

function binary(display: string): ReadOutcome {
  return {
    ok: false,
    message: `'${display}' is a binary file, not a Markdown note; leave it out of the paths or globs`,
  };
}

/** The message for a note over the size limit (`size` when known: a regular file). */
function tooLarge(display: string, size: number | null, maxBytes: number): ReadOutcome {
  const is = size === null ? `goes on past ${mb(maxBytes)}` : `is ${mb(size)}`;
  const suggested = Math.max(DEFAULT_MAX_NOTE_MB * 2, Math.ceil((size ?? 2 * maxBytes) / 1024 / 1024) + 1);
  return {
    ok: false,
    message:
      `'${display}' ${is}, more than the ${mb(maxBytes)} one note may be (so reading it cannot exhaust memory); ` +
      `split the note, or raise the limit with --max-note-size <MB>, e.g. --max-note-size ${suggested}`,
  };
}

/**
 * Decodes bytes as UTF-8 text; a NUL byte in the first 8000 means binary, more than `maxBytes`
 * is too large (checked in that order), an invalid sequence means not UTF-8.
 */
export function decodeText(bytes: Uint8Array, display: string, maxBytes: number = DEFAULT_MAX_NOTE_BYTES): ReadOutcome {
  const sniff = bytes.subarray(0, Math.min(bytes.length, BINARY_SNIFF));
  if (sniff.includes(0)) return binary(display);
  if (bytes.length > maxBytes) return tooLarge(display, null, maxBytes);
  try {
    return { ok: true, text: new TextDecoder('utf-8', { fatal: true }).decode(bytes) };
  } catch {
    const at = firstInvalidUtf8(bytes);
    return {
      ok: false,
      message: `'${display}' is not valid UTF-8 text (first bad byte at offset ${at}); save it as UTF-8`,
    };
  }
}

/** Offset of the first byte that breaks UTF-8 (for messages). */
export function firstInvalidUtf8(b: Uint8Array): number {
  let i = 0;
  while (i < b.length) {
    const c = b[i]!;
    let n = 0;
    if (c < 0x80) n = 0;
    else if (c >= 0xc2 && c <= 0xdf) n = 1;
    else if (c >= 0xe0 && c <= 0xef) n = 2;
    else if (c >= 0xf0 && c <= 0xf4) n = 3;
    else return i;
    for (let k = 1; k <= n; k++) {
      const d = b[i + k];
      if (d === undefined || (d & 0xc0) !== 0x80) return i;
    }
    i += n + 1;
  }
  return i;
}

/** Bytes read per call when the size is not known in advance (a device, a pipe). */
const CHUNK = 1 << 16;

/**
 * Fills `buf` from `at` with what `fd` gives until it is full or the file ends; returns the
 * bytes in `buf` after the call.
 */
function fill(fd: number, buf: Buffer, at: number): number {
  let got = at;
  while (got < buf.length) {
    const n = readSync(fd, buf, got, buf.length - got, null);
    if (n === 0) break;
    got += n;
  }
  return got;
}

/**
 * Reads a file input as text (standard input is read by the caller), never more than `maxBytes`
 * + 1 bytes: the first bytes are sniffed for binary content before anything else is read, a
 * regular file's size is checked before its contents are read, and a device or pipe (which has
 * no size: `/dev/zero`, a FIFO) is read in chunks only up to the limit.
 *
 * A regular file within the limit is read into one buffer of its size and one byte more (the
 * sniffed head is its start, the rest is read after it), so its bytes are copied once, by the
 * system, before they are decoded; the extra byte shows a file that grew since its size was
 * read, whose rest is then read in chunks as from a pipe.
 */
export function readInput(input: Input, maxBytes: number = DEFAULT_MAX_NOTE_BYTES): ReadOutcome {
  if (input.abs === null) return { ok: false, message: 'standard input must be read by the caller' };
  let fd: number;
  try {
    fd = openSync(input.abs, 'r');
  } catch (err) {
    return cannotRead(input.display, err);
  }
  try {
    const st = fstatSync(fd);
    if (st.isDirectory()) return { ok: false, message: `cannot read '${input.display}': it is a folder` };
    const whole = st.isFile() && st.size <= maxBytes;
    const first = Buffer.allocUnsafe(whole ? Math.max(BINARY_SNIFF, st.size + 1) : BINARY_SNIFF);
    const got = fill(fd, first.subarray(0, BINARY_SNIFF), 0);
    if (first.subarray(0, got).includes(0)) return binary(input.display);
    if (st.isFile() && st.size > maxBytes) return tooLarge(input.display, st.size, maxBytes);
    if (got < BINARY_SNIFF) return decodeText(first.subarray(0, got), input.display, maxBytes);
    let total = fill(fd, first, got);
    if (total < first.length) return decodeText(first.subarray(0, total), input.display, maxBytes);
    // Not all read yet (a device or pipe, or a file that grew): the rest chunk by chunk.
    const chunks: Buffer[] = [first];
    for (;;) {
      const room = Math.min(CHUNK, maxBytes + 1 - total);
      if (room <= 0) break;
      const buf = Buffer.allocUnsafe(room);
      const filled = fill(fd, buf, 0);
      chunks.push(filled === room ? buf : buf.subarray(0, filled));
      total += filled;
      if (filled < room) break;
    }
    if (total > maxBytes) return tooLarge(input.display, st.isFile() ? Math.max(st.size, total) : null, maxBytes);
    return decodeText(Buffer.concat(chunks, total), input.display, maxBytes);
  } catch (err) {
    return cannotRead(input.display, err);
  } finally {
    closeSync(fd);
  }
}

function cannotRead(display: string, err: unknown): ReadOutcome {
  const code = (err as NodeJS.ErrnoException).code;
  const why =
    code === 'EACCES'
      ? 'permission denied'
      : code === 'EISDIR'
        ? 'it is a folder'
        : code === 'ENOENT'
          ? 'no such file'
          : (err as Error).message;
  return { ok: false, message: `cannot read '${display}': ${why}` };
}

/**
 * `@dewmark/files` (Node only): which files are notes — paths, folders (recursive), globs, `-`
 * for standard input, ignore files, `--exclude` (see `select.ts`) — and reading them as UTF-8
 * text with clear errors for missing, unreadable, binary and non-UTF-8 files. The command line
 * and the language server's "check all notes" both use it, so they read the same notes the same way.
 */
import { readFileSync } from 'node:fs';
import type { Input } from './select';

export {
  collectInputs,
  describeLeftOut,
  explainEmpty,
  MARKDOWN,
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
const BINARY_SNIFF = 8000;

/** Decodes bytes as UTF-8 text; a NUL byte means binary, an invalid sequence means not UTF-8. */
export function decodeText(bytes: Uint8Array, display: string): ReadOutcome {
  const sniff = bytes.subarray(0, Math.min(bytes.length, BINARY_SNIFF));
  if (sniff.includes(0)) return { ok: false, message: `'${display}' is a binary file, not a Markdown note; leave it out of the paths or globs` };
  try {
    return { ok: true, text: new TextDecoder('utf-8', { fatal: true }).decode(bytes) };
  } catch {
    const at = firstInvalidUtf8(bytes);
    return { ok: false, message: `'${display}' is not valid UTF-8 text (first bad byte at offset ${at}); save it as UTF-8` };
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

/** Reads a file input as text (standard input is read by the caller). */
export function readInput(input: Input): ReadOutcome {
  if (input.abs === null) return { ok: false, message: 'standard input must be read by the caller' };
  let bytes: Buffer;
  try {
    bytes = readFileSync(input.abs);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === 'EACCES' ? 'permission denied' : code === 'EISDIR' ? 'it is a folder' : code === 'ENOENT' ? 'no such file' : (err as Error).message;
    return { ok: false, message: `cannot read '${input.display}': ${why}` };
  }
  return decodeText(bytes, input.display);
}

/**
 * What the `report` and `chart` commands share: reading exactly one note, and writing exactly the
 * output path given — never the note itself, never a Markdown file.
 */
import { lstatSync, readlinkSync, realpathSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { analyzeNote, type Analysis } from '../core';
import { STDIN_PATH, collectInputs, decodeText, readInput } from '@dewmark/files';
import type { CliIO } from '../run';
import { safeText } from '../sanitize';
import { UsageError, maxNoteBytes, toSettings, type RawEvalOptions } from '../settings';

/** One note read and analysed. */
export interface AnalysedNote {
  /** Path as shown to the user (or `<stdin>`). */
  path: string;
  /** Absolute path, null for standard input. */
  abs: string | null;
  text: string;
  analysis: Analysis;
}

/** Options every file-writing command takes. */
export interface WriteOptions extends RawEvalOptions {
  output?: string;
  gitignore?: boolean;
  exclude?: string[];
}

/**
 * The one list of Markdown-family file endings (lower case, without the dot) that a generated file
 * must never be written to: Markdown's own, its common spellings, and the formats built on it
 * (MDX, Quarto, R Markdown, Livebook).
 */
export const MARKDOWN_FAMILY_EXTENSIONS: readonly string[] = [
  'md',
  'markdown',
  'mdown',
  'mkd',
  'mkdn',
  'mkdown',
  'mdwn',
  'mdtxt',
  'mdtext',
  'markdn',
  'mdx',
  'qmd',
  'rmd',
  'livemd',
];

const MARKDOWN_FAMILY = new Set(MARKDOWN_FAMILY_EXTENSIONS);

/** Whether a file name ends in a Markdown-family extension (any letter case). */
export function isMarkdownFamilyName(path: string): boolean {
  const name = basename(path);
  const dot = name.lastIndexOf('.');
  return dot > 0 && MARKDOWN_FAMILY.has(name.slice(dot + 1).toLowerCase());
}

/** The most symbolic links one path may pass through (Linux's own limit, MAXSYMLINKS). */
const MAX_LINKS = 40;

/**
 * Checks the output path against the input: refuses a missing `-o`, the note itself (same path,
 * or the same file through a link), and any Markdown file. Throws {@link UsageError} (exit 2).
 */
export function checkOutputPath(
  output: string | undefined,
  input: { abs: string | null; path: string },
  cwd: string,
  what: string,
  example: string,
): string {
  if (output === undefined || output.trim() === '') {
    throw new UsageError(`say where to write the ${what} with -o, e.g. ${example}`);
  }
  const abs = resolve(cwd, output);
  if (input.abs !== null) {
    let same = abs === input.abs;
    if (!same) {
      try {
        const a = statSync(abs);
        const b = statSync(input.abs);
        same = a.dev === b.dev && a.ino === b.ino;
      } catch {
        // the output does not exist yet: it cannot be the note
      }
    }
    if (same)
      throw new UsageError(
        `refusing to write the ${what} over the note '${input.path}' ` +
          `itself; give another path with -o, e.g. ${example}`,
      );
  }
  const real = writtenPath(abs, output);
  if (isMarkdownFamilyName(abs) || isMarkdownFamilyName(real)) {
    const via = isMarkdownFamilyName(abs) ? '' : ` (a link to '${real}')`;
    throw new UsageError(
      `refusing to write the ${what} to '${output}'${via}: it is a Markdown file ` +
        `name, and dewmark never overwrites notes; use a name such as ${example}`,
    );
  }
  return abs;
}

/**
 * The file a write to `abs` would change, resolved the way the kernel opens it: an existing path
 * through `realpath` itself; otherwise its folder through `realpath` and the last name followed
 * while it is a link to nothing yet (a write creates that link's target), as far as the kernel
 * would follow (refused beyond, as the kernel's open would fail).
 */
function writtenPath(abs: string, shown: string): string {
  try {
    return realpathSync.native(abs);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ELOOP') throw tooManyLinks(shown);
  }
  let p = abs;
  for (let hops = 0; hops <= MAX_LINKS; hops++) {
    let dir: string;
    try {
      dir = realpathSync.native(dirname(p));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ELOOP') throw tooManyLinks(shown);
      return p; // its folder does not exist: the write fails and creates nothing
    }
    const full = join(dir, basename(p));
    let link: string;
    try {
      if (!lstatSync(full).isSymbolicLink()) return full;
      link = readlinkSync(full);
    } catch {
      return full; // nothing there yet: the write creates exactly this file
    }
    p = resolve(dir, link);
  }
  throw tooManyLinks(shown);
}

function tooManyLinks(shown: string): UsageError {
  return new UsageError(
    `refusing to write to '${shown}': it leads through more than ${MAX_LINKS} ` +
      `symbolic links (or a loop of them); give the path of a plain file with -o`,
  );
}

/** Reads exactly one note (a file or `-` for standard input) and analyses it; throws {@link UsageError}. */
export async function readOneNote(
  paths: string[],
  opts: WriteOptions,
  io: CliIO,
  command: string,
): Promise<AnalysedNote> {
  if (paths.length !== 1) {
    throw new UsageError(
      `${command} takes exactly one note (got ${paths.length === 0 ? 'none' : paths.length}), ` +
        `e.g. dewmark ${command} notes/ahu.md -o …`,
    );
  }
  const settings = toSettings(opts);
  const maxBytes = maxNoteBytes(opts);
  const { inputs, problems } = collectInputs(paths, {
    cwd: io.cwd,
    gitignore: opts.gitignore !== false,
    exclude: opts.exclude ?? [],
  });
  if (problems.length > 0) throw new UsageError(problems.map((p) => p.message).join('; '));
  if (inputs.length !== 1) {
    throw new UsageError(
      `${command} takes exactly one note, but '${paths[0]}' ` +
        `names ${inputs.length === 0 ? 'no Markdown file' : `${inputs.length} files`}; name one file`,
    );
  }
  const input = inputs[0]!;
  const read =
    input.abs === null ? decodeText(await io.stdin(maxBytes), STDIN_PATH, maxBytes) : readInput(input, maxBytes);
  if (!read.ok) throw new UsageError(read.message);
  return { path: input.display, abs: input.abs, text: read.text, analysis: analyzeNote(read.text, settings) };
}

/** Writes `content` to `abs` (text as UTF-8); an I/O failure is a {@link UsageError} with the reason. */
export function writeOutput(abs: string, shown: string, content: string | Uint8Array): void {
  try {
    if (typeof content === 'string') writeFileSync(abs, content, 'utf8');
    else writeFileSync(abs, content);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why =
      code === 'ENOENT'
        ? 'its folder does not exist'
        : code === 'EACCES'
          ? 'permission denied'
          : code === 'EISDIR'
            ? 'it is a folder'
            : (err as Error).message;
    throw new UsageError(`cannot write '${shown}': ${why}`);
  }
}

/**
 * The line `report` and `chart` print once the file is written: `dewmark: wrote OUTPUT (NOTE: DETAIL)`,
 * both paths sanitised, so that a file name holding a newline or an escape sequence stays on the
 * one line and can neither start a workflow command nor move the terminal's cursor.
 */
export function wroteLine(shown: string, notePath: string, detail: string): string {
  return `dewmark: wrote ${safeText(shown)} (${safeText(notePath)}: ${detail})\n`;
}

/** Exit code after a file was written: 1 when the note has errors (the file is still written), else 0. */
export function exitCodeOf(analysis: Analysis): number {
  return analysis.diagnostics.some((d) => d.severity === 'error') ? 1 : 0;
}

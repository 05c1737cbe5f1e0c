/**
 * `dewmark fix [paths…] [--write]`: the one-command remedy for a failing check. Rewrites every
 * stale claim to the computed figure (the `claim-mismatch` quick fix: the evaluator's own
 * replacement digits and span), then refreshes every results table that no longer matches its
 * block (the `stale-results-table` quick fix). Without `--write` it prints a unified diff and
 * writes nothing; with it, it writes each changed note in place.
 *
 * Byte-exact outside the edited spans: each edit replaces exactly a number's digits or a table
 * between its markers, and a byte-order mark and the line breaks are kept. Idempotent: a second
 * run finds nothing (tables are refreshed from the note as its claims were rewritten).
 *
 * Exit codes: 0 nothing left to fix (or fixed with --write); 1 the dry run found changes, or some
 * stale claim or table could not be fixed; 2 usage or I/O problems.
 */
import type { Command } from 'commander';
import { readFileSync, writeFileSync } from 'node:fs';
import {
  analyzeNote,
  DEFAULT_SERVICE_SETTINGS,
  resultsTableEdits,
  type Analysis,
  type EvaluateSettings,
} from '../core';
import { unifiedDiff } from '../diff';
import { collectInputs, decodeText, readInput, type Input } from '@dewmark/files';
import type { CliIO } from '../run';
import { safeText } from '../sanitize';
import { selectWithProjects } from '../project';
import { UsageError, toSettings, type RawEvalOptions } from '../settings';

/** The diagnostic codes `fix` repairs. */
export const FIXABLE_CODES = ['claim-mismatch', 'stale-results-table'] as const;

interface FixOptions extends RawEvalOptions {
  write?: boolean;
  gitignore?: boolean;
  exclude?: string[];
}

/** A replacement of `[start, end)` by `text`. */
interface Edit {
  start: number;
  end: number;
  text: string;
}

/** Applies non-overlapping edits (any order); an edit overlapping an earlier one is skipped. */
function applyEdits(text: string, edits: Edit[]): { text: string; applied: number } {
  const sorted = [...edits].sort((a, b) => a.start - b.start || a.end - b.end);
  let out = '';
  let at = 0;
  let applied = 0;
  for (const e of sorted) {
    if (e.start < at || e.end > text.length || e.start > e.end) continue;
    out += text.slice(at, e.start) + e.text;
    at = e.end;
    applied++;
  }
  return { text: out + text.slice(at), applied };
}

function isSpan(x: unknown): x is { start: number; end: number } {
  return (
    typeof x === 'object' &&
    x !== null &&
    typeof (x as { start: unknown }).start === 'number' &&
    typeof (x as { end: unknown }).end === 'number'
  );
}

/** The claim rewrites the evaluator proposes (its quick-fix data on each `claim-mismatch`). */
function claimEdits(analysis: Analysis): Edit[] {
  const out: Edit[] = [];
  for (const d of analysis.diagnostics) {
    if (d.code !== 'claim-mismatch') continue;
    const span = d.data?.replaceSpan;
    const replacement = d.data?.replacement;
    if (isSpan(span) && typeof replacement === 'string')
      out.push({ start: span.start, end: span.end, text: replacement });
  }
  return out;
}

/** The refreshes of results tables that no longer match their block (never inserts a new one). */
function tableEdits(text: string, analysis: Analysis): Edit[] {
  const plan = resultsTableEdits({ text, analysis, settings: DEFAULT_SERVICE_SETTINGS }, { kind: 'all' });
  return plan.changes.flatMap((c) =>
    c.kind === 'refresh' && c.edit ? [{ start: c.edit.span.start, end: c.edit.span.end, text: c.edit.newText }] : [],
  );
}

/** The outcome of fixing one note's text. */
export interface FixResult {
  text: string;
  claims: number;
  tables: number;
  /** Fixable diagnostics still there afterwards (a claim whose figure is not reproducible, an unterminated table…). */
  left: number;
}

/** Fixes one note's text: claims first, then the tables of the note as rewritten. Pure. */
export function fixText(text: string, settings: Partial<EvaluateSettings>): FixResult {
  const first = applyEdits(text, claimEdits(analyzeNote(text, settings)));
  const afterClaims = analyzeNote(first.text, settings);
  const second = applyEdits(first.text, tableEdits(first.text, afterClaims));
  const final = second.applied > 0 ? analyzeNote(second.text, settings) : afterClaims;
  const left = final.diagnostics.filter((d) => (FIXABLE_CODES as readonly string[]).includes(d.code)).length;
  return { text: second.text, claims: first.applied, tables: second.applied, left };
}

const BOM = '\uFEFF';

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

/** Runs `dewmark fix`. */
export async function runFix(paths: string[], opts: FixOptions, io: CliIO): Promise<number> {
  const settings = toSettings(opts);
  if (opts.write && paths.includes('-'))
    throw new UsageError(
      'fix --write cannot write to standard input; give the note as a file, or leave out --write to see the diff',
    );
  const { inputs, problems } = collectInputs(paths, {
    cwd: io.cwd,
    gitignore: opts.gitignore !== false,
    exclude: opts.exclude ?? [],
  });
  let ioProblems = 0;
  for (const p of problems) {
    io.err(`dewmark: ${safeText(p.message)}\n`);
    ioProblems++;
  }
  if (inputs.length === 0 && problems.length === 0) {
    io.err(
      `dewmark: no Markdown files (.md, .markdown) found ` +
        `in ${paths.length > 0 ? paths.map((p) => `'${safeText(p)}'`).join(', ') : 'the current folder'}\n`,
    );
    return 2;
  }
  let changedFiles = 0;
  let claims = 0;
  let tables = 0;
  let left = 0;
  let out = '';
  const project = selectWithProjects(inputs, io.cwd, settings);
  for (const p of project.problems) {
    io.err(`dewmark: ${safeText(p)}\n`);
    ioProblems++;
  }
  for (const { input, settings: own } of project.tasks) {
    const read = await readNote(input, io);
    if (!read.ok) {
      io.err(`dewmark: ${safeText(read.message)}\n`);
      ioProblems++;
      continue;
    }
    // The decoder drops a byte-order mark; it is put back so the file changes only where edited.
    const hasBom = read.text.startsWith(BOM) || read.bom;
    const body = read.text.startsWith(BOM) ? read.text.slice(1) : read.text;
    const r = fixText(body, own);
    left += r.left;
    if (r.text === body) continue;
    changedFiles++;
    claims += r.claims;
    tables += r.tables;
    if (opts.write && input.abs !== null) {
      try {
        writeFileSync(input.abs, (hasBom ? BOM : '') + r.text, 'utf8');
      } catch (err) {
        io.err(
          `dewmark: cannot write '${safeText(input.display)}': ${err instanceof Error ? err.message : String(err)}\n`,
        );
        ioProblems++;
      }
    } else {
      out += unifiedDiff(safeText(input.display), body, r.text);
    }
  }
  if (out) io.out(out);
  const files = plural(changedFiles, 'file');
  const what = `${plural(claims, 'stale claim')} and ${plural(tables, 'results table')} in ${files}`;
  const summary =
    changedFiles === 0
      ? 'nothing to fix'
      : opts.write
        ? `fixed ${what}`
        : `would fix ${what} (run with --write to apply)`;
  io.err(
    `dewmark: ${summary}${left > 0 ? `; ${left} could not be fixed automatically (run dewmark check for them)` : ''}\n`,
  );
  if (ioProblems > 0) return 2;
  if (left > 0) return 1;
  return changedFiles > 0 && !opts.write ? 1 : 0;
}

/** Reads one input; `bom` tells whether its bytes began with a UTF-8 byte-order mark (which the decoder drops). */
async function readNote(
  input: Input,
  io: CliIO,
): Promise<{ ok: true; text: string; bom: boolean } | { ok: false; message: string }> {
  let bytes: Uint8Array;
  if (input.abs === null) bytes = await io.stdin();
  else {
    try {
      bytes = readFileSync(input.abs);
    } catch {
      const r = readInput(input); // says why, in the words the other commands use
      return r.ok ? { ok: false, message: `cannot read '${input.display}'` } : r;
    }
  }
  const r = decodeText(bytes, input.display);
  return r.ok
    ? { ok: true, text: r.text, bom: bytes.length >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf }
    : r;
}

/** Adds the `fix` command to the program. */
export function registerFix(
  prog: Command,
  io: CliIO,
  onResult: (code: number) => void,
  addCommon: (c: Command) => Command,
): void {
  addCommon(
    prog
      .command('fix')
      .description(
        'rewrite stale claims to the computed figures and refresh stale results tables; prints a diff unless --write',
      )
      .argument('[paths...]', 'Markdown files, folders (recursive) or glob patterns (default: the current folder)')
      .option('--write', 'write the fixed notes in place (default: print a unified diff and write nothing)'),
  ).action(async (paths: string[], opts: FixOptions) => onResult(await runFix(paths, opts, io)));
}

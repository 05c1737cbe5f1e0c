/**
 * The custom `dewmark/checkWorkspace` request: reads every Markdown note under the workspace
 * folders (reading only; nothing is written), analyses it, and pushes its diagnostics. The notes
 * are the ones `dewmark check <folder>` reads (`@dewmark/files`: .gitignore and
 * .git/info/exclude honoured, node_modules and hidden folders left out, links not followed), read
 * the same way; a note its project file `dewmark.json` leaves out is listed as excluded and not
 * read. Reports work-done progress and stops between folders and files when cancelled.
 */
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { CancellationToken, WorkDoneProgressReporter } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { analyzeText, countDiagnostics, type Note, noteDiagnostics } from '@dewmark/core/service';
import { readInput, selectInputs } from '@dewmark/files';
import type { ServerContext } from './context';
import type { Diagnostics } from './diagnostics';
import { toLspDiagnostics } from './diagnostics';
import {
  CHECK_WORKSPACE_METHOD,
  type CheckedNote,
  type CheckWorkspaceParams,
  type CheckWorkspaceResult,
} from '@dewmark/protocol';
import { cancelled, runSafe } from './safe';

/** Folders read between two turns of the event loop while looking for notes (requests go on meanwhile). */
const FOLDERS_PER_TURN = 16;

/** The notes under the workspace folders, in order; `null` when cancelled. */
async function notesUnder(
  folders: string[],
  token: CancellationToken,
): Promise<{ files: string[]; problems: { path: string; message: string }[] } | null> {
  if (folders.length === 0) return { files: [], problems: [] };
  const steps = selectInputs(folders, { cwd: folders[0]! });
  for (let n = 1; ; n++) {
    const step = steps.next();
    if (step.done) {
      const files = step.value.inputs.flatMap((i) => (i.abs === null ? [] : [i.abs]));
      return { files, problems: step.value.problems.map((p) => ({ path: p.display, message: p.message })) };
    }
    if (n % FOLDERS_PER_TURN === 0) {
      await new Promise((r) => setImmediate(r));
      if (token.isCancellationRequested) return null;
    }
  }
}

/**
 * The local path of a workspace folder, or why it is skipped: only `file:` URIs of this machine
 * can be read (not another host's `file://host/…`, not a virtual or remote scheme).
 */
export function localFolderPath(uri: string): string | { reason: string } {
  const scheme = /^([a-z][a-z0-9+.-]*):/i.exec(uri)?.[1]?.toLowerCase();
  if (scheme !== 'file')
    return {
      reason:
        `not a folder on this machine's disk (${scheme ? `'${scheme}:'` : 'no'} ` +
        `scheme); only file: folders are checked`,
    };
  try {
    return fileURLToPath(uri);
  } catch (err) {
    return {
      reason:
        `not a local path (${err instanceof Error ? err.message : String(err)}); ` +
        `only folders on this machine are checked`,
    };
  }
}

/** Registers the check-all request. */
export function registerCheckWorkspace(ctx: ServerContext, diagnostics: Diagnostics): void {
  ctx.connection.onRequest(
    CHECK_WORKSPACE_METHOD,
    (params: CheckWorkspaceParams | undefined, token: CancellationToken) =>
      runSafe(ctx.connection, CHECK_WORKSPACE_METHOD, token, async (): Promise<CheckWorkspaceResult> => {
        let progress: WorkDoneProgressReporter;
        if (params?.workDoneToken !== undefined)
          progress = ctx.connection.window.attachWorkDoneProgress(params.workDoneToken);
        else if (ctx.client.workDoneProgress) progress = await ctx.connection.window.createWorkDoneProgress();
        else progress = ctx.connection.window.attachWorkDoneProgress(undefined);
        progress.begin('Dewmark: checking notes', 0, 'finding Markdown files', false);
        try {
          const result: CheckWorkspaceResult = {
            notes: [],
            filesRead: 0,
            errors: 0,
            warnings: 0,
            unreadable: [],
            skippedFolders: [],
            excluded: [],
          };
          const local: string[] = [];
          for (const folder of ctx.folders) {
            const path = localFolderPath(folder);
            if (typeof path === 'string') local.push(path);
            else result.skippedFolders.push({ uri: folder, reason: path.reason });
          }
          const found = await notesUnder(local, token);
          if (found === null) throw cancelled();
          const files = found.files;
          for (const p of found.problems)
            result.unreadable.push({ uri: pathToFileURL(p.path).href, reason: p.message });
          for (let i = 0; i < files.length; i++) {
            if (token.isCancellationRequested) throw cancelled();
            const path = files[i]!;
            const uri = pathToFileURL(path).href;
            progress.report(Math.round((100 * i) / files.length), `${i + 1}/${files.length} ${path.slice(-60)}`);
            const open = await ctx.notes.get(uri);
            // A note its dewmark.json leaves out is not checked, as by `dewmark check` (an open one
            // shows the note-excluded information instead of its problems).
            const settings = open ? open.note.settings : await ctx.config.get(uri);
            if (settings.excludedBy) {
              result.excluded.push({ uri, reason: `${settings.excludedBy.file}: ${settings.excludedBy.why}` });
              if (!open) diagnostics.clearClosed(uri);
              continue;
            }
            let doc: TextDocument;
            let note: Note;
            if (open) {
              ({ doc, note } = open);
            } else {
              const read = readInput({ display: path, abs: path });
              if (!read.ok) {
                result.unreadable.push({ uri, reason: read.message });
                continue;
              }
              doc = TextDocument.create(uri, 'markdown', 0, read.text);
              note = analyzeText(read.text, settings);
            }
            result.filesRead++;
            // A file without statements and without problems is prose; one with a problem but no
            // statement (a fence whose only line does not parse) is a note, as for `dewmark check`.
            if (note.analysis.parsed.statements.length === 0 && noteDiagnostics(note).length === 0) continue;
            const checked: CheckedNote = {
              uri,
              ...countDiagnostics(note),
              statements: note.analysis.parsed.statements.length,
            };
            result.notes.push(checked);
            result.errors += checked.errors;
            result.warnings += checked.warnings;
            if (!open) {
              await ctx.connection.sendDiagnostics({ uri, diagnostics: toLspDiagnostics(ctx, doc, note) });
              diagnostics.pushedForClosed(uri);
            }
          }
          return result;
        } finally {
          progress.done();
        }
      }),
  );
}
